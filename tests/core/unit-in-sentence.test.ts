// The sentences of PN204 and PN301 that name the unit a number would be ordinary in: inches are
// named `inches`, never "in in it would be ordinary". 1 in = 2.54 cm (the inch's definition, UCUM
// [in_i]); the adult's usual height, 120–220 cm, is common practice, no source. Invented notes only.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const messages = (text: string, code: string) => checkNote(text).findings.filter((f) => f.code === code).map((f) => f.message);

describe('a unit named in a sentence', () => {
  it('names inches in words where a bare height would be ordinary in them (PN204)', () => {
    // A bare 70 in cm is below an adult's usual 120 cm; 70 in is 177.8 cm.
    expect(messages('patient height 70', 'PN204')).toEqual(['Height 70 was read in cm, where it is implausible; in inches it would be ordinary. Add the unit (or convert); it is not used in calculations until then.']);
  });

  it('names inches in words where a height written in another unit is impossible (PN301)', () => {
    // 65 m is impossible; 65 in is 165.1 cm.
    expect(messages('patient height 65 m', 'PN301')).toEqual(['Height 65 m is impossible (expected 0.2 m to 2.75 m); it is not used in calculations. In inches it would be ordinary.']);
  });

  it('keeps the other units as they are written (lb, kPa, F)', () => {
    expect(messages('patient weight 300', 'PN204')[0]).toContain('; in lb it would be ordinary.');
    expect(messages('@ 08:00\nabg po2 9.1', 'PN204')[0]).toContain('; in kPa it would be ordinary.');
    expect(messages('@ 08:00\nvitals temp 98.6 C', 'PN301')[0]).toContain('In F it would be ordinary.');
  });
});
