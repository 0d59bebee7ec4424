/**
 * An arterial gas written above the line that changes the FiO2 at the same timepoint. The values in
 * force at a timepoint are those at its end (format rule), so the gas is read with the new FiO2:
 * `abg 7.40/40/70/24` then `oxygen fio2 0.6`, after a timepoint on 0.30, gives P/F 117 where the
 * gas drawn on 0.30 gives 233. The values are left as the format reads them; the warning says which
 * FiO2 they rest on, and how to write a gas drawn before the change.
 */
import type { InputValue, Timepoint } from '../analysis/model';
import { fio2InForce } from '../derive/context';
import { toRange, type LineNode } from '../syntax/tree';
import { formatNumber } from '../util/format';
import { defineCheck } from './check';

/** The FiO2 of air (common practice; as `fio2InForce` takes it). */
const ROOM_AIR_FIO2 = 0.21;

/** The value that gives a timepoint's FiO2 in force: its `fio2`, else a room-air device; null when neither. */
function fio2Source(tp: Timepoint): InputValue | null {
  const fio2 = tp.values.get('fio2');
  if (fio2 && fio2.stated.usable && fio2.stated.value !== null) return fio2;
  return tp.values.get('device') ?? null;
}

/**
 * The FiO2 held at the end of a timepoint, the one the next timepoint starts from: its FiO2 setting,
 * else 0.21 where the device held is room air without a flow; null when none is known (a cannula).
 */
function heldFio2(tp: Timepoint): number | null {
  const fio2 = tp.values.heldSetting('fio2');
  if (fio2) return fio2.stated.usable ? fio2.stated.value : null;
  const device = tp.values.heldSetting('device');
  if (!device || !device.stated.usable || device.stated.word !== 'room air') return null;
  const flow = tp.values.heldSetting('o2_flow');
  return flow && flow.stated.value !== null && flow.stated.value > 0 ? null : ROOM_AIR_FIO2;
}

function sectionSpan(node: LineNode | undefined): { start: number; end: number } {
  return node?.kind === 'section' ? node.sectionToken.span : { start: 0, end: node?.text.length ?? 0 };
}

export const gasAboveFio2Change = defineCheck({
  code: 'PN324',
  alias: 'gas-above-fio2-change',
  title: 'Arterial gas above the line that changes the FiO2',
  severity: 'warning',
  tags: ['timeline'],
  doc: {
    fires: 'An arterial gas stands above an oxygen or vent line that changes the FiO2 at the same timepoint. The values in force at a timepoint are those at its end, so the gas is read with the new FiO2: its P/F, A–a gradient and readings rest on it. Not reported where the FiO2 is the one in force before the timepoint, where the gas line gives its own sampling FiO2, or at the first timepoint (nothing was in force before it).',
    example: '@ 08:00\noxygen fio2 0.3\n@ 09:00\nabg 7.40/40/70/24\noxygen fio2 0.6',
    fix: 'If the gas was drawn before the change, give the change a timepoint of its own (a new `@` line below the gas), or write the FiO2 the gas was drawn on on the gas line (`abg 7.40/40/70/24, fio2 0.3`). If it was drawn after the change, write the change above the gas.',
  },
  source: 'format rule (grammar/README.md: the values in force at a timepoint, and a change of therapy gets a timepoint of its own)',
  runTimepoint(ctx) {
    const tp = ctx.timepoint;
    const values = tp.values;
    // Asked without building the values: most timepoints state no PaO2, or no FiO2 or device.
    if (values.originOf('pao2') !== 'here' || tp.index === 0) return;
    if (values.originOf('fio2') !== 'here' && values.originOf('device') !== 'here') return;
    const pao2 = values.get('pao2');
    const source = fio2Source(tp);
    const now = fio2InForce(values);
    if (!pao2 || !source || now === null || source.origin.kind !== 'here' || source.stated.line <= pao2.stated.line) return;
    const previous = ctx.analysis.timeline.timepoints[tp.index - 1];
    if (!previous) return;
    const before = heldFio2(previous);
    if (before !== null && Math.abs(before - now) < 1e-9) return;
    const lines = ctx.analysis.tree.lines;
    const shownNow = formatNumber(now, 2);
    const shownBefore = before === null ? null : formatNumber(before, 2);
    const write = shownBefore === null
      ? 'or write the FiO2 the gas was drawn on on the gas line.'
      : `or write the FiO2 the gas was drawn on on the gas line (\`fio2 ${shownBefore}\`).`;
    ctx.report({
      range: toRange(pao2.stated.line, sectionSpan(lines[pao2.stated.line])),
      message: `This gas is read with FiO2 ${shownNow} from line ${source.stated.line + 1} below it, which changed the FiO2 at this timepoint (${shownBefore === null ? 'none stated' : shownBefore} before it): its P/F, A–a gradient and readings rest on ${shownNow}. If the gas was drawn before the change, give the change a timepoint of its own, ${write}`,
      related: [{ range: toRange(source.stated.line, sectionSpan(lines[source.stated.line])), message: 'this line changes the FiO2 below the gas' }],
    });
  },
});
