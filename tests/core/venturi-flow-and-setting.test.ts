// A Venturi mask with both of its settings on one line, each without its key: the flow the valve
// asks for and the oxygen fraction it gives (`oxygen venturi 8 L/min 28 %`, or the other way round).
// A Venturi mask is set by the oxygen fraction it gives, 24 to 60 %, at a flow the valve names
// (European Respiratory Society, European Lung White Book, "Principles of respiratory therapy",
// figure 2, read in its text as cited in tests/core/device-fio2-across-lines.test.ts). The format
// already reads a percentage after `venturi` as its FiO2 (`venturi 28 %`: a percentage can only be
// the FiO2) and a number in L/min as its flow (`venturi 8 L/min`). The second of the two was two
// stray-text errors (`28`, then `%`) with no fix; it is now read as the device's other setting, as
// after `hfnc` (`hfnc 40 L/min 60 %`), and said by nothing, as `venturi 28 %` alone is not. Only a
// second number whose unit says which it is is read: a bare one stays stray text. A flow after a
// bare setting (`venturi 28 8 L/min`) is read too, and PN321 still asks what `28` is (see below).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { formatNote } from '../../server/src/core/service';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { derived } from '../derive/helpers';

const PATIENT = 'patient age 60 y, sex female, height 165 cm\n';
const note = (oxygen: string) => `${PATIENT}@ day 1 08:00\n${oxygen}\nabg ph 7.40, pco2 40, po2 80\n`;
const valuesOf = (text: string) => checkNote(text).analysis.timeline.timepoints[0]!.values;
const onLine = (text: string, line: number) => checkNote(text).findings.filter((f) => f.range.start.line === line);
const codesOn = (text: string, line: number) => onLine(text, line).map((f) => f.code);

describe('a flow and a percentage after `venturi`, each without its key', () => {
  it.each([
    ['oxygen venturi 8 L/min 28 %'],
    ['oxygen venturi 8 L/min 28%'],
    ['oxygen venturi 28 % 8 L/min'],
    ['oxygen venturi 0.28 8 L/min'],
    ['oxygen venturi 8 28 %'],
  ])('`%s`: the flow and the FiO2 are both read, and nothing is said', (line) => {
    const text = note(line);
    expect(codesOn(text, 2)).toEqual([]);
    expect(valuesOf(text).numberOf('o2_flow')).toBe(8);
    expect(valuesOf(text).numberOf('fio2')).toBeCloseTo(0.28, 10);
    expect(valuesOf(text).get('device')?.stated.word).toBe('venturi');
    // P/F = PaO2 ÷ FiO2 = 80 ÷ 0.28 = 285.7 (Horowitz index; ARDS Definition Task Force, Ranieri VM
    // et al., "Acute respiratory distress syndrome: the Berlin Definition", JAMA 2012;307:2526–2533).
    expect(derived(text, 'pf_ratio').value).toBeCloseTo(285.714, 2);
  });

  it('the formatter keeps the line as written', () => {
    expect(formatNote('@ day 1 08:00\noxygen venturi 8 L/min 28 %').split('\n')[1]).toMatch(/^oxygen +venturi 8 L\/min 28 %$/);
  });

  it('a percentage above every Venturi setting is read and reported (PN322), as `venturi 80 %` is', () => {
    const text = note('oxygen venturi 8 L/min 80 %');
    expect(codesOn(text, 2)).toEqual(codesOn(note('oxygen venturi 80 %'), 2));
    expect(codesOn(text, 2)).toContain('PN322');
    expect(valuesOf(text).numberOf('fio2')).toBeCloseTo(0.8, 10);
  });

  it('with a `fio2` of its own: compared as the setting always is (PN206 where they disagree, fixes that keep either)', () => {
    expect(codesOn(note('oxygen venturi 8 L/min 28 %, fio2 0.28'), 2)).toEqual([]);
    const text = note('oxygen venturi 8 L/min 28 %, fio2 0.35');
    const found = onLine(text, 2);
    expect(found.map((f) => f.code)).toEqual(['PN206']);
    expect(found[0]!.message).toBe('FiO2 is stated twice on this line, and the two disagree: the Venturi setting `28 %` gives 0.28, and `fio2 0.35` gives 0.35. The `fio2` written (0.35) is used; keep the one that was given.');
    const keepSetting = applyEdits(text, found[0]!.fixes[1]!.edits);
    expect(keepSetting.split('\n')[2]).toBe('oxygen venturi 8 L/min 28 %');
    expect(codesOn(keepSetting, 2)).toEqual([]);
    const keepFio2 = applyEdits(text, found[0]!.fixes[0]!.edits);
    expect(keepFio2.split('\n')[2]).toBe('oxygen venturi 8 L/min, fio2 0.35');
    expect(codesOn(keepFio2, 2)).toEqual([]);
  });
});

// A flow in L/min after a bare Venturi setting (`venturi 28 8 L/min`): the setting first, as the
// device's colour names it, then the flow the valve asks for. The flow was stray text (`8`) and an
// unknown key (`L/min`), and the flow was lost; its unit says what it is, so it is read as the flow,
// as after `venturi 28 %`. The bare `28` is still read as the FiO2 in % and said (PN321), but its
// fixes no longer offer `28 L/min`, a second flow, and its fix that writes `fio2 28 %` gives the flow
// its key too, since after a key no number is read as the device's.
describe('a flow in L/min after the Venturi setting', () => {
  it.each([
    ['oxygen venturi 28 8 L/min', ['PN321']],
    ['oxygen venturi 28 8L/min', ['PN321']],
    ['oxygen venturi 28 % 8 L/min', []],
    ['oxygen venturi 0.28 8 L/min', []],
  ])('`%s`: the flow and the FiO2 are both read', (line, codes) => {
    const text = note(line);
    expect(codesOn(text, 2)).toEqual(codes);
    expect(valuesOf(text).numberOf('o2_flow')).toBe(8);
    expect(valuesOf(text).numberOf('fio2')).toBeCloseTo(0.28, 10);
    // P/F = PaO2 ÷ FiO2 = 80 ÷ 0.28 = 285.7 (Horowitz index; ARDS Definition Task Force, Ranieri VM
    // et al., "Acute respiratory distress syndrome: the Berlin Definition", JAMA 2012;307:2526–2533).
    expect(derived(text, 'pf_ratio').value).toBeCloseTo(285.714, 2);
  });

  it('PN321 on the bare setting says what it is read as, and offers no second flow', () => {
    const text = note('oxygen venturi 28 8 L/min');
    const [found] = onLine(text, 2);
    expect(found!.message).toBe('`28` after `venturi` is read as the FiO2 it gives, 28 % (a Venturi mask is set by its oxygen fraction, 24–60 %), not as a flow: the flow is the `8 L/min` after it. Write `fio2 28 %` to say so.');
    expect(found!.fixes.map((f) => f.title)).toEqual(['Write `fio2 28 %`']);
  });

  it('its fix writes a clean line that keeps the flow', () => {
    const text = note('oxygen venturi 28 8 L/min # valve');
    const [found] = onLine(text, 2);
    const fixed = applyEdits(text, found!.fixes[0]!.edits);
    expect(fixed.split('\n')[2]).toBe('oxygen venturi fio2 28 % flow 8 L/min # valve');
    expect(codesOn(fixed, 2)).toEqual([]);
    expect(valuesOf(fixed).numberOf('o2_flow')).toBe(8);
    expect(valuesOf(fixed).numberOf('fio2')).toBeCloseTo(0.28, 10);
  });

  it('with a `fio2` of its own: nothing where they agree; where they disagree PN206 keeps either, and the flow', () => {
    expect(codesOn(note('oxygen venturi 28 8 L/min, fio2 0.28'), 2)).toEqual([]);
    const text = note('oxygen venturi 28 8 L/min, fio2 0.35');
    const found = onLine(text, 2);
    expect(found.map((f) => f.code)).toEqual(['PN206']);
    const keepFio2 = applyEdits(text, found[0]!.fixes[0]!.edits);
    expect(keepFio2.split('\n')[2]).toBe('oxygen venturi 8 L/min, fio2 0.35');
    expect(codesOn(keepFio2, 2)).toEqual([]);
    const keepSetting = applyEdits(text, found[0]!.fixes[1]!.edits);
    expect(keepSetting.split('\n')[2]).toBe('oxygen venturi fio2 28 % flow 8 L/min');
    expect(codesOn(keepSetting, 2)).toEqual([]);
    expect(valuesOf(keepSetting).numberOf('o2_flow')).toBe(8);
  });

  it('the formatter keeps the line as written', () => {
    expect(formatNote('@ day 1 08:00\noxygen venturi 28 8 L/min').split('\n')[1]).toMatch(/^oxygen +venturi 28 8 L\/min$/);
  });
});

describe('what stays unread', () => {
  it('a bare second number: stray text, as before', () => {
    const text = note('oxygen venturi 8 L/min 28');
    expect(codesOn(text, 2)).toEqual(['PN105']);
    expect(valuesOf(text).numberOf('fio2')).toBeNull();
    expect(valuesOf(text).numberOf('o2_flow')).toBe(8);
  });

  it('a bare number after a bare setting: PN321 asks what the setting is, and the second number stays stray text', () => {
    const text = note('oxygen venturi 28 8');
    expect(codesOn(text, 2)).toEqual(['PN321', 'PN105']);
    expect(valuesOf(text).numberOf('o2_flow')).toBeNull();
  });

  it('after a comma, one stray-text error with the fix that writes `fio2`, as after any device', () => {
    const text = note('oxygen venturi 8 L/min, 28 %');
    const found = onLine(text, 2);
    expect(found.map((f) => f.code)).toEqual(['PN105']);
    expect(applyEdits(text, found[0]!.fixes[0]!.edits).split('\n')[2]).toBe('oxygen venturi 8 L/min, fio2 28 %');
  });

  it('two flows or two percentages: the second is not read', () => {
    expect(codesOn(note('oxygen venturi 8 L/min 10 L/min'), 2)).toEqual(['PN105']);
    expect(valuesOf(note('oxygen venturi 28 % 35 %')).numberOf('fio2')).toBeCloseTo(0.28, 10);
  });
});
