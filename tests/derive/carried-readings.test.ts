// A reading that rests on a setting stated at an earlier timepoint says so: a ventilator's FiO2
// and PEEP carry forward until restated (the format's carry rules), and a P/F or an oxygenation
// band from them is only as current as that line. P/F = PaO2 ÷ FiO2; Berlin oxygenation bands
// with PEEP ≥ 5 cmH2O (ARDS Definition Task Force, JAMA 2012;307:2526–2533, from memory).
import { describe, expect, it } from 'vitest';
import { readings } from './helpers';

const NOTE = [
  'patient age 64 y, sex female, height 162 cm',
  '@ day 1 08:00 settings',
  'vent mode VC, vt 420 mL, rate 18, peep 10, fio2 0.6',
  'abg 7.30/48/72/23.2',
  '@ 09:00 gas only',
  'abg 7.36/44/90/24.4',
  '@ 10:00 gas only, hypoxaemic',
  'abg 7.33/45/58/23.3',
].join('\n');

describe('readings on a carried FiO2 and PEEP', () => {
  it('name where the FiO2 and PEEP were stated (90 ÷ 0.60 = P/F 150 mmHg)', () => {
    const r = readings(NOTE, {}, 1);
    expect(r.oxygenation).toBe('PaO2 90 mmHg on FiO2 0.60 (P/F 150 mmHg; FiO2 carried from line 3): consistent with impaired oxygenation supported by oxygen.');
    expect(r['oxygenation-band']).toMatch(/^P\/F 150 mmHg with PEEP 10 cmH2O \(FiO2 and PEEP carried from line 3\): consistent with the 100–200 mmHg oxygenation band/);
  });

  it('name it beside a hypoxaemia on oxygen (58 ÷ 0.60 = P/F 97 mmHg)', () => {
    const r = readings(NOTE, {}, 2);
    expect(r.oxygenation).toBe('PaO2 58 mmHg: consistent with moderate hypoxaemia (below 60 mmHg) despite FiO2 0.60 (carried from line 3).');
    expect(r['oxygenation-band']).toMatch(/^P\/F 97 mmHg with PEEP 10 cmH2O \(FiO2 and PEEP carried from line 3\): consistent with the ≤ 100 mmHg oxygenation band/);
    // PiO2 0.60 × (760 − 47) = 427.8, PAO2 427.8 − 45 ÷ 0.8 = 371.6, A–a 314 mmHg (simplified alveolar gas equation, common practice).
    expect(r['hypoxaemia-mechanism']).toBe('Consistent with hypoxaemia from a raised A–a gradient (314 mmHg, above 20 mmHg): V/Q mismatch, shunt or a diffusion limit. The PiO2 uses FiO2 0.60 (carried from line 3). On supplemental oxygen the normal gradient is wider than the air-based limit.');
  });

  it('say nothing of carrying where the settings were stated with the gas', () => {
    const r = readings(NOTE, {}, 0);
    expect(r.oxygenation).toBe('PaO2 72 mmHg on FiO2 0.60 (P/F 120 mmHg): consistent with impaired oxygenation supported by oxygen.');
    expect(r['oxygenation-band']).toMatch(/^P\/F 120 mmHg with PEEP 10 cmH2O: consistent/);
  });
});
