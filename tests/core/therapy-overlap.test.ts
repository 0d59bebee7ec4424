// PN311: an oxygen line and a vent line at one timepoint. The format rule (grammar/README.md:
// "An `oxygen` line replaces the previous oxygen line and ends ventilation"; "A `vent` line ends
// oxygen-line therapy") makes the later line win; the settings of the earlier one are dropped,
// and this check says so instead of leaving the writer asked for an FiO2 they wrote.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { hoverAt } from '../../server/src/core/service/hover';

const pn311 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN311');

describe('an oxygen line and a vent line at one timepoint (PN311)', () => {
  it('reports an oxygen line ended by a vent line below it, naming what is lost, with the vent line as related information', () => {
    const f = pn311('@ 08:00\noxygen mask, fio2 0.5\nvent mode VC, vt 450 mL, rate 14, peep 5\nabg 7.40/40/90/24');
    expect(f).toHaveLength(1);
    expect(f[0]?.severity).toBe('warning');
    expect(f[0]?.range).toEqual({ start: { line: 1, character: 0 }, end: { line: 1, character: 6 } });
    expect(f[0]?.message).toBe('This oxygen line is ended by the vent line below it (line 3) at the same timepoint, so its device (mask) and FiO2 0.50 are neither used at this timepoint nor carried. If the therapy changed during this timepoint, give the change a timepoint of its own. If the FiO2 is the ventilator\'s, write it on the vent line.');
    expect(f[0]?.related).toEqual([{ range: { start: { line: 2, character: 0 }, end: { line: 2, character: 4 } }, message: 'this vent line ends the oxygen line above it' }]);
  });

  it('what it reports is what the timeline does: the oxygen line\'s FiO2 is not in force, the vent line\'s settings are', () => {
    const r = checkNote('@ 08:00\noxygen mask, fio2 0.5\nvent mode VC, vt 450 mL, rate 14, peep 5');
    const values = r.analysis.timeline.timepoints[0]!.values;
    expect(values.get('fio2')).toBeUndefined();
    expect(values.get('device')).toBeUndefined();
    expect(values.get('peep')?.stated.value).toBe(5);
  });

  it('reports a vent line ended by an oxygen line below it (coming off the ventilator within one timepoint)', () => {
    const f = pn311('@ 10:00\nvent mode VC, vt 450 mL, rate 14, peep 5, fio2 0.4\noxygen cannula 2');
    expect(f.map((x) => x.range.start.line)).toEqual([1]);
    expect(f[0]?.message).toBe('This vent line is ended by the oxygen line below it (line 3) at the same timepoint, so its mode VC, VT 450 mL, rate 14 /min, PEEP 5 cmH2O and FiO2 0.40 are neither used at this timepoint nor carried. If the therapy changed during this timepoint, give the change a timepoint of its own.');
  });

  it('says one setting in the singular', () => {
    // The vent line states a setting: one of readings only (`vent plateau 20`) ends no oxygen line.
    expect(pn311('@ 11:00\noxygen mask\nvent mode VC, plateau 20')[0]?.message).toContain('so its device (mask) is neither used');
    expect(pn311('@ 11:00\noxygen mask\nvent plateau 20')).toEqual([]);
  });

  it('stays silent for one therapy per timepoint, for a change at a timepoint of its own, and for a vent line of readings only above an oxygen line', () => {
    expect(pn311('@ 08:00\noxygen mask, fio2 0.5\n@ 08:05\nvent mode VC, vt 450 mL, peep 5')).toEqual([]);
    expect(pn311('@ 08:00\nvent mode VC, peep 5\nvent fio2 0.4')).toEqual([]);
    expect(pn311('@ 08:00\noxygen cannula 2\noxygen mask 6')).toEqual([]);
    // Values measured on the ventilator are not settings: nothing of that line is lost.
    expect(pn311('@ 08:00\nvent plateau 20\noxygen cannula 2')).toEqual([]);
  });

  it('reports each ended line once, and every earlier line of either therapy when they alternate', () => {
    const f = pn311('@ 08:00\noxygen mask, fio2 0.5\nvent mode VC, peep 5\noxygen cannula 2');
    expect(f.map((x) => x.range.start.line)).toEqual([1, 2]);
    expect(f[0]?.message).toContain('ended by the vent line below it (line 3)');
    expect(f[1]?.message).toContain('ended by the oxygen line below it (line 4)');
  });

  it('covers lines before the first @ (an implicit first timepoint)', () => {
    expect(pn311('oxygen mask, fio2 0.5\nvent mode VC, peep 5\n@ 09:00\nvitals hr 80').map((x) => x.range.start.line)).toEqual([0]);
  });
});

describe('hover on a setting of a line PN311 reports', () => {
  it('says the value is not in force nor carried, naming the line that ends it; a value in force says nothing of the kind', () => {
    const text = '@ 08:00\noxygen mask, fio2 0.5\nvent mode VC, vt 450 mL, rate 14, peep 5';
    const r = checkNote(text);
    const ended = hoverAt(r, { line: 1, character: 19 })?.markdown ?? '';
    expect(ended).toContain('The `vent` line below it (line 3) ends this `oxygen` line at the same timepoint, so this value is not in force here nor carried (PN311).');
    const inForce = hoverAt(r, { line: 2, character: 37 })?.markdown ?? '';
    expect(inForce).toContain('Stated on line 3');
    expect(inForce).not.toContain('PN311');
    // A change at a timepoint of its own ends nothing at the first.
    const apart = hoverAt(checkNote('@ 08:00\noxygen mask, fio2 0.5\n@ 08:05\nvent mode VC, peep 5'), { line: 1, character: 19 })?.markdown ?? '';
    expect(apart).toContain('Stated on line 2');
    expect(apart).not.toContain('PN311');
  });
});
