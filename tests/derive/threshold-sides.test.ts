// Readings at and just either side of the thresholds, written in mmHg and in kPa. Hypoxaemia is a
// PaO2 below 60 mmHg (8 kPa) and hypercapnia a PaCO2 above 50 mmHg (common practice, no source; the
// defaults of REFERENCES.md). A value on a threshold is on neither side and is said to be "at" it.
// A value written in kPa stands for the range its last decimal allows (6.7 kPa: 6.65–6.75 kPa),
// and is on a threshold that range holds, so it falls on the side the mmHg value it is written
// for would: 8.0 kPa as 60 mmHg, 6.7 kPa as 50 mmHg, 6.0 kPa as 45 mmHg. 1 kPa = 7.50062 mmHg
// (definition of the units). PaCO2 reference interval 35–45 mmHg (4.7–6.0 kPa) (common practice,
// no source). Gases are built to fit Henderson–Hasselbalch, HCO3 = 0.0307 × PaCO2 × 10^(pH − 6.1).
import { describe, expect, it } from 'vitest';
import { sideOf } from '../../server/src/core/physiology/numeric';
import { readings } from './helpers';

const AIR = '@ 08:00\noxygen room air\n';
const KPA = 'units gas kPa\n@ 08:00\noxygen room air\n';

describe('sideOf', () => {
  it('compares exactly without a resolution, and puts a value within its resolution on the threshold', () => {
    expect(sideOf(60, 60)).toBe(0);
    expect(sideOf(59.9, 60)).toBe(-1);
    expect(sideOf(50.1, 50)).toBe(1);
    // 6.7 kPa = 50.254 mmHg; one written decimal of kPa is ± 0.05 kPa = ± 0.375 mmHg.
    expect(sideOf(6.7 * 7.50062, 50)).toBe(1);
    expect(sideOf(6.7 * 7.50062, 50, 0.375)).toBe(0);
    expect(sideOf(6.8 * 7.50062, 50, 0.375)).toBe(1);
    expect(sideOf(6.6 * 7.50062, 50, 0.375)).toBe(-1);
  });
});

describe('PaO2 at 60 mmHg and just either side', () => {
  it('60 mmHg is at the threshold: no hypoxaemia, and not said to be above it', () => {
    const r = readings(`${AIR}abg 7.36/50/60/27.5`);
    expect(r.oxygenation).toBe('PaO2 60 mmHg: consistent with mildly reduced oxygenation, at the hypoxaemia threshold of 60 mmHg, not below it.');
    expect(r['respiratory-failure']).toBeUndefined();
  });

  it('59.9 mmHg is hypoxaemia; 60.1 mmHg is above the threshold', () => {
    expect(readings(`${AIR}abg 7.35/50.1/59.9/27.2`).oxygenation).toBe('PaO2 59.9 mmHg: consistent with moderate hypoxaemia (below 60 mmHg).');
    expect(readings(`${AIR}abg 7.37/49.9/60.1/28`).oxygenation).toBe('PaO2 60.1 mmHg: consistent with mildly reduced oxygenation, above the hypoxaemia threshold of 60 mmHg.');
  });

  it('8.0 kPa is at the threshold of 8.0 kPa, as 60 mmHg is (not above a threshold of 7.999 kPa)', () => {
    const r = readings(`${KPA}abg ph 7.36, pco2 6.7, po2 8.0, hco3 27.6`);
    expect(r.oxygenation).toBe('PaO2 8.0 kPa (60 mmHg): consistent with mildly reduced oxygenation, at the hypoxaemia threshold of 8.0 kPa, not below it.');
  });

  it('7.9 and 7.99 kPa are hypoxaemia, 8.1 kPa is not', () => {
    expect(readings(`${KPA}abg ph 7.37, pco2 6.6, po2 7.9, hco3 28`).oxygenation).toBe('PaO2 7.9 kPa (59 mmHg): consistent with moderate hypoxaemia (below 8.0 kPa).');
    expect(readings(`${KPA}abg ph 7.38, pco2 6.5, po2 7.99, hco3 28`).oxygenation).toBe('PaO2 7.99 kPa (59.9 mmHg): consistent with moderate hypoxaemia (below 8.0 kPa).');
    expect(readings(`${KPA}abg ph 7.38, pco2 6.5, po2 8.1, hco3 28`).oxygenation).toMatch(/^PaO2 8\.1 kPa \(61 mmHg\): consistent with mildly reduced oxygenation, above the hypoxaemia threshold of 8\.0 kPa\.$/);
  });

  it('a PaO2 at the threshold with hypercapnia and no FiO2 is "not below" it, never "above" it', () => {
    expect(readings('@ 08:00\nabg 7.30/58/60/27.8')['respiratory-failure']).toMatch(/^Consistent with hypercapnia \(PaCO2 58 mmHg, above 50 mmHg\) with PaO2 60 mmHg, not below 60 mmHg, and no FiO2 stated/);
  });
});

describe('PaCO2 at 50 mmHg and just either side', () => {
  it('50 mmHg is at the threshold: not hypercapnia, and not said to be below it', () => {
    expect(readings(`${AIR}abg 7.36/50/60/27.5`).ventilation).toBe('PaCO2 50 mmHg: consistent with a mildly raised PaCO2, at the hypercapnia threshold of 50 mmHg, not above it.');
  });

  it('50.1 mmHg is hypercapnia (with hypoxaemia: type 2); 49.9 mmHg is below the threshold', () => {
    const above = readings(`${AIR}abg 7.35/50.1/59.9/27.2`);
    expect(above.ventilation).toBe('PaCO2 50.1 mmHg: consistent with hypercapnia (above 50 mmHg): ventilation is not clearing CO2.');
    expect(above['respiratory-failure']).toBe('Consistent with type 2 (hypercapnic) respiratory failure: hypoxaemia with hypercapnia (PaO2 59.9 mmHg, below 60 mmHg; PaCO2 50.1 mmHg, above 50 mmHg).');
    expect(readings(`${AIR}abg 7.37/49.9/60.1/28`).ventilation).toBe('PaCO2 49.9 mmHg: consistent with a mildly raised PaCO2, below the hypercapnia threshold of 50 mmHg.');
  });

  it('6.7 kPa with a PaO2 of 7.9 kPa is type 1, as 50 mmHg with 59 mmHg is; 6.8 kPa is type 2', () => {
    expect(readings(`${KPA}abg ph 7.36, pco2 6.7, po2 7.9, hco3 27.6`)['respiratory-failure']).toBe('Consistent with type 1 (hypoxaemic) respiratory failure: hypoxaemia without hypercapnia, PaCO2 mildly raised (PaO2 7.9 kPa (59 mmHg), below 8.0 kPa; PaCO2 6.7 kPa (50 mmHg), not above 6.7 kPa).');
    expect(readings(`${AIR}abg 7.36/50/59/27.5`)['respiratory-failure']).toBe('Consistent with type 1 (hypoxaemic) respiratory failure: hypoxaemia without hypercapnia, PaCO2 mildly raised (PaO2 59 mmHg, below 60 mmHg; PaCO2 50 mmHg, not above 50 mmHg).');
    const r = readings(`${KPA}abg ph 7.35, pco2 6.8, po2 7.9, hco3 27.6`);
    expect(r['respiratory-failure']).toBe('Consistent with type 2 (hypercapnic) respiratory failure: hypoxaemia with hypercapnia (PaO2 7.9 kPa (59 mmHg), below 8.0 kPa; PaCO2 6.8 kPa (51 mmHg), above 6.7 kPa).');
    expect(r.ventilation).toBe('PaCO2 6.8 kPa (51 mmHg): consistent with hypercapnia (above 6.7 kPa): ventilation is not clearing CO2.');
  });

  it('a kPa note with a gas written in mmHg compares the mmHg as written', () => {
    expect(readings(`${KPA}abg ph 7.36, pco2 50 mmHg, po2 60 mmHg, hco3 27.5`).ventilation).toBe('PaCO2 50 mmHg: consistent with a mildly raised PaCO2, at the hypercapnia threshold of 50 mmHg, not above it.');
  });
});

describe('the PaCO2 reference interval in kPa', () => {
  it('6.0 kPa (45.004 mmHg) is at the upper limit, not above it: a metabolic acidosis with too little respiratory response, not a mixed acidosis', () => {
    // pH 7.26, PaCO2 6.0 kPa, HCO3 20: 0.0307 × 45.0 × 10^1.16 ≈ 19.9 mmol/L. Winters' formula
    // (Albert, Dell & Winters, Ann Intern Med 1967;66:312–322, from memory): 1.5 × 20 + 8 ± 2 = 36–40 mmHg.
    const kpa = readings(`${KPA}abg ph 7.26, pco2 6.0, po2 12, hco3 20`)['acid-base'];
    const mmhg = readings(`${AIR}abg 7.26/45/90/20`)['acid-base'];
    expect(mmhg).toMatch(/^Consistent with metabolic acidosis\b.*PaCO2 45 mmHg is above the expected 36–40 mmHg: consistent with an added respiratory acidosis\.$/);
    expect(kpa).toMatch(/^Consistent with metabolic acidosis\b.*PaCO2 6\.0 kPa \(45 mmHg\) is above the expected 4\.8–5\.3 kPa: consistent with an added respiratory acidosis\.$/);
    expect(kpa).not.toMatch(/mixed/);
  });
});

describe('Berlin oxygenation bands from a PaO2 written in kPa (100 < P/F ≤ 200 mmHg is the moderate band; ARDS Definition Task Force, JAMA 2012;307:2526–2533, from memory)', () => {
  it('16.0 kPa on FiO2 0.60 (P/F 200.02 mmHg) is on the 200 mmHg boundary, as 120 mmHg on 0.60 is', () => {
    const mmhg = readings('@ 08:00\nvent peep 8, fio2 0.6\nabg 7.38/42/120/24')['oxygenation-band'];
    const kpa = readings('units gas kPa\n@ 08:00\nvent peep 8, fio2 0.6\nabg ph 7.38, pco2 5.6, po2 16.0, hco3 24')['oxygenation-band'];
    expect(mmhg).toMatch(/^P\/F 200 mmHg with PEEP 8 cmH2O: consistent with the 100–200 mmHg oxygenation band/);
    expect(kpa).toMatch(/^P\/F 26\.7 kPa \(200 mmHg\) with PEEP 8 cmH2O: consistent with the 100–200 mmHg oxygenation band/);
  });

  it('16.1 kPa on FiO2 0.60 (P/F 201 mmHg) is above it', () => {
    expect(readings('units gas kPa\n@ 08:00\nvent peep 8, fio2 0.6\nabg ph 7.38, pco2 5.6, po2 16.1, hco3 24')['oxygenation-band']).toMatch(/consistent with the 200–300 mmHg oxygenation band/);
  });

  it('P/F 300 from a kPa PaO2 (12.0 kPa on 0.30 = 300.02 mmHg) reads as impaired oxygenation on oxygen, as 90 mmHg on 0.30 does', () => {
    expect(readings('units gas kPa\n@ 08:00\noxygen venturi, fio2 0.3\nabg ph 7.40, pco2 5.3, po2 12.0, hco3 24')['oxygenation']).toMatch(/consistent with impaired oxygenation supported by oxygen/);
    expect(readings('@ 08:00\noxygen venturi, fio2 0.3\nabg 7.40/40/90/24.4')['oxygenation']).toMatch(/consistent with impaired oxygenation supported by oxygen/);
  });
});

describe('the hypercapnia threshold set to 6.5 kPa (48.75 mmHg; British Thoracic Society 2017, O’Driscoll BR et al., Thorax 2017;72 Suppl 1, from memory)', () => {
  const bts = { hypercapniaAboveMmhg: 48.75 };
  it('6.5 kPa is at it, 6.6 kPa above it, in a kPa note', () => {
    expect(readings(`${KPA}abg ph 7.38, pco2 6.5, po2 9.5, hco3 28`, bts).ventilation).toBe('PaCO2 6.5 kPa (49 mmHg): consistent with a mildly raised PaCO2, at the hypercapnia threshold of 6.5 kPa, not above it.');
    expect(readings(`${KPA}abg ph 7.37, pco2 6.6, po2 9.5, hco3 28`, bts).ventilation).toBe('PaCO2 6.6 kPa (50 mmHg): consistent with hypercapnia (above 6.5 kPa): ventilation is not clearing CO2.');
  });

  it('49 mmHg written in mmHg is above 48.75 mmHg, as written', () => {
    expect(readings(`${AIR}abg 7.37/49/72/27.6`, bts).ventilation).toBe('PaCO2 49 mmHg: consistent with hypercapnia (above 48.75 mmHg): ventilation is not clearing CO2.');
  });
});
