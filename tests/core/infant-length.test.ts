// An infant's bare height. Under 18 years a bare height is read against a child's size, from the
// field's hard minimum (20 cm), and a number impossible in cm is offered the unit that makes it a
// child's size: an 8-month-old's `height 10` was offered inches, 25 cm. Under a year
// an infant's length has a floor that rises with age (`childHeightMinCm`; after a year it goes on, tests/core/child-height.test.ts):
// - until 16 weeks after birth, 24 cm: a girl born at 24+0 weeks is 24.0 cm long at −3 SD
//   (INTERGROWTH-21st very preterm size at birth, read in its reproduction in pygrowthstandards);
//   it was 30 cm, "a newborn of 24 weeks of gestation" (from memory), which is that newborn's
//   median (31.8 cm) and flagged a real preterm newborn's length;
// - from then on, the girls' −3 SD length-for-age (WHO Child Growth Standards 2006, L, M and S read
//   in the WHO's package anthro) at the age corrected for a birth 16 weeks early, less 10 cm (our
//   margin, no source), in whole cm, rounded down: 46 cm at 8 months, 49 cm at 10 months.
// A bare number is read in cm from the floor; a unit is offered only where it makes the number the
// floor or more; a number no unit makes an infant's length is reported impossible (PN301) and not
// used; and a height written in cm below the floor is unusual (PN302).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import type { StatedValue } from '../../server/src/core';
import { CHILD_HEIGHT_MARGIN_CM, childHeightMinCm, EARLIEST_BIRTH_WEEKS_BEFORE_TERM } from '../../server/src/core/analysis/bounds';
import { lengthForAgeGirlsCm, PRETERM_GIRL_LENGTH_MINUS_3SD_CM } from '../../server/src/core/physiology/growth';

const findings = (text: string) => checkNote(text).findings.map((f) => `${f.code} ${f.range.start.line + 1}`);

function height(text: string): [number | null, boolean, string | null] {
  const s = checkNote(text).analysis.timeline.header.find((v: StatedValue) => v.fieldId === 'height');
  if (!s) throw new Error('no height');
  return [s.value, s.usable, s.unitDoubt];
}

describe('an infant\'s bare height: no unit is offered that makes it shorter than the floor of its age', () => {
  it('an 8-month-old\'s `height 10`: impossible, not used, and no inches offered (10 in is 25 cm)', () => {
    const result = checkNote('patient age 8 mo, height 10');
    expect(result.findings.map((f) => f.code)).toEqual(['PN301']);
    expect(result.findings[0]!.message).not.toMatch(/\bin in\b|inches/);
    expect(result.findings[0]!.fixes ?? []).toEqual([]);
    expect(height('patient age 8 mo, height 10')).toEqual([10, false, null]);
    // In days or weeks the same: a 20-day-old's `height 9` (22.9 cm in inches, below 24 cm).
    expect(findings('patient age 20 d, height 9')).toEqual(['PN301 1']);
  });

  it('a bare number that inches make an infant\'s length is offered inches: `height 25` (63.5 cm)', () => {
    expect(findings('patient age 8 mo, height 25')).toEqual(['PN204 1']);
    expect(height('patient age 8 mo, height 25')).toEqual([25, false, 'in']);
    expect(height('patient age 3 wk, height 20')).toEqual([20, false, 'in']);
  });

  it('from the floor a bare number is an infant\'s length in cm, as before', () => {
    expect(findings('patient age 8 mo, height 70, weight 8')).toEqual([]);
    expect(findings('patient age 0 mo, height 35, weight 1.1')).toEqual([]);
    expect(height('patient age 0 d, height 30')).toEqual([30, true, null]);
    expect(height('patient age 8 mo, height 46')).toEqual([46, true, null]);
  });

  it('a newborn born at 24 weeks may be 24 cm long (−3 SD, INTERGROWTH-21st): from 24 cm a bare number is read in cm, and 11 in (27.9 cm) is a length', () => {
    expect(height('patient age 0 d, height 24')).toEqual([24, true, null]);
    expect(findings('patient age 0 d, height 24, weight 0.5')).toEqual([]);
    expect(findings('patient age 3 mo, height 24 cm, weight 0.9')).toEqual([]);
    // 27.9 cm is a 24-weeker's length (−2 SD 26.6, median 31.8): inches are offered, no longer PN301.
    expect(findings('patient age 20 d, height 11')).toEqual(['PN204 1']);
    expect(height('patient age 20 d, height 11')).toEqual([11, false, 'in']);
  });

  it('a height written in cm below the floor is unusual for an infant (PN302), and used', () => {
    expect(findings('patient age 8 mo, height 25 cm')).toEqual(['PN302 1']);
    expect(height('patient age 8 mo, height 25 cm')).toEqual([25, true, null]);
    expect(findings('patient age 0 d, height 23 cm')).toEqual(['PN302 1']);
  });

  it('the floor rises with age: a 10-month-old of 31 cm is unusual (it was not), of 49 cm is not', () => {
    expect(findings('patient age 10 mo, height 31 cm')).toEqual(['PN302 1']);
    expect(findings('patient age 10 mo, height 48 cm')).toEqual(['PN302 1']);
    expect(findings('patient age 10 mo, height 49 cm')).toEqual([]);
    expect(findings('patient age 8 mo, height 30 cm')).toEqual(['PN302 1']);
    expect(findings('patient age 8 mo, height 45 cm')).toEqual(['PN302 1']);
    expect(findings('patient age 8 mo, height 46 cm')).toEqual([]);
    // The message gives the floor of the age.
    expect(checkNote('patient age 10 mo, height 31 cm').findings[0]!.message).toMatch(/49/);
  });

  it('from a year on a bare length keeps its window from the hard minimum, and the floor goes on as a usual minimum (tests/core/child-height.test.ts)', () => {
    // At a year the floor is 52 cm: `height 25 cm` was usual, and is not (PN302); read in cm and used.
    expect(findings('patient age 1 y, height 25 cm')).toEqual(['PN302 1']);
    expect(findings('patient age 12 mo, height 25')).toEqual(['PN302 1']);
    expect(height('patient age 12 mo, height 25')).toEqual([25, true, null]);
    // An older child's impossible number is still offered a child's size: 10 in is 25 cm.
    expect(findings('patient age 2 y, height 10')).toEqual(['PN204 1']);
  });

  it('the age of a timepoint decides at a timepoint, whichever line states it', () => {
    expect(findings('patient sex male\n@ day 1 08:00\npatient height 10, age 8 mo\nvitals hr 130')).toEqual(['PN301 3']);
    expect(findings('patient age 8 mo\n@ day 1 08:00\npatient height 25 cm\nvitals hr 130')).toEqual(['PN302 3']);
  });
});

describe('the floor of an infant\'s length (`childHeightMinCm` in the first year) flags no real child', () => {
  it('is 24 cm until 16 weeks after birth, then the girls\' −3 SD at the age corrected for a birth at 24 weeks, less 10 cm', () => {
    expect(childHeightMinCm(0)).toBe(24);
    expect(childHeightMinCm(111 / 365.25)).toBe(24);
    // 8 months: 243.5 days, corrected 131.5; −3 SD 56.17 cm (between days 122 and 152) − 10 → 46.
    expect(childHeightMinCm(8 / 12)).toBe(46);
    // 10 months: 304.4 days, corrected 192.4; −3 SD 59.38 cm (between days 183 and 213) − 10 → 49.
    expect(childHeightMinCm(10 / 12)).toBe(49);
  });

  it('on every day of the first year it is at most the −3 SD of a girl born at 24 weeks (24.0 cm) or, from term, her −3 SD at the corrected age less 10 cm, and never above a term girl\'s −3 SD', () => {
    for (let day = 0; day < 365; day++) {
      const floor = childHeightMinCm(day / 365.25);
      const corrected = day - EARLIEST_BIRTH_WEEKS_BEFORE_TERM * 7;
      expect(floor).toBeLessThanOrEqual(corrected < 0 ? PRETERM_GIRL_LENGTH_MINUS_3SD_CM : Math.max(PRETERM_GIRL_LENGTH_MINUS_3SD_CM, lengthForAgeGirlsCm(corrected, -3)! - CHILD_HEIGHT_MARGIN_CM));
      expect(floor).toBeLessThan(lengthForAgeGirlsCm(day, -3)! - 10);
      if (day > 0) expect(floor).toBeGreaterThanOrEqual(childHeightMinCm((day - 1) / 365.25));
    }
  });
});
