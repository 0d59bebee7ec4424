// The acid–base reading names the numbers it rests on, with their units: the gas's pH, PaCO2 and
// HCO3, the expected range it was read against, and the anion gap and delta ratio where they add
// or refine a disorder. Expected HCO3 in respiratory disorders: 24 + k × (PaCO2 − 40) ÷ 10 over the
// span of published coefficients, ± 2 mmol/L (Narins & Emmett, Medicine 1980;59:161–187; Adrogué &
// Madias, JASN 2010;21:920–923, from memory). Anion gap Na − (Cl + HCO3), upper normal 12 mmol/L
// (common practice, no source); albumin correction + 2.5 × (4.0 − albumin g/dL) (Figge J et al.,
// Crit Care Med 1998;26:1807–1810, from memory); delta ratio (AG − 12) ÷ (24 − HCO3) with bands
// < 0.4, 0.4–0.8, 0.8–2, > 2 (Rastegar A, JASN 2007;18:2429–2431; the bands as read in Wikipedia, "Delta ratio").
import { describe, expect, it } from 'vitest';
import { acidBaseLabel } from '../../server/src/core/service/hints';
import type { AcidBaseFinding } from '../../server/src/core/derive/model';
import { derivation, derived, readings } from './helpers';

const reading = (gas: string) => readings(`@ 08:00\noxygen room air\n${gas}`)['acid-base'];

/** The acid–base reading of a gas: its text, and what it decided (the inlay label is made from that). */
function acidBaseReading(gas: string): { text: string; acidBase: AcidBaseFinding } {
  const r = derivation(`@ 08:00\noxygen room air\n${gas}`).interpretations.find((i) => i.topic === 'acid-base');
  if (!r?.acidBase) throw new Error(`no acid–base finding for ${gas}`);
  return { text: r.text, acidBase: r.acidBase };
}

describe('respiratory disorders name the HCO3 ranges they were told apart by', () => {
  it('between the ranges: PaCO2 70, acute 24 + 3 ± 2 = 25–29, chronic 24 + 10.5…15 ± 2 = 32.5–41 mmol/L, HCO3 31.5', () => {
    const { text, acidBase } = acidBaseReading('abg 7.27/70/60/31.5');
    expect(text).toBe('Consistent with respiratory acidosis (pH 7.27, PaCO2 70 mmHg, HCO3 31.5 mmol/L); HCO3 31.5 mmol/L is between the acute and chronic ranges (25–29 mmol/L if acute, 33–41 mmol/L if chronic): evolving, or acute on chronic.');
    expect(acidBaseLabel(acidBase)).toBe('consistent with resp. acidosis, acute on chronic?');
  });

  it('in both ranges: PaCO2 28, acute 24 − 2.4 ± 2 = 19.6–23.6, chronic 24 − 4.8…6 ± 2 = 16–21.2 mmol/L, HCO3 21 — says they overlap, not that the change is too small', () => {
    const { text, acidBase } = acidBaseReading('abg 7.49/28/45/21');
    expect(text).toBe('Consistent with respiratory alkalosis (pH 7.49, PaCO2 28 mmHg, HCO3 21.0 mmol/L); HCO3 21.0 mmol/L is within both the acute (20–24 mmol/L) and the chronic (16.0–21.2 mmol/L) range, which overlap here, so acute cannot be told from chronic.');
    expect(acidBaseLabel(acidBase)).toBe('consistent with resp. alkalosis');
  });
});

describe('the expected HCO3 formula, with its numbers put in, gives the range (Narins & Emmett, Medicine 1980;59:161–187; Adrogué & Madias, JASN 2010;21:920–923, from memory)', () => {
  /** The coefficient the formula of this gas names, a number or a span `(a…b)`: `24 + k × (PaCO2 − 40) ÷ 10 ± 2`. */
  function coefficients(formula: string): number[] {
    const m = /^24 \+ \(?([0-9.…]+)\)? × \(PaCO2 − 40\) ÷ 10 ± 2$/.exec(formula);
    if (!m) throw new Error(`no coefficient in ${formula}`);
    return m[1]!.split('…').map(Number);
  }
  const note = '@ 08:00\noxygen room air\nabg 7.47/27/80/19.5';

  it.each(['hco3_expected_acute', 'hco3_expected_chronic'])('%s: PaCO2 27 mmHg (alkalosis), HCO3 falls: 24 + k × (27 − 40) ÷ 10 ± 2', (id) => {
    const d = derived(note, id);
    const ends = coefficients(d.formula).map((k) => 24 + (k * (27 - 40)) / 10);
    expect(d.range?.low).toBeCloseTo(Math.min(...ends) - 2, 9);
    expect(d.range?.high).toBeCloseTo(Math.max(...ends) + 2, 9);
    // Acute 24 − 2 × 1.3 ± 2 = 19.4–23.4; chronic 24 − (4…5) × 1.3 ± 2 = 15.5–20.8 mmol/L.
    expect([d.range?.low, d.range?.high].map((x) => Math.round(x! * 10) / 10)).toEqual(id.endsWith('acute') ? [19.4, 23.4] : [15.5, 20.8]);
  });

  it.each(['hco3_expected_acute', 'hco3_expected_chronic'])('%s: PaCO2 60 mmHg (acidosis), HCO3 rises: 24 + k × (60 − 40) ÷ 10 ± 2', (id) => {
    const d = derived('@ 08:00\noxygen room air\nabg 7.25/60/70/26', id);
    const ends = coefficients(d.formula).map((k) => 24 + (k * (60 - 40)) / 10);
    expect(d.range?.low).toBeCloseTo(Math.min(...ends) - 2, 9);
    expect(d.range?.high).toBeCloseTo(Math.max(...ends) + 2, 9);
  });
});

describe('the anion gap and the delta ratio are named where they shape the reading', () => {
  it('a low albumin turns a normal gap into a high one: AG 140 − (112 + 10) = 18, corrected 18 + 2.5 × (4.0 − 2.0) = 23 mmol/L; delta ratio (23 − 12) ÷ (24 − 10) = 0.79', () => {
    const { text, acidBase } = acidBaseReading('abg 7.25/23/96/9.8\nlabs na 140, cl 112, hco3 10, albumin 2.0');
    expect(text).toBe('Consistent with metabolic acidosis with high and normal anion-gap components (pH 7.25, PaCO2 23 mmHg, HCO3 9.8 mmol/L; anion gap 23 mmol/L corrected for albumin, delta ratio 0.79), with the expected respiratory response (PaCO2 within the expected 21–25 mmHg).');
    expect(acidBaseLabel(acidBase)).toBe('consistent with met. acidosis, mixed AG');
  });

  it('without albumin the same gap is 18 mmol/L and the delta ratio (18 − 12) ÷ 14 = 0.43', () => {
    expect(reading('abg 7.25/23/96/9.8\nlabs na 140, cl 112, hco3 10')).toMatch(/\(pH 7\.25, PaCO2 23 mmHg, HCO3 9\.8 mmol\/L; anion gap 18 mmol\/L, delta ratio 0\.43\)/);
  });

  it('a high gap beside a normal pH, PaCO2 and HCO3 names the gap and the HCO3 that has not fallen', () => {
    // AG 138 − (100 + 24.4) = 13.6, corrected 13.6 + 2.5 × 2 = 18.6 mmol/L; HCO3 24.4 is not below 24.
    const { text, acidBase } = acidBaseReading('abg 7.36/44/90/24.4\nlabs na 138, cl 100, albumin 2.0');
    expect(text).toBe('Consistent with normal acid–base balance by pH, PaCO2 and HCO3 (pH 7.36, PaCO2 44 mmHg, HCO3 24.4 mmol/L); also consistent with an added metabolic acidosis and metabolic alkalosis (anion gap 19 mmol/L corrected for albumin, above 12 mmol/L, with an HCO3 that has not fallen below 24 mmol/L).');
    expect(acidBaseLabel(acidBase)).toBe('normal pH; consistent with met. acidosis + met. alkalosis');
  });

  it('a high gap with the laboratory bicarbonate not below 24 names that bicarbonate, not the gas HCO3 below 24 it shows beside it', () => {
    // AG 140 − (100 + 24) = 16 mmol/L with the serum bicarbonate, which the gap takes; the gas HCO3 is
    // 22.1 (pH 7.38, PaCO2 38: 0.0307 × 38 × 10^1.28 ≈ 22.2, Henderson–Hasselbalch). A high gap with
    // no fall in bicarbonate: delta ratio above 2 (Rastegar 2007; the bands as read in Wikipedia, "Delta ratio").
    const { text, acidBase } = acidBaseReading('abg 7.38/38/90/22.1\nlabs na 140, cl 100, hco3 24');
    expect(text).toBe('Consistent with normal acid–base balance by pH, PaCO2 and HCO3 (pH 7.38, PaCO2 38 mmHg, HCO3 22.1 mmol/L); also consistent with an added metabolic acidosis and metabolic alkalosis (anion gap 16 mmol/L, above 12 mmol/L, with a serum HCO3 of 24.0 mmol/L, which has not fallen below 24 mmol/L).');
    expect(acidBaseLabel(acidBase)).toBe('normal pH; consistent with met. acidosis + met. alkalosis');
  });

  it('a mixed acidosis names the anion gap of its metabolic part, as a metabolic acidosis does', () => {
    // AG 140 − (95 + 18) = 27 mmol/L, above 12 (common practice, no source); delta ratio (27 − 12) ÷
    // (24 − 18) = 2.50 (Rastegar 2007; the bands as read in Wikipedia, "Delta ratio"), its HCO3 above what the gap explains being the
    // respiratory acidosis's. pH 7.10 fits (0.0307 × 60 × 10^1.0 ≈ 18.4, Henderson–Hasselbalch).
    const { text, acidBase } = acidBaseReading('abg 7.10/60/90/18\nlabs na 140, cl 95');
    expect(text).toBe('Consistent with a mixed metabolic and respiratory acidosis, the metabolic part with a high anion gap (pH 7.10; PaCO2 60 mmHg above 45 mmHg and HCO3 18.0 mmol/L below 22 mmol/L; anion gap 27 mmol/L, delta ratio 2.50).');
    expect(acidBaseLabel(acidBase)).toBe('consistent with mixed acidosis, high AG');
    // With a normal gap (140 − (110 + 18) = 12), the gap is named without a delta ratio.
    expect(reading('abg 7.10/60/90/18\nlabs na 140, cl 110')).toBe('Consistent with a mixed metabolic and respiratory acidosis, the metabolic part with a normal anion gap (pH 7.10; PaCO2 60 mmHg above 45 mmHg and HCO3 18.0 mmol/L below 22 mmol/L; anion gap 12 mmol/L).');
  });

  it('a delta ratio above 2 names it: AG 140 − (95 + 20) = 25, (25 − 12) ÷ (24 − 20) = 3.25', () => {
    expect(reading('abg 7.33/38/95/20\nlabs na 140, cl 95, hco3 20')).toMatch(/; also consistent with an added metabolic alkalosis \(delta ratio 3\.25, above 2\)\.$/);
  });
});

describe('every acid–base reading names pH, PaCO2 and HCO3 with their units', () => {
  const gases = ['abg 7.25/23/95/10', 'abg 7.25/60/70/26', 'abg 7.43/25/95/16.5', 'abg 7.13/55/70/18', 'abg 7.60/30/80/29', 'abg 7.40/40/95/24.4', 'abg 7.27/70/60/31.5'];
  it.each(gases)('%s', (gas) => {
    const text = reading(gas);
    expect(text).toMatch(/^Consistent with /);
    expect(text).toMatch(/pH \d\.\d\d[,;]/);
    expect(text).toMatch(/PaCO2 \d+(?:\.\d)? mmHg/);
    expect(text).toMatch(/HCO3 \d+\.\d mmol\/L/);
  });
});

describe('a value on the end of a range or on a limit on paper is on it here, whatever floating point makes of the sum', () => {
  it('HCO3 29.7 at PaCO2 62 is on the low end of the chronic range, 24 + 3.5 × 2.2 − 2 = 29.7 mmol/L (Narins & Emmett 1980; Adrogué & Madias 2010, from memory), so within it', () => {
    // 24 + 3.5 × 2.2 − 2 is 29.700000000000003 in floating point; pH 7.29 fits (0.0307 × 62 × 10^1.19 ≈ 29.5).
    const { text, acidBase } = acidBaseReading('abg 7.29/62/58/29.7');
    expect(text).toBe('Consistent with chronic respiratory acidosis (pH 7.29, PaCO2 62 mmHg, HCO3 29.7 mmol/L), with HCO3 within the 29.7–37.0 mmol/L expected if chronic (24–28 mmol/L if acute).');
    expect(acidBaseLabel(acidBase)).toBe('consistent with resp. acidosis, chronic');
  });

  it('an anion gap of 135 − (100.1 + 22.9) = 12 mmol/L is on the upper normal of 12 (common practice, no source), not above it', () => {
    // 135 − 100.1 − 22.9 is 12.000000000000007 in floating point. pH 7.39 and PaCO2 38 fit HCO3 22.9
    // (0.0307 × 38 × 10^1.29 ≈ 22.7, Henderson–Hasselbalch).
    const gas = 'abg 7.39/38/90/22.9\nlabs na 135, cl 100.1';
    expect(reading(gas)).toBe('Consistent with normal acid–base balance (pH 7.39, PaCO2 38 mmHg, HCO3 22.9 mmol/L).');
    expect(derived(`@ 08:00\noxygen room air\n${gas}`, 'anion_gap').value).toBeCloseTo(12, 9);
  });

  it('so is the delta ratio: none from a gap of 12 mmol/L, which is not raised (Rastegar 2007; the bands as read in Wikipedia, "Delta ratio")', () => {
    expect(() => derived('@ 08:00\noxygen room air\nabg 7.39/38/90/22.9\nlabs na 135, cl 100.1', 'delta_ratio')).toThrow(/was not derived/);
  });
});

describe('the anion gap of a venous gas takes its venous bicarbonate', () => {
  // Anion gap Na − (Cl + HCO3) (common practice, no source): the bicarbonate of the sample whose
  // sodium and chloride are given. A venous gas's HCO3 is such a bicarbonate; asking for `hco3` on a
  // line that states one sends the writer looking for what is already there.
  const note = '@ 08:00\nvbg 7.28/52/35/23.5, na 138, cl 100, lactate 4.1';

  it('AG 138 − (100 + 23.5) = 14.5 mmol/L from a vbg line, with no bicarbonate asked for', () => {
    const d = derivation(note);
    expect(d.missing.find((m) => m.id === 'anion_gap')).toBeUndefined();
    const gap = derived(note, 'anion_gap');
    expect(gap.value).toBeCloseTo(14.5, 9);
    expect(gap.inputs.map((t) => t.fieldId)).toEqual(['na', 'cl', 'hco3_venous']);
    // Delta ratio (14.5 − 12) ÷ (24 − 23.5) = 5 (Rastegar 2007; the bands as read in Wikipedia, "Delta ratio").
    expect(derived(note, 'delta_ratio').value).toBeCloseTo(5, 9);
  });

  it('the laboratory bicarbonate, then the arterial HCO3, come first, as before', () => {
    const both = '@ 08:00\nvbg 7.28/52/35/23.5, na 138, cl 100\nabg 7.33/45/80/23.0';
    expect(derived(both, 'anion_gap').inputs.map((t) => t.fieldId)).toEqual(['na', 'cl', 'hco3']);
    expect(derived(`${both}\nlabs hco3 22`, 'anion_gap').inputs.map((t) => t.fieldId)).toEqual(['na', 'cl', 'hco3_serum']);
  });

  it('a venous HCO3 that does not fit the venous pH and PvCO2 is doubted as an arterial one is (Henderson–Hasselbalch)', () => {
    // pH 7.28 and PvCO2 52 give 0.0307 × 52 × 10^1.18 ≈ 24.2 mmol/L, not 35.
    const gap = derived('@ 08:00\nvbg 7.28/52/35/35, na 145, cl 98', 'anion_gap');
    expect(gap.notes).toContain('uses the venous HCO3, which does not fit the venous pH and PvCO2 (see PN402)');
  });
});

describe('a PaCO2 outside its expected range is never shown rounded onto an end it is outside', () => {
  it('PaCO2 18.5 below Winters\' 19.2–23.2 mmHg (HCO3 8.8: 1.5 × 8.8 + 8 ± 2) is not "19 mmHg below the expected 19–23"', () => {
    // Albert, Dell & Winters 1967 (from memory); pH 7.29 fits (0.0307 × 18.5 × 10^1.19 ≈ 8.8).
    const text = reading('abg ph 7.29, pco2 18.5, po2 90, hco3 8.8');
    expect(text).toMatch(/; PaCO2 18\.5 mmHg is below the expected 19–23 mmHg: consistent with an added respiratory alkalosis\.$/);
  });
});
