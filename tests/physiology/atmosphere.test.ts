import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import * as atmosphere from '../../server/src/core/physiology/atmosphere';
import {
  barometricFromAltitudeStandard,
  barometricFromAltitudeWest,
  inspiredPo2Dry,
  inspiredPo2Humidified,
  waterVapourPressureMmhg,
} from '../../server/src/core/physiology/atmosphere';
import { paToMmhg } from '../../server/src/core/physiology/units';
import { assertTotal, awkwardDouble, exportedFunctionNames, totality } from './helpers';

function mmhgFromPa(pa: number): number {
  const mmhg = paToMmhg(pa);
  if (mmhg === null) throw new Error('bad conversion');
  return mmhg;
}

describe('barometricFromAltitudeStandard', () => {
  // U.S. Standard Atmosphere 1976, table of pressure by GEOMETRIC altitude (SI units), 5
  // significant figures (from memory). Tolerance 0.05 mmHg ≈ 6.7 Pa: the table's own rounding.
  const table: ReadonlyArray<readonly [altitudeM: number, pressurePa: number]> = [
    [0, 101325],
    [1000, 89876],
    [2000, 79501],
    [3000, 70121],
    [4000, 61660],
    [5000, 54048],
    [8000, 35651],
    [9000, 30800],
    [10000, 26500],
    [11000, 22700],
  ];
  it.each(table)('U.S. Standard Atmosphere 1976 table: %i m → %i Pa', (altitudeM, pressurePa) => {
    const pb = barometricFromAltitudeStandard(altitudeM);
    expect(pb).not.toBeNull();
    expect(Math.abs((pb ?? 0) - mmhgFromPa(pressurePa))).toBeLessThanOrEqual(0.05);
  });
  it('sea level is one standard atmosphere, 760 mmHg (U.S. Standard Atmosphere 1976; SI Brochure)', () => {
    expect(barometricFromAltitudeStandard(0)).toBeCloseTo(760, 3);
  });
  it('reads ≈ 236 mmHg on the Everest summit (8,848 m), ~17 mmHg below the 253 mmHg measured there (West et al. 1983, read in its abstract)', () => {
    const pb = barometricFromAltitudeStandard(8848) ?? 0;
    expect(pb).toBeGreaterThan(234);
    expect(pb).toBeLessThan(238);
    expect(253 - pb).toBeGreaterThan(15);
    expect(253 - pb).toBeLessThan(19);
  });
  it('returns null outside the lowest layer of the standard (−5 km to 11 km) and for non-finite input', () => {
    expect(barometricFromAltitudeStandard(12000)).toBeNull();
    expect(barometricFromAltitudeStandard(-6000)).toBeNull();
    expect(barometricFromAltitudeStandard(Number.NaN)).toBeNull();
  });
});

describe('barometricFromAltitudeWest (default model)', () => {
  it('Everest summit 8,848 m: 253 mmHg measured (West et al. 1983, J Appl Physiol 54:1188; read in its abstract: 253.0 Torr), model within 2 mmHg', () => {
    expect(Math.abs((barometricFromAltitudeWest(8848) ?? 0) - 253)).toBeLessThanOrEqual(2);
  });
  it('AMREE Base Camp, 5,400 m: about 400 mmHg measured (West et al. 1983; read in its abstract: 400.4 Torr), model within 1.5 %', () => {
    expect(Math.abs((barometricFromAltitudeWest(5400) ?? 0) - 400)).toBeLessThanOrEqual(6);
  });
  it('sea level ≈ 760 mmHg (West 1996: the model is anchored at sea level; its equation read in a reproduction)', () => {
    expect(Math.abs((barometricFromAltitudeWest(0) ?? 0) - 760)).toBeLessThanOrEqual(1);
  });
  it('reads 15–17 mmHg above the standard atmosphere at 8–9 km (West 1996; its equation read in a reproduction)', () => {
    for (const altitudeM of [8000, 8848, 9000]) {
      const difference = (barometricFromAltitudeWest(altitudeM) ?? 0) - (barometricFromAltitudeStandard(altitudeM) ?? 0);
      expect(difference).toBeGreaterThanOrEqual(15);
      expect(difference).toBeLessThanOrEqual(17.5);
    }
  });
  it('falls monotonically with altitude over its domain', () => {
    fc.assert(
      fc.property(fc.double({ min: -1000, max: 9999, noNaN: true }), (h) => {
        expect(barometricFromAltitudeWest(h + 1) ?? 0).toBeLessThan(barometricFromAltitudeWest(h) ?? 0);
      }),
    );
  });
  it('returns null outside −1 km to 10 km', () => {
    expect(barometricFromAltitudeWest(10001)).toBeNull();
    expect(barometricFromAltitudeWest(-1001)).toBeNull();
  });
});

describe('waterVapourPressureMmhg (Buck 1981)', () => {
  // Saturation vapour pressure of water, IAPWS-95 formulation as tabulated in the NIST Chemistry
  // WebBook / CRC Handbook (from memory). Tolerance 0.2 %: Buck's stated accuracy (from memory).
  const steamTable: ReadonlyArray<readonly [tempC: number, pressureKpa: number]> = [
    [0.01, 0.61166],
    [20, 2.3393],
    [25, 3.1699],
    [37, 6.2795],
    [40, 7.3849],
  ];
  it.each(steamTable)('IAPWS-95 steam table: %f °C → %f kPa', (tempC, pressureKpa) => {
    const expectedMmhg = mmhgFromPa(pressureKpa * 1000);
    const pressure = waterVapourPressureMmhg(tempC) ?? 0;
    expect(Math.abs(pressure - expectedMmhg) / expectedMmhg).toBeLessThanOrEqual(0.002);
  });
  it('≈ 47 mmHg at 37 °C, the value used in the inspired PO2 formula (common practice)', () => {
    expect(waterVapourPressureMmhg(37)).toBeCloseTo(47.1, 1);
  });
  it('returns null outside Buck’s fitted range (−20 to 50 °C)', () => {
    expect(waterVapourPressureMmhg(60)).toBeNull();
    expect(waterVapourPressureMmhg(-30)).toBeNull();
  });
});

describe('inspired PO2', () => {
  it('dry air at 760 mmHg ≈ 159 mmHg (common practice, no source)', () => {
    expect(Math.abs((inspiredPo2Dry(0.21, 760) ?? 0) - 159)).toBeLessThanOrEqual(1);
  });
  it('dry air at 600 mmHg ≈ 126 mmHg (common practice, no source)', () => {
    expect(inspiredPo2Dry(0.21, 600)).toBeCloseTo(126, 6);
  });
  it('humidified air at sea level ≈ 150 mmHg (West, Respiratory Physiology: The Essentials; from memory)', () => {
    expect(Math.abs((inspiredPo2Humidified(0.21, 760) ?? 0) - 150)).toBeLessThanOrEqual(0.5);
  });
  it('humidified air on the Everest summit (PB 253) ≈ 43 mmHg (West et al. 1983; from memory)', () => {
    expect(Math.abs((inspiredPo2Humidified(0.2093, 253) ?? 0) - 43)).toBeLessThanOrEqual(0.5);
  });
  it('accepts a vapour pressure from Buck’s equation at another body temperature', () => {
    const ph2o = waterVapourPressureMmhg(33) ?? 0;
    expect(inspiredPo2Humidified(0.21, 760, ph2o)).toBeCloseTo(0.21 * (760 - ph2o), 9);
  });
  it('returns null for FiO2 outside (0, 1], PB ≤ 0, or PB not above the water vapour pressure', () => {
    expect(inspiredPo2Dry(0, 760)).toBeNull();
    expect(inspiredPo2Dry(21, 760)).toBeNull();
    expect(inspiredPo2Dry(0.21, 0)).toBeNull();
    expect(inspiredPo2Humidified(0.21, 40)).toBeNull();
    expect(inspiredPo2Humidified(0.21, 760, -1)).toBeNull();
  });
});

describe('null safety (fast-check)', () => {
  const cases = {
    barometricFromAltitudeWest: totality(fc.tuple(awkwardDouble), atmosphere.barometricFromAltitudeWest),
    barometricFromAltitudeStandard: totality(fc.tuple(awkwardDouble), atmosphere.barometricFromAltitudeStandard),
    waterVapourPressureMmhg: totality(fc.tuple(awkwardDouble), atmosphere.waterVapourPressureMmhg),
    inspiredPo2Humidified: totality(
      fc.tuple(awkwardDouble, awkwardDouble, awkwardDouble),
      atmosphere.inspiredPo2Humidified,
    ),
    inspiredPo2Dry: totality(fc.tuple(awkwardDouble, awkwardDouble), atmosphere.inspiredPo2Dry),
  };
  it('covers every exported function', () => {
    expect(Object.keys(cases).sort()).toEqual(exportedFunctionNames(atmosphere));
  });
  it('no function throws or returns NaN/Infinity for arbitrary doubles', () => {
    assertTotal(cases);
  });
});
