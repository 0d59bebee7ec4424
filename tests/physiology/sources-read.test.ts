/**
 * Figures of cited sources that were read (December 2026) rather than recalled: each test holds
 * Pneumark's figure against the figure as read, and the citation against what it says of it.
 *
 * - The respiratory coefficients of Narins RG, Emmett M. Simple and mixed acid-base disorders: a
 *   practical approach. Medicine (Baltimore) 1980;59:161–187, read in its table as adapted in Hong
 *   Kong Practitioner 2005;27, table 3 (hkcfp.org.hk): HCO3 changes by 0.1 (acute) and 0.35
 *   (chronic) mmol/L per mmHg of PaCO2 above 40, and by 0.2 (acute) and 0.5 (chronic) per mmHg
 *   below it; and in a 2022 review in Kidney360 (3:1458–1466, table 3, PMC9416819): 0.1, 0.35, 0.2
 *   and 0.41.
 * - Winters' formula as the regression of that review's table 3: PCO2 = 1.54 × HCO3 + 8.36 ± 2.2.
 * - The author of the AARC capnography guideline of 2003, McArthur CD, Respir Care 2003;48:534–539,
 *   read in the National Guideline Clearinghouse summary of its 2011 update (web archive of
 *   guidelines.gov).
 *
 * Read in December 2026 (session 25), each beside its test below:
 * - Berend's rule for metabolic alkalosis, PaCO2 = 0.7 × (HCO3 − 24) + 40 ± 2, in a table of
 *   compensation rules headed by the citation NEJM 2014;371:1434 (physician.tw).
 * - The oxygenation index, (FiO2 × mean airway pressure × 100) / PaO2, with the PALICC bands
 *   4 ≤ OI < 8, 8 ≤ OI < 16, OI ≥ 16, in table 1 of a 2022 review in BJA Education (PMC9217163).
 * - The traditional tidal volumes of 10 to 15 mL per kg of body weight, and the trial's arms of
 *   6 and 12 mL per kg of predicted body weight, in the abstract of ARDS Network 2000 (themednet.org).
 * - The arterial to end-tidal CO2 gradient, normally less than 5 mmHg and raised by dead-space
 *   disease, in Malley WJ, Clinical Blood Gases, 2nd edition, 2005, pp 406–415, as quoted at
 *   sagamigaoka-ac.com, which gives the AARC guideline of 2003 as its reference.
 * - A 28 % Venturi mask at 4 L/min, in table 1 of a Breathe review adapted from the 2008 BTS
 *   guideline (breathe.ersjournals.com).
 *
 * Read in December 2026 (session 26):
 * - The conventional mmHg of NIST SP 811 appendix B.8, 133.3224 Pa, as reproduced in the R package
 *   NISTunits (rdrr.io). The LOINC codes read in that session are checked in tests/core/registry.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { VT_PER_KG_HARD_MAX, VT_PER_KG_USUAL } from '../../server/src/core/analysis/per-kg-volume';
import { venturiFio2High } from '../../server/src/core/checks/venturi-fio2';
import { venturiSetting } from '../../server/src/core/checks/collected';
import { tidalVolumePerKg } from '../../server/src/core/checks/vt-per-kg';
import { acidBaseReading } from '../../server/src/core/checks/interpretations';
import {
  expectedPaco2MetabolicAcidosis,
  expectedPaco2MetabolicAlkalosis,
  RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG,
  SOURCES as ACID_BASE,
} from '../../server/src/core/physiology/acid-base';
import { OSI_MAX_SPO2_PERCENT, oxygenationIndex, oxygenSaturationIndex, SOURCES as GAS_EXCHANGE } from '../../server/src/core/physiology/gas-exchange';
import { SOURCES as MECHANICS } from '../../server/src/core/physiology/mechanics';
import { VENTURI_PERCENT } from '../../server/src/core/syntax/parser';
import { MMHG_PER_KPA, PA_PER_MMHG, SOURCES as UNIT_SOURCES } from '../../server/src/core/physiology/units';

/** Per mmHg, as read; Pneumark's spans are per 10 mmHg. */
const NARINS_EMMETT_AS_ADAPTED = { acuteAcidosis: 0.1, chronicAcidosis: 0.35, acuteAlkalosis: 0.2, chronicAlkalosis: 0.5 } as const;
const KIDNEY360_2022 = { acuteAcidosis: 0.1, chronicAcidosis: 0.35, acuteAlkalosis: 0.2, chronicAlkalosis: 0.41 } as const;

describe('respiratory coefficients, as read', () => {
  it.each(Object.keys(NARINS_EMMETT_AS_ADAPTED) as (keyof typeof NARINS_EMMETT_AS_ADAPTED)[])(
    '%s: Narins & Emmett as adapted (HK Practitioner 2005, table 3) and the Kidney360 2022 review lie in the span Pneumark uses',
    (kind) => {
      const [low, high] = RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG[kind];
      for (const perMmhg of [NARINS_EMMETT_AS_ADAPTED[kind], KIDNEY360_2022[kind]]) {
        expect(perMmhg * 10).toBeGreaterThanOrEqual(low - 1e-9);
        expect(perMmhg * 10).toBeLessThanOrEqual(high + 1e-9);
      }
    },
  );

  it('the span ends of Narins & Emmett as adapted are the span ends Pneumark uses: acute 1 and 2, chronic acidosis from 3.5, chronic alkalosis to 5', () => {
    expect(RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG.acuteAcidosis).toEqual([1, 1]);
    expect(RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG.acuteAlkalosis).toEqual([2, 2]);
    expect(RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG.chronicAcidosis[0]).toBeCloseTo(NARINS_EMMETT_AS_ADAPTED.chronicAcidosis * 10, 12);
    expect(RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG.chronicAlkalosis[1]).toBeCloseTo(NARINS_EMMETT_AS_ADAPTED.chronicAlkalosis * 10, 12);
  });

  it('the citation says where the coefficients were read', () => {
    expect(ACID_BASE['narins-emmett-1980']).toContain('read in its table as adapted in Hong Kong Practitioner 2005;27, table 3');
    expect(ACID_BASE['narins-emmett-1980']).toContain('PMC9416819');
    expect(ACID_BASE['narins-emmett-1980']).not.toContain('(from memory)');
  });
});

describe("Winters' formula against the regression as read in the Kidney360 2022 review", () => {
  it('the rounded form is within 1.5 mmHg of 1.54 × HCO3 + 8.36 from HCO3 5 to 24 mmol/L, and its ±2 band inside that ±2.2', () => {
    for (let hco3 = 5; hco3 <= 24; hco3 += 0.5) {
      const rounded = expectedPaco2MetabolicAcidosis(hco3)!;
      const regression = 1.54 * hco3 + 8.36;
      expect(Math.abs(rounded.centre - regression)).toBeLessThan(1.5);
      expect(rounded.high - rounded.centre).toBeLessThanOrEqual(2.2);
    }
  });

  it('the citation gives the regression as read beside the rounding it uses', () => {
    expect(ACID_BASE['winters-1967']).toContain('1.54 × HCO3 + 8.36 ± 2.2');
    expect(ACID_BASE['winters-1967']).toContain('PMC9416819');
  });
});

describe('AARC capnography guideline of 2003', () => {
  it('names its author, read in the summary of its 2011 update', () => {
    expect(GAS_EXCHANGE['arterial-end-tidal-co2']).toContain('McArthur CD');
  });
});

// The SpO2 limit of the oxygen saturation index: "When Spo2 is used, ensure that Spo2 is ≤ 97%",
// read in a footnote of table 5 (the definition statements) of the second Pediatric Acute Lung
// Injury Consensus Conference, PALICC-2, at pmc.ncbi.nlm.nih.gov/articles/PMC9848214; the OI and
// OSI bands of the first (OI 4–8, 8–16, ≥ 16; OSI 5–7.5, 7.5–12.3, ≥ 12.3) read in its table as
// reproduced at PMC6589490, table 1 (Pediatr Allergy Immunol Pulmonol 2019;32:35–44).
describe('PALICC: the SpO2 limit of the oxygen saturation index, as read', () => {
  it('is 97 %, the limit PALICC-2 sets for any use of SpO2', () => {
    expect(OSI_MAX_SPO2_PERCENT).toBe(97);
    expect(oxygenSaturationIndex(0.4, 12, 97)).not.toBeNull();
    expect(oxygenSaturationIndex(0.4, 12, 97.1)).toBeNull();
  });

  it('the citation says where the limit and the bands were read', () => {
    expect(GAS_EXCHANGE['palicc-2015']).toContain('PMC9848214');
    expect(GAS_EXCHANGE['palicc-2015']).toContain('PMC6589490');
    expect(GAS_EXCHANGE['palicc-2015']).not.toContain('SpO2 limit for the OSI from memory');
  });
});

// Berend's rule as read: "PaCO2 = 0.7 (HCO3–24) + 40 ± 2", with "↑ PaCO2 = 0.7 × ΔHCO3", in a table
// of compensation rules headed by the citation NEJM 2014;371:1434 (Berend, de Vries and Gans), at
// physician.tw/Compensation-for-Acid-Base-Disorders.
const BEREND_SLOPE = 0.7;
const BEREND_HALF_WIDTH_MMHG = 2;

describe('Berend 2014: the expected PaCO2 of a metabolic alkalosis, as read', () => {
  it('is 40 + 0.7 × (HCO3 − 24) ± 2 mmHg from HCO3 25 to 50 mmol/L (HCO3 34 → 45–49, centre 47)', () => {
    for (let hco3 = 25; hco3 <= 50; hco3 += 0.5) {
      const range = expectedPaco2MetabolicAlkalosis(hco3)!;
      const read = 40 + BEREND_SLOPE * (hco3 - 24);
      expect(range.centre).toBeCloseTo(read, 12);
      expect(range.low).toBeCloseTo(read - BEREND_HALF_WIDTH_MMHG, 12);
      expect(range.high).toBeCloseTo(read + BEREND_HALF_WIDTH_MMHG, 12);
    }
    const at34 = expectedPaco2MetabolicAlkalosis(34)!;
    expect([at34.low, at34.centre, at34.high].map((v) => Math.round(v * 10) / 10)).toEqual([45, 47, 49]);
  });

  it('the citation says where the rule was read, and the acid–base reading no longer calls it recalled', () => {
    expect(ACID_BASE['berend-2014']).toContain('physician.tw');
    expect(ACID_BASE['berend-2014']).not.toContain('from memory');
    expect(acidBaseReading.source).not.toContain('(from memory)');
  });
});

// The oxygenation index as read: "Oxygenation index (OI)=(Fio2 × mean airway pressure × 100)/Pao2",
// severity "4 ≤ OI < 8", "8 ≤ OI <16", "OI ≥ 16", in table 1 of a 2022 review in BJA Education
// (22(9):364–370), at pmc.ncbi.nlm.nih.gov/articles/PMC9217163.
describe('Ortiz 1987 and PALICC: the oxygenation index, as read', () => {
  it('is FiO2 × MAP × 100 / PaO2: FiO2 0.5, MAP 16 cmH2O, PaO2 100 mmHg → 8, the lower end of the moderate band', () => {
    expect(oxygenationIndex(0.5, 16, 100)).toBeCloseTo(8, 12);
    expect(oxygenationIndex(0.6, 20, 60)).toBeCloseTo(20, 12);
    for (const [fio2, map, pao2] of [[0.3, 10, 75], [1, 25, 50], [0.45, 18, 62]] as const) {
      expect(oxygenationIndex(fio2, map, pao2)).toBeCloseTo((fio2 * map * 100) / pao2, 12);
    }
  });

  it('the citation says where the form was read', () => {
    expect(GAS_EXCHANGE['ortiz-1987']).toContain('PMC9217163');
    expect(GAS_EXCHANGE['ortiz-1987']).not.toContain('from memory');
  });
});

// The ARDS Network trial's abstract as read: "Traditional approaches to mechanical ventilation use
// tidal volumes of 10 to 15 ml per kilogram of body weight"; its arms "an initial tidal volume of
// 12 ml per kilogram of predicted body weight" and "of 6 ml per kilogram"; at themednet.org.
const TRADITIONAL_VT_PER_KG = { min: 10, max: 15 } as const;
const TRIAL_ARMS_PER_KG = { lower: 6, traditional: 12 } as const;

describe('ARDS Network 2000: the tidal volumes per kg its abstract gives, as read', () => {
  it('the 30 mL/kg ceiling is twice the largest traditional tidal volume, 15 mL/kg, and above every arm of the trial', () => {
    expect(VT_PER_KG_HARD_MAX).toBe(2 * TRADITIONAL_VT_PER_KG.max);
    expect(VT_PER_KG_HARD_MAX).toBeGreaterThan(TRIAL_ARMS_PER_KG.traditional);
    expect(TRIAL_ARMS_PER_KG.lower).toBeGreaterThanOrEqual(VT_PER_KG_USUAL.min);
    expect(TRIAL_ARMS_PER_KG.lower).toBeLessThanOrEqual(VT_PER_KG_USUAL.max);
    expect(TRADITIONAL_VT_PER_KG.min).toBeGreaterThan(VT_PER_KG_USUAL.max);
  });

  it('the citations say where the abstract was read', () => {
    expect(MECHANICS['ardsnet-2000']).toContain('themednet.org');
    expect(tidalVolumePerKg.source).toContain('10 to 15 mL');
  });
});

// The arterial to end-tidal CO2 gradient as read: "Normally, the gradient is less than 5 mm Hg;
// however, it can be increased with deadspace disease such as pulmonary embolism or decreased
// cardiac output", citing the AARC guideline of 2003: Malley WJ, Clinical Blood Gases, 2nd edition,
// 2005, pp 406–415, as quoted at sagamigaoka-ac.com.
describe('AARC 2003: the arterial to end-tidal CO2 gradient, as read', () => {
  it('the citation gives the 5 mmHg read and where, and says the lower figure was not read', () => {
    expect(GAS_EXCHANGE['arterial-end-tidal-co2']).toContain('less than 5 mmHg');
    expect(GAS_EXCHANGE['arterial-end-tidal-co2']).toContain('Malley WJ');
    expect(GAS_EXCHANGE['arterial-end-tidal-co2']).toContain('its lower figure, 2 mmHg, not read');
  });
});

// A Venturi setting as read: "use a 28% Venturi mask (4 L·min−1)", in table 1 of a Breathe review,
// adapted from tables 1–4 of the 2008 BTS guideline for emergency oxygen use, at breathe.ersjournals.com.
describe('BTS: a Venturi setting, as read', () => {
  it('28 % lies among the Venturi oxygen fractions Pneumark reads after venturi, and its 4 L/min outside them', () => {
    expect(28).toBeGreaterThanOrEqual(VENTURI_PERCENT.min);
    expect(28).toBeLessThanOrEqual(VENTURI_PERCENT.max);
    expect(4).toBeLessThan(VENTURI_PERCENT.min);
  });

  it('the citations say where the setting was read', () => {
    expect(venturiSetting.source).toContain('breathe.ersjournals.com');
    expect(venturiFio2High.source).toContain('breathe.ersjournals.com');
  });
});

// The conventional millimetre of mercury as read (December 2026, session 26): 133.3224 Pa, the factor of NIST SP 811
// appendix B.8 as reproduced in the R package NISTunits 1.0.1 (Gama J), whose NISTmillimeterOfMercuryConvtnlTOpascal
// multiplies by 133.3224 and names "NIST Guide to SI Units B.8 Factors for Units Listed Alphabetically" as its source
// (its help page at rdrr.io; the function body in a stored copy of the package source). NIST's own page not read.
const NIST_B8_PA_PER_MMHG = 133.3224;

describe('NIST SP 811: the conventional mmHg, as read in its reproduction', () => {
  it('Pneumark\'s 133.322387415 Pa is NIST\'s 133.3224 to its seven figures, so 1 kPa is 7.50062 mmHg either way', () => {
    expect(Math.round(PA_PER_MMHG * 1e4) / 1e4).toBe(NIST_B8_PA_PER_MMHG);
    expect(Math.abs(PA_PER_MMHG - NIST_B8_PA_PER_MMHG) / NIST_B8_PA_PER_MMHG).toBeLessThan(1e-7);
    expect(MMHG_PER_KPA).toBeCloseTo(1000 / NIST_B8_PA_PER_MMHG, 4);
    expect(Math.round(MMHG_PER_KPA * 1e5) / 1e5).toBe(7.50062);
  });

  it('the citation says where the factor was read, and what of it is still recalled', () => {
    expect(UNIT_SOURCES['nist-sp811']).toContain('NISTunits');
    expect(UNIT_SOURCES['nist-sp811']).toContain('rdrr.io/rforge/NISTunits/man/NISTmillimeterOfMercuryConvtnlTOpascal.html');
    expect(UNIT_SOURCES['nist-sp811']).not.toContain('conventional mmHg = 133.3224 Pa, conventional cmH2O = 98.0665 Pa, international foot = 0.3048 m, degree Fahrenheit) (from memory)');
  });
});
