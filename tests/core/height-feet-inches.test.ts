// A height in feet and inches (`height 5 ft 10 in`), as heights are often written, is no value of
// the format (one number, one unit). It used to be read as 5 ft (152.4 cm) with `10` and `in`
// reported as stray text and an unknown key, and the 5 ft went on into the predicted body weight:
// 50.0 kg for a man of 178 cm instead of 73.4 kg, and a tidal volume of 450 mL reported as
// 9.0 mL/kg, above the lung-protective range, where it is 6.1 mL/kg. Predicted body weight, male:
// 50 + 0.91 × (height cm − 152.4) (ARDS Network, Ventilation with lower tidal volumes as compared
// with traditional tidal volumes for acute lung injury and the acute respiratory distress syndrome,
// NEJM 2000;342:1301–1308). 1 ft = 12 in, 1 in = 2.54 cm (definitions of the units).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { applyEdits } from '../../server/src/core/service/text-edits';

const heightAt = (text: string) => checkNote(text).analysis.timeline.timepoints[0]!.values.get('height');

const NOTE = 'patient sex male, height 5 ft 10 in\n@ 08:00\nvent mode VC, vt 450, rate 16, peep 5';

describe('a height in feet and inches', () => {
  it('is one finding on the inches, with the height in inches offered, and no warning from the feet alone', () => {
    const found = checkNote(NOTE).findings;
    expect(found.map((f) => f.code)).toEqual(['PN105']);
    const [f] = found;
    expect(f?.message).toBe('`5 ft 10 in` is read as 5 ft: feet and inches are not read together. Write the height in one unit, `70 in` (178 cm); until then it is not used in calculations.');
    // `10 in` on line 0, characters 30 to 35.
    expect(f?.range).toEqual({ start: { line: 0, character: 30 }, end: { line: 0, character: 35 } });
    const fixed = applyEdits(NOTE, f!.fixes[0]!.edits);
    expect(fixed.split('\n')[0]).toBe('patient sex male, height 70 in');
    // 70 in = 177.8 cm: PBW 50 + 0.91 × 25.4 = 73.1 kg; 450 mL is 6.2 mL/kg, within the range.
    expect(checkNote(fixed).findings).toEqual([]);
  });

  it('keeps the feet alone out of calculations (no predicted body weight from 5 ft)', () => {
    expect(heightAt(NOTE)?.stated.usable).toBe(false);
    expect(checkNote(NOTE).analysis.derivation(0).derived.map((d) => d.id)).not.toContain('predicted_body_weight');
  });

  it('reads inches written bare or glued, and after a comma, and leaves other numbers after feet alone', () => {
    const first = (text: string) => checkNote(text).findings.map((f) => [f.code, f.fixes[0]?.edits[0]?.newText ?? null]);
    expect(first('patient height 6 ft 0')).toEqual([['PN105', '72 in']]);
    expect(first('patient height 5ft 4in')).toEqual([['PN105', '64 in']]);
    expect(first('patient height 5 ft, 11 inches')).toEqual([['PN105', '71 in']]);
    // 14 is no number of inches after feet: the general finding, and the feet stay in use.
    expect(first('patient height 5 ft 14')).toEqual([['PN105', null]]);
    expect(heightAt('patient height 5 ft 14\n@ 08:00\nvitals hr 80')?.stated.usable).toBe(true);
    // A height in cm followed by a stray number is not feet and inches.
    expect(first('patient height 178 cm 10')).toEqual([['PN105', null]]);
  });
});
