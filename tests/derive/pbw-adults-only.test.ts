// Predicted body weight by the ARDS Network equation (The Acute Respiratory Distress Syndrome Network.
// Ventilation with lower tidal volumes as compared with traditional tidal volumes for acute lung injury
// and the acute respiratory distress syndrome. N Engl J Med 2000;342:1301–1308, from memory: male
// 50 + 0.91 × (height cm − 152.4), female 45.5 + 0.91 × (height cm − 152.4)) was made for adults; the
// trial enrolled adults (18 years or more, from memory), and the project's reference notes say it is not
// valid for children, as does the abstract of a BMC Pulm Med 2017 paper on predicted body weight from
// pre-term to adult (doi 10.1186/s12890-017-0427-1, read there: the trial's relationship holds for adults
// only). A 6-year-old of 100 cm got a PBW of 2.3 kg, a VT of 120 mL read as 51.8 mL/kg with
// a lung-protective warning (PN403), and a ventilatory ratio of 13.8.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { derivation, derived } from './helpers';

const vent = 'vent      mode VC, vt 120, rate 25, peep 5, fio2 0.4\nabg       ph 7.40, pco2 40, po2 80, hco3 24';
const note = (patient: string) => `patient   ${patient}\n@ day 1 08:00\n${vent}`;
const notApplicable = (text: string, id: string) => derivation(text).notApplicable.find((n) => n.id === id)?.reason;

describe('predicted body weight is for adults (ARDS Network 2000, from memory)', () => {
  it('is not worked out for a child, and says why; nor is what rests on it', () => {
    const text = note('age 6 y, sex male, height 100 cm');
    expect(derivation(text).derived.map((d) => d.id)).not.toContain('predicted_body_weight');
    expect(notApplicable(text, 'predicted_body_weight')).toBe('the ARDS Network equation is for adults (18 years or more): not worked out at age 6 y');
    expect(notApplicable(text, 'vt_per_kg_pbw')).toBe('no predicted body weight: the ARDS Network equation is for adults (18 years or more): not worked out at age 6 y');
    expect(notApplicable(text, 'ventilatory_ratio')).toBe('no predicted body weight: the ARDS Network equation is for adults (18 years or more): not worked out at age 6 y');
    // Nothing asks to "add PBW", which cannot be added.
    expect(derivation(text).missing.flatMap((m) => m.needs)).not.toContain('PBW');
    expect(checkNote(text).findings.filter((f) => f.code === 'PN403')).toEqual([]);
    expect(notApplicable(note('age 17 y, sex female, height 160 cm'), 'predicted_body_weight')).toMatch(/at age 17 y$/);
  });

  it('`show` and the hovers say so where the values would have been (grammar/README.md: they "say so instead of asking for it")', async () => {
    const text = note('age 6 y, sex male, height 100 cm');
    const { renderShow } = await import('../../server/src/cli/render-show');
    const { paint } = await import('../../server/src/cli/colour');
    const shown = renderShow('child.pneu', checkNote(text), paint(false));
    const why = 'the ARDS Network equation is for adults (18 years or more): not worked out at age 6 y';
    expect(shown).toContain(`n/a      PBW: ${why}`);
    expect(shown).toContain(`n/a      VT/PBW: no predicted body weight: ${why}`);
    expect(shown).toContain(`n/a      VR: no predicted body weight: ${why}`);
    const { hoverAt } = await import('../../server/src/core/service');
    const lines = text.split('\n');
    const onVt = hoverAt(checkNote(text), { line: 2, character: lines[2]!.indexOf('120') })?.markdown ?? '';
    expect(onVt).toContain(`Not worked out here: PBW — ${why}.`);
    expect(onVt).toContain(`Not worked out here: VT/PBW — no predicted body weight: ${why}.`);
    const onPco2 = hoverAt(checkNote(text), { line: 3, character: lines[3]!.indexOf('pco2 40') + 5 })?.markdown ?? '';
    expect(onPco2).toContain(`Not worked out here: VR — no predicted body weight: ${why}.`);
    // An adult height that gives no weight, the same.
    expect(renderShow('short.pneu', checkNote(note('age 30 y, sex female, height 100 cm')), paint(false))).toContain('n/a      PBW: the ARDS Network equation gives no weight for a height of 100 cm');
  });

  it('is worked out from 18 years, and where the age is not given', () => {
    // 50 + 0.91 × (175 − 152.4) = 70.566 kg.
    expect(derived(note('age 18 y, sex male, height 175 cm'), 'predicted_body_weight').value).toBeCloseTo(70.566, 3);
    expect(derived(note('sex male, height 175 cm'), 'predicted_body_weight').value).toBeCloseTo(70.566, 3);
  });

  it('an adult height the equation gives no weight for is named as such, not asked for', () => {
    // 45.5 + 0.91 × (100 − 152.4) = −2.2 kg: no weight.
    const text = note('age 30 y, sex female, height 100 cm');
    expect(notApplicable(text, 'predicted_body_weight')).toBe('the ARDS Network equation gives no weight for a height of 100 cm');
    expect(notApplicable(text, 'vt_per_kg_pbw')).toBe('no predicted body weight: the ARDS Network equation gives no weight for a height of 100 cm');
    expect(derivation(text).missing.flatMap((m) => m.needs)).not.toContain('PBW');
  });
});
