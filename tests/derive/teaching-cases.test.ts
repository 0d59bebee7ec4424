// Invented teaching gases, each worked by hand from the rules the readings name, and checked here
// number by number. pH, PaCO2 and HCO3 agree by Henderson–Hasselbalch, HCO3 = 0.0307 × PaCO2 ×
// 10^(pH − 6.1) (standard physiology, from memory). Expected PaCO2 in metabolic acidosis
// 1.5 × HCO3 + 8 ± 2 (Albert MS, Dell RB, Winters RW, Ann Intern Med 1967;66:312–322, from
// memory); in metabolic alkalosis 40 + 0.7 × (HCO3 − 24) ± 2 (Berend K, de Vries APJ, Gans ROB,
// N Engl J Med 2014;371:1434–1445, read in its reproduction). Expected HCO3 per 10 mmHg of PaCO2
// from 40: acute acidosis +1, chronic +3.5 to +5, acute alkalosis −2, chronic −4 to −5, ± 2 mmol/L
// (Narins RG, Emmett M, Medicine 1980;59:161–187, as adapted; Adrogué HJ, Madias NE, JASN
// 2010;21:920–923, from memory). Anion gap Na − (Cl + HCO3), upper normal 12, corrected + 2.5 ×
// (4.0 − albumin g/dL) (Figge J, Jabor A, Kazda A, Fencl V, Crit Care Med 1998;26:1807–1810, read
// in its abstract); delta ratio (AG − 12) ÷ (24 − HCO3), above 2 an added metabolic alkalosis
// (Rastegar A, JASN 2007;18:2429–2431; the bands read in Wikipedia, "Delta ratio").
import { describe, expect, it } from 'vitest';
import { derivation } from './helpers';

function gas(line: string, extra = '') {
  const d = derivation(`patient age 50 y\n@ day 1 08:00\noxygen room air\nabg ${line}\n${extra}`);
  const value = (id: string) => d.derived.find((v) => v.id === id);
  return { d, value, acidBase: d.interpretations.find((i) => i.topic === 'acid-base')! };
}

describe('teaching gases, worked by hand', () => {
  it('acute respiratory acidosis: pH 7.24, PaCO2 60, HCO3 26; acute 24–28, chronic 29–36 mmol/L', () => {
    const g = gas('ph 7.24, pco2 60, po2 62, hco3 26');
    expect(g.value('hco3_calculated')?.value).toBeCloseTo(25.4, 1);
    expect(g.value('hco3_expected_acute')?.range).toEqual({ low: 24, high: 28 });
    expect(g.value('hco3_expected_chronic')?.range).toEqual({ low: 29, high: 36 });
    expect(g.acidBase.acidBase).toMatchObject({ primary: 'respiratory-acidosis', phase: 'acute' });
  });

  it('chronic respiratory alkalosis at altitude, pH 7.42: chronic 24 − 4.8…6 ± 2 = 16–21.2 mmol/L, fully compensated', () => {
    const g = gas('ph 7.42, pco2 28, po2 52, hco3 18');
    const r = g.value('hco3_expected_chronic')?.range;
    expect(r?.low).toBeCloseTo(16, 9);
    expect(r?.high).toBeCloseTo(21.2, 9);
    expect(g.acidBase.acidBase).toMatchObject({ primary: 'respiratory-alkalosis', phase: 'chronic', fullyCompensated: true });
  });

  it('high-gap acidosis, Winters met: HCO3 10 → 21–25 mmHg; gap 136 − 110 = 26; delta 14 ÷ 14 = 1.00', () => {
    const g = gas('ph 7.25, pco2 23, po2 104, hco3 10, na 136, cl 100');
    expect(g.value('paco2_expected')?.range).toMatchObject({ low: 21, high: 25 });
    expect(g.value('anion_gap')?.value).toBe(26);
    expect(g.value('delta_ratio')?.value).toBe(1);
    expect(g.acidBase.acidBase).toMatchObject({ primary: 'metabolic-acidosis', anionGap: 'high-anion-gap', suspected: null });
  });

  it('albumin 1.5 g/dL unmasks a high gap: 11 + 2.5 × 2.5 = 17.25; delta 5.25 ÷ 6 = 0.875', () => {
    const g = gas('ph 7.34, pco2 34, po2 90, hco3 18', 'labs na 136, cl 107, albumin 15 g/L');
    expect(g.value('anion_gap')?.value).toBe(11);
    expect(g.value('anion_gap_albumin_corrected')?.value).toBeCloseTo(17.25, 9);
    expect(g.value('delta_ratio')?.value).toBeCloseTo(0.875, 9);
    expect(g.acidBase.acidBase).toMatchObject({ primary: 'metabolic-acidosis', anionGap: 'high-anion-gap' });
  });

  it('metabolic alkalosis: HCO3 36 → 40 + 8.4 ± 2 = 46.4–50.4 mmHg, PaCO2 48 within', () => {
    const g = gas('ph 7.49, pco2 48, po2 84, hco3 36, na 138, cl 92');
    const r = g.value('paco2_expected')?.range;
    expect(r?.low).toBeCloseTo(46.4, 9);
    expect(r?.high).toBeCloseTo(50.4, 9);
    expect(g.acidBase.acidBase).toMatchObject({ primary: 'metabolic-alkalosis', suspected: null, added: [] });
  });

  it('ketoacidosis with vomiting: gap 140 − 108 = 32, delta 20 ÷ 6 = 3.33, an added metabolic alkalosis', () => {
    const g = gas('ph 7.34, pco2 34, po2 98, hco3 18, na 140, cl 90');
    expect(g.value('delta_ratio')?.value).toBeCloseTo(3.333, 3);
    expect(g.acidBase.acidBase).toMatchObject({ primary: 'metabolic-acidosis', added: ['metabolic-alkalosis'] });
  });

  it('pH 6.90 with PaCO2 120: HCO3 calc 23.2; acute 30–34, so a metabolic acidosis is suspected besides', () => {
    const g = gas('ph 6.90, pco2 120, po2 70, hco3 23');
    expect(g.value('hco3_calculated')?.value).toBeCloseTo(23.24, 2);
    expect(g.value('hco3_expected_acute')?.range).toEqual({ low: 30, high: 34 });
    expect(g.acidBase.acidBase).toMatchObject({ primary: 'respiratory-acidosis', suspected: 'metabolic-acidosis' });
  });

  it('pH 7.40, PaCO2 40 with HCO3 15 (24.5 expected): not read (PN402)', () => {
    const g = gas('ph 7.40, pco2 40, po2 95, hco3 15');
    expect(g.acidBase.acidBase?.primary).toBe('not-read');
  });
});
