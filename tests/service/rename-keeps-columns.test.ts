// A quick fix that puts the word meant in place of a misspelt one (a section word, PN101; a key or
// a device, PN201) changes the word and keeps what the note had laid out in columns where it was,
// as the formatter lays it out: items in column 10 after the section word (one space after a longer
// word), and a trailing comment in its column while the content ends at least two columns before
// it (else two spaces after the content). Before, the word alone was replaced: `oxygn     mask`
// became `oxygen     mask`, items in column 11, and a comment aligned with the lines around it
// moved by as many columns as the word changed length.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { applyEdits, formatNote } from '../../server/src/core/service';

/** The note after the fix titled `title` at the first finding with code `code`. */
function fixed(text: string, code: string, title: string): string {
  const finding = checkNote(text).findings.find((f) => f.code === code);
  const fix = finding?.fixes.find((x) => x.title === title);
  if (!fix) throw new Error(`no fix ${title} at ${code}: ${JSON.stringify(checkNote(text).findings.map((f) => [f.code, f.fixes.map((x) => x.title)]))}`);
  return applyEdits(text, fix.edits);
}

describe('a misspelt section word renamed', () => {
  it('keeps the items in column 10, as the formatter writes the line', () => {
    const cases: readonly (readonly [string, string, string])[] = [
      ['oxygn     mask, fio2 0.5', 'Change to `oxygen`', 'oxygen    mask, fio2 0.5'],
      ['abgg      ph 7.40', 'Change to `abg`', 'abg       ph 7.40'],
      ['vitls     hr 80', 'Change to `vitals`', 'vitals    hr 80'],
      // A word of nine letters or more is followed by one space.
      ['patientss age 60', 'Change to `patient`', 'patient   age 60'],
    ];
    for (const [line, title, want] of cases) {
      const after = fixed(`@ 08:00\n${line}`, 'PN101', title);
      expect(after.split('\n')[1], line).toBe(want);
      expect(formatNote(after), line).toBe(after);
    }
  });

  it('changes only the word on a line that was not laid out in columns', () => {
    expect(fixed('@ 08:00\noxygn mask, fio2 0.5', 'PN101', 'Change to `oxygen`')).toBe('@ 08:00\noxygen mask, fio2 0.5');
    expect(fixed('@ 08:00\nvitls\thr 80', 'PN101', 'Change to `vitals`')).toBe('@ 08:00\nvitals\thr 80');
  });
});

describe('a misspelt key or device renamed', () => {
  it('keeps a trailing comment in its column, aligned with the comments of the lines around it', () => {
    const note = '@ 08:00\nvitals    hrr 80               # first\nvitals    rr 18                # second';
    const after = fixed(note, 'PN201', 'Change to `hr`');
    expect(after).toBe('@ 08:00\nvitals    hr 80                # first\nvitals    rr 18                # second');
    const vent = '@ 08:00\nvent      mode VC, pep 5      # set\nvent      fio2 0.4            # set';
    expect(fixed(vent, 'PN201', 'Change to `peep`')).toBe('@ 08:00\nvent      mode VC, peep 5     # set\nvent      fio2 0.4            # set');
    const device = '@ 08:00\noxygen    canula 2            # c\nabg       7.40/40/90/24       # d';
    expect(fixed(device, 'PN201', 'Change to `cannula`')).toBe('@ 08:00\noxygen    cannula 2           # c\nabg       7.40/40/90/24       # d');
    for (const text of [after, fixed(vent, 'PN201', 'Change to `peep`')]) expect(formatNote(text)).toBe(text);
  });

  it('puts the comment two spaces after content that reaches it, as the formatter does', () => {
    const after = fixed('@ 08:00\noxygen    canula 2  # c', 'PN201', 'Change to `cannula`');
    expect(after).toBe('@ 08:00\noxygen    cannula 2  # c');
    expect(formatNote(after)).toBe(after);
  });

  it('leaves a comment that was not set apart from the content as it was (one blank, or a tab)', () => {
    expect(fixed('@ 08:00\nvitals    hrr 80 # c', 'PN201', 'Change to `hr`')).toBe('@ 08:00\nvitals    hr 80 # c');
    expect(fixed('@ 08:00\nvitals    hrr 80\t\t# c', 'PN201', 'Change to `hr`')).toBe('@ 08:00\nvitals    hr 80\t\t# c');
  });

  it('a misspelt word of a word key (a device after its key) keeps the comment column too', () => {
    const note = '@ 08:00\noxygen    device canula, flow 2   # c\nabg       7.40/40/90/24       # d';
    expect(fixed(note, 'PN205', 'Change to `cannula`')).toBe('@ 08:00\noxygen    device cannula, flow 2  # c\nabg       7.40/40/90/24       # d');
  });

  it('a device of two words keeps the comment column too', () => {
    const note = '@ 08:00\noxygen    rom air 2           # c';
    expect(fixed(note, 'PN201', 'Change to `room air`')).toBe('@ 08:00\noxygen    room air 2          # c');
  });
});
