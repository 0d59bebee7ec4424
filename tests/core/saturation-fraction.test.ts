// A saturation written as a fraction (`spo2 0.94`). Saturations are given in percent (pulse
// oximeters display SpO2 in %: ISO 80601-2-61:2017, from memory); 0.94 % is far below any
// saturation measured in a living patient (common practice, no source), so the value is reported
// with the percentage offered, and kept out of calculations until it is rewritten.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { applyEdits } from '../../server/src/core/service';

const note = '@ 08:00\noxygen venturi, fio2 0.28\nvitals spo2 0.94\nabg sao2 .9, po2 60, pco2 40';

describe('a saturation written as a fraction', () => {
  it('is reported (PN302) with the percentage offered, preferred', () => {
    const found = checkNote(note).findings.filter((f) => f.code === 'PN302');
    expect(found.map((f) => [f.range.start.line, f.message])).toEqual([
      [2, 'SpO2 0.94 reads as 0.94 %, far below any measured saturation: a fraction for 94 %? It is not used in calculations until it is written as a percentage.'],
      [3, 'SaO2 .9 reads as .9 %, far below any measured saturation: a fraction for 90 %? It is not used in calculations until it is written as a percentage.'],
    ]);
    const fixed = applyEdits(note, found.flatMap((f) => f.fixes[0]!.edits));
    expect(fixed).toBe('@ 08:00\noxygen venturi, fio2 0.28\nvitals spo2 94\nabg sao2 90, po2 60, pco2 40');
    expect(checkNote(fixed).findings.filter((f) => f.code === 'PN302')).toEqual([]);
  });

  it('is not used: no S/F from 0.94 %, and an S/F once it is a percentage', () => {
    const derived = (text: string) => {
      const r = checkNote(text);
      return r.analysis.derivation(0).derived.map((d) => d.id);
    };
    expect(derived(note)).not.toContain('sf_ratio');
    expect(derived(note.replace('0.94', '94'))).toContain('sf_ratio');
  });

  it('keeps the decimals a percentage needs (0.935 is 93.5 %), and leaves a whole 1 or a unit as written', () => {
    const msg = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN302').map((f) => f.message);
    expect(msg('@ 08:00\nvitals spo2 0.935')[0]).toContain('a fraction for 93.5 %?');
    expect(msg('@ 08:00\nvitals spo2 1')).toEqual(['SpO2 1 % is unusual (usually at least 70 %): check the unit and the transcription.']);
    expect(msg('@ 08:00\nvitals spo2 0.94 %')[0]).toMatch(/is unusual/);
  });
});
