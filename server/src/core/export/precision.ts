/**
 * The precision of every number Pneumark writes as data (CSV, JSON Lines, FHIR, and the values,
 * derived values and inputs of `check --format json`): one rule, applied here and nowhere else.
 *
 * A number is rounded to 12 significant digits, and to 12 decimal places at most; −0 is written
 * as 0. Whole numbers are written as they are.
 *
 * Why 12 significant digits: a double holds about 15.9, and the arithmetic behind a value
 * (a unit conversion, a formula of a few steps) leaves an error in the last one or two of them
 * (5.9 ft × 30.48 is 179.83200000000002, not 179.832). Rounding at the 12th digit removes that
 * noise, and keeps every digit a note can mean: a value is written with at most five or six
 * digits, and a unit's factor has at most nine (1 lb = 0.45359237 kg), so a converted value with
 * a finite decimal expansion (5.9 ft = 179.832 cm, 150 lb = 68.0388555 kg) is written exactly,
 * and one without (6.1 kPa = 45.7537561266 mmHg, 1 mmHg being 133.322387415 Pa; 99.1 °F =
 * 37.2777777778 °C) is within half a unit of its 12th digit: converted back to the unit it was
 * written in, it gives the written number again, to its own decimals and to 11 significant digits.
 *
 * Why 12 decimals at most: a difference of two values that are equal on paper (PAO2 − PaO2 at the
 * edge) can be left as 1e-14 instead of 0, which significant digits alone would keep as noise.
 * The noise of a difference is about that of its terms, and the terms of Pneumark's formulas are
 * below 10,000 in their units (noise below 1e-12), while no quantity Pneumark exports means
 * anything near a trillionth of its unit. Every value from 0.1 up keeps its 12 digits.
 */

const POWERS_OF_TEN: readonly number[] = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/** Significant digits kept in exported numbers. */
export const EXPORTED_SIGNIFICANT_DIGITS = 12;
/** Decimal places kept at most in exported numbers. */
export const EXPORTED_MAX_DECIMALS = 12;

/**
 * A number as Pneumark exports it (see above); null for null, undefined, NaN and infinities,
 * which the exports write as an empty cell or null.
 */
export function exportedNumber(value: number | null | undefined): number | null {
  if (value === null || value === undefined || !Number.isFinite(value)) return null;
  if (Number.isInteger(value)) return value === 0 ? 0 : value;
  const size = Math.abs(value);
  // The decimals that leave 12 significant digits: 11 less the power of ten of the first digit.
  let first = Math.floor(Math.log10(size));
  // log10 can be a hair off at powers of ten (log10(1000) is 2.9999999999999996 on some engines).
  if (POWERS_OF_TEN[first + 1] !== undefined && size >= POWERS_OF_TEN[first + 1]!) first++;
  const decimals = Math.min(EXPORTED_MAX_DECIMALS, EXPORTED_SIGNIFICANT_DIGITS - 1 - first);
  let rounded: number;
  if (decimals >= 0) {
    // n ÷ 10^d with n and 10^d exact is the double nearest to the decimal n·10^-d, which
    // JavaScript then writes as that decimal.
    const scale = POWERS_OF_TEN[decimals]!;
    rounded = Math.round(size * scale) / scale;
  } else {
    const scale = POWERS_OF_TEN[-decimals] ?? 10 ** -decimals;
    rounded = Math.round(size / scale) * scale;
  }
  return rounded === 0 ? 0 : value < 0 ? -rounded : rounded;
}
