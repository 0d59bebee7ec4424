/**
 * A static compliance no respiratory system gives: a tidal volume delivered with no rise from the
 * end-expiratory pressure to the plateau, or with a rise so small that the quotient is beyond what
 * the lungs and chest wall of a healthy adult give together. Either is consistent with a
 * transcription error in the plateau, the PEEP (EPAP, CPAP level) or the tidal volume.
 *
 * Where no plateau is written, the peak tells the same under volume control (VC, SIMV, SIMV-VC:
 * fields/modes.ts), where the ventilator drives the set volume in: a peak equal to the PEEP is a
 * breath with no rise in pressure, and a dynamic compliance VT / (Ppeak − PEEP) above the ceiling
 * means a static one above it too, as the peak includes the plateau (peak = plateau + resistive
 * pressure; respiratory mechanics, common practice, no source). And under PRVC (the adaptive
 * family), which sets the tidal volume as a target and raises its inspiratory pressure until that
 * volume goes in: in a passive patient the pressure must rise there too. PRVC also lowers that
 * pressure as the patient's own effort draws in more of the target (`PRVC_ADAPTS`, read), so there the
 * finding names a patient breathing the target with little or no support as the other reading, and
 * claims nothing of the static compliance. Not under other modes (PC, PS, CPAP, NIV), which set no
 * volume, where the patient's own effort may move a volume with the airway pressure at the PEEP.
 *
 * A volume mode is never in force beside the EPAP or CPAP level of an oxygen line (a vent line with
 * a mode ends that therapy, an oxygen line ends ventilation: analysis/timeline.ts, PN311), so the
 * peak is compared with the PEEP alone.
 */
import { COMPLIANCE_CEILING_ML_PER_CMH2O, SOURCES } from '../physiology';
import { toRange } from '../syntax/tree';
import { formatAgainst, formatNumber } from '../util/format';
import { derivedValueOf } from '../derive/registry';
import type { DerivedValue } from '../derive/model';
import { defineCheck, type TimepointContext } from './check';
import { inHfov } from './oscillation';
import { modeFamily } from '../fields/modes';

const CEILING = COMPLIANCE_CEILING_ML_PER_CMH2O;

/** The input of a derived value that is the end-expiratory pressure: PEEP, EPAP or CPAP as its line names it, or the total PEEP. */
export function endExpiratoryName(d: DerivedValue): string {
  if (setPlusIntrinsic(d)) return 'set PEEP plus intrinsic PEEP';
  const name = d.inputs.find((t) => t.name !== 'Pplat' && t.name !== 'Ppeak' && t.name !== 'VT')?.name ?? 'PEEP';
  // A total PEEP of an end-expiratory hold (derive/mechanics.ts `elasticBase`) is named in words.
  return name === 'PEEPtot' ? 'total PEEP' : name;
}

/** Whether `d` took the set PEEP plus the intrinsic PEEP of a hold (derive/mechanics.ts `elasticBase`), so that a message names both. */
export function setPlusIntrinsic(d: DerivedValue): boolean {
  return d.inputs.some((t) => t.name === 'PEEPi');
}

/** The end-expiratory pressure as a place a transcription error may be, in a list: `set PEEP, the intrinsic PEEP` where the two were summed. */
function suspectName(d: DerivedValue): string {
  return setPlusIntrinsic(d) ? 'set PEEP, the intrinsic PEEP' : endExpiratoryName(d);
}

/** `the plateau or the PEEP`, or where the set and intrinsic PEEP were summed `the plateau, the set PEEP or the intrinsic PEEP`. */
function plateauOrBase(d: DerivedValue): string {
  return setPlusIntrinsic(d) ? 'the plateau, the set PEEP or the intrinsic PEEP' : `the plateau or the ${endExpiratoryName(d)}`;
}

/** A formula with its numbers, without its result: `450 ÷ (12 − 10)` of `450 ÷ (12 − 10) = 225 mL/cmH2O`. */
function withoutResult(substituted: string): string {
  const end = substituted.lastIndexOf(' = ');
  return end < 0 ? substituted : substituted.slice(0, end);
}

const aboveCeilingMessage = (c: DerivedValue): string =>
  `Static compliance ${formatAgainst(c.value, 0, CEILING)} mL/cmH2O (${withoutResult(c.substituted)}) is above ${CEILING} mL/cmH2O, more than the lungs and chest wall of a healthy adult give together: consistent with a transcription error in the plateau, the ${suspectName(c)} or the tidal volume.`;

const noRiseMessage = (vt: number, dp: DerivedValue): string =>
  `Plateau pressure ${formatNumber(dp.inputs[0]?.value ?? NaN, 0)} cmH2O equals the ${endExpiratoryName(dp)} with a tidal volume of ${formatNumber(vt, 0)} mL: a breath delivered with no rise in pressure, which no respiratory system allows; consistent with a transcription error in ${plateauOrBase(dp)}.`;

const dynamicAboveCeilingMessage = (c: DerivedValue): string =>
  `Dynamic compliance ${formatAgainst(c.value, 0, CEILING)} mL/cmH2O (${withoutResult(c.substituted)}) is above ${CEILING} mL/cmH2O, more than the lungs and chest wall of a healthy adult give together, and a static compliance is higher still: consistent with a transcription error in the peak pressure, the ${endExpiratoryName(c)} or the tidal volume.`;

const noRiseAtPeakMessage = (peak: number, vt: number, mode: string): string =>
  `Peak pressure ${formatNumber(peak, 0)} cmH2O equals the PEEP with a tidal volume of ${formatNumber(vt, 0)} mL set under ${mode}: the ventilator drove the volume in without raising the pressure, which no respiratory system allows; consistent with a transcription error in the peak pressure or the PEEP.`;

/**
 * How PRVC adapts, as read (December 2026, session 31): the source of the other reading of a low
 * rise under PRVC.
 */
const PRVC_ADAPTS =
  "PRVC sets its inspiratory pressure breath by breath from the tidal volume of the breath before, lowering it after a volume above the target and raising it after one below, and a patient's greater inspiratory effort draws a larger volume at the same pressure: read on Cooper University Health Care's emergency medicine teaching page on PRVC (emdaily1.cooperhealth.org) and on the PRVC page of the Department of Anaesthesia and Intensive Care of the Chinese University of Hong Kong (aic.cuhk.edu.hk/web8/prvc.htm). So as the patient's effort grows the mode lowers its pressure.";

/** The other reading of a low rise under PRVC: the mode lowers its pressure as the patient's effort grows (`PRVC_ADAPTS`). */
const ADAPTIVE_EFFORT = "since PRVC lowers its pressure as the patient's effort grows";

const adaptiveDynamicAboveCeilingMessage = (c: DerivedValue): string =>
  `Dynamic compliance ${formatAgainst(c.value, 0, CEILING)} mL/cmH2O (${withoutResult(c.substituted)}) is above ${CEILING} mL/cmH2O, more than the lungs and chest wall of a healthy adult give together: consistent with a transcription error in the peak pressure, the ${endExpiratoryName(c)} or the tidal volume, or with a patient drawing in most of the target volume with little support, ${ADAPTIVE_EFFORT}.`;

const adaptiveNoRiseAtPeakMessage = (peak: number, vt: number, mode: string): string =>
  `Peak pressure ${formatNumber(peak, 0)} cmH2O equals the PEEP with a target tidal volume of ${formatNumber(vt, 0)} mL under ${mode}: in a passive patient the ventilator cannot deliver the volume without raising the pressure; consistent with a transcription error in the peak pressure or the PEEP, or with a patient drawing in the whole target volume with no support, ${ADAPTIVE_EFFORT}.`;

/**
 * The peak written at a timepoint with no plateau written, under volume control or PRVC: a dynamic
 * compliance above the ceiling, or none because the peak equals the PEEP with a set (or target)
 * tidal volume above 0 (a peak below the PEEP is PN314's).
 */
function reportPeak(ctx: TimepointContext): void {
  const values = ctx.timepoint.values;
  const mode = values.wordOf('mode');
  const family = modeFamily(mode);
  if (mode === null || (family !== 'volume' && family !== 'adaptive')) return;
  const adaptive = family === 'adaptive';
  const peak = values.get('peak');
  if (!peak || peak.origin.kind !== 'here' || !peak.stated.usable || peak.stated.value === null) return;
  const range = toRange(peak.stated.line, peak.stated.item.span);
  const compliance = derivedValueOf(ctx.derivation, 'compliance_dynamic');
  if (compliance !== null) {
    if (compliance.value > CEILING + 1e-9) ctx.report({ range, message: adaptive ? adaptiveDynamicAboveCeilingMessage(compliance) : dynamicAboveCeilingMessage(compliance) });
    return;
  }
  const vt = values.get('vt');
  const peep = values.get('peep');
  if (!vt?.stated.usable || vt.stated.value === null || !(vt.stated.value > 0)) return;
  if (!peep?.stated.usable || peep.stated.value !== peak.stated.value) return;
  ctx.report({ range, message: (adaptive ? adaptiveNoRiseAtPeakMessage : noRiseAtPeakMessage)(peak.stated.value, vt.stated.value, mode) });
}

export const complianceImplausible = defineCheck({
  code: 'PN407',
  alias: 'compliance-implausible',
  title: 'Compliance no respiratory system gives',
  severity: 'warning',
  tags: ['physiology'],
  doc: {
    fires: `A plateau pressure written at the timepoint gives, with the tidal volume and the end-expiratory pressure in force (PEEP; EPAP or the CPAP level on non-invasive support), a static compliance above ${CEILING} mL/cmH2O, or none at all because the plateau equals the end-expiratory pressure while a tidal volume above 0 was delivered. A healthy adult's lungs and chest wall together give about 100 mL/cmH2O, and a passive breath cannot move a volume without a rise in pressure, so either is more likely a number written wrong (a plateau of 11 for 21, a PEEP copied into the plateau) than a measurement. Where no plateau is written, under volume control (VC, SIMV, SIMV-VC), where the ventilator drives the set volume in, the peak pressure is looked at instead: a dynamic compliance (VT ÷ (peak − PEEP)) above ${CEILING} mL/cmH2O, which means a static one above it too since the peak includes the plateau, or a peak equal to the PEEP with a set tidal volume above 0, a breath with no rise in pressure; reported on the peak. So under PRVC, which raises its pressure until the target volume goes in: a passive patient's airway pressure must rise there too; as PRVC also lowers its pressure when the patient's own effort draws in more of the target, the finding names that reading too (a patient breathing the target with little or no support). Not under other modes (PC, PS, CPAP, NIV), which set no volume, where the patient's own effort may move a volume with the airway pressure at the PEEP, and not where a plateau is written (its report stands, and no second one). Not in HFOV, where no conventional breath has a plateau. The compliance is still shown: the check reports, it does not withhold.`,
    example: '@ 08:00\nvent mode VC, vt 450 mL, peep 10, plateau 11',
    fix: 'Check the plateau (a true inspiratory hold) or the peak, the PEEP and the tidal volume against the ventilator.',
  },
  source: `${SOURCES['compliance-ceiling']} ${PRVC_ADAPTS}`,
  runTimepoint(ctx: TimepointContext) {
    const values = ctx.timepoint.values;
    // Most timepoints state neither: asked without building the values.
    const plateauHere = values.originOf('plateau') === 'here';
    if ((!plateauHere && values.originOf('peak') !== 'here') || inHfov(ctx)) return;
    // A plateau written here is the one looked at: its report stands, and the peak gives no second one.
    if (!plateauHere) return reportPeak(ctx);
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
