// A child's ventilator settings are not read against an adult's usual minimum. An infant on a
// ventilator is given an inspiratory flow of about 4–10 L/min (common practice, from memory), below
// the adult usual minimum of 10 L/min in the field registry; under 18 years (the age in force, as for
// height and weight: analysis/bounds.ts) a child's range applies instead, from 2 L/min (half the
// bottom of an infant's usual flows, as the tidal volume's usual minimum is half the ARDS Network
// protocol's 4 mL/kg: common practice, no source) to the adult usual maximum. A newborn's tidal
// volume is some 15–25 mL (4–6 mL/kg of 3–4 kg, from memory): with a weight in force its usual
// minimum is 2 mL/kg already (`VT_USUAL_MIN_ML_PER_KG`), and a child with no body size in force has
// no usual minimum, as a child's size runs from a preterm newborn's to an adult's (common practice,
// no source). Invented patients only.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const found = (text: string) => checkNote(text).findings.map((f) => `${f.code} ${f.range.start.line + 1}:${f.range.start.character}`);
const messages = (text: string, code: string) => checkNote(text).findings.filter((f) => f.code === code).map((f) => f.message);

const infant = 'patient   age 2 mo\n@ day 1 08:00\n';
const newborn = 'patient   age 0 y, weight 3.2 kg\n@ day 1 08:00\n';
const adult = 'patient   age 40 y\n@ day 1 08:00\n';

describe('inspiratory flow of a child (under 18 years)', () => {
  it('an infant flow of 6 L/min is not unusual, with or without a weight', () => {
    expect(found(`${newborn}vent      mode VC, vt 18 mL, rate 40, peep 5, flow 6`)).toEqual([]);
    expect(found(`${infant}vent      mode VC, vt 20 mL, rate 40, peep 5, flow 4 L/min`)).toEqual([]);
  });

  it('an adult, or a patient of no stated age, keeps the adult usual minimum of 10 L/min', () => {
    expect(messages(`${adult}vent      mode VC, vt 450 mL, rate 14, peep 5, flow 6`, 'PN302')).toEqual([
      'Inspiratory flow 6 L/min is unusual (usually 10 L/min to 120 L/min): check the unit and the transcription.',
    ]);
    expect(found('@ day 1 08:00\nvent      mode VC, vt 450 mL, rate 14, peep 5, flow 6')).toEqual(['PN302 2:52']);
    expect(found('patient   age 18 y\n@ day 1 08:00\nvent      mode VC, vt 450 mL, rate 14, peep 5, flow 6')).toEqual(['PN302 3:52']);
  });

  it('a child has a usual minimum still: 2 L/min', () => {
    expect(messages(`${infant}vent      mode VC, vt 20 mL, rate 40, peep 5, flow 1 L/min`, 'PN302')).toEqual([
      'Inspiratory flow 1 L/min is unusual (usually 2 L/min to 120 L/min): check the unit and the transcription. As `1 L/s` it would be usual.',
    ]);
    expect(found(`${infant}vent      mode VC, vt 20 mL, rate 40, peep 5, flow 2 L/min`)).toEqual([]);
  });

  it('a bare number below a child\'s range but a child\'s flow in L/s is doubted (PN204), as an adult\'s is', () => {
    // 0.15 L/s is 9 L/min: a child's flow, below an adult's usual minimum.
    expect(found(`${infant}vent      mode VC, vt 20 mL, rate 40, peep 5, flow 0.15`)).toEqual(['PN204 3:51']);
    expect(found(`${adult}vent      mode VC, vt 450 mL, rate 14, peep 5, flow 0.15`)).toEqual(['PN302 3:52']);
    // 0.5 L/s is 30 L/min, ordinary for both.
    expect(found(`${infant}vent      mode VC, vt 20 mL, rate 40, peep 5, flow 0.5`)).toEqual(['PN204 3:51']);
    expect(found(`${adult}vent      mode VC, vt 450 mL, rate 14, peep 5, flow 0.5`)).toEqual(['PN204 3:52']);
  });

  it('the age may be written at the timepoint, after the vent line', () => {
    expect(found('@ day 1 08:00\nvent      mode VC, vt 20 mL, rate 40, peep 5, flow 6\npatient   age 1 y, weight 9 kg')).toEqual([]);
  });

  it('a measured flow under PC is read against the same ranges', () => {
    expect(found(`${infant}vent      mode PC, pinsp 12, rate 40, peep 5, flow 5`)).toEqual([]);
    expect(found(`${adult}vent      mode PC, pinsp 12, rate 14, peep 5, flow 5`)).toEqual(['PN302 3:51']);
  });
});

describe('tidal volume of a child with no body size in force', () => {
  it('a newborn tidal volume of 20 mL is not unusual where no weight is written', () => {
    expect(found(`${infant}vent      mode VC, vt 20 mL, rate 40, peep 5, flow 6`)).toEqual([]);
  });

  it('with a weight in force the usual minimum is 2 mL/kg for a child as for an adult', () => {
    // 2 mL/kg × 3.2 kg = 6.4 mL, shown whole as the field's decimals are (5 is below 6).
    expect(messages(`${newborn}vent      mode VC, vt 5 mL, rate 40, peep 5, flow 6`, 'PN302')).toEqual([
      'Tidal volume 5 mL is unusual (usually 6 mL to 1200 mL): check the unit and the transcription.',
    ]);
  });

  it('an adult, or a patient of no stated age, with no body size keeps the minimum of 50 mL', () => {
    expect(found(`${adult}vent      mode VC, vt 20 mL, rate 14, peep 5, flow 40`)).toEqual(['PN302 3:22']);
    expect(found('@ day 1 08:00\nvent      mode VC, vt 20 mL, rate 14, peep 5, flow 40')).toEqual(['PN302 2:22']);
  });
});
