// An editing session as a language server sees it while someone types fast in a big note: long
// random sequences of realistic edits (lines typed a character at a time, values changed,
// timepoints added and removed, a header line moved after the first timepoint, `units gas`
// toggled, a carried setting edited, the patient's height and sex changed, the place moved, a
// block pasted, everything deleted, line ends mixed, a line of only `@`, undo) and changes of
// settings in between. After every edit the session's result must be what a fresh analysis of
// the same text with the same settings gives: findings (ranges, messages, fixes), every
// timepoint's values in force with their origins, derived values, what is missing, readings,
// inlay hints, symbols and folding ranges.
//
// The generator is seeded, so a failure names its seed and can be replayed:
// `SESSION_SEED=123 SESSION_RUNS=1 npx vitest run tests/core/session-edits.test.ts`.
// `SESSION_RUNS=2000` stresses it locally; CI keeps the default.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { NoteSession } from '../../server/src/core/session';
import type { Settings } from '../../server/src/core/settings';
import { generateNote } from '../bench/generate.mjs';
import { sameAsJson, snapshot } from './session-snapshot';
import { rng } from '../helpers/seeded';

/** Edit sequences per test (each of about `EDITS` edits, every one compared with a fresh analysis). */
const SESSION_RUNS = Number(process.env.SESSION_RUNS ?? 12);
const EDITS = Number(process.env.SESSION_EDITS ?? 40);
const FIRST_SEED = Number(process.env.SESSION_SEED ?? 1);

class Dice {
  constructor(readonly next: () => number) {}
  int(n: number): number { return Math.floor(this.next() * n); }
  pick<T>(list: readonly T[]): T { return list[this.int(list.length)]!; }
  chance(p: number): boolean { return this.next() < p; }
}

// ---- notes and edits ---------------------------------------------------------------------------

const SAMPLES = ['icu-ventilated-lung-injury', 'home-oxygen-exacerbation', 'summit-hut-evacuation', 'broken-note'].map((n) => readFileSync(`samples/${n}.pneu`, 'utf8'));
const STARTS = [...SAMPLES, generateNote(12, 7), generateNote(30, 3), ''];

const HEADER_LINES = [
  'patient   age 64 y, sex female, height 163 cm, weight 71 kg',
  'patient   sex male, height 180 cm',
  'patient   height 5 ft',
  'patient   ht 1.7 m, sex f',
  'place     altitude 1650 m',
  'place     barometric 628 mmHg',
  'place     pb 84 kPa',
  'units     gas kPa',
  'units     gas mmHg',
  'units     gas torr',
];

const BODY_LINES = [
  'vitals    hr 118, rr 26, spo2 89 %, temp 38.4 C, bp 96/58',
  'vitals    hr 80 rr 18 spo2 97%',
  'vitals    hr 80.',
  'vitals    hr, rr 26',
  'oxygen    cannula 4 L/min',
  'oxygen    room air',
  'oxygen    room air 2',
  'oxygen    mask 10 L/min',
  'oxygen    hfnc 50 L/min fio2 60 %',
  'oxygen    niv ipap 14, epap 6, fio2 40 %',
  'oxygen    cpap 8 fio2 0.5',
  'abg       7.28/7.5/9.5/26',
  'abg       7.28/56/71/26, be -2',
  'abg       ph 7.31, pco2 7.1, po2 9.0 kPa, hco3 26, be -2, sao2 93 %, lactate 2.1',
  'abg       po2 9.1',
  'abg       7,35/41/88/24',
  'abg       7.28/56/71/26/-2',
  'vbg       ph 7.29, pco2 7.9',
  'labs      na 139, cl 101, albumin 31 g/L, hb 11.2 g/dL, hco3 24',
  'vent      mode VC, vt 430 mL, rate 24, peep 10, fio2 0.6, plateau 29, peak 34, flow 60 L/min, map 17',
  'vent      peep 14, fio2 0.8',
  'vent      mode PC, peep 8',
  'vent      plateau 31, peak 38',
  'vent      vt 700 mL',
  'note      turned; seen by Dr Roe on 4 March 2026, 07700 900123',
  'vitls hr 118',
  'hr 118',
  '# a comment',
  '',
  '   ',
  ',,,',
  '/ / / / /',
];

const TIMEPOINT_LINES = ['@ day 1 07:40  arrival', '@ 08:00', '@ +2h30 later', '@ day 2', '@ day 2 0800', '@ 25:10 bad', '@', '@ ', '@ +1d2h', '@ 23:00.', '@ day 0 22:00 before admission', '@ +2h90', '@, label'];

const PASTE_BLOCKS = [
  '@ day 3 09:00  pasted\nvent      mode PS, peep 6, fio2 0.35\nabg       7.41/42/85/25\nnote      weaning',
  'patient   age 50 y, sex male, height 170 cm\nplace     altitude 2400 m\nunits     gas kPa\n',
  '@ 10:00\r\noxygen    cannula 2\r\nvitals    spo2 94 %\r\n@ +30min\r\nabg 7.40/5.3/10.1/24\r\n',
  generateNote(4, 11),
];

const EOLS = ['\n', '\n', '\n', '\r\n', '\r'];

/** A note as lines with their own terminators, so line ends can be mixed. */
interface Line { text: string; eol: string }

function toLines(text: string): Line[] {
  const out: Line[] = [];
  const re = /\r\n|\r|\n/g;
  let at = 0;
  for (let m = re.exec(text); m; m = re.exec(text)) {
    out.push({ text: text.slice(at, m.index), eol: m[0] });
    at = m.index + m[0].length;
  }
  out.push({ text: text.slice(at), eol: '' });
  return out;
}

function join(lines: readonly Line[]): string {
  return lines.map((l) => l.text + l.eol).join('');
}

/** `lines` with `index` guaranteed to hold a terminator when it is not the last line. */
function insertLine(lines: Line[], at: number, text: string, eol: string): void {
  if (at >= lines.length) {
    const last = lines[lines.length - 1]!;
    if (last.eol === '') last.eol = eol;
    lines.push({ text, eol: '' });
  } else lines.splice(at, 0, { text, eol });
}

function removeLine(lines: Line[], at: number): void {
  if (lines.length === 1) { lines[0] = { text: '', eol: '' }; return; }
  lines.splice(at, 1);
  lines[lines.length - 1]!.eol = '';
}

function indexWhere(lines: readonly Line[], test: (l: Line) => boolean, d: Dice): number {
  const found: number[] = [];
  for (let i = 0; i < lines.length; i++) if (test(lines[i]!)) found.push(i);
  return found.length === 0 ? -1 : d.pick(found);
}

const NUMBERS = ['0', '1', '7.4', '7.1', '40', '56', '88', '9.5', '163', '200', '2500', '-2', '0.6', '60', '5.3', '12', '', '1e3', '.5', '−3'];

/** One edit: a new text, possibly reached through several keystrokes (each one an update). */
type Edit = { name: string; texts: string[] };

function edit(text: string, d: Dice, history: readonly string[]): Edit {
  const lines = toLines(text);
  const n = lines.length;
  const at = d.int(n + 1);
  const eol = d.pick(EOLS);
  const one = (name: string): Edit => ({ name, texts: [join(lines)] });
  switch (d.int(22)) {
    case 0: insertLine(lines, at, d.pick(BODY_LINES), eol); return one('insert a line');
    case 1: if (n > 1) removeLine(lines, d.int(n)); return one('delete a line');
    case 2: { // change a number somewhere
      const k = indexWhere(lines, (l) => /\d/.test(l.text), d);
      if (k < 0) return one('no number to change');
      const matches = [...lines[k]!.text.matchAll(/\d+(\.\d+)?/g)];
      const m = d.pick(matches);
      lines[k]!.text = lines[k]!.text.slice(0, m.index) + d.pick(NUMBERS) + lines[k]!.text.slice(m.index + m[0].length);
      return one('change a value');
    }
    case 3: insertLine(lines, at, d.pick(TIMEPOINT_LINES), eol); return one('add a timepoint');
    case 4: { const k = indexWhere(lines, (l) => l.text.startsWith('@'), d); if (k >= 0) removeLine(lines, k); return one('remove a timepoint'); }
    case 5: { // move a header line after the first timepoint, or back before it
      const h = indexWhere(lines, (l) => /^(patient|place|units|pt|site)\b/.test(l.text), d);
      const first = lines.findIndex((l) => l.text.startsWith('@'));
      if (h < 0 || first < 0) return one('no header line to move');
      const [moved] = lines.splice(h, 1);
      if (moved!.eol === '') moved!.eol = '\n';
      const target = h < first ? first : 0; // after the first `@` (its index moved up by one), or to the top
      lines.splice(Math.min(target, lines.length), 0, moved!);
      lines[lines.length - 1]!.eol = '';
      return one('move a header line');
    }
    case 6: { // toggle `units gas kPa`
      const k = indexWhere(lines, (l) => l.text.startsWith('units'), d);
      if (k >= 0 && d.chance(0.5)) removeLine(lines, k);
      else if (k >= 0) lines[k]!.text = lines[k]!.text.includes('kPa') ? 'units gas mmHg' : 'units     gas kPa';
      else insertLine(lines, d.chance(0.7) ? 0 : at, 'units gas kPa', eol);
      return one('toggle the gas unit');
    }
    case 7: { // edit a carried setting: the first vent or oxygen line
      const k = lines.findIndex((l) => /^(vent|oxygen)\b/.test(l.text));
      if (k < 0) { insertLine(lines, at, 'vent      mode VC, vt 450 mL, peep 8, fio2 0.5', eol); return one('add a setting'); }
      const options = ['vent      peep 16, fio2 0.9', 'vent      mode PS, peep 5', 'oxygen    room air', 'oxygen    cannula 3', 'vent      fio2 45 %', `${lines[k]!.text} vt 380`];
      lines[k]!.text = d.pick(options);
      return one('edit a carried setting');
    }
    case 8: { // the patient line that predicted body weight depends on
      const k = lines.findIndex((l) => /^(patient|pt)\b/.test(l.text));
      const sex = d.pick(['female', 'male', 'f', 'm', 'other', '']);
      const height = d.pick(['163 cm', '185 cm', '1.52 m', '70 in', '5 ft', '10 cm', '400', '']);
      const text2 = `patient   age ${d.pick(['64 y', '8 mo', '200 y', '45'])}${sex ? `, sex ${sex}` : ''}${height ? `, height ${height}` : ''}`;
      if (k >= 0) lines[k]!.text = text2; else insertLine(lines, 0, text2, eol);
      return one('change the patient line');
    }
    case 9: { // the place
      const k = indexWhere(lines, (l) => /^(place|site)\b/.test(l.text), d);
      const text2 = d.pick(['place     altitude 3000 m', 'place     altitude 0 m', 'place     altitude 12000 ft', 'place     barometric 500', 'place     pb 90 kPa', 'place', 'place     altitude -600 m']);
      if (k >= 0 && d.chance(0.2)) removeLine(lines, k);
      else if (k >= 0) lines[k]!.text = text2;
      else insertLine(lines, at, text2, eol);
      return one('change the place');
    }
    case 10: { // paste a block
      const block = toLines(d.pick(PASTE_BLOCKS));
      block[block.length - 1]!.eol = block.length > 0 && at < n ? eol : '';
      if (at >= n) { if (lines[n - 1]!.eol === '') lines[n - 1]!.eol = eol; lines.push(...block); lines[lines.length - 1]!.eol = ''; }
      else lines.splice(at, 0, ...block);
      return one('paste a block');
    }
    case 11: return { name: 'delete everything', texts: [''] };
    case 12: { // mix line ends
      if (d.chance(0.3)) return { name: 'convert line ends', texts: [join(lines.map((l) => ({ text: l.text, eol: l.eol === '' ? '' : eol })))] };
      const k = d.int(n);
      if (lines[k]!.eol !== '') lines[k]!.eol = eol;
      return one('change a line end');
    }
    case 13: insertLine(lines, at, '@', eol); return one('a line of only @');
    case 14: case 15: case 16: { // type a line a character at a time, at the start, middle or end of a line
      const k = d.int(n);
      const typed = d.chance(0.5) ? d.pick(BODY_LINES) : d.pick(TIMEPOINT_LINES);
      const where = d.chance(0.5) ? lines[k]!.text.length : d.int(lines[k]!.text.length + 1);
      const before = join(lines.slice(0, k));
      const line = lines[k]!;
      const after = join(lines.slice(k + 1));
      const prefix = line.text.slice(0, where);
      const suffix = line.text.slice(where);
      const lead = where === 0 && line.text.length > 0 ? eol : '';
      const texts: string[] = [];
      // A new line first (Enter), then the characters one by one.
      const newline = where === line.text.length ? eol : lead;
      for (let c = 0; c <= typed.length; c++) {
        const typedSoFar = typed.slice(0, c);
        texts.push(where === line.text.length
          ? `${before}${line.text}${newline}${typedSoFar}${line.eol}${after}`
          : `${before}${prefix}${typedSoFar}${newline}${suffix}${line.eol}${after}`);
      }
      return { name: 'type a line', texts };
    }
    case 17: { // backspace a few characters at a time, across line ends too
      const texts: string[] = [];
      let t = text;
      let pos = d.int(t.length + 1);
      const count = 1 + d.int(12);
      for (let c = 0; c < count && pos > 0; c++) { t = t.slice(0, pos - 1) + t.slice(pos); pos--; texts.push(t); }
      return { name: 'backspace', texts: texts.length > 0 ? texts : [t] };
    }
    case 18: { // cut a random stretch
      const a = d.int(text.length + 1);
      const b = Math.min(text.length, a + d.int(200));
      return { name: 'cut a stretch', texts: [text.slice(0, a) + text.slice(b)] };
    }
    case 19: // undo: back to an earlier version
      return { name: 'undo', texts: [history.length > 0 ? d.pick(history) : text] };
    case 20: { // duplicate a timepoint's block (copy and paste of a whole timepoint)
      const k = indexWhere(lines, (l) => l.text.startsWith('@'), d);
      if (k < 0) return one('no timepoint to copy');
      let end = k + 1;
      while (end < n && !lines[end]!.text.startsWith('@')) end++;
      const copy = lines.slice(k, end).map((l) => ({ text: l.text, eol: l.eol === '' ? eol : l.eol }));
      lines.splice(end, 0, ...copy);
      lines[lines.length - 1]!.eol = '';
      return one('copy a timepoint');
    }
    default: { // a character typed or removed in the middle of a word
      const k = d.int(n);
      const l = lines[k]!;
      const p = d.int(l.text.length + 1);
      l.text = d.chance(0.5) ? l.text.slice(0, p) + d.pick(['x', ' ', ',', '/', '.', '#', '%', '0', 'é', '\u00a0', '\t', '\u0000', '\ud800', '@', '\r']) + l.text.slice(p) : l.text.slice(0, p) + l.text.slice(p + 1);
      return one('a keystroke');
    }
  }
}

// ---- settings ------------------------------------------------------------------------------

const SETTINGS: readonly Partial<Settings>[] = [
  {},
  { gasUnit: 'kPa' },
  { hypoxaemiaBelowMmhg: 80, hypercapniaAboveMmhg: 45, hypocapniaBelowMmhg: 38 },
  { disabledChecks: ['PN410', 'acid-base-reading', 'PN105'] },
  { privacyChecks: false },
  { alveolarEquation: 'full', respiratoryQuotient: 1, waterVapour: 'body-temperature' },
  { barometricModel: 'standard', aaGradientRule: 'mellemgaard', hufnerConstant: 1.39 },
  { gasUnit: 'kPa', disabledChecks: ['PN204'], hypoxaemiaBelowMmhg: 40 },
];

/** Updates compared with a fresh analysis so far (printed after a local stress run). */
let compared = 0;

/** Runs one seeded sequence; returns a description of the first difference, or null. */
function runSequence(seed: number, edits: number): string | null {
  const d = new Dice(rng(seed));
  let settings = d.pick(SETTINGS);
  const session = new NoteSession(settings);
  let text = d.pick(STARTS);
  const history: string[] = [];
  const log: string[] = [];
  const compare = (what: string): string | null => {
    compared++;
    const got = snapshot(session.update(text));
    const fresh = snapshot(checkNote(text, settings));
    if (sameAsJson(got, fresh)) return null;
    try {
      expect(got).toEqual(fresh);
    } catch (error) {
      return `seed ${seed}, after ${[...log, what].join(' → ')}\ntext: ${JSON.stringify(text)}\n${error instanceof Error ? error.message.slice(0, 3000) : String(error)}`;
    }
    return null;
  };
  const first = compare('open');
  if (first) return first;
  for (let e = 0; e < edits; e++) {
    if (d.chance(0.05)) {
      // A change of settings between two updates (the editor's or pneumark.config.json).
      settings = d.pick(SETTINGS);
      session.setSettings(settings);
      log.push('settings');
      const failed = compare('settings');
      if (failed) return failed;
      continue;
    }
    const step = edit(text, d, history);
    log.push(step.name);
    if (log.length > 12) log.shift();
    for (const t of step.texts) {
      history.push(text);
      if (history.length > 20) history.shift();
      text = t;
      // Fast typing: not every keystroke is analysed (the server debounces), but many are.
      if (step.texts.length > 1 && t !== step.texts[step.texts.length - 1] && d.chance(0.5)) continue;
      const failed = compare(step.name);
      if (failed) return failed;
    }
    // A request may read the result in steps (a big paste), cut short by the next edit.
    if (d.chance(0.1)) {
      const steps = session.steps(text, 1 + d.int(8));
      for (let k = d.int(4); k > 0; k--) if (steps.next().done) break;
    }
  }
  return null;
}

describe('NoteSession under long random edit sequences', () => {
  // A local stress run may take long on a small machine: about a second per edit is allowed.
  const timeout = Math.max(600_000, SESSION_RUNS * EDITS * 1000);
  it(`gives what a fresh analysis gives after every edit (${SESSION_RUNS} seeded sequences of ${EDITS} edits)`, { timeout }, () => {
    const started = performance.now();
    const failures: string[] = [];
    for (let r = 0; r < SESSION_RUNS && failures.length === 0; r++) {
      const failed = runSequence(FIRST_SEED + r, EDITS);
      if (failed) failures.push(failed);
    }
    if (process.env.SESSION_RUNS) console.log(`session stress: seeds ${FIRST_SEED}–${FIRST_SEED + SESSION_RUNS - 1}, ${compared} updates compared in ${Math.round((performance.now() - started) / 1000)} s`);
    expect(failures).toEqual([]);
  });
});

describe('NoteSession while a line is typed into a big note', () => {
  it('reads only the line typed and keeps every other timepoint, keystroke after keystroke', { timeout: 120_000 }, () => {
    const note = generateNote(300, 5); // about 1,500 lines, 300 timepoints
    const session = new NoteSession();
    session.update(note);
    // A new line after a vitals line in the middle of the note (Enter), then typed a character at a time.
    const at = note.indexOf('\n', note.indexOf('vitals', note.length >> 1)) + 1;
    let text = `${note.slice(0, at)}\n${note.slice(at)}`;
    session.update(text);
    const typed = 'labs      na 139, k 4.1, cl 101';
    for (let c = 1; c <= typed.length; c++) {
      text = `${note.slice(0, at)}${typed.slice(0, c)}\n${note.slice(at)}`;
      const got = session.update(text);
      // The line typed, and the line before it when the edit touches its terminator.
      expect(session.stats.parsedLines).toBeLessThanOrEqual(2);
      expect(session.stats.reusedTimepoints).toBe(session.stats.timepoints - 1);
      expect(sameAsJson(got.findings, checkNote(text).findings)).toBe(true);
    }
    const a = snapshot(session.update(text));
    const b = snapshot(checkNote(text));
    if (!sameAsJson(a, b)) expect(a).toEqual(b);
  });
});
