// The upper normal A–a gradient for age is given by rules made in adults: age/4 + 4 and
// (age + 10)/4 (common practice, no source) and 2.5 + 0.21 × age (Mellemgaard K. The alveolar-
// arterial oxygen difference: its size and components in normal man. Acta Physiol Scand
// 1966;67:10–20, adults, from memory). No published rule for children was found (searched for this
// project; see the closing notes), so a child gets no age-based limit: an 8-year-old was shown
// "A–a normal ≤ 6 mmHg", a limit no source gives for a child, and a gradient of 17 mmHg read
// against it. Adults from 18 years, as for the predicted body weight (ARDS Network 2000, from
// memory): PBW_ADULT_FROM_YEARS.
import { describe, expect, it } from 'vitest';
import { AA_UPPER_NORMAL_NO_AGE_MMHG } from '../../server/src/core/derive/interpret';
import { PBW_ADULT_FROM_YEARS } from '../../server/src/core/derive/mechanics';
import { checkNote } from '../../server/src/core/check-note';
import { HINT_CATEGORIES, inlayHints, type HintCategory } from '../../server/src/core/service';
import { derivation, derived, readings } from './helpers';

const note = (patient: string, gas = 'abg 7.40/38/85/24') => `patient   ${patient}\n@ day 1 08:00\noxygen room air\n${gas}`;
const notApplicable = (text: string, id: string) => derivation(text).notApplicable.find((n) => n.id === id)?.reason;

describe('the age-based upper normal A–a gradient is for adults (rules made in adults: common practice, no source; Mellemgaard 1966, from memory)', () => {
  it('is not given for a child, and says why', () => {
    const text = note('age 8 y, sex female, height 128 cm');
    expect(derivation(text).derived.map((d) => d.id)).not.toContain('aa_gradient_upper_normal');
    expect(notApplicable(text, 'aa_gradient_upper_normal')).toBe('the age rules were made in adults (18 years or more): no upper normal at age 8 y');
    // The gradient itself is still worked out: 0.21 × (760 − 47) − 38 / 0.8 − 85 = 17 mmHg (alveolar gas equation).
    expect(derived(text, 'aa_gradient').value).toBeCloseTo(149.73 - 47.5 - 85, 1);
    expect(notApplicable(note('age 17 y, sex male'), 'aa_gradient_upper_normal')).toMatch(/at age 17 y$/);
    expect(notApplicable(note('age 0.5 y, sex male'), 'aa_gradient_upper_normal')).toMatch(/at age 0\.5 y$/);
  });

  it('a child\'s hypoxaemia is read against the generous limit used without an age, and the reading says why', () => {
    // A–a = 149.73 − 40/0.8 − 55 = 44.7 mmHg: above the 20 mmHg used without an age-based limit.
    const raised = readings(note('age 8 y', 'abg 7.40/40/55/24.4'))['hypoxaemia-mechanism'];
    expect(raised).toBe(`Consistent with hypoxaemia from a raised A–a gradient (45 mmHg, above ${AA_UPPER_NORMAL_NO_AGE_MMHG} mmHg; no age-based normal under 18 years): V/Q mismatch, shunt or a diffusion limit.`);
    // Pure hypoventilation in a child: PaCO2 70 → PAO2 62, PaO2 55 → A–a 7 mmHg, within 20.
    const normal = readings(note('age 8 y', 'abg 7.20/70/55/27'))['hypoxaemia-mechanism'];
    expect(normal).toMatch(/The A–a gradient \(\d mmHg\) is within the normal of 20 mmHg \(no age-based normal under 18 years\)\.$/);
    // Without an age, as before.
    expect(readings(note('sex male', 'abg 7.20/70/55/27'))['hypoxaemia-mechanism']).toMatch(/within the normal of 20 mmHg \(age unknown\)\.$/);
  });

  it('the inlay hint shows a child\'s gradient with no limit beside it', () => {
    const text = note('age 8 y', 'abg 7.40/40/55/24.4');
    const labels = inlayHints(checkNote(text), { start: 0, end: 100 }, { categories: new Set<HintCategory>(HINT_CATEGORIES) }).map((h) => h.label).join(' ');
    expect(labels).toMatch(/A–a 45(?! \()/);
  });

  it('`show` and the hover of the PaO2 say why it is not given', async () => {
    const text = note('age 8 y', 'abg 7.40/40/55/24.4');
    const { renderShow } = await import('../../server/src/cli/render-show');
    const { paint } = await import('../../server/src/cli/colour');
    expect(renderShow('child.pneu', checkNote(text), paint(false))).toContain('n/a      A–a normal ≤: the age rules were made in adults (18 years or more): no upper normal at age 8 y');
    const { hoverAt } = await import('../../server/src/core/service');
    const po2 = text.split('\n')[3]!.indexOf('55');
    const hover = hoverAt(checkNote(text), { line: 3, character: po2 });
    expect(hover?.markdown ?? '').toContain('Not worked out here: A–a normal ≤ — the age rules were made in adults (18 years or more): no upper normal at age 8 y.');
  });

  it('is given from 18 years', () => {
    expect(PBW_ADULT_FROM_YEARS).toBe(18);
    // 18 / 4 + 4 = 8.5 mmHg.
    expect(derived(note('age 18 y'), 'aa_gradient_upper_normal').value).toBeCloseTo(8.5, 6);
    expect(readings(note('age 60 y', 'abg 7.46/32/52/22.7'))['hypoxaemia-mechanism']).toMatch(/above 19 mmHg\): V\/Q mismatch/);
  });
});
