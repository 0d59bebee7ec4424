// A bare height or weight of a patient under 18 years (ADULT_FROM_YEARS, physiology/adults.ts) is
// read against a child's size, not doubted as inches or pounds (PN204). The doubt window of height
// and weight is an adult's (their usual range in the field registry, 120–220 cm and 25–250 kg:
// common practice, no source): a bare `height 70` is 70 cm, an ordinary infant length, and 70 in an
// ordinary adult height, so it was doubted and not used. Under 18 years a child's size replaces the
// adult's, from the field's hard minimum (20 cm, 0.3 kg) to the same usual maximum: a child's size
// runs from a preterm newborn's to an adult's (common practice, no source), so no smaller bound
// tells a child's height in inches from one in cm. A number impossible in cm or kg that is a
// child's size in another unit (`height 0.72`, meant as m) is doubted as that unit. The age is the one in force where the value is
// read: the header's (the whole header, whichever line states it), or at a timepoint the one
// stated there or carried to it (whichever line states it), as PN302 reads it.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import type { StatedValue } from '../../server/src/core';

const codes = (text: string) => checkNote(text).findings.map((f) => `${f.code} ${f.range.start.line + 1}`);
const pn204 = (text: string) => codes(text).filter((c) => c.startsWith('PN204'));

/** Each header value of `id` as read: its number, whether it is used, the unit it is doubted to be in. */
function header(text: string, id: string): [number | null, boolean, string | null][] {
  return checkNote(text).analysis.timeline.header.filter((s: StatedValue) => s.fieldId === id).map((s) => [s.value, s.usable, s.unitDoubt]);
}

describe('a bare height or weight of a child is read against a child\'s size (PN204)', () => {
  it('an infant of 8 months, 70 cm and 8 kg: no unit doubt, both values used', () => {
    const text = 'patient age 8 mo, height 70, weight 8';
    expect(codes(text)).toEqual([]);
    expect(header(text, 'height')).toEqual([[70, true, null]]);
    expect(header(text, 'weight')).toEqual([[8, true, null]]);
  });

  it('a toddler of 2 years and 86 cm, a child of 6 years, 116 cm and 21 kg', () => {
    expect(codes('patient age 2 y, height 86')).toEqual([]);
    expect(codes('patient age 6 y, height 116, weight 21')).toEqual([]);
    // A newborn at term, about 50 cm (the WHO length-for-age median at birth, 49.1 cm for girls and 49.9 cm for boys, read in the WHO package anthro) and 3.3 kg (from memory), written with an age of 0 years or months.
    expect(codes('patient age 0 y, height 50, weight 3.3')).toEqual([]);
    expect(codes('patient age 0 mo, height 48')).toEqual([]);
  });

  it('the age after the height on the same line reads the same', () => {
    const text = 'patient height 70, weight 8, age 8 mo';
    expect(codes(text)).toEqual([]);
    expect(header(text, 'height')).toEqual([[70, true, null]]);
  });

  it('the age on an earlier or a later header line reads the same: the header is read as a whole', () => {
    expect(codes('patient age 8 mo\npatient height 70, weight 8')).toEqual([]);
    const later = 'patient height 70, weight 8\npatient sex male\npatient age 8 mo';
    expect(pn204(later)).toEqual([]);
    expect(header(later, 'height')).toEqual([[70, true, null]]);
    // With a measurement before it (the implicit first timepoint), a patient line is still the header's.
    expect(pn204('patient height 70\nvitals hr 130\npatient age 8 mo')).toEqual([]);
  });

  it('an age stated twice in the header: the later, the one in force, decides (either order)', () => {
    expect(pn204('patient age 8 mo, height 70\npatient age 30 y')).toEqual(['PN204 1']);
    expect(pn204('patient age 30 y, height 70\npatient age 8 mo')).toEqual([]);
  });

  it('the usual minimum (PN302) and the doubt (PN204) take the same header age: the last, which when not used is no age', () => {
    // Age 250 y is impossible (PN301) and replaces the 6 y before it (PN206): no age is in force.
    expect(codes('patient age 6 y, height 116 cm\npatient age 250 y')).toEqual(['PN302 1', 'PN206 2', 'PN301 2']);
    expect(pn204('patient age 6 y, height 70\npatient age 250 y')).toEqual(['PN204 1']);
  });

  it('an age in weeks or days is a child\'s age too (read in years: 3 wk is 0.058 y)', () => {
    expect(codes('patient age 3 wk, height 50')).toEqual([]);
    expect(header('patient age 10 d, height 50', 'height')).toEqual([[50, true, null]]);
  });

  it('an adult, a patient of 18, or one of no stated age keeps the adult doubt window', () => {
    expect(pn204('patient age 40 y, height 70')).toEqual(['PN204 1']);
    expect(header('patient age 40 y, height 70', 'height')).toEqual([[70, false, 'in']]);
    expect(pn204('patient age 18 y, height 70')).toEqual(['PN204 1']);
    expect(pn204('patient height 70')).toEqual(['PN204 1']);
    expect(pn204('patient age 17 y, height 70')).toEqual([]);
    // An age not used (impossible, or a unit in doubt) is no age.
    expect(pn204('patient age 250 y, height 70')).toContain('PN204 1');
  });

  it('a timepoint reads its patient line with the age in force there', () => {
    // Carried from the header.
    const carried = 'patient age 8 mo\n@ day 1 08:00\npatient height 70, weight 8\nvitals hr 130';
    expect(codes(carried)).toEqual([]);
    const tp = checkNote(carried).analysis.timeline.timepoints[0]!;
    expect(tp.values.numberOf('height')).toBe(70);
    // Stated at the timepoint, on a line before or after the height.
    expect(pn204('@ day 1 08:00\npatient height 70\npatient age 8 mo')).toEqual([]);
    expect(pn204('@ day 1 08:00\npatient age 8 mo\npatient height 70')).toEqual([]);
    // An adult's age restated at the timepoint, after the height there: the adult's window.
    expect(pn204('patient age 8 mo\n@ day 1 08:00\npatient height 70\npatient age 30 y')).toEqual(['PN204 3']);
    // A later timepoint's age changes nothing before it: the header keeps its own.
    expect(pn204('patient age 8 mo, height 70\n@ day 1 08:00\npatient age 30 y\n@ day 2 08:00\npatient height 70')).toEqual(['PN204 5']);
  });

  it('a number impossible in cm and a child\'s size in another unit is doubted as that unit', () => {
    expect(codes('patient age 6 y, height 1.2')).toEqual(['PN204 1']); // 1.2 m
    expect(codes('patient age 6 y, height 4')).toEqual(['PN204 1']); // 4 ft
    expect(header('patient age 6 y, height 1.2', 'height')).toEqual([[1.2, false, 'm']]);
    // An infant's 72 cm in metres, a toddler's 85 cm in feet: no adult's size, a child's.
    expect(header('patient age 8 mo, height 0.72', 'height')).toEqual([[0.72, false, 'm']]);
    expect(header('patient age 2 y, height 2.8', 'height')).toEqual([[2.8, false, 'ft']]);
    // For an adult 0.72 m is no size either: impossible in cm (PN301), with no unit offered.
    expect(codes('patient age 40 y, height 0.72')).toEqual(['PN301 1']);
    // A preterm newborn's length is read in cm.
    expect(codes('patient age 0 mo, height 35, weight 1.1')).toEqual([]);
  });

  it('the usual maximum stays: a child\'s bare weight above 250 kg is doubted as pounds', () => {
    expect(codes('patient age 10 y, weight 300')).toEqual(['PN204 1']);
    expect(codes('patient age 16 y, weight 130, height 190')).toEqual([]);
  });

  it('no other field doubts a child\'s ordinary bare values: an infant\'s tidal volume and rate', () => {
    // Only height and weight have a doubt window an infant's values fall below and another unit
    // reads as an adult's: 60 L and 40 Hz are no ordinary tidal volume or rate.
    expect(pn204('patient age 8 mo, weight 8\n@ day 1 08:00\nvent mode PC, vt 60, rate 40, pinsp 18, peep 5')).toEqual([]);
  });
});
