// PN309: in a mode that delivers every set breath (VC, PC, PRVC, SIMV), the measured total rate
// cannot be below the set rate (common practice, no source; the one-breath tolerance is ours).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const pn309 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN309');

describe('measured rate below the set ventilator rate (PN309)', () => {
  it('fires on a measured rate well below the set rate in VC, with the set rate as related information', () => {
    const f = pn309('@ 08:00\nvent mode VC, vt 420, rate 30, peep 8\nvitals rr 8');
    expect(f).toHaveLength(1);
    expect(f[0]?.message).toBe('Measured respiratory rate 8 /min is below the set rate 30 /min in VC, which delivers every set breath: check both rates.');
    expect(f[0]?.range.start).toEqual({ line: 2, character: 7 });
    expect(f[0]?.related?.[0]?.message).toBe('set rate 30 /min');
  });

  it('names a set rate carried from an earlier timepoint', () => {
    const f = pn309('@ 08:00\nvent mode SIMV, rate 16, peep 5\n@ 09:00\nvitals rr 10');
    expect(f).toHaveLength(1);
    expect(f[0]?.related?.[0]?.message).toBe('set rate 16 /min, carried from here');
    expect(f[0]?.related?.[0]?.range.start.line).toBe(1);
  });

  it('allows one breath a minute of difference, and more spontaneous breaths', () => {
    expect(pn309('@ 08:00\nvent mode PC, rate 20, peep 8\nvitals rr 19')).toEqual([]);
    expect(pn309('@ 08:00\nvent mode PC, rate 20, peep 8\nvitals rr 28')).toEqual([]);
  });

  it('stays silent in modes without set breaths, without a mode, and without a measured rate here', () => {
    expect(pn309('@ 08:00\nvent mode PS, rate 20, peep 8\nvitals rr 8')).toEqual([]);
    expect(pn309('@ 08:00\nvent rate 20, peep 8\nvitals rr 8')).toEqual([]);
    expect(pn309('@ 08:00\nvent mode VC, rate 20, peep 8\nvitals rr 8\n@ 09:00\nvitals hr 80')).toHaveLength(1);
  });
});
