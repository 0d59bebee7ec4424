// Numbers in exports (CSV, JSON Lines, FHIR, `check --format json`): no binary noise
// (179.83200000000002 for 5.9 ft), no loss of real precision, and a value converted from the unit
// it was written in converts back to what was written.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { exportColumns, timepointRows, toCsv, toFhirBundle, toJsonl } from '../../server/src/core/export';
import { exportedNumber } from '../../server/src/core/export/precision';
import { timepointsJson } from '../../server/src/cli/timepoints-json';
import { checked } from './helpers';

const plain = { redactProse: false, shiftDays: 0 } as const;

/** The note of the report: a height in feet, a temperature in °F, gases in kPa. */
const NOTE = [
  'patient age 50, sex male, height 5.9 ft',
  'units gas kPa',
  '@ day 1 08:00',
  'vent mode VC, vt 450, rate 18, peep 8, fio2 0.4, plateau 24, peak 30',
  'vitals hr 80, rr 18, spo2 93 %, temp 99.1 F',
  'abg ph 7.35, pco2 6.1, po2 10.3, hco3 24',
  '',
].join('\n');

/** Significant digits of a number as JavaScript writes it shortest (`179.832` → 6). */
function significantDigits(n: number): number {
  const [mantissa] = Math.abs(n).toExponential().split('e');
  return mantissa!.replace('.', '').replace(/0+$/, '').length;
}

/** Every number in a JSON value, at any depth. */
function numbersIn(value: unknown, out: number[] = []): number[] {
  if (typeof value === 'number') out.push(value);
  else if (Array.isArray(value)) for (const v of value) numbersIn(v, out);
  else if (value !== null && typeof value === 'object') for (const v of Object.values(value)) numbersIn(v, out);
  return out;
}

describe('exported numbers carry no floating-point noise', () => {
  const result = checked(NOTE);

  it('CSV: height 5.9 ft is 179.832 cm, its predicted body weight 74.96312 kg', () => {
    // 5.9 × 30.48 = 179.832 exactly (1 ft = 30.48 cm, an exact definition); ARDS Network (NEJM 2000;342:1301–1308):
    // 50 + 0.91 × (179.832 − 152.4) = 74.96312.
    const csv = toCsv(exportColumns(), timepointRows('n.pneu', result, plain));
    const [header, record] = csv.trimEnd().split('\n');
    const names = header!.split(',');
    const cells = record!.split(',');
    expect(cells[names.indexOf('height_cm')]).toBe('179.832');
    expect(cells[names.indexOf('predicted_body_weight_kg')]).toBe('74.96312');
    for (const cell of cells) if (/^-?[0-9.]+(e[-+]?\d+)?$/.test(cell)) expect(significantDigits(Number(cell)), cell).toBeLessThanOrEqual(12);
  });

  it('JSON Lines, FHIR and check --format json give the same numbers', () => {
    const jsonl = JSON.parse(toJsonl('n.pneu', result, plain)) as Record<string, unknown>;
    expect(jsonl.height_cm).toBe(179.832);
    expect(jsonl.predicted_body_weight_kg).toBe(74.96312);
    const fhir = toFhirBundle('n.pneu', result, { redactProse: false, shiftDays: 0 });
    const json = timepointsJson(result);
    for (const [name, numbers] of [['jsonl', numbersIn(jsonl)], ['fhir', numbersIn(fhir)], ['json', numbersIn(json)]] as const) {
      for (const n of numbers) expect(significantDigits(n), `${name}: ${n}`).toBeLessThanOrEqual(12);
    }
    expect(numbersIn(fhir)).toContain(179.832);
    expect(numbersIn(json)).toContain(179.832);
    expect(numbersIn(json)).toContain(74.96312);
  });
});

describe('the rule: 12 significant digits, at most 12 decimals', () => {
  it('keeps whole numbers and short decimals as they are, and folds −0 to 0', () => {
    expect(exportedNumber(760)).toBe(760);
    expect(exportedNumber(0.21)).toBe(0.21);
    expect(exportedNumber(179.83200000000002)).toBe(179.832);
    expect(exportedNumber(200.00000000000003)).toBe(200);
    expect(Object.is(exportedNumber(-0), 0)).toBe(true);
    expect(Object.is(exportedNumber(-1e-14), 0)).toBe(true);
    expect(exportedNumber(45.75375612658503)).toBe(45.7537561266);
    expect(exportedNumber(-0.9784294727174512)).toBe(-0.978429472717);
    expect(exportedNumber(123456789.123456)).toBe(123456789.123);
  });

  it('a value written in kPa, ft, in, °F or lb converts back to what was written (property)', () => {
    // The factors, from the units' definitions (Thompson & Taylor, NIST Special Publication 811,
    // 2008, appendix B, from memory): 1 mmHg = 133.322387415 Pa, 1 ft = 30.48 cm, 1 in = 2.54 cm,
    // °C = (°F − 32) × 5/9, 1 lb = 0.45359237 kg.
    const units: readonly { readonly unit: string; readonly key: string; readonly column: string; readonly back: (v: number) => number; readonly lo: number; readonly hi: number }[] = [
      { unit: 'kPa', key: 'abg po2', column: 'pao2_mmHg', back: (v) => (v * 133.322387415) / 1000, lo: 4, hi: 60 },
      { unit: 'ft', key: 'patient height', column: 'height_cm', back: (v) => v / 30.48, lo: 4, hi: 7 },
      { unit: 'in', key: 'patient height', column: 'height_cm', back: (v) => v / 2.54, lo: 50, hi: 84 },
      { unit: 'F', key: 'vitals temp', column: 'temp_C', back: (v) => (v * 9) / 5 + 32, lo: 90, hi: 106 },
      { unit: 'lb', key: 'patient weight', column: 'weight_kg', back: (v) => v / 0.45359237, lo: 90, hi: 300 },
    ];
    fc.assert(fc.property(fc.constantFrom(...units), fc.integer({ min: 0, max: 3 }), fc.double({ min: 0, max: 1, noNaN: true }), (u, decimals, t) => {
      const written = (u.lo + t * (u.hi - u.lo)).toFixed(decimals);
      const [section, key] = u.key.split(' ');
      const note = section === 'patient' ? `patient ${key} ${written} ${u.unit}\n@ day 1 08:00\nvitals hr 80\n` : `@ day 1 08:00\n${section} ${key} ${written} ${u.unit}\n`;
      const row = timepointRows('n.pneu', checked(note), plain)[0]!;
      const cell = row[u.column];
      expect(typeof cell, `${note} → ${u.column}`).toBe('number');
      const value = cell as number;
      expect(significantDigits(value)).toBeLessThanOrEqual(12);
      // Back in the unit it was written in: the written number, to the decimals it was written
      // with and even to 11 significant digits (12 would ask for more than the 12 kept: the last
      // one is rounded).
      expect(u.back(value).toFixed(decimals)).toBe(written);
      expect(Number(u.back(value).toPrecision(11))).toBe(Number(written));
    }), { numRuns: 300 });
  });
});
