/**
 * Unit conversions, checked against (a) the definitions of the units (NIST SP 811, SI Brochure)
 * and (b) an independent general-purpose UCUM implementation, @lhncbc/ucum-lhc.
 *
 * Tolerance against UCUM: relative 1e-5. UCUM defines mm[Hg] as 133.3220 Pa (rounded), while the
 * conventional millimetre of mercury is 133.322387 Pa (MMHG_PER_KPA = 1000 ÷ 133.322387 = 7.500617,
 * 7.50062 to six figures); the two therefore differ by ~3e-6 relative.
 */
import { UcumLhcUtils } from '@lhncbc/ucum-lhc';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import * as units from '../../server/src/core/physiology/units';
import { convert, unitById } from '../../server/src/core/fields/units';
import {
  celsiusFromFahrenheit,
  cmh2oToMmhg,
  fahrenheitFromCelsius,
  feetFromMetres,
  fractionFromPercent,
  hpaToMmhg,
  kpaToMmhg,
  MMHG_PER_CMH2O,
  MMHG_PER_KPA,
  metresFromFeet,
  mmhgToCmh2o,
  mmhgToKpa,
  paToMmhg,
  percentFromFraction,
} from '../../server/src/core/physiology/units';
import { assertTotal, awkwardDouble, exportedFunctionNames, totality } from './helpers';

const ucum = UcumLhcUtils.getInstance();

/** Converts with UCUM and insists that the conversion succeeded. */
function ucumConvert(fromCode: string, value: number, toCode: string): number {
  const result = ucum.convertUnitTo(fromCode, value, toCode);
  expect(result.status, `${fromCode} → ${toCode}: ${result.msg.join('; ')}`).toBe('succeeded');
  if (result.toVal === null) throw new Error('UCUM returned no value');
  return result.toVal;
}

function expectRelativelyClose(actual: number | null, expected: number, relative = 1e-5): void {
  expect(actual).not.toBeNull();
  const a = actual ?? Number.NaN;
  expect(Math.abs(a - expected)).toBeLessThanOrEqual(Math.abs(expected) * relative + 1e-12);
}

describe('pressure constants', () => {
  it('1 kPa = 7.50062 mmHg (NIST SP 811: 1 mmHg = 133.3224 Pa) and agrees with UCUM', () => {
    expect(1000 / 133.3224).toBeCloseTo(MMHG_PER_KPA, 4);
    expectRelativelyClose(MMHG_PER_KPA, ucumConvert('kPa', 1, 'mm[Hg]'));
  });
  it('1 cmH2O = 98.0665 Pa = 0.735559 mmHg (NIST SP 811) and agrees with UCUM', () => {
    expect(98.0665 / 133.322387415).toBeCloseTo(MMHG_PER_CMH2O, 6);
    expectRelativelyClose(MMHG_PER_CMH2O, ucumConvert('cm[H2O]', 1, 'mm[Hg]'));
  });
});

// The library the factors below were checked with, and its version (a newer one may round UCUM's
// definitions otherwise: read this test again before moving the pin).
const UCUM_LHC_VERSION = (JSON.parse(readFileSync(fileURLToPath(new URL('../../node_modules/@lhncbc/ucum-lhc/package.json', import.meta.url)), 'utf8')) as { version: string }).version;

describe('Pneumark\'s factors, checked against UCUM as implemented by @lhncbc/ucum-lhc 7.1.10', () => {
  it('is that version of the library', () => {
    expect(UCUM_LHC_VERSION).toBe('7.1.10');
  });
  it('mmHg: UCUM\'s mm[Hg] is 133.322 Pa (133.3220, rounded), the conventional 133.322387 within 3e-6', () => {
    expect(ucumConvert('mm[Hg]', 1, 'Pa')).toBeCloseTo(133.322, 9);
    expectRelativelyClose(units.PA_PER_MMHG, ucumConvert('mm[Hg]', 1, 'Pa'), 3e-6);
    expectRelativelyClose(MMHG_PER_KPA, ucumConvert('kPa', 1, 'mm[Hg]'), 3e-6);
  });
  it('cmH2O: 98.0665 Pa exactly, as UCUM\'s cm[H2O] (m[H2O] = 9.80665 kPa)', () => {
    expect(ucumConvert('cm[H2O]', 1, 'Pa')).toBeCloseTo(units.PA_PER_CMH2O, 9);
  });
  it('the foot: 0.3048 m exactly, as UCUM\'s [ft_i]', () => {
    expect(ucumConvert('[ft_i]', 1, 'm')).toBeCloseTo(units.METRES_PER_FOOT, 12);
  });
  it('the degree Fahrenheit: 98.6 °F is 37 °C, as UCUM\'s [degF]', () => {
    expect(celsiusFromFahrenheit(98.6)).toBeCloseTo(ucumConvert('[degF]', 98.6, 'Cel'), 9);
    expect(ucumConvert('[degF]', 98.6, 'Cel')).toBeCloseTo(37, 9);
  });
  it('haemoglobin g/dL ↔ g/L: 10 g/L per g/dL, as the unit registry reads and writes it', () => {
    const gdl = unitById('g/dL')!;
    const gl = unitById('g/L')!;
    for (const v of [4.5, 9.8, 13.6, 21]) {
      expect(convert(v, gdl, gl)).toBeCloseTo(ucumConvert('g/dL', v, 'g/L'), 9);
      expect(convert(v * 10, gl, gdl)).toBeCloseTo(ucumConvert('g/L', v * 10, 'g/dL'), 9);
    }
  });
  it('the standard atmosphere: 101 325 Pa, as UCUM\'s atm', () => {
    expect(ucumConvert('atm', 1, 'Pa')).toBe(units.PA_PER_ATMOSPHERE);
  });
});

describe('one kPa factor', () => {
  it('the unit registry (values read and shown) converts kPa exactly as kpaToMmhg and mmhgToKpa do', () => {
    const kpa = unitById('kPa')!;
    const mmHg = unitById('mmHg')!;
    for (const v of [1, 5.3, 8, 13.3, 101.325]) expect(convert(v, kpa, mmHg)).toBe(kpaToMmhg(v));
    for (const v of [40, 60, 100, 253, 760]) expect(convert(v, mmHg, kpa)).toBe(mmhgToKpa(v));
  });
});

describe('kpaToMmhg / mmhgToKpa', () => {
  it('standard atmosphere: 101.325 kPa ≈ 760 mmHg (SI Brochure, 9th ed.: 1 atm = 101 325 Pa)', () => {
    expect(kpaToMmhg(101.325)).toBeCloseTo(760, 2);
    expect(mmhgToKpa(760)).toBeCloseTo(101.325, 2);
  });
  it.each([1, 5.3, 13.3, 101.325])('kPa %f → mmHg agrees with UCUM', (kpa) => {
    expectRelativelyClose(kpaToMmhg(kpa), ucumConvert('kPa', kpa, 'mm[Hg]'));
  });
  it.each([40, 100, 253, 760])('mmHg %f → kPa agrees with UCUM', (mmhg) => {
    expectRelativelyClose(mmhgToKpa(mmhg), ucumConvert('mm[Hg]', mmhg, 'kPa'));
  });
  it('round-trips', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (kpa) => {
        const back = mmhgToKpa(kpaToMmhg(kpa) ?? Number.NaN);
        expect(back).not.toBeNull();
        expect(Math.abs((back ?? 0) - kpa)).toBeLessThanOrEqual(Math.abs(kpa) * 1e-12 + 1e-12);
      }),
    );
  });
});

describe('paToMmhg / hpaToMmhg', () => {
  it('101 325 Pa and 1013.25 hPa ≈ 760 mmHg (SI Brochure, standard atmosphere)', () => {
    expect(paToMmhg(101325)).toBeCloseTo(760, 2);
    expect(hpaToMmhg(1013.25)).toBeCloseTo(760, 2);
  });
  it.each([101325, 33700, 54048])('Pa %f → mmHg agrees with UCUM', (pa) => {
    expectRelativelyClose(paToMmhg(pa), ucumConvert('Pa', pa, 'mm[Hg]'));
  });
  it.each([1013.25, 337, 600])('hPa %f → mmHg agrees with UCUM', (hpa) => {
    expectRelativelyClose(hpaToMmhg(hpa), ucumConvert('hPa', hpa, 'mm[Hg]'));
  });
});

describe('cmh2oToMmhg / mmhgToCmh2o', () => {
  it('10 mmHg ≈ 13.595 cmH2O (density of mercury 13.5951 g/cm³, NIST SP 811 definitions)', () => {
    expect(mmhgToCmh2o(10)).toBeCloseTo(13.5951, 3);
    expect(cmh2oToMmhg(13.5951)).toBeCloseTo(10, 3);
  });
  it.each([1, 5, 30, -3])('cmH2O %f → mmHg agrees with UCUM', (cmh2o) => {
    expectRelativelyClose(cmh2oToMmhg(cmh2o), ucumConvert('cm[H2O]', cmh2o, 'mm[Hg]'));
  });
  it.each([10, 22, 40])('mmHg %f → cmH2O agrees with UCUM', (mmhg) => {
    expectRelativelyClose(mmhgToCmh2o(mmhg), ucumConvert('mm[Hg]', mmhg, 'cm[H2O]'));
  });
});

describe('temperature', () => {
  it('fixed points: 32 °F = 0 °C, 212 °F = 100 °C, −40 °F = −40 °C (NIST SP 811)', () => {
    expect(celsiusFromFahrenheit(32)).toBeCloseTo(0, 12);
    expect(celsiusFromFahrenheit(212)).toBeCloseTo(100, 12);
    expect(celsiusFromFahrenheit(-40)).toBeCloseTo(-40, 12);
    expect(fahrenheitFromCelsius(37)).toBeCloseTo(98.6, 10);
  });
  it.each([98.6, 32, 104, -40])('°F %f → °C agrees with UCUM', (f) => {
    expect(celsiusFromFahrenheit(f)).toBeCloseTo(ucumConvert('[degF]', f, 'Cel'), 9);
  });
  it.each([37, 0, 41.5, -40])('°C %f → °F agrees with UCUM', (c) => {
    expect(fahrenheitFromCelsius(c)).toBeCloseTo(ucumConvert('Cel', c, '[degF]'), 9);
  });
  it('rejects temperatures below absolute zero (−459.67 °F, −273.15 °C; SI Brochure)', () => {
    expect(celsiusFromFahrenheit(-460)).toBeNull();
    expect(fahrenheitFromCelsius(-274)).toBeNull();
    expect(celsiusFromFahrenheit(-459.67)).toBeCloseTo(-273.15, 9);
  });
});

describe('length', () => {
  it('1 ft = 0.3048 m exactly (international foot, NIST SP 811); 29,029 ft = 8,848 m (Everest)', () => {
    expect(metresFromFeet(1)).toBe(0.3048);
    expect(metresFromFeet(29029)).toBeCloseTo(8848.04, 2);
  });
  it.each([1, 29029, -1400])('ft %f → m agrees with UCUM', (ft) => {
    expectRelativelyClose(metresFromFeet(ft), ucumConvert('[ft_i]', ft, 'm'), 1e-12);
  });
  it.each([8848, 3000])('m %f → ft agrees with UCUM', (m) => {
    expectRelativelyClose(feetFromMetres(m), ucumConvert('m', m, '[ft_i]'), 1e-12);
  });
});

describe('percent and fraction', () => {
  it('agree with UCUM (% = 1/100)', () => {
    expectRelativelyClose(fractionFromPercent(40), ucumConvert('%', 40, '1'), 1e-12);
    expectRelativelyClose(percentFromFraction(0.97), ucumConvert('1', 0.97, '%'), 1e-12);
  });
  it('the unit registry reads a whole percentage, g/L and months as the number written in the base unit, to the last digit (% = 1/100, g/L = 1/10 g/dL, month = 1/12 year: definitions of the units)', () => {
    const read = (value: number, from: string, to: string) => convert(value, unitById(from)!, unitById(to)!);
    // 57 × 0.01 is 0.5700000000000001 in doubles, 70 × 0.01 is 0.7000000000000001: the exports
    // would give `fio2 57 %` and `fio2 0.57` two different numbers.
    for (let percent = 0; percent <= 100; percent++) expect(read(percent, '%', 'fraction'), `${percent} %`).toBe(Number(`${percent / 100}`));
    expect([read(57, '%', 'fraction'), read(70, '%', 'fraction'), read(28.5, '%', 'fraction')]).toEqual([0.57, 0.7, 0.285]);
    expect([read(34, 'g/L', 'g/dL'), read(123, 'g/L', 'g/dL')]).toEqual([3.4, 12.3]);
    expect([read(5, 'mo', 'y'), read(18, 'mo', 'y')]).toEqual([5 / 12, 1.5]);
  });
  it('reject values outside 0–100 % and 0–1', () => {
    expect(fractionFromPercent(120)).toBeNull();
    expect(fractionFromPercent(-1)).toBeNull();
    expect(percentFromFraction(1.2)).toBeNull();
  });
});

describe('null safety (fast-check)', () => {
  const one = fc.tuple(awkwardDouble);
  const cases = {
    kpaToMmhg: totality(one, units.kpaToMmhg),
    mmhgToKpa: totality(one, units.mmhgToKpa),
    paToMmhg: totality(one, units.paToMmhg),
    hpaToMmhg: totality(one, units.hpaToMmhg),
    cmh2oToMmhg: totality(one, units.cmh2oToMmhg),
    mmhgToCmh2o: totality(one, units.mmhgToCmh2o),
    celsiusFromFahrenheit: totality(one, units.celsiusFromFahrenheit),
    fahrenheitFromCelsius: totality(one, units.fahrenheitFromCelsius),
    metresFromFeet: totality(one, units.metresFromFeet),
    feetFromMetres: totality(one, units.feetFromMetres),
    fractionFromPercent: totality(one, units.fractionFromPercent),
    percentFromFraction: totality(one, units.percentFromFraction),
  };
  it('covers every exported function', () => {
    expect(Object.keys(cases).sort()).toEqual(exportedFunctionNames(units));
  });
  it('no function throws or returns NaN/Infinity for arbitrary doubles', () => {
    assertTotal(cases);
  });
});
