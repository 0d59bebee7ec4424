// A low-flow device's FiO2 estimate outside the flows its rough rule is quoted for, and the ROX
// index's thresholds by the hours of high flow, on invented notes.
// Nasal cannula FiO2 ≈ 0.21 + 0.04 per L/min up to 6 L/min; simple mask ≈ 0.35 at 5 L/min rising to
// ≈ 0.55 at 10 L/min (both common practice, no source: the rules of physiology/oxygen-transport.ts).
// ROX = (SpO2 ÷ FiO2) ÷ RR (Roca O, Messika J, Caralt B, et al. J Crit Care 2016, from memory); ROX
// ≥ 4.88 at 2, 6 or 12 h of high flow associated with a lower risk of intubation, and < 2.85, < 3.47
// and < 3.85 at 2, 6 and 12 h predicting failure (Roca O, Caralt B, Messika J, et al. An index
// combining respiratory rate and oxygenation to predict outcome of nasal high-flow therapy. Am J
// Respir Crit Care Med 2019, read in its abstract).
import { describe, expect, it } from 'vitest';
import { derivation, derived } from './helpers';

const onOxygen = (oxygen: string) => `@ 08:00\noxygen ${oxygen}\nvitals spo2 92 %, rr 24\n`;

describe('a low-flow FiO2 estimate outside its rule', () => {
  it('is given within the flows of the rule (cannula 6 L/min: 0.45; mask 5 L/min: 0.35)', () => {
    expect(derived(onOxygen('cannula 6 L/min'), 'fio2_estimated').value).toBeCloseTo(0.45, 10);
    expect(derived(onOxygen('mask 5 L/min'), 'fio2_estimated').value).toBeCloseTo(0.35, 10);
  });

  it('is not given above 6 L/min by cannula, and says why where `show` and hovers read it', () => {
    const d = derivation(onOxygen('cannula 8 L/min'));
    expect(d.derived.find((v) => v.id === 'fio2_estimated')).toBeUndefined();
    const na = d.notApplicable.find((n) => n.id === 'fio2_estimated');
    expect(na?.explained).toBe(true);
    expect(na?.reason).toBe('the cannula rule is quoted for flows up to 6 L/min, not 8.0 L/min');
  });

  it('is not given below 5 L/min by simple mask, and says why', () => {
    const na = derivation(onOxygen('mask 3 L/min')).notApplicable.find((n) => n.id === 'fio2_estimated');
    expect(na?.explained).toBe(true);
    expect(na?.reason).toBe('the simple mask rule is quoted for flows from 5 to 10 L/min, not 3.0 L/min');
  });
});

describe('the ROX index note', () => {
  it('gives the thresholds at 2, 6 and 12 h of high flow, not those of 12 h alone', () => {
    const rox = derived(onOxygen('hfnc 50 L/min, fio2 0.6'), 'rox_index');
    expect(rox.notes[0]).toBe('≥ 4.88 at 2, 6 or 12 h of high flow was associated with success; below 2.85 at 2 h, 3.47 at 6 h and 3.85 at 12 h with failure (Roca 2019)');
    // High flow from the note's first timepoint: why no hour's thresholds are read (tests/derive/rox-hours.test.ts).
    expect(rox.notes[1]).toMatch(/^not read against the 2, 6 or 12 h thresholds/);
  });
});
