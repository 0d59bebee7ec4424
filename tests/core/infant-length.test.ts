// An infant's bare height. Under 18 years a bare height is read against a child's size, from the
// field's hard minimum (20 cm), and a number impossible in cm is offered the unit that makes it a
// child's size: an 8-month-old's `height 10` was offered inches, 25 cm. No infant is that long
// after birth: a term newborn is about 50 cm long (common practice, no source), and a newborn of
// 24 weeks of gestation about 30 cm (from memory). So under a year (INFANT_UNTIL_YEARS) an
// infant's length starts at 30 cm (INFANT_LENGTH_MIN_CM, from memory, as above): a bare number is
// read in cm from there; a unit is offered only where it makes the number 30 cm or more (`height
// 25`, 25 in = 63.5 cm, an infant's length); a number no unit makes an infant's length is reported
// impossible (PN301) and not used, with nothing offered; and a height written in cm below 30 is
// unusual (PN302), where a child's has no usual minimum.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import type { StatedValue } from '../../server/src/core';

const findings = (text: string) => checkNote(text).findings.map((f) => `${f.code} ${f.range.start.line + 1}`);

function height(text: string): [number | null, boolean, string | null] {
  const s = checkNote(text).analysis.timeline.header.find((v: StatedValue) => v.fieldId === 'height');
  if (!s) throw new Error('no height');
  return [s.value, s.usable, s.unitDoubt];
}

describe('an infant\'s bare height: no unit is offered that makes it shorter than 30 cm', () => {
  it('an 8-month-old\'s `height 10`: impossible, not used, and no inches offered (10 in is 25 cm)', () => {
    const result = checkNote('patient age 8 mo, height 10');
    expect(result.findings.map((f) => f.code)).toEqual(['PN301']);
    expect(result.findings[0]!.message).not.toMatch(/\bin in\b|inches/);
    expect(result.findings[0]!.fixes ?? []).toEqual([]);
    expect(height('patient age 8 mo, height 10')).toEqual([10, false, null]);
    // In days or weeks the same.
    expect(findings('patient age 20 d, height 11')).toEqual(['PN301 1']);
  });

  it('a bare number that inches make an infant\'s length is offered inches: `height 25` (63.5 cm)', () => {
    expect(findings('patient age 8 mo, height 25')).toEqual(['PN204 1']);
    expect(height('patient age 8 mo, height 25')).toEqual([25, false, 'in']);
    expect(height('patient age 3 wk, height 20')).toEqual([20, false, 'in']);
  });

  it('from 30 cm a bare number is an infant\'s length in cm, as before', () => {
    expect(findings('patient age 8 mo, height 70, weight 8')).toEqual([]);
    expect(findings('patient age 0 mo, height 35, weight 1.1')).toEqual([]);
    expect(height('patient age 0 d, height 30')).toEqual([30, true, null]);
  });

  it('a height written in cm below 30 is unusual for an infant (PN302), and used', () => {
    expect(findings('patient age 8 mo, height 25 cm')).toEqual(['PN302 1']);
    expect(height('patient age 8 mo, height 25 cm')).toEqual([25, true, null]);
    expect(findings('patient age 8 mo, height 30 cm')).toEqual([]);
  });

  it('from a year on a child\'s length keeps its window from the hard minimum', () => {
    expect(findings('patient age 1 y, height 25 cm')).toEqual([]);
    expect(findings('patient age 12 mo, height 25')).toEqual([]);
    // An older child's impossible number is still offered a child's size: 10 in is 25 cm.
    expect(findings('patient age 2 y, height 10')).toEqual(['PN204 1']);
  });

  it('the age of a timepoint decides at a timepoint, whichever line states it', () => {
    expect(findings('patient sex male\n@ day 1 08:00\npatient height 10, age 8 mo\nvitals hr 130')).toEqual(['PN301 3']);
    expect(findings('patient age 8 mo\n@ day 1 08:00\npatient height 25 cm\nvitals hr 130')).toEqual(['PN302 3']);
  });
});
