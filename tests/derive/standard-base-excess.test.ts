// The standard base excess from a gas's pH and HCO3 (`sbe`, `sbe_venous`): SBE = HCO3 − 24.8 + 16.2 ×
// (pH − 7.40), the CLSI guideline's form (C46-A 2001), read in a published study's table (where, in
// tests/physiology/sources-read.test.ts). Invented gases.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { HINT_PICKS, inlayHints } from '../../server/src/core/service';
import { HINT_CATEGORIES } from '../../server/src/core/service/types';
import { derivation, derived } from './helpers';

describe('standard base excess, derived', () => {
  it('of an arterial gas: pH 7.20, HCO3 14 give 14 − 24.8 + 16.2 × (−0.20) = −14.0', () => {
    const v = derived('@ 08:00\nabg 7.20/36/90/14', 'sbe');
    expect(v.value).toBeCloseTo(-14.04, 4);
    expect(v.unit).toBe('mmol/L');
    expect(v.formula).toBe('HCO3 − 24.8 + 16.2 × (pH − 7.40)');
    expect(v.substituted).toBe('14.0 − 24.8 + 16.2 × (7.20 − 7.40) = -14.0 mmol/L');
    expect(v.inputs.map((t) => t.fieldId)).toEqual(['hco3', 'ph']);
    expect(v.source).toContain('CLSI');
    // An arterial gas gives no venous value.
    expect(derivation('@ 08:00\nabg 7.20/36/90/14').derived.some((d) => d.id === 'sbe_venous')).toBe(false);
  });

  it('of a venous gas, from its own pH and HCO3: 7.32 and 25 give 25 − 24.8 + 16.2 × (−0.08) = −1.1', () => {
    const v = derived('@ 08:00\nvbg 7.32/50/40/25', 'sbe_venous');
    expect(v.value).toBeCloseTo(-1.096, 4);
    expect(v.inputs.map((t) => t.fieldId)).toEqual(['hco3_venous', 'ph_venous']);
    expect(v.substituted).toBe('25.0 − 24.8 + 16.2 × (7.32 − 7.40) = -1.1 mmol/L');
    // Both gases at one timepoint: each its own value.
    const both = derivation('@ 08:00\nvbg 7.32/50/40/25\nabg 7.42/37/90/24.1').derived;
    expect(both.find((d) => d.id === 'sbe')?.value).toBeCloseTo(-0.376, 4);
    expect(both.find((d) => d.id === 'sbe_venous')?.value).toBeCloseTo(-1.096, 4);
  });

  it('an HCO3 in mEq/L is the same number', () => {
    expect(derived('@ 08:00\nabg ph 7.20, pco2 36, hco3 14 mEq/L', 'sbe').value).toBeCloseTo(-14.04, 4);
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
    expect(labels.some((l) => l.includes('SBE') || l.includes('-14.0'))).toBe(false);
  });
});
