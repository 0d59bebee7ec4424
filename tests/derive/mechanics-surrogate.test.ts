// The mechanical power surrogate at note level: VE × (Ppeak + PEEP + F/6) / 20 (Giosa L et al.,
// Intensive Care Med Exp 2019;7:61 — formula read in its abstract, PMC6879677), for volume control only.
import { describe, expect, it } from 'vitest';
import { derivation, derived } from './helpers';

describe('mechanical power surrogate', () => {
  it('VT 500 mL × rate 20 = VE 10 L/min; Ppeak 30, PEEP 10, flow 60 L/min → 25 J/min, with its inputs named', () => {
    const d = derived('@ 08:00\nvent mode VC, vt 500 mL, rate 20, peep 10, peak 30, flow 60 L/min', 'mechanical_power_surrogate');
    expect(d.value).toBeCloseTo(25, 9);
    expect(d.inputs.map((t) => t.name)).toEqual(['VE', 'Ppeak', 'PEEP', 'flow']);
  });

  it('is not computed outside volume control, or without a flow', () => {
    const pc = derivation('@ 08:00\nvent mode PC, vt 500 mL, rate 20, peep 10, peak 30, flow 60 L/min');
    expect(pc.derived.find((x) => x.id === 'mechanical_power_surrogate')).toBeUndefined();
    expect(pc.notApplicable.find((x) => x.id === 'mechanical_power_surrogate')?.reason).toBe('the surrogate is for volume control');
    const noFlow = derivation('@ 08:00\nvent mode VC, vt 500 mL, rate 20, peep 10, peak 30');
    expect(noFlow.derived.find((x) => x.id === 'mechanical_power_surrogate')).toBeUndefined();
  });
});
