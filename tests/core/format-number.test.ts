// formatNumber writes whole numbers without toFixed (a shortcut for speed): the text must be the
// one toFixed gives, with a negative number that rounds to zero written as 0. A number that is a
// half on paper (0.686 × 25 = 17.15, computed as 17.149999999999995) is rounded as the half it is,
// away from zero, where toFixed rounds the binary number (17.1).
import { describe, expect, it } from 'vitest';
import { formatNumber, halfLastDigit, writtenDecimals } from '../../server/src/core/util/format';
import { unsignedOnPaper } from '../helpers/on-paper';
import { rng } from '../helpers/seeded';

/**
 * The rule, written with decimal text rather than arithmetic: decimals clamped to 0–6; the number
 * first taken to 9 decimals past the last one shown (toFixed of the binary number, exact in
 * decimal), then rounded at the last one shown with halves away from zero; no "-0". Numbers of a
 * million units of the last decimal or more are toFixed's (no noise there to mistake for a half).
 */
function byToFixed(value: number, decimals: number): string {
  if (!Number.isFinite(value)) return '—';
  const d = decimals < 0 ? 0 : decimals > 6 ? 6 : Number.isInteger(decimals) ? decimals : Math.trunc(decimals);
  let fixed: string;
  if (Math.abs(value) * 10 ** d >= 1e6 || Number.isInteger(value)) fixed = value.toFixed(decimals < 0 ? 0 : decimals > 6 ? 6 : decimals);
  else {
    const negative = value < 0;
    const text = unsignedOnPaper(value, d);
    fixed = negative ? `-${text}` : text;
  }
  return fixed.startsWith('-') && Number(fixed) === 0 ? fixed.slice(1) : fixed;
}

describe('formatNumber', () => {
  it('writes whole numbers as toFixed does, at every number of decimals', () => {
    const cases = [0, -0, 1, -1, 7, 80, 100, -250, 2 ** 31, -(2 ** 53), 1e20, -1e20, 1e21, 5e21, Number.MAX_SAFE_INTEGER];
    for (const v of cases) for (const d of [-1, 0, 1, 2, 3, 6, 7, 1.5]) expect(formatNumber(v, d), `${v} with ${d}`).toBe(byToFixed(v, d));
    expect(formatNumber(-0, 0)).toBe('0');
    expect(formatNumber(-0, 2)).toBe('0.00');
    expect(formatNumber(84, 0)).toBe('84');
    expect(formatNumber(10, 1)).toBe('10.0');
    expect(formatNumber(-3, 2)).toBe('-3.00');
  });

  it('agrees with the rule on random whole and fractional numbers (seeded)', () => {
    const next = rng(20261202);
    for (let i = 0; i < 20000; i++) {
      const scale = 10 ** Math.floor(next() * 8);
      const raw = (next() - 0.5) * scale;
      const v = next() < 0.5 ? Math.round(raw) : raw;
      const d = Math.floor(next() * 8) - 1;
      expect(formatNumber(v, d)).toBe(byToFixed(v, d));
    }
  });

  it('rounds a fraction to a whole number as the rule does, halves and near-halves included', () => {
    const cases = [0.5, 1.5, 2.5, 99.5, 0.49999999999999994, 0.5000000000000001, 123.49999999999999, 199.99999999999997, 4503599627370495.5, 1e-300, 5e-324, -0.5, -1.5, -2.5, -0.4, -199.6];
    for (const v of cases) expect(formatNumber(v, 0), String(v)).toBe(byToFixed(v, 0));
    const next = rng(7);
    for (let i = 0; i < 20000; i++) {
      const v = (Math.floor(next() * 1e6) + (next() < 0.5 ? 0.5 : next())) / 10 ** Math.floor(next() * 4);
      expect(formatNumber(v, 0)).toBe(byToFixed(v, 0));
    }
  });

  it('rounds a number that is a half on paper as that half, away from zero', () => {
    // Gattinoni L et al., Intensive Care Med 2016;42:1567–1575 (simplified mechanical power):
    // 0.098 × 20 × 0.350 × (32 − (27 − 13) ÷ 2) = 17.15 J/min exactly on paper.
    expect(formatNumber(0.098 * 20 * 350 / 1000 * (32 - (27 - 13) / 2), 1)).toBe('17.2');
    expect(formatNumber(2.675, 2)).toBe('2.68');
    expect(formatNumber(1.005, 2)).toBe('1.01');
    expect(formatNumber(-2.675, 2)).toBe('-2.68');
    expect(formatNumber(0.1 + 0.2 - 0.3, 1)).toBe('0.0');
    expect(formatNumber(-0.04, 1)).toBe('0.0');
    // Not a half: rounded as it is.
    expect(formatNumber(17.149, 1)).toBe('17.1');
    expect(formatNumber(2.6749, 2)).toBe('2.67');
  });

  it('writes what is not a finite number as a dash', () => {
    expect(formatNumber(NaN, 0)).toBe('—');
    expect(formatNumber(Infinity, 2)).toBe('—');
  });
});

describe('writtenDecimals and halfLastDigit', () => {
  it('count the decimals written and give half a unit of the last one', () => {
    expect(writtenDecimals('7.5')).toBe(1);
    expect(writtenDecimals('0.355')).toBe(3);
    expect(writtenDecimals('7,25')).toBe(2);
    expect(writtenDecimals('120/80')).toBe(0);
    expect(halfLastDigit('6.7')).toBeCloseTo(0.05, 12);
    expect(halfLastDigit('150')).toBe(0.5);
    // A kPa pressure is taken to a tenth at least: 8 kPa stands for 7.95–8.05 kPa.
    expect(halfLastDigit('8', 1)).toBeCloseTo(0.05, 12);
    expect(halfLastDigit('6.75', 1)).toBeCloseTo(0.005, 12);
  });
});
