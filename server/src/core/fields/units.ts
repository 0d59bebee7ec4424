/**
 * Unit registry: every unit a note may write, its dimension, its UCUM code and how it
 * converts to the dimension's base unit. Fields pick their canonical unit from here;
 * conversion happens only at the edges (parsing and display).
 */

import { GLUCOSE_MG_PER_DL_PER_MMOL_L, HB_G_PER_DL_PER_MMOL_L, MMHG_PER_KPA, PA_PER_CMH2O, PA_PER_MMHG } from '../physiology/units';
import { squeezeBlanks } from '../syntax/blanks';

export type Dimension =
  | 'gas-pressure'
  | 'airway-pressure'
  | 'fraction'
  | 'percent'
  | 'rate'
  | 'temperature'
  | 'volume'
  | 'volume-per-kg'
  | 'flow'
  | 'mass-concentration'
  | 'substance-concentration'
  | 'length'
  | 'mass'
  | 'age'
  | 'ph';

export interface UnitDef {
  /** Canonical spelling as written back into a note. */
  readonly id: string;
  readonly dimension: Dimension;
  /** Other spellings accepted (matched case-insensitively; written here as the docs list them). */
  readonly aliases: readonly string[];
  readonly ucum: string;
  /** Value in this unit → value in the dimension's base unit. */
  readonly toBase: (value: number) => number;
  /** Value in the dimension's base unit → value in this unit. */
  readonly fromBase: (value: number) => number;
  /**
   * Whether a number written without this unit, or with another, may be offered it (`unitsWithin`:
   * PN204, the fixes of PN301 and PN302, a thousands reading). False for an age's weeks and days:
   * nearly any large number is an ordinary age in weeks or days (900 wk is 17 years, 900 d 2.5), so
   * guessing them would drown the one guess that helps (a bare `age 900` is 75 years in months), and
   * a neonatal note writes the unit.
   */
  readonly offered: boolean;
}

/** The internal id of haemoglobin's mmol/L (a mass concentration by its molar mass), written `mmol/L`. */
export const HB_MMOL_PER_L = 'mmolHb/L';

/** Definitions of the units (exact where the unit is defined exactly). */
/** Exact conversions from the definitions of the units (physiology/units.ts holds the constants). */
const CMH2O_PER_MBAR = 100 / PA_PER_CMH2O; // 1.019716
const MMHG_PER_HPA = 100 / PA_PER_MMHG; // 0.750062

/** Days in UCUM's year `a`, the Julian year. */
const DAYS_PER_YEAR = 365.25;

const linear = (factor: number) => ({
  toBase: (v: number) => v * factor,
  fromBase: (v: number) => v / factor,
});

/**
 * A unit that is a whole part of its base unit (1 % is 1/100 of the fraction 1): divided rather
 * than multiplied by the part, so that a value is the number written, read in the base unit, to
 * the last digit (57 % is 0.57, where 57 × 0.01 is 0.5700000000000001, and `fio2 57 %` and
 * `fio2 0.57` give one number in the exports).
 */
const part = (divisor: number) => ({
  toBase: (v: number) => v / divisor,
  fromBase: (v: number) => v * divisor,
});

function unit(
  id: string,
  dimension: Dimension,
  ucum: string,
  conversion: { toBase: (v: number) => number; fromBase: (v: number) => number },
  aliases: readonly string[] = [],
  offered = true,
): UnitDef {
  return { id, dimension, ucum, aliases, ...conversion, offered };
}

/** Base units: mmHg, cmH2O, fraction, %, /min (Hz converts to it), °C, mL, L/min, g/dL, mmol/L, cm, kg, years, pH units. */
export const UNITS: readonly UnitDef[] = [
  unit('mmHg', 'gas-pressure', 'mm[Hg]', linear(1), ['mm Hg', 'mmhg', 'torr']),
  unit('kPa', 'gas-pressure', 'kPa', linear(MMHG_PER_KPA), ['kpa']),
  // Hectopascals (= millibars), as weather stations and altimeters give the barometric pressure (1 hPa = 100 Pa).
  unit('hPa', 'gas-pressure', 'hPa', linear(MMHG_PER_HPA), ['hpa', 'mbar']),
  unit('cmH2O', 'airway-pressure', 'cm[H2O]', linear(1), ['cmh2o', 'cm H2O', 'cmwater']),
  unit('mbar', 'airway-pressure', 'mbar', linear(CMH2O_PER_MBAR), ['hPa']),
  unit('fraction', 'fraction', '1', linear(1), []),
  unit('%', 'fraction', '%', part(100), ['percent', 'pct']),
  // Spelt as the fraction's percentage is (`spo2 94 pct` as `fio2 40 pct`).
  unit('%sat', 'percent', '%', linear(1), ['%', 'percent', 'pct']),
  unit('/min', 'rate', '/min', linear(1), ['bpm', 'min-1', 'breaths/min', 'beats/min', '/m']),
  // Cycles a second, as oscillators are set (1 Hz = 60 /min; UCUM: Hz = 1/s).
  unit('Hz', 'rate', 'Hz', linear(60), ['hz']),
  unit('C', 'temperature', 'Cel', linear(1), ['°C', '℃', 'degC', 'c', 'celsius']),
  unit('F', 'temperature', '[degF]', { toBase: (v) => ((v - 32) * 5) / 9, fromBase: (v) => (v * 9) / 5 + 32 }, ['°F', '℉', 'degF', 'f', 'fahrenheit']),
  unit('mL', 'volume', 'mL', linear(1), ['ml', 'cc']),
  unit('L', 'volume', 'L', linear(1000), ['l']),
  // A tidal volume per kg of predicted body weight: read in mL once the PBW is known (timeline).
  unit('mL/kg', 'volume-per-kg', 'mL/kg', linear(1), ['ml/kg']),
  unit('L/min', 'flow', 'L/min', linear(1), ['l/min', 'lpm', 'l/m', 'litres/min', 'liters/min']),
  unit('L/s', 'flow', 'L/s', linear(60), ['l/s', 'l/sec']),
  unit('g/dL', 'mass-concentration', 'g/dL', linear(1), ['g/dl']),
  unit('g/L', 'mass-concentration', 'g/L', part(10), ['g/l']),
  // Haemoglobin in mmol/L (monomer basis, 16,114.5 g/mol: 1 mmol/L = 1.61145 g/dL), written `mmol/L` as
  // any substance concentration, but a mass concentration here, so Hb stays in g/dL inside the core.
  // Its id is internal (as `%sat` is): written and shown as `mmol/L` (`displayUnit`). Haemoglobin's alone.
  unit(HB_MMOL_PER_L, 'mass-concentration', 'mmol/L', linear(HB_G_PER_DL_PER_MMOL_L), ['mmol/L', 'mmol/l']),
  unit('mmol/L', 'substance-concentration', 'mmol/L', linear(1), ['mmol/l']),
  unit('mEq/L', 'substance-concentration', 'meq/L', linear(1), ['meq/l']),
  // Glucose's mass concentration, read by its molar mass (18.016 mg/dL per mmol/L): a unit of glucose
  // alone, which no other field may list (lactate, say, has a molar mass of its own). Divided
  // (mg/dL ÷ 18.016), so that a value read in mg/dL and shown in mg/dL is the number written.
  unit('mg/dL', 'substance-concentration', 'mg/dL', part(GLUCOSE_MG_PER_DL_PER_MMOL_L), ['mg/dl']),
  unit('cm', 'length', 'cm', linear(1), []),
  unit('m', 'length', 'm', linear(100), ['metres', 'meters']),
  unit('in', 'length', '[in_i]', linear(2.54), ['inch', 'inches']),
  unit('ft', 'length', '[ft_i]', linear(30.48), ['feet']),
  unit('kg', 'mass', 'kg', linear(1), ['kgs']),
  unit('lb', 'mass', '[lb_av]', linear(0.45359237), ['lbs']),
  unit('y', 'age', 'a', linear(1), ['yr', 'yrs', 'years', 'year', 'a']),
  unit('mo', 'age', 'mo', part(12), ['months', 'month']),
  // UCUM's year `a` is the Julian year of 365.25 days, its week 7 days (a definition). `d` and `day`
  // are also words of a timepoint's time (`@ day 2`, `@ +1d`), which only an `@` line reads: on a
  // patient line they name the unit, and no other unit of the format is spelt so.
  // Written, never guessed (see `UnitDef.offered`).
  unit('wk', 'age', 'wk', part(DAYS_PER_YEAR / 7), ['wks', 'week', 'weeks'], false),
  unit('d', 'age', 'd', part(DAYS_PER_YEAR), ['day', 'days'], false),
  unit('ph', 'ph', '[pH]', linear(1), []),
];

const byId = new Map<string, UnitDef>();
const byLowerSpelling = new Map<string, UnitDef[]>();
for (const u of UNITS) {
  byId.set(u.id, u);
  for (const spelling of [u.id, ...u.aliases]) {
    const key = spelling.toLowerCase();
    const list = byLowerSpelling.get(key);
    if (list) list.push(u);
    else byLowerSpelling.set(key, [u]);
  }
}

export function unitById(id: string): UnitDef | undefined {
  return byId.get(id);
}

/** Units found for a spelling, kept (spellings that name a unit are few; others are not kept). */
const spellingCache = new Map<string, readonly UnitDef[]>();
const SPELLING_CACHE_LIMIT = 2000;

/**
 * Every unit a written token may mean. An exact-case match wins over a case-folded one
 * (so `mL` and `ML` both read as millilitres, and `%` means whichever percent the field uses).
 */
export function unitsForSpelling(text: string): readonly UnitDef[] {
  const known = spellingCache.get(text);
  if (known) return known;
  const exact = byId.get(text);
  const folded = byLowerSpelling.get(text.toLowerCase()) ?? byLowerSpelling.get(oneSpaced(text)) ?? [];
  const found = exact ? [exact, ...folded.filter((u) => u !== exact)] : folded;
  if (found.length > 0 && spellingCache.size < SPELLING_CACHE_LIMIT) spellingCache.set(text, found);
  return found;
}

/**
 * A unit of two words as the registry spells it: lower case, one space between the words (`mm
 * Hg` written with a tab, two spaces or any other blanks is still millimetres of mercury). Only on a miss.
 */
function oneSpaced(text: string): string {
  return squeezeBlanks(text.toLowerCase());
}

export function isKnownUnitSpelling(text: string): boolean {
  return byId.has(text) || byLowerSpelling.has(text.toLowerCase());
}

/** Converts between two units of one dimension; null when they do not share a dimension. */
export function convert(value: number, from: UnitDef, to: UnitDef): number | null {
  if (from.dimension !== to.dimension) return null;
  if (from === to) return value;
  const result = to.fromBase(from.toBase(value));
  return Number.isFinite(result) ? result : null;
}
