/**
 * Bounds in context. Soft lower bounds of arterial gas pressures are waived where the
 * barometric pressure is low, because extreme altitude makes such values real
 * (see the `boundsSource` of pao2 and paco2 in the field registry).
 */
import { fieldById, type Bounds, type FieldDef } from '../fields/registry';
import { convert, unitById, type UnitDef } from '../fields/units';
import { ADULT_FROM_YEARS } from '../physiology/adults';
import { heightForAgeShorterCm, lengthForAgeGirlsCm, PRETERM_GIRL_LENGTH_MINUS_3SD_CM } from '../physiology/growth';
import { halfLastDigit } from '../util/format';

export const LOW_PRESSURE_WAIVER_MMHG = 500;
const WAIVED_AT_ALTITUDE = new Set(['pao2', 'paco2', 'pvo2', 'pvco2', 'spo2', 'sao2']);

export interface BoundsContext {
  /** Barometric pressure in force, mmHg, when known. */
  readonly barometricMmhg: number | null;
}

/**
 * The lowest usual tidal volume, mL per kg of body size: half the 4 mL/kg predicted body weight at
 * the bottom of the ARDS Network protocol's range, to leave room for ultra-protective settings
 * (common practice, no source). With no body size in force, the tidal volume's soft minimum in the
 * field registry applies: this figure times the 25 kg soft minimum of weight (50 mL).
 */
export const VT_USUAL_MIN_ML_PER_KG = 2;

/**
 * The soft bounds of a field where the barometric pressure in force is `barometricMmhg` (null:
 * unknown) and the patient's body size is `bodyKg` (the smaller of the weight and the predicted
 * body weight in force; null: unknown). A tidal volume's usual minimum follows the body size when
 * one is known (`VT_USUAL_MIN_ML_PER_KG`): 5 mL is usual only for the smallest infants.
 */
export function softBoundsAt(field: FieldDef, barometricMmhg: number | null, bodyKg: number | null = null): Bounds | undefined {
  const soft = field.soft;
  if (!soft) return undefined;
  if (bodyKg !== null && bodyKg > 0 && field.id === 'vt') return { min: VT_USUAL_MIN_ML_PER_KG * bodyKg, max: soft.max };
  if (barometricMmhg !== null && barometricMmhg < LOW_PRESSURE_WAIVER_MMHG && WAIVED_AT_ALTITUDE.has(field.id)) {
    return soft.max === undefined ? {} : { max: soft.max };
  }
  return soft;
}

/**
 * Whether a field is a body size whose usual minimum is an adult's (height 120 cm, weight 25 kg):
 * not applied under ADULT_FROM_YEARS, neither as the usual minimum (PN302) nor as the bottom of the
 * doubt window of a bare number (PN204, `doubtBoundsAt`).
 */
export function isBodySize(field: FieldDef): boolean {
  return field.id === 'height' || field.id === 'weight';
}

/** Whether an age (years; null: none in force) is a child's: under ADULT_FROM_YEARS. */
export function isChildAge(ageYears: number | null): boolean {
  return ageYears !== null && ageYears < ADULT_FROM_YEARS;
}

/**
 * A child's size, for a body size under ADULT_FROM_YEARS: from the field's hard minimum (20 cm,
 * 0.3 kg) to its usual maximum (220 cm, 250 kg). A child's size runs from a preterm newborn's to an
 * adult's (common practice, no source), so no bound between tells a child's height in inches from
 * one in cm: a bare `height 70` is an infant's 70 cm, not doubted as 70 in. It is both the doubt
 * window of a bare number and where it would be ordinary in another unit: a number impossible in
 * cm that is a child's size in another unit (`height 0.72`, meant as m) is doubted still.
 */
function childSizeBounds(id: string): Bounds {
  const field = fieldById(id);
  if (!field?.hard || field.hard.min === undefined || field.soft?.max === undefined) throw new Error(`bounds: ${id} needs a hard minimum and a usual maximum`);
  return Object.freeze({ min: field.hard.min, max: (field.doubt ?? field.soft).max });
}

const CHILD_HEIGHT = childSizeBounds('height');
const CHILD_WEIGHT = childSizeBounds('weight');

const DAYS_PER_YEAR = 365.25;

/**
 * How many weeks before term (40 weeks) a child's height allows for: a birth at 24 weeks of
 * gestation, the earliest of the very preterm reference read (`intergrowth-very-preterm-2016` in
 * physiology/growth.ts). A child's age is corrected by it before the height is judged, in full until
 * a corrected age of CORRECTED_IN_FULL_UNTIL_YEARS, then less and less (`correctionWeeksAt`).
 */
export const EARLIEST_BIRTH_WEEKS_BEFORE_TERM = 16;

/**
 * The corrected age (years) until which the age is corrected in full: 3 years. Read (December 2026,
 * session 32): a growth-chart training module of the US Maternal and Child Health Bureau (page 10,
 * "Using corrected age to plot measures for low birthweight and premature infants", as mirrored on
 * hitpages.com) corrects until 2 years for most preterm infants and often until 3 years for a birth
 * weight under 1,000 g, which a birth at 24 weeks is; and Elmrayed S, Dai S, Lodha A, Kumar M,
 * Fenton T. Preterm growth assessment: the latest findings on age correction. J Perinatol
 * 2025;45(5):607–615 (abstract read on PubMed, 39820765) finds correction needed for all growth
 * measures through 36 months of corrected age for children born before 32 weeks. Stopped at 2 years
 * (chronological), a 2-year-old born at 24 weeks would be judged at her full age a day after being
 * judged at 1.69 years: a floor 3 to 4 cm higher overnight, and PN302 for an ex-preterm toddler who
 * has not caught up.
 */
export const CORRECTED_IN_FULL_UNTIL_YEARS = 3;

/**
 * Over how many years (of age, after the full correction) the correction falls to none, in a
 * straight line: 1 (our choice, no source). The floor then rises a little faster than the −3 SD
 * for a year, with no step (the corrected age never goes back, `correctionWeeksAt`), and from about
 * 4 years 4 months on it is the −3 SD at the child's own age, less the margin: a school-age child
 * is no longer given the growth of 16 weeks that an ex-preterm toddler needs.
 */
export const CORRECTION_TAPER_YEARS = 1;

/**
 * The weeks a child's age of `ageYears` (chronological) is corrected by before the height is
 * judged: EARLIEST_BIRTH_WEEKS_BEFORE_TERM until the corrected age is CORRECTED_IN_FULL_UNTIL_YEARS
 * (about 3 years 4 months of age), then down in a straight line to none CORRECTION_TAPER_YEARS
 * later (about 4 years 4 months). The corrected age, age less these weeks, rises with age at every
 * age (by 1.31 days a day in the taper), so no height goes from usual to unusual and back.
 */
export function correctionWeeksAt(ageYears: number): number {
  const full = EARLIEST_BIRTH_WEEKS_BEFORE_TERM;
  const taperFrom = CORRECTED_IN_FULL_UNTIL_YEARS + (full * 7) / DAYS_PER_YEAR;
  if (!(ageYears > taperFrom)) return full;
  const left = 1 - (ageYears - taperFrom) / CORRECTION_TAPER_YEARS;
  return left > 0 ? full * left : 0;
}

/** How far below the −3 SD of the shorter sex at the corrected age a child's height floor lies, cm: our margin, no source. */
export const CHILD_HEIGHT_MARGIN_CM = 10;


/** The last day of age (corrected) read on the first year's rows (`lengthForAgeGirlsCm`); after it the rows of whole years. */
const FIRST_YEAR_LAST_DAY = 365;

/**
 * An adult's usual minimum height (cm), the field registry's soft minimum (120 cm): the cap of a
 * child's floor (`childHeightMinCm`), so that a teenager's floor is never stricter than the
 * adult's and the floor does not drop at ADULT_FROM_YEARS (a 17-year-old of 125 cm was unusual, an
 * 18-year-old of 125 cm was not).
 */
export const ADULT_HEIGHT_USUAL_MIN_CM: number = (() => {
  const min = fieldById('height')?.soft?.min;
  if (min === undefined) throw new Error('bounds: height needs a usual minimum');
  return min;
})();

/**
 * The shortest usual height (cm) of a child of `ageYears` (under ADULT_FROM_YEARS), in whole cm
 * rounded down: until EARLIEST_BIRTH_WEEKS_BEFORE_TERM weeks after birth, the −3 SD length of a
 * girl born at 24 weeks (24.0 cm, INTERGROWTH-21st); from then on the larger of that and the
 * −3 SD at the age so corrected (by `correctionWeeksAt`: in full to a corrected age of 3 years, none
 * from about 4 years 4 months), less CHILD_HEIGHT_MARGIN_CM: in the first year of corrected age her
 * length-for-age (WHO Child Growth Standards 2006, monthly rows), after it the height-for-age by
 * whole year of the sex shorter there, straight between them (`heightForAgeShorterCm`: the 2006
 * standards to 4 years, the WHO 2007 reference from 5 to 19, the boys' at 10 to 13), which starts
 * on the first year's last row, so the floor does not drop there. The shorter sex, the earliest
 * birth and a margin of some 1.5 to 6 SD more, so that no real child's height is below it short of
 * a disorder of growth: 24 cm at birth, 33 cm at 16 weeks, 46 cm at 8 months, 52 cm at a year, 63
 * cm at 2 years, 71 cm at 3, 84 cm at 5, 108 cm at 10, 117 cm at 12; never above an adult's usual
 * minimum (ADULT_HEIGHT_USUAL_MIN_CM, 120 cm), which it reaches at about 12 years 4 months (day 4,517) and
 * keeps to ADULT_FROM_YEARS, so it does not drop at 18 (uncapped it was 132 cm at 17, and a
 * 17-year-old of 125 cm was unusual where an 18-year-old was not). A height below it is unusual
 * (PN302, with a word on disorders of growth), and under INFANT_UNTIL_YEARS no height at all for a
 * bare number (an 8-month-old's `height 10` is not offered inches, 25 cm). It was 30 cm at every
 * age under a year (from memory), which flagged a real preterm newborn and passed a 10-month-old
 * of 31 cm; and from a year on there was none short of the field's hard minimum (20 cm), which
 * passed a 3-year-old of 45 cm. Corrected in full at every age, it was lower by the growth of
 * 16 weeks past 4 years too (83 cm at 5, 107 at 10, 116 at 12, 120 from day 4,629).
 */
export function childHeightMinCm(ageYears: number): number {
  const correctedDays = ageYears * DAYS_PER_YEAR - correctionWeeksAt(ageYears) * 7;
  const line = correctedDays < 0 ? null
    : correctedDays <= FIRST_YEAR_LAST_DAY ? lengthForAgeGirlsCm(correctedDays, -3)
    : heightForAgeShorterCm(Math.max(1, correctedDays / DAYS_PER_YEAR), -3);
  const newborn = Math.floor(PRETERM_GIRL_LENGTH_MINUS_3SD_CM);
  return line === null ? newborn : Math.min(ADULT_HEIGHT_USUAL_MIN_CM, Math.max(newborn, Math.floor(line - CHILD_HEIGHT_MARGIN_CM)));
}


/** An infant's height window: from `childHeightMinCm` to a child's usual maximum. */
function infantHeight(ageYears: number): Bounds {
  return { min: childHeightMinCm(ageYears), max: CHILD_HEIGHT.max };
}

/**
 * Under this age (years) a bare height below the floor of the age (`childHeightMinCm`) is no height
 * at all (`childSizeAt`). From it on a bare number is read in cm down to the field's hard minimum,
 * as before the floor went on past a year: a disorder of growth can make a child's height real far
 * below the −3 SD (common practice, no source), so no height a child could measure is called
 * impossible or read in another unit; below the floor it is unusual (PN302, `childUsualBounds`).
 */
export const INFANT_UNTIL_YEARS = 1;

/**
 * The size window of a body size of a patient of `ageYears` (null: none in force): under
 * ADULT_FROM_YEARS a child's (`childSizeBounds`), and for a height under INFANT_UNTIL_YEARS an
 * infant's, from the floor of the age (`childHeightMinCm`); null for an adult, for no age, and for
 * any other field. It is both the doubt window of a bare number (`doubtBoundsAt`) and where another
 * unit would make the number ordinary (`ordinaryBoundsAt`).
 */
export function childSizeAt(field: FieldDef, ageYears: number | null): Bounds | null {
  if (!isChildAge(ageYears) || !isBodySize(field)) return null;
  if (field.id === 'weight') return CHILD_WEIGHT;
  return ageYears! < INFANT_UNTIL_YEARS ? infantHeight(ageYears!) : CHILD_HEIGHT;
}

/** `usual`'s maximum with `min` as its minimum (none where undefined): a child's usual bounds drop or replace an adult's minimum. */
function keepingMax(usual: Bounds | undefined, min: number | undefined): Bounds {
  const max = usual?.max;
  if (max === undefined) return min === undefined ? {} : { min };
  return min === undefined ? { max } : { min, max };
}

/**
 * The lowest usual inspiratory flow of a patient under ADULT_FROM_YEARS, L/min: half the 4 L/min at
 * the bottom of the 4–10 L/min an infant on a ventilator is usually given (common practice, from
 * memory), as the tidal volume's usual minimum is half the bottom of a protocol's range; an adult's
 * usual minimum (10 L/min in the field registry) is below any infant's flow.
 */
export const CHILD_INSP_FLOW_MIN_L_PER_MIN = 2;

/** A child's inspiratory flow: from CHILD_INSP_FLOW_MIN_L_PER_MIN to the adult usual maximum. */
const CHILD_INSP_FLOW: Bounds = Object.freeze({ min: CHILD_INSP_FLOW_MIN_L_PER_MIN, max: fieldById('insp_flow')?.soft?.max });

/**
 * A child's window of a field whose usual minimum is an adult's, for a patient of `ageYears` (null:
 * none in force): a body size's (`childSizeAt`), the inspiratory flow's CHILD_INSP_FLOW under
 * ADULT_FROM_YEARS; null for an adult, for no age, and for the other fields. It is both the doubt
 * window of a bare number and where a number doubted would be ordinary in another unit.
 */
function childWindowAt(field: FieldDef, ageYears: number | null): Bounds | null {
  if (field.id === 'insp_flow') return isChildAge(ageYears) ? CHILD_INSP_FLOW : null;
  return childSizeAt(field, ageYears);
}

/**
 * The usual bounds of a field for a patient under ADULT_FROM_YEARS, from `usual`, the bounds an
 * adult's value is read against (PN302), for a patient of `ageYears`: a body size keeps only its
 * usual maximum, with a child's height from `childHeightMinCm`, the inspiratory flow a child's minimum (CHILD_INSP_FLOW_MIN_L_PER_MIN), and a tidal volume read
 * against no body size (`bodyKg` null: neither a weight nor a predicted body weight in force) has no
 * usual minimum, as a child's size runs from a preterm newborn's to an adult's (common practice,
 * no source); with a body size its minimum is per kg for a child as for an adult (`softBoundsAt`).
 */
export function childUsualBounds(field: FieldDef, usual: Bounds | undefined, bodyKg: number | null, ageYears: number): Bounds | undefined {
  // A child's weight has no usual minimum (an adult's, 25 kg, is none of a child's; common practice,
  // no source), and a child's height starts at the floor of the age (`childHeightMinCm`), not at an
  // adult's 120 cm.
  if (isBodySize(field)) return keepingMax(usual, field.id === 'height' ? childHeightMinCm(ageYears) : undefined);
  if (usual === undefined) return usual;
  if (field.id === 'insp_flow') return keepingMax(usual, CHILD_INSP_FLOW_MIN_L_PER_MIN);
  if (field.id === 'vt' && (bodyKg === null || !(bodyKg > 0)) && usual.min !== undefined) return keepingMax(usual, undefined);
  return usual;
}

/**
 * Where a bare number is read in the unit in force without doubt (see `FieldDef.doubt`): the
 * field's doubt window, else its soft bounds, with the same waiver at low barometric pressure; for
 * a body size of a patient under ADULT_FROM_YEARS (`ageYears`, the age in force where the number
 * is read; null: none), a child's window (`childWindowAt`: a child's size, an infant's length from
 * `childHeightMinCm`, a child's inspiratory flow).
 */
export function doubtBoundsAt(field: FieldDef, barometricMmhg: number | null, ageYears: number | null = null): Bounds | undefined {
  const child = childWindowAt(field, ageYears);
  if (child !== null) return child;
  const doubt = field.doubt;
  if (!doubt) return softBoundsAt(field, barometricMmhg);
  if (barometricMmhg !== null && barometricMmhg < LOW_PRESSURE_WAIVER_MMHG && WAIVED_AT_ALTITUDE.has(field.id)) {
    return doubt.max === undefined ? {} : { max: doubt.max };
  }
  return doubt;
}

/**
 * Where a bare number doubted in the unit in force would be ordinary in another unit (PN204): the
 * field's soft bounds at the barometric pressure in force, or for a body size or the inspiratory flow
 * of a patient under ADULT_FROM_YEARS a child's window (`childWindowAt`).
 */
export function ordinaryBoundsAt(field: FieldDef, barometricMmhg: number | null, ageYears: number | null): Bounds | undefined {
  return childWindowAt(field, ageYears) ?? softBoundsAt(field, barometricMmhg);
}

export function within(value: number, bounds: Bounds | undefined): boolean {
  if (!bounds) return true;
  if (bounds.min !== undefined && value < bounds.min) return false;
  if (bounds.max !== undefined && value > bounds.max) return false;
  return true;
}

/**
 * Whether `value` (in the field's own unit) lies within usual `bounds` at the precision it was
 * written with. A number written in another unit than the field's own carries a rounding of the
 * conversion that its writer did not make: 20.0 kPa is 150.01 mmHg, yet written to a tenth of a
 * kPa it is the usual maximum of PaCO2, 150 mmHg. Such a number lies within when some number it
 * can stand for (its last written digit give or take a half) does. A number in the field's own
 * unit is compared as it is. `readUnit`: the unit it was read in; `text`: the number as written.
 */
export function withinAsWritten(value: number, bounds: Bounds | undefined, field: FieldDef, readUnit: string | null, text: string | null): boolean {
  if (within(value, bounds)) return true;
  if (!bounds || readUnit === null || text === null || readUnit === field.unit) return false;
  const from = unitById(readUnit);
  const canonical = unitById(field.unit ?? '');
  const written = from && canonical ? convert(value, canonical, from) : null;
  if (!from || !canonical || written === null) return false;
  const half = halfLastDigit(text);
  const a = convert(written - half, from, canonical);
  const b = convert(written + half, from, canonical);
  if (a === null || b === null) return false;
  const low = Math.min(a, b);
  const high = Math.max(a, b);
  return (bounds.min === undefined || high >= bounds.min) && (bounds.max === undefined || low <= bounds.max);
}

/**
 * The field's units, other than `except` and those never offered (`UnitDef.offered`: an age's weeks
 * and days), in which the number as written (`written`) lies within
 * every one of `bounds` once read into the field's canonical unit: where a number written or
 * read in one unit would be ordinary (PN204 for a bare number, PN301's fix for a written unit).
 */
export function unitsWithin(field: FieldDef, written: number, except: string | null, ...bounds: readonly (Bounds | undefined)[]): UnitDef[] {
  const canonical = unitById(field.unit ?? '');
  const out: UnitDef[] = [];
  if (!canonical) return out;
  for (const id of field.units ?? []) {
    if (id === except) continue;
    const unit = unitById(id);
    const value = unit && unit.offered ? convert(written, unit, canonical) : null;
    if (unit && value !== null && bounds.every((b) => within(value, b))) out.push(unit);
  }
  return out;
}
