// The ventilation reading and the acid–base reading of one gas must not contradict each other.
// In a metabolic acidosis with HCO3 12 mmol/L, Winters' formula expects a PaCO2 of 1.5 × 12 + 8 ± 2
// = 24–28 mmHg (Albert MS, Dell RB, Winters RW, Ann Intern Med 1967;66:312–322; the coefficients
// from memory, read as 1.54 × HCO3 + 8.36 ± 2.2 in table 3 of a 2022 review in Kidney360,
// 3:1458–1466): a PaCO2 of 38 mmHg, inside the 35–45 mmHg reference interval (common practice, no
// source), is above it, and the acid–base reading says "an added respiratory acidosis"; the
// ventilation reading called the same PaCO2 "normal ventilation". Likewise in a metabolic alkalosis
// with HCO3 36, 40 + 0.7 × (36 − 24) ± 2 = 46.4–50.4 mmHg is expected (Berend K, de Vries APJ,
// Gans ROB, N Engl J Med 2014;371:1434–1445, the rule read in its reproduction): a PaCO2 of 40 is
// below it.
// Gases invented; each HCO3 within 0.3 mmol/L of 0.0307 × PaCO2 × 10^(pH − 6.1).
import { describe, expect, it } from 'vitest';
import { readings } from './helpers';

const note = (gas: string) => `patient age 66 y\n@ day 1 03:30\noxygen room air\nabg ${gas}\n`;

describe('a PaCO2 in its reference interval, read against the response a metabolic disorder calls for', () => {
  it('metabolic acidosis, PaCO2 38 above the expected 24–28 mmHg: not "normal ventilation"', () => {
    const r = readings(note('ph 7.11, pco2 38, po2 88, hco3 12'));
    expect(r['acid-base']).toContain('consistent with an added respiratory acidosis');
    expect(r.ventilation).toBe(
      'PaCO2 38 mmHg: consistent with a PaCO2 within its reference range (35–45 mmHg) but above what the metabolic acidosis calls for: ventilation short of the response expected (the acid–base reading compares it with that response).',
    );
  });

  it('metabolic alkalosis, PaCO2 40 below the expected 46–50 mmHg: not "normal ventilation"', () => {
    const r = readings(note('ph 7.57, pco2 40, po2 90, hco3 36'));
    expect(r['acid-base']).toContain('consistent with an added respiratory alkalosis');
    expect(r.ventilation).toBe(
      'PaCO2 40 mmHg: consistent with a PaCO2 within its reference range (35–45 mmHg) but below what the metabolic alkalosis calls for: ventilation beyond the response expected (the acid–base reading compares it with that response).',
    );
  });

  it('metabolic acidosis with the response expected and a PaCO2 in range (HCO3 20: 36–40 mmHg): normal ventilation, as before', () => {
    // 1.5 × 20 + 8 = 38 ± 2; pH 7.33 with PaCO2 38 gives HCO3 0.0307 × 38 × 10^1.23 = 19.7.
    const r = readings(note('ph 7.33, pco2 38, po2 90, hco3 20'));
    expect(r['acid-base']).toContain('with the expected respiratory response');
    expect(r.ventilation).toBe('PaCO2 38 mmHg: consistent with normal ventilation.');
  });

  it('a primary respiratory acidosis: hypercapnia read as before', () => {
    expect(readings(note('ph 7.24, pco2 60, po2 62, hco3 26')).ventilation).toBe('PaCO2 60 mmHg: consistent with hypercapnia (above 50 mmHg): ventilation is not clearing CO2.');
  });
});

describe('in a note whose gas unit is kPa', () => {
  it('the reference range in kPa: 5.1 kPa (38 mmHg) above the 24–28 mmHg Winters expects for HCO3 12', () => {
    const r = readings(`patient age 66 y\nunits gas kPa\n@ day 1 03:30\noxygen room air\nabg ph 7.11, pco2 5.1, po2 11.7, hco3 12\n`);
    expect(r.ventilation).toBe(
      'PaCO2 5.1 kPa (38 mmHg): consistent with a PaCO2 within its reference range (4.7–6.0 kPa) but above what the metabolic acidosis calls for: ventilation short of the response expected (the acid–base reading compares it with that response).',
    );
  });
});

// A raised PaCO2 within the response a primary metabolic alkalosis calls for, 40 + 0.7 × (HCO3 − 24)
// ± 2 mmHg (Berend K, de Vries APJ, Gans ROB, N Engl J Med 2014;371:1434–1445, the rule read in its
// reproduction), is the breathing's response to it, not ventilation failing to clear CO2; that the
// response can take the PaCO2 above 50 mmHg is common practice, no source. Gases invented, each HCO3
// within 0.4 mmol/L of 0.0307 × PaCO2 × 10^(pH − 6.1).
describe('a raised PaCO2 read against the response a metabolic alkalosis calls for', () => {
  it('HCO3 41, PaCO2 53 within the expected 50–54 mmHg, on air: the response, not ventilatory failure', () => {
    const r = readings(note('ph 7.50, pco2 53, po2 72, hco3 41'));
    expect(r['acid-base']).toContain('with the expected respiratory response (PaCO2 within the expected 50–54 mmHg)');
    expect(r.ventilation).toBe("PaCO2 53 mmHg: consistent with hypercapnia (above 50 mmHg): the breathing's response to the metabolic alkalosis (the acid–base reading compares it with the response expected).");
    expect(r['respiratory-failure']).toBe("Consistent with hypercapnia (PaCO2 53 mmHg, above 50 mmHg) without hypoxaemia on air (PaO2 72 mmHg, not below 60 mmHg), which may be the breathing's response to the metabolic alkalosis (the acid–base reading compares it with the response expected) rather than ventilatory failure.");
  });

  it('HCO3 36, PaCO2 47 within the expected 46–50 mmHg: a mildly raised PaCO2 that is the response', () => {
    const r = readings(note('ph 7.50, pco2 47, po2 85, hco3 36'));
    expect(r.ventilation).toBe("PaCO2 47 mmHg: consistent with a mildly raised PaCO2, below the hypercapnia threshold of 50 mmHg: the breathing's response to the metabolic alkalosis (the acid–base reading compares it with the response expected).");
  });

  it('with hypoxaemia: still type 2 by its definition, and the reading names the response the PaCO2 may be', () => {
    const r = readings(note('ph 7.50, pco2 53, po2 55, hco3 41'));
    expect(r['respiratory-failure']).toBe("Consistent with type 2 (hypercapnic) respiratory failure: hypoxaemia with hypercapnia (PaO2 55 mmHg, below 60 mmHg; PaCO2 53 mmHg, above 50 mmHg); the raised PaCO2 may be the breathing's response to the metabolic alkalosis (the acid–base reading compares it with the response expected).");
  });

  it('HCO3 45, PaCO2 62 above the expected 53–57 mmHg: an added respiratory acidosis, and ventilation not clearing CO2, as before', () => {
    const r = readings(note('ph 7.47, pco2 62, po2 70, hco3 45'));
    expect(r['acid-base']).toContain('consistent with an added respiratory acidosis');
    expect(r.ventilation).toBe('PaCO2 62 mmHg: consistent with hypercapnia (above 50 mmHg): ventilation is not clearing CO2.');
    expect(r['respiratory-failure']).toContain('and so with ventilatory (hypercapnic) failure');
  });
});
