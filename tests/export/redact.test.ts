// `--redact` keeps only Pneumark's own words: a word the note's writer chose (a ventilator mode
// Pneumark does not know, a device, a label, a key or a section it does not know, a comment, a
// prose note, the file's name) may be a person's or a place's name, so none reaches CSV, JSON
// Lines or FHIR. Notes are generated with invented name-like words in every free position.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { exportRenderer } from '../../server/src/cli/export-command';
import { checkNote } from '../../server/src/core/check-note';
import { REDACTED_WORD } from '../../server/src/core/export/columns';

/**
 * An invented name-like word: a capital and three to five syllables of letters that no hex id
 * holds (g–z), so it cannot turn up by chance in an id or in one of Pneumark's own words.
 */
const nameLike = fc.array(fc.tuple(fc.constantFrom('z', 'q', 'x', 'v', 'w', 'j', 'k'), fc.constantFrom('o', 'u', 'y', 'i')), { minLength: 3, maxLength: 5 })
  .map((syllables) => syllables.map(([c, v]) => c + v).join(''))
  .map((w) => w[0]!.toUpperCase() + w.slice(1));

/** The free positions of a note, each holding one of the words. */
function noteWith(w: readonly string[]): string {
  return [
    `# ${w[0]} ${w[1]}`,
    `patient   age 64 y, sex ${w[2]}, height 170 cm, ${w[3]} 4`,
    `units     gas ${w[4]}`,
    '',
    `@ day 1 08:00  ${w[5]} saw ${w[6]}`,
    `oxygen    ${w[7]} 4 L/min   # ${w[8]}`,
    `vent      mode ${w[9]}, vt 420, peep 8, fio2 0.5, ${w[10]} 12`,
    `vitals    hr 90 ${w[11]}, rr 18, spo2 94 %`,
    'abg       7.36/44/78/24',
    `note      seen by ${w[12]} at ${w[13]}`,
    `${w[14]}  12`,
    '',
    `@ day 1 12:00 ${w[15]}`,
    'oxygen    room air',
    `vent      mode ${w[16]}`,
    `vitals    hr 80, rr 16, ${w[17]}`,
    `labs      na 140 mmol/L, ${w[18]} 3, k 4.1 ${w[19]}`,
    `vbg       ${w[20]} 7.35/48`,
    `place     altitude 1200 m ${w[21]}`,
  ].join('\n') + '\n';
}

const WORDS = 22;
/** One fixed set of words, the mode of the first timepoint as first reported (`mode Smithvent`). */
const FIXED_WORDS = ['Zoqujy', 'Quxovi', 'Xovuzo', 'Wojoky', 'Kozuqi', 'Juqoxy', 'Vowizu', 'Zizuvo', 'Quvuji', 'Smithvent', 'Kizoqu', 'Xuzivy', 'Vuqoji', 'Jixuzo', 'Wiwuky', 'Zuxovi', 'Qojyzu', 'Kyzoxu', 'Zyvoqi', 'Xiwoju', 'Qizyvo', 'Wuxoky'];
const FORMATS = ['csv', 'jsonl', 'fhir'] as const;
/** What the export writes for one note, as the command makes it (a string; '' when nothing). */
function exported(path: string, result: ReturnType<typeof checkNote>, t: ReturnType<typeof task>): string {
  const out = exportRenderer(path, result, t);
  return typeof out === 'string' ? out : '';
}
const task = (format: (typeof FORMATS)[number]) => ({ kind: 'export' as const, format, redactProse: true, shiftDays: 0, anchor: null, spreadsheetSafe: false });

describe('--redact keeps no word the note\'s writer chose', () => {
  it('in CSV, JSON Lines and FHIR, whatever the words and wherever they are', () => {
    fc.assert(fc.property(fc.array(nameLike, { minLength: WORDS, maxLength: WORDS }), (words) => {
      const result = checkNote(noteWith(words));
      for (const format of FORMATS) {
        const out = exported('note-00001', result, task(format));
        for (const w of words) expect(out.toLowerCase(), `${format}: ${w}`).not.toContain(w.toLowerCase());
      }
    }), { numRuns: 40, examples: [[FIXED_WORDS]] });
  });

  it('a mode Pneumark does not know is the placeholder; the ones it knows are kept', () => {
    const result = checkNote('@ day 1 08:00\nvent mode Smithvent, vt 420\n@ day 1 09:00\nvent mode simv\n');
    const rows = exported('note-00001', result, task('jsonl')).trim().split('\n').map((l) => JSON.parse(l) as { mode: string | null });
    expect(rows.map((r) => r.mode)).toEqual([REDACTED_WORD, 'SIMV']);
    const open = exported('a.pneu', result, { ...task('jsonl'), redactProse: false }).trim().split('\n').map((l) => JSON.parse(l) as { mode: string | null });
    expect(open.map((r) => r.mode)).toEqual(['Smithvent', 'SIMV']);
  });

  it('the built command names no part of the file name or the note\'s words (needs npm run build)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-redact-'));
    const words = FIXED_WORDS;
    writeFileSync(join(dir, 'Zarquovy-Jixwell.pneu'), noteWith(words));
    for (const format of FORMATS) {
      const r = spawnSync(process.execPath, [join(process.cwd(), 'dist/cli.js'), 'export', '--format', format, '--redact', '.'], { cwd: dir, encoding: 'utf8' });
      expect(r.stdout.length, r.stderr).toBeGreaterThan(0);
      for (const w of [...words, 'Zarquovy', 'Jixwell']) expect(r.stdout.toLowerCase(), `${format}: ${w}`).not.toContain(w.toLowerCase());
    }
  });
});
