/**
 * A static compliance no respiratory system gives: a tidal volume delivered with no rise from the
 * end-expiratory pressure to the plateau, or with a rise so small that the quotient is beyond what
 * the lungs and chest wall of a healthy adult give together. Either is consistent with a
 * transcription error in the plateau, the PEEP (EPAP, CPAP level) or the tidal volume.
 */
import { COMPLIANCE_CEILING_ML_PER_CMH2O, SOURCES } from '../physiology';
import { toRange } from '../syntax/tree';
import { formatAgainst, formatNumber } from '../util/format';
import { derivedValueOf } from '../derive/registry';
import type { DerivedValue } from '../derive/model';
import { defineCheck, type TimepointContext } from './check';
import { inHfov } from './oscillation';

const CEILING = COMPLIANCE_CEILING_ML_PER_CMH2O;

/** The input of a derived value that is the end-expiratory pressure: PEEP, EPAP or CPAP as its line names it. */
function endExpiratoryName(d: DerivedValue): string {
  return d.inputs.find((t) => t.name !== 'Pplat' && t.name !== 'VT')?.name ?? 'PEEP';
}

/** A formula with its numbers, without its result: `450 ÷ (12 − 10)` of `450 ÷ (12 − 10) = 225 mL/cmH2O`. */
function withoutResult(substituted: string): string {
  const end = substituted.lastIndexOf(' = ');
  return end < 0 ? substituted : substituted.slice(0, end);
}

const aboveCeilingMessage = (c: DerivedValue): string =>
  `Static compliance ${formatAgainst(c.value, 0, CEILING)} mL/cmH2O (${withoutResult(c.substituted)}) is above ${CEILING} mL/cmH2O, more than the lungs and chest wall of a healthy adult give together: consistent with a transcription error in the plateau, the ${endExpiratoryName(c)} or the tidal volume.`;

const noRiseMessage = (vt: number, dp: DerivedValue): string =>
  `Plateau pressure ${formatNumber(dp.inputs[0]?.value ?? NaN, 0)} cmH2O equals the ${endExpiratoryName(dp)} with a tidal volume of ${formatNumber(vt, 0)} mL: a breath delivered with no rise in pressure, which no respiratory system allows; consistent with a transcription error in the plateau or the ${endExpiratoryName(dp)}.`;

export const complianceImplausible = defineCheck({
  code: 'PN407',
  alias: 'compliance-implausible',
  title: 'Static compliance no respiratory system gives',
  severity: 'warning',
  tags: ['physiology'],
  doc: {
    fires: `A plateau pressure written at the timepoint gives, with the tidal volume and the end-expiratory pressure in force (PEEP; EPAP or the CPAP level on non-invasive support), a static compliance above ${CEILING} mL/cmH2O, or none at all because the plateau equals the end-expiratory pressure while a tidal volume above 0 was delivered. A healthy adult's lungs and chest wall together give about 100 mL/cmH2O, and a passive breath cannot move a volume without a rise in pressure, so either is more likely a number written wrong (a plateau of 11 for 21, a PEEP copied into the plateau) than a measurement. Not in HFOV, where no conventional breath has a plateau. The compliance is still shown: the check reports, it does not withhold.`,
    example: '@ 08:00\nvent mode VC, vt 450 mL, peep 10, plateau 11',
    fix: 'Check the plateau (a true inspiratory hold), the PEEP and the tidal volume against the ventilator.',
  },
  source: SOURCES['compliance-ceiling'],
  runTimepoint(ctx: TimepointContext) {
    const values = ctx.timepoint.values;
    if (values.originOf('plateau') !== 'here' || inHfov(ctx)) return;
    const plateau = values.get('plateau');
    if (!plateau || plateau.origin.kind !== 'here' || !plateau.stated.usable) return;
    const range = toRange(plateau.stated.line, plateau.stated.item.span);
    const compliance = derivedValueOf(ctx.derivation, 'compliance_static');
    if (compliance !== null) {
      if (compliance.value > CEILING + 1e-9) ctx.report({ range, message: aboveCeilingMessage(compliance) });
      return;
    }
    const dp = derivedValueOf(ctx.derivation, 'driving_pressure');
    const vt = values.numberOf('vt');
    if (dp === null || dp.value !== 0 || vt === null || !(vt > 0) || !values.get('vt')?.stated.usable) return;
    ctx.report({ range, message: noRiseMessage(vt, dp) });
  },
});
