// An arterial gas written above the line that changes the FiO2 at the same timepoint (PN324).
// The values in force at a timepoint are those at its end, so such a gas is read on the new FiO2:
// a gas drawn on 0.30 and followed by `oxygen fio2 0.6` gave P/F 70 / 0.6 = 117 in silence, where
// 70 / 0.3 = 233 is what it was drawn on. P/F = PaO2 ÷ FiO2 (ARDS Definition Task Force, JAMA
// 2012;307:2526–2533); PiO2 = FiO2 × (PB − 47), common practice (../shared/REFERENCES.md).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { derived } from '../derive/helpers';

const found = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN324');

describe('a gas above the line that changes the FiO2 at its timepoint (PN324)', () => {
  it('is reported on the gas line, naming the FiO2 used and the one in force before', () => {
    const text = 'patient age 50 y\n@ 08:00\noxygen fio2 0.3\n@ 09:00\nabg 7.40/40/70/24\noxygen fio2 0.6';
    const f = found(text);
    expect(f).toHaveLength(1);
    expect(f[0]!.severity).toBe('warning');
    expect(f[0]!.range.start.line).toBe(4);
    expect(f[0]!.message).toBe('This gas is read with FiO2 0.60 from line 6 below it, which changed the FiO2 at this timepoint (0.30 before it): its P/F, A–a gradient and readings rest on 0.60. If the gas was drawn before the change, give the change a timepoint of its own, or write the FiO2 the gas was drawn on on the gas line (`fio2 0.30`).');
    expect(f[0]!.related?.[0]?.range.start.line).toBe(5);
    // The values stay those of the timepoint's end, as the format says: 70 / 0.6 = 116.7.
    expect(derived(text, 'pf_ratio').value).toBeCloseTo(70 / 0.6, 9);
  });

  it('is reported for a vent line below the gas, and from room air or a cannula (no FiO2 before)', () => {
    expect(found('@ 08:00\noxygen room air\n@ 09:00\nabg 7.40/40/70/24\noxygen fio2 0.3')[0]?.message).toContain('(0.21 before it)');
    const fromCannula = found('@ 08:00\noxygen cannula 2\n@ 09:00\nabg 7.40/40/70/24\nvent mode VC, vt 450, rate 14, peep 5, fio2 0.5');
    expect(fromCannula).toHaveLength(1);
    expect(fromCannula[0]!.message).toContain('which changed the FiO2 at this timepoint (none stated before it)');
    expect(fromCannula[0]!.message).not.toContain('`fio2');
    expect(found('@ 08:00\noxygen fio2 0.5\n@ 09:00\nabg 7.40/40/70/24\noxygen room air')[0]?.message).toContain('read with FiO2 0.21 from line 5');
  });

  it('is silent where the FiO2 is stated above the gas, unchanged, on the gas line, or at the first timepoint', () => {
    expect(found('@ 08:00\noxygen fio2 0.3\n@ 09:00\noxygen fio2 0.6\nabg 7.40/40/70/24')).toEqual([]);
    expect(found('@ 08:00\noxygen fio2 0.3\n@ 09:00\nabg 7.40/40/70/24\noxygen fio2 30 %')).toEqual([]);
    expect(found('@ 08:00\noxygen fio2 0.3\n@ 09:00\nabg 7.40/40/70/24, fio2 0.3\noxygen fio2 0.6')).toEqual([]);
    expect(found('@ 08:00\nabg 7.40/40/70/24\noxygen fio2 0.6')).toEqual([]);
    // A venous gas and a vent line of readings only change nothing the arterial readings rest on.
    expect(found('@ 08:00\noxygen fio2 0.3\n@ 09:00\nvbg 7.35/46/40/25\noxygen fio2 0.6')).toEqual([]);
    expect(found('@ 08:00\nvent mode VC, vt 450, rate 14, peep 5, fio2 0.5\n@ 09:00\nabg 7.40/40/70/24\nvent plateau 20')).toEqual([]);
    // A carried FiO2 is not reported again at later timepoints.
    expect(found('@ 08:00\noxygen fio2 0.3\n@ 09:00\nabg 7.40/40/70/24\noxygen fio2 0.6\n@ 10:00\nabg 7.40/40/90/24')).toHaveLength(1);
  });
});
