import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import * as transport from '../../server/src/core/physiology/oxygen-transport';
import {
  arterialO2Content,
  fio2EstimateLowFlow,
  oxygenDelivery,
  type LowFlowDevice,
} from '../../server/src/core/physiology/oxygen-transport';
import { assertTotal, awkwardDouble, exportedFunctionNames, totality } from './helpers';

describe('arterial O2 content (West, Respiratory Physiology: The Essentials, from memory; the form read on openanesthesia.org, and a worked value in tests/physiology/sources-read.test.ts)', () => {
  it('Hb 15 g/dL, SaO2 97.5 %, PaO2 100 → ≈ 20 mL/dL (normal arterial blood)', () => {
    expect(Math.abs((arterialO2Content(15, 0.975, 100) ?? 0) - 20)).toBeLessThanOrEqual(0.2);
  });
  it('Hb 15 g/dL, SvO2 75 %, PvO2 40 → ≈ 15 mL/dL (normal mixed venous blood)', () => {
    expect(arterialO2Content(15, 0.75, 40)).toBeCloseTo(15.195, 9);
  });
  it('dissolved O2 is 0.003 mL/dL per mmHg: PaO2 600 adds 1.8 mL/dL', () => {
    expect((arterialO2Content(15, 1, 600) ?? 0) - (arterialO2Content(15, 1, 0) ?? 0)).toBeCloseTo(1.8, 9);
  });
  it('accepts another Hüfner constant (1.39, the theoretical maximum) and rejects invalid inputs', () => {
    expect(arterialO2Content(15, 1, 0, 1.39)).toBeCloseTo(20.85, 9);
    expect(arterialO2Content(15, 97, 100)).toBeNull(); // percent passed where a fraction belongs
    expect(arterialO2Content(-1, 0.9, 100)).toBeNull();
    expect(arterialO2Content(15, 0.9, 100, 0)).toBeNull();
  });
});

describe('O2 delivery (standard physiology; normal ≈ 1,000 mL/min, read in a worked value at e-safe-anaesthesia.org: tests/physiology/sources-read.test.ts)', () => {
  it('CO 5 L/min × CaO2 20 mL/dL × 10 = 1,000 mL/min', () => {
    expect(oxygenDelivery(5, 20)).toBe(1000);
  });
  it('CO 4 L/min × CaO2 15 mL/dL × 10 = 600 mL/min', () => {
    expect(oxygenDelivery(4, 15)).toBe(600);
    expect(oxygenDelivery(-4, 15)).toBeNull();
  });
});

describe('rough FiO2 for low-flow devices', () => {
  const table: ReadonlyArray<readonly [LowFlowDevice, number, number | null, string]> = [
    ['cannula', 1, 0.25, 'common practice, no source'],
    ['cannula', 2, 0.29, 'common practice, no source'],
    ['cannula', 6, 0.45, 'common practice, no source'],
    ['cannula', 7, null, 'above the rule’s 6 L/min'],
    ['cannula', 0, null, 'no flow, no rule'],
    ['mask', 5, 0.35, 'common practice, no source'],
    ['mask', 7.5, 0.45, 'common practice, no source (linear between)'],
    ['mask', 10, 0.55, 'common practice, no source'],
    ['mask', 4, null, 'below 5 L/min a simple mask rebreathes CO2'],
    ['mask', 12, null, 'above the rule’s 10 L/min'],
  ];
  it.each(table)('%s at %f L/min → %s (%s)', (device, flow, expected) => {
    const fio2 = fio2EstimateLowFlow(device, flow);
    if (expected === null) expect(fio2).toBeNull();
    else expect(fio2).toBeCloseTo(expected, 12);
  });
  it('gives the rule\'s decimal to the last digit, as the exports write it (0.21 + 0.04 per L/min; 0.35 at 5 to 0.55 at 10 L/min: common practice, no source)', () => {
    // 0.21 + 0.04 × 3 is 0.32999999999999996 in doubles: a CSV cell would not read 0.33.
    expect([1, 2, 3, 4, 5, 6].map((flow) => fio2EstimateLowFlow('cannula', flow))).toEqual([0.25, 0.29, 0.33, 0.37, 0.41, 0.45]);
    expect(fio2EstimateLowFlow('cannula', 0.5)).toBe(0.23);
    expect([5, 6, 7, 8, 9, 10].map((flow) => fio2EstimateLowFlow('mask', flow))).toEqual([0.35, 0.39, 0.43, 0.47, 0.51, 0.55]);
  });
  it('returns null for an unknown device', () => {
    expect(fio2EstimateLowFlow('venturi' as unknown as LowFlowDevice, 4)).toBeNull();
  });
});

describe('null safety (fast-check)', () => {
  const d = awkwardDouble;
  const device = fc.constantFrom<LowFlowDevice>('cannula', 'mask', 'bogus' as unknown as LowFlowDevice);
  const cases = {
    arterialO2Content: totality(fc.tuple(d, d, d, d), transport.arterialO2Content),
    oxygenDelivery: totality(fc.tuple(d, d), transport.oxygenDelivery),
    fio2EstimateLowFlow: totality(fc.tuple(device, d), transport.fio2EstimateLowFlow),
    meanArterialPressure: totality(fc.tuple(d, d), transport.meanArterialPressure),
  };
  it('covers every exported function', () => {
    expect(Object.keys(cases).sort()).toEqual(exportedFunctionNames(transport));
  });
  it('no function throws or returns NaN/Infinity for arbitrary doubles', () => {
    assertTotal(cases);
  });
});
