// fast-check properties of the incremental session, aimed at what makes a later timepoint depend
// on an earlier one: timepoints moved (a block cut and pasted elsewhere, so times and their order
// change), carried settings changed or removed (FiO2, PEEP, the device), a place line added to or
// removed from an early timepoint (the barometric pressure of every later one), `units gas`
// toggled (how later bare numbers read), a line typed a character at a time (a child's age typed
// after a bare height: how the height reads), and changes of the settings in between. After every update the session must give what a fresh analysis of the same
// text with the same settings gives: everything a user sees (tests/core/session-snapshot.ts).
// A failure prints the shrunk edit list; replay with the seed fast-check prints.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { NoteSession } from '../../server/src/core/session';
import type { Settings } from '../../server/src/core/settings';
import { sameAsJson, snapshot } from './session-snapshot';

const RUNS = Number(process.env.SESSION_PROPERTY_RUNS ?? 40);

// Invented note over three days: a header place and gas unit, settings carried from timepoint to
// timepoint, bare gases that read differently in mmHg and kPa, a place line in a later timepoint.
const START = [
  'patient   age 64 y, sex female, height 163 cm',
  'place     altitude 1650 m',
  '',
  '@ day 1 22:00  arrival',
  'oxygen    venturi 6 L/min, fio2 40 %',
  'abg       7.31/7.1/8.9/26',
  '',
  '@ 23:30  intubated',
  'vent      mode VC, vt 420 mL, rate 22, peep 10, fio2 0.6, plateau 27',
  'abg       7.33/52/70/26',
  '',
  '@ 02:00  next day by the clock',
  'vent      peep 12',
  'abg       ph 7.36, pco2 46, po2 76, hco3 25',
  '',
  '@ day 3 09:00  transfer',
  'place     altitude 300 m',
  'abg       7.40/41/80/24',
  '',
  '@ +2h',
  'vitals    spo2 95 %',
  'abg       7.41/40/78/25',
];

const SETTINGS: readonly Partial<Settings>[] = [
  {},
  { gasUnit: 'kPa' },
  { barometricModel: 'standard' },
  { alveolarEquation: 'full', respiratoryQuotient: 1 },
  { disabledChecks: ['PN410', 'other-unit-likely'] },
  { hypoxaemiaBelowMmhg: 80, gasUnit: 'kPa' },
];

const SETTING_LINES = ['vent      fio2 0.35', 'vent      peep 5, fio2 1.0', 'vent      mode PS, ps 10', 'oxygen    room air', 'oxygen    cannula 2', 'oxygen    hfnc 50 L/min fio2 60 %', 'vent      vt 380 mL'];
const PLACE_LINES = ['place     altitude 3000 m', 'place     barometric 600 mmHg', 'place     pb 80 kPa', 'place     altitude 0 m', 'place'];
const TIMEPOINT_LINES = ['@ 01:00', '@ day 2 06:00  moved', '@ +30min', '@ day 1 21:00', '@'];
// A blood pressure with its mean in brackets typed a character at a time goes through an unclosed
// bracket (`(9`, `(93 mm`) before it closes.
// A child's age and bare body sizes, typed anywhere: the age (`8` years, `8 m`, not an age unit,
// then `8 mo`) decides how a bare height or weight of its header or timepoint reads, on any line of it.
const TYPED = ['abg 7.29/6.8/8.1/24', 'vent fio2 0.5, peep 8', 'place altitude 2500 m', '@ day 2 12:00', 'units gas kPa', 'vitals bp 120/80(93 mmHg) hr 80', 'patient age 8 mo', 'patient height 70, weight 8'];

type Edit =
  | { kind: 'move'; from: number; to: number }
  | { kind: 'carried'; at: number; text: string }
  | { kind: 'drop-carried'; at: number }
  | { kind: 'place'; at: number; text: string }
  | { kind: 'drop-place'; at: number }
  | { kind: 'timepoint'; at: number; text: string }
  | { kind: 'units'; at: number }
  | { kind: 'type'; at: number; text: string; every: number }
  | { kind: 'settings'; settings: Partial<Settings> };

const edit: fc.Arbitrary<Edit> = fc.oneof(
  fc.record({ kind: fc.constant('move' as const), from: fc.nat(), to: fc.nat() }),
  fc.record({ kind: fc.constant('carried' as const), at: fc.nat(), text: fc.constantFrom(...SETTING_LINES) }),
  fc.record({ kind: fc.constant('drop-carried' as const), at: fc.nat() }),
  fc.record({ kind: fc.constant('place' as const), at: fc.nat(), text: fc.constantFrom(...PLACE_LINES) }),
  fc.record({ kind: fc.constant('drop-place' as const), at: fc.nat() }),
  fc.record({ kind: fc.constant('timepoint' as const), at: fc.nat(), text: fc.constantFrom(...TIMEPOINT_LINES) }),
  fc.record({ kind: fc.constant('units' as const), at: fc.nat() }),
  fc.record({ kind: fc.constant('type' as const), at: fc.nat(), text: fc.constantFrom(...TYPED), every: fc.integer({ min: 1, max: 4 }) }),
  fc.record({ kind: fc.constant('settings' as const), settings: fc.constantFrom(...SETTINGS) }),
);

/** The blocks of a note: the lines before the first `@`, then one block per timepoint. */
function blocks(lines: readonly string[]): string[][] {
  const out: string[][] = [[]];
  for (const l of lines) {
    if (l.startsWith('@')) out.push([]);
    out[out.length - 1]!.push(l);
  }
  return out;
}

const pick = <T>(list: readonly T[], n: number): T | undefined => (list.length === 0 ? undefined : list[n % list.length]);
const indexes = (lines: readonly string[], test: (l: string) => boolean) => lines.flatMap((l, i) => (test(l) ? [i] : []));

/** The texts an edit goes through (several for a line typed a character at a time). */
function apply(lines: string[], e: Exclude<Edit, { kind: 'settings' }>): string[] {
  switch (e.kind) {
    case 'move': { // a timepoint's block cut and pasted before another (or at the end)
      const bs = blocks(lines);
      if (bs.length < 3) break;
      const from = 1 + (e.from % (bs.length - 1));
      const [moved] = bs.splice(from, 1);
      bs.splice(1 + (e.to % bs.length), 0, moved!);
      lines.splice(0, lines.length, ...bs.flat());
      break;
    }
    case 'carried': {
      const at = pick(indexes(lines, (l) => /^(vent|oxygen)\b/.test(l)), e.at);
      if (at === undefined) lines.splice(Math.min(lines.length, 4), 0, e.text);
      else lines[at] = e.text;
      break;
    }
    case 'drop-carried': {
      const at = pick(indexes(lines, (l) => /^(vent|oxygen)\b/.test(l)), e.at);
      if (at !== undefined) lines.splice(at, 1);
      break;
    }
    case 'place': { // after a timepoint line, or replacing a place line
      const places = indexes(lines, (l) => l.startsWith('place'));
      const tps = indexes(lines, (l) => l.startsWith('@'));
      if (places.length > 0 && e.at % 2 === 0) lines[pick(places, e.at >> 1)!] = e.text;
      else lines.splice((pick(tps, e.at) ?? -1) + 1, 0, e.text);
      break;
    }
    case 'drop-place': {
      const at = pick(indexes(lines, (l) => l.startsWith('place')), e.at);
      if (at !== undefined) lines.splice(at, 1);
      break;
    }
    case 'timepoint': {
      const at = pick(indexes(lines, (l) => l.startsWith('@')), e.at);
      if (at !== undefined && e.at % 3 === 0) lines[at] = e.text; // a time rewritten: later times move
      else lines.splice(e.at % (lines.length + 1), 0, e.text);
      break;
    }
    case 'units': {
      const at = pick(indexes(lines, (l) => l.startsWith('units')), e.at);
      if (at === undefined) lines.splice(e.at % 2 === 0 ? 0 : e.at % (lines.length + 1), 0, 'units     gas kPa');
      else if (e.at % 2 === 0) lines.splice(at, 1);
      else lines[at] = lines[at]!.includes('kPa') ? 'units     gas mmHg' : 'units     gas kPa';
      break;
    }
    case 'type': { // a new line typed a character at a time; some keystrokes are analysed
      const at = e.at % (lines.length + 1);
      lines.splice(at, 0, '');
      const texts: string[] = [];
      for (let c = 1; c <= e.text.length; c++) {
        lines[at] = e.text.slice(0, c);
        if (c % e.every === 0 || c === e.text.length) texts.push(lines.join('\n'));
      }
      return texts;
    }
  }
  return [lines.join('\n')];
}

describe('NoteSession: a child\'s age typed after a bare height', () => {
  // Invented: an infant's header whose bare height is doubted until the age is typed below it, and
  // a timepoint that restates the height before its age line. Each keystroke is analysed.
  const NOTE = [
    'patient   height 70, weight 8',
    'place     altitude 300 m',
    '',
    '@ day 1 08:00  ward',
    'patient   height 71',
    'vitals    hr 130, spo2 94 %',
    '',
    '@ day 2 08:00',
    'vitals    hr 124',
  ];

  /** Types `text` as a new line at `at` of `lines`, a character at a time: the texts after each keystroke. */
  function typed(lines: readonly string[], at: number, text: string): string[] {
    const out: string[] = [];
    for (let c = 1; c <= text.length; c++) out.push([...lines.slice(0, at), text.slice(0, c), ...lines.slice(at)].join('\n'));
    return out;
  }

  const doubted = (r: ReturnType<typeof checkNote>) => r.findings.filter((f) => f.code === 'PN204').map((f) => f.range.start.line);

  for (const [where, at, lines] of [['on a later header line', 2, NOTE], ['at the timepoint, after its height', 5, NOTE]] as const) {
    it(`${where}: the session gives what a fresh analysis gives at every keystroke`, () => {
      const session = new NoteSession({});
      const texts = [NOTE.join('\n'), ...typed(lines, at, 'patient   age 8 mo')];
      // And the age deleted again, a character at a time.
      texts.push(...[...typed(lines, at, 'patient   age 8 mo')].reverse().slice(1), NOTE.join('\n'));
      const seen = new Set<string>();
      for (const text of texts) {
        const got = session.update(text);
        const fresh = checkNote(text);
        if (!sameAsJson(snapshot(got), snapshot(fresh))) expect(snapshot(got)).toEqual(snapshot(fresh));
        seen.add(JSON.stringify(doubted(fresh)));
      }
      // Not vacuous: the keystrokes change which heights are doubted (none once `age 8` is typed, as
      // 8 years, then both again at `8 m`, a unit an age does not take, then none).
      expect(doubted(checkNote(NOTE.join('\n')))).toEqual([0, 4]);
      const withAge = typed(lines, at, 'patient   age 8 mo').at(-1)!;
      // The header's age is carried to the timepoint; one at the timepoint leaves the header an adult's.
      expect(doubted(checkNote(withAge))).toEqual(at === 2 ? [] : [0]);
      expect(seen.size).toBeGreaterThan(1);
    });
  }
});

describe('NoteSession (fast-check): edits that change what later timepoints depend on', () => {
  it(`gives what a fresh analysis gives after every update (${RUNS} edit sequences)`, { timeout: 300_000 }, () => {
    // Updates that reused an earlier timepoint: the incremental path is taken, not only fresh analyses.
    let reused = 0;
    fc.assert(
      fc.property(fc.constantFrom(...SETTINGS), fc.array(edit, { minLength: 1, maxLength: 10 }), (first, edits) => {
        let settings = first;
        const session = new NoteSession(settings);
        const lines = [...START];
        const check = (text: string) => {
          const got = snapshot(session.update(text));
          if (session.stats.reusedTimepoints > 0) reused++;
          const fresh = snapshot(checkNote(text, settings));
          if (!sameAsJson(got, fresh)) expect(got).toEqual(fresh);
        };
        check(lines.join('\n'));
        for (const e of edits) {
          if (e.kind === 'settings') {
            settings = e.settings;
            session.setSettings(settings);
            check(lines.join('\n'));
            continue;
          }
          for (const text of apply(lines, e)) check(text);
        }
      }),
      { numRuns: RUNS },
    );
    expect(reused).toBeGreaterThan(RUNS);
  });

  it('the edits do change later timepoints (the property above is not vacuous)', () => {
    const before = checkNote(START.join('\n'));
    const later = (r: ReturnType<typeof checkNote>) => r.analysis.timeline.timepoints.map((tp) => [tp.time.minutes, tp.barometricMmhg, tp.values.numberOf('fio2'), tp.gasUnit]);
    const changed = (e: Exclude<Edit, { kind: 'settings' }>) => {
      const lines = [...START];
      const texts = apply(lines, e);
      return JSON.stringify(later(checkNote(texts[texts.length - 1]!))) !== JSON.stringify(later(before));
    };
    // A place line added to the first timepoint changes the pressure of the next two.
    expect(changed({ kind: 'place', at: 1, text: 'place     altitude 3000 m' })).toBe(true);
    // The FiO2 carried from 23:30 to 02:00 changes.
    expect(changed({ kind: 'carried', at: 1, text: 'vent      fio2 0.35' })).toBe(true);
    // A block moved changes the times of those after it.
    expect(changed({ kind: 'move', from: 0, to: 3 })).toBe(true);
    // `units gas kPa` at the top reads the later bare gases in kPa.
    expect(changed({ kind: 'units', at: 0 })).toBe(true);
  });
});
