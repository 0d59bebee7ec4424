// Hostile text at the core's API (checkNote and an editing session): a 20 MB note, lines of a
// megabyte, 100,000 timepoints, NUL bytes, lone surrogates, a note of carriage returns only,
// commas and slashes repeated without end. None may throw or report an internal error (PN900);
// every range must lie in the text, every number be finite, every message readable; and an edit
// in an open session must give what a fresh analysis gives. Timings are not asserted (they are
// printed by nothing here: see the session report for figures on the reference machine).
import { describe, expect, it } from 'vitest';
import { checkNote, type NoteResult } from '../../server/src/core/check-note';
import { NoteSession } from '../../server/src/core/session';
import type { Range } from '../../server/src/core/types';
import { sameAsJson, snapshot } from '../core/session-snapshot';

/** The text of each line, split as the format splits lines (`\n`, `\r\n`, `\r`). */
function linesOf(text: string): string[] {
  return text.split(/\r\n|\r|\n/);
}

function rangeInText(range: Range, lines: readonly string[]): boolean {
  const { start, end } = range;
  return start.line >= 0 && end.line < lines.length && (start.line < end.line || (start.line === end.line && start.character <= end.character)) &&
    start.character >= 0 && start.character <= lines[start.line]!.length && end.character <= lines[end.line]!.length;
}

const finiteOrNull = (n: number | null) => n === null || Number.isFinite(n);

/** What must hold of any analysis, whatever the text. */
function expectSane(text: string, r: NoteResult): void {
  const lines = linesOf(text);
  expect(r.analysis.tree.lines.length).toBe(lines.length);
  const internal = r.findings.filter((f) => f.code === 'PN900');
  expect(internal).toEqual([]);
  const bad: string[] = [];
  for (const f of r.findings) {
    if (!rangeInText(f.range, lines)) bad.push(`${f.code} range ${JSON.stringify(f.range)}`);
    if (f.message.length === 0 || /\b(NaN|undefined|Infinity)\b/.test(f.message)) bad.push(`${f.code} message ${f.message.slice(0, 200)}`);
    for (const fix of f.fixes) for (const e of fix.edits) if (!rangeInText(e.range, lines)) bad.push(`${f.code} fix range ${JSON.stringify(e.range)}`);
    if (bad.length > 5) break;
  }
  for (const tp of r.analysis.timeline.timepoints) {
    if (!finiteOrNull(tp.time.day) || !finiteOrNull(tp.time.minutes) || !finiteOrNull(tp.barometricMmhg)) bad.push(`timepoint ${tp.index} time ${JSON.stringify(tp.time)} PB ${tp.barometricMmhg}`);
    if (tp.startLine < 0 || tp.endLine >= lines.length || tp.startLine > tp.endLine + 1) bad.push(`timepoint ${tp.index} lines ${tp.startLine}–${tp.endLine}`);
    for (const s of tp.stated) if (!finiteOrNull(s.value) || (s.parts ?? []).some((p) => !Number.isFinite(p))) bad.push(`timepoint ${tp.index} ${s.fieldId} ${s.value}`);
    if (bad.length > 5) break;
  }
  expect(bad).toEqual([]);
}

/** An open session reads `text`, then an edit in its middle; the edit gives what a fresh analysis gives. */
function expectSessionAgrees(text: string, insert = 'x', compareAll = true): void {
  const session = new NoteSession();
  expectSane(text, session.update(text));
  const at = text.length >> 1;
  const edited = text.slice(0, at) + insert + text.slice(at);
  const got = session.update(edited);
  const fresh = checkNote(edited);
  expectSane(edited, got);
  if (compareAll) {
    const a = snapshot(got);
    const b = snapshot(fresh);
    if (!sameAsJson(a, b)) expect(a).toEqual(b);
  } else {
    expect(got.analysis.timeline.timepoints.length).toBe(fresh.analysis.timeline.timepoints.length);
    expect(sameAsJson(got.findings, fresh.findings)).toBe(true);
  }
}

const MB = 1 << 20;

describe('a 20 MB note', () => {
  it('is read whole, and an edit in an open session gives what a fresh analysis gives', { timeout: 300_000 }, () => {
    // Invented: an hourly record with long remarks and comments (about 1.2 KB a timepoint).
    const block = (i: number) => `@ +1h  hour ${i}\nvitals    hr ${60 + (i % 50)}, rr 18, spo2 95 %\nnote      ${'settled overnight, turned two-hourly, family updated by phone; '.repeat(14)}\n# ${'x'.repeat(300)}\n`;
    const parts = ['patient   age 61 y, sex male, height 176 cm\n'];
    let length = parts[0]!.length;
    for (let i = 0; length < 20 * MB; i++) { const b = block(i); parts.push(b); length += b.length; }
    const text = parts.join('');
    const r = checkNote(text);
    expectSane(text, r);
    expect(r.analysis.timeline.timepoints.length).toBe(parts.length - 1);
    expectSessionAgrees(text, '9', false);
  });
});

describe('lines of a megabyte', () => {
  const LINES: readonly [string, string][] = [
    ['one word', 'a'.repeat(MB)],
    ['note prose', `note ${'word '.repeat(MB / 5)}`],
    ['a comment', '#'.repeat(MB)],
    ['blanks', ' '.repeat(MB)],
    ['no-break spaces inside a line', `vitals${'\u00a0'.repeat(MB)}hr 80`],
    ['a timepoint label', `@ 08:00 ${'x'.repeat(MB)}`],
    ['@ repeated', '@'.repeat(MB)],
    ['a number of a million digits', `vitals hr ${'9'.repeat(MB)}`],
    ['a day of a million digits', `@ day ${'9'.repeat(MB)}`],
    ['full stops', `vitals hr ${'.'.repeat(MB)}`],
    ['minus signs', `vitals hr ${'-'.repeat(MB)}`],
    ['commas after a section word', `vitals ${','.repeat(MB)}`],
    ['a line of commas', ','.repeat(MB)],
    ['slashes after abg', `abg ${'/'.repeat(MB)}`],
    ['spaced slashes', `abg ${'/ '.repeat(MB / 2)}`],
    ['a shorthand gas of 250,000 parts', `abg 7.3${'/7.3'.repeat(MB / 4)}`],
    ['a pair of 500,000 parts', `vitals bp ${'1/'.repeat(MB / 2)}`],
    ['decimal commas', `abg ph ${'7,3'.repeat(MB / 3)}`],
    ['digits in other scripts', `vitals hr ${'٣'.repeat(MB)}`],
    ['a privacy cue repeated', `note ${'MR SMITH '.repeat(MB / 9)}`],
  ];
  for (const [name, line] of LINES) {
    it(`${name}: read without an error, also after an edit in a session`, { timeout: 120_000 }, () => {
      const text = `@ 08:00\n${line}\nvitals hr 80\n`;
      const r = checkNote(text);
      expectSane(text, r);
      // The lines around it are read as usual.
      expect(r.analysis.tree.lines[2]!.kind).toBe('section');
      expectSessionAgrees(text);
    });
  }
});

describe('100,000 timepoints', () => {
  it('one minute apart: every one read, the last at minute 100,000', { timeout: 300_000 }, () => {
    const text = '@ +1m\nvitals hr 80\n'.repeat(100_000);
    const r = checkNote(text);
    expectSane(text, r);
    const timepoints = r.analysis.timeline.timepoints;
    expect(timepoints.length).toBe(100_000);
    expect(timepoints[99_999]!.time).toEqual({ day: Math.floor(100_000 / 1440) + 1, minutes: 100_000 });
    expectSessionAgrees(text, '0', false);
  });

  it('bare `@` lines: each one a timepoint without a time, each reported once', { timeout: 300_000 }, () => {
    const text = '@\n'.repeat(100_000);
    const r = checkNote(text);
    expectSane(text, r);
    expect(r.analysis.timeline.timepoints.length).toBe(100_000);
    expect(r.findings.filter((f) => f.code === 'PN104').length).toBe(100_000);
    expectSessionAgrees(text, ' 08:00\n', false);
  });
});

describe('control characters and broken UTF-16', () => {
  it('NUL bytes in keys, values, times, labels and a megabyte of them', () => {
    const text = `patient age\u000060\n@\u0000 08:00 \u0000label\nvitals hr\u000080, rr 1\u00008\nabg 7.4\u0000/40/90\n\u0000vitals hr 80\n${'\u0000'.repeat(MB)}\n@ 09:00\nvitals hr 81`;
    const r = checkNote(text);
    expectSane(text, r);
    expect(r.analysis.timeline.timepoints.at(-1)!.values.numberOf('hr')).toBe(81);
    expectSessionAgrees(text, '\u0000');
  });

  it('lone surrogates and reversed pairs anywhere', () => {
    const block = 'vitals h\ud800r 80 \udc00\n@ 08:00 \ud83d\nabg 7.4/40/90 mm\udfffHg\nnote \ud800\udc00\udc00\ud800\npatient sex \ud800\n\ud800 hr 9\nvitals hr 80 \ud83d\n';
    const text = block.repeat(300);
    const r = checkNote(text);
    expectSane(text, r);
    expectSessionAgrees(text, '\udc00');
    // A lone surrogate typed into a key, then its pair: each keystroke gives what a fresh analysis gives.
    const session = new NoteSession();
    let typed = '@ 08:00\nvitals hr 80\n';
    session.update(typed);
    for (const piece of ['\ud83d', '\ude00', ' rr 12', '\udfff']) {
      typed += piece;
      const a = snapshot(session.update(typed));
      const b = snapshot(checkNote(typed));
      if (!sameAsJson(a, b)) expect(a).toEqual(b);
    }
  });

  it('a note of carriage returns only (a million lines), and a note written with \\r line ends', { timeout: 120_000 }, () => {
    const crs = '\r'.repeat(MB);
    const r = checkNote(crs);
    expectSane(crs, r);
    expect(r.findings).toEqual([]);
    expectSessionAgrees(crs, '@ 08:00\rvitals hr 80\r', false);
    const old = 'patient   age 50 y, sex male, height 180 cm\r@ day 1 08:00\rvent      mode VC, vt 500 mL, peep 5, fio2 0.4\r@ 09:00\rabg 7.4/40/90/24\r';
    const o = checkNote(old);
    expectSane(old, o);
    expect(o.analysis.timeline.timepoints[1]!.values.originOf('peep')).toBe('carried');
    expectSessionAgrees(old, '\r\n');
  });

  it('\\r\\r\\n and \\n\\r line ends mixed, 300,000 times', { timeout: 120_000 }, () => {
    const text = '\r\r\n\n\r'.repeat(300_000);
    expectSane(text, checkNote(text));
    expectSessionAgrees(text, '\n', false);
  });
});

describe('commas and slashes repeated', () => {
  const CASES: readonly [string, string][] = [
    ['lines of commas', ',,,,,,,,\n'.repeat(20_000)],
    ['commas between every item', `@ 08:00\nvitals ${'hr 80,,,,,,,,, '.repeat(20_000)}`],
    ['slashes between numbers', `@ 08:00\nabg 7.3${'//////'.repeat(50_000)}40`],
    ['spaced slashes after every item', `@ 08:00\nvitals ${'hr 80 / '.repeat(50_000)}`],
    ['commas and slashes in a time', `@ 08:00${',/'.repeat(50_000)}\n@ +1h${'/,'.repeat(50_000)}`],
    ['commas as a label, on 20,000 timepoints', '@ +1h ,,,,,,\nvitals ,\n'.repeat(20_000)],
  ];
  for (const [name, text] of CASES) {
    it(`${name}: read without an error, also after an edit in a session`, { timeout: 120_000 }, () => {
      const r = checkNote(text);
      expectSane(text, r);
      expectSessionAgrees(text, ',', r.analysis.timeline.timepoints.length < 1000);
    });
  }
});

describe('numbers too large for a time', () => {
  // A day or an offset beyond day 100000 (about 270 years) is reported (PN104) and gives no time:
  // 400 digits once read as Infinity minutes with no finding, and 20 digits as a day that lost
  // its precision (day 100000000000000000000).
  const pn104 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN104');

  it('an offset of 400 digits gives no infinite time, and is reported', () => {
    const text = `@ +${'9'.repeat(400)}h\nvitals hr 80\n@ +1h\nvitals hr 81`;
    expectSane(text, checkNote(text));
    expect(pn104(text).map((f) => f.message)).toEqual([`\`+${'9'.repeat(400)}h\` is longer than a note can span (100000 days).`]);
    expect(checkNote(text).analysis.timeline.timepoints[0]!.time.minutes).toBeNull();
  });

  it('a day beyond day 100000 is reported, with its clock kept out of the label; day 100000 and an offset of 100000 days are read', () => {
    const text = '@ day 99999999999999999999 08:00  first look\nvitals hr 80';
    expect(pn104(text).map((f) => f.message)).toEqual(['`day 99999999999999999999` is beyond the last day a note can name (day 100000).']);
    expect(checkNote(text).analysis.timeline.timepoints[0]!.label).toBe('first look');
    expect(pn104('@ day 100000 08:00\nvitals hr 80')).toEqual([]);
    expect(pn104('@ +100000d\nvitals hr 80')).toEqual([]);
    expect(pn104('@ +100001d\nvitals hr 80')).toHaveLength(1);
    expect(pn104('@ +99999999999999999999h90\nvitals hr 80').map((f) => f.message)).toEqual(['`+99999999999999999999h90` is longer than a note can span (100000 days).']);
  });

  it('offsets and clock times past midnight that reach beyond day 100000 are reported, and give no time (they ran on to day 10,000,000,001)', () => {
    const text = `@ day 100000 23:59\nvitals hr 80\n${'@ +100000d\nvitals hr 81\n'.repeat(3)}@ day 100000 23:00\n@ 01:00\nvitals hr 82\n@ +1m\n`;
    const r = checkNote(text);
    expectSane(text, r);
    expect(pn104(text).map((f) => `${f.range.start.line + 1}: ${f.message}`)).toEqual([
      '3: `+100000d` takes this timepoint to day 200000, beyond what a note can span (100000 days from day 1); it has no time.',
      '5: `+100000d` takes this timepoint to day 200000, beyond what a note can span (100000 days from day 1); it has no time.',
      '7: `+100000d` takes this timepoint to day 200000, beyond what a note can span (100000 days from day 1); it has no time.',
      '10: `01:00` takes this timepoint to day 100001, beyond what a note can span (100000 days from day 1); it has no time.',
    ]);
    expect(r.analysis.timeline.timepoints.map((tp) => tp.time.day)).toEqual([100000, null, null, null, 100000, null, 100000]);
    expect(pn104('@ day 99999 23:00\n@ 01:00\n@ +1d\n@ +1m')).toHaveLength(1);
    expect(pn104('@ +100000d\n@ +1m')).toHaveLength(1);
    // An edit above them in an open session gives what a fresh analysis gives.
    expectSessionAgrees(text, '\n');
    expectSessionAgrees(text, '@ +1d\n');
  });
});
