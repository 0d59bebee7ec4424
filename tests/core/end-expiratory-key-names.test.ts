// The end-expiratory pressure has a name per line: `peep` on a vent line (in mode CPAP too), `epap`
// on a NIV oxygen line, `level` for CPAP on an oxygen line (format rule, grammar/README.md). A name
// of one written on the other line is offered the name that line uses.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { applyEdits } from '../../server/src/core/service/text-edits';

const pn201 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN201');

describe('names of the end-expiratory pressure on the wrong line', () => {
  it('`vent mode CPAP, cpap 8`: offered `peep`, the vent line\'s name for it', () => {
    const text = '@ 08:00\nvent mode CPAP, cpap 8, fio2 0.4';
    const [f] = pn201(text);
    expect(f?.message).toMatch(/Did you mean `peep`\?$/);
    expect(f?.fixes.map((x) => x.title)).toEqual(['Change to `peep`']);
    const fixed = applyEdits(text, f!.fixes[0]!.edits);
    expect(fixed).toBe('@ 08:00\nvent mode CPAP, peep 8, fio2 0.4');
    expect(pn201(fixed)).toEqual([]);
  });

  it('`vent epap 6`: offered `peep` first', () => {
    expect(pn201('@ 08:00\nvent mode PS, ps 8, epap 6')[0]?.fixes[0]?.title).toBe('Change to `peep`');
  });

  it('`oxygen niv ipap 14, peep 6`: offered `epap`, and on CPAP `level`', () => {
    expect(pn201('@ 08:00\noxygen niv ipap 14, peep 6')[0]?.fixes.map((x) => x.title)).toEqual(['Change to `epap`']);
    expect(pn201('@ 08:00\noxygen cpap, peep 8, fio2 0.5')[0]?.fixes.map((x) => x.title)).toEqual(['Change to `level`']);
  });

  // A device that gives no set airway pressure (a mask, a reservoir mask, high flow) has no name for
  // one: an `epap` there is reported in turn (PN318) and not used, so it is not offered.
  it('`oxygen mask, peep 6`: offered no `epap` or `level`, which the device does not give either', () => {
    for (const line of ['oxygen mask, peep 6', 'oxygen nrb 15, peep 6', 'oxygen hfnc 40, fio2 0.5, peep 5', 'oxygen room air, peep 5', 'oxygen device mask, peep 6']) {
      const [f] = pn201(`@ 08:00\n${line}`);
      expect(f?.message, line).toBe('`peep` is not a key of oxygen lines (`peep` belongs on a vent line).');
      expect(f?.fixes, line).toEqual([]);
    }
    // With no device, an EPAP makes the line NIV: offered as before, and so beside `bilevel`.
    expect(pn201('@ 08:00\noxygen peep 6, fio2 0.4')[0]?.fixes.map((x) => x.title)).toEqual(['Change to `epap`']);
    expect(pn201('@ 08:00\noxygen bilevel ipap 12, peep 5')[0]?.fixes.map((x) => x.title)).toEqual(['Change to `epap`']);
  });
});
