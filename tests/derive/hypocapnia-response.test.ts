// A low PaCO2 in a metabolic acidosis is the breathing's response to it, not ventilation "above
// metabolic need": in diabetic ketoacidosis (pH 7.08, PaCO2 16, HCO3 5.1) the PaCO2 is within the
// 13.65–17.65 mmHg Winters' formula expects (1.5 × 5.1 + 8 ± 2: Albert MS, Dell RB, Winters RW,
// Ann Intern Med 1967;66:312–322, from memory), and the ventilation reading said it was above need.
// The reading now says so where the acid–base reading finds a primary metabolic acidosis whose
// response is as expected or short of it; where the PaCO2 is below what the acidosis calls for (an
// added respiratory alkalosis), or in a primary respiratory alkalosis, the words stay as they were.
import { describe, expect, it } from 'vitest';
import { readings } from './helpers';

const note = (gas: string) => `patient age 19 y\n@ day 1 01:20\noxygen room air\nabg ${gas}\n`;

describe('hypocapnia in a metabolic acidosis', () => {
  it('with the expected response: the response to the acidosis', () => {
    expect(readings(note('ph 7.08, pco2 16, po2 118, hco3 5.1')).ventilation).toBe(
      'PaCO2 16 mmHg: consistent with hypocapnia (below 35 mmHg): the breathing\'s response to the metabolic acidosis (the acid–base reading compares it with the response expected).',
    );
  });

  it('with a response short of the expected (PaCO2 31 above Winters\' 24.15–28.15): still the response', () => {
    expect(readings(note('7.21/31/88/12.1')).ventilation).toContain('the breathing\'s response to the metabolic acidosis');
  });

  it('below what the acidosis calls for (an added respiratory alkalosis): as before', () => {
    // HCO3 9.9: Winters 22.85 ± 2; PaCO2 19 is below it (HCO3 calc 0.0307 × 19 × 10^1.23 = 9.9).
    const r = readings(note('7.33/19/100/9.9'));
    expect(r['acid-base']).toContain('metabolic acidosis');
    expect(r.ventilation).toContain('ventilation above metabolic need');
  });

  it('a primary respiratory alkalosis: as before', () => {
    expect(readings(note('7.49/27/90/20.5')).ventilation).toBe('PaCO2 27 mmHg: consistent with hypocapnia (below 35 mmHg): ventilation above metabolic need.');
  });
});
