// The set inspiratory pressure of pressure control (`pinsp`): a setting, above PEEP (our
// convention, the footing of pressure support), held and carried like the other ventilator
// settings and ended by a change of mode (only PEEP and FiO2 carry across one: our convention,
// common practice, no source). Before it existed, `pinsp 18` was an unknown key offered `pip`, the
// measured peak pressure, so the quick fix turned a setting into a reading.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { fieldById, fieldFor } from '../../server/src/core/fields/registry';

const timepoints = (text: string) => checkNote(text).analysis.timeline.timepoints;

describe('the set inspiratory pressure (`pinsp`)', () => {
  it('is a key of vent lines, read as a setting in cmH2O above PEEP, with no finding', () => {
    const result = checkNote('@ 08:00\nvent mode pc pinsp 18 peep 8 rate 20 fio2 0.5');
    expect(result.findings).toEqual([]);
    const values = result.analysis.timeline.timepoints[0]!.values;
    expect(values.numberOf('insp_pressure')).toBe(18);
    expect(values.numberOf('peep')).toBe(8);
    const field = fieldById('insp_pressure')!;
    expect(field.reading).toBeFalsy();
    expect(field.unit).toBe('cmH2O');
    expect(field.units).toEqual(['cmH2O', 'mbar']);
    expect(field.description).toContain('above PEEP');
    expect(field.boundsSource).toContain('above PEEP');
    // No key of the peak pressure: `pip` stays the measured peak.
    expect(fieldFor('vent', 'pip')?.id).toBe('peak');
    for (const alias of field.aliases) expect(fieldFor('vent', alias)?.id, alias).toBe('insp_pressure');
  });

  it('is read in mbar when written so (1 mbar = 1.01972 cmH2O, from the definitions of the units)', () => {
    const [tp] = timepoints('@ 08:00\nvent mode PC, pinsp 20 mbar, peep 8');
    expect(tp!.values.numberOf('insp_pressure')).toBeCloseTo(20.394, 3);
  });

  it('carries to a later timepoint as a setting', () => {
    const tps = timepoints('@ 08:00\nvent mode PC, pinsp 18, peep 8, rate 20, fio2 0.5\n@ 09:00\nvent fio2 0.4\n@ 10:00\nabg 7.38/42/90/24');
    expect(tps.map((t) => t.values.numberOf('insp_pressure'))).toEqual([18, 18, 18]);
    expect(tps[2]!.values.originOf('insp_pressure')).toBe('carried');
  });

  it('is ended by a change of mode, as every setting but PEEP and FiO2', () => {
    const tps = timepoints('@ 08:00\nvent mode PC, pinsp 18, peep 8, fio2 0.5\n@ 09:00\nvent mode PS, ps 10');
    expect(tps[0]!.values.numberOf('insp_pressure')).toBe(18);
    expect(tps[1]!.values.numberOf('insp_pressure')).toBeNull();
    expect(tps[1]!.values.numberOf('peep')).toBe(8);
    // The same mode restated (in another case) keeps it.
    const same = timepoints('@ 08:00\nvent mode PC, pinsp 18, peep 8\n@ 09:00\nvent mode pc, rate 18');
    expect(same[1]!.values.numberOf('insp_pressure')).toBe(18);
  });

  it('outside its bounds is unusual above 35 and impossible above 60 cmH2O (our bounds, common practice, from memory)', () => {
    const codes = (v: number) => checkNote(`@ 08:00\nvent mode PC, pinsp ${v}, peep 5`).findings.map((f) => f.code);
    expect(codes(25)).toEqual([]);
    expect(codes(40)).toEqual(['PN302']);
    expect(codes(70)).toEqual(['PN301']);
  });
});

describe('a misspelt key nearer a setting than a reading', () => {
  // A fix that turns a setting into a reading changes what the number means (a set 18 read as a
  // measured peak), so a reading is not offered where a setting is at least as near (our rule,
  // common practice of safe fixes, no source).
  const pn201 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN201');

  it('offers `pinsp` first, and never the peak pressure `pip`, for `pinps`, `pnsp` and `pinp`', () => {
    for (const written of ['pinps', 'pnsp', 'pinp']) {
      const [f] = pn201(`@ 08:00\nvent mode PC, ${written} 18, peep 8`);
      expect(f?.message, written).toMatch(new RegExp(`^\`${written}\` is not a key of vent lines\\. Did you mean \`pinsp\``));
      const offered = f!.fixes.map((x) => x.title);
      expect(offered[0], written).toBe('Change to `pinsp`');
      for (const reading of ['pip', 'peak', 'ppeak']) expect(offered, written).not.toContain(`Change to \`${reading}\``);
    }
    // `pip` was one letter from `pinp`, as `pinsp` is; `peep`, two letters off, is a setting too.
    const [pinp] = pn201('@ 08:00\nvent mode PC, pinp 18, peep 8');
    expect(pinp?.message).toBe('`pinp` is not a key of vent lines. Did you mean `pinsp` or `peep`?');
    // Where nothing was set aside, a one-letter slip of a long key is still a safe fix.
    expect(pn201('@ 08:00\nvent mode PC, pinsq 18')[0]?.fixes.map((x) => [x.title, x.preferred === true])).toEqual([['Change to `pinsp`', true]]);
  });

  it('still offers a reading nearer than every setting (`ppeek` is `ppeak`)', () => {
    const [f] = pn201('@ 08:00\nvent mode PC, ppeek 24');
    expect(f?.fixes[0]?.title).toBe('Change to `ppeak`');
  });

  it('sets a reading aside where a setting is as near: `peek` is offered `peep` alone, never applied unasked', () => {
    const [f] = pn201('@ 08:00\nvent mode PC, peek 24');
    expect(f?.message).toBe('`peek` is not a key of vent lines. Did you mean `peep`?');
    expect(f?.fixes.map((x) => x.preferred === true)).toEqual([false]);
  });
});
