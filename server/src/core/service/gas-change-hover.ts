/**
 * The change since the previous arterial gas (core/gas-change.ts) as a hover paragraph: under the
 * P/F ratio's tooltip, the hover of a value on an arterial gas line and that of a timepoint line.
 */
import type { NoteResult } from '../check-note';
import { changeSincePreviousGas, gasChangeText } from '../gas-change';
import { escapeMarkdown } from './markdown';

/**
 * `**Since the previous arterial gas**: from timepoint 1 (…), 6 h earlier: PaO2 down 20 mmHg (was 80) · …`,
 * saying that carried values are not compared; null where the timepoint has no arterial gas, no
 * earlier one, or nothing stated at both to compare.
 */
export function gasChangeParagraph(result: NoteResult, timepoint: number): string | null {
  const text = gasChangeText(changeSincePreviousGas(result, timepoint));
  if (text === null) return null;
  return `**Since the previous arterial gas**: ${escapeMarkdown(text)}.  \n_Only values stated at each gas's own timepoint, or derived from them, are compared; a value carried from an earlier timepoint is not._`;
}
