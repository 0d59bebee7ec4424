// A Venturi setting written beside the FiO2 it gives (`oxygen venturi 28, fio2 0.28`). A Venturi
// mask is set by the oxygen fraction it gives, 24 to 60 % (European Respiratory Society, European
// Lung White Book, "Principles of respiratory therapy", figure 2, read; O'Driscoll BR et al., BTS
// guideline for oxygen use in adults in healthcare and emergency settings, Thorax 2017;72(Suppl 1),
// from memory), so the number after `venturi` is read as the FiO2 (PN321's reading), and a `fio2`
// on the same line states it again. When the two agree (as fractions, at the precision of the less
// precise of the two as written) that is no duplicate: it was PN206 "stated twice". When they
// disagree it is a real conflict: PN206 names both values, where each comes from and which is used
// (the `fio2` written, the later one, as before), with a fix that keeps either.
import { describe, expect, it } from 'vitest';
import { fhirFio2Values, firstCsvRow } from '../helpers/first-timepoint-exports';
import { checkNote } from '../../server/src/core/check-note';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { derived } from '../derive/helpers';

const PATIENT = 'patient age 60 y, sex female, height 165 cm\n';
const note = (oxygen: string) => `${PATIENT}@ day 1 08:00\n${oxygen}\nabg ph 7.40, pco2 40, po2 80\n`;
const codesOn = (text: string, line: number) => checkNote(text).findings.filter((f) => f.range.start.line === line).map((f) => f.code);
const fio2Of = (text: string) => checkNote(text).analysis.timeline.timepoints[0]!.values.numberOf('fio2');

describe('a Venturi setting and an FiO2 that agree', () => {
  const agreeing = [
    'oxygen venturi 28, fio2 0.28',
    'oxygen venturi 28 %, fio2 0.28',
    'oxygen venturi 0.28, fio2 0.28',
    'oxygen venturi 0.28, fio2 28 %',
    'oxygen venturi 28, fio2 28 %',
    'oxygen venturi 28, fio2 28',
    'oxygen venturi 28 fio2 0.28',
    'oxygen venturi 28.0, fio2 0.280',
    'oxygen venturi 40, fio2 0.4',
  ];

  it.each(agreeing)('`%s`: no duplicate (PN206), and PN321 is not needed (the `fio2` written says what 28 is)', (line) => {
    expect(codesOn(note(line), 2)).toEqual([]);
  });

  it('agree at the precision of the less precise of the two: 28 % is 0.3 to one decimal, 35 % is neither 0.3 nor 0.4', () => {
    expect(codesOn(note('oxygen venturi 28, fio2 0.3'), 2)).toEqual([]);
    expect(codesOn(note('oxygen venturi 31, fio2 0.3'), 2)).toEqual([]);
    expect(codesOn(note('oxygen venturi 35, fio2 0.4'), 2)).toEqual(['PN206']);
    expect(codesOn(note('oxygen venturi 35, fio2 0.3'), 2)).toEqual(['PN206']);
    expect(codesOn(note('oxygen venturi 28, fio2 0.29'), 2)).toEqual(['PN206']);
    expect(codesOn(note('oxygen venturi 0.28, fio2 0.281'), 2)).toEqual([]);
    expect(codesOn(note('oxygen venturi 0.28, fio2 0.286'), 2)).toEqual(['PN206']);
  });

  it('the FiO2 feeds P/F, the A–a gradient and the exports once', () => {
    const text = note('oxygen venturi 28, fio2 0.28');
    expect(fio2Of(text)).toBeCloseTo(0.28, 10);
    // P/F = PaO2 ÷ FiO2 = 80 ÷ 0.28 = 285.7 (Horowitz index; ARDS Definition Task Force, Ranieri VM
    // et al., "Acute respiratory distress syndrome: the Berlin Definition", JAMA 2012;307:2526–2533).
    expect(derived(text, 'pf_ratio').value).toBeCloseTo(285.714, 2);
    // Simplified alveolar gas equation, PAO2 = 0.28 × (760 − 47) − 40 ÷ 0.8 = 149.64 mmHg, A–a =
    // 149.64 − 80 = 69.64 (common practice, no source).
    expect(derived(text, 'aa_gradient').value).toBeCloseTo(69.64, 2);
    const row = firstCsvRow(text);
    expect(row.fio2_fraction).toBe('0.28');
    expect(row.fio2_in_force).toBe('0.28');
    expect(row.o2_flow_L_min).toBe('');
    expect(fhirFio2Values(text)).toEqual([0.28]);
  });

  it('a `fio2` written twice beside the setting is still stated twice', () => {
    const text = note('oxygen venturi 28, fio2 0.28, fio2 0.28');
    const found = checkNote(text).findings.filter((f) => f.code === 'PN206');
    expect(found).toHaveLength(1);
    expect(found[0]!.range.start.character).toBe('oxygen venturi 28, fio2 0.28, '.length);
    expect(found[0]!.message).toBe('FiO2 is stated twice at this timepoint; the later value is used.');
  });

  it('PN321 stays where no `fio2` is written on the line', () => {
    expect(codesOn(note('oxygen venturi 28'), 2)).toEqual(['PN321']);
    expect(codesOn(`${PATIENT}@ day 1 08:00\noxygen venturi 28\n@ +1h\noxygen venturi, fio2 0.28\n`, 2)).toEqual(['PN321']);
  });
});

describe('a Venturi setting and an FiO2 that disagree', () => {
  const text = note('oxygen venturi 28, fio2 0.35');

  it('is reported once, naming both values, where each comes from, and which one is used', () => {
    const found = checkNote(text).findings.filter((f) => f.range.start.line === 2);
    expect(found.map((f) => f.code)).toEqual(['PN206']);
    const f = found[0]!;
    expect(f.severity).toBe('warning');
    expect(f.range).toEqual({ start: { line: 2, character: 19 }, end: { line: 2, character: 23 } });
    expect(f.message).toBe('FiO2 is stated twice on this line, and the two disagree: the Venturi setting `28` gives 0.28, and `fio2 0.35` gives 0.35. The `fio2` written (0.35) is used; keep the one that was given.');
    expect(f.related?.map((r) => [r.message, r.range.start.character, r.range.end.character])).toEqual([['the Venturi setting, read as the FiO2', 15, 17]]);
  });

  it('uses the `fio2` written: P/F, A–a gradient, CSV and FHIR', () => {
    expect(fio2Of(text)).toBeCloseTo(0.35, 10);
    // P/F = 80 ÷ 0.35 = 228.6 (Berlin Definition, JAMA 2012, as above).
    expect(derived(text, 'pf_ratio').value).toBeCloseTo(228.571, 2);
    // PAO2 = 0.35 × 713 − 40 ÷ 0.8 = 199.55, A–a = 119.55 (common practice, no source).
    expect(derived(text, 'aa_gradient').value).toBeCloseTo(119.55, 2);
    const row = firstCsvRow(text);
    expect(row.fio2_fraction).toBe('0.35');
    expect(row.fio2_in_force).toBe('0.35');
    expect(fhirFio2Values(text)).toEqual([0.35]);
  });

  it('offers to keep either, and each fix leaves a line with no finding', () => {
    const f = checkNote(text).findings.find((x) => x.code === 'PN206')!;
    expect(f.fixes.map((x) => x.title)).toEqual(['Keep `fio2 0.35` (remove the Venturi setting `28`)', 'Keep the Venturi setting `28` as `fio2 28 %` (remove `fio2 0.35`)']);
    const keepFio2 = applyEdits(text, f.fixes[0]!.edits);
    expect(keepFio2.split('\n')[2]).toBe('oxygen venturi, fio2 0.35');
    expect(codesOn(keepFio2, 2)).toEqual([]);
    expect(fio2Of(keepFio2)).toBeCloseTo(0.35, 10);
    // Keeping the bare setting writes it with its key, as on two lines: what PN321 would ask for
    // once the `fio2` is gone is done by the same fix, so nothing is left to say.
    const keepSetting = applyEdits(text, f.fixes[1]!.edits);
    expect(keepSetting.split('\n')[2]).toBe('oxygen venturi fio2 28 %');
    expect(codesOn(keepSetting, 2)).toEqual([]);
    expect(fio2Of(keepSetting)).toBeCloseTo(0.28, 10);
  });

  it('keeping a bare setting written before other items, or with the `fio2` first among them, leaves a clean line too', () => {
    for (const [line, kept] of [
      ['oxygen venturi 28, flow 8 L/min, fio2 0.35', 'oxygen venturi fio2 28 %, flow 8 L/min'],
      ['oxygen venturi 28, fio2 0.35, flow 8 L/min', 'oxygen venturi fio2 28 %, flow 8 L/min'],
      ['oxygen venturi 40 fio2 0.35', 'oxygen venturi fio2 40 %'],
    ] as const) {
      const t = note(line);
      const f = checkNote(t).findings.find((x) => x.code === 'PN206')!;
      const fixed = applyEdits(t, f.fixes[1]!.edits);
      expect(fixed.split('\n')[2]).toBe(kept);
      expect(codesOn(fixed, 2)).toEqual([]);
    }
  });

  it('the fixes keep what else the line says, and the setting keeps its unit', () => {
    const other = note('oxygen venturi 28 %, fio2 0.35, flow 8 L/min # on the ward');
    const f = checkNote(other).findings.find((x) => x.code === 'PN206')!;
    expect(f.message).toContain('the Venturi setting `28 %` gives 0.28');
    expect(applyEdits(other, f.fixes[0]!.edits).split('\n')[2]).toBe('oxygen venturi, fio2 0.35, flow 8 L/min # on the ward');
    expect(applyEdits(other, f.fixes[1]!.edits).split('\n')[2]).toBe('oxygen venturi 28 %, flow 8 L/min # on the ward');
  });

  it('a `fio2` that is not used itself (impossible) still replaces the setting, and says so', () => {
    const f = checkNote(note('oxygen venturi 28, fio2 0.1')).findings.find((x) => x.code === 'PN206')!;
    expect(f.message).toBe('FiO2 is stated twice on this line, and the two disagree: the Venturi setting `28` gives 0.28, and `fio2 0.1` gives 0.10. The `fio2` written replaces the setting, but is not used itself (see its finding); keep the one that was given.');
  });
});
