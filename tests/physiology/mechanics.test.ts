import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import * as mechanics from '../../server/src/core/physiology/mechanics';
import {
  airwayResistance,
  complianceDynamic,
  complianceStatic,
  drivingPressure,
  mechanicalPowerSimplified,
  mechanicalPowerSurrogate,
  minuteVentilationLPerMin,
  predictedBodyWeightKg,
  ventilatoryRatio,
  vtPerKgPbw,
  type Sex,
} from '../../server/src/core/physiology/mechanics';
import { assertTotal, awkwardDouble, exportedFunctionNames, totality } from './helpers';

describe('minute ventilation', () => {
  it('500 mL × 15 /min = 7.5 L/min (West, Respiratory Physiology: The Essentials; from memory)', () => {
    expect(minuteVentilationLPerMin(500, 15)).toBeCloseTo(7.5, 12);
  });
  it('420 mL × 20 /min = 8.4 L/min (same definition)', () => {
    expect(minuteVentilationLPerMin(420, 20)).toBeCloseTo(8.4, 12);
    expect(minuteVentilationLPerMin(-1, 20)).toBeNull();
  });
});

describe('predicted body weight (ARDS Network, NEJM 2000)', () => {
  // ARDSNet: male 50 + 2.3 × (height in − 60), female 45.5 + 2.3 × (height in − 60) (the network's
  // protocol card, read in its reproduction at thorax.us/ventilator_settings_pulmonary_me.htm); in cm
  // the slope is 0.91 per cm (the NEJM paper's form, from memory; 2.3 ÷ 2.54 = 0.906).
  const table: ReadonlyArray<readonly [number, Sex, number, string]> = [
    [152.4, 'male', 50, '5 ft 0 in'],
    [152.4, 'female', 45.5, '5 ft 0 in'],
    [177.8, 'male', 73.0, '5 ft 10 in, 50 + 2.3 × 10'],
    [162.6, 'female', 54.7, '5 ft 4 in, 45.5 + 2.3 × 4'],
  ];
  it.each(table)('%f cm, %s → %f kg (%s)', (heightCm, sex, kg) => {
    expect(Math.abs((predictedBodyWeightKg(heightCm, sex) ?? 0) - kg)).toBeLessThanOrEqual(0.2);
  });
  it('agrees with the protocol card in inches within 0.3 kg from 152.4 to 213 cm (0.0045 kg per cm above 152.4) (ARDS Network protocol card, read in its reproduction at thorax.us)', () => {
    for (let cm = 152.4; cm <= 213; cm += 0.5) {
      const inches = cm / 2.54;
      expect(Math.abs(predictedBodyWeightKg(cm, 'male')! - (50 + 2.3 * (inches - 60)))).toBeLessThan(0.3);
      expect(Math.abs(predictedBodyWeightKg(cm, 'female')! - (45.5 + 2.3 * (inches - 60)))).toBeLessThan(0.3);
    }
  });
  it('6 mL/kg PBW is the ARDSNet target: 420 mL for 70 kg', () => {
    expect(vtPerKgPbw(420, 70)).toBeCloseTo(6, 12);
    expect(vtPerKgPbw(560, 70)).toBeCloseTo(8, 12);
    expect(vtPerKgPbw(420, 0)).toBeNull();
  });
  it('returns null for a non-positive result, impossible height or unknown sex', () => {
    expect(predictedBodyWeightKg(90, 'female')).toBeNull();
    expect(predictedBodyWeightKg(0, 'male')).toBeNull();
    expect(predictedBodyWeightKg(170, 'other' as unknown as Sex)).toBeNull();
  });
});

describe('driving pressure and compliance (Amato et al., NEJM 2015, read in its abstract: ΔP = VT / Crs)', () => {
  it('Pplat 27, PEEP 12 → driving pressure 15 cmH2O, the level commonly flagged (common practice)', () => {
    expect(drivingPressure(27, 12)).toBe(15);
  });
  it('driving pressure = VT / static compliance: 420 mL at Crs 28 mL/cmH2O → 15 cmH2O', () => {
    const compliance = complianceStatic(420, 27, 12) ?? 0;
    expect(compliance).toBeCloseTo(28, 12);
    expect((drivingPressure(27, 12) ?? 0) * compliance).toBeCloseTo(420, 9);
  });
  it('static VT/(Pplat − PEEP): 500 / (20 − 5) = 33.3; dynamic VT/(Ppeak − PEEP): 500 / (30 − 5) = 20 mL/cmH2O (standard mechanics, common practice)', () => {
    expect(complianceStatic(500, 20, 5)).toBeCloseTo(33.33, 2);
    expect(complianceDynamic(500, 30, 5)).toBeCloseTo(20, 12);
  });
  it('returns null when the plateau is not above PEEP', () => {
    expect(drivingPressure(10, 12)).toBeNull();
    expect(complianceStatic(500, 5, 5)).toBeNull();
    expect(complianceDynamic(500, 4, 5)).toBeNull();
  });
});

describe('airway resistance (constant-flow volume control; standard mechanics, common practice)', () => {
  it('(30 − 20) cmH2O at 60 L/min (1 L/s) → 10 cmH2O·s/L', () => {
    expect(airwayResistance(30, 20, 60)).toBeCloseTo(10, 12);
  });
  it('(25 − 19) cmH2O at 45 L/min (0.75 L/s) → 8 cmH2O·s/L', () => {
    expect(airwayResistance(25, 19, 45)).toBeCloseTo(8, 12);
    expect(airwayResistance(25, 19, 0)).toBeNull();
    expect(airwayResistance(18, 19, 45)).toBeNull();
  });
});

describe('mechanical power, surrogate for volume control (Giosa L et al., Intensive Care Med Exp 2019;7:61; formula read in its abstract, PMC6879677)', () => {
  // Worked by us from the published formula VE × (Ppeak + PEEP + F/6) / 20 (VE and F in L/min, pressures in cmH2O, J/min);
  // no worked example from the paper was at hand.
  it('VE 10 L/min, Ppeak 30, PEEP 10, flow 60 L/min → 10 × (30 + 10 + 10) / 20 = 25 J/min', () => {
    expect(mechanicalPowerSurrogate(10, 30, 10, 60)).toBeCloseTo(25, 9);
  });
  it('is close to the simplified power equation in constant-flow volume control: RR 20, VT 500 mL, Ppeak 30, Pplat 25, PEEP 10, flow 60', () => {
    // Gattinoni's simplified form gives 22.05 J/min for these settings (above); the surrogate, 25.
    expect(Math.abs(mechanicalPowerSurrogate(10, 30, 10, 60)! - mechanicalPowerSimplified(20, 500, 30, 25, 10)!)).toBeLessThan(4);
  });
  it('needs a positive flow and a peak pressure at or above PEEP', () => {
    expect(mechanicalPowerSurrogate(10, 30, 10, 0)).toBeNull();
    expect(mechanicalPowerSurrogate(10, 8, 10, 60)).toBeNull();
  });
});

describe('mechanical power, simplified (Gattinoni et al., Intensive Care Med 2016; the simplified form from memory)', () => {
  // Worked by us from the published formula; no worked example from the paper was at hand.
  it('RR 20, VT 500 mL, Ppeak 30, Pplat 25, PEEP 10 → 0.098 × 20 × 0.5 × (30 − 7.5) = 22.05 J/min', () => {
    expect(mechanicalPowerSimplified(20, 500, 30, 25, 10)).toBeCloseTo(22.05, 9);
  });
  it('RR 15, VT 450 mL, Ppeak 22, Pplat 18, PEEP 5 → 10.25 J/min', () => {
    expect(mechanicalPowerSimplified(15, 450, 22, 18, 5)).toBeCloseTo(10.25325, 9);
  });
  // The full equation as quoted in the abstract of Wu SH et al., J Clin Monit Comput 2022 (doi 10.1007/s10877-022-00823-3), read.
  it('equals Gattinoni’s full power equation under constant flow: 0.098 × RR × [VT² × (½·EL + RR·(1 + I:E)/(60·I:E)·Raw) + VT × PEEP]', () => {
    const rr = 20;
    const vtL = 0.5;
    const elastance = 30; // cmH2O/L → driving pressure 15
    const resistance = 10; // cmH2O·s/L
    const ie = 0.5; // I:E 1:2
    const peep = 5;
    const full = 0.098 * rr * (vtL * vtL * (0.5 * elastance + ((rr * (1 + ie)) / (60 * ie)) * resistance) + vtL * peep);
    const inspiratoryTimeS = (60 / rr) * (ie / (1 + ie));
    const flowLPerS = vtL / inspiratoryTimeS;
    const pplat = peep + vtL * elastance;
    const ppeak = pplat + flowLPerS * resistance;
    expect(mechanicalPowerSimplified(rr, vtL * 1000, ppeak, pplat, peep)).toBeCloseTo(full, 9);
    expect(full).toBeCloseTo(17.15, 9);
  });
  it('returns null when pressures are out of order', () => {
    expect(mechanicalPowerSimplified(20, 500, 24, 25, 10)).toBeNull();
    expect(mechanicalPowerSimplified(20, 500, 30, 8, 10)).toBeNull();
  });
});

describe('ventilatory ratio (Sinha et al., Br J Anaesth 2009; AJRCCM 2019; the formula read in their abstracts: 100 mL/kg/min and 5 kPa = 37.5 mmHg)', () => {
  it('predicted ventilation 100 mL/kg/min and PaCO2 37.5 give exactly 1: PBW 70, VE 7,000 mL/min, PaCO2 37.5', () => {
    expect(ventilatoryRatio(7000, 37.5, 70)).toBeCloseTo(1, 12);
  });
  it('PBW 70, VE 10,000 mL/min, PaCO2 45 → 1.71', () => {
    expect(ventilatoryRatio(10000, 45, 70)).toBeCloseTo(1.714, 3);
    expect(ventilatoryRatio(10000, 45, 0)).toBeNull();
  });
});

describe('null safety (fast-check)', () => {
  const d = awkwardDouble;
  const sex = fc.constantFrom<Sex>('male', 'female', 'bogus' as unknown as Sex);
  const cases = {
    minuteVentilationLPerMin: totality(fc.tuple(d, d), mechanics.minuteVentilationLPerMin),
    predictedBodyWeightKg: totality(fc.tuple(d, sex), mechanics.predictedBodyWeightKg),
    vtPerKgPbw: totality(fc.tuple(d, d), mechanics.vtPerKgPbw),
    drivingPressure: totality(fc.tuple(d, d), mechanics.drivingPressure),
    complianceStatic: totality(fc.tuple(d, d, d), mechanics.complianceStatic),
    complianceDynamic: totality(fc.tuple(d, d, d), mechanics.complianceDynamic),
    airwayResistance: totality(fc.tuple(d, d, d), mechanics.airwayResistance),
    mechanicalPowerSimplified: totality(fc.tuple(d, d, d, d, d), mechanics.mechanicalPowerSimplified),
    mechanicalPowerSurrogate: totality(fc.tuple(d, d, d, d), mechanics.mechanicalPowerSurrogate),
    ventilatoryRatio: totality(fc.tuple(d, d, d), mechanics.ventilatoryRatio),
  };
  it('covers every exported function', () => {
    expect(Object.keys(cases).sort()).toEqual(exportedFunctionNames(mechanics));
  });
  it('no function throws or returns NaN/Infinity for arbitrary doubles', () => {
    assertTotal(cases);
  });
});
