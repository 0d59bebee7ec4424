// A child's height and weight are not read against adult usual ranges. The usual bounds of height
// (120–220 cm) and weight (25–250 kg) in the field registry are adult ones (common practice, no
// source; the height range is where the ARDS Network predicted-body-weight equations were used), and
// Pneumark reads a patient under 18 years as a child elsewhere too (physiology/adults.ts: no
// predicted body weight, no age-based A–a normal). A six-year-old of 116 cm and 21 kg, or a toddler
// of 86 cm and 12 kg, is ordinary (ordinary growth, from memory), so PN302 must not ask for the
// transcription to be checked, nor offer inches for a toddler's 86 cm (86 in is 218 cm).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const codes = (text: string) => checkNote(text).findings.map((f) => `${f.code} ${f.range.start.line + 1}`);

describe('height and weight of a child (under 18 years)', () => {
  it('a six-year-old of 116 cm and 21 kg has no unusual-value finding', () => {
    expect(codes('patient   age 6 y, sex male, height 116 cm, weight 21 kg')).toEqual([]);
  });

  it('a toddler of 86 cm and 12 kg, age in months, has none either, and no inches offered', () => {
    expect(codes('patient age 30 mo, sex f, height 86 cm, weight 12 kg')).toEqual([]);
  });

  it('the age may come after the height on the line, or on a later header line', () => {
    expect(codes('patient height 116 cm, weight 21 kg, age 6 y')).toEqual([]);
    expect(codes('patient height 116 cm, weight 21 kg\npatient age 6 y')).toEqual([]);
  });

  it('a patient line at a timepoint is read with the age in force there', () => {
    expect(codes('patient age 6 y\n@ day 1 08:00\npatient weight 20 kg\nvitals hr 110')).toEqual([]);
  });

  it('an adult, or a patient of no stated age, keeps the adult usual ranges', () => {
    expect(codes('patient age 40 y, height 150 cm, weight 20 kg')).toEqual(['PN302 1']);
    expect(codes('patient height 116 cm, weight 21 kg')).toEqual(['PN302 1', 'PN302 1']);
    expect(codes('patient age 18 y, weight 21 kg')).toEqual(['PN302 1']);
  });

  it('the hard bounds still hold for a child', () => {
    expect(checkNote('patient age 6 y, height 300 cm').findings.map((f) => f.code)).toEqual(['PN301']);
  });
});
