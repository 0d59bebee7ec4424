/** Ventilator settings beyond the usual lung-protective limits. */
import { DRIVING_PRESSURE_FLAG_CMH2O, LUNG_PROTECTIVE_VT_MAX_ML_PER_KG, PLATEAU_LIMIT_CMH2O, SOURCES } from '../physiology';
import { toRange } from '../syntax/tree';
import { formatAgainst, writtenDecimals } from '../util/format';
import { derivedValueOf } from '../derive/registry';
import type { DerivedValue } from '../derive/model';
import { endExpiratoryName, setPlusIntrinsic } from './compliance-reach';
import { defineCheck, type TimepointContext } from './check';
import { inHfov } from './oscillation';
import { ownBreaths } from '../fields/modes';
import { deviceInForce, noninvasiveSupport } from '../analysis/noninvasive-support';

/** The limits live with the formulas, so the check and the values shown beside it read the same numbers. */
const VT_PER_KG_LIMIT = LUNG_PROTECTIVE_VT_MAX_ML_PER_KG;
const DRIVING_PRESSURE_LIMIT_CMH2O = DRIVING_PRESSURE_FLAG_CMH2O;

function derivedAbove(ctx: TimepointContext, id: string, limit: number, anchorField: string, message: (d: DerivedValue) => string): void {
  // The limits are of conventional breaths; an oscillator delivers none (HFOV).
  if (ctx.timepoint.values.originOf(anchorField) !== 'here' || inHfov(ctx)) return;
  const d = derivedValueOf(ctx.derivation, id);
  const anchor = ctx.timepoint.values.get(anchorField);
  if (!d || d.value <= limit + 1e-9 || !anchor || anchor.origin.kind !== 'here') return;
  ctx.report({ range: toRange(anchor.stated.line, anchor.stated.item.span), message: message(d) });
}

// The messages are made once, not as a closure per timepoint (a big note has thousands).
const tidalVolumeMessage = ({ value: v }: DerivedValue): string => `Tidal volume is ${formatAgainst(v, 1, VT_PER_KG_LIMIT)} mL/kg predicted body weight, above the ${VT_PER_KG_LIMIT} mL/kg top of the lung-protective range.`;
// The end-expiratory pressure is named as the driving pressure took it (derive/mechanics.ts
// `elasticBase`): the PEEP, a total PEEP of a hold, the set plus intrinsic PEEP, an EPAP.
const drivingPressureMessage = (d: DerivedValue): string => `Driving pressure is ${formatAgainst(d.value, 0, DRIVING_PRESSURE_LIMIT_CMH2O)} cmH2O (plateau − ${baseShown(d)}), above ${DRIVING_PRESSURE_LIMIT_CMH2O} cmH2O.`;

/** `PEEP`, `total PEEP`, `EPAP`, or `(set PEEP + intrinsic PEEP)` where the two were summed. */
function baseShown(d: DerivedValue): string {
  return setPlusIntrinsic(d) ? '(set PEEP + intrinsic PEEP)' : endExpiratoryName(d);
}

/**
 * Whether the breaths in force are the patient's own under NIV or CPAP (`ownBreaths`: the `CPAP`
 * mode of a ventilator, or with no mode NIV or CPAP of the oxygen line), where the tidal volume is
 * no setting and the 8 mL/kg limit of a ventilator's breath is not applied. Not pressure support on
 * a ventilator: the volume is the patient's, helped by a set pressure through a tube, and lung
 * protection still applies (the pressure support can be lowered).
 */
function breathIsPatientsOwn(ctx: TimepointContext): boolean {
  const values = ctx.timepoint.values;
  const mode = values.wordOf('mode');
  const own = mode !== null ? ownBreaths(mode) : ownBreaths(null, noninvasiveSupport(deviceInForce(values), values));
  return own === 'niv' || own === 'cpap';
}

export const tidalVolumeHigh = defineCheck({
  code: 'PN403',
  alias: 'tidal-volume-high',
  title: 'Tidal volume above 8 mL/kg predicted body weight',
  severity: 'warning',
  tags: ['physiology'],
  doc: {
    fires: `The tidal volume is above ${VT_PER_KG_LIMIT} mL per kg of predicted body weight (from the patient's height and sex), the top of the lung-protective range of invasive ventilation; also under pressure support on a ventilator, where the patient's breath is helped through a tube. Not in HFOV, whose oscillations are no conventional breaths; not under NIV or CPAP (an oxygen line \`niv\` or \`cpap\` with no ventilator mode, or \`mode CPAP\`), where the volume is the patient's own breath and no setting: VT/PBW is still shown there, and under NIV its hover says that a larger expired volume during NIV for de novo hypoxaemic respiratory failure was associated with failure of NIV (Carteaux 2016), with no threshold.`,
    example: 'patient sex female, height 160 cm\n@ 08:00\nvent vt 520 mL, rate 16, peep 5',
    fix: 'Check the height and sex on the patient line and the tidal volume; whether to change the setting is a clinical decision.',
  },
  source: `${SOURCES['ardsnet-2000']} Under NIV: ${SOURCES['carteaux-2016']}`,
  runTimepoint(ctx) {
    if (breathIsPatientsOwn(ctx)) return;
    derivedAbove(ctx, 'vt_per_kg_pbw', VT_PER_KG_LIMIT, 'vt', tidalVolumeMessage);
  },
});

export const plateauHigh = defineCheck({
  code: 'PN404',
  alias: 'plateau-high',
  title: 'Plateau pressure above 30 cmH2O',
  severity: 'warning',
  tags: ['physiology'],
  doc: {
    fires: `The plateau pressure is above ${PLATEAU_LIMIT_CMH2O} cmH2O, the limit of the lung-protective protocol. Not in HFOV, where no conventional breath has an end-inspiratory plateau.`,
    example: '@ 08:00\nvent peep 18, plateau 33',
    fix: 'Confirm the measurement (a true inspiratory hold); a clinical review decides what follows.',
  },
  source: SOURCES['ardsnet-2000-plateau'],
  runTimepoint(ctx) {
    if (ctx.timepoint.values.originOf('plateau') !== 'here' || inHfov(ctx)) return;
    const plat = ctx.timepoint.values.get('plateau');
    if (!plat || plat.origin.kind !== 'here' || !plat.stated.usable || plat.stated.value === null || plat.stated.value <= PLATEAU_LIMIT_CMH2O) return;
    ctx.report({ range: toRange(plat.stated.line, plat.stated.item.span), message: `Plateau pressure ${formatAgainst(plat.stated.value, writtenDecimals(plat.stated.item.value?.text ?? ''), PLATEAU_LIMIT_CMH2O)} cmH2O is above ${PLATEAU_LIMIT_CMH2O} cmH2O.` });
  },
});

export const drivingPressureHigh = defineCheck({
  code: 'PN405',
  alias: 'driving-pressure-high',
  title: 'Driving pressure above 15 cmH2O',
  severity: 'warning',
  tags: ['physiology'],
  doc: {
    fires: `The driving pressure (plateau − PEEP; the total PEEP of a hold, or the set plus intrinsic PEEP, where written, and the message names which) is above ${DRIVING_PRESSURE_LIMIT_CMH2O} cmH2O, where higher driving pressures were associated with lower survival. Not in HFOV, where driving pressure is not worked out: an oscillator gives no conventional breath with a plateau.`,
    example: '@ 08:00\nvent peep 8, plateau 27',
    fix: 'Confirm plateau and PEEP; a clinical review decides what follows.',
  },
  source: `${SOURCES['amato-2015']} The 15 cmH2O flag is common practice, no source.`,
  runTimepoint(ctx) {
    derivedAbove(ctx, 'driving_pressure', DRIVING_PRESSURE_LIMIT_CMH2O, 'plateau', drivingPressureMessage);
  },
});
