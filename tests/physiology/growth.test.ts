/**
 * Infants' length by age, against the rows of the references as read (December 2026, session 29):
 *
 * - WHO Child Growth Standards 2006, girls' length-for-age: L, M and S by day of age, read in the
 *   WHO's own R package anthro (github.com/WorldHealthOrganization/anthro,
 *   data-raw/growthstandards/lenanthro.txt, sex 2, and sex 1 for boys). L is 1 on every row, so the
 *   length at z SD is M × (1 + z × S).
 * - INTERGROWTH-21st very preterm size at birth, girls' length at 24+0 weeks (day 168): −3 SD 24.0 cm,
 *   median 31.8 cm, read in its reproduction in the pygrowthstandards repository
 *   (data/raw/intergrowth-21st-newborn-size-very-preterm-infants, stature, girls).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  heightForAgeShorterCm,
  lengthForAgeGirlsCm,
  PRETERM_GIRL_LENGTH_MINUS_3SD_CM,
  SOURCES,
} from '../../server/src/core/physiology/growth';

/** Rows of lenanthro.txt as read: [day, M, S], girls (sex 2). */
const GIRLS_READ: readonly (readonly [number, number, number])[] = [
  [0, 49.1477, 0.0379],
  [30, 53.6326, 0.03641],
  [183, 65.751, 0.03448],
  [365, 74.0049, 0.03479],
];
/** Rows of lenanthro.txt as read: [day, M, S], boys (sex 1). */
const BOYS_READ: readonly (readonly [number, number, number])[] = [
  [0, 49.8842, 0.03795],
  [183, 67.6435, 0.03165],
  [365, 75.7391, 0.03137],
];

describe('girls\' length-for-age (WHO Child Growth Standards 2006, read in the WHO package anthro, lenanthro.txt)', () => {
  it.each(GIRLS_READ)('day %d: M %d cm, S %d: the median and −3 SD are M and M × (1 − 3S)', (day, m, s) => {
    expect(lengthForAgeGirlsCm(day, 0)).toBeCloseTo(m, 4);
    expect(lengthForAgeGirlsCm(day, -3)).toBeCloseTo(m * (1 - 3 * s), 4);
  });

  it('at birth −3 SD is 43.6 cm (49.1477 × (1 − 3 × 0.0379) = 43.56), and at a year 66.3 cm', () => {
    expect(lengthForAgeGirlsCm(0, -3)).toBeCloseTo(43.56, 2);
    expect(lengthForAgeGirlsCm(365, -3)).toBeCloseTo(66.28, 2);
  });

  it('is at or below the rows read between the rows it keeps (so a floor made from it is never above the reference)', () => {
    // Day 100 as read: M 60.4958, S 0.03509; day 250: M 69.0527, S 0.0344.
    expect(lengthForAgeGirlsCm(100, -3)!).toBeLessThanOrEqual(60.4958 * (1 - 3 * 0.03509) + 1e-9);
    expect(lengthForAgeGirlsCm(100, -3)!).toBeGreaterThan(60.4958 * (1 - 3 * 0.03509) - 0.3);
    expect(lengthForAgeGirlsCm(250, -3)!).toBeLessThanOrEqual(69.0527 * (1 - 3 * 0.0344) + 1e-9);
    expect(lengthForAgeGirlsCm(250, -3)!).toBeGreaterThan(69.0527 * (1 - 3 * 0.0344) - 0.3);
  });

  it.each(BOYS_READ)('girls are the shorter: at day %d the girls\' −3 SD is below the boys\' (M %d, S %d)', (day, m, s) => {
    expect(lengthForAgeGirlsCm(day, -3)!).toBeLessThan(m * (1 - 3 * s));
  });

  it('is null outside the first year and for a non-finite input', () => {
    expect(lengthForAgeGirlsCm(-1, -3)).toBeNull();
    expect(lengthForAgeGirlsCm(366, -3)).toBeNull();
    expect(lengthForAgeGirlsCm(Number.NaN, -3)).toBeNull();
    expect(lengthForAgeGirlsCm(10, Number.POSITIVE_INFINITY)).toBeNull();
    fc.assert(
      fc.property(fc.double(), fc.double(), (day, z) => {
        const v = lengthForAgeGirlsCm(day, z);
        return v === null || Number.isFinite(v);
      }),
    );
  });
});

describe('a girl born at 24+0 weeks (INTERGROWTH-21st very preterm size at birth, as reproduced in pygrowthstandards)', () => {
  it('is 24.0 cm long at −3 SD', () => {
    expect(PRETERM_GIRL_LENGTH_MINUS_3SD_CM).toBe(24.0);
  });

  it('each source says where it was read', () => {
    expect(SOURCES['who-length-for-age-2006']).toMatch(/read in its reproduction in the WHO's own R package anthro/);
    expect(SOURCES['intergrowth-very-preterm-2016']).toMatch(/24\.0 cm at −3 SD, read in its reproduction/);
  });
});

describe('height-for-age by whole year of the sex shorter at −3 SD (WHO Child Growth Standards 2006 to 4 years, WHO 2007 reference from 5; read in the WHO packages anthro and anthroplus)', () => {
  /** Rows as read: [years, M, S]. 2006 girls days 365, 731 (height), 1096, 1461; 2007 girls months 60, 72, 216, 228; boys months 120, 144. */
  const READ: readonly (readonly [number, number, number])[] = [
    [1, 74.0049, 0.03479], [2, 85.7299, 0.03764], [3, 95.0572, 0.04007], [4, 102.7312, 0.04193],
    [5, 109.0725, 0.04346], [6, 115.1244, 0.04447], [10, 137.7795, 0.04626], [12, 149.0807, 0.04753], [18, 163.0595, 0.04053], [19, 163.1548, 0.04009],
  ];
  it.each(READ)('at %d years: M %d cm, S %d: the median and −3 SD are M and M × (1 − 3S)', (years, m, s) => {
    expect(heightForAgeShorterCm(years, 0)).toBeCloseTo(m, 4);
    expect(heightForAgeShorterCm(years, -3)).toBeCloseTo(m * (1 - 3 * s), 4);
  });

  it('meets the first year\'s length at a year (the same row, day 365), and is straight between whole years', () => {
    expect(heightForAgeShorterCm(1, -3)).toBeCloseTo(lengthForAgeGirlsCm(365, -3)!, 9);
    // Halfway between 5 y (94.85) and 6 y (115.1244, 0.04447: 99.77): 97.31.
    expect(heightForAgeShorterCm(5.5, -3)).toBeCloseTo((109.0725 * (1 - 3 * 0.04346) + 115.1244 * (1 - 3 * 0.04447)) / 2, 6);
  });

  it('is null under a year, over 19 years and for a non-finite input', () => {
    expect([heightForAgeShorterCm(0.99, -3), heightForAgeShorterCm(19.01, -3), heightForAgeShorterCm(Number.NaN, -3), heightForAgeShorterCm(5, Number.POSITIVE_INFINITY)]).toEqual([null, null, null, null]);
  });

  it('cites both references, read in their reproductions', () => {
    expect(SOURCES['who-height-for-age-2006-years']).toMatch(/read in its reproduction/);
    expect(SOURCES['who-height-for-age-2007']).toMatch(/Bull World Health Organ 2007;85:660–667.*read in its reproduction.*anthroplus/);
  });
});
