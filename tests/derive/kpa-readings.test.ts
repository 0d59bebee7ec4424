// Readings in a note whose gas unit is kPa give pressures in kPa first, with mmHg in brackets, and
// thresholds in kPa, as hints and hovers do; an mmHg note reads as before. 1 kPa = 7.50062 mmHg
// (definition of the units, cross-checked with @lhncbc/ucum-lhc in tests/physiology/units.test.ts).
// Thresholds: hypoxaemia PaO2 < 60 mmHg (8.0 kPa), hypercapnia PaCO2 > 50 mmHg (6.7 kPa) — common
// practice, no source; Winters' formula (Albert, Dell & Winters, Ann Intern Med 1967 — from memory).
import { describe, expect, it } from 'vitest';
import { readings } from './helpers';

describe('readings in a kPa note', () => {
  it('give PaO2 and PaCO2 in kPa with mmHg in brackets, and thresholds in kPa', () => {
    const r = readings('units gas kPa\n@ 08:00\noxygen venturi, fio2 0.28\nabg ph 7.28, pco2 9.1, po2 7.9, hco3 31.5');
    expect(r.oxygenation).toBe('PaO2 7.9 kPa (59 mmHg): consistent with moderate hypoxaemia (below 8.0 kPa) despite FiO2 0.28.');
    expect(r.ventilation).toBe('PaCO2 9.1 kPa (68 mmHg): consistent with hypercapnia (above 6.7 kPa): ventilation is not clearing CO2.');
  });

  it('read 6.7 kPa as 50 mmHg would be read, on the hypercapnia threshold and not above it', () => {
    // 6.7 kPa stands for 6.65–6.75 kPa (49.9–50.6 mmHg), which holds 50 mmHg (6.67 kPa): written in
    // kPa, it is how 50 mmHg is written, and 50 mmHg is not above 50.
    const r = readings('units gas kPa\n@ 08:00\noxygen room air\nabg ph 7.33, pco2 6.7, po2 11, hco3 26');
    expect(r.ventilation).toBe('PaCO2 6.7 kPa (50 mmHg): consistent with a mildly raised PaCO2, at the hypercapnia threshold of 6.7 kPa, not above it.');
  });

  it('read a value written with more decimals at that resolution: 6.68 kPa (50.1 mmHg) is above 6.67 kPa', () => {
    const r = readings('units gas kPa\n@ 08:00\noxygen room air\nabg ph 7.33, pco2 6.68, po2 11, hco3 26');
    expect(r.ventilation).toBe('PaCO2 6.68 kPa (50.1 mmHg): consistent with hypercapnia (above 6.67 kPa): ventilation is not clearing CO2.');
  });

  it('give an expected PaCO2 range in kPa', () => {
    // HCO3 15 → 1.5 × 15 + 8 ± 2 = 28.5–32.5 mmHg = 3.8–4.3 kPa; 4.4 kPa (33 mmHg) is above it.
    const r = readings('units gas kPa\n@ 08:00\noxygen room air\nabg ph 7.27, pco2 4.4, po2 12.7, hco3 15');
    expect(r['acid-base']).toMatch(/PaCO2 4\.4 kPa \(33 mmHg\) is above the expected 3\.8–4\.3 kPa: consistent with an added respiratory acidosis\.$/);
  });

  it('leave an mmHg note as it was', () => {
    const r = readings('@ 08:00\noxygen venturi, fio2 0.28\nabg ph 7.28, pco2 68, po2 59, hco3 31.5');
    expect(r.oxygenation).toBe('PaO2 59 mmHg: consistent with moderate hypoxaemia (below 60 mmHg) despite FiO2 0.28.');
    expect(r.ventilation).toBe('PaCO2 68 mmHg: consistent with hypercapnia (above 50 mmHg): ventilation is not clearing CO2.');
  });

  it('read the expected HCO3 of a respiratory disorder as the mmHg twin reads it: 12.0 kPa with HCO3 27 is within the acute range, as 90 mmHg is', () => {
    // Acute respiratory acidosis: 24 + 1 × (90 − 40) ÷ 10 ± 2 = 27–31 mmol/L (Narins & Emmett 1980;
    // Adrogué & Madias 2010, from memory). 12.0 kPa is 90.007 mmHg as a number, and stands for
    // 11.95–12.05 kPa (89.6–90.4 mmHg), which holds 90: its HCO3 27 is no added metabolic acidosis.
    // pH 7.09 fits (0.0307 × 90 × 10^0.99 ≈ 26.9, Henderson–Hasselbalch).
    const kpa = readings('units gas kPa\n@ 08:00\noxygen room air\nabg ph 7.09, pco2 12.0, po2 12, hco3 27')['acid-base'];
    const mmhg = readings('@ 08:00\noxygen room air\nabg ph 7.09, pco2 90, po2 90, hco3 27')['acid-base'];
    expect(mmhg).toBe('Consistent with acute respiratory acidosis (pH 7.09, PaCO2 90 mmHg, HCO3 27.0 mmol/L), with HCO3 within the 27–31 mmol/L expected if acute (40–51 mmol/L if chronic).');
    // The ranges hold what every PaCO2 12.0 kPa stands for gives: 24 + (89.6 − 40) ÷ 10 − 2 = 26.96 to
    // 24 + (90.4 − 40) ÷ 10 + 2 = 31.04 mmol/L if acute; 24 + 3.5 × 4.96 − 2 ≈ 39 to 24 + 5 × 5.04 + 2 ≈ 51 if chronic.
    expect(kpa).toBe('Consistent with acute respiratory acidosis (pH 7.09, PaCO2 12.0 kPa (90 mmHg), HCO3 27.0 mmol/L), with HCO3 within the 26.96–31.04 mmol/L expected if acute (39–51 mmol/L if chronic).');
  });

  it('show the end of an expected PaCO2 range a kPa value is on as the value is written, not one that leaves it outside', () => {
    // HCO3 5.2 → 1.5 × 5.2 + 8 ± 2 = 13.8–17.8 mmHg = 1.84–2.37 kPa (Winters' formula). 2.4 kPa stands
    // for 2.35–2.45 kPa, which holds 2.37: within, and the range is not shown as ending at 2.37 below it.
    // pH 7.07 fits (0.0307 × 18 × 10^0.97 ≈ 5.2, Henderson–Hasselbalch).
    const r = readings('units gas kPa\n@ 08:00\noxygen room air\nabg ph 7.07, pco2 2.4, po2 12, hco3 5.2')['acid-base'];
    expect(r).toBe('Consistent with metabolic acidosis (pH 7.07, PaCO2 2.4 kPa (18 mmHg), HCO3 5.2 mmol/L), with the expected respiratory response (PaCO2 within the expected 1.8–2.4 kPa).');
  });
});
