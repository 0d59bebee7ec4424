// Lines added or removed in the middle of a note (Enter, a line deleted, an item line typed in):
// the timepoints after the change are relocated (copies with their line numbers moved, findings
// moved with them), not read and checked again, and the result is what a fresh analysis gives.
// The random part adds and removes lines of every kind that moves something: blank lines, item
// lines, settings carried to later timepoints (whose readings then name a moved line), the same
// field twice (a read issue pointing at another line), `@` alone (labelled with its line number),
// header lines, and whole timepoints. `RELOCATE_RUNS` stresses it locally.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { moveLineNames } from '../../server/src/core/analysis/model';
import { NoteSession } from '../../server/src/core/session';
import { generateNote } from '../bench/generate.mjs';
import { sameAsJson, snapshot } from './session-snapshot';
import { rng } from '../helpers/seeded';

function expectFresh(session: NoteSession, text: string): void {
  const a = snapshot(session.update(text));
  const b = snapshot(checkNote(text));
  if (!sameAsJson(a, b)) expect(a).toEqual(b);
}

/** The index of the first line from `from` on that starts with `prefix`. */
function lineFrom(lines: readonly string[], from: number, prefix: string): number {
  const i = lines.findIndex((l, j) => j >= from && l.startsWith(prefix));
  if (i < 0) throw new Error(`no ${prefix} line after ${from}`);
  return i;
}

describe('moveLineNames', () => {
  // Old lines 0–9 keep their numbers, 10–11 were changed, 12 on move by 3 (shown 1-based).
  const shift = { head: 10, end: 12, delta: 3 };
  it('moves the lines a message names, keeps those before the change, and gives up on a changed one', () => {
    expect(moveLineNames(shift, 'FiO2 and PEEP carried from line 13; PEEP carried from line 4')).toBe('FiO2 and PEEP carried from line 16; PEEP carried from line 4');
    expect(moveLineNames(shift, 'see Line 20, lines 30 and baseline 40')).toBe('see Line 23, lines 33 and baseline 40');
    expect(moveLineNames(shift, 'no number here: the line reads as blank')).toBe('no number here: the line reads as blank');
    expect(moveLineNames(shift, 'carried from line 11')).toBeNull();
    // Quoted note text is not a line number the message wrote.
    expect(moveLineNames(shift, '`see line 40` looks like a name')).toBeNull();
    expect(moveLineNames(shift, '`line 4` and line 40')).toBe('`line 4` and line 43');
  });
});

describe('NoteSession when lines are added or removed', () => {
  const note = generateNote(120, 3);
  const lines = note.split('\n');
  const middle = lineFrom(lines, lines.length >> 1, 'vitals');
  const session = (): NoteSession => {
    const s = new NoteSession();
    s.update(note);
    return s;
  };

  it('relocates the later timepoints when a blank line is inserted mid-note', () => {
    const s = session();
    const edited = [...lines.slice(0, middle + 1), '', ...lines.slice(middle + 1)].join('\n');
    s.update(edited);
    const { timepoints, reusedTimepoints, relocatedTimepoints, parsedLines } = s.stats;
    expect(parsedLines).toBeLessThanOrEqual(3); // the new line and the lines either side of its terminators
    // The timepoints before the change are kept, the one changed is read again, every later one relocated.
    expect(reusedTimepoints).toBeGreaterThan(50);
    expect(relocatedTimepoints).toBe(timepoints - reusedTimepoints - 1);
    expect(relocatedTimepoints).toBeGreaterThan(50);
    expectFresh(s, edited);
  });

  it('relocates the later timepoints when a line is deleted mid-note', () => {
    const s = session();
    const edited = [...lines.slice(0, middle), ...lines.slice(middle + 1)].join('\n');
    s.update(edited);
    const { timepoints, reusedTimepoints, relocatedTimepoints } = s.stats;
    expect(reusedTimepoints).toBeGreaterThan(50);
    expect(relocatedTimepoints).toBe(timepoints - reusedTimepoints - 1);
    expectFresh(s, edited);
  });

  it('relocates the later timepoints when an item line is typed into a timepoint, and again as it is deleted', () => {
    const s = session();
    const typed = 'labs      na 139, k 4.1, cl 101';
    const edited = [...lines.slice(0, middle + 1), typed, ...lines.slice(middle + 1)].join('\n');
    s.update(edited);
    expect(s.stats.relocatedTimepoints).toBe(s.stats.timepoints - s.stats.reusedTimepoints - 1);
    expect(s.stats.relocatedTimepoints).toBeGreaterThan(50);
    expectFresh(s, edited);
    s.update(note);
    expect(s.stats.relocatedTimepoints).toBe(s.stats.timepoints - s.stats.reusedTimepoints - 1);
    expectFresh(s, note);
  });

  it('moves the line a later reading names when the setting it carries moved (`FiO2 carried from line N`)', () => {
    // The ventilator line of a timepoint before the change and of one after it: readings at later
    // timepoints name the line their FiO2 was carried from.
    const s = session();
    const edited = [...lines.slice(0, middle + 1), '', '', ...lines.slice(middle + 1)].join('\n');
    const fresh = checkNote(edited).findings.filter((f) => /carried from line/.test(f.message));
    expect(fresh.length).toBeGreaterThan(0);
    s.update(edited);
    expect(s.stats.relocatedTimepoints).toBeGreaterThan(50);
    expectFresh(s, edited);
  });

  it('reads again a timepoint labelled with its line number (`@` alone), and what carries from it', () => {
    const at = lineFrom(lines, middle, '@');
    const base = [...lines.slice(0, at), '@', 'vent      mode VC, vt 420 mL, rate 16, peep 8, fio2 0.5', ...lines.slice(at)];
    const s = new NoteSession();
    s.update(base.join('\n'));
    const edited = [...base.slice(0, middle), '', ...base.slice(middle)].join('\n');
    s.update(edited);
    expect(s.stats.relocatedTimepoints).toBeGreaterThan(0);
    expectFresh(s, edited);
  });
});

const NEW_LINES = [
  '',
  '',
  'vitals    hr 80, rr 18',
  'vitals    hr 81',
  'labs      na 139, k 4.1',
  'vent      peep 10, fio2 0.45',
  'vent      mode PC, pinsp 18, peep 6',
  'oxygen    cannula 3 L/min',
  'oxygen    room air',
  'abg       7.31/52/61/25',
  'abg       7.31/7.1/8.2/25',
  'units     gas kPa',
  'units     gas mmHg',
  'place     barometric 620 mmHg',
  'patient   height 170 cm',
  '@',
  '@ +30m',
  '@ day 9 10:00 extra',
  'note      seen by [name]',
  'bogus     line',
  'vitals    hr 80, hr 82',
  '# a comment',
];

describe('NoteSession under random line insertions and deletions', () => {
  const RUNS = Number(process.env.RELOCATE_RUNS ?? 6);
  const EDITS = 30;
  it(`gives what a fresh analysis gives after every edit (${RUNS} seeded sequences of ${EDITS} edits)`, { timeout: Math.max(120_000, RUNS * EDITS * 2000) }, () => {
    let relocated = 0;
    for (let r = 0; r < RUNS; r++) {
      const next = rng(1000 + r);
      const pick = <T>(list: readonly T[]): T => list[Math.floor(next() * list.length)]!;
      let lines = generateNote(25, 1 + r).split('\n');
      const session = new NoteSession();
      session.update(lines.join('\n'));
      for (let e = 0; e < EDITS; e++) {
        const at = Math.floor(next() * (lines.length + 1));
        const roll = next();
        if (roll < 0.45) {
          const count = 1 + Math.floor(next() * 3);
          const added = Array.from({ length: count }, () => pick(NEW_LINES));
          lines = [...lines.slice(0, at), ...added, ...lines.slice(at)];
        } else if (roll < 0.9) {
          lines = [...lines.slice(0, at), ...lines.slice(at + 1 + Math.floor(next() * 2))];
        } else {
          // A line moved: removed here, put back further on.
          const [moved] = lines.splice(at, 1);
          if (moved !== undefined) lines.splice(Math.floor(next() * (lines.length + 1)), 0, moved);
        }
        const text = lines.join('\n');
        const a = snapshot(session.update(text));
        relocated += session.stats.relocatedTimepoints;
        const b = snapshot(checkNote(text));
        if (!sameAsJson(a, b)) expect({ seed: 1000 + r, edit: e, got: a }).toEqual({ seed: 1000 + r, edit: e, got: b });
      }
    }
    // The sequences did exercise relocation.
    expect(relocated).toBeGreaterThan(RUNS * EDITS);
  });
});
