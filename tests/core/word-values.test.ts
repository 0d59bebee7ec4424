// PN205: word values. A field with a fixed list refuses other words; the ventilator mode takes any
// word (modes differ between ventilators) but never a number. Format rule (grammar/README.md).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';

const pn205 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN205').map((f) => f.message);

describe('word values (PN205)', () => {
  it('a mode takes any word, but not a number', () => {
    expect(pn205('@ 08:00\nvent mode VC, peep 5')).toEqual([]);
    expect(pn205('@ 08:00\nvent mode Bilevel, peep 5')).toEqual([]);
    expect(pn205('@ 08:00\nvent mode 10, peep 5')).toEqual(['`10` is a number, not a ventilator mode: write a word, e.g. VC, PC, PRVC, PS, SIMV, SIMV-VC, SIMV-PC, APRV, CPAP, HFOV.']);
    expect(pn205('@ 08:00\nvent mode 7.5')).toHaveLength(1);
  });

  it('a mode given as a number is not used (no mode in force)', () => {
    const result = checkNote('@ 08:00\nvent mode 10, peep 5');
    const mode = result.analysis.timeline.timepoints[0]!.values.get('mode');
    expect(mode?.stated.usable).toBe(false);
  });

  it('a field with a fixed list names its words', () => {
    expect(pn205('patient sex x\n@ 08:00')).toEqual(['`x` is not a known value for sex; expected one of: female, male.']);
  });
});

describe('the words offered for a misspelt one (PN205)', () => {
  // `mael` is one letter from both `male` and `m`, two spellings of one word: it was offered
  // `male` twice, as two quick fixes of the same title and edit.
  it('offers each word once, however many of its spellings are near', () => {
    const titles = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN205').flatMap((f) => f.fixes.map((x) => x.title));
    expect(titles('patient sex mael')).toEqual(['Change to `male`']);
    expect(titles('patient sex femal')).toEqual(['Change to `female`']);
  });
});
