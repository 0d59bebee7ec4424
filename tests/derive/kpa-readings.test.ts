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
});
