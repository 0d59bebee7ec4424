// A derived value shown beside the value it is read against keeps the decimals that put that value
// on the same side of it as the reading says (the rule of util/format.ts's formatAgainst): an
// expected PaCO2 of 21.6–25.6 mmHg beside a PaCO2 of 26 mmHg is not shown as 22–26.
import { describe, expect, it } from 'vitest';
import { numberText } from '../../server/src/core/service/derived-hover';
import { derived, readings } from './helpers';

describe('expected ranges beside the observed value', () => {
  it("Winters' range for HCO3 10.4: 1.5 × 10.4 + 8 ± 2 = 21.6–25.6 mmHg, beside a PaCO2 of 26 (Albert, Dell & Winters, Ann Intern Med 1967;66:312–322, from memory)", () => {
    const note = '@ 08:00\noxygen room air\nabg 7.22/26/96/10.4';
    expect(numberText(derived(note, 'paco2_expected'))).toBe('21.6–25.6');
    expect(readings(note)['acid-base']).toMatch(/PaCO2 26 mmHg is above the expected 21\.6–25\.6 mmHg/);
  });

  it('keeps whole numbers where they already keep the side (HCO3 10 → 21–25 mmHg beside 23)', () => {
    expect(numberText(derived('@ 08:00\noxygen room air\nabg 7.25/23/96/10', 'paco2_expected'))).toBe('21–25');
  });

  it('the chronic HCO3 range for PaCO2 32 mmHg, 24 − (4…5) × 0.8 ± 2 = 18.0–22.8 mmol/L, beside an HCO3 of 22.9 read as acute (Narins & Emmett, Medicine 1980;59:161–187; Adrogué & Madias, JASN 2010;21:920–923, from memory)', () => {
    const note = '@ 08:00\noxygen room air\nabg 7.47/32/55/22.9';
    expect(numberText(derived(note, 'hco3_expected_chronic'))).toBe('18.0–22.8');
    expect(numberText(derived(note, 'hco3_expected_acute'))).toBe('20–24');
    expect(readings(note)['acid-base']).toMatch(/^Consistent with acute respiratory alkalosis/);
  });
});

describe('the A–a gradient beside its upper normal for age', () => {
  it('age 30: upper normal 30 ÷ 4 + 4 = 11.5 mmHg (common practice, no source) is shown as 11.5 beside a gradient of 11.8, not as 12 beside 12', () => {
    // PAO2 = 0.21 × (760 − 47) − 34 ÷ 0.8 = 107.2 mmHg (simplified alveolar gas equation, common
    // practice); PaO2 95.4 → A–a 11.8 mmHg.
    const note = 'patient age 30 y\n@ 08:00\noxygen room air\nabg 7.46/34/95.4/23.8';
    expect(numberText(derived(note, 'aa_gradient_upper_normal'))).toBe('11.5');
    expect(numberText(derived(note, 'aa_gradient'))).toBe('12');
  });

  it('age 40: upper normal 14 mmHg stays a whole number', () => {
    expect(numberText(derived('patient age 40 y\n@ 08:00\noxygen room air\nabg 7.20/70/55/27', 'aa_gradient_upper_normal'))).toBe('14');
  });
});

describe('ventilator values beside the limits their checks name', () => {
  it('a driving pressure of 30.4 − 15 = 15.4 cmH2O is shown as 15.4 beside the 15 cmH2O flag (common practice, after Amato MBP et al., NEJM 2015;372:747–755, from memory), as PN405 says it', () => {
    const note = '@ 08:00\nvent mode VC, vt 400 mL, peep 15, plateau 30.4, fio2 0.5';
    expect(numberText(derived(note, 'driving_pressure'))).toBe('15.4');
    expect(numberText(derived('@ 08:00\nvent mode VC, vt 400 mL, peep 10, plateau 27, fio2 0.5', 'driving_pressure'))).toBe('17');
  });

  it('VT per kg predicted body weight beside the 8 mL/kg top of the lung-protective range (ARDS Network, NEJM 2000;342:1301–1308; the protocol card\'s at most 8 mL/kg PBW read in its reproduction at thorax.us)', () => {
    // Female, 160 cm: PBW 45.5 + 0.91 × (160 − 152.4) = 52.416 kg; 421 mL ÷ 52.416 = 8.032 mL/kg.
    const female = 'patient sex female, height 160 cm\n@ 08:00\nvent mode VC, vt 421 mL, peep 8, fio2 0.4';
    expect(derived(female, 'predicted_body_weight').value).toBeCloseTo(52.416, 3);
    expect(numberText(derived(female, 'vt_per_kg_pbw'))).toBe('8.03');
    // Male, 180 cm: PBW 50 + 0.91 × 27.6 = 75.116 kg; 450 mL ÷ 75.116 = 5.99 mL/kg.
    const male = 'patient sex male, height 180 cm\n@ 08:00\nvent mode VC, vt 450 mL, peep 8, fio2 0.4';
    expect(derived(male, 'predicted_body_weight').value).toBeCloseTo(75.116, 3);
    expect(numberText(derived(male, 'vt_per_kg_pbw'))).toBe('6.0');
  });
});
