/**
 * Internal numeric guards shared by the physiology modules (not re-exported by `index.ts`).
 *
 * Every physiology function is total: it returns `null` instead of NaN or ±Infinity and never
 * throws. These helpers keep that rule in one place.
 */

/** True when every value is a finite number (rejects NaN, ±Infinity and non-numbers at run time). */
export function allFinite(...values: readonly number[]): boolean {
  for (const value of values) {
    if (typeof value !== 'number' || !Number.isFinite(value)) return false;
  }
  return true;
}

/** The value itself when finite (with −0 folded to 0), otherwise `null`. */
export function finiteOrNull(value: number): number | null {
  if (!Number.isFinite(value)) return null;
  return value === 0 ? 0 : value;
}

/** True when `value` is finite and lies in the closed interval [min, max]. */
export function inClosedRange(value: number, min: number, max: number): boolean {
  return Number.isFinite(value) && value >= min && value <= max;
}

/** True when `value` is a finite fraction of inspired oxygen: 0 < FiO2 ≤ 1. */
export function isFio2Fraction(value: number): boolean {
  return Number.isFinite(value) && value > 0 && value <= 1;
}

/** True when `value` is a finite saturation in percent: 0 ≤ value ≤ 100. */
export function isPercent(value: number): boolean {
  return inClosedRange(value, 0, 100);
}

/**
 * A computed value as compared with a band's boundary: rounded to 9 decimal places, so that a
 * quotient which is exactly on a boundary on paper (114 / 0.57 = 200) is on it here too, where
 * floating point gives 200.00000000000003. Inputs carry far fewer decimals than that.
 */
export function forBand(value: number): number {
  return Math.round(value * 1e9) / 1e9;
}

/**
 * Which side of `threshold` a measured value is on: 1 above, −1 below, 0 on it. `resolution` is
 * how far the value as written can be from what it stands for (half a unit of its last written
 * decimal, in the threshold's unit): a value within that of the threshold cannot be told from it
 * and is on it. A gas written as 6.7 kPa (50.25 mmHg) stands for 6.65–6.75 kPa, which holds
 * 50 mmHg (6.67 kPa): it is on a 50 mmHg threshold, as 50 mmHg written in mmHg is. 0 (the
 * default) compares exactly, with `forBand`'s rounding.
 */
export function sideOf(value: number, threshold: number, resolution = 0): -1 | 0 | 1 {
  const difference = forBand(value) - forBand(threshold);
  if (resolution > 0 && Math.abs(difference) < resolution) return 0;
  return difference > 0 ? 1 : difference < 0 ? -1 : 0;
}
