// A Venturi setting (`oxygen venturi 28`) or a percentage after `hfnc` on one oxygen line, and a
// `fio2` written on another oxygen line of the same timepoint (one that names no device). A Venturi
// mask is set by the oxygen fraction it gives, 24 to 60 % (European Respiratory Society, European
// Lung White Book, "Principles of respiratory therapy", figure 2, read; O'Driscoll BR et al., BTS
// guideline for oxygen use in adults in healthcare and emergency settings, Thorax 2017;72(Suppl 1),
// from memory), so both lines state the FiO2. They were a bare "FiO2 is stated twice" (PN206) beside
// PN321, whose fix would write a third FiO2, even where the two agree; and the second oxygen line
// replaced the first, so the device was lost (`fio2` first, the Venturi line second: its 28 % was
// used). They are now compared as on one line (tests/core/venturi-setting-with-fio2.test.ts): the
// same precision rule, nothing where they agree, PN206 naming both values and their lines where they
// disagree, with fixes that keep either; the device and the `fio2` written are both in force, the
// `fio2` written used, in either order of the lines.
import { describe, expect, it } from 'vitest';
import { fhirFio2Values, firstCsvRow } from '../helpers/first-timepoint-exports';
import { checkNote } from '../../server/src/core/check-note';
import { codeActions } from '../../server/src/core/service/actions';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { NoteSession } from '../../server/src/core/session';
import { derived } from '../derive/helpers';
import { sameAsJson, snapshot } from './session-snapshot';

const PATIENT = 'patient age 60 y, sex female, height 165 cm\n';
/** The oxygen lines start on line 2. */
const note = (...oxygen: string[]) => `${PATIENT}@ day 1 08:00\n${oxygen.join('\n')}\nabg ph 7.40, pco2 40, po2 80\n`;
const findings = (text: string) => checkNote(text).findings.filter((f) => f.range.start.line >= 2 && f.code !== 'PN410' && f.code !== 'PN411' && f.code !== 'PN412');
const codes = (text: string) => findings(text).map((f) => `${f.code}@${f.range.start.line}`);
const values = (text: string) => checkNote(text).analysis.timeline.timepoints[0]!.values;

describe('a Venturi setting and a `fio2` on another oxygen line that agree', () => {
  const agreeing: [string, string][] = [
    ['oxygen venturi 28', 'oxygen fio2 0.28'],
    ['oxygen fio2 0.28', 'oxygen venturi 28'],
    ['oxygen venturi 28', 'oxygen fio2 28 %'],
    ['oxygen venturi 28 %', 'oxygen fio2 0.3'],
    ['oxygen fio2 0.3', 'oxygen venturi 31'],
    ['oxygen venturi 0.4', 'oxygen fio2 40%'],
  ];

  it.each(agreeing)('`%s` and `%s`: no PN206, and no PN321 (the `fio2` says what the number is)', (a, b) => {
    expect(codes(note(a, b))).toEqual([]);
  });

  it('both lines are in force: the device, and the `fio2` written, used once by P/F and the exports', () => {
    for (const text of [note('oxygen venturi 28', 'oxygen fio2 0.28'), note('oxygen fio2 0.28', 'oxygen venturi 28')]) {
      expect(values(text).get('device')?.stated.word).toBe('venturi');
      expect(values(text).numberOf('fio2')).toBeCloseTo(0.28, 10);
      expect(values(text).get('fio2')?.stated.item.implied).toBeNull();
      // P/F = PaO2 ÷ FiO2 = 80 ÷ 0.28 = 285.7 (Horowitz index; ARDS Definition Task Force, Ranieri VM
      // et al., "Acute respiratory distress syndrome: the Berlin Definition", JAMA 2012;307:2526–2533).
      expect(derived(text, 'pf_ratio').value).toBeCloseTo(285.714, 2);
      expect(firstCsvRow(text).fio2_fraction).toBe('0.28');
      expect(fhirFio2Values(text)).toEqual([0.28]);
    }
  });

  it('a percentage after `hfnc` on one line and a `fio2` on another, as on one line', () => {
    expect(codes(note('oxygen hfnc 40 L/min 60 %', 'oxygen fio2 0.6'))).toEqual([]);
    expect(codes(note('oxygen fio2 60 %', 'oxygen hfnc 60 %'))).toEqual([]);
    const text = note('oxygen hfnc 40 L/min 60 %', 'oxygen fio2 0.6');
    expect(values(text).numberOf('o2_flow')).toBe(40);
    expect(values(text).get('device')?.stated.word).toBe('hfnc');
  });
});

describe('a Venturi setting and a `fio2` on another oxygen line that disagree', () => {
  const forward = note('oxygen venturi 28', 'oxygen fio2 0.35');
  const backward = note('oxygen fio2 0.35', 'oxygen venturi 28');

  it('is PN206 on the `fio2`, naming both values and their lines, the setting as related information', () => {
    const [f] = findings(forward);
    expect(findings(forward)).toHaveLength(1);
    expect(f!.code).toBe('PN206');
    expect(f!.severity).toBe('warning');
    expect(f!.range).toEqual({ start: { line: 3, character: 7 }, end: { line: 3, character: 11 } });
    expect(f!.message).toBe('FiO2 is stated twice at this timepoint, and the two disagree: the Venturi setting `28` (line 3) gives 0.28, and `fio2 0.35` (line 4) gives 0.35. The `fio2` written (0.35) is used; keep the one that was given.');
    expect(f!.related?.map((r) => [r.message, r.range.start.line, r.range.start.character, r.range.end.character])).toEqual([['the Venturi setting, read as the FiO2', 2, 15, 17]]);
  });

  it('the other way round: the finding on the `fio2` above, the setting below as related information', () => {
    const [f] = findings(backward);
    expect(findings(backward)).toHaveLength(1);
    expect(f!.code).toBe('PN206');
    expect(f!.range).toEqual({ start: { line: 2, character: 7 }, end: { line: 2, character: 11 } });
    expect(f!.message).toBe('FiO2 is stated twice at this timepoint, and the two disagree: the Venturi setting `28` (line 4) gives 0.28, and `fio2 0.35` (line 3) gives 0.35. The `fio2` written (0.35) is used; keep the one that was given.');
    expect(f!.related?.map((r) => [r.range.start.line, r.range.start.character])).toEqual([[3, 15]]);
  });

  it('uses the `fio2` written, in either order: P/F, A–a gradient, CSV and FHIR', () => {
    for (const text of [forward, backward]) {
      expect(values(text).numberOf('fio2')).toBeCloseTo(0.35, 10);
      expect(values(text).get('device')?.stated.word).toBe('venturi');
      // P/F = 80 ÷ 0.35 = 228.6 (Berlin Definition, JAMA 2012, as above).
      expect(derived(text, 'pf_ratio').value).toBeCloseTo(228.571, 2);
      // PAO2 = 0.35 × (760 − 47) − 40 ÷ 0.8 = 199.55, A–a = 119.55 (simplified alveolar gas
      // equation; common practice, no source).
      expect(derived(text, 'aa_gradient').value).toBeCloseTo(119.55, 2);
      const row = firstCsvRow(text);
      expect(row.fio2_fraction).toBe('0.35');
      expect(row.fio2_in_force).toBe('0.35');
      expect(fhirFio2Values(text)).toEqual([0.35]);
    }
  });

  it('offers to keep either; each fix edits both lines, and leaves a note clean of PN206 and PN321', () => {
    for (const text of [forward, backward]) {
      const f = findings(text)[0]!;
      expect(f.fixes.map((x) => x.title)).toEqual(['Keep `fio2 0.35` (remove the Venturi setting `28`)', 'Keep the Venturi setting `28` as `fio2 28 %` (remove `fio2 0.35`)']);
      expect(f.fixes.map((x) => [...new Set(x.edits.map((e) => e.range.start.line))].sort())).toEqual([[2, 3], [2, 3]]);
      const keepFio2 = applyEdits(text, f.fixes[0]!.edits);
      expect(keepFio2).toBe(note('oxygen venturi fio2 0.35'));
      expect(codes(keepFio2)).toEqual([]);
      expect(values(keepFio2).numberOf('fio2')).toBeCloseTo(0.35, 10);
      const keepSetting = applyEdits(text, f.fixes[1]!.edits);
      expect(keepSetting).toBe(note('oxygen venturi fio2 28 %'));
      expect(codes(keepSetting)).toEqual([]);
      expect(values(keepSetting).numberOf('fio2')).toBeCloseTo(0.28, 10);
    }
  });

  it('the editor offers both fixes as quick fixes of the finding', () => {
    for (const text of [forward, backward]) {
      const result = checkNote(text);
      const f = result.findings.find((x) => x.code === 'PN206')!;
      const titles = codeActions(result, f.range).filter((a) => a.kind === 'quickfix').map((a) => a.title);
      expect(titles).toEqual(expect.arrayContaining(['Keep `fio2 0.35` (remove the Venturi setting `28`)', 'Keep the Venturi setting `28` as `fio2 28 %` (remove `fio2 0.35`)']));
    }
  });

  it('a line that says more than the `fio2` keeps the rest; a setting with its unit is kept as written', () => {
    const text = note('oxygen venturi 28 %', 'oxygen fio2 0.35, flow 8 L/min # on the ward');
    const f = findings(text).find((x) => x.code === 'PN206')!;
    expect(f.fixes.map((x) => x.title)).toEqual(['Keep `fio2 0.35` (remove the Venturi setting `28 %`)', 'Keep the Venturi setting `28 %` (remove `fio2 0.35`)']);
    expect(applyEdits(text, f.fixes[0]!.edits)).toBe(note('oxygen venturi fio2 0.35', 'oxygen flow 8 L/min # on the ward'));
    expect(applyEdits(text, f.fixes[1]!.edits)).toBe(note('oxygen venturi 28 %', 'oxygen flow 8 L/min # on the ward'));
    const after = note('oxygen fio2 0.35 # set at 07:50', 'oxygen venturi 28');
    const g = findings(after).find((x) => x.code === 'PN206')!;
    expect(applyEdits(after, g.fixes[1]!.edits)).toBe(note('oxygen # set at 07:50', 'oxygen venturi fio2 28 %'));
  });

  it('after `hfnc`: the message names the percentage after the device', () => {
    const text = note('oxygen hfnc 40 L/min 60 %', 'oxygen fio2 0.5');
    const f = findings(text).find((x) => x.code === 'PN206')!;
    expect(codes(text)).toEqual(['PN206@3']);
    expect(f.message).toBe('FiO2 is stated twice at this timepoint, and the two disagree: `60 %` after `hfnc` (line 3) gives 0.60, and `fio2 0.5` (line 4) gives 0.50. The `fio2` written (0.50) is used; keep the one that was given.');
    expect(values(text).numberOf('fio2')).toBeCloseTo(0.5, 10);
    expect(values(text).numberOf('o2_flow')).toBe(40);
    expect(applyEdits(text, f.fixes[1]!.edits)).toBe(note('oxygen hfnc 40 L/min fio2 60 %'));
    expect(codes(applyEdits(text, f.fixes[0]!.edits))).toEqual([]);
  });
});

describe('what is not compared across lines', () => {
  it('two `fio2` written beside a Venturi setting: the PN206 between the two written ones, as before', () => {
    const text = note('oxygen venturi 28', 'oxygen fio2 0.28', 'oxygen fio2 0.3');
    expect(codes(text)).toEqual(['PN206@4']);
    expect(findings(text)[0]!.message).toBe('FiO2 is stated twice at this timepoint; the later value is used.');
    expect(findings(text)[0]!.related?.map((r) => r.range.start.line)).toEqual([3]);
  });

  it('two `fio2` written, both above the Venturi line: the setting is compared with the later, the one in force', () => {
    const text = note('oxygen fio2 0.28', 'oxygen fio2 0.35', 'oxygen venturi 28');
    expect(codes(text)).toEqual(['PN206@3', 'PN206@3']);
    const [between, withSetting] = findings(text);
    expect(between!.message).toBe('FiO2 is stated twice at this timepoint; the later value is used.');
    expect(between!.related?.map((r) => r.range.start.line)).toEqual([2]);
    expect(withSetting!.message).toBe('FiO2 is stated twice at this timepoint, and the two disagree: the Venturi setting `28` (line 5) gives 0.28, and `fio2 0.35` (line 4) gives 0.35. The `fio2` written (0.35) is used; keep the one that was given.');
    expect(withSetting!.related?.map((r) => [r.range.start.line, r.range.start.character])).toEqual([[4, 15]]);
    // The later `fio2` and the Venturi line hold as one, as two lines do: the device, and the `fio2` in force.
    expect(values(text).numberOf('fio2')).toBeCloseTo(0.35, 10);
    expect(values(text).get('device')?.stated.word).toBe('venturi');
    // P/F = 80 ÷ 0.35 = 228.6 (Berlin Definition, JAMA 2012, as above).
    expect(derived(text, 'pf_ratio').value).toBeCloseTo(228.571, 2);
    expect(applyEdits(text, withSetting!.fixes[0]!.edits)).toBe(note('oxygen fio2 0.28', 'oxygen venturi fio2 0.35'));
    expect(applyEdits(text, withSetting!.fixes[1]!.edits)).toBe(note('oxygen fio2 0.28', 'oxygen venturi fio2 28 %'));
  });

  it('two `fio2` written above the Venturi line, the later agreeing with the setting: only the PN206 between the two written', () => {
    const text = note('oxygen fio2 0.35', 'oxygen fio2 0.28', 'oxygen venturi 28');
    expect(codes(text)).toEqual(['PN206@3']);
    expect(values(text).numberOf('fio2')).toBeCloseTo(0.28, 10);
    expect(values(text).get('fio2')?.stated.line).toBe(3);
    expect(values(text).get('device')?.stated.word).toBe('venturi');
  });

  it('a `fio2` in force on a line that names a device is that line\'s, and not compared with a later setting', () => {
    const text = note('oxygen fio2 0.28', 'oxygen mask, fio2 0.35', 'oxygen venturi 28');
    // The device and the FiO2 each stated twice, as plain duplicates; the Venturi line replaces the mask line.
    expect(codes(text)).toEqual(['PN206@3', 'PN206@4', 'PN206@4']);
    expect(findings(text).map((f) => f.message)).toEqual([
      'FiO2 is stated twice at this timepoint; the later value is used.',
      'Oxygen device is stated twice at this timepoint; the later value is used.',
      'FiO2 is stated twice at this timepoint; the later value is used.',
    ]);
    expect(values(text).numberOf('fio2')).toBeCloseTo(0.28, 10);
  });

  it('a `fio2` on a line that names a device of its own is that line\'s: two oxygen lines, as before', () => {
    expect(codes(note('oxygen venturi 28', 'oxygen mask, fio2 0.35'))).toEqual(['PN321@2', 'PN206@3', 'PN206@3']);
  });

  it('a `fio2` on a vent line is the ventilator\'s: the oxygen line and the vent line overlap (PN311), and the later is in force', () => {
    const text = note('oxygen venturi 28', 'vent mode VC, vt 450, rate 14, peep 5, fio2 0.35');
    expect(codes(text)).toEqual(['PN311@2', 'PN321@2']);
    expect(values(text).numberOf('fio2')).toBeCloseTo(0.35, 10);
    const other = note('vent mode VC, vt 450, rate 14, peep 5, fio2 0.35', 'oxygen venturi 28');
    expect(codes(other)).toEqual(['PN311@2', 'PN321@3']);
    expect(values(other).numberOf('fio2')).toBeCloseTo(0.28, 10);
  });

  it('at another timepoint, nothing is compared', () => {
    const text = `${PATIENT}@ day 1 08:00\noxygen venturi 28\n@ day 1 09:00\noxygen fio2 0.35\n`;
    expect(checkNote(text).findings.map((f) => `${f.code}@${f.range.start.line}`)).toEqual(['PN321@2']);
  });
});

describe('lines added above', () => {
  it('move the finding, its related place and the lines its fixes edit, as a fresh analysis gives them', () => {
    const base = `${PATIENT}@ day 1 07:00\nvitals hr 80\n@ day 1 08:00\noxygen venturi 28\noxygen fio2 0.35\nabg ph 7.40, pco2 40, po2 80\n`;
    const session = new NoteSession();
    session.update(base);
    // A line added in the timepoint above: the one below is moved, not read again.
    const moved = base.replace('@ day 1 07:00\n', '@ day 1 07:00\nvitals rr 18\n');
    const result = session.update(moved);
    const fresh = checkNote(moved);
    expect(sameAsJson(snapshot(result), snapshot(fresh))).toBe(true);
    const f = result.findings.find((x) => x.code === 'PN206')!;
    expect(f.range.start.line).toBe(6);
    expect(f.message).toContain('the Venturi setting `28` (line 6) gives 0.28, and `fio2 0.35` (line 7)');
    expect(f.related?.[0]!.range.start.line).toBe(5);
    expect(applyEdits(moved, f.fixes[0]!.edits)).toBe(moved.replace('oxygen venturi 28\noxygen fio2 0.35\n', 'oxygen venturi fio2 0.35\n'));
  });
});
