// The oxygenation bands of the Berlin definition (ARDS Definition Task Force. JAMA
// 2012;307:2526–2533) were made in adults. For children the Pediatric Acute Lung Injury Consensus
// Conference made a definition of its own, which grades the oxygenation of a child on invasive
// ventilation by the oxygenation index (OI) or the oxygen saturation index rather than by the P/F
// ratio (Khemani RG, Smith LS, Zimmerman JJ, Erickson S, PALICC Group. Pediatric acute respiratory
// distress syndrome: definition, incidence, and epidemiology. Pediatr Crit Care Med 2015;16(5
// Suppl 1):S23–S40: a pediatric-specific definition, read in its abstract, which also says the data
// support no specific age between "adult" and "pediatric" ARDS; the grading by OI and OSI during
// invasive ventilation read in the comparison of the two definitions in BJA Education
// 2022;22(9):364–370, its table 1). A ventilated 4-year-old with P/F 150 mmHg on PEEP 8 was read as
// "consistent with the 100–200 mmHg oxygenation band of the Berlin definition (the band called
// moderate there)". Under 18 years (Pneumark's adult age, as for the predicted body weight and the
// A–a gradient's upper normal: our convention) the P/F on invasive PEEP is now not read against
// those bands, and the reading says why; the OI, worked out as before, is what to read.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { derived, readings } from '../derive/helpers';

const vented = (patient: string, vent = 'mode PC, pinsp 16, peep 8, rate 24, fio2 0.6, vt 120, map 13') => `patient ${patient}\n@ 08:00\nvent ${vent}\nabg 7.32/48/90/24.2`;

describe('a child on invasive ventilation is not read against the adult Berlin oxygenation bands (PALICC 2015; Berlin definition 2012)', () => {
  it('a 4-year-old: P/F 90 ÷ 0.6 = 150 mmHg, no band named, and the OI 0.6 × 13 × 100 ÷ 90 = 8.7 is still worked out', () => {
    const text = vented('age 4 y, sex female');
    const band = readings(text)['oxygenation-band'];
    expect(band).toBe('P/F 150 mmHg with PEEP 8 cmH2O at age 4 y: not read against the oxygenation bands of the Berlin definition, which were made in adults; the pediatric consensus (PALICC 2015) grades the oxygenation of a ventilated child by the oxygenation index instead.');
    expect(band).not.toMatch(/called moderate/);
    expect(derived(text, 'oxygenation_index').value).toBeCloseTo((0.6 * 13 * 100) / 90, 6);
    // Not a finding: the oxygenation reading itself (P/F ≤ 300 on oxygen) is the PN410 of this gas.
    const pn410 = checkNote(text).findings.filter((f) => f.code === 'PN410').map((f) => f.message);
    expect(pn410).toEqual(['PaO2 90 mmHg on FiO2 0.60 (P/F 150 mmHg): consistent with impaired oxygenation supported by oxygen.']);
  });

  it('an infant whose age is written in months: 8 months is 0.67 y', () => {
    expect(readings(vented('age 8 mo'))['oxygenation-band']).toMatch(/^P\/F 150 mmHg with PEEP 8 cmH2O at age 0\.67 y: not read against/);
  });

  it('names the FiO2 and PEEP carried from an earlier line, as the band reading does', () => {
    const text = `${vented('age 4 y')}\n@ 09:00\nabg 7.34/46/84/24.3`;
    expect(readings(text)['oxygenation-band']).toBe('P/F 140 mmHg with PEEP 8 cmH2O (FiO2 and PEEP carried from line 3) at age 4 y: not read against the oxygenation bands of the Berlin definition, which were made in adults; the pediatric consensus (PALICC 2015) grades the oxygenation of a ventilated child by the oxygenation index instead.');
  });

  it('from 18 years, and without an age, the Berlin band is read as before', () => {
    const adult = 'P/F 150 mmHg with PEEP 8 cmH2O: consistent with the 100–200 mmHg oxygenation band of the Berlin definition (the band called moderate there) — an oxygenation band, not a diagnosis.';
    expect(readings(vented('age 18 y, sex male'))['oxygenation-band']).toBe(adult);
    expect(readings(vented('sex male'))['oxygenation-band']).toBe(adult);
  });

  it('a child on CPAP keeps the noninvasive reading (PALICC 2015 grades noninvasive support by P/F too, without severity bands)', () => {
    const text = 'patient age 6 y\n@ 08:00\noxygen cpap 6, fio2 0.5\nabg 7.38/40/120/23.5';
    expect(readings(text)['oxygenation-band']).toMatch(/^P\/F 240 mmHg with CPAP 6 cmH2O: consistent with the 200–300 mmHg oxygenation band/);
  });
});
