/**
 * Infants' length by age, from published growth references: what an infant's usual length is
 * judged against (analysis/bounds.ts, `infantLengthMinCm`).
 *
 * Units: age in days since birth, length in cm. Every function returns `null` (never NaN or
 * ±Infinity, never throws) when an input is non-finite or outside the stated domain.
 */
import { allFinite, finiteOrNull, inClosedRange } from './numeric';

/** Citations for the figures in this module (key → citation). */
export const SOURCES = Object.freeze({
  'who-length-for-age-2006':
    "WHO Multicentre Growth Reference Study Group. WHO Child Growth Standards: length/height-for-age, weight-for-age, weight-for-length, weight-for-height and body mass index-for-age: methods and development. Geneva: World Health Organization, 2006 (citation from memory): the girls' length-for-age by day of age, L = 1 with M and S on every row, read in its reproduction in the WHO's own R package anthro (github.com/WorldHealthOrganization/anthro, data-raw/growthstandards/lenanthro.txt, sex 2); the boys' rows (sex 1) are longer at every age read.",
  'intergrowth-very-preterm-2016':
    'Villar J, Giuliani F, Fenton TR, et al. INTERGROWTH-21st very preterm size at birth reference charts. Lancet 2016;387(10021):844–845 (citation from memory): a girl born at 24+0 weeks of gestation is 31.8 cm long at the median and 24.0 cm at −3 SD, read in its reproduction in the pygrowthstandards repository (data/raw/intergrowth-21st-newborn-size-very-preterm-infants, girls\' stature, day 168).',
} as const);

/**
 * The length (cm) at −3 SD of a girl born at 24+0 weeks of gestation, the earliest gestation of
 * the reference read. Source: `intergrowth-very-preterm-2016`.
 */
export const PRETERM_GIRL_LENGTH_MINUS_3SD_CM = 24.0;

/** Girls' length-for-age as read, one row a month: [day of age, M (cm), S]; L is 1 on every row. */
const GIRLS_LENGTH_MS: readonly (readonly [number, number, number])[] = Object.freeze([
  [0, 49.1477, 0.0379],
  [30, 53.6326, 0.03641],
  [61, 57.0796, 0.03568],
  [91, 59.7773, 0.0352],
  [122, 62.1071, 0.03486],
  [152, 64.019, 0.03463],
  [183, 65.751, 0.03448],
  [213, 67.2842, 0.03441],
  [244, 68.7732, 0.0344],
  [274, 70.1463, 0.03444],
  [304, 71.4656, 0.03452],
  [335, 72.7788, 0.03464],
  [365, 74.0049, 0.03479],
].map((row) => Object.freeze(row as [number, number, number])));

/** Length (cm) at `z` SD on a row: M × (1 + z·S), the LMS method with L = 1. */
function lengthOnRow(row: readonly [number, number, number], z: number): number {
  return row[1] * (1 + z * row[2]);
}

/**
 * A girl's length (cm) at `z` standard deviations from the median for her age (days since birth,
 * 0 to 365): M × (1 + z·S) on the monthly rows read, straight between them. The curves are
 * concave over the first year, so between rows the result is at most the reference's own day (a
 * floor made from it is never above the reference). Girls are the shorter sex at every age read.
 * Source: `who-length-for-age-2006`.
 */
export function lengthForAgeGirlsCm(ageDays: number, z: number): number | null {
  if (!allFinite(ageDays, z) || !inClosedRange(ageDays, 0, 365)) return null;
  let i = 1;
  while (i < GIRLS_LENGTH_MS.length - 1 && GIRLS_LENGTH_MS[i]![0] < ageDays) i++;
  const before = GIRLS_LENGTH_MS[i - 1]!;
  const after = GIRLS_LENGTH_MS[i]!;
  const share = (ageDays - before[0]) / (after[0] - before[0]);
  const low = lengthOnRow(before, z);
  return finiteOrNull(low + share * (lengthOnRow(after, z) - low));
}
