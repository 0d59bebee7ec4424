// Edits met at a bedside that the other session tests do not make, each compared with a fresh
// analysis of the same text (tests/core/session-snapshot.ts: everything a user sees), and a
// fast-check property that makes them at random (a byte-order mark put in front, a line commented
// out and back, line ends changed to CRLF or a lone CR, stretches of lines moved across timepoint
// lines, pieces of other notes pasted, the patient and place lines edited, an undo to an earlier
// text, settings changed) and compares, beyond the snapshot, what an editor asks for at every word:
// hovers, completions, code actions, timepoint summaries and the whole-note unit conversions.
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkNote, type NoteResult } from '../../server/src/core/check-note';
import { NoteSession } from '../../server/src/core/session';
import { codeActions } from '../../server/src/core/service/actions';
import { completionsAt } from '../../server/src/core/service/complete';
import { hoverAt } from '../../server/src/core/service/hover';
import { convertNoteUnits } from '../../server/src/core/service/unit-conversion';
import { timepointSummary } from '../../server/src/core/trends';
import { generateNote } from '../bench/generate.mjs';
import type { Settings } from '../../server/src/core/settings';
import { sameAsJson, snapshot } from './session-snapshot';

/** The code actions offered with the cursor at each character of each line. */
function actionsEverywhere(result: NoteResult): unknown[] {
  const out: unknown[] = [];
  for (const node of result.analysis.tree.lines) {
    for (let character = 0; character <= node.text.length; character++) {
      const at = { line: node.line, character };
      out.push([at, codeActions(result, { start: at, end: at })]);
    }
  }
  return out;
}

/** Opens the first text in a session, then updates it to each of the others; every result is compared with a fresh analysis. */
function expectFreshThrough(texts: readonly string[], settings: Partial<Settings> = {}): NoteSession {
  const session = new NoteSession(settings);
  for (const text of texts) {
    const got = snapshot(session.update(text));
    const fresh = snapshot(checkNote(text, settings));
    if (!sameAsJson(got, fresh)) expect(got).toEqual(fresh);
  }
  return session;
}

describe('NoteSession: a setting held as before only when it reads the same', () => {
  it('reads `place barometric 0` again when `units gas` above it changes (0 is 0 in either unit, read in another)', () => {
    const note = (unit: string) => [`units     gas ${unit}`, 'place     barometric 0', '', '@ 08:00', 'abg       7.40/40/90/24'].join('\n');
    const session = expectFreshThrough([note('mmHg'), note('kPa'), note('mmHg')]);
    // The place line itself is unchanged: its value is read again under the new unit, not kept.
    expect(session.result!.analysis.timeline.timepoints[0]!.values.get('barometric')?.stated.readUnit).toBe('mmHg');
  });
});

describe('NoteSession: lines added above a timepoint whose findings quote a label', () => {
  it('reads again a timepoint whose FiO2 is carried from a timepoint labelled with words like `line 7`', () => {
    // PN401 names where its FiO2 came from with that timepoint's label (`carried from see line 7,
    // line 2`): a line added before the third timepoint must not move the `7` of the label.
    const before = [
      '@ day 1 08:00  see line 7',
      'vent      mode VC, vt 400 mL, peep 5, fio2 0.3',
      '',
      '@ 09:00',
      'vitals    hr 70',
      '@ 10:00',
      'abg       7.40/40/400/24',
    ];
    const after = [...before.slice(0, 3), 'vitals    hr 80', ...before.slice(3)];
    const fresh = checkNote(after.join('\n')).findings.find((f) => f.code === 'PN401');
    expect(fresh?.related?.[0]?.message).toBe('FiO2 0.30 in force (carried from see line 7, line 2)');
    expectFreshThrough([before.join('\n'), after.join('\n'), before.join('\n')]);
  });
});

describe('NoteSession: code actions on a line read again though unchanged', () => {
  // A line next to a change is read again (its terminator, or the character after it, is in the
  // changed stretch), so the tree holds a new node for it; when its timepoint is kept, the values
  // in force still hold the items of the node read before. The actions at a value must not care.
  const cases: { name: string; before: string; after: string }[] = [
    {
      name: 'a line end changed on the blank line after a gas (LF to CRLF)',
      before: '@ 08:00\nabg       7.33/45/82/23.1, etco2 40\n\n@ 09:00\nvitals    hr 80\n',
      after: '@ 08:00\nabg       7.33/45/82/23.1, etco2 40\n\r\n@ 09:00\nvitals    hr 80\n',
    },
    {
      name: 'the line end of a setting line changed (LF to CRLF)',
      before: '@ 08:00\nvent      peep 12, fio2 0.6, map 18\n@ 09:00\nvitals    hr 80\n',
      after: '@ 08:00\nvent      peep 12, fio2 0.6, map 18\r\n@ 09:00\nvitals    hr 80\n',
    },
    {
      name: 'two lines far apart changed at once (a fix applied to the whole note)',
      before: '@ 08:00\nvitals    hr 80.\n@ 09:00\nabg       7.33/45/82/23.1\n@ 10:00\nvitals    hr 81.\n',
      after: '@ 08:00\nvitals    hr 80\n@ 09:00\nabg       7.33/45/82/23.1\n@ 10:00\nvitals    hr 81\n',
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const session = new NoteSession();
      session.update(c.before);
      const got = session.update(c.after);
      const fresh = checkNote(c.after);
      const offered = actionsEverywhere(fresh);
      // Not vacuous: values on the unchanged lines are offered their unit written out, or in another unit.
      expect(JSON.stringify(offered)).toMatch(/Write the unit|shorthand gas pressures in kPa/);
      expect(actionsEverywhere(got)).toEqual(offered);
    });
  }
});

// ---- a differential property: bedside edits, and every answer a user can ask for ----------------

/** The start of each line of a text, with line ends counted as the editor counts them. */
function lineStarts(text: string): number[] {
  const starts = [0];
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x0d && text.charCodeAt(i + 1) === 0x0a) i++;
    if (c === 0x0a || c === 0x0d) starts.push(i + 1);
  }
  return starts;
}

/**
 * What the editor asks of an analysis beyond what `snapshot` holds: hovers, completions and code
 * actions at the start and end of every line and at every word, the quick fixes of every line,
 * each line's timepoint summary, and the whole note's gas pressures converted either way.
 */
function services(result: NoteResult): unknown {
  const out: unknown[] = [];
  for (const node of result.analysis.tree.lines) {
    const text = node.text;
    const line = node.line;
    const at = new Set([0, text.length]);
    for (let c = 1; c < text.length; c++) if (/\s/.test(text[c - 1]!) && !/\s/.test(text[c]!)) at.add(c);
    for (const character of at) {
      const p = { line, character };
      out.push(hoverAt(result, p), completionsAt(result, p), codeActions(result, { start: p, end: p }));
    }
    out.push(codeActions(result, { start: { line, character: 0 }, end: { line, character: text.length } }), timepointSummary(result, line));
  }
  out.push(convertNoteUnits(result, 'kPa'), convertNoteUnits(result, 'mmHg'));
  return out;
}

const SAMPLES = ['icu-ventilated-lung-injury', 'home-oxygen-exacerbation', 'summit-hut-evacuation', 'broken-note'].map((n) => readFileSync(`samples/${n}.pneu`, 'utf8'));
const STARTS = [...SAMPLES, generateNote(8, 3)];

/** Pieces typed or pasted: whole lines (timepoints, header lines, settings that carry), line ends, a byte-order mark, a comment mark, single keystrokes. */
const PIECES = [
  '\ufeff', '# ', '\r', '\n', '\r\n',
  '@ day 1 08:00\n', '@ +1h\r\n', '@\n', '@ 10:00  see line 9\n', '@ +1h  art line 2nd try\n', '@ 11:00  `quoted` line 12`\n',
  'patient   age 80 y, sex male, height 150 cm\n', 'patient   age 4 y\n', 'place     altitude 4000 m\n', 'place     barometric 0\n',
  'units     gas kPa\n', 'units     gas mmHg\n',
  'vent      mode VC, vt 500 mL, peep 10, fio2 0.5\n', 'vent      fio2 0.3\n', 'vent      mode HFOV, map 25, rate 6 Hz\n',
  'oxygen    cpap 8 fio2 0.4\n', 'oxygen    cannula 2 epap 6\n',
  'abg       7.3/50/60/24\n', 'abg       7.3/6/8/24\n', 'abg       7.40/40/500/24\n', 'vitals    hr 80 bp 120/80(93)\n', 'note      Dr Roe 07700 900123\n',
  'x', ' ', ',', '0', '\u00a0', 'é', '😀',
];

const BEDSIDE_SETTINGS: readonly Partial<Settings>[] = [{}, { gasUnit: 'kPa' }, { alveolarEquation: 'full' }, { disabledChecks: ['PN410', 'PN107', 'pressure-without-support'] }, { privacyChecks: false }, { barometricModel: 'standard' }];

type BedsideEdit =
  | { kind: 'piece'; at: number; remove: number; piece: string }
  | { kind: 'cut'; at: number; length: number }
  | { kind: 'move-lines'; from: number; count: number; to: number }
  | { kind: 'comment'; line: number }
  | { kind: 'line-end'; line: number; eol: string }
  | { kind: 'header'; age: string; sex: string; height: string; altitude: string }
  | { kind: 'paste'; source: number; from: number; length: number; at: number }
  | { kind: 'undo'; back: number }
  | { kind: 'settings'; settings: Partial<Settings> };

const bedsideEdit: fc.Arbitrary<BedsideEdit> = fc.oneof(
  { arbitrary: fc.record({ kind: fc.constant('piece' as const), at: fc.nat(), remove: fc.nat({ max: 3 }), piece: fc.constantFrom(...PIECES) }), weight: 4 },
  fc.record({ kind: fc.constant('cut' as const), at: fc.nat(), length: fc.nat({ max: 300 }) }),
  fc.record({ kind: fc.constant('move-lines' as const), from: fc.nat(), count: fc.integer({ min: 1, max: 6 }), to: fc.nat() }),
  fc.record({ kind: fc.constant('comment' as const), line: fc.nat() }),
  fc.record({ kind: fc.constant('line-end' as const), line: fc.nat(), eol: fc.constantFrom('\n', '\r\n', '\r') }),
  fc.record({ kind: fc.constant('header' as const), age: fc.constantFrom('2', '40', '90', '130'), sex: fc.constantFrom('male', 'female', 'f'), height: fc.constantFrom('120', '190', '60'), altitude: fc.constantFrom('0', '2500', '5000') }),
  fc.record({ kind: fc.constant('paste' as const), source: fc.nat(), from: fc.nat(), length: fc.nat({ max: 400 }), at: fc.nat() }),
  fc.record({ kind: fc.constant('undo' as const), back: fc.nat() }),
  fc.record({ kind: fc.constant('settings' as const), settings: fc.constantFrom(...BEDSIDE_SETTINGS) }),
);

/** The text after an edit (`history`: the texts before, most recent last). */
function edited(text: string, e: Exclude<BedsideEdit, { kind: 'settings' }>, history: readonly string[]): string {
  const starts = lineStarts(text);
  const lineStart = (i: number) => (i < starts.length ? starts[i]! : text.length);
  switch (e.kind) {
    case 'piece': {
      const at = e.at % (text.length + 1);
      return text.slice(0, at) + e.piece + text.slice(Math.min(text.length, at + e.remove));
    }
    case 'cut': {
      const at = e.at % (text.length + 1);
      return text.slice(0, at) + text.slice(Math.min(text.length, at + e.length));
    }
    case 'move-lines': { // a stretch of lines cut and pasted elsewhere (across timepoints, often)
      const from = e.from % starts.length;
      const a = lineStart(from);
      const b = lineStart(from + e.count);
      const rest = text.slice(0, a) + text.slice(b);
      const moved = /[\r\n]$/.test(text.slice(a, b)) || b === a ? text.slice(a, b) : `${text.slice(a, b)}\n`;
      const restStarts = lineStarts(rest);
      const to = restStarts[e.to % restStarts.length]!;
      return rest.slice(0, to) + moved + rest.slice(to);
    }
    case 'comment': { // a line commented out, or its comment mark taken away
      const s = lineStart(e.line % starts.length);
      return text.startsWith('# ', s) ? text.slice(0, s) + text.slice(s + 2) : `${text.slice(0, s)}# ${text.slice(s)}`;
    }
    case 'line-end': { // the line end before a line: LF, CRLF or a lone CR
      if (starts.length < 2) return text;
      const s = starts[1 + (e.line % (starts.length - 1))]!;
      const from = text.charCodeAt(s - 1) === 0x0a && text.charCodeAt(s - 2) === 0x0d ? s - 2 : s - 1;
      return text.slice(0, from) + e.eol + text.slice(s);
    }
    case 'header': // the patient and place lines: what every timepoint derives changes
      return text.replace(/age \d+/, `age ${e.age}`).replace(/height \d+/, `height ${e.height}`).replace(/altitude \d+/, `altitude ${e.altitude}`).replace(/sex \w+/, `sex ${e.sex}`);
    case 'paste': { // a stretch of another note pasted, cut anywhere
      const source = STARTS[e.source % STARTS.length]!;
      const from = e.from % (source.length + 1);
      const at = e.at % (text.length + 1);
      return text.slice(0, at) + source.slice(from, from + e.length) + text.slice(at);
    }
    case 'undo': // back to an earlier text (the undo of a big paste: the whole text replaced)
      return history.length === 0 ? text : history[history.length - 1 - (e.back % history.length)]!;
  }
}

const BEDSIDE_RUNS = Number(process.env.BEDSIDE_PROPERTY_RUNS ?? 25);

describe('NoteSession (fast-check): bedside edits, compared in everything an editor asks for', () => {
  it(`gives what a fresh analysis gives after every edit, hovers, completions and code actions included (${BEDSIDE_RUNS} edit sequences)`, { timeout: 600_000 }, () => {
    fc.assert(
      fc.property(fc.nat({ max: STARTS.length - 1 }), fc.constantFrom(...BEDSIDE_SETTINGS), fc.array(bedsideEdit, { minLength: 1, maxLength: 14 }), (start, first, edits) => {
        let settings = first;
        const session = new NoteSession(settings);
        let text = STARTS[start]!;
        const history: string[] = [];
        const check = () => {
          const got = session.update(text);
          const fresh = checkNote(text, settings);
          const a = snapshot(got);
          const b = snapshot(fresh);
          if (!sameAsJson(a, b)) expect(a).toEqual(b);
          const sa = services(got);
          const sb = services(fresh);
          if (!sameAsJson(sa, sb)) expect(sa).toEqual(sb);
        };
        check();
        for (const e of edits) {
          if (e.kind === 'settings') {
            settings = e.settings;
            session.setSettings(settings);
          } else {
            history.push(text);
            text = edited(text, e, history);
          }
          check();
        }
      }),
      {
        numRuns: BEDSIDE_RUNS,
        // Found by the sequences above: a line end changed beside a gas line of a kept timepoint.
        examples: [[0, {}, [{ kind: 'line-end', line: 6, eol: '\r\n' }]]],
      },
    );
  });
});
