// A percentage after the flow of a device that is not set by its FiO2 (`oxygen mask 10 L/min 40 %`,
// `oxygen cannula 2 L/min 28 %`). A nasal cannula and a simple or reservoir mask are set by an
// oxygen flow, and the FiO2 they give is not fixed (it varies with the patient's breathing):
// common practice, no source. So the percentage is no setting of theirs and is not read; it was two
// stray-text errors (`40`, then `%`) with no fix. It is now one (PN105, still an error: text the tool
// does not read) over the number and its unit, saying why, with a fix that writes its key, as for a
// percentage after a comma (`hfnc 40 L/min, 60 %`).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { applyEdits } from '../../server/src/core/service/text-edits';

const PATIENT = 'patient age 60 y, sex female, height 165 cm\n';
const note = (oxygen: string) => `${PATIENT}@ day 1 08:00\n${oxygen}\nabg ph 7.40, pco2 40, po2 80\n`;
const valuesOf = (text: string) => checkNote(text).analysis.timeline.timepoints[0]!.values;
const onLine = (text: string, line: number) => checkNote(text).findings.filter((f) => f.range.start.line === line);
const codesOn = (text: string, line: number) => onLine(text, line).map((f) => f.code);

describe('a percentage after the flow of a low-flow device', () => {
  it('`mask 10 L/min 40 %`: one stray-text error over `40 %`, saying why, with a fix that writes `fio2 40 %`', () => {
    const text = note('oxygen mask 10 L/min 40 %');
    const found = onLine(text, 2);
    expect(found.map((f) => f.code)).toEqual(['PN105']);
    const f = found[0]!;
    expect(f.severity).toBe('error');
    expect(f.range).toEqual({ start: { line: 2, character: 21 }, end: { line: 2, character: 25 } });
    expect(f.message).toBe('`40 %` after the flow of `mask` is not read: a simple mask is set by its oxygen flow, a percentage is not one of its settings, and the FiO2 it gives is not fixed. If it is an FiO2 measured or worked out, write `fio2 40 %`.');
    expect(f.fixes.map((x) => x.title)).toEqual(['Write `fio2 40 %`']);
    expect(f.fixes[0]!.preferred).toBe(true);
    // Nothing is read from it until then: the flow is.
    expect(valuesOf(text).numberOf('fio2')).toBeNull();
    expect(valuesOf(text).numberOf('o2_flow')).toBe(10);
    const fixed = applyEdits(text, f.fixes[0]!.edits);
    expect(fixed.split('\n')[2]).toBe('oxygen mask 10 L/min fio2 40 %');
    expect(codesOn(fixed, 2)).toEqual([]);
    expect(valuesOf(fixed).numberOf('fio2')).toBeCloseTo(0.4, 10);
    expect(valuesOf(fixed).numberOf('o2_flow')).toBe(10);
  });

  it('glued (`28%`), after a cannula, and after a bare flow', () => {
    const glued = note('oxygen cannula 2 L/min 28%');
    const found = onLine(glued, 2);
    expect(found.map((f) => f.code)).toEqual(['PN105']);
    expect(found[0]!.range).toEqual({ start: { line: 2, character: 23 }, end: { line: 2, character: 26 } });
    expect(found[0]!.message).toBe('`28%` after the flow of `cannula` is not read: a nasal cannula is set by its oxygen flow, a percentage is not one of its settings, and the FiO2 it gives is not fixed. If it is an FiO2 measured or worked out, write `fio2 28%`.');
    const fixed = applyEdits(glued, found[0]!.fixes[0]!.edits);
    expect(fixed.split('\n')[2]).toBe('oxygen cannula 2 L/min fio2 28%');
    expect(codesOn(fixed, 2)).toEqual([]);
    expect(valuesOf(fixed).numberOf('fio2')).toBeCloseTo(0.28, 10);
    const bare = note('oxygen nc 2 28 %');
    expect(codesOn(bare, 2)).toEqual(['PN105']);
    expect(onLine(bare, 2)[0]!.message).toMatch(/^`28 %` after the flow of `nc` is not read: a nasal cannula /);
    expect(applyEdits(bare, onLine(bare, 2)[0]!.fixes[0]!.edits).split('\n')[2]).toBe('oxygen nc 2 fio2 28 %');
  });

  it('after a reservoir mask, and a percentage with more after it', () => {
    const text = note('oxygen nrb 15 L/min 60 %, spo2 94');
    const found = onLine(text, 2).filter((f) => f.code === 'PN105');
    expect(found).toHaveLength(1);
    expect(found[0]!.message).toMatch(/^`60 %` after the flow of `nrb` is not read: a reservoir mask /);
  });

  it('after NIV, CPAP and room air: one finding, with the reason that only the number right after the device is read', () => {
    for (const [line, written, device] of [['oxygen cpap 8 40 %', '40 %', 'cpap'], ['oxygen niv 10 L/min 35%', '35%', 'niv'], ['oxygen air 2 L/min 30 %', '30 %', 'air']] as const) {
      const text = note(line);
      const found = onLine(text, 2).filter((f) => f.code === 'PN105');
      expect(found).toHaveLength(1);
      expect(found[0]!.message).toBe(`\`${written}\` after the number of \`${device}\` is not read: only the number right after the device is read without a key. A percentage on an oxygen line can only be the FiO2: write \`fio2 ${written}\`.`);
      const fixed = applyEdits(text, found[0]!.fixes[0]!.edits);
      expect(fixed.split('\n')[2]).toBe(line.replace(written, `fio2 ${written}`));
      expect(codesOn(fixed, 2).filter((c) => c === 'PN105')).toEqual([]);
    }
  });

  it('what is not a percentage right after the flow stays as it was', () => {
    // Another number, or one in another unit: no key, as before.
    expect(onLine(note('oxygen mask 10 L/min 40'), 2).map((f) => f.message)).toEqual(['`40` has no key; write it as `key value`, e.g. `hr 118`.']);
    // After a comma: the finding of last session, with its own words.
    expect(onLine(note('oxygen mask 8 L/min, 40 %'), 2)[0]!.message).toBe('`40 %` has no key. A percentage on an oxygen line can only be the FiO2: write `fio2 40 %`.');
    // Right after the device: a unit the flow does not take (PN203), offered as the FiO2.
    expect(codesOn(note('oxygen mask 40 %'), 2)).toEqual(['PN203']);
    // A second percentage after the first is no FiO2 either: as before.
    expect(codesOn(note('oxygen mask 10 L/min 40 % 50 %'), 2)).toEqual(['PN105', 'PN105']);
  });

  it('the high-flow and Venturi readings of last session are unchanged', () => {
    expect(codesOn(note('oxygen hfnc 40 L/min 60 %'), 2)).toEqual(['PN323']);
    expect(valuesOf(note('oxygen hfnc 40 L/min 60 %')).numberOf('fio2')).toBeCloseTo(0.6, 10);
    expect(codesOn(note('oxygen hfnc 60 % 40 %'), 2)).toEqual(['PN323', 'PN105']);
    expect(codesOn(note('oxygen hfnc 40 L/min, 60 %'), 2)).toEqual(['PN105']);
    expect(codesOn(note('oxygen venturi 28'), 2)).toEqual(['PN321']);
  });
});
