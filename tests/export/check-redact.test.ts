// The rules `check --redact` applies to a message (core/export/redact.ts): what a message quotes of
// the note is replaced unless it is the format's own vocabulary or a number as values are written;
// labels and unknown modes are replaced wherever they stand whole.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { NoteWorker } from '../../server/src/cli/work';
import { checkNote } from '../../server/src/core/check-note';
import { noteOwnWords, redactedFinding, redactedText } from '../../server/src/core/export/redact';

const NONE = { phrases: [], quotesUnsure: false };

describe('redactedText', () => {
  it('keeps quoted words of the format and numbers as values are written', () => {
    for (const kept of ['`hr` has no value.', '`bp 120/80`', '`7,35` uses', '`25:10` is not', '`@ day 1 07:40`', '`+2h30`', '`(93 mmHg)`', '`fio2 60 %`', '`room air`', '`VC`', '`7.31/52/64/26`', '`key value`']) {
      expect(redactedText(kept, NONE), kept).toBe(kept);
    }
  });

  it('replaces a quoted part whole when a word of it is the writer\'s own, or a number could be an identifier', () => {
    expect(redactedText('`vitls` is not a section. Did you mean `vitals`?', NONE)).toBe('[redacted] is not a section. Did you mean `vitals`?');
    expect(redactedText('`room aor` is neither', NONE)).toBe('[redacted] is neither');
    // More than four digits in a row, the shape of a calendar date, a phone number.
    for (const quoted of ['`1234567`', '`12/03/1961`', '`4.3.26`', '`07700 900123`', '`(555) 010-1234`', '`hr 80 Quillane`']) {
      expect(redactedText(`${quoted} has no key`, NONE), quoted).toBe('[redacted] has no key');
    }
  });

  it('replaces every quoted part when told to (privacy findings), and the note\'s labels and modes wherever they stand whole', () => {
    expect(redactedText('`1234` looks like a record number (after `mrn`)', NONE, true)).toBe('[redacted] looks like a record number (after [redacted])');
    const own = { phrases: ['Bay 4 Quillane', 'Quillane'], quotesUnsure: false };
    expect(redactedText('FiO2 0.21 (carried from Bay 4 Quillane, line 3); Quillanes stay; Quillane goes', own)).toBe('FiO2 0.21 (carried from [redacted], line 3); Quillanes stay; [redacted] goes');
    // A label with a backtick in it is replaced before quoted parts are looked for.
    expect(redactedText('FiO2 carried from Bed `4, line 3', { phrases: ['Bed `4'], quotesUnsure: true })).toBe('FiO2 carried from [redacted], line 3');
  });

  it('a note that holds a backtick: a message with one is its check\'s title, another text with one [redacted]', () => {
    const result = checkNote('@ day 1 08:00\nvitals Zor`vath 12, hr 80\nabg ph 7,35\n');
    const own = noteOwnWords(result);
    expect(own.quotesUnsure).toBe(true);
    const messages = result.findings.map((f) => redactedFinding(f, own).message);
    expect(messages.join('\n').toLowerCase()).not.toMatch(/zor|vath/);
    expect(messages).toContain('Unknown key');
    expect(redactedText('a `hr` reading', own)).toBe('[redacted]');
    expect(redactedText('no quotes here', own)).toBe('no quotes here');
  });
});

describe('noteOwnWords and redactedFinding', () => {
  it('finds the labels written and the modes Pneumark does not know, and leaves known modes alone', () => {
    const result = checkNote('@ day 1 08:00  Quillane round\nvent mode Zorvathvent, peep 5\n@ day 1 09:00\nvent mode vc, peep 5\n');
    expect([...noteOwnWords(result).phrases].sort()).toEqual(['Quillane round', 'Zorvathvent']);
  });

  it('redacts the message and the related places\' messages, and leaves out the fixes', () => {
    const result = checkNote('@ day 1 08:00\nvitls hr 80\n');
    const finding = result.findings.find((f) => f.code === 'PN101')!;
    expect(finding.fixes.length).toBeGreaterThan(0);
    const redacted = redactedFinding(finding, noteOwnWords(result));
    expect(redacted.message).toBe(finding.message.replace('`vitls`', '[redacted]'));
    expect(redacted.fixes).toEqual([]);
    expect(redacted.range).toEqual(finding.range);
  });
});

/** An invented name-like word: a capital and three to five syllables of letters g–z (none of Pneumark's words holds such a run). */
const nameLike = fc.array(fc.tuple(fc.constantFrom('z', 'q', 'x', 'v', 'w', 'j', 'k'), fc.constantFrom('o', 'u', 'y', 'i')), { minLength: 3, maxLength: 5 })
  .map((syllables) => syllables.map(([c, v]) => c + v).join(''))
  .map((w) => w[0]!.toUpperCase() + w.slice(1));

/** A note with one of the words in each place that holds the writer's own words (invented throughout). */
function noteWith(w: readonly string[]): string {
  return [
    `# ${w[0]}`,
    `patient   age 64 y, sex ${w[1]}, height 170 cm, ${w[2]} 4`,
    `@ day 1 08:00  ${w[3]} saw ${w[4]}`,
    'oxygen    room air',
    `vitals    hr 90 ${w[5]}, rr 18, spo2 94 %, ${w[6]}`,
    `note      seen by Dr ${w[7]} at ${w[8]}`,
    `${w[9]}  12`,
    `@ day 1 12:00 ${w[10]}`,
    'abg       7.40/40/160/24',
    `vent      mode ${w[11]}, peep 5, vt 450`,
    `oxygen    ${w[12]} 4`,
    `labs      na 140 mmol/L, k 4.1 ${w[13]}`,
  ].join('\n') + '\n';
}

describe('check --redact: no word of the writer\'s in what a note\'s report carries', () => {
  it('findings and timepoints (as `check --format json` writes them), whatever the words and wherever they are', () => {
    const worker = new NoteWorker(process.cwd(), {}, null, null);
    fc.assert(fc.property(fc.array(nameLike, { minLength: 14, maxLength: 14 }), (words) => {
      const text = noteWith(words);
      const task = { kind: 'check' as const, timepoints: true, redact: true };
      const report = worker.analyse('a.pneu', { path: 'a.pneu', bytes: Buffer.from(text), problem: null }, task, 1);
      const out = JSON.stringify({ path: report.path, findings: report.findings, timepoints: report.timepointTexts }).toLowerCase();
      expect(report.path).toBe('note-00001');
      for (const w of words) expect(out, w).not.toContain(w.toLowerCase());
      // The same findings as without --redact.
      const plain = worker.analyse('a.pneu', { path: 'a.pneu', bytes: Buffer.from(text), problem: null }, { ...task, redact: false }, 1);
      expect(report.findings.map((f) => [f.code, f.range])).toEqual(plain.findings.map((f) => [f.code, f.range]));
      expect(words.some((w) => JSON.stringify(plain).includes(w))).toBe(true);
    }), { numRuns: 30 });
  });
});
