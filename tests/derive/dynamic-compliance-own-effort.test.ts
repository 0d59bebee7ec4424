// Dynamic compliance, VT ÷ (Ppeak − PEEP) (standard respiratory mechanics; common practice, no
// source), is the respiratory system's compliance only where the ventilator alone moves the volume.
// Under the spontaneous family (mode PS or CPAP, or with no mode NIV or CPAP of the oxygen line:
// fields/modes.ts `familyInForce`) the patient's own inspiratory effort draws in part of the volume,
// which the airway pressure does not show, so the quotient is higher than the compliance by an
// unknown amount (common practice, no source). It is withheld there with its reason, shown where it
// would have been (hover, `show`), and no tidal volume is asked for to get it. Invented notes.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';

const at = (text: string, i = 0) => checkNote(text).analysis.derivation(i)!;
const cdyn = (text: string, i = 0) => at(text, i).derived.find((v) => v.id === 'compliance_dynamic');
const why = (text: string, i = 0) => at(text, i).notApplicable.find((n) => n.id === 'compliance_dynamic');

describe('dynamic compliance under spontaneous breathing', () => {
  it('under PS: not worked out, with the reason, explained where it would have been', () => {
    const text = '@ 08:00\nvent mode PS, ps 10, peep 5, vt 450, peak 15';
    expect(cdyn(text)).toBeUndefined();
    const n = why(text)!;
    expect(n.explained).toBe(true);
    expect(n.reason).toBe("not worked out under pressure support: the patient's own inspiratory effort draws in part of the volume, which the airway pressure does not show, so VT ÷ (Ppeak − PEEP) is higher than the respiratory system's compliance by an unknown amount; a plateau of a passive breath (an inspiratory hold) gives the static compliance");
  });

  it('under the CPAP mode, under CPAP and under NIV of an oxygen line', () => {
    expect(why('@ 08:00\nvent mode CPAP, peep 8, vt 400, peak 9')?.reason).toMatch(/^not worked out under CPAP: .*VT ÷ \(Ppeak − CPAP\) is no compliance/);
    expect(why('@ 08:00\noxygen cpap level 8, fio2 0.4\nvent vt 400, peak 12')?.reason).toMatch(/^not worked out under CPAP: /);
    expect(why('@ 08:00\noxygen niv ipap 16, epap 6, fio2 0.4\nvent vt 480, peak 16')?.reason).toMatch(/^not worked out under NIV: .*VT ÷ \(Ppeak − EPAP\)/);
  });

  it('asks for no tidal volume to get it where none is written', () => {
    expect(at('@ 08:00\nvent mode PS, ps 10, peep 5\n@ 09:00\nvent peak 15', 1).missing.map((m) => m.id)).not.toContain('compliance_dynamic');
  });

  it('is worked out as before where the ventilator delivers the breath: VC 450 ÷ (20 − 5) = 30, PC 500 ÷ (23 − 5) ≈ 27.8, PRVC 450 ÷ (18 − 8) = 45', () => {
    expect(cdyn('@ 08:00\nvent mode VC, vt 450, peep 5, peak 20')?.value).toBeCloseTo(30, 9);
    expect(cdyn('@ 08:00\nvent mode PC, pinsp 18, peep 5, vt 500, peak 23')?.value).toBeCloseTo(500 / 18, 9);
    expect(cdyn('@ 08:00\nvent mode PRVC, vt 450, peep 8, peak 18')?.value).toBeCloseTo(45, 9);
    // No mode and no support: as before.
    expect(cdyn('@ 08:00\nvent vt 450, peep 5, peak 20')?.value).toBeCloseTo(30, 9);
  });

  it('`show` says why on an n/a line', async () => {
    const io = memoryIo({ stdin: '@ 08:00\nvent mode PS, ps 10, peep 5, vt 450, peak 15\n' });
    await run(['show', '-'], io);
    expect(io.out()).toContain('n/a      Cdyn: not worked out under pressure support: ');
  });

  it('PN407 (a compliance no respiratory system gives) reads the peak only under VC and PRVC: nothing under PS', () => {
    // 450 ÷ (6 − 5) = 450 mL/cmH2O would be above the ceiling; under PS the patient's effort can move it.
    expect(checkNote('@ 08:00\nvent mode PS, ps 1, peep 5, vt 450, peak 6').findings.map((f) => f.code)).not.toContain('PN407');
    expect(checkNote('@ 08:00\nvent mode VC, vt 450, peep 5, peak 6').findings.map((f) => f.code)).toContain('PN407');
  });
});
