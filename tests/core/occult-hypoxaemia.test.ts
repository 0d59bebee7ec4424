// SpO2 against SaO2 at one timepoint. Occult (hidden) hypoxaemia: an arterial saturation below 88 %
// while the pulse oximeter reads 92 % or more (Sjoding MW, Dickson RP, Iwashyna TJ, Gay SE, Valley TS.
// Racial bias in pulse oximetry measurement. N Engl J Med 2020;383:2477–2478, from memory: SaO2 < 88 %
// with SpO2 92–96 %; the same SaO2 < 88 % with SpO2 above 92 % in later studies of it, e.g. the
// intraoperative one summarised by Anesthesia Experts). The oximeter reads high: the SaO2 is the
// saturation to act on.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { OCCULT_SAO2_BELOW_PERCENT, OCCULT_SPO2_FROM_PERCENT, occultHypoxaemiaCheck } from '../../server/src/core/checks/occult-hypoxaemia';

const found = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN406');

describe('SpO2 well above the SaO2 (PN406)', () => {
  it('is reported where SaO2 is below 88 % and SpO2 is 92 % or more at one timepoint', () => {
    const text = '@ 08:00\nvitals spo2 94\nabg ph 7.40, pco2 40, po2 52, sao2 86';
    const f = found(text);
    expect(f).toHaveLength(1);
    expect(f[0]!.range.start.line).toBe(2);
    expect(f[0]!.message).toBe('SaO2 86 % with SpO2 94 % at this timepoint: consistent with occult hypoxaemia (an arterial saturation below 88 % while the oximeter reads 92 % or more). The oximeter reads high here; the SaO2 is the one measured in the blood.');
  });

  it('is silent at the edges and where either saturation is missing or from another timepoint', () => {
    expect(found('@ 08:00\nvitals spo2 92\nabg sao2 88')).toEqual([]); // SaO2 88 % is not below 88 %
    expect(found('@ 08:00\nvitals spo2 91\nabg sao2 80')).toEqual([]); // SpO2 below 92 %: the oximeter does not claim normal
    expect(found('@ 08:00\nvitals spo2 92\nabg sao2 87')).toHaveLength(1);
    expect(found('@ 08:00\nvitals spo2 95\n@ 08:30\nabg sao2 85')).toEqual([]);
    expect(found('@ 08:00\nabg sao2 85')).toEqual([]);
  });
});

// The thresholds as read: occult hypoxaemia, an arterial SaO2 below 88 % while the pulse oximeter
// reads 92 % or more, defined so in the abstract of Valbuena VSM, Seelye S,
// Sjoding MW and coauthors, Racial bias and reproducibility in pulse oximetry among medical and
// surgical inpatients in general care in the Veterans Health Administration 2013–19, BMJ
// 2022;378:e069775 (PubMed 35793817). The 2020 letter itself (SpO2 92–96 %) is still from memory.
describe('PN406 thresholds, as read (Valbuena, Sjoding and coauthors, BMJ 2022)', () => {
  it('are an SaO2 below 88 % with an SpO2 of 92 % or more', () => {
    expect(OCCULT_SAO2_BELOW_PERCENT).toBe(88);
    expect(OCCULT_SPO2_FROM_PERCENT).toBe(92);
  });

  it('its source names where they were read, and what of the 2020 letter is still recalled', () => {
    expect(occultHypoxaemiaCheck.source).toContain('BMJ 2022;378:e069775');
    expect(occultHypoxaemiaCheck.source).toContain('read in the abstract');
    expect(occultHypoxaemiaCheck.source).not.toMatch(/2477–2478 \(from memory\)/);
  });
});

// The 2020 letter as read on its PubMed page (33326721, December 2026, session 28): "Racial Bias in Pulse Oximetry
// Measurement", N Engl J Med 2020 Dec 17;383(25):2477-2478, doi 10.1056/NEJMc2029240, "Michael W Sjoding et al.";
// the legend of its figure 1: "The shaded area indicates an arterial oxygen saturation of less than 88%". Its first
// three authors also on AHRQ PSNet's page ("Sjoding MW, Dickson RP, Iwashyna TJ, et al."); the last two, and the
// SpO2 of 92–96 %, not read there.
const SJODING_2020_SHADED_SAO2_BELOW_PERCENT = 88;

describe('PN406: the 2020 letter, as read on its PubMed page', () => {
  it('shades an SaO2 below 88 %, the threshold Pneumark uses', () => {
    expect(OCCULT_SAO2_BELOW_PERCENT).toBe(SJODING_2020_SHADED_SAO2_BELOW_PERCENT);
  });

  it('its source gives the citation as read and where, and marks what is recalled', () => {
    expect(occultHypoxaemiaCheck.source).toContain('N Engl J Med 2020;383(25):2477–2478, doi 10.1056/NEJMc2029240');
    expect(occultHypoxaemiaCheck.source).toContain('PubMed 33326721');
    expect(occultHypoxaemiaCheck.source).toContain('the last two authors and its SpO2 of 92–96 % from memory');
  });
});
