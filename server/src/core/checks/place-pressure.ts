/**
 * A place line that states an altitude and a barometric pressure that cannot belong together
 * (`place altitude 2000 m, barometric 700 mmHg`). The stated pressure is the one used (derive/
 * atmosphere.ts) and the altitude is left out, so a pressure or an altitude mistyped, or an
 * altitude in feet written as metres, would otherwise go unnoticed. The pressure an altitude gives
 * is taken from both model atmospheres (they differ with latitude), widened by a margin for the
 * weather and the season at one place.
 */
import type { StatedValue } from '../analysis/model';
import { displayUnit } from '../analysis/read-value';
import { PLACE_PRESSURE_MARGIN, pressureFitsAltitude } from '../derive/atmosphere';
import { SOURCES, barometricFromAltitudeStandard, barometricFromAltitudeWest } from '../physiology/atmosphere';
import { KPA_DECIMALS, kpaFromMmhg } from '../present';
import { toRange } from '../syntax/tree';
import { formatAgainst, formatNumber } from '../util/format';
import { defineCheck, type CheckContext } from './check';

export const placePressureUnlikeAltitude = defineCheck({
  code: 'PN320',
  alias: 'pressure-unlike-altitude',
  title: 'Barometric pressure unlike the altitude on its place line',
  severity: 'warning',
  tags: ['plausibility', 'units'],
  doc: {
    fires: `A place line states both an altitude and a barometric pressure, and the pressure is more than ${PLACE_PRESSURE_MARGIN * 100} % outside what that altitude gives by the U.S. Standard Atmosphere and West's model atmosphere (which differ by a few mmHg). The stated pressure is the one used for PiO2, the A–a gradient and whether the P/F is adjusted for altitude (above 1,000 m), and the altitude is left out.`,
    example: 'place altitude 2000 m, barometric 700 mmHg',
    fix: 'Check both numbers and their units (an altitude in feet written as metres, a pressure in kPa written as mmHg). Keep the pressure measured where the patient is, or remove it to have it estimated from the altitude.',
  },
  source: `${SOURCES['west-1996']} ${SOURCES['us-standard-atmosphere-1976']} The ${PLACE_PRESSURE_MARGIN * 100} % margin for weather and season: Pneumark's own convention, no source.`,
  run(ctx) {
    const header = ctx.analysis.timeline.header;
    for (let i = 0; i < header.length; i++) if (header[i]!.fieldId === 'barometric') compare(ctx, header[i]!, header);
  },
  runTimepoint(ctx) {
    const stated = ctx.timepoint.stated;
    // Most timepoints state no place: nothing more is looked at.
    for (let i = 0; i < stated.length; i++) if (stated[i]!.fieldId === 'barometric') compare(ctx, stated[i]!, stated);
  },
});

/** Compares a stated pressure with an altitude stated on its line, when both are used. */
function compare(ctx: CheckContext, pressure: StatedValue, stated: readonly StatedValue[]): void {
  if (!pressure.usable || pressure.value === null) return;
  let altitude: StatedValue | null = null;
  for (let i = 0; i < stated.length; i++) {
    const s = stated[i]!;
    if (s.fieldId === 'altitude' && s.line === pressure.line && s.usable && s.value !== null) altitude = s;
  }
  if (altitude === null || pressureFitsAltitude(pressure.value, altitude.value!)) return;
  const west = barometricFromAltitudeWest(altitude.value!);
  const standard = barometricFromAltitudeStandard(altitude.value!);
  if (west === null || standard === null) return;
  const low = Math.min(west, standard);
  const high = Math.max(west, standard);
  const pb = pressure.value;
  const inKpa = pressure.readUnit === 'kPa';
  const pbShown = inKpa
    ? `${formatNumber(kpaFromMmhg(pb), KPA_DECIMALS)} kPa (${formatNumber(pb, 0)} mmHg)`
    : `${formatNumber(pb, 0)} mmHg`;
  const rangeMmhg = `${span(formatNumber(low, 0), formatNumber(high, 0))} mmHg`;
  const rangeShown = inKpa
    ? `${span(formatNumber(kpaFromMmhg(low), KPA_DECIMALS), formatNumber(kpaFromMmhg(high), KPA_DECIMALS))} kPa (${rangeMmhg})`
    : rangeMmhg;
  const altitudeNumber = altitude.item.value;
  const altitudeShown = `${altitudeNumber && altitudeNumber.kind === 'number' ? altitudeNumber.text : formatAgainst(altitude.value!, 0, NaN)} ${displayUnit(altitude.readUnit ?? 'm')}`;
  ctx.report({
    range: toRange(pressure.line, pressure.item.span),
    message: `Barometric pressure ${pbShown} is unlike altitude ${altitudeShown} on the same line, where about ${rangeShown} is expected (by the U.S. Standard Atmosphere and West's model; weather moves it by a few percent). The pressure is used and the altitude is not: check both.`,
    related: [{ range: toRange(altitude.line, altitude.item.span), message: 'the altitude on this line' }],
  });
}

/**
 * The pressures the two model atmospheres give, as shown: one number where they agree at the
 * decimals shown (at sea level both give 760 mmHg), never a range with equal ends (`760–760`).
 */
function span(low: string, high: string): string {
  return low === high ? low : `${low}–${high}`;
}
