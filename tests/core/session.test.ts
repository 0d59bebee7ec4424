// The incremental session gives exactly what a fresh analysis gives, whatever the edits, and
// recomputes only the timepoints an edit touches (and those that depend on what they carry).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { allDerivations } from '../../server/src/core/analysis/analyse';
import { checkNote, type NoteResult } from '../../server/src/core/check-note';
import { nextCut, NoteSession } from '../../server/src/core/session';
import { generateNote } from '../bench/generate.mjs';
import { readFileSync } from 'node:fs';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

function snapshot(r: NoteResult): unknown {
  return {
    findings: r.findings,
    timepoints: r.analysis.timeline.timepoints.map((tp) => ({ ...tp, values: [...tp.values.entries()].map(([k, v]) => [k, v.stated.value, v.stated.word, v.origin]) , stated: tp.stated.map((s) => [s.fieldId, s.value, s.line]) })),
    // Texts built on first read (a getter, which toEqual does not compare) are named explicitly.
    derivations: allDerivations(r.analysis).map((d) => ({
      timepoint: d.timepoint,
      derived: d.derived.map((v) => ({ ...v, substituted: v.substituted })),
      missing: d.missing.map((m) => ({ ...m, message: m.message })),
      notApplicable: d.notApplicable,
      interpretations: d.interpretations.map((i) => ({ ...i, text: i.text })),
    })),
  };
}

const base = readFileSync('samples/icu-ventilated-lung-injury.pneu', 'utf8');
const baseLines = base.split('\n');

describe('NoteSession', () => {
  it('matches a fresh analysis after every edit of a random edit sequence (300 sequences)', { timeout: 180_000 }, () => {
    const edit = fc.record({
      line: fc.nat({ max: baseLines.length + 2 }),
      kind: fc.constantFrom('replace', 'insert', 'delete', 'type'),
      text: fc.constantFrom('vitals hr 90', 'abg 7.30/50/70/24', 'vent peep 14', 'oxygen room air', '@ 23:00 later', 'place altitude 2000 m', 'units gas kPa', '', '# comment', 'patient age 80 y', 'x'),
    });
    fc.assert(
      fc.property(fc.array(edit, { minLength: 1, maxLength: 8 }), (edits) => {
        const session = new NoteSession();
        const lines = [...baseLines];
        session.update(lines.join('\n'));
        for (const e of edits) {
          const at = Math.min(e.line, lines.length);
          if (e.kind === 'replace' && at < lines.length) lines[at] = e.text;
          else if (e.kind === 'insert') lines.splice(at, 0, e.text);
          else if (e.kind === 'delete' && lines.length > 1 && at < lines.length) lines.splice(at, 1);
          else if (e.kind === 'type' && at < lines.length) lines[at] = `${lines[at]}${e.text.slice(0, 3)}`;
          const text = lines.join('\n');
          expect(snapshot(session.update(text))).toEqual(snapshot(checkNote(text)));
        }
      }),
      { numRuns: 300 },
    );
  });

  it('matches a fresh parse after character edits anywhere, line terminators included (400 sequences)', { timeout: 180_000 }, () => {
    // Edits that split, join and re-terminate lines: a lone \r becoming \r\n, a \r\n losing its \n, …
    const pieces = fc.constantFrom('\n', '\r', '\r\n', ' ', 'hr 9', '@ 08:00', 'vitals ', 'abg 7.3/50/70', '#', '');
    const edit = fc.record({ at: fc.nat(), remove: fc.nat({ max: 12 }), insert: fc.array(pieces, { maxLength: 3 }).map((p) => p.join('')) });
    const start = ['patient age 70 y', '@ day 1 08:00', 'vitals hr 90\r\nabg 7.30/50/70/24', '', '@ +1h\rvent peep 8 fio2 0.4', 'note calm'].join('\n');
    fc.assert(
      fc.property(fc.array(edit, { minLength: 1, maxLength: 10 }), (edits) => {
        const session = new NoteSession();
        let text = start;
        session.update(text);
        for (const e of edits) {
          const at = e.at % (text.length + 1);
          text = text.slice(0, at) + e.insert + text.slice(Math.min(text.length, at + e.remove));
          const got = session.update(text);
          const fresh = checkNote(text);
          expect(got.analysis.tree).toEqual(fresh.analysis.tree);
          expect(snapshot(got)).toEqual(snapshot(fresh));
        }
      }),
      { numRuns: 400 },
    );
  });

  it('parses only the lines an edit touches', () => {
    const session = new NoteSession();
    const lines = [...baseLines];
    session.update(lines.join('\n'));
    const k = lines.findIndex((l) => l.startsWith('vitals'));
    lines[k] = `${lines[k]} temp 37.2`;
    session.update(lines.join('\n'));
    expect(session.stats.parsedLines).toBe(1);
    lines.splice(k, 0, 'note inserted line');
    session.update(lines.join('\n'));
    // The new line, and the lines at the edges of the changed stretch of text (their terminators touch it).
    expect(session.stats.parsedLines).toBeLessThanOrEqual(3);
    expect(session.stats.parsedLines).toBeGreaterThanOrEqual(1);
  });

  it('reuses every other timepoint when a measurement changes', () => {
    const session = new NoteSession();
    session.update(base);
    const edited = base.replace('abg       7.33/45/82/23.1', 'abg       7.34/45/82/23.6');
    session.update(edited);
    // The edited timepoint is read again; the three others are kept (the header is no timepoint).
    expect(session.stats).toEqual({ parsedLines: 1, reusedTimepoints: 3, relocatedTimepoints: 0, timepoints: 4 });
  });

  it('counts as reused only timepoints, not the lines before the first `@`', () => {
    const session = new NoteSession();
    session.update('patient age 60 y\n@ 08:00\nvitals hr 80\n@ 09:00\nvitals hr 81');
    session.update('patient age 60 y\n@ 08:00\nvitals hr 80\n@ 09:00\nvitals hr 82');
    expect(session.stats).toEqual({ parsedLines: 1, reusedTimepoints: 1, relocatedTimepoints: 0, timepoints: 2 });
    // Measurements before the first `@` make a timepoint of their own (`start`), reused like any
    // other; the timepoints after it are read again when it appears (each is one further on).
    session.update('vitals hr 70\n@ 08:00\nvitals hr 80\n@ 09:00\nvitals hr 82');
    expect(session.stats).toEqual({ parsedLines: 1, reusedTimepoints: 0, relocatedTimepoints: 0, timepoints: 3 });
    session.update('vitals hr 70\n@ 08:00\nvitals hr 80\n@ 09:00\nvitals hr 83');
    expect(session.stats).toEqual({ parsedLines: 1, reusedTimepoints: 2, relocatedTimepoints: 0, timepoints: 3 });
  });

  it('recomputes the later timepoints that carry a changed setting, and only those from there on', () => {
    const session = new NoteSession();
    session.update(base);
    session.update(base.replace('vent      peep 12, fio2 0.6', 'vent      peep 13, fio2 0.6'));
    // Timepoints day1 22:15, day2 02:00 (edited), day2 08:00, day3 09:30 → the first one reused.
    expect(session.stats.reusedTimepoints).toBe(1);
    expect(session.stats.parsedLines).toBe(1);
  });

  it('starts afresh when the settings change', () => {
    const session = new NoteSession();
    const a = session.update(base);
    session.setSettings({ alveolarEquation: 'full' });
    const b = session.update(base);
    expect(b).not.toBe(a);
    expect(snapshot(b)).toEqual(snapshot(checkNote(base, { alveolarEquation: 'full' })));
  });
});

describe('NoteSession.steps (a note read in steps)', () => {
  const big = generateNote(300); // about 1,500 lines

  function run(session: NoteSession, text: string, linesPerStep: number): { result: NoteResult; yields: number } {
    const steps = session.steps(text, linesPerStep);
    let yields = 0;
    for (;;) {
      const next = steps.next();
      if (next.done) return { result: next.value, yields };
      yields++;
    }
  }

  it('reads a new note in steps and ends with what a fresh analysis gives', () => {
    const session = new NoteSession();
    const { result, yields } = run(session, big, 200);
    const lines = big.split('\n').length;
    expect(yields).toBeGreaterThanOrEqual(Math.floor(lines / 400));
    expect(yields).toBeLessThanOrEqual(Math.ceil(lines / 200));
    expect(snapshot(result)).toEqual(snapshot(checkNote(big)));
    // Each step stops before a timepoint line, so a timepoint is read once: the last update read
    // only the lines of its step.
    expect(session.stats.parsedLines).toBeLessThanOrEqual(2 * 200 + 1);
  });

  it('takes one step for a note it has read (an edit)', () => {
    const session = new NoteSession();
    session.update(big);
    const edited = big.replace('hour 150', 'hour 150 (edited)');
    const { result, yields } = run(session, edited, 200);
    expect(yields).toBe(0);
    expect(snapshot(result)).toEqual(snapshot(checkNote(edited)));
  });

  it('reads a change of many lines in steps too: a note pasted into an empty one, a change to every line', () => {
    const session = new NoteSession();
    session.update('');
    const pasted = run(session, big, 200);
    expect(pasted.yields).toBeGreaterThan(0);
    expect(snapshot(pasted.result)).toEqual(snapshot(checkNote(big)));
    const everyLine = big.replaceAll('vitals    hr', 'vitals hr');
    const changed = run(session, everyLine, 200);
    expect(changed.yields).toBeGreaterThan(0);
    expect(snapshot(changed.result)).toEqual(snapshot(checkNote(everyLine)));
    // A change whose stretch (first changed line to last) is shorter than a step is one step.
    const lines = everyLine.split('\n');
    lines[10] = 'vitals hr 77';
    lines[lines.length - 10] = 'vitals hr 78';
    const two = run(session, lines.join('\n'), 5000);
    expect(two.yields).toBe(0);
    expect(snapshot(two.result)).toEqual(snapshot(checkNote(lines.join('\n'))));
  });

  it('goes on from where unfinished steps stopped when the note changed meanwhile', () => {
    const session = new NoteSession();
    const first = session.steps(big, 200);
    first.next();
    first.next(); // two steps read, then the note changes near its start and near its end
    const lines = big.split('\n');
    lines[6] = 'vitals    hr 131, spo2 88 %';
    lines[lines.length - 3] = 'abg       7.21/66/58/26';
    const changed = lines.join('\n');
    const { result, yields } = run(session, changed, 200);
    expect(yields).toBeGreaterThan(0);
    expect(snapshot(result)).toEqual(snapshot(checkNote(changed)));
  });

  it('ends with what a fresh analysis gives, however edits cut into unfinished steps (200 sequences)', { timeout: 180_000 }, () => {
    const edit = fc.record({
      line: fc.nat({ max: baseLines.length + 2 }),
      kind: fc.constantFrom('replace', 'insert', 'delete'),
      text: fc.constantFrom('vitals hr 90', 'abg 7.30/50/70/24', 'vent peep 14', '@ 23:00 later', 'units gas kPa', '', 'x'),
      linesPerStep: fc.integer({ min: 1, max: 6 }),
      // How many steps run before the next edit arrives (the rest are dropped, as the server does).
      stepsBeforeNext: fc.integer({ min: 0, max: 4 }),
    });
    fc.assert(
      fc.property(fc.array(edit, { minLength: 1, maxLength: 6 }), (edits) => {
        const session = new NoteSession();
        const lines = [...baseLines];
        for (const e of edits) {
          const at = Math.min(e.line, lines.length);
          if (e.kind === 'replace' && at < lines.length) lines[at] = e.text;
          else if (e.kind === 'insert') lines.splice(at, 0, e.text);
          else if (e.kind === 'delete' && lines.length > 1 && at < lines.length) lines.splice(at, 1);
          const steps = session.steps(lines.join('\n'), e.linesPerStep);
          for (let k = 0; k < e.stepsBeforeNext; k++) if (steps.next().done) break;
        }
        const text = lines.join('\n');
        expect(snapshot(run(session, text, 3).result)).toEqual(snapshot(checkNote(text)));
      }),
      { numRuns: 200 },
    );
  });

  it('says beforehand whether a text would take steps', () => {
    const session = new NoteSession();
    expect(session.wouldStep(big, 200)).toBe(true);
    expect(session.wouldStep('@ 08:00\nvitals hr 80', 200)).toBe(false); // fits in one step
    session.update(big);
    expect(session.wouldStep(big, 200)).toBe(false);
    expect(session.wouldStep(big.replace('hour 150', 'hour 150 (edited)'), 200)).toBe(false);
    expect(session.wouldStep(big.replaceAll('vitals    hr', 'vitals hr'), 200)).toBe(true);
  });

  it('sizes the steps that follow by what next() is given', () => {
    const session = new NoteSession();
    const steps = session.steps(big, 100);
    steps.next();
    expect(session.stats.parsedLines).toBeLessThanOrEqual(2 * 100 + 1);
    steps.next(600);
    expect(session.stats.parsedLines).toBeGreaterThanOrEqual(600);
    expect(session.stats.parsedLines).toBeLessThanOrEqual(2 * 600 + 1);
    let next = steps.next(100_000);
    while (!next.done) next = steps.next();
    expect(snapshot(next.value)).toEqual(snapshot(checkNote(big)));
  });

  it('stops early when an update in between brought the session to the text', () => {
    const session = new NoteSession();
    const steps = session.steps(big, 200);
    steps.next();
    const whole = session.update(big); // a request that needed the result
    const end = steps.next();
    expect(end.done).toBe(true);
    expect(end.value).toBe(whole);
  });

  it('starts afresh in steps after a change of settings', () => {
    const session = new NoteSession();
    session.update(big);
    session.setSettings({ alveolarEquation: 'full' });
    const { result, yields } = run(session, big, 200);
    expect(yields).toBeGreaterThan(0);
    expect(snapshot(result)).toEqual(snapshot(checkNote(big, { alveolarEquation: 'full' })));
  });
});

describe('nextCut', () => {
  it('cuts at the start of the first timepoint line after the lines asked for', () => {
    const text = 'a\nb\n@ 1\nc\n@ 2\nd';
    expect(nextCut(text, 0, 1)).toBe(text.indexOf('@ 1'));
    expect(nextCut(text, 0, 3)).toBe(text.indexOf('@ 2'));
    expect(nextCut(text, text.indexOf('@ 2'), 5)).toBe(text.length);
  });

  it('cuts at any line after twice the lines asked for when no timepoint line comes', () => {
    expect(nextCut('a\nb\nc\nd\ne', 0, 2)).toBe('a\nb\nc\nd\n'.length);
  });

  it('counts \\r\\n and a lone \\r as one line end each, and never cuts between \\r and \\n', () => {
    const text = 'a\r\nb\r@ 1\r\n@ 2';
    expect(nextCut(text, 0, 1)).toBe(text.indexOf('@ 1'));
    expect(nextCut(text, 0, 3)).toBe(text.indexOf('@ 2'));
    expect(nextCut('a\r\nb\r\nc', 0, 1)).toBe(6);
  });
});

describe('NoteSession memory', () => {
  it('keeps only the changed lines after an edit, not another copy of the whole note (100 edits of a 300 KB note)', () => {
    setFlagsFromString('--expose-gc');
    const gc = runInNewContext('gc') as () => void;
    const block = (i: number) => [`@ day ${1 + Math.floor(i / 24)} ${String(i % 24).padStart(2, '0')}:00  hour ${i + 1}`, `vitals    hr ${60 + (i % 40)}, rr 18, spo2 95 %, temp 37.1 C, bp 120/70`, 'vent      plateau 22, peak 28, map 12', `abg       7.38/${38 + (i % 6)}/90/24, lactate 1.2`, 'note      turned and settled', ''];
    const lines = ['patient   age 61 y, sex male, height 176 cm', 'place     altitude 300 m', ''];
    for (let i = 0; i < 2000; i++) lines.push(...block(i));
    const session = new NoteSession();
    session.update(lines.join('\n'));
    gc();
    gc();
    const before = process.memoryUsage().heapUsed;
    const vitals = lines.flatMap((l, i) => (l.startsWith('vitals') ? [i] : []));
    for (let e = 0; e < 100; e++) {
      const k = vitals[(e * 37) % vitals.length]!;
      lines[k] = lines[k]!.replace(/hr (\d+)/, (_m, n: string) => `hr ${Number(n) + 1}`);
      session.update(lines.join('\n'));
    }
    gc();
    gc();
    const grown = process.memoryUsage().heapUsed - before;
    // Holding a view of each version of the note would keep 100 × 300 KB = 30 MB.
    expect(grown).toBeLessThan(8 * 1048576);
  });
});
