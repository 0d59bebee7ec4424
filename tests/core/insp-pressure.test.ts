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

describe('words written for a ventilator pressure that are no key (`ip`, `pmax`)', () => {
  // Neither is an alias: each also means something else. `ip` is commonly written for the set
  // inspiratory pressure (common practice, no source), and is one letter from the measured peak
  // `pip`; `pmax` is the peak airway pressure in LOINC's naming (76531-3, "Pressure.max
  // Respiratory system airway --on ventilator", the peak's code in our registry), but on some
  // ventilators the set pressure limit (from memory). So each is offered what it is written
  // for, and no fix is applied unasked.
  const pn201 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN201');
  const offered = (text: string) => pn201(text).map((f) => [f.message, f.fixes.map((x) => [x.title, x.preferred === true])]);

  it('offers `ip` the set inspiratory pressure `pinsp` first, then the peak `pip`, neither preferred', () => {
    expect(offered('@ 08:00\nvent mode PC, ip 18, peep 5')).toEqual([
      ['`ip` is not a key of vent lines. Did you mean `pinsp` or `pip`?', [['Change to `pinsp`', false], ['Change to `pip`', false]]],
    ]);
  });

  it('offers `pmax` the peak pressure alone (not the mean airway pressure, its spelling neighbour), not preferred', () => {
    expect(offered('@ 08:00\nvent mode VC, vt 450, pmax 30')).toEqual([
      ['`pmax` is not a key of vent lines. Did you mean `peak`?', [['Change to `peak`', false]]],
    ]);
    // In capitals too, as a ventilator's screen writes it.
    expect(offered('@ 08:00\nvent Pmax 30')[0]?.[0]).toBe('`Pmax` is not a key of vent lines. Did you mean `peak`?');
  });

  it('offers no ventilator key on other lines, where the spelling neighbours stay', () => {
    expect(offered('@ 08:00\nvitals ip 30')).toEqual([['`ip` is not a key of vitals lines. Did you mean `bp`?', [['Change to `bp`', false]]]]);
  });
});

// PN317. In pressure control the ventilator holds the airway at PEEP plus the set inspiratory
// pressure during inspiration, so the measured peak reads about their sum (common practice, no
// source). A peak near `pinsp` itself and far below PEEP + `pinsp` says `pinsp` was written as the
// absolute inspiratory level, which Pneumark reads as above PEEP.
describe('a peak pressure near `pinsp` itself, far below PEEP + `pinsp` (PN317)', () => {
  const pn317 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN317');

  it('fires on `pinsp` written as the absolute level, says so, and suggests the level less PEEP', () => {
    const text = '@ 08:00\nvent mode PC, pinsp 26, peep 8, rate 20, fio2 0.5, peak 27';
    const [f, ...more] = pn317(text);
    expect(more).toEqual([]);
    expect(f?.severity).toBe('warning');
    expect(f?.message).toBe('Peak pressure 27 cmH2O is near `pinsp` 26 cmH2O, well below PEEP 8 + `pinsp` 26 = 34 cmH2O: consistent with the absolute inspiratory level written as `pinsp`, which Pneumark reads as the pressure above PEEP. If 26 is the absolute level, write `pinsp 18` (26 less PEEP 8).');
    // On the `pinsp` item, where it is written.
    const line = text.split('\n')[1]!;
    expect(f?.range).toEqual({ start: { line: 1, character: line.indexOf('pinsp') }, end: { line: 1, character: line.indexOf('pinsp') + 'pinsp 26'.length } });
    // The fix writes the level less PEEP, by hand only (it changes a setting).
    expect(f?.fixes.map((x) => [x.title, x.preferred === true])).toEqual([['Write `pinsp 18` (the level less PEEP)', false]]);
    const fixed = checkNote(text.replace('pinsp 26', 'pinsp 18'));
    expect(fixed.findings.map((x) => x.code)).toEqual([]);
  });

  it('fires at a later timepoint on the peak, pointing to the `pinsp` carried from an earlier one', () => {
    const [f] = pn317('@ 08:00\nvent mode PC, pinsp 22, peep 10, rate 18\n@ 09:00\nvent peak 23');
    expect(f?.range.start.line).toBe(3);
    expect(f?.related?.map((r) => [r.range.start.line, r.message])).toEqual([[1, 'carried from here']]);
  });

  it('at the edges: within 2 cmH2O of `pinsp` and more than 4 below PEEP + `pinsp`, with PEEP at least 5', () => {
    const codes = (pinsp: number, peep: number, peak: number) => pn317(`@ 08:00\nvent mode PC, pinsp ${pinsp}, peep ${peep}, peak ${peak}`).length;
    expect(codes(20, 8, 22)).toBe(1); // 2 above pinsp, 6 below the sum
    expect(codes(20, 8, 18)).toBe(1); // 2 below pinsp
    expect(codes(20, 8, 22.5)).toBe(0); // beyond 2 of pinsp
    expect(codes(20, 8, 17.5)).toBe(0);
    expect(codes(20, 5, 20)).toBe(1); // PEEP 5: the sum 25 is 5 above the peak
    expect(codes(20, 4, 20)).toBe(0); // PEEP below 5: the two readings are too close to tell apart
    expect(codes(20, 6, 22)).toBe(0); // 4 below the sum, not more
  });

  it('gives no finding where the peak is about PEEP + `pinsp`, or an input is missing', () => {
    // The counter-example: `pinsp` above PEEP, as Pneumark reads it.
    expect(pn317('@ 08:00\nvent mode PC, pinsp 18, peep 8, peak 27')).toEqual([]);
    expect(pn317('@ 08:00\nvent mode PC, pinsp 18, peep 8, peak 25')).toEqual([]);
    // No peak measured, no PEEP, no `pinsp`.
    expect(pn317('@ 08:00\nvent mode PC, pinsp 26, peep 8')).toEqual([]);
    expect(pn317('@ 08:00\nvent mode PC, pinsp 26, peak 27')).toEqual([]);
    expect(pn317('@ 08:00\nvent mode PC, peep 8, peak 27')).toEqual([]);
    // A peak from an earlier timepoint is a reading: it does not carry.
    expect(pn317('@ 08:00\nvent mode PC, pinsp 18, peep 8, peak 27\n@ 09:00\nvent pinsp 26')).toEqual([]);
    // `pinsp` ended by a change of mode.
    expect(pn317('@ 08:00\nvent mode PC, pinsp 26, peep 8\n@ 09:00\nvent mode VC, vt 420, peak 27')).toEqual([]);
    // A `pinsp` at or below PEEP cannot be an absolute inspiratory level.
    expect(pn317('@ 08:00\nvent mode PC, pinsp 8, peep 10, peak 9')).toEqual([]);
  });

  it('compares in cmH2O a `pinsp` written in mbar, and offers no fix it would have to convert', () => {
    const [f] = pn317('@ 08:00\nvent mode PC, pinsp 26 mbar, peep 8, peak 27');
    expect(f?.message).toContain('near `pinsp` 26.51 cmH2O');
    expect(f?.fixes).toEqual([]);
  });
});
