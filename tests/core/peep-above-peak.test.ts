// PN314: the peak airway pressure is measured above atmospheric pressure and includes PEEP
// (peak = PEEP + the elastic and resistive pressures of the breath), so a peak below the PEEP in
// force is a contradiction (respiratory mechanics, common practice, no source). Where a plateau is
// in force, PN303 (PEEP above plateau) or PN304 (plateau above peak) already says it: PEEP > peak
// means one of the two pairs is out of order.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const codes = (text: string) => checkNote(text).findings.map((f) => f.code).filter((c) => c === 'PN303' || c === 'PN304' || c === 'PN314');
const pn314 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN314');

describe('PEEP above the peak pressure (PN314)', () => {
  it('fires where no plateau is measured, on the peak, and says why', () => {
    const f = pn314('@ 08:00\nvent mode VC, vt 450, rate 16, peep 12, peak 10');
    expect(f).toHaveLength(1);
    expect(f[0]?.severity).toBe('error');
    expect(f[0]?.message).toBe('PEEP 12 cmH2O is above the peak pressure 10 cmH2O; peak pressure includes PEEP.');
    // `peak 10` on line 1 (0-based), at character 40.
    expect(f[0]?.range.start).toEqual({ line: 1, character: 40 });
  });

  it('names a PEEP carried from an earlier timepoint', () => {
    const f = pn314('@ 08:00\nvent mode PC, rate 16, peep 14\n@ 09:00\nvent peak 12');
    expect(f).toHaveLength(1);
    expect(f[0]?.related?.[0]?.message).toBe('carried from here');
    expect(f[0]?.related?.[0]?.range.start.line).toBe(1);
  });

  it('stays silent for a peak at or above PEEP, and leaves a plateau in force to PN303 and PN304', () => {
    expect(codes('@ 08:00\nvent peep 10, peak 10')).toEqual([]);
    expect(codes('@ 08:00\nvent peep 10, peak 25')).toEqual([]);
    expect(codes('@ 08:00\nvent peep 12, plateau 11, peak 10')).toEqual(['PN303', 'PN304']);
    expect(codes('@ 08:00\nvent peep 12, plateau 13, peak 10')).toEqual(['PN304']);
    // A carried PEEP and a peak measured at an earlier timepoint (readings do not carry): nothing to compare.
    expect(codes('@ 08:00\nvent peep 5, peak 20\n@ 09:00\nvent peep 25')).toEqual([]);
  });

  it('compares in cmH2O whatever the unit written: 12 mbar is 12.2 cmH2O', () => {
    // 1 mbar = 100 Pa and 1 cmH2O = 98.0665 Pa (definitions of the units).
    expect(pn314('@ 08:00\nvent peep 12 mbar, peak 12')[0]?.message).toBe('PEEP 12.24 cmH2O is above the peak pressure 12 cmH2O; peak pressure includes PEEP.');
  });
});
