// A respiratory disorder's timing is read from the HCO3 as the kidney's response to the PaCO2: per
// 10 mmHg below 40, HCO3 falls 2 mmol/L if acute and 4 to 5 if chronic, ± 2 mmol/L (Narins RG,
// Emmett M, Medicine 1980;59:161–187, as adapted in Hong Kong Practitioner 2005;27; Adrogué HJ,
// Madias NE, JASN 2010;21:920–923, from memory). Where the anion gap adds a metabolic acidosis (gap
// above 12 mmol/L: common practice, no source), the acidosis lowers the HCO3 too, so the HCO3 no
// longer tells acute from chronic. An invented salicylate-like gas, PaCO2 15 mmHg and HCO3 12 mmol/L
// with a gap of 140 − (102 + 12) = 26, read as a "chronic respiratory alkalosis" (its HCO3 in the
// chronic 9.5–16 mmol/L) with an added metabolic acidosis; a reviewer would call the timing unknown.
// pH 7.52 with PaCO2 15 gives HCO3 0.0307 × 15 × 10^1.42 = 12.1.
import { describe, expect, it } from 'vitest';
import { derivation } from './helpers';

const note = (gas: string) => `patient age 35 y\n@ day 1 13:00\noxygen room air\nabg ${gas}\n`;

function acidBaseOf(text: string) {
  return derivation(text).interpretations.find((i) => i.topic === 'acid-base');
}

describe('a respiratory disorder beside a metabolic disorder the anion gap adds', () => {
  it('respiratory alkalosis with a gap of 26: no timing, and the reading says why', () => {
    const r = acidBaseOf(note('ph 7.52, pco2 15, po2 120, hco3 12, na 140, cl 102'));
    expect(r?.acidBase).toEqual({ primary: 'respiratory-alkalosis', phase: null, fullyCompensated: false, anionGap: null, suspected: null, added: ['metabolic-acidosis'] });
    expect(r?.text).toBe(
      'Consistent with respiratory alkalosis (pH 7.52, PaCO2 15 mmHg, HCO3 12.0 mmol/L); HCO3 12.0 mmol/L does not tell acute from chronic, as the added metabolic acidosis lowers it too (17–21 mmol/L expected if acute, 10–16 mmol/L if chronic); also consistent with an added metabolic acidosis (anion gap 26 mmol/L, above 12 mmol/L).',
    );
  });

  it('the same gas with a gap of 10: a chronic respiratory alkalosis, as before', () => {
    const r = acidBaseOf(note('ph 7.52, pco2 15, po2 120, hco3 12, na 124, cl 102'));
    expect(r?.acidBase?.phase).toBe('chronic');
    expect(r?.text).toContain('Consistent with chronic respiratory alkalosis');
  });
});
