/**
 * The change since the previous arterial gas (core/gas-change.ts) as a hover paragraph: under the
 * P/F ratio's tooltip, the hover of a value on an arterial gas line and that of a timepoint line.
 */
import type { NoteResult } from '../check-note';
import { changeSincePreviousGas, changeUsesCarried, gasChangeText } from '../gas-change';
import { escapeMarkdown } from './markdown';

/**
 * `**Since the previous arterial gas**: from timepoint 1 (…), 6 h earlier: PaO2 down 20 mmHg (was 80) · …`,
 * saying that gas values are compared only where stated and settings as in force (a `*` marks one
 * carried); null where the timepoint has no arterial gas, no
 * earlier one, or nothing stated at both to compare.
 */
export function gasChangeParagraph(result: NoteResult, timepoint: number): string | null {
  const change = changeSincePreviousGas(result, timepoint);
  const text = gasChangeText(change);
  if (text === null) return null;
  const carried = changeUsesCarried(change!) ? ' A value marked \\* is a setting carried from an earlier timepoint, or a ratio computed with one.' : '';
  const estimate = change!.changes.some((c) => c.earlierEstimated || c.laterEstimated) ? " An FiO2 marked est is a cannula's or simple mask's, estimated from its flow (a rough rule; not used for P/F)." : '';
  return `**Since the previous arterial gas**: ${escapeMarkdown(text)}.  \n_PaO2, PaCO2 and pH are compared only where stated at each gas's own timepoint; P/F and the settings (FiO2, O2 flow, PEEP, IPAP, EPAP, CPAP) as in force at each gas, and the oxygen device where it changed.${estimate}${carried}_`;
}
