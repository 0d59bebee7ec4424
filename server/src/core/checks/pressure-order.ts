/**
 * Pressures that must come in order: PEEP ≤ plateau ≤ peak on the ventilator, EPAP ≤ IPAP on
 * non-invasive ventilation, and diastolic ≤ systolic blood pressure. Ventilator pressures compare
 * the values in force at a timepoint (one may be carried), and report only where one of the pair
 * was stated there. PEEP and peak are compared only where no plateau is in force: with one, a PEEP
 * above the peak puts one of the other two pairs out of order, and that one is reported.
 */
import { toRange } from '../syntax/tree';
import { decimalsAgainst, formatShort } from '../util/format';
import { defineCheck, usableNumber, type TimepointContext } from './check';
import { deviceInForce, endExpiratoryField, nivPressuresNotGiven } from '../analysis/noninvasive-support';
import { carriedFromText } from '../present';

function orderCheck(ctx: TimepointContext, lowId: string, highId: string, message: (low: number, high: number) => string): void {
  const tp = ctx.timepoint;
  // Most timepoints have the pair in order: compared without building the values.
  const lowValue = tp.values.numberOf(lowId);
  const highValue = tp.values.numberOf(highId);
  if (lowValue === null || highValue === null || lowValue <= highValue) return;
  const low = usableNumber(tp, lowId);
  const high = usableNumber(tp, highId);
  if (!low || !high || low.value <= high.value) return;
  const here = [high, low].find((v) => v.input.origin.kind === 'here');
  if (!here) return;
  const other = here === high ? low : high;
  const o = other.input.origin;
  ctx.report({
    range: toRange(here.input.stated.line, here.input.stated.item.span),
    message: message(low.value, high.value),
    ...(o.kind !== 'default' && o.kind !== 'here'
      ? { related: [{ range: toRange(o.line, o.span), message: o.kind === 'carried' ? carriedFromText(o, 'here') : 'carried from here' }] }
      : {}),
  });
}

/** A pressure shown beside the one it exceeds, with the decimals that keep the two apart (10.04 above 10, never 10 above 10). */
const above = (value: number, other: number): string => formatShort(value, decimalsAgainst(value, 2, other));

const peepAbovePlateauMessage = (low: number, high: number): string => `PEEP ${above(low, high)} cmH2O is above the plateau pressure ${above(high, low)} cmH2O; plateau pressure includes PEEP.`;
const plateauAbovePeakMessage = (low: number, high: number): string => `Plateau pressure ${above(low, high)} cmH2O is above the peak pressure ${above(high, low)} cmH2O; were they swapped?`;
const peepAbovePeakMessage = (low: number, high: number): string => `PEEP ${above(low, high)} cmH2O is above the peak pressure ${above(high, low)} cmH2O; peak pressure includes PEEP.`;
const epapAbovePeakMessage = (low: number, high: number): string => `EPAP ${above(low, high)} cmH2O is above the peak pressure ${above(high, low)} cmH2O; peak pressure includes the EPAP.`;
const cpapAbovePeakMessage = (low: number, high: number): string => `CPAP ${above(low, high)} cmH2O is above the peak pressure ${above(high, low)} cmH2O; peak pressure includes the CPAP.`;

export const peepAbovePlateau = defineCheck({
  code: 'PN303',
  alias: 'peep-above-plateau',
  title: 'PEEP above plateau pressure',
  severity: 'error',
  tags: ['plausibility'],
  doc: {
    fires: 'PEEP is higher than the plateau pressure in force at the same timepoint. Plateau pressure includes PEEP, so it cannot be lower.',
    example: 'vent peep 14, plateau 12',
    fix: 'Check both values; a plateau written as a driving pressure (plateau − PEEP) is a common slip.',
  },
  source: 'respiratory mechanics: plateau pressure is measured above atmospheric and includes PEEP (common practice, no source)',
  runTimepoint(ctx) {
    orderCheck(ctx, 'peep', 'plateau', peepAbovePlateauMessage);
  },
});

export const plateauAbovePeak = defineCheck({
  code: 'PN304',
  alias: 'plateau-above-peak',
  title: 'Plateau above peak pressure',
  severity: 'error',
  tags: ['plausibility'],
  doc: {
    fires: 'The plateau pressure is higher than the peak pressure at the same timepoint; the plateau is measured after the peak, once flow stops.',
    example: 'vent plateau 28, peak 25',
    fix: 'Check whether the two were swapped.',
  },
  source: 'respiratory mechanics: peak = plateau + resistive pressure (common practice, no source)',
  runTimepoint(ctx) {
    orderCheck(ctx, 'plateau', 'peak', plateauAbovePeakMessage);
  },
});

export const peepAbovePeak = defineCheck({
  code: 'PN314',
  alias: 'peep-above-peak',
  title: 'PEEP above peak pressure',
  severity: 'error',
  tags: ['plausibility'],
  doc: {
    fires: 'PEEP is higher than the peak pressure in force at the same timepoint, where no plateau pressure is measured. The peak pressure is measured above atmospheric pressure and includes PEEP (PEEP plus the pressures that move the breath), so it cannot be lower. With a plateau measured, PEEP above plateau (PN303) or plateau above peak (PN304) is reported instead. On NIV or CPAP (an oxygen line in force, and a peak read on a vent line of readings) the EPAP or the CPAP level is the end-expiratory pressure compared, the one the device gives where both are written (the level under `cpap`, the EPAP under `niv`); not one the device does not give (PN318).',
    example: 'vent peep 12, peak 10',
    fix: 'Check both values; a peak written as the pressure above PEEP (a set inspiratory pressure or pressure support) is a common slip.',
  },
  source: 'respiratory mechanics: peak pressure = PEEP + resistive + elastic pressure, measured above atmospheric (common practice, no source)',
  runTimepoint(ctx) {
    // A plateau in force is compared with both (PN303, PN304); asked without building the value.
    const values = ctx.timepoint.values;
    if (values.numberOf('peak') === null || values.numberOf('plateau') !== null) return;
    // The end-expiratory pressure in force: PEEP, else the one of the oxygen line its device gives
    // (the CPAP level under `cpap`, else the EPAP first); none the device does not give (PN318
    // reports it, unused).
    if (values.numberOf('peep') !== null) orderCheck(ctx, 'peep', 'peak', peepAbovePeakMessage);
    else if (values.numberOf('epap') === null && values.numberOf('cpap_level') === null) return;
    else {
      const id = endExpiratoryField(deviceInForce(values), values);
      if (id !== null) orderCheck(ctx, id, 'peak', id === 'epap' ? epapAbovePeakMessage : cpapAbovePeakMessage);
    }
  },
});

const epapAboveIpapMessage = (low: number, high: number): string => `EPAP ${above(low, high)} cmH2O is above the IPAP ${above(high, low)} cmH2O; the inspiratory pressure is the higher of the two. Were they swapped?`;

export const epapAboveIpap = defineCheck({
  code: 'PN315',
  alias: 'epap-above-ipap',
  title: 'EPAP above IPAP',
  severity: 'error',
  tags: ['plausibility'],
  doc: {
    fires: 'On non-invasive ventilation (an oxygen line with `ipap` and `epap`), the EPAP is higher than the IPAP in force at the same timepoint. Bilevel ventilation raises the pressure from EPAP to IPAP on each breath (IPAP = EPAP + the pressure support), so IPAP cannot be the lower one; equal pressures are continuous pressure, as CPAP. EPAP counts as PEEP for the oxygenation band, so swapped values also give the band a wrong PEEP. The two are not compared beside a device that gives neither, one that gives no set airway pressure (`oxygen mask, ipap 6, epap 14`) or `cpap`, where PN318 reports each.',
    example: 'oxygen niv ipap 6, epap 14, fio2 0.4',
    fix: 'Check whether the two were swapped (`niv ipap 14, epap 6`).',
  },
  source: 'non-invasive ventilation: the inspiratory positive airway pressure is set above the expiratory one, their difference being the pressure support (common practice, no source)',
  runTimepoint(ctx) {
    // Asked without building the values: most timepoints are not on NIV. Beside a device that gives
    // neither (one that gives no set airway pressure, or `cpap`), the two are not compared (PN318
    // reports each, unused).
    const values = ctx.timepoint.values;
    if (values.numberOf('epap') === null || values.numberOf('ipap') === null || nivPressuresNotGiven(values)) return;
    orderCheck(ctx, 'epap', 'ipap', epapAboveIpapMessage);
  },
});

export const systolicBelowDiastolic = defineCheck({
  code: 'PN305',
  alias: 'systolic-below-diastolic',
  title: 'Systolic below diastolic',
  severity: 'error',
  tags: ['plausibility'],
  doc: {
    fires: 'A blood pressure is written with the systolic value lower than the diastolic.',
    example: 'vitals bp 58/96',
    fix: 'Write systolic/diastolic: `bp 96/58`. The quick fix swaps them.',
  },
  source: 'definition of systolic and diastolic pressure, no source needed',
  runTimepoint(ctx) {
    for (const s of ctx.timepoint.stated) {
      if (s.fieldId !== 'bp' || !s.parts) continue;
      const sys = s.parts[0];
      const dia = s.parts[1];
      const value = s.item.value;
      if (sys === undefined || dia === undefined || sys >= dia || value?.kind !== 'pair') continue;
      const [a, b] = value.parts;
      ctx.report({
        range: toRange(s.line, value.span),
        message: `Blood pressure ${value.text} mmHg: the systolic value is below the diastolic.`,
        fixes: a && b ? [{ title: `Swap to ${b.text}/${a.text}`, edits: [{ range: toRange(s.line, value.span), newText: `${b.text}/${a.text}` }] }] : [],
      });
    }
  },
});
