// A percentage after a high-flow nasal device (`oxygen hfnc 60 %`). A high-flow device is set by a
// total gas flow and by the oxygen fraction of its air–oxygen blender (Guia M et al., "High-flow
// nasal oxygen therapy in acute hypoxemic respiratory failure: concise review on technology and
// initial methodology", Turk Thorac J 2021;22:494–500, read; Li J et al., "Optimizing high-flow
// nasal cannula flow settings in adult hypoxemic patients based on peak inspiratory flow during
// tidal breathing", Ann Intensive Care 2021;11:164, read: the flow set in L/min, the FiO2 titrated
// on its own), and a flow is never written in %: so a number with `%` after `hfnc` can only be its FiO2. It was PN203 "Oxygen
// flow is not measured in %", and nothing was read. It is now read as the FiO2, and said (PN323,
// information), with fixes that write `fio2 60 %` or, for a mistyped flow, `60 L/min`. A flow then
// a percentage (`hfnc 40 L/min 60 %`, before: PN105 twice) gives both. Devices whose FiO2 is not
// set (a cannula, a simple or reservoir mask) keep PN203 with its fix that writes `fio2`; so do
// NIV and CPAP, whose oxygen may be bled in at a flow (common practice, no source).
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { csvCells, csvHeader, exportColumns, timepointCells } from '../../server/src/core/export';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { formatNote } from '../../server/src/core/service';
import { derived } from '../derive/helpers';

const PATIENT = 'patient age 60 y, sex female, height 165 cm\n';
const note = (oxygen: string) => `${PATIENT}@ day 1 08:00\n${oxygen}\nabg ph 7.40, pco2 40, po2 80\n`;
const valuesOf = (text: string) => checkNote(text).analysis.timeline.timepoints[0]!.values;
const codesOn = (text: string, line: number) => checkNote(text).findings.filter((f) => f.range.start.line === line).map((f) => f.code);

describe('a percentage after `hfnc`', () => {
  it('is read as the FiO2, said by PN323 (information) with fixes that write which was meant', () => {
    const text = note('oxygen hfnc 60 %');
    expect(valuesOf(text).numberOf('fio2')).toBeCloseTo(0.6, 10);
    expect(valuesOf(text).numberOf('o2_flow')).toBeNull();
    const found = checkNote(text).findings.filter((f) => f.range.start.line === 2);
    expect(found.map((f) => f.code)).toEqual(['PN323']);
    const f = found[0]!;
    expect(f.severity).toBe('information');
    expect(f.range).toEqual({ start: { line: 2, character: 12 }, end: { line: 2, character: 16 } });
    expect(f.message).toBe('`60 %` after `hfnc` is read as the FiO2 it gives, 60 % (a high-flow device is set by a flow in L/min and an FiO2; a flow is never in %). Write `fio2 60 %` to say so, or `60 L/min` for a flow.');
    expect(f.fixes.map((x) => x.title)).toEqual(['Write `fio2 60 %`', 'Write `60 L/min`']);
    const asFio2 = applyEdits(text, f.fixes[0]!.edits);
    expect(asFio2.split('\n')[2]).toBe('oxygen hfnc fio2 60 %');
    expect(codesOn(asFio2, 2)).toEqual([]);
    expect(valuesOf(asFio2).numberOf('fio2')).toBeCloseTo(0.6, 10);
    const asFlow = applyEdits(text, f.fixes[1]!.edits);
    expect(asFlow.split('\n')[2]).toBe('oxygen hfnc 60 L/min');
    expect(codesOn(asFlow, 2)).toEqual([]);
    expect(valuesOf(asFlow).numberOf('o2_flow')).toBe(60);
  });

  it('glued (`60%`) and under the alias `highflow` too', () => {
    expect(valuesOf(note('oxygen hfnc 60%')).numberOf('fio2')).toBeCloseTo(0.6, 10);
    expect(codesOn(note('oxygen hfnc 60%'), 2)).toEqual(['PN323']);
    expect(valuesOf(note('oxygen highflow 45 %')).numberOf('fio2')).toBeCloseTo(0.45, 10);
    const fix = checkNote(note('oxygen hfnc 60%')).findings.find((x) => x.code === 'PN323')!.fixes[0]!;
    expect(applyEdits(note('oxygen hfnc 60%'), fix.edits).split('\n')[2]).toBe('oxygen hfnc fio2 60%');
  });

  it('feeds P/F, the A–a gradient and the export like a stated FiO2', () => {
    const text = note('oxygen hfnc 60 %');
    // P/F = 80 ÷ 0.6 = 133.3 (Ranieri VM et al., the Berlin Definition, JAMA 2012;307:2526–2533).
    expect(derived(text, 'pf_ratio').value).toBeCloseTo(133.333, 2);
    // PAO2 = 0.6 × (760 − 47) − 40 ÷ 0.8 = 377.8, A–a = 297.8 (common practice, no source).
    expect(derived(text, 'aa_gradient').value).toBeCloseTo(297.8, 1);
    const result = checkNote(text, {}, { keepDerivations: true });
    const csv = csvHeader(exportColumns()) + timepointCells('a.pneu', result, { redactProse: false, shiftDays: 0 }).map((c) => csvCells(c)).join('');
    const row = (parse(csv, { columns: true }) as Record<string, string>[])[0]!;
    expect([row.fio2_fraction, row.fio2_in_force, row.o2_flow_L_min]).toEqual(['0.6', '0.6', '']);
  });

  it('after a flow (`hfnc 40 L/min 60 %`, was PN105 twice) gives both, the percentage said', () => {
    for (const line of ['oxygen hfnc 40 L/min 60 %', 'oxygen hfnc 40 60 %', 'oxygen hfnc 40L/min 60%']) {
      const text = note(line);
      expect(valuesOf(text).numberOf('o2_flow'), line).toBe(40);
      expect(valuesOf(text).numberOf('fio2'), line).toBeCloseTo(0.6, 10);
      expect(codesOn(text, 2), line).toEqual(['PN323']);
    }
    const text = note('oxygen hfnc 40 L/min 60 %');
    const f = checkNote(text).findings.find((x) => x.code === 'PN323')!;
    expect(f.range).toEqual({ start: { line: 2, character: 21 }, end: { line: 2, character: 25 } });
    expect(applyEdits(text, f.fixes[0]!.edits).split('\n')[2]).toBe('oxygen hfnc 40 L/min fio2 60 %');
    expect(codesOn(applyEdits(text, f.fixes[0]!.edits), 2)).toEqual([]);
    // The flow is the number after the device: only the FiO2 is offered, not a second flow.
    expect(f.fixes.map((x) => x.title)).toEqual(['Write `fio2 60 %`']);
  });

  it('a percentage first and a flow after it give both too', () => {
    const text = note('oxygen hfnc 60 % 40 L/min');
    expect(valuesOf(text).numberOf('fio2')).toBeCloseTo(0.6, 10);
    expect(valuesOf(text).numberOf('o2_flow')).toBe(40);
    expect(codesOn(text, 2)).toEqual(['PN323']);
    // Its fix writes the key of each: `fio2` alone would leave the flow after it without one.
    const f = checkNote(text).findings.find((x) => x.code === 'PN323')!;
    const fixed = applyEdits(text, f.fixes[0]!.edits);
    expect(fixed.split('\n')[2]).toBe('oxygen hfnc fio2 60 % flow 40 L/min');
    expect(codesOn(fixed, 2)).toEqual([]);
    expect(valuesOf(fixed).numberOf('o2_flow')).toBe(40);
  });

  it('with a `fio2` of its own on the line: agreeing is no duplicate, disagreeing is PN206 naming both', () => {
    expect(codesOn(note('oxygen hfnc 50 L/min 60 %, fio2 0.6'), 2)).toEqual([]);
    expect(codesOn(note('oxygen hfnc 60 %, fio2 0.6'), 2)).toEqual([]);
    const f = checkNote(note('oxygen hfnc 60 %, fio2 0.5')).findings.filter((x) => x.range.start.line === 2);
    expect(f.map((x) => x.code)).toEqual(['PN206']);
    expect(f[0]!.message).toBe('FiO2 is stated twice on this line, and the two disagree: `60 %` after `hfnc` gives 0.60, and `fio2 0.5` gives 0.50. The `fio2` written (0.50) is used; keep the one that was given.');
    expect(valuesOf(note('oxygen hfnc 60 %, fio2 0.5')).numberOf('fio2')).toBeCloseTo(0.5, 10);
  });

  it('disagreeing on one line: keeping the percentage writes it with its key, so the line is left clean (no PN206, no PN323)', () => {
    for (const [line, kept] of [
      ['oxygen hfnc 40 L/min 60 %, fio2 0.5', 'oxygen hfnc 40 L/min fio2 60 %'],
      ['oxygen hfnc 60 %, fio2 0.5', 'oxygen hfnc fio2 60 %'],
      ['oxygen hfnc 60 % 40 L/min, fio2 0.5', 'oxygen hfnc fio2 60 % flow 40 L/min'],
    ] as const) {
      const text = note(line);
      const f = checkNote(text).findings.find((x) => x.code === 'PN206')!;
      expect(f.fixes[1]!.title).toBe('Keep `60 %` as `fio2 60 %` (remove `fio2 0.5`)');
      const fixed = applyEdits(text, f.fixes[1]!.edits);
      expect(fixed.split('\n')[2]).toBe(kept);
      expect(codesOn(fixed, 2)).toEqual([]);
      expect(valuesOf(fixed).numberOf('fio2')).toBeCloseTo(0.6, 10);
    }
  });

  it('a percentage that is no possible FiO2 is read, and reported as such', () => {
    expect(codesOn(note('oxygen hfnc 15 %'), 2)).toContain('PN323');
    expect(codesOn(note('oxygen hfnc 15 %'), 2)).toContain('PN307');
    expect(valuesOf(note('oxygen hfnc 15 %')).numberOf('fio2')).toBeNull();
  });

  it('the formatter leaves the line as written until the FiO2 is keyed, as after `venturi 28`, and then aligns it', () => {
    expect(formatNote('@ day 1 08:00\noxygen   hfnc   40 L/min   60 %').split('\n')[1]).toBe('oxygen   hfnc   40 L/min   60 %');
    expect(formatNote('@ day 1 08:00\noxygen   hfnc   40 L/min   fio2 60 %').split('\n')[1]).toMatch(/^oxygen +hfnc 40 L\/min fio2 60 %$/);
  });
});

describe('naming NIV for an EPAP beside `hfnc` (PN318) keys the FiO2, which NIV would read as a flow', () => {
  it.each([
    ['oxygen hfnc 60 %, epap 6', 'oxygen niv fio2 60 %, epap 6'],
    ['oxygen hfnc 40 L/min 60 %, epap 6', 'oxygen niv 40 L/min fio2 60 %, epap 6'],
    ['oxygen hfnc 60 % 40 L/min, epap 6', 'oxygen niv fio2 60 % flow 40 L/min, epap 6'],
  ])('`%s`', (line, fixed) => {
    const text = `@ day 1 08:00\n${line}`;
    const pn318 = checkNote(text).findings.find((f) => f.code === 'PN318')!;
    const toNiv = pn318.fixes.find((f) => f.title === 'Change the device to `niv`')!;
    const after = applyEdits(text, toNiv.edits);
    expect(after.split('\n')[1]).toBe(fixed);
    expect(checkNote(after).analysis.timeline.timepoints[0]!.values.numberOf('fio2')).toBeCloseTo(0.6, 10);
    expect(checkNote(after).findings.filter((f) => f.severity === 'error')).toEqual([]);
  });
});

describe('a percentage after other devices stays PN203', () => {
  it.each(['oxygen nasal 28 %', 'oxygen cannula 28 %', 'oxygen mask 40 %', 'oxygen reservoir 80 %', 'oxygen niv 40 %'])('`%s`', (line) => {
    const text = note(line);
    expect(codesOn(text, 2)).toEqual(['PN203']);
    expect(valuesOf(text).numberOf('fio2')).toBeNull();
    // The fix that writes it as the FiO2 is offered first, as before.
    expect(checkNote(text).findings.find((f) => f.code === 'PN203')!.fixes[0]!.title).toMatch(/^Write it as the FiO2: fio2 /);
  });

  it('and a second number after another device stays stray text', () => {
    // One finding over the number and its `%`, with a fix that writes `fio2` (was two, the number
    // and its unit): tests/core/percent-after-low-flow.test.ts.
    expect(codesOn(note('oxygen mask 10 L/min 40 %'), 2)).toEqual(['PN105']);
    expect(valuesOf(note('oxygen mask 10 L/min 40 %')).numberOf('fio2')).toBeNull();
    expect(codesOn(note('oxygen mask 10 L/min 40'), 2)).toEqual(['PN105']);
    // Two flows after `hfnc`: the second is no FiO2, and stays stray text: one finding over the
    // number and its unit, the only unit of the flow (tests/core/keyless-unit.test.ts).
    expect(codesOn(note('oxygen hfnc 40 L/min 50 L/min'), 2)).toEqual(['PN105']);
    expect(valuesOf(note('oxygen hfnc 40 L/min 50 L/min')).numberOf('o2_flow')).toBe(40);
  });
});

// A comma ends the numbers read after the device, as it does everywhere (`hfnc, 40 L/min` and
// `mask, 8 L/min` are stray text too): after it each item is `key value`. So `hfnc 40 L/min, 60 %`
// is not read as the FiO2; but a percentage on an oxygen line can only be the FiO2 (no other key
// of the section takes %), so it is one finding (was two: the number and its `%`) whose message
// says why, with a fix that writes its key.
describe('a percentage after a comma on an oxygen line', () => {
  it('`hfnc 40 L/min, 60 %`: one stray-text error on `60 %`, the fix writes `fio2 60 %`', () => {
    const text = note('oxygen hfnc 40 L/min, 60 %');
    const found = checkNote(text).findings.filter((f) => f.range.start.line === 2);
    expect(found.map((f) => f.code)).toEqual(['PN105']);
    const f = found[0]!;
    expect(f.severity).toBe('error');
    expect(f.range).toEqual({ start: { line: 2, character: 22 }, end: { line: 2, character: 26 } });
    expect(f.message).toBe('`60 %` has no key: after `hfnc` a percentage is read as its FiO2 only among the numbers right after the device, before any comma. A percentage on an oxygen line can only be the FiO2: write `fio2 60 %`.');
    expect(f.fixes.map((x) => x.title)).toEqual(['Write `fio2 60 %`']);
    expect(f.fixes[0]!.preferred).toBe(true);
    // Nothing is read from it until then: the flow is.
    expect(valuesOf(text).numberOf('fio2')).toBeNull();
    expect(valuesOf(text).numberOf('o2_flow')).toBe(40);
    const fixed = applyEdits(text, f.fixes[0]!.edits);
    expect(fixed.split('\n')[2]).toBe('oxygen hfnc 40 L/min, fio2 60 %');
    expect(codesOn(fixed, 2)).toEqual([]);
    expect(valuesOf(fixed).numberOf('fio2')).toBeCloseTo(0.6, 10);
  });

  it('glued (`60%`), after a bare flow, and after the FiO2 first', () => {
    const glued = note('oxygen hfnc 40, 60%');
    const f = checkNote(glued).findings.find((x) => x.range.start.line === 2)!;
    expect(codesOn(glued, 2)).toEqual(['PN105']);
    expect(f.message).toMatch(/^`60%` has no key: after `hfnc` /);
    expect(applyEdits(glued, f.fixes[0]!.edits).split('\n')[2]).toBe('oxygen hfnc 40, fio2 60%');
    expect(codesOn(note('oxygen highflow 40 L/min , 60 %'), 2)).toEqual(['PN105']);
  });

  it('after other devices, the same finding without the words about `hfnc`', () => {
    const text = note('oxygen mask 8 L/min, 40 %');
    const found = checkNote(text).findings.filter((f) => f.range.start.line === 2);
    expect(found.map((f) => f.code)).toEqual(['PN105']);
    expect(found[0]!.message).toBe('`40 %` has no key. A percentage on an oxygen line can only be the FiO2: write `fio2 40 %`.');
    const fixed = applyEdits(text, found[0]!.fixes[0]!.edits);
    expect(fixed.split('\n')[2]).toBe('oxygen mask 8 L/min, fio2 40 %');
    expect(codesOn(fixed, 2)).toEqual([]);
  });

  it('a number after a comma in another unit, or none, stays as it was', () => {
    expect(codesOn(note('oxygen hfnc 40 L/min, 60'), 2)).toEqual(['PN105']);
    expect(checkNote(note('oxygen hfnc 40 L/min, 60')).findings.find((f) => f.code === 'PN105')!.message).toBe('`60` has no key; write it as `key value`, e.g. `hr 118`.');
    expect(codesOn(note('oxygen hfnc, 40 L/min'), 2)).toEqual(['PN105']);
    // Without a comma, a second percentage is no FiO2 either (the first one is): as before.
    expect(codesOn(note('oxygen hfnc 60 % 40 %'), 2)).toEqual(['PN323', 'PN105']);
    // On other lines a keyless percentage is no FiO2: on a vitals line, the SpO2 offered.
    expect(codesOn(`@ day 1 08:00\nvitals hr 80, 94 %\n`, 1)).toEqual(['PN105']);
  });
});
