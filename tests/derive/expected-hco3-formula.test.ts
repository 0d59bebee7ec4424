// The expected HCO3 of a respiratory disorder, its formula with the numbers put in: the coefficient
// its PaCO2 takes, not both branches of the template. HCO3 up 1 (acute) and 3.5–5 (chronic) mmol/L
// per 10 mmHg of PaCO2 above 40, down 2 (acute) and 4–5 (chronic) per 10 mmHg below it, ± 2 mmol/L:
// Narins RG, Emmett M. Simple and mixed acid-base disorders: a practical approach. Medicine
// (Baltimore) 1980;59:161–187, its coefficients read in its table as adapted in Hong Kong
// Practitioner 2005;27, table 3 (hkcfp.org.hk), the citation from memory; the 4–5 of a chronic
// alkalosis: Adrogué HJ, Madias NE, J Am Soc Nephrol 2010;21:920–923 (from memory). Invented notes only.
import { describe, expect, it } from 'vitest';
import { derived } from './helpers';

describe('the expected HCO3 of a respiratory disorder, with the numbers put in', () => {
  it('in a respiratory acidosis, takes the coefficients of a PaCO2 above 40 mmHg (Narins and Emmett 1980)', () => {
    const text = '@ 08:00\nabg 7.29/49/74/23';
    const acute = derived(text, 'hco3_expected_acute');
    // 24 + 1 × 0.9 = 24.9, ± 2.
    expect(acute.formula).toBe('24 + 1 × (PaCO2 − 40) ÷ 10 ± 2');
    expect(acute.substituted).toBe('24 + 1 × (49 − 40) ÷ 10 ± 2 = 22.9–26.9 mmol/L');
    // 24 + 3.5 × 0.9 − 2 = 25.15 to 24 + 5 × 0.9 + 2 = 30.5.
    expect(derived(text, 'hco3_expected_chronic').substituted).toBe('24 + (3.5…5) × (49 − 40) ÷ 10 ± 2 = 25–31 mmol/L');
  });

  it('in a respiratory alkalosis, takes those of a PaCO2 below 40 mmHg (Narins and Emmett 1980; Adrogué and Madias 2010)', () => {
    const text = '@ 08:00\nabg 7.47/27/33/19.5';
    // 24 − 2 × 1.3 = 21.4, ± 2; chronic 24 − 5 × 1.3 − 2 = 15.5 to 24 − 4 × 1.3 + 2 = 20.8.
    expect(derived(text, 'hco3_expected_acute').substituted).toBe('24 + 2 × (27 − 40) ÷ 10 ± 2 = 19–23 mmol/L');
    expect(derived(text, 'hco3_expected_chronic').substituted).toBe('24 + (4…5) × (27 − 40) ÷ 10 ± 2 = 16–21 mmol/L');
  });

  it('never writes a branch the gas does not take, nor words, among the numbers', () => {
    for (const text of ['@ 08:00\nabg 7.29/49/74/23', '@ 08:00\nabg 7.47/27/33/19.5', '@ 08:00\nunits gas kPa\nabg 7.30/7.5/9.5/26']) {
      for (const id of ['hco3_expected_acute', 'hco3_expected_chronic']) expect(derived(text, id).substituted).not.toMatch(/acidosis|alkalosis|\|/);
    }
  });
});
