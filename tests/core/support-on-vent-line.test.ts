// NIV or CPAP written on a vent line (`vent mode NIV, ipap 16, epap 5`). In this format NIV and
// CPAP are written on oxygen lines (`oxygen niv ipap 16, epap 5`, `oxygen cpap 8`: format rule,
// grammar/README.md), so `ipap` and `epap` on a vent line are unknown keys (PN201). They said
// where the keys belong, and offered `peep` for `epap`, which left `ipap` and the mode NIV on the
// vent line. Where the line names NIV (its mode, or the device word as a key) or holds only the
// pressures of NIV or CPAP besides keys an oxygen line takes too (`fio2`, `flow`), PN201 now offers
// one fix, preferred, that writes the line as that oxygen line, its other items, their units and
// its comment kept as written. A line that also holds keys only a vent line takes (`vt`, `rate`,
// `peep`, `ps`, the readings) is not moved: a vent line with a setting ends the support, so moving
// part of it would change what the note says; the message says why. `vent mode CPAP` is the
// ventilator's CPAP mode in this format (its PEEP is `peep`): it is read as such and not moved.
// Our rules, no source.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { codeActions } from '../../server/src/core/service';
import { applyEdits } from '../../server/src/core/service/text-edits';

const note = (line: string) => `@ day 1 08:00\n${line}\nabg ph 7.40, pco2 40, po2 80\n`;
const onLine = (text: string) => checkNote(text).findings.filter((f) => f.range.start.line === 1);
const valuesOf = (text: string) => checkNote(text).analysis.timeline.timepoints[0]!.values;
/** The line after the first fix of the first PN201 finding is applied. */
const moved = (line: string) => {
  const text = note(line);
  const found = onLine(text).find((f) => f.code === 'PN201')!;
  return applyEdits(text, found.fixes[0]!.edits);
};

describe('a vent line that is NIV or CPAP', () => {
  it('`vent mode NIV, ipap 16, epap 5`: each PN201 offers the oxygen line, preferred, and says why', () => {
    const text = note('vent mode NIV, ipap 16, epap 5');
    const found = onLine(text);
    expect(found.map((f) => f.code)).toEqual(['PN201', 'PN201']);
    expect(found[0]!.message).toBe('`ipap` is not a key of vent lines (`ipap` belongs on an oxygen line): NIV and CPAP are written on oxygen lines in this format. Write this line as `oxygen niv ipap 16, epap 5`.');
    expect(found[1]!.message).toBe('`epap` is not a key of vent lines (`epap` belongs on an oxygen line): NIV and CPAP are written on oxygen lines in this format. Write this line as `oxygen niv ipap 16, epap 5`.');
    for (const f of found) {
      // `peep` for `epap` would leave `ipap` and the mode NIV on the vent line: not offered here.
      expect(f.fixes.map((x) => [x.title, x.preferred === true])).toEqual([['Write as `oxygen niv ipap 16, epap 5`', true]]);
    }
  });

  it('the fixed line is clean, and read as NIV with its pressures', () => {
    const fixed = moved('vent mode NIV, ipap 16, epap 5');
    expect(fixed.split('\n')[1]).toBe('oxygen niv ipap 16, epap 5');
    expect(onLine(fixed)).toEqual([]);
    const values = valuesOf(fixed);
    expect(values.wordOf('device')).toBe('niv');
    expect(values.numberOf('ipap')).toBe(16);
    expect(values.numberOf('epap')).toBe(5);
  });

  it.each([
    ['vent mode bilevel, ipap 14, epap 6, fio2 0.4 # on arrival', 'oxygen bilevel ipap 14, epap 6, fio2 0.4 # on arrival'],
    ['vent mode NIV, ipap 16 cmH2O, epap 5 cmH2O, fio2 40 %, flow 2 L/min', 'oxygen niv ipap 16 cmH2O, epap 5 cmH2O, fio2 40 %, flow 2 L/min'],
    ['vent ipap 16, mode NIV, epap 5', 'oxygen niv ipap 16, epap 5'],
    ['vent ipap 16, epap 5, fio2 0.35', 'oxygen niv ipap 16, epap 5, fio2 0.35'],
    ['vent niv ipap 16, epap 5', 'oxygen niv ipap 16, epap 5'],
    ['vent ipap 16, epap 5, niv', 'oxygen niv ipap 16, epap 5'],
    // A section word followed by one blank where that is where the formatter starts the items after
    // it (`ventilator mode`) is laid out: the oxygen line keeps the formatter's column, as a rename does.
    ['ventilator mode NIV, ipap 16, epap 5', 'oxygen    niv ipap 16, epap 5'],
    ['vent      mode NIV, ipap 16, epap 5', 'oxygen    niv ipap 16, epap 5'],
    ['  vent mode NIV ipap 16 epap 5', '  oxygen niv ipap 16 epap 5'],
  ])('`%s` → `%s`, clean', (line, expected) => {
    const fixed = moved(line);
    expect(fixed.split('\n')[1]).toBe(expected);
    expect(onLine(fixed)).toEqual([]);
    expect(valuesOf(fixed).numberOf('ipap')).toBe(valuesOf(note(expected)).numberOf('ipap'));
  });

  it('keeps the flow and the FiO2 as read on the oxygen line', () => {
    const values = valuesOf(moved('vent mode NIV, ipap 16 cmH2O, epap 5 cmH2O, fio2 40 %, flow 2 L/min'));
    expect(values.numberOf('fio2')).toBeCloseTo(0.4, 10);
    expect(values.numberOf('o2_flow')).toBe(2);
  });

  it('`vent cpap 8`: the oxygen line `oxygen cpap 8`, preferred, and `peep` still offered for a ventilator\'s CPAP', () => {
    const text = note('vent cpap 8');
    const [found] = onLine(text);
    expect(found!.message).toBe('`cpap` is not a key of vent lines: NIV and CPAP are written on oxygen lines in this format. Write this line as `oxygen cpap 8`, or `peep` for a ventilator\'s PEEP.');
    expect(found!.fixes.map((x) => [x.title, x.preferred === true])).toEqual([['Write as `oxygen cpap 8`', true], ['Change to `peep`', false]]);
    const fixed = applyEdits(text, found!.fixes[0]!.edits);
    expect(fixed.split('\n')[1]).toBe('oxygen cpap 8');
    expect(onLine(fixed)).toEqual([]);
    expect(valuesOf(fixed).wordOf('device')).toBe('cpap');
    expect(valuesOf(fixed).numberOf('cpap_level')).toBe(8);
    const peep = applyEdits(text, found!.fixes[1]!.edits);
    expect(peep.split('\n')[1]).toBe('vent peep 8');
    expect(onLine(peep)).toEqual([]);
  });

  it.each([
    ['vent fio2 0.5, cpap 8 cmH2O', 'oxygen cpap 8 cmH2O, fio2 0.5', 8],
    ['vent level 8, fio2 0.5', 'oxygen cpap level 8, fio2 0.5', 8],
    ['vent pressure 7', 'oxygen cpap pressure 7', 7],
  ])('`%s` → `%s`, read as CPAP', (line, expected, level) => {
    const fixed = moved(line);
    expect(fixed.split('\n')[1]).toBe(expected);
    expect(onLine(fixed)).toEqual([]);
    expect(valuesOf(fixed).wordOf('device')).toBe('cpap');
    expect(valuesOf(fixed).numberOf('cpap_level')).toBe(level);
  });

  it('`vent epap 6`: the oxygen line first, and `peep`, which alone leaves a clean vent line', () => {
    const [found] = onLine(note('vent epap 6'));
    expect(found!.fixes.map((x) => [x.title, x.preferred === true])).toEqual([['Write as `oxygen niv epap 6`', true], ['Change to `peep`', false]]);
  });

  it('the whole-line fix is applied once by "fix all", though two findings offer it', () => {
    const text = note('vent mode NIV, ipap 16, epap 5');
    const result = checkNote(text);
    const all = codeActions(result, { start: { line: 0, character: 0 }, end: { line: 3, character: 0 } }).find((a) => a.kind === 'source.fixAll');
    expect(all).toBeDefined();
    expect(applyEdits(text, all!.edits).split('\n')[1]).toBe('oxygen niv ipap 16, epap 5');
  });
});

describe('what is not moved', () => {
  it('a line that also holds keys only a vent line takes: no move, and the message says why', () => {
    const found = onLine(note('vent mode NIV, ipap 16, epap 5, vt 450, rate 14'));
    expect(found.map((f) => f.code)).toEqual(['PN201', 'PN201']);
    expect(found[0]!.message).toBe('`ipap` is not a key of vent lines (`ipap` belongs on an oxygen line). NIV and CPAP are written on oxygen lines in this format, but this line also holds `vt` and `rate`, which an oxygen line does not take, so no fix moves it: write the NIV on an oxygen line (a vent line of readings beside it keeps what the device measured), or a ventilator\'s mode with the keys of a vent line (`peep`, `ps`).');
    expect(found[0]!.fixes).toEqual([]);
    // `epap` keeps its `peep`: with a ventilator's keys on the line, the ventilator's PEEP is a reading.
    expect(found[1]!.fixes.map((x) => x.title)).toEqual(['Change to `peep`']);
  });

  it('a line that does not name NIV keeps today\'s message and offers', () => {
    expect(onLine(note('vent ipap 16, epap 5, vt 450')).map((f) => [f.message, f.fixes.map((x) => x.title)])).toEqual([
      ['`ipap` is not a key of vent lines (`ipap` belongs on an oxygen line).', []],
      ['`epap` is not a key of vent lines (`epap` belongs on an oxygen line). Did you mean `peep`?', ['Change to `peep`']],
    ]);
    expect(onLine(note('vent mode PS, ps 8, epap 6')).map((f) => f.fixes.map((x) => x.title))).toEqual([['Change to `peep`']]);
  });

  it('pressures of NIV and CPAP together: no move (one of them would be a pressure the support does not give, PN318)', () => {
    for (const line of ['vent ipap 16, level 8', 'vent mode NIV, level 8', 'vent cpap 8, epap 5']) {
      for (const f of onLine(note(line))) expect(f.fixes.map((x) => x.title).filter((t) => t.startsWith('Write as')), line).toEqual([]);
    }
  });

  it('a section word with a comma glued to it (`vent,ipap 16`) is left to that finding first', () => {
    for (const f of onLine(note('vent,ipap 16'))) expect(f.fixes.map((x) => x.title).filter((t) => t.startsWith('Write as'))).toEqual([]);
  });

  // The ventilator's CPAP mode is a mode of this format (its level written `peep`; the rate there a
  // backup rate): the line is read as written, and `cpap` written for its level is offered `peep`.
  it('`vent mode CPAP, peep 8` is the ventilator\'s CPAP mode: nothing to say', () => {
    const text = note('vent mode CPAP, peep 8');
    expect(onLine(text)).toEqual([]);
    expect(valuesOf(text).wordOf('mode')).toBe('CPAP');
    expect(valuesOf(text).numberOf('peep')).toBe(8);
    expect(onLine(note('vent mode CPAP, cpap 8, fio2 0.4')).map((f) => f.fixes.map((x) => x.title))).toEqual([['Change to `peep`']]);
  });

  it('`vent mode NIV, peep 5, ps 10` (a ventilator\'s NIV mode with its own keys) has nothing to say', () => {
    expect(onLine(note('vent mode NIV, peep 5, ps 10, fio2 0.4'))).toEqual([]);
  });
});
