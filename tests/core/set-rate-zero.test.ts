// PN312: a set rate of 0 in a mode that delivers mandatory breaths (VC, PC, PRVC, SIMV) gives no
// breath unless the patient triggers one (common practice, no source), so the rate or the mode is
// likely mistyped. Minute ventilation VE = VT × RR (common practice, no source): with no measured
// rate, a set rate of 0 gives no VE of 0 as a fact; it is withheld (PN312) or asked for (spontaneous modes).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const pn312 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN312');
const derivation = (text: string, index = 0) => checkNote(text).analysis.derivation(index);

describe('a set rate of 0 in a mode with mandatory breaths (PN312)', () => {
  it('fires on the rate in VC, PC, PRVC and SIMV', () => {
    const [f] = pn312('@ 08:00\nvent mode VC, vt 420 mL, rate 0, peep 8');
    expect(f?.message).toBe('Set rate 0 /min in VC, which delivers mandatory breaths: no breath would be given unless the patient triggers one. Check the rate and the mode; minute ventilation is not worked out from a rate of 0.');
    expect(f?.severity).toBe('warning');
    expect(f?.range.start).toEqual({ line: 1, character: 30 }); // the 0 of `rate 0`
    for (const mode of ['PC', 'PRVC', 'SIMV']) expect(pn312(`@ 08:00\nvent mode ${mode}, rate 0, peep 8`), mode).toHaveLength(1);
  });

  it('stays quiet in spontaneous modes, without a mode, with a set rate, and where nothing is restated', () => {
    expect(pn312('@ 08:00\nvent mode PS, ps 10, rate 0, peep 5')).toEqual([]);
    expect(pn312('@ 08:00\nvent mode CPAP, rate 0, peep 5')).toEqual([]);
    expect(pn312('@ 08:00\nvent vt 420 mL, rate 0, peep 5')).toEqual([]);
    expect(pn312('@ 08:00\nvent mode VC, vt 420 mL, rate 1, peep 5')).toEqual([]);
    // Reported once, where the rate is written; a later timepoint that restates neither is quiet.
    expect(pn312('@ 08:00\nvent mode VC, vt 420 mL, rate 0, peep 5\n@ 09:00\nvent peep 6')).toHaveLength(1);
  });

  it('stays quiet in APRV, whose rate is the release frequency: no releases is continuous pressure with spontaneous breaths, which may be meant (common practice, no source)', () => {
    expect(pn312('@ 08:00\nvent mode APRV, rate 0, peep 25')).toEqual([]);
    // Nor where a rate of 0 is carried into APRV (reported once, under VC), or APRV's rate of 0 carried on.
    expect(pn312('@ 08:00\nvent mode VC, vt 420 mL, rate 0, peep 5\n@ 09:00\nvent mode APRV').map((f) => f.range.start.line)).toEqual([1]);
    expect(pn312('@ 08:00\nvent mode APRV, rate 0, peep 25\n@ 09:00\nvent peep 24')).toEqual([]);
  });

  it('fires where a rate of 0 is written under a mode carried from an earlier line', () => {
    // A rate restated on a later line without the mode: reported there, on the rate.
    const f = pn312('@ 08:00\nvent mode VC, vt 420 mL, rate 14, peep 5\n@ 09:00\nvent rate 0');
    expect(f).toHaveLength(1);
    expect(f[0]?.range.start.line).toBe(3);
  });
});

describe('minute ventilation with a set rate of 0', () => {
  it('is withheld, with the mechanics that follow from it, in a mode with mandatory breaths and no measured rate', () => {
    const d = derivation('patient sex female, height 165 cm\n@ 08:00\nvent mode VC, vt 420 mL, rate 0, peep 8\nabg 7.30/50/90/24');
    expect(d.derived.find((v) => v.id === 'minute_ventilation')).toBeUndefined();
    expect(d.notApplicable.find((n) => n.id === 'minute_ventilation')?.withheldBy).toBe('PN312');
    expect(d.notApplicable.find((n) => n.id === 'ventilatory_ratio')?.withheldBy).toBe('PN312');
  });

  it('comes from the measured rate when there is one: 420 mL × 14 /min = 5.88 L/min', () => {
    const d = derivation('@ 08:00\nvent mode VC, vt 420 mL, rate 0, peep 8\nvitals rr 14');
    expect(d.derived.find((v) => v.id === 'minute_ventilation')?.value).toBeCloseTo(5.88, 6);
  });

  it('asks for a measured rate in a spontaneous mode, never shows 0', () => {
    const d = derivation('@ 08:00\nvent mode PS, ps 10, vt 420 mL, rate 0, peep 5');
    expect(d.derived.find((v) => v.id === 'minute_ventilation')).toBeUndefined();
    expect(d.missing.find((m) => m.id === 'minute_ventilation')?.needs).toEqual(['rr']);
  });

  it('asks for a measured rate in APRV with a release rate of 0, as in a spontaneous mode, never shows 0 or withholds it as a mistake', () => {
    const d = derivation('@ 08:00\nvent mode APRV, vt 420 mL, rate 0, peep 25');
    expect(d.derived.find((v) => v.id === 'minute_ventilation')).toBeUndefined();
    expect(d.notApplicable.find((n) => n.id === 'minute_ventilation')).toBeUndefined();
    expect(d.missing.find((m) => m.id === 'minute_ventilation')?.needs).toEqual(['rr']);
    // With a measured rate: 420 mL × 12 /min = 5.04 L/min.
    expect(derivation('@ 08:00\nvent mode APRV, vt 420 mL, rate 0, peep 25\nvitals rr 12').derived.find((v) => v.id === 'minute_ventilation')?.value).toBeCloseTo(5.04, 6);
  });

  it('is 0 for a measured rate of 0 (apnoea is a measurement)', () => {
    const d = derivation('@ 08:00\nvent mode PS, ps 10, vt 420 mL, peep 5\nvitals rr 0');
    expect(d.derived.find((v) => v.id === 'minute_ventilation')?.value).toBe(0);
  });
});
