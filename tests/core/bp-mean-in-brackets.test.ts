// A blood pressure with its measured mean in brackets (`bp 120/80 (93)`) is a common way of writing
// it on a monitor or a chart. It used to be a syntax error (`(93)` reported as stray text, PN105)
// and the measured mean was lost. The bracketed number is read as the measured mean arterial
// pressure (`mean_bp`, mmHg), as `bp 120/80, map 93` would be on a vitals line.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { formatNote, hoverAt } from '../../server/src/core/service';
import { parseNote } from '../../server/src/core/syntax/parser';
import type { SectionLine } from '../../server/src/core/syntax/tree';
import { noteAt } from '../service/cursor';
import { NoteSession } from '../../server/src/core/session';
import { sameAsJson, snapshot } from './session-snapshot';

const valuesOf = (text: string) => checkNote(text).analysis.timeline.timepoints[0]!.values;

describe('a blood pressure with its mean in brackets', () => {
  it('reads the bracketed number as the measured mean arterial pressure, with no finding', () => {
    const text = '@ 08:00\nvitals bp 120/80 (93), hr 80';
    expect(checkNote(text).findings).toEqual([]);
    const values = valuesOf(text);
    expect(values.get('mean_bp')?.stated.value).toBe(93);
    expect(values.get('bp')?.stated.usable).toBe(true);
    expect(values.get('hr')?.stated.value).toBe(80);
  });

  it('reads as `bp 120/80, map 93` does: the same values, the same derived values', () => {
    const bracketed = checkNote('@ 08:00\nvitals bp 120/80 (93) mmHg, spo2 95');
    const written = checkNote('@ 08:00\nvitals bp 120/80 mmHg, map 93, spo2 95');
    expect(bracketed.analysis.timeline.timepoints[0]!.values.get('mean_bp')?.stated.value).toBe(93);
    const derived = (r: typeof bracketed) => r.analysis.derivation(0).derived.map((d) => [d.id, d.value]);
    expect(derived(bracketed)).toEqual(derived(written));
  });

  it('keeps the span of the number inside the brackets, with the key implied by its place', () => {
    const line = parseNote('vitals bp 120/80mmHg (93)').lines[0] as SectionLine;
    const mean = line.items[1]!;
    expect(mean.key).toBeNull();
    expect(mean.implied).toBe('bracketed-mean');
    expect(mean.field?.id).toBe('mean_bp');
    expect(mean.value?.text).toBe('93');
    expect(mean.span).toMatchObject({ start: 22, end: 24 });
    expect(line.issues).toEqual([]);
  });

  it('checks the mean like any other value (an impossible one is reported)', () => {
    expect(checkNote('@ 08:00\nvitals bp 120/80 (930)').findings.map((f) => f.code)).toContain('PN301');
  });

  it('is not read after anything but a blood pressure, nor after a comma', () => {
    expect(checkNote('@ 08:00\nvitals hr 80 (93)').findings.map((f) => f.code)).toEqual(['PN105']);
    expect(checkNote('@ 08:00\nvitals bp 120/80, (93)').findings.map((f) => f.code)).toEqual(['PN105']);
    expect(valuesOf('@ 08:00\nvitals bp 120/80, (93)').get('mean_bp')).toBeUndefined();
  });

  it('is laid out by the formatter and kept as written (idempotent)', () => {
    const once = formatNote('vitals  bp 120/80   (93)  hr 80');
    expect(once).toBe('vitals    bp 120/80 (93), hr 80');
    expect(formatNote(once)).toBe(once);
    expect(formatNote('vitals bp 120 / 80 mmHg (93),hr 80')).toBe('vitals    bp 120 / 80 mmHg (93), hr 80');
  });
});

describe('hover on the mean in brackets', () => {
  it('names the measured mean arterial pressure and where it is written', () => {
    const { result, position } = noteAt('@ 08:00\nvitals bp 120/80 (9|3)');
    const md = hoverAt(result, position)?.markdown ?? '';
    expect(md).toContain('**Mean arterial pressure** — the number in brackets after the blood pressure on this `vitals` line');
    expect(md).toContain('93');
  });
});

// The same mean as people also write it: a unit inside the brackets (`(93 mmHg)`), no blank before
// the bracket (`120/80(93)`), blanks inside it (`( 93 )`). These used to be syntax errors (PN105
// stray text, PN201 an unknown key `mmHg)`, PN102 a blood pressure with no value) and the mean, and
// with `120/80(93)` the blood pressure too, were lost.
const meanLine = (text: string) => parseNote(text).lines[0] as SectionLine;
const codesOf = (text: string) => checkNote(`@ 08:00\n${text}`).findings.map((f) => f.code);

describe('the mean in brackets, written with a unit, glued or with blanks', () => {
  it.each([
    ['vitals bp 120/80 (93 mmHg) hr 80'],
    ['vitals bp 120/80 (93mmHg), hr 80'],
    ['vitals bp 120/80(93), hr 80'],
    ['vitals bp 120/80 mmHg (93 mmHg) hr 80'],
    ['vitals bp 120/80mmHg(93) hr 80'],
    ['vitals bp 120/80 mmHg(93) hr 80'],
    ['vitals bp 120 / 80(93) hr 80'],
    ['vitals bp 120/80 ( 93 ), hr 80'],
    ['vitals bp 120/80 ( 93 mm Hg ) hr 80'],
    // The bracket glued to the second word of a unit of two words.
    ['vitals bp 120/80 mm Hg(93) hr 80'],
    ['vitals bp 120/80mm Hg(93), hr 80'],
    ['vitals bp 120 / 80 mm Hg(93 mmHg) hr 80'],
  ])('`%s` reads as `bp 120/80 (93)`: the mean, the pressure and what follows, with no finding', (line) => {
    const text = `@ 08:00\n${line}`;
    expect(checkNote(text).findings).toEqual([]);
    const values = valuesOf(text);
    expect(values.get('mean_bp')?.stated.value).toBe(93);
    expect(values.get('mean_bp')?.stated.usable).toBe(true);
    expect(values.get('bp')?.stated.usable).toBe(true);
    expect(values.get('hr')?.stated.value).toBe(80);
    const derived = (t: string) => checkNote(t).analysis.derivation(0).derived.map((d) => [d.id, d.value]);
    expect(derived(text)).toEqual(derived('@ 08:00\nvitals bp 120/80, map 93, hr 80'));
  });

  it('gives the mean its value range on the number and its unit range on the unit inside the brackets', () => {
    const line = meanLine('vitals bp 120/80 (93 mmHg) hr 80');
    expect(line.issues).toEqual([]);
    const [bp, mean, hr] = line.items;
    expect(bp!.value?.span).toMatchObject({ start: 10, end: 16 });
    expect(bp!.unit).toBeNull();
    expect(mean!.implied).toBe('bracketed-mean');
    expect(mean!.field?.id).toBe('mean_bp');
    expect(mean!.value?.span).toMatchObject({ start: 18, end: 20 });
    expect(mean!.unit?.text).toBe('mmHg');
    expect(mean!.unit?.span).toMatchObject({ start: 21, end: 25 });
    expect(hr!.keyName).toBe('hr');
  });

  it('cuts the pair or its unit where a glued bracket starts', () => {
    const glued = meanLine('vitals bp 120/80(93)');
    expect(glued.issues).toEqual([]);
    expect(glued.items[0]!.value?.span).toMatchObject({ start: 10, end: 16 });
    expect(glued.items[0]!.unit).toBeNull();
    expect(glued.items[1]!.value?.span).toMatchObject({ start: 17, end: 19 });
    const unit = meanLine('vitals bp 120/80mmHg(93)');
    expect(unit.items[0]!.unit?.text).toBe('mmHg');
    expect(unit.items[0]!.unit?.span).toMatchObject({ start: 16, end: 20 });
    expect(unit.items[1]!.value?.span).toMatchObject({ start: 21, end: 23 });
    const word = meanLine('vitals bp 120/80 mmHg(93)');
    expect(word.items[0]!.unit?.span).toMatchObject({ start: 17, end: 21 });
    expect(word.items[1]!.value?.span).toMatchObject({ start: 22, end: 24 });
  });

  it('reads blanks inside the brackets as nothing', () => {
    const line = meanLine('vitals bp 120/80 (  93  mmHg )');
    expect(line.issues).toEqual([]);
    expect(line.items[1]!.value?.span).toMatchObject({ start: 20, end: 22 });
    expect(line.items[1]!.unit?.span).toMatchObject({ start: 24, end: 28 });
  });

  it('reports a unit other than mmHg inside the brackets as a wrong unit of the mean, naming mmHg, and does not use it', () => {
    const text = '@ 08:00\nvitals bp 120/80 (12 kPa) hr 80';
    const findings = checkNote(text).findings;
    expect(findings.map((f) => f.code)).toEqual(['PN203']);
    expect(findings[0]!.message).toContain('mmHg');
    expect(findings[0]!.range).toMatchObject({ start: { line: 1, character: 21 }, end: { line: 1, character: 24 } });
    expect(valuesOf(text).get('mean_bp')?.stated.usable).toBe(false);
    expect(valuesOf(text).get('hr')?.stated.value).toBe(80);
    // The same finding as the mean written with its key.
    expect(codesOf('vitals map 12 kPa')).toEqual(['PN203']);
  });

  it('reports a bracket that is not closed, says what is missing, and reads on after it', () => {
    for (const [line, written] of [['vitals bp 120/80 (93', '(93'], ['vitals bp 120/80 (93 mmHg, hr 80', '(93 mmHg'], ['vitals bp 120/80(93 hr 80', '(93']] as const) {
      const result = checkNote(`@ 08:00\n${line}`);
      expect(result.findings.map((f) => f.code), line).toEqual(['PN105']);
      expect(result.findings[0]!.message).toContain(`\`${written}\``);
      expect(result.findings[0]!.message).toContain('closing bracket');
      const values = result.analysis.timeline.timepoints[0]!.values;
      expect(values.get('mean_bp'), line).toBeUndefined();
      expect(values.get('bp')?.stated.usable, line).toBe(true);
      if (line.includes('hr')) expect(values.get('hr')?.stated.value, line).toBe(80);
    }
    const span = checkNote('@ 08:00\nvitals bp 120/80 (93 mmHg, hr 80').findings[0]!.range;
    expect(span).toMatchObject({ start: { character: 17 }, end: { character: 25 } });
  });

  it('offers to close an unclosed bracket, which then reads as the mean', () => {
    const text = 'vitals bp 120/80 (93 mmHg, hr 80';
    const [issue] = meanLine(text).issues;
    const edit = issue!.fixes[0]!.edits[0]!;
    const fixed = text.slice(0, edit.span.start) + edit.newText + text.slice(edit.span.end);
    expect(fixed).toBe('vitals bp 120/80 (93 mmHg), hr 80');
    expect(meanLine(fixed).issues).toEqual([]);
    expect(valuesOf(`@ 08:00\n${fixed}`).get('mean_bp')?.stated.value).toBe(93);
  });

  it('keeps brackets after anything but a blood pressure an error that says they follow a blood pressure only', () => {
    for (const line of ['vitals hr 80 (93)', 'vitals hr 80 (93 mmHg)', 'vitals bp 120/80, (93)', 'vitals hr 80 ( 93 )', 'vitals (93)']) {
      const result = checkNote(`@ 08:00\n${line}`);
      expect(result.findings.map((f) => f.code), line).toEqual(['PN105']);
      expect(result.findings[0]!.message, line).toContain('only right after a blood pressure');
      expect(result.analysis.timeline.timepoints[0]!.values.get('mean_bp'), line).toBeUndefined();
    }
    // The whole bracket is the one finding's range (not `(93` and an unknown key `mmHg)`).
    expect(checkNote('@ 08:00\nvitals hr 80 (93 mmHg)').findings[0]!.range).toMatchObject({ start: { character: 13 }, end: { character: 22 } });
    // Glued to a value that is no blood pressure, the bracket is what is glued to any number: its
    // unit, here one Pneumark does not know (PN202), as before.
    expect(codesOf('vitals hr 80(93)')).toEqual(['PN202']);
    // Punctuation in brackets that holds no number stays the stray text it was.
    expect(checkNote('@ 08:00\nvitals hr 80 (sitting)').findings[0]!.message).toContain('is not a key');
  });

  it('is formatted with one blank before the bracket and none inside it, never changing the value or the unit', () => {
    const cases: [string, string][] = [
      ['vitals bp 120/80(93) hr 80', 'vitals    bp 120/80 (93), hr 80'],
      ['vitals bp 120/80 (93 mmHg) hr 80', 'vitals    bp 120/80 (93 mmHg), hr 80'],
      ['vitals bp 120/80 (  93   mmHg )', 'vitals    bp 120/80 (93 mmHg)'],
      ['vitals bp 120/80mmHg(93)', 'vitals    bp 120/80 mmHg (93)'],
      ['vitals bp 120/80 (93mmHg)', 'vitals    bp 120/80 (93 mmHg)'],
      ['vitals bp 120/80 ( 93 mm  Hg )', 'vitals    bp 120/80 (93 mm Hg)'],
      ['vitals bp 120/80 ( 12 kPa )', 'vitals    bp 120/80 (12 kPa)'],
    ];
    for (const [written, formatted] of cases) {
      const once = formatNote(written);
      expect(once, written).toBe(formatted);
      expect(formatNote(once), written).toBe(once);
      const item = (t: string) => meanLine(t).items[1]!;
      expect([item(once).value?.text, item(once).unit?.text ?? null]).toEqual([item(written).value?.text, item(written).unit?.text.replace(/\s+/gu, ' ') ?? null]);
    }
    // An unclosed bracket is left as written.
    expect(formatNote('vitals bp 120/80 (93')).toBe('vitals bp 120/80 (93');
  });

  it('cuts a unit of two words where a bracket is glued to its second word, and lays it out with one blank before the bracket', () => {
    const line = meanLine('vitals bp 120/80 mm Hg(93)');
    expect(line.issues).toEqual([]);
    expect(line.items[0]!.unit?.text).toBe('mm Hg');
    expect(line.items[0]!.unit?.span).toMatchObject({ start: 17, end: 22 });
    expect(line.items[1]!.value?.span).toMatchObject({ start: 23, end: 25 });
    const once = formatNote('vitals bp 120/80 mm Hg(93)');
    expect(once).toBe('vitals    bp 120/80 mm Hg (93)');
    expect(formatNote(once)).toBe(once);
  });

  it('reports a bracket with something glued after its `)` as one finding on the whole word; the pressure and what follows are read', () => {
    for (const [line, written] of [
      ['vitals bp 120/80 (93)x, hr 80', '(93)x'],
      ['vitals bp 120/80(93)x hr 80', '(93)x'],
      ['vitals bp 120/80 (93 mmHg)x, hr 80', '(93 mmHg)x'],
      ['vitals bp 120/80 mmHg(93)x, hr 80', '(93)x'],
      ['vitals bp 120/80 mm Hg(93)x, hr 80', '(93)x'],
      ['vitals bp 120/80 (93)(94), hr 80', '(93)(94)'],
    ] as const) {
      const result = checkNote(`@ 08:00\n${line}`);
      expect(result.findings.map((f) => f.code), line).toEqual(['PN105']);
      const [finding] = result.findings;
      const start = line.indexOf(written);
      expect(finding!.range, line).toMatchObject({ start: { character: start }, end: { character: start + written.length } });
      expect(finding!.message, line).toContain(`\`${written}\` is not read`);
      expect(finding!.message, line).toContain('glued');
      const values = result.analysis.timeline.timepoints[0]!.values;
      expect(values.get('mean_bp'), line).toBeUndefined();
      expect(values.get('bp')?.stated.usable, line).toBe(true);
      expect(values.get('hr')?.stated.value, line).toBe(80);
    }
    // After a value that is no blood pressure, it says where brackets are read, as a closed one does.
    const [after] = checkNote('@ 08:00\nvitals hr 80 (93)x').findings;
    expect([after?.code, after?.message.includes('only right after a blood pressure')]).toEqual(['PN105', true]);
  });
});

describe('hover on the mean in brackets written with a unit', () => {
  it('names the mean on its number and on its unit inside the brackets', () => {
    for (const marked of ['@ 08:00\nvitals bp 120/80 (9|3 mmHg)', '@ 08:00\nvitals bp 120/80 (93 mm|Hg)', '@ 08:00\nvitals bp 120/80(9|3)']) {
      const { result, position } = noteAt(marked);
      const md = hoverAt(result, position)?.markdown ?? '';
      expect(md, marked).toContain('**Mean arterial pressure** — the number in brackets after the blood pressure');
      expect(md, marked).toContain('93');
    }
  });
});

describe('an editing session with edits inside the brackets', () => {
  it('gives what a fresh analysis gives after each keystroke inside and around the brackets', () => {
    const session = new NoteSession({});
    const head = '@ 08:00\nvitals bp 120/80';
    const tail = ' hr 80\n@ 09:00\nvitals spo2 95';
    // Typed one character at a time, then the bracket's content changed and the bracket removed.
    const typed = '(93 mmHg)';
    const texts: string[] = [];
    for (let c = 0; c <= typed.length; c++) texts.push(`${head}${typed.slice(0, c)}${tail}`, `${head} ${typed.slice(0, c)}${tail}`);
    texts.push(`${head} (12 kPa)${tail}`, `${head} ( 93 )${tail}`, `${head} (9${tail}`, `${head}(93)${tail}`, `${head} ${tail}`);
    // A unit of two words with the bracket glued to it, and more glued after the bracket, typed.
    for (const more of [' mm Hg(93)x', '(93)(94)']) for (let c = 0; c <= more.length; c++) texts.push(`${head}${more.slice(0, c)}${tail}`);
    for (const text of texts) {
      const got = snapshot(session.update(text));
      const fresh = snapshot(checkNote(text));
      if (!sameAsJson(got, fresh)) expect(got, text).toEqual(fresh);
    }
  });
});
