// formatNumber writes whole numbers without toFixed (a shortcut for speed): the text must be the
// one toFixed gives, with a negative number that rounds to zero written as 0.
import { describe, expect, it } from 'vitest';
import { formatNumber, halfLastDigit, writtenDecimals } from '../../server/src/core/util/format';
import { rng } from '../helpers/seeded';

/** The rule as written before the shortcut: toFixed, decimals clamped to 0–6, no "-0". */
function byToFixed(value: number, decimals: number): string {
  if (!Number.isFinite(value)) return '—';
  const fixed = value.toFixed(decimals < 0 ? 0 : decimals > 6 ? 6 : decimals);
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

  it('agrees with toFixed on random whole and fractional numbers (seeded)', () => {
    const next = rng(20261202);
    for (let i = 0; i < 20000; i++) {
      const scale = 10 ** Math.floor(next() * 8);
      const raw = (next() - 0.5) * scale;
      const v = next() < 0.5 ? Math.round(raw) : raw;
      const d = Math.floor(next() * 8) - 1;
      expect(formatNumber(v, d)).toBe(byToFixed(v, d));
    }
  });

  it('rounds a fraction to a whole number as toFixed does, halves and near-halves included', () => {
    const cases = [0.5, 1.5, 2.5, 99.5, 0.49999999999999994, 0.5000000000000001, 123.49999999999999, 199.99999999999997, 4503599627370495.5, 1e-300, 5e-324, -0.5, -1.5, -2.5, -0.4, -199.6];
    for (const v of cases) expect(formatNumber(v, 0), String(v)).toBe(byToFixed(v, 0));
    const next = rng(7);
    for (let i = 0; i < 20000; i++) {
      const v = (Math.floor(next() * 1e6) + (next() < 0.5 ? 0.5 : next())) / 10 ** Math.floor(next() * 4);
      expect(formatNumber(v, 0)).toBe(byToFixed(v, 0));
    }
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
