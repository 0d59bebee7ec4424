// Invented notes typed a keystroke at a time through the session, as the language server reads
// them (tests/helpers/keystrokes.ts): what a person typing sees at each key.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { heldWhileTyping, typedItem } from '../../server/src/core/service/typing';
import { completionsAfter, flashes, hintsAfter, hoverAfter, shownWhileTyping, strokeAt, typeNote } from '../helpers/keystrokes';
import { TYPED_NOTES } from './typing-notes';

const codesAt = (text: string) => strokeAt(typeNote(text), text).result.findings.map((f) => f.code);

describe('a note typed a key at a time', () => {
  it('passes through findings about values and words half typed, which the finished line does not have', () => {
    // What `pneumark check` would say of each half-typed line, and so what the editor showed
    // at each key before anything was held back.
    expect(codesAt('vitals    spo2 9')).toContain('PN302');
    expect(codesAt('oxygen    venturi, fio2 0')).toContain('PN307');
    expect(codesAt('abg       7.32/5')).toContain('PN204');
    expect(codesAt('vent      peep 10, plateau 2')).toContain('PN303');
    expect(codesAt('@ day 1 09:')).toContain('PN104');
    expect(codesAt('patient   age 67 y, h')).toContain('PN201');
    expect(codesAt('vitals    hr ')).toContain('PN102');
    for (const [name, note] of Object.entries(TYPED_NOTES)) expect(flashes(typeNote(note)).length, name).toBeGreaterThan(5);
  });

  it('shows none of them while typing goes on, and each line as `pneumark check` reports it once it is left', () => {
    for (const [name, note] of Object.entries(TYPED_NOTES)) {
      const strokes = typeNote(note);
      const shown = shownWhileTyping(strokes);
      expect(flashes(strokes, (k) => shown[k]!).map((f) => `${f.finding.code} ${f.lineText}`), name).toEqual([]);
      // Each note ends with Enter: nothing is held, and the session agrees with a fresh check.
      expect(shown.at(-1), name).toEqual(checkNote(note).findings);
      expect(strokes.at(-1)!.result.findings, name).toEqual(checkNote(note).findings);
    }
  });

  it('shows a mistake in a line as soon as the line is left', () => {
    const note = 'vitals    spo2 950, hr 88\noxygen    mask, fio2 4\n';
    const strokes = typeNote(note);
    const shown = shownWhileTyping(strokes);
    const enter = (line: number) => strokes.findIndex((s) => s.typed === '\n' && s.cursor.line === line + 1);
    // Typing `, hr 88` after it: SpO2 950 is in the item before the cursor's, so it is shown at once.
    expect(shown[strokes.indexOf(strokeAt(strokes, 'vitals    spo2 950, h'))]!.map((f) => f.code)).toContain('PN306');
    expect(shown[strokes.indexOf(strokeAt(strokes, 'vitals    spo2 950'))]!.map((f) => f.code)).not.toContain('PN306');
    expect(shown[enter(0)]!.map((f) => f.code)).toContain('PN306');
    expect(shown[enter(1)]!.map((f) => f.code)).toContain('PN307');
    expect(shown[enter(1) - 1]!.map((f) => f.code)).not.toContain('PN307');
  });

  it('keeps a finding shown before shown while typing goes on', () => {
    // `hr 1` was left standing (the pause showed it); typing `0` keeps the same finding there.
    const strokes = typeNote('0', { before: 'vitals    hr 1' });
    const finding = strokes[0]!.result.findings.find((f) => f.code === 'PN302')!;
    expect(finding).toBeDefined();
    const before = checkNote('vitals    hr 1').findings;
    const held = heldWhileTyping(strokes[0]!.result.findings, 'vitals    hr 10', strokes[0]!.cursor, (f) => before.some((g) => g.code === f.code && g.range.start.character === f.range.start.character));
    expect(held).toEqual([]);
    expect(heldWhileTyping(strokes[0]!.result.findings, 'vitals    hr 10', strokes[0]!.cursor, () => false)).toEqual([finding]);
  });

  it('holds back only the item typed: from the comma before the cursor to the comma after it', () => {
    const line = 'vitals    hr 1, rr 26, spo2 95 %';
    expect(typedItem(line, 14)).toEqual({ start: 0, end: 14 });
    expect(typedItem(line, 20)).toEqual({ start: 15, end: 21 });
    // A comma just typed still belongs to the item it closes.
    expect(typedItem('vitals    hr 1,', 15)).toEqual({ start: 0, end: 15 });
    expect(typedItem(line, line.length)).toEqual({ start: 22, end: line.length });
    // Editing a value in the middle of a line (`hr 1` made `hr 10`): the findings of the other items are shown.
    const text = 'vitals    hr 10, rr 90, spo2 9';
    const findings = checkNote(text).findings;
    const held = heldWhileTyping(findings, text, { line: 0, character: 15 }, () => false);
    expect(held.map((f) => [f.code, f.range.start.character])).toEqual([['PN302', 13]]);
    expect(findings.filter((f) => !held.includes(f)).map((f) => [f.code, f.range.start.character])).toEqual([['PN302', 20], ['PN302', 29]]);
  });

  it('offers at each point what comes next, and hovers give the unit a value was read in', () => {
    const strokes = typeNote(TYPED_NOTES['ward review on oxygen']!);
    const labels = (prefix: string) => completionsAfter(strokeAt(strokes, prefix)).map((c) => c.label);
    const head = 'patient   age 67 y, sex male, height 178 cm, weight 84 kg\n\n@ day 1 09:40  ward review, breathless overnight\n';
    // The device after `oxygen`, its unit after the flow, the keys after a section word and a unit after a number.
    expect(labels(`${head}oxygen    `).slice(0, 3)).toEqual(['room air', 'cannula', 'mask']);
    expect(labels(`${head}oxygen    cannula 3 `)[0]).toBe('L/min');
    expect(labels(`${head}oxygen    cannula 3 L/min\nvitals    `).slice(0, 3)).toEqual(['hr', 'rr', 'spo2']);
    expect(labels(`${head}oxygen    cannula 3 L/min\nvitals    hr 102, rr 26, spo2 93 `)[0]).toBe('%');
    expect(labels('patient   age 67 y, sex male, height 178 ')[0]).toBe('cm');
    // A half-typed value hovers with the unit it is read in.
    const half = strokeAt(strokes, `${head}oxygen    cannula 3 L/min\nvitals    hr 102, rr 26, spo2 9`);
    expect(hoverAfter(half, { line: 4, character: 30 })?.markdown).toContain('Value: **9 %**');
    // The acid–base reading is hinted once the gas is written.
    expect(hintsAfter(strokes.at(-1)!).map((h) => h.label)).toContain('consistent with resp. acidosis, chronic');
  });
});
