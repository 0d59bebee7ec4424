// A child's height after the first year. Under a year a length has a floor that rises with age
// (tests/core/infant-length.test.ts); after it there was none short of the field's hard minimum
// (20 cm), so a 3-year-old of 45 cm passed. The floor now goes on through childhood in the same way
// (`childHeightMinCm`): the −3 SD of the shorter sex at the age corrected for a birth 16 weeks
// early (the earliest of INTERGROWTH-21st very preterm size at birth, 2016; in full to a corrected age
// of 3 years, none from about 4 years 4 months: see the last block), less 10 cm (our margin,
// no source), in whole cm rounded down, from the height-for-age by whole year, straight between them:
// - 1 to 4 years: WHO Multicentre Growth Reference Study Group, WHO Child Growth Standards:
//   length/height-for-age … methods and development, WHO 2006 (citation from memory); the girls' rows
//   read in the WHO's package anthro (data-raw/growthstandards/lenanthro.txt, sex 2): day 365 M
//   74.0049 S 0.03479 (length), day 731 M 85.7299 S 0.03764 (height), day 1096 M 95.0572 S 0.04007,
//   day 1461 M 102.7312 S 0.04193;
// - 5 to 19 years: de Onis M, Onyango AW, Borghi E, Siyam A, Nishida C, Siekmann J. Development of a
//   WHO growth reference for school-aged children and adolescents. Bull World Health Organ
//   2007;85:660–667 (citation from memory); the girls' rows read in the WHO's package anthroplus
//   (data-raw/growthstandards/hfawho2007.txt), by month, girls (sex 2): month 60 M 109.0725 S
//   0.04346, month 108 M 132.4944 S 0.04612, month 120 M 138.6363 S 0.04614, month 192 M 162.5156 S
//   0.04176, month 204 M 162.8545 S 0.04109, month 216 M 163.0595 S 0.04053; boys (sex 1), shorter
//   at −3 SD at 10 to 13 years (the girls' growth spurt comes earlier): month 120 M 137.7795 S
//   0.04626, month 132 M 143.1126 S 0.04703, month 144 M 149.0807 S 0.04753, month 156 M 156.0426 S
//   0.04760; month 108 M 132.5652 S 0.04535, month 168 M 163.1816 S 0.04714.
// L is 1 on every row: −3 SD is M × (1 − 3S). The floor is capped at the adult's usual minimum
// (120 cm, the field registry: common practice, no source), which applies from 18 years, so the
// floor does not drop at 18. Invented patients.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { ADULT_HEIGHT_USUAL_MIN_CM, CHILD_HEIGHT_MARGIN_CM, childHeightMinCm, CORRECTED_IN_FULL_UNTIL_YEARS, correctionWeeksAt, EARLIEST_BIRTH_WEEKS_BEFORE_TERM } from '../../server/src/core/analysis/bounds';
import { heightForAgeShorterCm, lengthForAgeGirlsCm } from '../../server/src/core/physiology/growth';

const findings = (text: string) => checkNote(text).findings.map((f) => `${f.code} ${f.range.start.line + 1}`);
const messageOf = (text: string) => checkNote(text).findings[0]?.message ?? '';
/** −3 SD of a row read: M × (1 − 3S). */
const minus3 = (m: number, s: number) => m * (1 - 3 * s);
/** Years of age corrected for a birth 16 weeks early. */
const corrected = (years: number) => years - (EARLIEST_BIRTH_WEEKS_BEFORE_TERM * 7) / 365.25;

describe('the floor of a child\'s height after the first year (`childHeightMinCm`)', () => {
  it('at 1, 2, 5, 10 and 12 years, and from about 12 years 4 months the adult\'s 120 cm', () => {
    // 1 y: corrected 253.25 days, on the first year's rows (WHO 2006, days 244 and 274): −3 SD 62.05 cm − 10 → 52.
    expect(childHeightMinCm(1)).toBe(52);
    // 2 y: corrected 1.693 y, between 1 y (74.0049, 0.03479: 66.28) and 2 y (85.7299, 0.03764: 76.05), WHO 2006: 73.05 − 10 → 63.
    expect(childHeightMinCm(2)).toBe(63);
    // From about 4 years 4 months the age is not corrected (`correctionWeeksAt`).
    // 5 y: WHO 2007 month 60 (109.0725, 0.04346): 94.85 − 10 → 84.
    expect(childHeightMinCm(5)).toBe(84);
    // 10 y: the boys' month 120 (137.7795, 0.04626): 118.66 − 10 → 108.
    expect(childHeightMinCm(10)).toBe(108);
    // 12 y: the boys' month 144 (149.0807, 0.04753): 127.82 − 10 → 117.
    expect(childHeightMinCm(12)).toBe(117);
    // 17 y: between 16 y (month 192: 162.5156, 0.04176: 142.16) and 17 y (month 204: 162.8545, 0.04109: 142.78): 142.59 − 10 → 132,
    // above the adult's usual minimum (120 cm, field registry, common practice, no source): capped at 120.
    expect(heightForAgeShorterCm(corrected(17), -3)! - CHILD_HEIGHT_MARGIN_CM).toBeCloseTo(132.59, 1);
    expect(ADULT_HEIGHT_USUAL_MIN_CM).toBe(120);
    expect(childHeightMinCm(17)).toBe(120);
    // 18 y for the function (a patient of 18 is an adult): 143.09 − 10 → 133 uncapped, 120 capped.
    expect(childHeightMinCm(18)).toBe(120);
    // The cap is reached at about 12 years 4 months: day 4,516 119 cm, day 4,517 120 cm (12.37 y,
    // between the boys' 12 y, 127.82, and 13 y, 133.76: 130.0 − 10 → 120).
    expect([childHeightMinCm(4516 / 365.25), childHeightMinCm(4517 / 365.25)]).toEqual([119, 120]);
    for (const years of [13, 14, 15, 16, 17.5, 17.99]) expect([years, childHeightMinCm(years)]).toEqual([years, 120]);
  });

  it('joins the first year\'s floor at a year without a drop, rises or holds on every day to 18 years, and never exceeds the adult\'s', () => {
    // Just before a year, at a year and just after: 52 cm (the first year's rows, corrected age).
    expect([childHeightMinCm(364 / 365.25), childHeightMinCm(1), childHeightMinCm(366 / 365.25)]).toEqual([52, 52, 52]);
    let previous = childHeightMinCm(0);
    for (let day = 1; day <= 18 * 365.25; day++) {
      const floor = childHeightMinCm(day / 365.25);
      expect([day, floor >= previous, floor <= ADULT_HEIGHT_USUAL_MIN_CM]).toEqual([day, true, true]);
      previous = floor;
    }
  });

  it('at the joins of the references: the corrected age of a year (the first year\'s last row is the first whole year\'s), of 2 years (height from length), and 5 years of age (WHO 2007 from WHO 2006)', () => {
    const at = (correctedYears: number) => childHeightMinCm(correctedYears + (EARLIEST_BIRTH_WEEKS_BEFORE_TERM * 7) / 365.25);
    // Corrected 1 y: day 365 of the first year (74.0049, 0.03479): 66.28 − 10 → 56, on both tables.
    expect(lengthForAgeGirlsCm(365, -3)).toBeCloseTo(heightForAgeShorterCm(1, -3)!, 9);
    expect([at(0.999), at(1), at(1.001)]).toEqual([56, 56, 56]);
    // Corrected 2 y: the height row (day 731: 85.7299, 0.03764: 76.05), below the length of day 730 (86.4008, 0.03733: 76.72).
    expect(heightForAgeShorterCm(2, -3)).toBeCloseTo(minus3(85.7299, 0.03764), 6);
    expect(heightForAgeShorterCm(2, -3)!).toBeLessThan(minus3(86.4008, 0.03733));
    expect(at(2)).toBe(66);
    // 5 y, with no correction (from about 4 years 4 months): WHO 2007 month 60 (109.0725, 0.04346: 94.85), below WHO 2006 day 1826 (109.4189, 0.04346: 95.15).
    expect(heightForAgeShorterCm(5, -3)).toBeCloseTo(minus3(109.0725, 0.04346), 6);
    expect(heightForAgeShorterCm(5, -3)!).toBeLessThan(minus3(109.4189, 0.04346));
    expect([childHeightMinCm(4.999), childHeightMinCm(5), childHeightMinCm(5.001)]).toEqual([84, 84, 84]);
  });

  it('takes the shorter sex at each whole year: the girls\' −3 SD but at 10 to 13 years the boys\' (WHO 2007 rows read)', () => {
    // Girls 9 y 114.16 < boys 9 y (132.5652, 0.04535) 114.53; boys 10 y 118.66 < girls 10 y (138.6363, 0.04614) 119.45;
    // boys 13 y (156.0426, 0.0476) 133.76 < girls 13 y (156.3748, 0.04439) 135.55; girls 14 y (159.789, 0.04345) 138.96 < boys 14 y (163.1816, 0.04714) 140.10.
    expect(heightForAgeShorterCm(9, -3)).toBeCloseTo(minus3(132.4944, 0.04612), 6);
    expect(heightForAgeShorterCm(9, -3)!).toBeLessThan(minus3(132.5652, 0.04535));
    expect(heightForAgeShorterCm(10, -3)).toBeCloseTo(minus3(137.7795, 0.04626), 6);
    expect(heightForAgeShorterCm(10, -3)!).toBeLessThan(minus3(138.6363, 0.04614));
    expect(heightForAgeShorterCm(13, -3)).toBeCloseTo(minus3(156.0426, 0.0476), 6);
    expect(heightForAgeShorterCm(13, -3)!).toBeLessThan(minus3(156.3748, 0.04439));
    expect(heightForAgeShorterCm(14, -3)).toBeCloseTo(minus3(159.789, 0.04345), 6);
    expect(heightForAgeShorterCm(14, -3)!).toBeLessThan(minus3(163.1816, 0.04714));
  });

  it('is never above the shorter sex\'s −3 SD less the margin at the child\'s own age (rows read, WHO 2006 and 2007)', () => {
    // [age in years, M, S] as read: WHO 2006 girls days 500, 1000 and 1500 (height from day 731);
    // WHO 2007 girls months 66, 186 and 216, boys months 126 (140.3948, 0.04667) and 150 (152.4425, 0.04763).
    const rows: readonly (readonly [number, number, number])[] = [
      [500 / 365.25, 79.0642, 0.03564], [1000 / 365.25, 92.8178, 0.03949], [1500 / 365.25, 103.4842, 0.0421],
      [66 / 12, 112.1753, 0.04399], [126 / 12, 140.3948, 0.04667], [150 / 12, 152.4425, 0.04763], [186 / 12, 162.188, 0.04214], [216 / 12, 163.0595, 0.04053],
    ];
    for (const [years, m, s] of rows) {
      expect(childHeightMinCm(years)).toBeLessThanOrEqual(minus3(m, s) - CHILD_HEIGHT_MARGIN_CM);
      // And not far below it: the correction lowers the floor by 16 weeks of growth at most, the rounding by under 1 cm;
      // where that is above the adult's usual minimum (120 cm), the floor is the adult's.
      expect(childHeightMinCm(years)).toBeGreaterThan(Math.min(minus3(m, s) - CHILD_HEIGHT_MARGIN_CM - 6, ADULT_HEIGHT_USUAL_MIN_CM - 1));
    }
    // Between whole years the straight line is above the shorter sex's month by 0.13 cm at most: at 12.5 years (boys month 150).
    expect(heightForAgeShorterCm(12.5, -3)! - minus3(152.4425, 0.04763)).toBeLessThan(0.14);
    expect(corrected(10)).toBeCloseTo(9.693, 3);
  });
});

describe('a child\'s height below the floor of the age is unusual, with a word on disorders of growth', () => {
  it('a 3-year-old of 45 cm (it passed) is unusual; of 71 cm, the floor, it is not', () => {
    // 3 y: corrected 2.693 y, between 2 y (76.05) and 3 y (95.0572, 0.04007: 83.63): 81.31 − 10 → 71.
    expect(childHeightMinCm(3)).toBe(71);
    expect(findings('patient age 3 y, height 45 cm')).toEqual(['PN302 1']);
    expect(messageOf('patient age 3 y, height 45 cm')).toBe('Height 45 cm is unusual (usually 71 cm to 220 cm): check the unit and the transcription. As `45 in` it would be usual. A disorder of growth can make so short a height real at this age.');
    expect(findings('patient age 3 y, height 71 cm, weight 9')).toEqual([]);
    expect(findings('patient age 3 y, height 70 cm')).toEqual(['PN302 1']);
  });

  it('at 10 years: 107 cm is unusual, 108 cm is not; at 12 years 116 and 117 cm; at 17 years 119 and 120 cm', () => {
    expect(findings('patient age 12 y, height 116 cm')).toEqual(['PN302 1']);
    expect(findings('patient age 12 y, height 117 cm')).toEqual([]);
    expect(findings('patient age 10 y, height 107 cm')).toEqual(['PN302 1']);
    expect(findings('patient age 10 y, height 108 cm')).toEqual([]);
    expect(findings('patient age 17 y, height 119 cm')).toEqual(['PN302 1']);
    expect(findings('patient age 17 y, height 120 cm')).toEqual([]);
  });

  it('from 18 years the adult\'s usual minimum (120 cm) applies, and its message has no word on growth', () => {
    expect(findings('patient age 18 y, height 125 cm')).toEqual([]);
    expect(findings('patient age 18 y, height 115 cm')).toEqual(['PN302 1']);
    expect(messageOf('patient age 18 y, height 115 cm')).not.toMatch(/growth/);
  });

  it('a bare number below the floor is read in cm from a year on (a disorder of growth can make it real), and is unusual', () => {
    // 45 at 3 years: 45 cm, used, unusual; 100 at 10 years (floor 108): 100 cm, used, unusual.
    for (const text of ['patient age 3 y, height 45', 'patient age 10 y, height 100']) {
      expect(findings(text)).toEqual(['PN302 1']);
      const s = checkNote(text).analysis.timeline.header.find((v) => v.fieldId === 'height')!;
      expect([s.usable, s.unitDoubt]).toEqual([true, null]);
      expect(messageOf(text)).toMatch(/A disorder of growth can make so short a height real at this age\.$/);
    }
    // At 17 years a bare 115 is read in cm, as an adult's is, and is unusual for the age (120 cm); 125 is usual, as at 18.
    expect(findings('patient age 17 y, height 115')).toEqual(['PN302 1']);
    expect(findings('patient age 17 y, height 125')).toEqual([]);
    // From the floor a bare number is a height in cm, as before.
    expect(findings('patient age 5 y, height 90, weight 14')).toEqual([]);
  });

  it('a height above the floor says nothing of growth; the message of another field is unchanged', () => {
    expect(messageOf('patient age 3 y, height 230 cm')).not.toMatch(/growth/);
    expect(messageOf('patient age 3 y\n@ 08:00\nvitals hr 236')).not.toMatch(/growth/);
  });
});

describe('the floor at the child/adult boundary (18 years) does not jump', () => {
  // The adult's usual minimum, 120 cm (field registry soft bounds: common practice, no source), caps
  // the child's floor, so the same height reads the same on both sides of 18 years.
  it('a 17-year-old and an 18-year-old of 125 cm are both usual (the 17-year-old was flagged: floor 132 cm)', () => {
    expect(findings('patient age 17 y, height 125 cm')).toEqual([]);
    expect(findings('patient age 18 y, height 125 cm')).toEqual([]);
    expect(findings('patient age 17.9 y, height 125 cm')).toEqual([]);
    expect(findings('patient age 215 mo, height 125 cm')).toEqual([]);
  });

  it('119 cm is unusual on both sides of 18 years, with the word on growth only for the child', () => {
    for (const age of ['14 y', '16 y', '17 y', '17.99 y', '18 y', '19 y', '40 y']) {
      expect([age, findings(`patient age ${age}, height 119 cm`)]).toEqual([age, ['PN302 1']]);
      expect([age, findings(`patient age ${age}, height 120 cm`)]).toEqual([age, []]);
    }
    expect(messageOf('patient age 17 y, height 119 cm')).toBe('Height 119 cm is unusual (usually 120 cm to 220 cm): check the unit and the transcription. A disorder of growth can make so short a height real at this age.');
    expect(messageOf('patient age 18 y, height 119 cm')).toBe('Height 119 cm is unusual (usually 120 cm to 220 cm): check the unit and the transcription.');
  });

  it('younger children keep the floor of their age (below 120 cm)', () => {
    // 12 y: 116 cm (WHO 2007 boys' rows, as above); 10 y: 107 cm.
    expect(findings('patient age 12 y, height 117 cm')).toEqual([]);
    expect(findings('patient age 12 y, height 115 cm')).toEqual(['PN302 1']);
  });
});

// An ex-preterm child past 2 years. The age is corrected in full for a birth 16 weeks early until a
// corrected age of 3 years, then less and less over a year (our choice, no source), to none at about
// 4 years 4 months (`correctionWeeksAt`). Read (December 2026, session 32): a growth-chart training
// module of the US Maternal and Child Health Bureau, page 10 ("Using corrected age to plot measures for
// low birthweight and premature infants", mirrored on hitpages.com): corrected age until 2 years for
// most preterm infants, often until 3 years for a birth weight under 1,000 g; and the abstract of
// Elmrayed S, Dai S, Lodha A, Kumar M, Fenton T. Preterm growth assessment: the latest findings on age
// correction. J Perinatol 2025;45(5):607–615 (PubMed 39820765): correction needed for all growth
// measures through 36 months of corrected age for children born before 32 weeks. WHO 2006 girls'
// rows as read above: 1 y 66.28, 2 y 76.05, 3 y 83.63 cm at −3 SD. Invented patients.
describe('an ex-preterm child\'s height past 2 years (`correctionWeeksAt`)', () => {
  it('1 y 11 m, 2 y, 2 y 1 m and 3 y: corrected in full, so no floor rises at 2 years', () => {
    // 1 y 11 m: corrected 1.610 y, 66.28 + 0.610 × (76.05 − 66.28) = 72.24 − 10 → 62.
    // 2 y: corrected 1.693 y, 73.05 − 10 → 63. 2 y 1 m: corrected 1.777 y, 73.87 − 10 → 63.
    // 3 y: corrected 2.693 y, 76.05 + 0.693 × (83.63 − 76.05) = 81.31 − 10 → 71.
    for (const years of [23 / 12, 2, 25 / 12, 3]) expect([years, correctionWeeksAt(years)]).toEqual([years, EARLIEST_BIRTH_WEEKS_BEFORE_TERM]);
    expect([childHeightMinCm(23 / 12), childHeightMinCm(2), childHeightMinCm(25 / 12), childHeightMinCm(3)]).toEqual([62, 63, 63, 71]);
    // Stopped at 2 years, 2 y 1 m would be judged at 2.083 y: 76.05 + 0.083 × 7.58 = 76.68 − 10 → 66, three
    // cm above the day before: a toddler born at 24 weeks of 64 cm, usual at 1 y 364 d, unusual at 2 y 1 d.
    expect(Math.floor(heightForAgeShorterCm(25 / 12, -3)! - CHILD_HEIGHT_MARGIN_CM)).toBe(66);
    expect([childHeightMinCm(730 / 365.25), childHeightMinCm(731 / 365.25), childHeightMinCm(732 / 365.25)]).toEqual([63, 63, 63]);
  });

  it('in a note: at the floor usual, a centimetre below it PN302, written in months or years', () => {
    expect(findings('patient age 23 mo, height 62 cm')).toEqual([]);
    expect(findings('patient age 23 mo, height 61 cm')).toEqual(['PN302 1']);
    expect(findings('patient age 2 y, height 63 cm')).toEqual([]);
    expect(findings('patient age 2 y, height 62 cm')).toEqual(['PN302 1']);
    expect(findings('patient age 25 mo, height 63 cm')).toEqual([]);
    expect(findings('patient age 25 mo, height 62 cm')).toEqual(['PN302 1']);
    expect(findings('patient age 3 y, height 71 cm')).toEqual([]);
    expect(findings('patient age 3 y, height 70 cm')).toEqual(['PN302 1']);
  });

  it('tapers from a corrected age of 3 years to none a year later, the corrected age rising every day', () => {
    const taperFrom = CORRECTED_IN_FULL_UNTIL_YEARS + (EARLIEST_BIRTH_WEEKS_BEFORE_TERM * 7) / 365.25;
    expect(taperFrom).toBeCloseTo(3.307, 3);
    expect(correctionWeeksAt(taperFrom)).toBe(16);
    expect(correctionWeeksAt(taperFrom + 0.5)).toBeCloseTo(8, 9);
    expect(correctionWeeksAt(taperFrom + 1)).toBe(0);
    expect(correctionWeeksAt(10)).toBe(0);
    let before = -Infinity;
    for (let day = 0; day <= 18 * 365.25; day++) {
      const years = day / 365.25;
      const corrected = years - (correctionWeeksAt(years) * 7) / 365.25;
      expect([day, corrected > before]).toEqual([day, true]);
      before = corrected;
    }
  });

  it('no step: from 16 weeks after birth to 18 years the floor rises by a centimetre a day at most, and never falls', () => {
    let previous = childHeightMinCm(113 / 365.25);
    for (let day = 114; day <= 18 * 365.25; day++) {
      const floor = childHeightMinCm(day / 365.25);
      expect([day, floor - previous >= 0 && floor - previous <= 1]).toEqual([day, true]);
      previous = floor;
    }
  });
});
