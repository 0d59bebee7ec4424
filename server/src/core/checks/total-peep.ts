/**
 * Total PEEP (`peep_total`, an end-expiratory hold) and intrinsic PEEP (`autopeep`) that cannot be:
 * in a passive patient the pressure at the end of a hold is the set PEEP plus any intrinsic PEEP, so
 * a total below the set PEEP, a total above the plateau (the end-inspiratory hold includes it), or an
 * intrinsic PEEP other than total − set, each beyond 1 cmH2O of rounding, is consistent with a
 * transcription error or a hold not made at rest (respiratory mechanics, common practice, no source).
 */
import type { InputValue } from '../analysis/model';
import { toRange } from '../syntax/tree';
import { formatShort } from '../util/format';
import { defineCheck, usableNumber } from './check';

/** What the two readings of one hold may differ by from rounding on the display (common practice, no source). */
export const TOTAL_PEEP_TOLERANCE_CMH2O = 1;

const n = (v: number): string => formatShort(v, 1);

export const totalPeepImpossible = defineCheck({
  code: 'PN418',
  alias: 'total-peep-impossible',
  title: 'Total or intrinsic PEEP that cannot be',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: 'A total PEEP (`peep_total`, `tpeep`: an end-expiratory hold) is below the set PEEP in force or above the plateau pressure of its timepoint, or an intrinsic PEEP (`autopeep`, `ipeep`) differs from total − set PEEP where all three are known; each by more than 1 cmH2O, allowed for rounding. In a passive patient the pressure at the end of an expiratory hold is the set PEEP plus any intrinsic PEEP, and the plateau includes it.',
    example: 'vent peep 10, tpeep 7',
    fix: 'Check the values against the ventilator; a hold made while the patient breathes is not at rest and is better not recorded as a total PEEP.',
  },
  source: 'respiratory mechanics: total PEEP = set PEEP + intrinsic PEEP, measured in an end-expiratory hold in a passive patient (common practice, no source)',
  runTimepoint(ctx) {
    const tp = ctx.timepoint;
    // Most timepoints have neither reading: asked without building the values.
    if (tp.values.numberOf('peep_total') === null && tp.values.numberOf('autopeep') === null) return;
    const total = usableNumber(tp, 'peep_total');
    const set = usableNumber(tp, 'peep');
    const plateau = usableNumber(tp, 'plateau');
    const intrinsic = usableNumber(tp, 'autopeep');
    const at = (v: { input: InputValue }) => toRange(v.input.stated.line, v.input.stated.item.span);
    const here = (v: { input: InputValue }) => v.input.origin.kind === 'here';
    if (total && here(total)) {
      if (set && set.value - total.value > TOTAL_PEEP_TOLERANCE_CMH2O) {
        ctx.report({ range: at(total), message: `Total PEEP ${n(total.value)} cmH2O is below the set PEEP ${n(set.value)} cmH2O: the pressure at the end of an expiratory hold includes the set PEEP. Consistent with a transcription error or a hold not made at rest.` });
      }
      if (plateau && total.value - plateau.value > TOTAL_PEEP_TOLERANCE_CMH2O) {
        ctx.report({ range: at(total), message: `Total PEEP ${n(total.value)} cmH2O is above the plateau pressure ${n(plateau.value)} cmH2O: the plateau includes the end-expiratory pressure. Consistent with a transcription error.` });
      }
    }
    if (total && set && intrinsic && here(intrinsic)) {
      const expected = total.value - set.value;
      if (Math.abs(intrinsic.value - expected) > TOTAL_PEEP_TOLERANCE_CMH2O) {
        ctx.report({ range: at(intrinsic), message: `Intrinsic PEEP ${n(intrinsic.value)} cmH2O is not total − set PEEP: ${n(total.value)} − ${n(set.value)} = ${n(expected)} cmH2O. Consistent with a transcription error in one of the three.` });
      }
    }
  },
});
