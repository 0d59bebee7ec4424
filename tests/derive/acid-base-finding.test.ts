// The acid–base reading carries what it decided as data (`acidBase`), set where the reading is
// decided, beside its words: what names the reading in short reads this, never the text. Expected
// ranges as the reading gives them: PaCO2 in metabolic acidosis 1.5 × HCO3 + 8 ± 2 (Albert, Dell &
// Winters, Ann Intern Med 1967;66:312–322); HCO3 in respiratory disorders per 10 mmHg of PaCO2 from
// 40, acute acidosis +1, chronic +3.5 to +5, ± 2 mmol/L (Narins & Emmett, Medicine 1980;59:161–187;
// Adrogué & Madias, JASN 2010;21:920–923, from memory); anion gap Na − (Cl + HCO3), upper normal
// 12 mmol/L (common practice, no source); delta ratio (AG − 12) ÷ (24 − HCO3), > 2 an added
// metabolic alkalosis (Rastegar A, JASN 2007;18:2429–2431, from memory).
import { describe, expect, it } from 'vitest';
import type { AcidBaseFinding } from '../../server/src/core/derive/model';
import { derivation } from './helpers';

function acidBaseOf(text: string) {
  return derivation(text).interpretations.find((i) => i.topic === 'acid-base');
}

const gas = (lines: string) => `@ 08:00\noxygen room air\n${lines}`;

const AS_EXPECTED: AcidBaseFinding = { primary: 'normal', phase: null, fullyCompensated: false, anionGap: null, suspected: null, added: [] };

describe('the acid–base reading says what it decided as data', () => {
  it('an HCO3 between the acute (25–29) and chronic (32.5–41 mmol/L) ranges at PaCO2 70: respiratory acidosis, between', () => {
    const r = acidBaseOf(gas('abg 7.27/70/60/31.5'));
    expect(r?.acidBase).toEqual({ ...AS_EXPECTED, primary: 'respiratory-acidosis', phase: 'intermediate' });
    expect(r?.text).toMatch(/between the acute and chronic ranges/);
  });

  it('a normal pH with HCO3 33 in the chronic range (29–36 mmol/L) at PaCO2 60: chronic and fully compensated', () => {
    expect(acidBaseOf(gas('abg 7.35/60/70/33'))?.acidBase).toEqual({ ...AS_EXPECTED, primary: 'respiratory-acidosis', phase: 'chronic', fullyCompensated: true });
  });

  it('PaCO2 40 above the expected 24–28 mmHg for HCO3 12, gap 140 − (100 + 12) = 28: a high-gap metabolic acidosis, a respiratory acidosis suspected', () => {
    expect(acidBaseOf(gas('abg 7.09/40/90/12\nlabs na 140, cl 100'))?.acidBase).toEqual({ ...AS_EXPECTED, primary: 'metabolic-acidosis', anionGap: 'high-anion-gap', suspected: 'respiratory-acidosis' });
  });

  it('HCO3 23 below both ranges at PaCO2 60 (acute 24–28): respiratory acidosis, a metabolic acidosis suspected, no timing', () => {
    expect(acidBaseOf(gas('abg 7.20/60/70/23'))?.acidBase).toEqual({ ...AS_EXPECTED, primary: 'respiratory-acidosis', suspected: 'metabolic-acidosis' });
  });

  it('a gap of 25 with a delta ratio of 3.25: a metabolic alkalosis added besides the high-gap acidosis', () => {
    expect(acidBaseOf(gas('abg 7.33/38/95/20\nlabs na 140, cl 95, hco3 20'))?.acidBase).toEqual({ ...AS_EXPECTED, primary: 'metabolic-acidosis', anionGap: 'high-anion-gap', added: ['metabolic-alkalosis'] });
  });

  it('normal by pH, PaCO2 and HCO3, with a gap that adds a metabolic acidosis and alkalosis', () => {
    expect(acidBaseOf(gas('abg 7.36/44/90/24.4\nlabs na 138, cl 100, albumin 2.0'))?.acidBase).toEqual({ ...AS_EXPECTED, added: ['metabolic-acidosis', 'metabolic-alkalosis'] });
  });

  it('a mixed acidosis names the gap of its metabolic part', () => {
    expect(acidBaseOf(gas('abg 7.10/60/90/18\nlabs na 140, cl 95'))?.acidBase).toEqual({ ...AS_EXPECTED, primary: 'mixed-acidosis', anionGap: 'high-anion-gap' });
  });

  it('a gas in kPa is decided as its mmHg values are: 9.3 kPa (70 mmHg) with HCO3 34 in the chronic range', () => {
    expect(acidBaseOf(`units gas kPa\n${gas('abg 7.30/9.3/8.0/34')}`)?.acidBase).toEqual({ ...AS_EXPECTED, primary: 'respiratory-acidosis', phase: 'chronic' });
  });

  it('a normal gas is normal, as expected', () => {
    expect(acidBaseOf(gas('abg 7.40/40/95/24'))?.acidBase).toEqual(AS_EXPECTED);
  });

  it('a gas whose pH, PaCO2 and HCO3 do not fit together (PN402) is not read', () => {
    const r = acidBaseOf(gas('abg 7.30/40/90/35'));
    expect(r?.acidBase?.primary).toBe('not-read');
    expect(r?.text).toMatch(/^Acid–base not interpreted/);
  });

  it('no other reading carries an acid–base finding', () => {
    const readings = [...derivation(gas('abg 7.25/60/55/26')).interpretations, ...derivation('@ 08:00\nvbg 7.30/60/40/29').interpretations];
    expect(readings.map((r) => r.topic)).toContain('venous');
    for (const r of readings) expect(r.acidBase === null, r.topic).toBe(r.topic !== 'acid-base');
  });
});
