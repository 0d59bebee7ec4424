// A PaO2 is impossible (PN401) only above the alveolar PO2 that the full alveolar gas equation allows.
// The simplified form PAO2 = PiO2 − PaCO2 ÷ R (R 0.8, the default) reads lower than the full form
// PAO2 = PiO2 − PaCO2 × [FiO2 + (1 − FiO2) ÷ R] by PaCO2 × FiO2 × (1/R − 1): about 2 mmHg on air,
// 10 mmHg on FiO2 1.0 with PaCO2 40, 25 mmHg with PaCO2 100 (Fenn WO, Rahn H, Otis AB. A theoretical
// study of the composition of the alveolar air at altitude. Am J Physiol 1946;146:637–653; Riley RL,
// Cournand A. J Appl Physiol 1949;1:825–847, both from memory; the project's reference notes give the
// 2 and 10 mmHg). On FiO2 1.0 there is no nitrogen and the full form is PiO2 − PaCO2 whatever R is, so a
// PaO2 of 600 mmHg with PaCO2 100 at sea level (PiO2 713, full PAO2 613) is possible, and was called
// impossible against the simplified 588.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { alveolarPo2Full, alveolarPo2Simplified } from '../../server/src/core/physiology/gas-exchange';
import { derivation, derived } from './helpers';

const gas = (fio2: string, po2: number, pco2 = 100) => `patient age 50 y, sex male\n@ day 1 08:00\nvent mode VC, fio2 ${fio2}, peep 5\nabg ph 7.10, pco2 ${pco2}, po2 ${po2}, hco3 30`;
const pn401 = (text: string, settings = {}) => checkNote(text, settings).findings.filter((f) => f.code === 'PN401');

describe('PN401 judges a PaO2 against the full alveolar gas equation (Fenn, Rahn & Otis 1946, from memory)', () => {
  it('the two forms on FiO2 1.0, PaCO2 100, PiO2 713: simplified 588, full 613 mmHg', () => {
    expect(alveolarPo2Simplified(713, 100, 0.8)).toBeCloseTo(588, 6);
    expect(alveolarPo2Full(1, 713, 100, 0.8)).toBeCloseTo(613, 6);
  });

  it('a PaO2 between the simplified and the full alveolar PO2 is not impossible', () => {
    const text = gas('1.0', 600);
    expect(pn401(text)).toEqual([]);
    // The gradient by the simplified form would be negative: shown as 0, the a/A ratio as 1, the P/F worked out.
    expect(derived(text, 'aa_gradient').value).toBe(0);
    expect(derived(text, 'aa_gradient').notes.join(' ')).toMatch(/full alveolar gas equation/);
    expect(derived(text, 'a_to_A_ratio').value).toBe(1);
    expect(derived(text, 'a_to_A_ratio').notes.join(' ')).toMatch(/full alveolar gas equation/);
    expect(derived(text, 'pf_ratio').value).toBeCloseTo(600, 6);
    expect(derivation(text).interpretations.map((i) => i.text).join(' ')).not.toMatch(/PN401/);
  });

  it('on FiO2 0.90 as well: full 641.7 − 100 × (0.9 + 0.1 ÷ 0.8) = 539.2 mmHg', () => {
    // PiO2 0.9 × 713 = 641.7; simplified 516.7.
    expect(pn401(gas('0.9', 530))).toEqual([]);
    expect(pn401(gas('0.9', 545))).toHaveLength(1);
  });

  it('a PaO2 more than 5 mmHg above the full form is still impossible, and room air is judged as before', () => {
    expect(pn401(gas('1.0', 619))).toHaveLength(1);
    expect(pn401(gas('1.0', 619))[0]!.message).toBe('PaO2 619 mmHg is above the alveolar PO2 that FiO2 1.00 allows here (588 mmHg by the simplified alveolar gas equation, 613 mmHg by the full one): check the FiO2, the unit, and whether the sample had an air bubble.');
    expect(pn401(gas('1.0', 618))).toEqual([]);
    // Room air, PaCO2 40: simplified 99.7, full 101.8 mmHg; 160 mmHg is impossible by either.
    expect(pn401('@ 08:00\noxygen room air\nabg ph 7.40, pco2 40, po2 160, hco3 24')).toHaveLength(1);
    // With the full form chosen (setting), the same limit.
    expect(pn401(gas('1.0', 600), { alveolarEquation: 'full' })).toEqual([]);
    expect(pn401(gas('1.0', 619), { alveolarEquation: 'full' })).toHaveLength(1);
  });
});
