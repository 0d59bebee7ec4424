/**
 * Children's length and height by age, from published growth references: what a child's usual
 * height is judged against (analysis/bounds.ts, `childHeightMinCm`).
 *
 * Units: age in days since birth (the first year, `lengthForAgeGirlsCm`) or in years (1 to 19,
 * `heightForAgeGirlsCm`), length and height in cm. Every function returns `null` (never NaN or
 * ±Infinity, never throws) when an input is non-finite or outside the stated domain.
 */
import { allFinite, finiteOrNull, inClosedRange } from './numeric';

/** Citations for the figures in this module (key → citation). */
export const SOURCES = Object.freeze({
  'who-length-for-age-2006':
    "WHO Multicentre Growth Reference Study Group. WHO Child Growth Standards: length/height-for-age, weight-for-age, weight-for-length, weight-for-height and body mass index-for-age: methods and development. Geneva: World Health Organization, 2006 (citation from memory): the girls' length-for-age by day of age, L = 1 with M and S on every row, read in its reproduction in the WHO's own R package anthro (github.com/WorldHealthOrganization/anthro, data-raw/growthstandards/lenanthro.txt, sex 2); the boys' rows (sex 1) are longer at every age read.",
  'who-height-for-age-2006-years':
    "WHO Multicentre Growth Reference Study Group. WHO Child Growth Standards: length/height-for-age … methods and development. Geneva: World Health Organization, 2006 (citation from memory): the girls' rows at 1 to 4 years, read in its reproduction in the WHO's own R package anthro (data-raw/growthstandards/lenanthro.txt, sex 2): day 365 M 74.0049 S 0.03479 (length), day 731 M 85.7299 S 0.03764 (height, standing, from 2 years; the length of day 730 is M 86.4008 S 0.03733), day 1096 M 95.0572 S 0.04007, day 1461 M 102.7312 S 0.04193; day 1826 M 109.4189 S 0.04346, above the 2007 reference's row at 5 years, which is taken; L = 1 on every row.",
  'who-height-for-age-2007':
    "de Onis M, Onyango AW, Borghi E, Siyam A, Nishida C, Siekmann J. Development of a WHO growth reference for school-aged children and adolescents. Bull World Health Organ 2007;85:660–667 (citation from memory): height-for-age by month from 5 to 19 years, L = 1 with M and S on every row, read in its reproduction in the WHO's own R package anthroplus (github.com/WorldHealthOrganization/anthroplus, data-raw/growthstandards/hfawho2007.txt), the rows of whole years (months 60 to 228) taken: the girls' (sex 2), but at 10 to 13 years the boys' (sex 1: months 120, 132, 144 and 156), which are shorter there at −3 SD (the girls' growth spurt comes earlier).",
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

/**
 * Height-for-age by whole year as read, of the sex shorter at −3 SD at that year, [years, M (cm),
 * S]; L is 1 on every row. 1 year: the length of the girls' first-year rows' last row (day 365); 2
 * to 4 years: the WHO Child Growth Standards' girls' height (standing) at days 731, 1096 and 1461
 * (`who-height-for-age-2006-years`); 5 to 19 years: the WHO 2007 reference at months 60 to 228
 * (`who-height-for-age-2007`), the girls' but at 10 to 13 years the boys'. The 2007 girls' row at 5
 * years is below the 2006 standards' (109.0725 against 109.4189 cm at the median, the same S). The
 * boys' rows read at 1 to 9 and 14 to 19 years, and the girls' at 10 to 13, are taller at −3 SD.
 */
const SHORTER_HEIGHT_BY_YEAR_MS: readonly (readonly [number, number, number])[] = Object.freeze([
  [1, 74.0049, 0.03479],
  [2, 85.7299, 0.03764],
  [3, 95.0572, 0.04007],
  [4, 102.7312, 0.04193],
  [5, 109.0725, 0.04346],
  [6, 115.1244, 0.04447],
  [7, 120.8105, 0.04525],
  [8, 126.5558, 0.04581],
  [9, 132.4944, 0.04612],
  // Boys, WHO 2007 months 120, 132, 144, 156.
  [10, 137.7795, 0.04626],
  [11, 143.1126, 0.04703],
  [12, 149.0807, 0.04753],
  [13, 156.0426, 0.0476],
  [14, 159.789, 0.04345],
  [15, 161.6692, 0.04255],
  [16, 162.5156, 0.04176],
  [17, 162.8545, 0.04109],
  [18, 163.0595, 0.04053],
  [19, 163.1548, 0.04009],
].map((row) => Object.freeze(row as [number, number, number])));

/** The age (years) from which `heightForAgeShorterCm` answers, where the first year's rows end. */
export const HEIGHT_BY_YEAR_FROM_YEARS = 1;

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

/**
 * The height (cm) at `z` standard deviations from the median at an age in years (1 to 19) of the
 * sex shorter at −3 SD at each whole year (girls, but boys at 10 to 13 years): M × (1 + z·S) on the
 * rows of whole years read, straight between them. Meant for z = −3, where the sex was chosen. At 1
 * year it is the girls' first-year length at day 365 (`lengthForAgeGirlsCm`), the same row, so the
 * two meet. Between whole years the straight line is below the monthly rows where the curve is
 * concave, and above the shorter sex's monthly −3 SD by at most 0.14 cm where it is convex (0.13 cm
 * at 12.5 years against the 2007 reference's month 150, computed from the rows read). Sources:
 * `who-height-for-age-2006-years`, `who-height-for-age-2007`.
 */
export function heightForAgeShorterCm(ageYears: number, z: number): number | null {
  if (!allFinite(ageYears, z) || !inClosedRange(ageYears, HEIGHT_BY_YEAR_FROM_YEARS, 19)) return null;
  let i = 1;
  while (i < SHORTER_HEIGHT_BY_YEAR_MS.length - 1 && SHORTER_HEIGHT_BY_YEAR_MS[i]![0] < ageYears) i++;
  const before = SHORTER_HEIGHT_BY_YEAR_MS[i - 1]!;
  const after = SHORTER_HEIGHT_BY_YEAR_MS[i]!;
  const share = (ageYears - before[0]) / (after[0] - before[0]);
  const low = lengthOnRow(before, z);
  return finiteOrNull(low + share * (lengthOnRow(after, z) - low));
}
