/**
 * A tidal volume written per kg of predicted body weight (`vt 6 mL/kg`): read in mL where the
 * patient values in force where it is written give a PBW (the timeline's `PerKgVolume`), else kept
 * as written and not used (PN325 says what to add).
 */
import { predictedBodyWeightKg } from '../physiology/mechanics';
import { ADULT_FROM_YEARS } from '../physiology/adults';

/** The unit id of a tidal volume per kg of predicted body weight. */
export const PER_KG_PBW = 'mL/kg';

/** Age (years) from which the ARDS Network's predicted body weight is worked out: the one adult age of physiology/adults.ts. */
export { ADULT_FROM_YEARS as PER_KG_ADULT_FROM_YEARS } from '../physiology/adults';

/**
 * Above it a tidal volume in mL/kg is impossible, and taken for a volume in mL written with the
 * wrong unit (`vt 450 mL/kg`): not converted (common practice, no source: twice the largest of the
 * tidal volumes once given, 10 to 15 mL per kg of body weight, and above the 12 mL/kg of PBW of the
 * trial's traditional arm, read in the abstract of ARDS Network 2000 as SOURCES['ardsnet-2000'] cites it).
 */
export const VT_PER_KG_HARD_MAX = 30;

/**
 * The usual tidal volume per kg of PBW, the lung-protective range of the ARDS Network protocol:
 * 4 to 8 mL/kg (ARDS Network 2000, as SOURCES['ardsnet-2000'] cites it).
 */
export const VT_PER_KG_USUAL = { min: 4, max: 8 } as const;

/**
 * The predicted body weight (kg) from a height (cm), a sex word and an age (years, null when not
 * stated): null without height or sex, for a child (the equation is for adults), or where the
 * equation gives no weight. ARDS Network 2000 (`predictedBodyWeightKg`).
 */
export function pbwFrom(heightCm: number | null, sex: string | null, ageYears: number | null): number | null {
  if (heightCm === null || (sex !== 'male' && sex !== 'female')) return null;
  if (ageYears !== null && ageYears < ADULT_FROM_YEARS) return null;
  return predictedBodyWeightKg(heightCm, sex);
}
