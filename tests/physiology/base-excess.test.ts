/**
 * Base excess as the CLSI guideline has it: the standard base excess of the extracellular fluid,
 * SBE = HCO3 − 24.8 + 16.2 × (pH − 7.40), and the actual base excess of blood,
 * ABE = (1 − 0.014 × Hb) × (HCO3 − 24.8 + (1.43 × Hb + 7.7) × (pH − 7.40)), Hb in g/dL.
 * Source of both: CLSI (NCCLS) C46-A, Blood Gas and pH Analysis and Related Measurements, Approved
 * Guideline, 2001 (second edition C46-A2, 2009; not read): the SBE's form read in a published study's
 * table, the ABE's constants from memory (December 2026; where, in tests/physiology/sources-read.test.ts, with their general form and the ABE
 * against another standardisation, Lang & Zander 2002). Every expected value is worked by hand from
 * those forms, the arithmetic beside it; the gases are invented.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  BASE_EXCESS_HB_SPAN_G_DL,
  BASE_EXCESS_TOLERANCE_MMOL_L,
  actualBaseExcess,
  baseExcessAgrees,
  baseExcessSpan,
  standardBaseExcess,
} from '../../server/src/core/physiology/acid-base';

describe('standard base excess (CLSI C46-A 2001)', () => {
  it('pH 7.40 with HCO3 24.8 is 0: 24.8 − 24.8 + 16.2 × 0 = 0; with HCO3 24.4, −0.4', () => {
    expect(standardBaseExcess(7.4, 24.8)).toBeCloseTo(0, 9);
    expect(standardBaseExcess(7.4, 24.4)).toBeCloseTo(-0.4, 9);
  });
  it('pH 7.20, HCO3 14: 14 − 24.8 + 16.2 × (−0.20) = −10.8 − 3.24 = −14.04', () => {
    expect(standardBaseExcess(7.2, 14)).toBeCloseTo(-14.04, 9);
  });
  it('pH 7.50, HCO3 32: 32 − 24.8 + 16.2 × 0.10 = 7.2 + 1.62 = +8.82', () => {
    expect(standardBaseExcess(7.5, 32)).toBeCloseTo(8.82, 9);
  });
  it('pH 7.42, HCO3 24.1: 24.1 − 24.8 + 16.2 × 0.02 = −0.7 + 0.324 = −0.376', () => {
    expect(standardBaseExcess(7.42, 24.1)).toBeCloseTo(-0.376, 9);
  });
  it('rises with pH and with HCO3, as an excess of base does', () => {
    fc.assert(
      fc.property(fc.double({ min: 6.8, max: 7.7, noNaN: true }), fc.double({ min: 2, max: 60, noNaN: true }), (ph, hco3) => {
        expect(standardBaseExcess(ph + 0.01, hco3)!).toBeGreaterThan(standardBaseExcess(ph, hco3)!);
        expect(standardBaseExcess(ph, hco3 + 1)!).toBeGreaterThan(standardBaseExcess(ph, hco3)!);
      }),
    );
  });
  it('is null outside its domain', () => {
    expect(standardBaseExcess(Number.NaN, 24)).toBeNull();
    expect(standardBaseExcess(15, 24)).toBeNull();
    expect(standardBaseExcess(7.4, -1)).toBeNull();
  });
});

describe('actual base excess, Hb in g/dL (CLSI C46-A 2001)', () => {
  it('pH 7.20, HCO3 14, Hb 10: (1 − 0.14) × (14 − 24.8 + (14.3 + 7.7) × (−0.20)) = 0.86 × (−10.8 − 4.4) = 0.86 × −15.2 = −13.07', () => {
    expect(actualBaseExcess(7.2, 14, 10)).toBeCloseTo(-13.072, 4);
  });
  it('pH 7.40 with HCO3 24.8 is 0 whatever the Hb: (1 − 0.014 Hb) × (0 + (1.43 Hb + 7.7) × 0) = 0', () => {
    for (const hb of [5, 10, 15]) expect(actualBaseExcess(7.4, 24.8, hb)).toBeCloseTo(0, 9);
  });
  it('pH 7.42, HCO3 24.1: Hb 7 gives 0.902 × (−0.7 + 17.71 × 0.02) = 0.902 × −0.3458 = −0.3119; Hb 17 gives 0.762 × (−0.7 + 32.01 × 0.02) = 0.762 × −0.0598 = −0.0456', () => {
    expect(actualBaseExcess(7.42, 24.1, 7)).toBeCloseTo(-0.31191, 4);
    expect(actualBaseExcess(7.42, 24.1, 17)).toBeCloseTo(-0.04557, 4);
  });
  it('shares the SBE\'s HCO3 at pH 7.40, 24.8: both are 0 there, whatever the Hb, and differ by Z and the buffer slope alone', () => {
    fc.assert(
      fc.property(fc.double({ min: 6.8, max: 7.8, noNaN: true }), fc.double({ min: 2, max: 60, noNaN: true }), fc.double({ min: 3, max: 20, noNaN: true }), (ph, hco3, hb) => {
        const x = ph - 7.4;
        expect(standardBaseExcess(ph, hco3)!).toBeCloseTo(hco3 - 24.8 + 16.2 * x, 9);
        expect(actualBaseExcess(ph, hco3, hb)!).toBeCloseTo((1 - 0.014 * hb) * (hco3 - 24.8 + (1.43 * hb + 7.7) * x), 9);
      }),
    );
    for (const hb of [5, 10, 15]) expect(actualBaseExcess(7.4, 24.8, hb)! - standardBaseExcess(7.4, 24.8)!).toBeCloseTo(0, 9);
  });
  it('is null for an Hb of 0 or less, or one above 50 g/dL', () => {
    expect(actualBaseExcess(7.4, 24, 0)).toBeNull();
    expect(actualBaseExcess(7.4, 24, -3)).toBeNull();
    expect(actualBaseExcess(7.4, 24, 80)).toBeNull();
  });
});

describe('the span of the two forms, and the tolerance (±3 mmol/L: common practice, no source)', () => {
  it('with no Hb, spans the SBE and the ABE over Hb 7–17 g/dL: pH 7.42, HCO3 24.1 gives −0.376 to −0.046 (the values above)', () => {
    const span = baseExcessSpan(7.42, 24.1)!;
    expect(span.low).toBeCloseTo(-0.376, 4);
    expect(span.high).toBeCloseTo(-0.04557, 4);
  });
  it('with a stated Hb, spans the SBE and the ABE at that Hb: pH 7.20, HCO3 14, Hb 10 gives −14.04 to −13.07', () => {
    const span = baseExcessSpan(7.2, 14, 10)!;
    expect(span.low).toBeCloseTo(-14.04, 4);
    expect(span.high).toBeCloseTo(-13.072, 4);
  });
  it('holds the SBE and the ABE at every Hb of 7–17 g/dL, its turning point inside the span included', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 6.8, max: 7.8, noNaN: true }),
        fc.double({ min: 2, max: 60, noNaN: true }),
        fc.double({ min: BASE_EXCESS_HB_SPAN_G_DL.low, max: BASE_EXCESS_HB_SPAN_G_DL.high, noNaN: true }),
        (ph, hco3, hb) => {
          const span = baseExcessSpan(ph, hco3)!;
          const abe = actualBaseExcess(ph, hco3, hb)!;
          expect(abe).toBeGreaterThanOrEqual(span.low - 1e-9);
          expect(abe).toBeLessThanOrEqual(span.high + 1e-9);
          expect(standardBaseExcess(ph, hco3)!).toBeGreaterThanOrEqual(span.low);
          expect(standardBaseExcess(ph, hco3)!).toBeLessThanOrEqual(span.high);
        },
      ),
    );
  });
  it('accepts a value up to 3 mmol/L beyond either end, ends included, and nothing further', () => {
    expect(BASE_EXCESS_TOLERANCE_MMOL_L).toBe(3);
    const span = { low: -2, high: 1 };
    expect(baseExcessAgrees(4, span)).toBe(true);
    expect(baseExcessAgrees(4.01, span)).toBe(false);
    expect(baseExcessAgrees(-5, span)).toBe(true);
    expect(baseExcessAgrees(-5.01, span)).toBe(false);
    expect(baseExcessAgrees(0, span)).toBe(true);
    // An end on paper is the end: −0.1 − 3 is −3.1, not −3.1000000000000001.
    expect(baseExcessAgrees(-3.1, { low: -0.1, high: 0.2 })).toBe(true);
  });
  it('is null where the pH or the HCO3 is unusable, or a given Hb is', () => {
    expect(baseExcessSpan(Number.NaN, 24)).toBeNull();
    expect(baseExcessSpan(7.4, Number.POSITIVE_INFINITY)).toBeNull();
    expect(baseExcessSpan(7.4, 24, 0)).toBeNull();
  });
});
