import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { inspiredPo2Humidified } from '../../server/src/core/physiology/atmosphere';
import * as gas from '../../server/src/core/physiology/gas-exchange';
import {
  aaGradient,
  aaGradientUpperNormal,
  alveolarPo2Full,
  alveolarPo2Simplified,
  arterialAlveolarRatio,
  BERLIN_BAND_SEVERITY,
  berlinOxygenationBand,
  oxygenationIndex,
  oxygenSaturationIndex,
  pfRatio,
  pfRatioAltitudeAdjusted,
  po2FromSaturation,
  roxIndex,
  saturationFromPo2Severinghaus,
  sfRatio,
  type AaGradientAgeRule,
} from '../../server/src/core/physiology/gas-exchange';
import { assertTotal, awkwardDouble, exportedFunctionNames, totality } from './helpers';

const seaLevelPio2Air = inspiredPo2Humidified(0.21, 760) ?? 0; // 149.7 mmHg
const seaLevelPio2Oxygen = inspiredPo2Humidified(1, 760) ?? 0; // 713 mmHg

describe('alveolar gas equation', () => {
  it('air at sea level, PaCO2 40: PAO2 ≈ 100 mmHg (West, Respiratory Physiology: The Essentials; from memory)', () => {
    expect(Math.abs((alveolarPo2Simplified(seaLevelPio2Air, 40) ?? 0) - 100)).toBeLessThanOrEqual(1);
    expect(Math.abs((alveolarPo2Full(0.21, seaLevelPio2Air, 40) ?? 0) - 100)).toBeLessThanOrEqual(2.5);
  });
  it('full form is ≈ 2 mmHg above the simplified on air and ≈ 10 mmHg on FiO2 1.0 (shared/REFERENCES.md; Riley & Cournand 1949, from memory)', () => {
    const onAir = (alveolarPo2Full(0.21, seaLevelPio2Air, 40) ?? 0) - (alveolarPo2Simplified(seaLevelPio2Air, 40) ?? 0);
    const onOxygen = (alveolarPo2Full(1, seaLevelPio2Oxygen, 40) ?? 0) - (alveolarPo2Simplified(seaLevelPio2Oxygen, 40) ?? 0);
    expect(onAir).toBeCloseTo(2.1, 1);
    expect(onOxygen).toBeCloseTo(10, 6);
  });
  it('the excess of the full form over the simplified is PaCO2 × FiO2 × (1/R − 1): the same 2.1 and 10 mmHg, 25 mmHg with PaCO2 100 on FiO2 1.0, none at R 1 (shared/REFERENCES.md; Riley & Cournand 1949, from memory)', () => {
    expect(gas.fullFormExcessMmhg(0.21, 40)).toBeCloseTo((alveolarPo2Full(0.21, seaLevelPio2Air, 40) ?? 0) - (alveolarPo2Simplified(seaLevelPio2Air, 40) ?? 0), 9);
    expect(gas.fullFormExcessMmhg(1, 40)).toBeCloseTo(10, 9);
    expect(gas.fullFormExcessMmhg(1, 100)).toBeCloseTo(25, 9);
    expect(gas.fullFormExcessMmhg(0.5, 40, 1)).toBe(0);
    expect(gas.fullFormExcessMmhg(0.5, 40, 1.2)).toBe(0);
    expect(gas.fullFormExcessMmhg(0, 40)).toBeNull();
  });
  it('Everest summit: PB 253, PACO2 7.5, R 0.85 → PAO2 ≈ 35 mmHg (West et al., J Appl Physiol 1983;55:678–687; from memory)', () => {
    const pio2 = inspiredPo2Humidified(0.2093, 253) ?? 0;
    expect(Math.abs((alveolarPo2Full(0.2093, pio2, 7.5, 0.85) ?? 0) - 35)).toBeLessThanOrEqual(1.5);
  });
  it('returns null for a negative result or invalid inputs', () => {
    expect(alveolarPo2Simplified(43, 60)).toBeNull();
    expect(alveolarPo2Simplified(150, 40, 0)).toBeNull();
    expect(alveolarPo2Full(0, 150, 40)).toBeNull();
  });
});

describe('A–a gradient', () => {
  it('young adult on air: PAO2 ≈ 100, PaO2 90 → about 10 mmHg (common practice, no source)', () => {
    expect(aaGradient(99.7, 90)).toBeCloseTo(9.7, 9);
    expect(aaGradient(100, 95)).toBe(5);
  });
  it('keeps an impossible negative gradient for the check layer to flag', () => {
    expect(aaGradient(100, 110)).toBe(-10);
  });
  const upperNormal: ReadonlyArray<readonly [AaGradientAgeRule, number, number, string]> = [
    ['age-over-4-plus-4', 40, 14, 'age/4 + 4 (common practice, no source)'],
    ['age-over-4-plus-4', 80, 24, 'age/4 + 4 (common practice, no source)'],
    ['age-plus-10-over-4', 40, 12.5, '(age + 10)/4 (common practice, no source)'],
    ['age-plus-10-over-4', 70, 20, '(age + 10)/4 (common practice, no source)'],
    ['mellemgaard', 20, 6.7, '2.5 + 0.21 × age (Mellemgaard, Acta Physiol Scand 1966; from memory)'],
    ['mellemgaard', 60, 15.1, '2.5 + 0.21 × age (Mellemgaard, Acta Physiol Scand 1966; from memory)'],
  ];
  it.each(upperNormal)('upper normal, rule %s, age %i → %f: %s', (rule, age, expected) => {
    expect(aaGradientUpperNormal(age, rule)).toBeCloseTo(expected, 9);
  });
  it('upper normal returns null for an impossible age or unknown rule', () => {
    expect(aaGradientUpperNormal(-1, 'mellemgaard')).toBeNull();
    expect(aaGradientUpperNormal(40, 'bogus' as unknown as AaGradientAgeRule)).toBeNull();
  });
});

describe('a/A ratio (Gilbert & Keighley 1974, from memory; normal above 0.75, read at derangedphysiology.com: tests/physiology/sources-read.test.ts)', () => {
  it('healthy: PaO2 90 / PAO2 100 = 0.9; severe shunt on oxygen: 60 / 663 ≈ 0.09', () => {
    expect(arterialAlveolarRatio(90, 100)).toBeCloseTo(0.9, 12);
    expect(arterialAlveolarRatio(60, 663)).toBeCloseTo(0.0905, 4);
    expect(arterialAlveolarRatio(60, 0)).toBeNull();
  });
});

describe('P/F ratio and the Berlin bands (ARDS Definition Task Force, JAMA 2012; the bands read in its table as adapted in Crit Care 2012, cc11867)', () => {
  it('P/F = PaO2 / FiO2: 90 on 0.30 = 300; 60 on 0.60 = 100', () => {
    expect(pfRatio(90, 0.3)).toBeCloseTo(300, 9);
    expect(pfRatio(60, 0.6)).toBeCloseTo(100, 9);
    expect(pfRatio(60, 0)).toBeNull();
    expect(pfRatio(60, 60)).toBeNull();
  });
  it('altitude adjustment × PB/760: P/F 250 at PB 600 → 197 (moderate band); unchanged at 760', () => {
    expect(pfRatioAltitudeAdjusted(250, 600)).toBeCloseTo(197.37, 2);
    expect(pfRatioAltitudeAdjusted(250, 760)).toBe(250);
    expect(berlinOxygenationBand(pfRatioAltitudeAdjusted(250, 600) ?? 0)).toBe('pf-100-to-200');
  });
  const bands: ReadonlyArray<readonly [number, ReturnType<typeof berlinOxygenationBand>]> = [
    [300.1, null],
    [300, 'pf-200-to-300'],
    [200.1, 'pf-200-to-300'],
    [200, 'pf-100-to-200'],
    [100.1, 'pf-100-to-200'],
    [100, 'pf-100-or-below'],
    [55, 'pf-100-or-below'],
    [-1, null],
  ];
  it.each(bands)('P/F %f → %s (Berlin: 200 < P/F ≤ 300, 100 < P/F ≤ 200, P/F ≤ 100)', (pf, band) => {
    expect(berlinOxygenationBand(pf)).toBe(band);
  });
  it('a P/F on a band boundary on paper is on it here, whatever floating point makes of the quotient (ARDS Definition Task Force, JAMA 2012)', () => {
    // 114 / 0.57 is 200 on paper and 200.00000000000003 in floating point.
    expect(pfRatio(114, 0.57)).not.toBe(200);
    expect(berlinOxygenationBand(pfRatio(114, 0.57)!)).toBe('pf-100-to-200');
    expect(berlinOxygenationBand(pfRatio(57, 0.57)!)).toBe('pf-100-or-below');
    expect(berlinOxygenationBand(pfRatio(69, 0.69)!)).toBe('pf-100-or-below');
    expect(berlinOxygenationBand(pfRatio(138, 0.69)!)).toBe('pf-100-to-200');
    expect(berlinOxygenationBand(200.001)).toBe('pf-200-to-300');
  });
  it('names the Berlin severities mild / moderate / severe', () => {
    expect(BERLIN_BAND_SEVERITY['pf-200-to-300']).toBe('mild');
    expect(BERLIN_BAND_SEVERITY['pf-100-or-below']).toBe('severe');
  });
});

describe('S/F ratio (Rice et al., Chest 2007, read in its abstract: S/F 235 ≈ P/F 200, S/F 315 ≈ P/F 300)', () => {
  it('SpO2 94 % on 0.40 → 235; SpO2 94.5 % on 0.30 → 315', () => {
    expect(sfRatio(94, 0.4)).toBeCloseTo(235, 9);
    expect(sfRatio(94.5, 0.3)).toBeCloseTo(315, 9);
    expect(sfRatio(101, 0.3)).toBeNull();
  });
});

describe('ROX index (Roca et al., J Crit Care 2016, from memory; AJRCCM 2019, its 4.88 and 3.85 read in its abstract)', () => {
  it('SpO2 88 %, FiO2 0.60, RR 30 → 4.89, just above the 4.88 success threshold', () => {
    expect(roxIndex(88, 0.6, 30)).toBeCloseTo(4.889, 3);
  });
  it('SpO2 90 %, FiO2 0.80, RR 32 → 3.52, below the 3.85 failure threshold', () => {
    expect(roxIndex(90, 0.8, 32)).toBeCloseTo(3.516, 3);
    expect(roxIndex(90, 0.8, 0)).toBeNull();
  });
});

describe('oxygenation and oxygen saturation indices (PALICC 2015: its bands read as reproduced at PMC6589490, table 1; the SpO2 limit in PALICC-2, PMC9848214, table 5; the formulas from memory)', () => {
  it('OI = FiO2 × MAP × 100 / PaO2: 0.5 × 16 × 100 / 50 = 16 (severe cut-off); 0.4 × 12 × 100 / 80 = 6 (mild band 4–8)', () => {
    expect(oxygenationIndex(0.5, 16, 50)).toBeCloseTo(16, 9);
    expect(oxygenationIndex(0.4, 12, 80)).toBeCloseTo(6, 9);
    expect(oxygenationIndex(0.4, 12, 0)).toBeNull();
  });
  it('OSI = FiO2 × MAP × 100 / SpO2: 0.6 × 18 × 100 / 88 ≈ 12.3 (severe cut-off); 0.4 × 12 × 100 / 92 ≈ 5.2 (mild band 5–7.5)', () => {
    expect(oxygenSaturationIndex(0.6, 18, 88)).toBeCloseTo(12.27, 2);
    expect(oxygenSaturationIndex(0.4, 12, 92)).toBeCloseTo(5.22, 2);
  });
  it('OSI is not defined above SpO2 97 %', () => {
    expect(oxygenSaturationIndex(0.4, 12, 97)).not.toBeNull();
    expect(oxygenSaturationIndex(0.4, 12, 98)).toBeNull();
  });
});

describe('oxygen dissociation curve (Severinghaus, J Appl Physiol 1979; read in its abstract)', () => {
  it('is the abstract\'s equation 1, S = (((PO2³ + 150 PO2)⁻¹ × 23,400) + 1)⁻¹, written out here again', () => {
    for (let po2 = 1; po2 <= 600; po2 += 0.5) {
      expect(saturationFromPo2Severinghaus(po2)).toBeCloseTo(1 / ((1 / (po2 ** 3 + 150 * po2)) * 23400 + 1), 12);
    }
  });
  it('the exact inversion agrees with the abstract\'s own approximate equation 2 within 1.5 % from S 0.1 to 0.98', () => {
    // ln PO2 = 0.385 ln((1/S − 1)⁻¹) + 3.32 − (72 S)⁻¹ − 0.17 S⁶ (Severinghaus 1979, equation 2, read in its abstract).
    for (let s = 0.1; s <= 0.98; s += 0.01) {
      const eq2 = Math.exp(0.385 * Math.log(1 / (1 / s - 1)) + 3.32 - 1 / (72 * s) - 0.17 * s ** 6);
      expect(Math.abs(po2FromSaturation(s)! / eq2 - 1)).toBeLessThan(0.015);
    }
  });
  it('P50 of standard human blood is 26.8 mmHg → S = 0.50', () => {
    expect(Math.abs((saturationFromPo2Severinghaus(26.8) ?? 0) - 0.5)).toBeLessThanOrEqual(0.005);
  });
  it('mixed venous PO2 40 → ≈ 75 %; arterial PO2 100 → ≈ 97.5 % (standard curve; West, Respiratory Physiology; from memory)', () => {
    expect(Math.abs((saturationFromPo2Severinghaus(40) ?? 0) - 0.75)).toBeLessThanOrEqual(0.01);
    expect(Math.abs((saturationFromPo2Severinghaus(100) ?? 0) - 0.975)).toBeLessThanOrEqual(0.005);
  });
  it('PO2 60 → ≈ 90 % (common practice, no source)', () => {
    expect(Math.abs((saturationFromPo2Severinghaus(60) ?? 0) - 0.9)).toBeLessThanOrEqual(0.01);
  });
  it('PO2 from saturation, exact inversion (Ellis 1989, as read in a reproduction): S 0.50 → 26.8 mmHg; S 0.90 → ≈ 60 mmHg (common practice)', () => {
    expect(Math.abs((po2FromSaturation(0.5) ?? 0) - 26.8)).toBeLessThanOrEqual(0.2);
    expect(Math.abs((po2FromSaturation(0.9) ?? 0) - 60)).toBeLessThanOrEqual(2);
  });
  it('the inversion is exact: po2FromSaturation(S(PO2)) = PO2', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 600, noNaN: true }), (po2) => {
        const back = po2FromSaturation(saturationFromPo2Severinghaus(po2) ?? 0) ?? 0;
        expect(Math.abs(back - po2) / po2).toBeLessThan(1e-6);
      }),
    );
  });
  it('edges: S 0 → 0, S ≥ 1 → null, negative PO2 → null', () => {
    expect(po2FromSaturation(0)).toBe(0);
    expect(po2FromSaturation(1)).toBeNull();
    expect(saturationFromPo2Severinghaus(0)).toBe(0);
    expect(saturationFromPo2Severinghaus(-1)).toBeNull();
  });
});

describe('null safety (fast-check)', () => {
  const d = awkwardDouble;
  const rules = fc.constantFrom<AaGradientAgeRule>(
    'age-over-4-plus-4',
    'age-plus-10-over-4',
    'mellemgaard',
    'bogus' as unknown as AaGradientAgeRule,
  );
  const cases = {
    alveolarPo2Simplified: totality(fc.tuple(d, d, d), gas.alveolarPo2Simplified),
    alveolarPo2Full: totality(fc.tuple(d, d, d, d), gas.alveolarPo2Full),
    alveolarPo2SimplifiedSigned: totality(fc.tuple(d, d, d), gas.alveolarPo2SimplifiedSigned),
    alveolarPo2FullSigned: totality(fc.tuple(d, d, d, d), gas.alveolarPo2FullSigned),
    aaGradient: totality(fc.tuple(d, d), gas.aaGradient),
    fullFormExcessMmhg: totality(fc.tuple(d, d, d), gas.fullFormExcessMmhg),
    aaGradientUpperNormal: totality(fc.tuple(d, rules), gas.aaGradientUpperNormal),
    arterialAlveolarRatio: totality(fc.tuple(d, d), gas.arterialAlveolarRatio),
    arterialEndTidalCo2Difference: totality(fc.tuple(d, d), gas.arterialEndTidalCo2Difference),
    pfRatio: totality(fc.tuple(d, d), gas.pfRatio),
    pfRatioAltitudeAdjusted: totality(fc.tuple(d, d), gas.pfRatioAltitudeAdjusted),
    berlinOxygenationBand: totality(fc.tuple(d), gas.berlinOxygenationBand),
    sfRatio: totality(fc.tuple(d, d), gas.sfRatio),
    roxIndex: totality(fc.tuple(d, d, d), gas.roxIndex),
    roxThresholdHour: totality(fc.tuple(d), gas.roxThresholdHour),
    roxSideAt: totality(fc.tuple(d, d), gas.roxSideAt),
    oxygenationIndex: totality(fc.tuple(d, d, d), gas.oxygenationIndex),
    oxygenSaturationIndex: totality(fc.tuple(d, d, d), gas.oxygenSaturationIndex),
    saturationFromPo2Severinghaus: totality(fc.tuple(d), gas.saturationFromPo2Severinghaus),
    po2FromSaturation: totality(fc.tuple(d), gas.po2FromSaturation),
  };
  it('covers every exported function', () => {
    expect(Object.keys(cases).sort()).toEqual(exportedFunctionNames(gas));
  });
  it('no function throws or returns NaN/Infinity for arbitrary doubles', () => {
    assertTotal(cases);
  });
});
