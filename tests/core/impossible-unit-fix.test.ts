// PN301 on a number whose written unit makes it impossible, while the field's other unit makes it
// ordinary: the message says so and a fix writes that unit. The conversions are the units'
// definitions (°F = °C × 9/5 + 32; 1 kPa = 7.50062 mmHg, cross-checked with UCUM elsewhere).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { applyEdits } from '../../server/src/core/service/text-edits';

const pn301 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN301');

describe('an impossible value that is ordinary in the field\'s other unit (PN301)', () => {
  it('offers to write the other unit, and the fixed note has no PN301', () => {
    const text = '@ 08:00\nvitals temp 98.6 C';
    const [f] = pn301(text);
    expect(f?.message).toBe('Temperature 98.6 C is impossible (expected 13.0 C to 47.0 C); it is not used in calculations. In F it would be ordinary.');
    expect(f?.fixes.map((x) => x.title)).toEqual(['Write F instead of C']);
    const fixed = applyEdits(text, f!.fixes[0]!.edits);
    expect(fixed).toBe('@ 08:00\nvitals temp 98.6 F');
    // 98.6 °F = 37.0 °C.
    expect(pn301(fixed)).toEqual([]);
    expect(checkNote(fixed).analysis.timeline.timepoints[0]!.values.get('temp')?.stated.value).toBeCloseTo(37, 6);
  });

  it('works for gas pressures written in the wrong unit', () => {
    // 56 kPa = 420 mmHg, above the 53 kPa hard maximum; 56 mmHg is an ordinary PaCO2.
    expect(pn301('@ 08:00\nabg pco2 56 kPa')[0]?.fixes.map((x) => x.title)).toEqual(['Write mmHg instead of kPa']);
  });

  it('offers nothing for a value impossible in every unit, a bare number (PN204 covers it), or a pair', () => {
    expect(pn301('@ 08:00\nvitals temp 500 C')[0]?.fixes).toEqual([]);
    expect(pn301('@ 08:00\nvitals hr 400')[0]?.fixes).toEqual([]);
    expect(pn301('@ 08:00\nvitals hr 400 /min')[0]?.fixes).toEqual([]);
  });
});

describe('a unit the field never takes (PN203): the fixes offer only units the number is possible in', () => {
  const pn203 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN203');

  it('`temp 37 mmHg` is offered C, not F (37 °F is 2.8 °C, below the 13 °C hard minimum)', () => {
    const text = '@ 08:00\nvitals temp 37 mmHg';
    const [f] = pn203(text);
    // The message still names every unit the field takes.
    expect(f?.message).toBe('Temperature is not measured in `mmHg`; it takes C or F.');
    expect(f?.fixes.map((x) => x.title)).toEqual(['Change to C']);
    const fixed = applyEdits(text, f!.fixes[0]!.edits);
    expect(checkNote(fixed).findings.map((x) => x.code)).toEqual([]);
  });

  it('`temp 98.6 mmHg` is offered F; `fio2 45 mmHg` is offered %, not the fraction 45', () => {
    expect(pn203('@ 08:00\nvitals temp 98.6 mmHg')[0]?.fixes.map((x) => x.title)).toEqual(['Change to F']);
    expect(pn203('@ 08:00\noxygen fio2 45 mmHg')[0]?.fixes.map((x) => x.title)).toEqual(['Change to %']);
  });

  it('a number possible in no unit the field takes, or a pair, is offered them all', () => {
    expect(pn203('@ 08:00\nvitals temp 500 mmHg')[0]?.fixes.map((x) => x.title)).toEqual(['Change to C', 'Change to F']);
    expect(pn203('@ 08:00\nvitals bp 120/80 L')[0]?.fixes.map((x) => x.title)).toEqual(['Change to mmHg']);
  });
});

describe('a pressure the field never takes in the unit written (PN203): the fix that keeps the value converts it', () => {
  const pn203 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN203');
  // 1 kPa = 7.50062 mmHg (the unit registry's definition, checked in tests/physiology/units.test.ts).

  it('`map 12 kPa` is offered 90 mmHg first (12 mmHg would be an unusual mean pressure), then mmHg as written', () => {
    const text = '@ 08:00\nvitals map 12 kPa';
    const [f] = pn203(text);
    expect(f?.fixes.map((x) => x.title)).toEqual(['Convert to 90 mmHg', 'Change to mmHg']);
    const fixed = applyEdits(text, f!.fixes[0]!.edits);
    expect(fixed).toBe('@ 08:00\nvitals map 90 mmHg');
    expect(checkNote(fixed).findings.map((x) => x.code)).toEqual([]);
    // The mean in brackets after a blood pressure, the same.
    const bracket = '@ 08:00\nvitals bp 120/80 (12 kPa)';
    expect(applyEdits(bracket, pn203(bracket)[0]!.fixes[0]!.edits)).toBe('@ 08:00\nvitals bp 120/80 (90 mmHg)');
  });

  it('a blood pressure in kPa converts both numbers', () => {
    // 16 kPa = 120.0 mmHg, 10.7 kPa = 80.3 mmHg.
    const text = '@ 08:00\nvitals bp 16/10.7 kPa, hr 80';
    const [f] = pn203(text);
    expect(f?.fixes.map((x) => x.title)).toEqual(['Convert to 120/80 mmHg', 'Change to mmHg']);
    const fixed = applyEdits(text, f!.fixes[0]!.edits);
    expect(fixed).toBe('@ 08:00\nvitals bp 120/80 mmHg, hr 80');
    expect(checkNote(fixed).findings.map((x) => x.code)).toEqual([]);
  });

  it('comes after the unit as written where that reads as ordinary, and is not offered where the conversion is impossible', () => {
    // 93 mmHg is ordinary; 93 kPa (698 mmHg) is above the 300 mmHg hard maximum.
    expect(pn203('@ 08:00\nvitals map 93 kPa')[0]?.fixes.map((x) => x.title)).toEqual(['Change to mmHg']);
    // 9 kPa (68 mmHg) and 9 mmHg are both possible; 9 mmHg is unusual, so the conversion comes first.
    expect(pn203('@ 08:00\nvitals map 9 kPa')[0]?.fixes.map((x) => x.title)).toEqual(['Convert to 68 mmHg', 'Change to mmHg']);
    // 70 kPa (525 mmHg) is possible in no way but as written in mmHg.
    expect(pn203('@ 08:00\nvitals map 70 kPa')[0]?.fixes.map((x) => x.title)).toEqual(['Change to mmHg']);
    // A unit of another kind converts to nothing.
    expect(pn203('@ 08:00\nvitals temp 37 mmHg')[0]?.fixes.map((x) => x.title)).toEqual(['Change to C']);
    // Not only pressures: a heart rate in Hz (1.2 Hz = 72 /min, 1 Hz being 60 /min).
    expect(pn203('@ 08:00\nvitals hr 1.2 Hz')[0]?.fixes.map((x) => x.title)).toEqual(['Convert to 72 /min', 'Change to /min']);
    // 12 hPa is 9 mmHg, as unusual a mean pressure as 12 mmHg: the conversion is not put first.
    expect(pn203('@ 08:00\nvitals map 12 hPa')[0]?.fixes.map((x) => x.title)).toEqual(['Change to mmHg', 'Convert to 9 mmHg']);
  });

  it('never converts a concentration: a unit read by one substance\'s molar mass is no other substance\'s', () => {
    // mg/dL is glucose's unit (18.016 mg/dL per mmol/L), mmol/L of haemoglobin Hb's: 18 mg/dL of
    // lactate is 2.0 mmol/L (its molar mass, 90.08 g/mol: from memory), not 1.0; albumin has no unit in mmol/L here.
    expect(pn203('@ 08:00\nlabs lactate 18 mg/dL')[0]?.fixes.map((x) => x.title)).toEqual(['Change to mmol/L']);
    expect(pn203('@ 08:00\nlabs albumin 0.5 mmol/L')[0]?.fixes.map((x) => x.title)).toEqual(['Change to g/dL']);
    expect(pn203('@ 08:00\nlabs na 2500 mg/dL')[0]?.fixes.map((x) => x.title)).toEqual(['Change to mmol/L', 'Change to mEq/L']);
  });
});
