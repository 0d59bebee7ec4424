// The standard base excess from a gas's pH and HCO3 (`sbe`, `sbe_venous`): the Van Slyke equation
// as standardised, SBE = 0.93 × (HCO3 − 24.4 + 14.8 × (pH − 7.40)) (CLSI C46-A2 2009;
// Siggaard-Andersen, The acid-base status of the blood, 1974; from memory). Invented gases.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { HINT_PICKS, inlayHints } from '../../server/src/core/service';
import { HINT_CATEGORIES } from '../../server/src/core/service/types';
import { derivation, derived } from './helpers';

describe('standard base excess, derived', () => {
  it('of an arterial gas: pH 7.20, HCO3 14 give 0.93 × (14 − 24.4 + 14.8 × (−0.20)) = −12.4', () => {
    const v = derived('@ 08:00\nabg 7.20/36/90/14', 'sbe');
    expect(v.value).toBeCloseTo(-12.4248, 4);
    expect(v.unit).toBe('mmol/L');
    expect(v.formula).toBe('0.93 × (HCO3 − 24.4 + 14.8 × (pH − 7.40))');
    expect(v.substituted).toBe('0.93 × (14.0 − 24.4 + 14.8 × (7.20 − 7.40)) = -12.4 mmol/L');
    expect(v.inputs.map((t) => t.fieldId)).toEqual(['hco3', 'ph']);
    expect(v.source).toContain('from memory');
    // An arterial gas gives no venous value.
    expect(derivation('@ 08:00\nabg 7.20/36/90/14').derived.some((d) => d.id === 'sbe_venous')).toBe(false);
  });

  it('of a venous gas, from its own pH and HCO3: 7.32 and 25 give 0.93 × (25 − 24.4 + 14.8 × (−0.08)) = −0.5', () => {
    const v = derived('@ 08:00\nvbg 7.32/50/40/25', 'sbe_venous');
    expect(v.value).toBeCloseTo(-0.54312, 4);
    expect(v.inputs.map((t) => t.fieldId)).toEqual(['hco3_venous', 'ph_venous']);
    expect(v.substituted).toBe('0.93 × (25.0 − 24.4 + 14.8 × (7.32 − 7.40)) = -0.5 mmol/L');
    // Both gases at one timepoint: each its own value.
    const both = derivation('@ 08:00\nvbg 7.32/50/40/25\nabg 7.42/37/90/24.1').derived;
    expect(both.find((d) => d.id === 'sbe')?.value).toBeCloseTo(-0.00372, 4);
    expect(both.find((d) => d.id === 'sbe_venous')?.value).toBeCloseTo(-0.54312, 4);
  });

  it('an HCO3 in mEq/L is the same number', () => {
    expect(derived('@ 08:00\nabg ph 7.20, pco2 36, hco3 14 mEq/L', 'sbe').value).toBeCloseTo(-12.4248, 4);
  });

  it('names what is missing where an HCO3 is stated without a pH, and is not reported where no HCO3 is stated', () => {
    const d = derivation('@ 08:00\nabg pco2 36, po2 90, hco3 14');
    expect(d.derived.some((x) => x.id === 'sbe')).toBe(false);
    expect(d.missing.find((m) => m.id === 'sbe')?.needs).toEqual(['ph']);
    const none = derivation('@ 08:00\nabg ph 7.20, pco2 36, po2 90');
    expect(none.missing.some((m) => m.id === 'sbe')).toBe(false);
    expect(none.derived.some((x) => x.id === 'sbe')).toBe(false);
  });

  it('has no inlay hint of its own (the acid–base hints are the anion gap\'s)', () => {
    const text = '@ 08:00\nabg 7.20/36/90/14';
    expect(HINT_PICKS['acid-base'].map((p) => p.id)).not.toContain('sbe');
    const labels = inlayHints(checkNote(text), { start: 0, end: 2 }, { categories: new Set(HINT_CATEGORIES) }).map((h) => String(h.label));
    expect(labels.length).toBeGreaterThan(0);
    expect(labels.some((l) => l.includes('SBE') || l.includes('-12.4'))).toBe(false);
  });
});
