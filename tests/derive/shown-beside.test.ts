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
