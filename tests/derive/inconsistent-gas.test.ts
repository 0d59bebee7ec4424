// A gas whose pH, PaCO2 and HCO3 do not fit together (PN402) gets no acid–base reading, and no
// expected compensation either: both would rest on the same numbers, one of which is wrong.
// Consistency by Henderson–Hasselbalch, HCO3 = 0.0307 × PaCO2 × 10^(pH − 6.1) (Hasselbalch 1916,
// from memory), within max(2 mmol/L, 10 %) (Pneumark's tolerance, no source).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { derivation } from './helpers';

function withheld(note: string, id: string): string | undefined {
  return derivation(note).notApplicable.find((n) => n.id === id)?.reason;
}

function shown(note: string): string[] {
  return derivation(note).derived.map((d) => d.id);
}

describe('expected compensation of a gas that PN402 reports', () => {
  // pH 7.20 and PaCO2 25 mmHg give HCO3 0.0307 × 25 × 10^1.1 ≈ 9.7 mmol/L; 18 is stated. Taken at
  // face value it reads as a metabolic acidosis, and Winters' formula (Albert, Dell & Winters,
  // Ann Intern Med 1967;66:312–322, from memory) would expect PaCO2 1.5 × 18 + 8 ± 2 = 33–37 mmHg.
  const metabolic = '@ 08:00\noxygen room air\nabg 7.20/25/95/18';

  it('is reported by PN402 and holds the reading back', () => {
    expect(checkNote(metabolic).findings.map((f) => f.code)).toContain('PN402');
    expect(derivation(metabolic).interpretations.find((i) => i.topic === 'acid-base')?.text).toMatch(/^Acid–base not interpreted/);
  });

  it('withholds the expected PaCO2, saying why in plain words', () => {
    expect(shown(metabolic)).not.toContain('paco2_expected');
    expect(withheld(metabolic, 'paco2_expected')).toBe('the pH, PaCO2 and HCO3 stated do not fit together (pH and PaCO2 give HCO3 9.7 mmol/L; see PN402), so no compensation is worked out from them');
  });

  it('keeps the HCO3 calculated from pH and PaCO2, which shows the disagreement', () => {
    expect(shown(metabolic)).toEqual(expect.arrayContaining(['hco3_calculated', 'hco3_gap']));
  });

  // pH 7.25 and PaCO2 60 mmHg give HCO3 0.0307 × 60 × 10^1.15 ≈ 26.0 mmol/L; 40 is stated. At face
  // value a respiratory acidosis, with expected HCO3 ranges (Narins & Emmett, Medicine 1980;59:161–187;
  // Adrogué & Madias, JASN 2010;21:920–923, from memory).
  const respiratory = '@ 08:00\noxygen room air\nabg 7.25/60/70/40';

  it('withholds the expected HCO3, acute and chronic', () => {
    expect(checkNote(respiratory).findings.map((f) => f.code)).toContain('PN402');
    const ids = shown(respiratory);
    expect(ids).not.toContain('hco3_expected_acute');
    expect(ids).not.toContain('hco3_expected_chronic');
    expect(withheld(respiratory, 'hco3_expected_acute')).toMatch(/^the pH, PaCO2 and HCO3 stated do not fit together \(pH and PaCO2 give HCO3 26\.0 mmol\/L; see PN402\)/);
    expect(withheld(respiratory, 'hco3_expected_chronic')).toMatch(/see PN402/);
  });

  it('still gives them for a gas that fits (7.25/23/95/10: expected PaCO2 21–25 mmHg)', () => {
    const ok = '@ 08:00\noxygen room air\nabg 7.25/23/95/10';
    const d = derivation(ok).derived.find((x) => x.id === 'paco2_expected');
    expect(d?.range).toEqual({ low: 21, centre: 23, high: 25 });
  });

  it('keeps the anion gap and delta ratio from the gas HCO3, with a note that PN402 doubts it', () => {
    // AG = 140 − (104 + 18) = 18 mmol/L (common practice, no source); Δ ratio (18 − 12) ÷ (24 − 18) = 1.0
    // (Rastegar A, JASN 2007;18:2429–2431, from memory).
    const note = `${metabolic}\nlabs na 140, cl 104`;
    const d = derivation(note);
    const gap = d.derived.find((x) => x.id === 'anion_gap');
    expect(gap?.value).toBe(18);
    expect(gap?.notes).toContain('uses the gas HCO3, which does not fit the pH and PaCO2 (see PN402)');
    expect(d.derived.find((x) => x.id === 'delta_ratio')?.notes).toContain('uses the gas HCO3, which does not fit the pH and PaCO2 (see PN402)');
  });

  it('says nothing of PN402 where the laboratory gave its own bicarbonate', () => {
    const gap = derivation(`${metabolic}\nlabs na 140, cl 104, hco3 18`).derived.find((x) => x.id === 'anion_gap');
    expect(gap?.notes).toEqual(['without potassium']);
  });
});

describe('a gas written in kPa', () => {
  // 7.35 / 40 mmHg / 24 fits (the pH and PaCO2 give 21.8 mmol/L, 2.2 from 24, within 2.45). Written
  // in kPa, 40 mmHg is 5.3 kPa, which read as such is 39.75 mmHg and gives 21.7 mmol/L, 2.3 from 24;
  // but 5.3 kPa stands for 5.25–5.35 kPa, and within that the gas fits: no PN402, as for its twin.
  it('is checked at the resolution its PaCO2 was written with, as the same gas in mmHg', () => {
    const codes = (note: string) => checkNote(note).findings.map((f) => f.code);
    expect(codes('@ 08:00\nabg 7.35/40/80/24')).not.toContain('PN402');
    expect(codes('units gas kPa\n@ 08:00\nabg 7.35/5.3/10.7/24')).not.toContain('PN402');
    expect(codes('@ 08:00\nabg ph 7.35, pco2 5.3 kPa, po2 10.7 kPa, hco3 24')).not.toContain('PN402');
    // Its acid–base reading is given, not held back.
    expect(derivation('units gas kPa\n@ 08:00\nabg 7.35/5.3/10.7/24').interpretations.find((i) => i.topic === 'acid-base')?.text).not.toMatch(/not interpreted/);
    // A gas that does not fit at any PaCO2 its kPa value stands for still does.
    expect(codes('units gas kPa\n@ 08:00\nabg 7.40/5.3/12/15')).toContain('PN402');
  });
});
