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
 *
 * Read in December 2026 (session 28), each beside its test at the end of this file: the bands of the
 * delta ratio; NIST's conventional cmH2O and foot; the usual 2–5 mmHg of the arterial to end-tidal
 * CO2 gradient; the compliance of a healthy chest wall and respiratory system; a later form of Buck's
 * vapour pressure equation; the Safe Harbor list of identifiers; the Venturi settings and their flows.
 *
 * Read in December 2026 (session 32), beside its tests in tests/core/child-height.test.ts: how long
 * growth is judged at an age corrected for prematurity, in a growth-chart training module of the US
 * Maternal and Child Health Bureau (page 10, mirrored on hitpages.com: until 2 years for most, often
 * until 3 for a birth weight under 1,000 g) and in the abstract of Elmrayed et al., J Perinatol
 * 2025;45(5):607–615 (PubMed 39820765: through 36 months of corrected age before 32 weeks).
 *
 * Read in December 2026 (session 31), each beside its test at the end of this file: the SpO2 targets
 * of BTS 2017 and TSANZ 2015; the general form of the base excess and a standardisation of it (Lang &
 * Zander 2002), and the CO2 solubility of the Henderson–Hasselbalch form as two sources give it; how
 * PRVC adapts its pressure; a starting pressure control; the end-expiratory pressure driving pressure
 * is measured from; a worked alveolar PO2 on air at sea level, with its water vapour pressure; West's
 * model atmosphere against the pressures measured on Everest; the arterial O2 content and delivery; the
 * normal a/A ratio; the oscillation frequencies of HFOV in adults; the oldest verified age and the
 * height of the highest summit, behind the bounds of age and altitude.
 *
 * Read in December 2026 (session 32), each beside its test below: the CLSI form of the standard base
 * excess, in a published study's table (the standard base excess Pneumark used before was not that
 * form, and was replaced); West's model atmosphere of 1996 and the molar mass of
 * haemoglobin, in the oxygen delivery model of Bretherick and Baillie; Ellis's inversion of Severinghaus's
 * equation, in the Acutelines data toolbox; the frequencies of neonates on
 * nasal HFOV; the citation of Roca and coauthors 2016. Not found in that session (still from memory):
 * Mellemgaard 1966 (citation and rule), Madias 1979, the usual pressure control of 10–25 cmH2O, which PEEP Amato 2015
 * measured driving pressure from.
 * Also in session 32, beside its test at the end of this file: the expired tidal volumes during NIV
 * of Carteaux 2016, in its abstract.
 */
import { describe, expect, it } from 'vitest';
import { VT_PER_KG_HARD_MAX, VT_PER_KG_USUAL } from '../../server/src/core/analysis/per-kg-volume';
import { venturiFio2High } from '../../server/src/core/checks/venturi-fio2';
import { venturiSetting } from '../../server/src/core/checks/collected';
import { tidalVolumePerKg } from '../../server/src/core/checks/vt-per-kg';
import { derived } from '../derive/helpers';
import { acidBaseReading } from '../../server/src/core/checks/interpretations';
import {
  actualBaseExcess,
  BASE_EXCESS_TOLERANCE_MMOL_L,
  hco3FromPhPco2,
  standardBaseExcess,
  expectedPaco2MetabolicAcidosis,
  expectedPaco2MetabolicAlkalosis,
  RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG,
  SOURCES as ACID_BASE,
} from '../../server/src/core/physiology/acid-base';
import { alveolarPo2Full, alveolarPo2Simplified, arterialAlveolarRatio, OSI_MAX_SPO2_PERCENT, oxygenationIndex, oxygenSaturationIndex, SOURCES as GAS_EXCHANGE } from '../../server/src/core/physiology/gas-exchange';
import { NIV_VT_MEDIAN_ML_PER_KG, SOURCES as MECHANICS } from '../../server/src/core/physiology/mechanics';
import { VENTURI_PERCENT } from '../../server/src/core/syntax/parser';
import { METRES_PER_FOOT, MMHG_PER_CMH2O, MMHG_PER_KPA, PA_PER_CMH2O, PA_PER_MMHG, SOURCES as UNIT_SOURCES } from '../../server/src/core/physiology/units';
import { deltaRatioBand } from '../../server/src/core/physiology/acid-base';
import { COMPLIANCE_CEILING_ML_PER_CMH2O } from '../../server/src/core/physiology/mechanics';
import { barometricFromAltitudeStandard, barometricFromAltitudeWest, inspiredPo2Humidified, SOURCES as ATMOSPHERE, WATER_VAPOUR_37C_MMHG, waterVapourPressureMmhg } from '../../server/src/core/physiology/atmosphere';
import { PLACEHOLDERS, type PrivacyKind } from '../../server/src/core/privacy/types';
import { PRIVACY_CHECKS, possibleName } from '../../server/src/core/checks/privacy';
import { derivedDef } from '../../server/src/core/derive/registry';
import { ADULT_FROM_YEARS } from '../../server/src/core/physiology/adults';
import { fieldById } from '../../server/src/core/fields/registry';
import { arterialO2Content, DISSOLVED_O2_ML_PER_DL_PER_MMHG, oxygenDelivery, SOURCES as TRANSPORT } from '../../server/src/core/physiology/oxygen-transport';
import { settingsSchema, type Settings } from '../../server/src/core/settings';
import { checkNote } from '../../server/src/core';
import { targetInForce } from '../../server/src/core/analysis/spo2-target';
import { complianceImplausible } from '../../server/src/core/checks/compliance-reach';
import { HFOV_USUAL_RATE_PER_MIN } from '../../server/src/core/checks/value-bounds';
import { aaGradientUpperNormal, po2FromSaturation, saturationFromPo2Severinghaus } from '../../server/src/core/physiology/gas-exchange';
import { HB_G_PER_DL_PER_MMOL_L, HB_MONOMER_G_PER_MOL } from '../../server/src/core/physiology/units';
import { DEFAULT_HUFNER_ML_PER_G } from '../../server/src/core/physiology/oxygen-transport';
import { bareHbBesideMmolCheck as hbUnits } from '../../server/src/core/checks/hb-units';
import { ORDINARY_TARGET_FROM_PCT, spo2AboveTarget, spo2BelowTarget, targetBesideHypercapnia } from '../../server/src/core/checks/spo2-target';

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
  it('the citation gives the 5 mmHg read and where, and where its lower figure was read since (session 28)', () => {
    expect(GAS_EXCHANGE['arterial-end-tidal-co2']).toContain('less than 5 mmHg');
    expect(GAS_EXCHANGE['arterial-end-tidal-co2']).toContain('Malley WJ');
    expect(GAS_EXCHANGE['arterial-end-tidal-co2']).not.toContain('its lower figure, 2 mmHg, not read');
    expect(GAS_EXCHANGE['arterial-end-tidal-co2']).toContain('derangedphysiology.com');
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

// ---------------------------------------------------------------------------------------------
// Read in December 2026 (session 28).

// The bands of the delta ratio as read in the English Wikipedia article "Delta ratio" (its copy at
// wiki-gateway.eudic.net/wikipedia_en/Delta_Ratio.html): "< 0.4 due to a pure NAGMA; 0.4 - 0.8 due to a
// mixed NAGMA + HAGMA; 0.8 - 2.0 due to a pure HAGMA; > 2.0 due to a mixed HAGMA + metabolic alkalosis
// (or pre-existing compensated respiratory acidosis)". Rastegar 2007 itself was read only in its opening.
const DELTA_RATIO_BANDS_AS_READ = [
  [0, 0.4, 'normal-gap-acidosis'],
  [0.4, 0.8, 'mixed-high-and-normal-gap-acidosis'],
  [0.8, 2, 'high-gap-acidosis'],
] as const;

describe('the delta ratio bands, as read', () => {
  it.each(DELTA_RATIO_BANDS_AS_READ)('%f to %f reads as %s, and its lower end belongs to it', (low, high, band) => {
    expect(deltaRatioBand(low)).toBe(band);
    expect(deltaRatioBand((low + high) / 2)).toBe(band);
    expect(deltaRatioBand(high - 0.01)).toBe(band);
  });

  it('2.0 is the top of the uncomplicated high-gap band, and above it a metabolic alkalosis is added', () => {
    expect(deltaRatioBand(2)).toBe('high-gap-acidosis');
    expect(deltaRatioBand(2.01)).toBe('high-gap-acidosis-with-alkalosis');
    expect(deltaRatioBand(5)).toBe('high-gap-acidosis-with-alkalosis');
  });

  it('the citation says where the bands were read, and what reads them otherwise', () => {
    expect(ACID_BASE['rastegar-2007']).toContain('wiki-gateway.eudic.net/wikipedia_en/Delta_Ratio.html');
    expect(ACID_BASE['rastegar-2007']).toContain('1 to 2, not 0.8 to 2');
    expect(ACID_BASE['rastegar-2007']).not.toContain('from memory');
  });
});

// NIST SP 811's other factors, as reproduced in the R package NISTunits (NISTunits/R/NISTfactors.R, in the
// stored copy TypeFox/R-Examples): "NISTcmOfWaterConvtnlTOpascal<-function(cmOfWaterConvtnl) cmOfWaterConvtnl *
// 98.0665" (centimeter of water, conventional) and "NISTftTOmeter<-function(ft) ft * 0.3048".
const NIST_PA_PER_CMH2O_CONVENTIONAL = 98.0665;
const NIST_METRES_PER_FOOT = 0.3048;

describe('NIST SP 811: the conventional cmH2O and the foot, as read in its reproduction', () => {
  it('Pneumark uses the factors as read, exactly', () => {
    expect(PA_PER_CMH2O).toBe(NIST_PA_PER_CMH2O_CONVENTIONAL);
    expect(METRES_PER_FOOT).toBe(NIST_METRES_PER_FOOT);
    expect(MMHG_PER_CMH2O).toBeCloseTo(NIST_PA_PER_CMH2O_CONVENTIONAL / NIST_B8_PA_PER_MMHG, 5);
  });

  it('the citation names the functions read, and keeps the degree Fahrenheit as recalled', () => {
    expect(UNIT_SOURCES['nist-sp811']).toContain('NISTcmOfWaterConvtnlTOpascal multiplies by 98.0665');
    expect(UNIT_SOURCES['nist-sp811']).toContain('NISTftTOmeter by 0.3048');
    expect(UNIT_SOURCES['nist-sp811']).toContain('degree Fahrenheit, (°F − 32) ÷ 1.8, from memory');
  });
});

// The arterial to end-tidal CO2 gradient: "Normal PaCO2-EtCO2 difference is 2-5 mmHg (Satoh et al, 2015)", read
// at derangedphysiology.com; "this gradient is roughly 2 to 5 mmHg", read on Medtronic's page "Understanding the gap".
const CO2_GRADIENT_AS_READ_MMHG = { low: 2, high: 5 } as const;

describe('the usual arterial to end-tidal CO2 gradient, as read', () => {
  it('the note on the derived value gives the range read', () => {
    const note = `${CO2_GRADIENT_AS_READ_MMHG.low}–${CO2_GRADIENT_AS_READ_MMHG.high} mmHg`;
    expect(GAS_EXCHANGE['arterial-end-tidal-co2']).toContain(`usually about ${note}`);
    expect(derivedDef('paco2_etco2_difference')?.source).toContain('derangedphysiology.com');
  });
});

// The compliance of a healthy adult, as read in the abstract of "Compliance of the respiratory system and its
// components in health and obesity" (scilit.com): "The mean compliance of the total respiratory system was .119
// l/cm H2O in normal individuals"; "The compliance of the chest wall was .224 l/cm H2O in normal subjects".
const HEALTHY_TOTAL_ML_PER_CMH2O = 119;
const HEALTHY_CHEST_WALL_ML_PER_CMH2O = 224;

describe('the compliance of healthy lungs and chest wall, as read', () => {
  it('in series, the lungs come to about 250 mL/cmH2O: each part about 200, the whole about 100 to 120', () => {
    const lungs = 1 / (1 / HEALTHY_TOTAL_ML_PER_CMH2O - 1 / HEALTHY_CHEST_WALL_ML_PER_CMH2O);
    expect(lungs).toBeCloseTo(253.9, 1);
    for (const part of [lungs, HEALTHY_CHEST_WALL_ML_PER_CMH2O]) expect(part / 200).toBeGreaterThan(1 - 0.3);
    for (const part of [lungs, HEALTHY_CHEST_WALL_ML_PER_CMH2O]) expect(part / 200).toBeLessThan(1 + 0.3);
  });

  it('a healthy respiratory system breathing spontaneously stays below the ceiling Pneumark reports above', () => {
    expect(HEALTHY_TOTAL_ML_PER_CMH2O).toBeLessThan(COMPLIANCE_CEILING_ML_PER_CMH2O);
    expect(MECHANICS['compliance-ceiling']).toContain('0.224 L/cmH2O');
    expect(MECHANICS['compliance-ceiling']).toContain('0.119 L/cmH2O');
  });
});

// A later form of Buck's equation, over liquid water, as read in the Wikipedia article "Arden Buck equation":
// Ps(T) = 6.1121 exp((18.678 − T/234.5)(T/(257.14 + T))) hPa, T in °C. Pneumark uses the 1981 form (read below).
function buckLaterFormMmhg(tempC: number): number {
  return (6.1121 * Math.exp((18.678 - tempC / 234.5) * (tempC / (257.14 + tempC))) * 100) / PA_PER_MMHG;
}

describe('Buck: the vapour pressure Pneumark uses against the later form as read', () => {
  it.each([0, 10, 20, 30, 37, 39, 42])('%f °C: within 0.05 %', (tempC) => {
    const ours = waterVapourPressureMmhg(tempC);
    expect(ours).not.toBeNull();
    expect(Math.abs((ours ?? 0) / buckLaterFormMmhg(tempC) - 1)).toBeLessThan(0.0005);
  });

  it('the citation says so', () => {
    expect(ATMOSPHERE['buck-1981']).toContain('en.wikipedia.org/wiki/Arden_Buck_equation');
  });
});

// Buck's 1981 form, as read (December 2026, session 29) in its reproduction in the R package HeatStress
// (rdrr.io/github/anacv/HeatStress/src/R/esat.R, "Buck's (1981) approximation (eqn 3) of Wexler's
// (1976) formulae over liquid water"): esat = 6.1121 exp(17.502 (Tk − 273.15) / (Tk − 32.18)) hPa, Tk
// in kelvin; Tk − 32.18 is T + 240.97 with T in °C. (The package then multiplies by 1.004 for moist air,
// an enhancement factor Pneumark leaves out: the pressure of water vapour in the airways is that of
// saturation over water.)
function buck1981AsReadMmhg(tempC: number): number {
  const tk = tempC + 273.15;
  return (6.1121 * Math.exp((17.502 * (tk - 273.15)) / (tk - 32.18)) * 100) / PA_PER_MMHG;
}

describe('Buck 1981: the coefficients Pneumark uses are those of eqn 3 as reproduced in HeatStress', () => {
  it.each([-20, 0, 20, 37, 39, 50])('%f °C: the same pressure', (tempC) => {
    expect(waterVapourPressureMmhg(tempC)).toBeCloseTo(buck1981AsReadMmhg(tempC), 9);
  });

  it('37 °C: 47.1 mmHg', () => {
    expect(buck1981AsReadMmhg(37)).toBeCloseTo(47.1, 1);
  });

  it('the citation says where the coefficients were read', () => {
    expect(ATMOSPHERE['buck-1981']).toContain('rdrr.io/github/anacv/HeatStress');
    expect(ATMOSPHERE['buck-1981']).not.toContain('from memory, as are the coefficients');
  });
});

// The Safe Harbor list of 45 CFR 164.514(b)(2), as quoted at johndcook.com: "(A) Names; (B) All geographic
// subdivisions smaller than a State …; (C) All elements of dates (except year) for dates directly related to an
// individual …; (D) Telephone numbers; … (F) Electronic mail addresses; … (H) Medical record numbers; …".
const SAFE_HARBOR_AS_READ: Readonly<Record<PrivacyKind, string>> = {
  'name': '(A) Names',
  'postal-code': '(B) All geographic subdivisions smaller than a State',
  'birth-date': '(C) All elements of dates (except year)',
  'calendar-date': '(C) All elements of dates (except year)',
  'phone': '(D) Telephone numbers',
  'email': '(F) Electronic mail addresses',
  'record-number': '(H) Medical record numbers',
};

describe('HIPAA Safe Harbor: each kind of identifier Pneumark looks for is on the list as read', () => {
  it('every kind has its item of the list', () => {
    expect(Object.keys(SAFE_HARBOR_AS_READ).sort()).toEqual(Object.keys(PLACEHOLDERS).sort());
  });

  it('the privacy checks say where the list was read', () => {
    for (const check of PRIVACY_CHECKS) expect(check.source, check.code).toContain('johndcook.com/blog/hipaa-identifiers-explained');
    expect(possibleName.source).not.toContain('from memory');
  });
});

// The Venturi settings as read in a teaching table of colour codes (md3.info/skills/oxygen/amplified): blue 24 %
// at 2–4 L/min, white 28 % at 4–6, orange 31 % at 6–8, yellow 35 % at 8–10, red 40 % at 10–12, green 60 % at 12–15.
const VENTURI_TABLE_AS_READ = [[24, 2, 4], [28, 4, 6], [31, 6, 8], [35, 8, 10], [40, 10, 12], [60, 12, 15]] as const;

describe('the Venturi settings and their flows, as read', () => {
  it('every setting lies among the oxygen fractions Pneumark reads after venturi, and every flow below them', () => {
    expect(VENTURI_TABLE_AS_READ[0][0]).toBe(VENTURI_PERCENT.min);
    expect(VENTURI_TABLE_AS_READ[VENTURI_TABLE_AS_READ.length - 1]![0]).toBe(VENTURI_PERCENT.max);
    for (const [percent, lowFlow, highFlow] of VENTURI_TABLE_AS_READ) {
      expect(percent).toBeGreaterThanOrEqual(VENTURI_PERCENT.min);
      expect(percent).toBeLessThanOrEqual(VENTURI_PERCENT.max);
      expect(lowFlow).toBeGreaterThanOrEqual(2);
      expect(highFlow).toBeLessThanOrEqual(15);
      expect(highFlow).toBeLessThan(VENTURI_PERCENT.min);
    }
  });

  it('the citations say where the settings were read', () => {
    expect(venturiSetting.source).toContain('md3.info/skills/oxygen/amplified');
    expect(venturiFio2High.source).toContain('md3.info/skills/oxygen/amplified');
    expect(venturiSetting.source).not.toContain('from memory');
  });
});

// The ARDS Network trial of 2000 (NEJM 2000;342:1301–1308) as summarised at pathway.md/studies (read in
// December 2026, session 29): "Key exclusion criteria: younger than 18 years of age"; 861 patients. The
// paper itself not read here.
const ARDSNET_EXCLUDED_UNDER_YEARS = 18;

describe('the ARDS Network trial\'s adults, as read in its summary', () => {
  it('rules made in its adults (predicted body weight) apply from the age it enrolled: 18 years', () => {
    expect(ADULT_FROM_YEARS).toBe(ARDSNET_EXCLUDED_UNDER_YEARS);
  });
});

// The extremes the field registry's bounds name, as read (December 2026, session 29):
// - Grocott MPW et al. Arterial blood gases and oxygen content in climbers on Mount Everest. NEJM
//   2009;360:140–149, its abstract: at 8,400 m (barometric pressure 272 mmHg) mean PaO2 24.6 mmHg
//   (19.1 to 29.5), mean PaCO2 13.3 mmHg (10.3 to 15.7).
// - West JB. Human physiology at extreme altitudes on Mount Everest. Science 1984;223:784–788, its
//   abstract: on the summit an alveolar PCO2 of 7.5 torr and an arterial pH of over 7.7.
// - West JB et al. J Appl Physiol 1983;54:1188–1194, its abstract: 253.0 Torr on the summit.
// - A body temperature of 13.7 °C survived (Gilbert M et al., Lancet 2000), in a Reuters report of the
//   case quoting its first author (cryonet.org).
const EVEREST_8400_M = { pao2: { mean: 24.6, low: 19.1, high: 29.5 }, paco2: { mean: 13.3, low: 10.3, high: 15.7 } } as const;

describe('the extremes the field registry names, as read', () => {
  const bounds = (id: string) => {
    const field = fieldById(id);
    if (!field?.hard || !field.soft) throw new Error(id);
    return { hard: field.hard, soft: field.soft, source: field.boundsSource ?? '' };
  };

  it.each(['pao2', 'paco2'] as const)('%s at 8,400 m (Grocott 2009): every value measured is possible, and the mean below the usual minimum that low pressure waives', (id) => {
    const { hard, soft, source } = bounds(id);
    expect(hard.min!).toBeLessThanOrEqual(EVEREST_8400_M[id].low);
    expect(soft.min!).toBeGreaterThan(EVEREST_8400_M[id].mean);
    expect(source).toContain('Grocott MPW et al., NEJM 2009;360:140–149, read in its abstract');
  });

  it('pH over 7.7 on the summit (West, Science 1984) is possible and within the usual bounds', () => {
    const { hard, soft, source } = bounds('ph');
    expect(hard.max!).toBeGreaterThan(7.7);
    expect(soft.max!).toBeGreaterThan(7.7);
    expect(source).toContain('Science 1984;223:784–788, read in its abstract');
  });

  it('253 mmHg on the summit (West 1983) is a possible barometric pressure, 13.7 °C a possible temperature', () => {
    expect(bounds('barometric').hard.min!).toBeLessThan(253);
    expect(bounds('barometric').source).toContain('read in its abstract: 253.0 Torr');
    expect(bounds('temp').hard.min!).toBeLessThanOrEqual(13.7);
    expect(bounds('temp').source).toContain('13.7 °C read in a Reuters report');
  });
});

// Hüfner's factor, as read (December 2026, session 29) in the abstract of Dijkhuizen P et al. The oxygen
// binding capacity of human haemoglobin: Hüfner's factor redetermined. Pflugers Arch 1977;369:223–231
// (link.springer.com): 1.39 mL/g were all haemoglobin active; measured in 36 healthy men, mean 1.368 mL/g,
// range 1.322 to 1.387.
const HUFNER_AS_READ = { theoretical: 1.39, mean: 1.368, low: 1.322, high: 1.387 } as const;

describe('the Hüfner constants Pneumark offers, against Dijkhuizen 1977 as read', () => {
  it('the default 1.34 and 1.36 lie within the range measured; 1.39 is the theoretical maximum', () => {
    const offered = [1.34, 1.36, 1.39];
    for (const h of offered) expect(settingsSchema.safeParse({ hufnerConstant: h }).success, String(h)).toBe(true);
    expect(settingsSchema.parse({}).hufnerConstant).toBe(1.34);
    for (const h of [1.34, 1.36]) {
      expect(h).toBeGreaterThanOrEqual(HUFNER_AS_READ.low);
      expect(h).toBeLessThanOrEqual(HUFNER_AS_READ.high);
    }
    expect(1.39).toBe(HUFNER_AS_READ.theoretical);
    expect(TRANSPORT['oxygen-content']).toContain('mean 1.368 mL/g (range 1.322–1.387)');
  });
});

// The U.S. Standard Atmosphere 1976, troposphere, with its constants as read (December 2026, session 29) in
// the table of crnslab.org/util/atmo.php: p0 101325 Pa, T0 288.15 K, lapse rate 6.5 K/km, g0 9.80665 m/s²,
// M0 28.9644 kg/kmol, R* 8.31432 J/(K·mol), r0 6356766 m, 22632 Pa at the tropopause (11 km); and in the
// layer table at av8n.com/physics/altimetry.htm: 22632.1 Pa at 11,000 m.
const STD = { p0: 101325, t0: 288.15, lapse: 0.0065, g0: 9.80665, m0: 28.9644e-3, r: 8.31432, r0: 6356766 } as const;
function standardAsReadPa(geometricM: number): number {
  const h = (STD.r0 * geometricM) / (STD.r0 + geometricM);
  return STD.p0 * Math.pow(1 - (STD.lapse * h) / STD.t0, (STD.g0 * STD.m0) / (STD.r * STD.lapse));
}

describe('the standard atmosphere Pneumark uses, against its constants as read', () => {
  it('the constants read give 22632.1 Pa at 11,000 m geopotential, the tropopause pressure read', () => {
    const exponent = (STD.g0 * STD.m0) / (STD.r * STD.lapse);
    expect(STD.p0 * Math.pow(1 - (STD.lapse * 11000) / STD.t0, exponent)).toBeCloseTo(22632.1, 0);
  });

  it.each([-1000, 0, 1000, 3000, 5000, 8848, 10000])('%d m: the same pressure as the formula with the constants read, to 1 in 10⁵', (z) => {
    const ours = barometricFromAltitudeStandard(z);
    expect(ours).not.toBeNull();
    expect(Math.abs((ours! * PA_PER_MMHG) / standardAsReadPa(z) - 1)).toBeLessThan(1e-5);
  });

  it('the citation says where the constants were read', () => {
    expect(ATMOSPHERE['us-standard-atmosphere-1976']).toContain('crnslab.org/util/atmo.php');
  });
});

// ---------------------------------------------------------------------------------------------
// Read in December 2026 (session 31).

// The SpO2 targets as read. BTS 2017 (O'Driscoll BR et al., Thorax 2017;72(Suppl 1):ii1–ii90), in its
// table 2 at thorax.bmj.com: an initial target range of 94–98 % for serious illness, and 88–92 % pending
// blood gases where COPD or another risk of hypercapnic respiratory failure coexists; the same two ranges
// on the British Thoracic Society's own page of the guideline (brit-thoracic.org.uk, its update of
// December 2019). TSANZ 2015 (Beasley R et al., Respirology 2015;20:1182–1191): 92–96 % as the range it
// recommends, read in the abstract of its authors' letter comparing it with 94–98 % (Respirology 2016,
// doi 10.1111/resp.12879, at ahro.austin.org.au), and 88–92 % in COPD and other causes of chronic
// respiratory failure, its recommendation 8 (the guideline as reproduced at fliphtml5.com, page 14).
const SPO2_TARGETS_AS_READ = {
  bts: [[94, 98], [88, 92]],
  tsanz: [[92, 96], [88, 92]],
} as const;

describe('the SpO2 targets Pneumark offers, against BTS 2017 and TSANZ 2015 as read', () => {
  const ranges = [...SPO2_TARGETS_AS_READ.bts, ...SPO2_TARGETS_AS_READ.tsanz];

  it.each(ranges)('%d–%d %%: a value of the spo2Target setting, which gives a note that writes none that target', (low, high) => {
    const spo2Target = `${low}-${high}` as Settings['spo2Target'];
    expect(settingsSchema.safeParse({ spo2Target }).success).toBe(true);
    const result = checkNote('@ day 1 09:00\nvitals spo2 95', { spo2Target });
    const target = targetInForce(result.analysis.timeline.timepoints[0]!.values, { spo2Target });
    expect(target && [target.lowPct, target.highPct]).toEqual([low, high]);
  });

  it('the setting offers no range that was not read', () => {
    const offered = ['88-92', '92-96', '94-98'];
    expect(new Set(ranges.map(([low, high]) => `${low}-${high}`))).toEqual(new Set(offered));
    for (const other of ['90-94', '92-98', '94-99']) expect(settingsSchema.safeParse({ spo2Target: other }).success, other).toBe(false);
  });

  it('PN329 speaks under the ordinary targets read (lower end 92 % or more) and not under 88–92 %', () => {
    expect(SPO2_TARGETS_AS_READ.bts[0][0]).toBeGreaterThanOrEqual(ORDINARY_TARGET_FROM_PCT);
    expect(SPO2_TARGETS_AS_READ.tsanz[0][0]).toBeGreaterThanOrEqual(ORDINARY_TARGET_FROM_PCT);
    expect(SPO2_TARGETS_AS_READ.bts[1][0]).toBeLessThan(ORDINARY_TARGET_FROM_PCT);
  });

  it('every range read lies within the bounds of the spo2_target field', () => {
    const field = fieldById('spo2_target')!;
    for (const [low, high] of ranges) {
      expect(low).toBeGreaterThanOrEqual(field.hard!.min!);
      expect(high).toBeLessThanOrEqual(field.hard!.max!);
    }
  });

  it('the citations say where the targets were read', () => {
    for (const check of [spo2AboveTarget, spo2BelowTarget, targetBesideHypercapnia]) {
      expect(check.source, check.code).toContain('table 2 at thorax.bmj.com');
      expect(check.source, check.code).toContain('brit-thoracic.org.uk');
      expect(check.source, check.code).not.toContain('from memory');
    }
    const bounds = fieldById('spo2_target')!.boundsSource ?? '';
    expect(bounds).toContain('ahro.austin.org.au');
    expect(bounds).not.toContain('from memory');
  });
});

// The base excess as read in the abstract of Lang W, Zander R. The accuracy of calculated base excess in
// blood. Clin Chem Lab Med 2002;40(4):404–410 (metajournal.com): most forms rest on the Van Slyke equation,
// BE = Z × ((cHCO3 − cHCO3 at pH 7.4) + β × (pH − 7.4)), Z depending on the Hb only; the authors recommend
// BE = (1 − 0.0143 × cHb) × ((0.0304 × PCO2 × 10^(pH − 6.1) − 24.26) + (9.5 + 1.63 × cHb) × (pH − 7.4))
// − 0.2 × cHb × (1 − sO2), cHb in g/dL; the seven forms compared have mean errors of ±0.86 to ±1.50 mmol/L
// against 148 reference samples. The constants of the CLSI forms Pneumark uses are read below (session 32).
function zander2002AsRead(ph: number, hco3: number, hbGdl: number, so2: number): number {
  return (1 - 0.0143 * hbGdl) * (hco3 - 24.26 + (9.5 + 1.63 * hbGdl) * (ph - 7.4)) - 0.2 * hbGdl * (1 - so2);
}

describe('base excess: the Van Slyke form as read, and the actual base excess against the form Lang & Zander recommend', () => {
  it('both forms Pneumark uses are Z × ((HCO3 − its value at pH 7.40) + β × (pH − 7.40)): 0 at pH 7.40 and that HCO3, and Z per mmol/L of HCO3', () => {
    expect(standardBaseExcess(7.4, 24.8)).toBeCloseTo(0, 12);
    expect(standardBaseExcess(7.3, 20)! - standardBaseExcess(7.3, 19)!).toBeCloseTo(1, 12);
    for (const hb of [7, 12, 17]) {
      expect(actualBaseExcess(7.4, 24.8, hb)).toBeCloseTo(0, 12);
      expect(actualBaseExcess(7.3, 20, hb)! - actualBaseExcess(7.3, 19, hb)!).toBeCloseTo(1 - 0.014 * hb, 12);
    }
  });

  it('with the same HCO3, the actual base excess is within 2 mmol/L of theirs in oxygenated blood (pH 7.0–7.7, HCO3 5–50, Hb 7–17 g/dL), inside the ±3 mmol/L a stated base excess is allowed', () => {
    let largest = 0;
    for (let ph = 7.0; ph <= 7.7 + 1e-9; ph += 0.05) {
      for (let hco3 = 5; hco3 <= 50; hco3 += 2.5) {
        for (let hb = 7; hb <= 17; hb += 1) {
          largest = Math.max(largest, Math.abs(actualBaseExcess(ph, hco3, hb)! - zander2002AsRead(ph, hco3, hb, 1)));
        }
      }
    }
    expect(largest).toBeLessThan(2);
    expect(largest).toBeLessThan(BASE_EXCESS_TOLERANCE_MMOL_L);
  });

  it('pH 7.40, HCO3 24.8, Hb 15: 0 here, 0.78 × 0.54 = 0.42 mmol/L by theirs (their HCO3 at pH 7.4 is 24.26)', () => {
    expect(actualBaseExcess(7.4, 24.8, 15)).toBeCloseTo(0, 12);
    expect(zander2002AsRead(7.4, 24.8, 15, 1)).toBeCloseTo((1 - 0.0143 * 15) * 0.54, 12);
  });

  it('the citation says what was read', () => {
    expect(ACID_BASE['van-slyke-sbe']).toContain('Clin Chem Lab Med 2002;40(4):404–410');
  });
});

// The standard base excess of the CLSI guideline (C46-A, 2001; C46-A2, 2009; the standard itself not read),
// SBE = HCO3 − 24.8 + 16.2 × (pH − 7.4), as read in December 2026 (session 32) in table 1 of a 2018 study in
// Vet Med Sci 4(3):206–217 (PMC6090410), after Shapiro and coauthors 1989. The actual base excess,
// (1 − 0.014 × Hb) × (HCO3 − 24.8 + (1.43 × Hb + 7.7) × (pH − 7.4)), Hb in g/dL: its constants from memory.
// (Both forms also agreed with manufacturers' documentation that quotes the standard, looked at that session;
// product documents are not cited as sources here.) Pneumark's SBE until then, 0.93 × (HCO3 − 24.4 + 14.8 ×
// (pH − 7.40)), recalled as the standard's, was not the form read: it is replaced by it.
const CLSI_SBE_AS_READ = (ph: number, hco3: number): number => hco3 - 24.8 + 16.2 * (ph - 7.4);
const CLSI_ABE_RECALLED = (ph: number, hco3: number, hb: number): number => (1 - 0.014 * hb) * (hco3 - 24.8 + (1.43 * hb + 7.7) * (ph - 7.4));
const SBE_USED_UNTIL_DECEMBER_2026 = (ph: number, hco3: number): number => 0.93 * (hco3 - 24.4 + 14.8 * (ph - 7.4));

describe('base excess: the standard base excess against the form as read, the actual one against its recalled constants', () => {
  it.each([[7.0, 5], [7.2, 14], [7.4, 24.8], [7.42, 24.1], [7.5, 32], [7.7, 50]])('pH %f, HCO3 %f: the SBE is the form as read, the ABE (Hb 7, 10, 15, 17 g/dL) the form recalled', (ph, hco3) => {
    expect(standardBaseExcess(ph, hco3)!).toBeCloseTo(CLSI_SBE_AS_READ(ph, hco3), 12);
    for (const hb of [7, 10, 15, 17]) expect(actualBaseExcess(ph, hco3, hb)!).toBeCloseTo(CLSI_ABE_RECALLED(ph, hco3, hb), 12);
  });

  it('the ABE is 0 at pH 7.40 and HCO3 24.8 with Hb 15.0 g/dL (from memory)', () => {
    expect(actualBaseExcess(7.4, 24.8, 15)).toBeCloseTo(0, 12);
  });

  it('the SBE Pneumark used before differs from the standard\'s by up to 2.7 mmol/L over pH 7.0–7.7 and HCO3 5–50 mmol/L', () => {
    let largest = 0;
    for (let ph = 7.0; ph <= 7.7 + 1e-9; ph += 0.01) {
      for (let hco3 = 5; hco3 <= 50 + 1e-9; hco3 += 0.5) largest = Math.max(largest, Math.abs(SBE_USED_UNTIL_DECEMBER_2026(ph, hco3) - standardBaseExcess(ph, hco3)!));
    }
    expect(largest).toBeGreaterThan(2.7);
    expect(largest).toBeLessThan(2.75);
  });

  it('the citation says where the forms were read, and what replaced what', () => {
    const source = ACID_BASE['van-slyke-sbe'];
    expect(source).toContain('table 1 of a 2018 study in Vet Med Sci 4(3):206–217 (PMC6090410');
    expect(source).toContain('the ABE\'s constants from memory');
    expect(source).toContain('SBE = HCO3 − 24.8 + 16.2 × (pH − 7.40)');
    expect(source).toContain('Until December 2026 Pneumark used 0.93 × (HCO3 − 24.4 + 14.8 × (pH − 7.40))');
  });
});

// The CO2 solubility of the Henderson–Hasselbalch form, as read: HCO3 = 0.0307 × pCO2 × 10^(pH − 6.105)
// after NCCLS (1994), in table 1 of a 2018 study in Vet Med Sci 4(3):206–217 (PMC6090410); and
// 0.0304 × PCO2 × 10^(pH − 6.1) in the form of Lang & Zander 2002 as read above.
describe('Henderson–Hasselbalch: the HCO3 from pH and PaCO2 against two forms as read', () => {
  it.each([[7.1, 60], [7.4, 40], [7.55, 25], [7.25, 80]])('pH %f, PaCO2 %f mmHg: within 1.2 %% of both', (ph, paco2) => {
    const ours = hco3FromPhPco2(ph, paco2)!;
    for (const read of [0.0307 * paco2 * 10 ** (ph - 6.105), 0.0304 * paco2 * 10 ** (ph - 6.1)]) {
      expect(Math.abs(ours / read - 1)).toBeLessThan(0.012);
    }
  });

  it('the citation says where the solubility was read', () => {
    expect(ACID_BASE['henderson-hasselbalch']).toContain('PMC6090410');
  });
});

// How PRVC adapts, as read on Cooper University Health Care's emergency medicine teaching page on PRVC
// (emdaily1.cooperhealth.org): the ventilator adjusts the applied pressure up or down according to whether the
// exhaled tidal volume is below or above the target, and a greater inspiratory effort increases the inspiratory
// flow at a set pressure; and on the PRVC page of the Department of Anaesthesia and Intensive Care, Chinese
// University of Hong Kong (aic.cuhk.edu.hk/web8/prvc.htm): a volume too high lowers the pressure of the next
// breath, one too low raises it. So a patient whose effort draws in the target is given less pressure.
describe('PRVC: the other reading PN407 names, against how the mode adapts as read', () => {
  it('a peak equal to the PEEP under PRVC names a patient breathing the target unsupported, and under VC does not', () => {
    const prvc = checkNote('@ 08:00\nvent mode PRVC, vt 450 mL, peep 8, peak 8').findings.filter((f) => f.code === 'PN407');
    const vc = checkNote('@ 08:00\nvent mode VC, vt 450 mL, peep 8, peak 8').findings.filter((f) => f.code === 'PN407');
    expect(prvc).toHaveLength(1);
    expect(prvc[0]!.message).toContain("PRVC lowers its pressure as the patient's effort grows");
    expect(vc).toHaveLength(1);
    expect(vc[0]!.message).not.toContain('effort');
  });

  it('the check says where the mode\'s adaptation was read', () => {
    expect(complianceImplausible.source).toContain('emdaily1.cooperhealth.org');
    expect(complianceImplausible.source).toContain('aic.cuhk.edu.hk/web8/prvc.htm');
  });
});

// A starting pressure control as read in the open textbook Mechanical Ventilators (eCampusOntario), its
// chapter on the pressure control setting (ecampusontario.pressbooks.pub): 14 cmH2O is a safe pressure
// control to start at, keeping peak pressures well below 35 cmH2O even with a slightly higher PEEP.
// The usual 10–25 cmH2O above PEEP that the field's bounds name is still from memory.
const STARTING_PRESSURE_CONTROL_CMH2O = 14;
const PEAK_KEPT_BELOW_CMH2O = 35;

describe('the set inspiratory pressure (pinsp): a starting pressure control as read', () => {
  it('14 cmH2O lies within the usual bounds (the value is above PEEP), and with a PEEP of 5 to 10 gives a peak below 35', () => {
    const field = fieldById('insp_pressure')!;
    expect(STARTING_PRESSURE_CONTROL_CMH2O).toBeGreaterThanOrEqual(field.hard!.min!);
    expect(STARTING_PRESSURE_CONTROL_CMH2O).toBeLessThanOrEqual(field.soft!.max!);
    for (const peep of [5, 10]) expect(STARTING_PRESSURE_CONTROL_CMH2O + peep).toBeLessThan(PEAK_KEPT_BELOW_CMH2O);
    expect(field.boundsSource).toContain('ecampusontario.pressbooks.pub');
  });
});

// Driving pressure as read: "the difference of the plateau pressure and end-expiratory pressure of the
// respiratory system", in the abstract of a 2018 review (pmc.ncbi.nlm.nih.gov/articles/PMC6212354); and
// ΔP = Pplat − PEEP or VT / CRS in table 1 of a 2020 review (PMC7449829). Which PEEP Amato 2015 meant is
// not read; that an end-expiratory hold measures the end-expiratory pressure of the respiratory system
// (the total PEEP) is common practice, no source.
describe('driving pressure: from the end-expiratory pressure of the respiratory system, as read', () => {
  it('plateau 27 less the total PEEP of a hold, 12: 15 cmH2O; with no hold, less the set PEEP 8: 19, which is VT / Crs', () => {
    expect(derived('@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, peep_total 12, plateau 27', 'driving_pressure').value).toBe(15);
    expect(derived('@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, plateau 27', 'driving_pressure').value).toBe(19);
    const crs = derived('@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, plateau 27', 'compliance_static').value;
    expect(450 / crs).toBeCloseTo(19, 9);
  });
});

// The sample values of the English Wikipedia article "Alveolar gas equation", as read in its copy at
// primidi.com/alveolar_gas_equation/equation, for air at sea level at 37 °C: pAO2 107 mmHg (14.2 kPa),
// FiO2 0.21, atmospheric pressure 760 mmHg, water vapour pressure at body temperature 47 mmHg (6.25 kPa),
// paCO2 36 mmHg, respiratory quotient 0.8.
const ALVEOLAR_SAMPLE_AS_READ = { pao2Alveolar: 107, fio2: 0.21, pb: 760, ph2o: 47, paco2: 36, rq: 0.8 } as const;

describe('the alveolar gas equation against a worked value as read', () => {
  const s = ALVEOLAR_SAMPLE_AS_READ;

  it('the water vapour pressure Pneumark takes at 37 °C is the 47 mmHg read, and Buck\'s equation gives it to the nearest mmHg (47.1)', () => {
    expect(WATER_VAPOUR_37C_MMHG).toBe(s.ph2o);
    expect(Math.round(waterVapourPressureMmhg(37)!)).toBe(s.ph2o);
  });

  it('the full form gives the 107 mmHg read to the nearest mmHg (0.21 × 713 − 36 × (0.21 + 0.79 ÷ 0.8) = 106.6); the simplified form, 104.7, does not', () => {
    const pio2 = inspiredPo2Humidified(s.fio2, s.pb)!;
    expect(pio2).toBeCloseTo(149.73, 9);
    expect(Math.round(alveolarPo2Full(s.fio2, pio2, s.paco2, s.rq)!)).toBe(s.pao2Alveolar);
    expect(Math.round(alveolarPo2Simplified(pio2, s.paco2, s.rq)!)).not.toBe(s.pao2Alveolar);
  });

  it('the citations say where the values were read', () => {
    expect(ATMOSPHERE['inspired-po2']).toContain('primidi.com');
    expect(GAS_EXCHANGE['alveolar-gas-equation']).toContain('primidi.com');
  });
});

// The mean barometric pressures measured on Mount Everest, as read in the abstract of West JB et al.
// Barometric pressures at extreme altitudes on Mt. Everest: physiological significance. J Appl Physiol
// 1983;54(5):1188–1194 (in a copy of the article): 400.4 Torr at 5,400 m, 351.0 at 6,300 m, 283.6 at
// 8,050 m and 253.0 on the summit, 8,848 m; all considerably higher than the ICAO Standard Atmosphere
// predicts. West's model atmosphere of 1996, Pneumark's default (its equation read in a reproduction, below,
// session 32): this holds its pressures to the ones measured.
const EVEREST_MEASURED_TORR = [[5400, 400.4], [6300, 351.0], [8050, 283.6], [8848, 253.0]] as const;

describe('West\'s model atmosphere against the pressures measured on Everest, as read', () => {
  it.each(EVEREST_MEASURED_TORR)('%d m: within 1.3 %% (4.5 mmHg) of the %f Torr measured', (altitudeM, measured) => {
    const model = barometricFromAltitudeWest(altitudeM)!;
    expect(Math.abs(model - measured)).toBeLessThan(4.5);
    expect(Math.abs(model / measured - 1)).toBeLessThan(0.013);
  });

  it('the standard atmosphere reads lower than each pressure measured, and more than 15 mmHg lower on the summit', () => {
    for (const [altitudeM, measured] of EVEREST_MEASURED_TORR) expect(barometricFromAltitudeStandard(altitudeM)!).toBeLessThan(measured);
    expect(253.0 - barometricFromAltitudeStandard(8848)!).toBeGreaterThan(15);
  });

  it('the citations say what was read and what is still recalled', () => {
    expect(ATMOSPHERE['west-1983']).toContain('351.0 at 6,300 m, 283.6 at 8,050 m');
    expect(ATMOSPHERE['west-1996']).toContain('the paper not read here');
  });
});

// The arterial O2 content and delivery, as read: CaO2 = (1.34 × Hgb × SaO2) + (0.003 × PaO2) and DO2 = CO × CaO2
// on OpenAnesthesia's page on O2 delivery (openanesthesia.org); and a worked value in the e-Learning for
// Healthcare anaesthesia session on oxygen delivery (e-safe-anaesthesia.org): Hb 150 g/L × 1.34 × 0.98
// saturation + 0.23 mL/L per kPa × 13 kPa = 197 + 3 = 200 mL/L, times a cardiac output of 5 L/min, an O2 flux
// of 1,000 mL/min.
const WORKED_CONTENT_AS_READ = { hbGdl: 15, so2: 0.98, po2Kpa: 13, dissolvedMlPerLPerKpa: 0.23, contentMlPerL: 200, coLPerMin: 5, fluxMlPerMin: 1000 } as const;

describe('the arterial O2 content and delivery, against a worked value as read', () => {
  const w = WORKED_CONTENT_AS_READ;

  it('the dissolved O2 of 0.003 mL/dL per mmHg is the 0.23 mL/L per kPa read, to 3 % (0.00307 per mmHg)', () => {
    const perMmhgAsRead = w.dissolvedMlPerLPerKpa / 10 / MMHG_PER_KPA;
    expect(Math.abs(DISSOLVED_O2_ML_PER_DL_PER_MMHG / perMmhgAsRead - 1)).toBeLessThan(0.03);
  });

  it('Hb 15 g/dL, saturation 0.98, PO2 13 kPa: 20.0 mL/dL (the 200 mL/L read), and at 5 L/min 1,000 mL/min', () => {
    const cao2 = arterialO2Content(w.hbGdl, w.so2, w.po2Kpa * MMHG_PER_KPA)!;
    expect(Math.round(cao2 * 10)).toBe(w.contentMlPerL);
    expect(Math.round(oxygenDelivery(w.coLPerMin, cao2)! / 10) * 10).toBe(w.fluxMlPerMin);
  });

  it('the citation says where the form and the worked value were read', () => {
    expect(TRANSPORT['oxygen-content']).toContain('openanesthesia.org');
    expect(TRANSPORT['oxygen-content']).toContain('e-safe-anaesthesia.org');
  });
});

// The a/A ratio as read in the chapter on oxygen tension-based indices of oxygenation at derangedphysiology.com:
// the arterial over the alveolar PO2; over 75 % probably normal; unlike the other indices unaffected by FiO2
// or barometric pressure. Gilbert & Keighley 1974 itself not read.
const NORMAL_AA_RATIO_ABOVE = 0.75;

describe('the a/A ratio against its normal as read', () => {
  it('a healthy gas on air at sea level (PaO2 95, PaCO2 40, R 0.8) is above 0.75; the same lungs with a shunt on oxygen far below', () => {
    const pio2Air = inspiredPo2Humidified(0.21, 760)!;
    expect(arterialAlveolarRatio(95, alveolarPo2Full(0.21, pio2Air, 40)!)!).toBeGreaterThan(NORMAL_AA_RATIO_ABOVE);
    const pio2Oxygen = inspiredPo2Humidified(1, 760)!;
    expect(arterialAlveolarRatio(60, alveolarPo2Full(1, pio2Oxygen, 40)!)!).toBeLessThan(NORMAL_AA_RATIO_ABOVE / 5);
  });

  it('the citation says where the normal was read', () => {
    expect(GAS_EXCHANGE['gilbert-keighley-1974']).toContain('derangedphysiology.com');
  });
});

// The oscillation frequency of HFOV in adults as read in the abstract of a clinical review of HFOV in adults in
// Critical Care (doi 10.1186/cc2182, ccforum.biomedcentral.com): frequencies generally between 3 and 10 Hz.
// The higher frequencies used in infants (up to about 15 Hz) are not read (from memory).
const ADULT_HFOV_HZ = { min: 3, max: 10 } as const;

describe('HFOV: the usual set rate against the adult frequencies as read', () => {
  it('3 Hz (180 /min) is the usual minimum, and 10 Hz (600 /min) within the usual range; both possible', () => {
    expect(HFOV_USUAL_RATE_PER_MIN.min).toBe(ADULT_HFOV_HZ.min * 60);
    expect(ADULT_HFOV_HZ.max * 60).toBeLessThanOrEqual(HFOV_USUAL_RATE_PER_MIN.max!);
    expect(ADULT_HFOV_HZ.max * 60).toBeLessThanOrEqual(fieldById('vent_rate')!.hard!.max!);
    expect(fieldById('vent_rate')!.boundsSource).toContain('10.1186/cc2182');
  });
});

// The extremes behind two fields' bounds, as read: the oldest person whose age has been verified lived 122 years
// and 164 days (the English Wikipedia article on Jeanne Calment, en.wikipedia.org); the summit of Mount Everest
// is at 8,848 m (the abstract of West JB et al., J Appl Physiol 1983, read above).
const OLDEST_VERIFIED_YEARS = 122 + 164 / 365.25;
const EVEREST_SUMMIT_M = 8848;

describe('the bounds of age and altitude against the extremes as read', () => {
  it('122 years and 164 days is possible but above the usual maximum (an age in months written as years is likelier)', () => {
    const age = fieldById('age')!;
    expect(OLDEST_VERIFIED_YEARS).toBeLessThanOrEqual(age.hard!.max!);
    expect(OLDEST_VERIFIED_YEARS).toBeGreaterThan(age.soft!.max!);
    expect(age.boundsSource).toContain('122 years and 164 days');
  });

  it('the summit of Everest, 8,848 m, is a possible altitude, above the usual maximum (an altitude in feet written as metres is likelier)', () => {
    const altitude = fieldById('altitude')!;
    expect(EVEREST_SUMMIT_M).toBeLessThanOrEqual(altitude.hard!.max!);
    expect(EVEREST_SUMMIT_M).toBeGreaterThan(altitude.soft!.max!);
    expect(altitude.boundsSource).toContain('8,848 m, read in the abstract of West JB et al.');
  });
});

// Read in December 2026 (session 32) in public code, each file named in the citation it backs:
// - West's model atmosphere of 1996, PB = exp(6.63268 − 0.1112 h − 0.00149 h²) mmHg, h in km, in the oxygen
//   delivery model of Bretherick A and Baillie JK (2018; baillielab/oxygen_delivery, oxygen_delivery.py), whose
//   function calculatedconstants names "West 1996" as its source and multiplies by 0.1333 to give kPa.
// - In the same model, haemoglobin as a molar concentration: its mass concentration (g/L) ÷ 64,458, four O2
//   bound to each, at a molar volume of R × 273.15 ÷ 101.325 with R 8.3145 J/(K·mol).
// - Ellis's inversion of Severinghaus's equation, PO2 = ∛(A + √(50³ + A²)) + ∛(A − √(50³ + A²)) with
//   A = 11,700 ÷ (1/S − 1), in the R package acutelines.datatoolbox (UMCG-SEH, R/respiration.r, spo2_to_pao2),
//   a version of which cites the letter by its doi, 10.1152/jappl.1989.67.2.902.
// - Mellemgaard 1966: not read (a package of clinical scores that cites it is no source here); its citation and
//   its rule, 2.5 + 0.21 × age, are still recalled.
const WEST_1996_AS_READ = (altitudeM: number): number => Math.exp(6.63268 - 0.1112 * (altitudeM * 1e-3) - 0.00149 * (altitudeM * 1e-3) ** 2);
const HB_TETRAMER_G_PER_MOL_AS_READ = 64458;
const MOLAR_VOLUME_ML_AS_READ = (8.3145 * 273.15) / 101.325 * 1000;
const ELLIS_1989_AS_READ = (s: number): number => {
  const a = 11700 / (1 / s - 1);
  const b = Math.sqrt(50 ** 3 + a * a);
  return Math.cbrt(a + b) + Math.cbrt(a - b);
};

describe('West\'s model atmosphere against its equation as read', () => {
  it.each([-430, 0, 1000, 2500, 3440, 5400, 6300, 8050, 8848, 10000])('%d m: the pressure is the equation\'s', (altitudeM) => {
    expect(barometricFromAltitudeWest(altitudeM)!).toBeCloseTo(WEST_1996_AS_READ(altitudeM), 9);
  });

  it('the sea-level pressure of the model is exp(6.63268) = 759.5 mmHg, and the model\'s kPa (× 0.1333) 101.2', () => {
    expect(barometricFromAltitudeWest(0)!).toBeCloseTo(759.51, 2);
    expect(WEST_1996_AS_READ(0) * 0.1333).toBeCloseTo(101.24, 2);
  });

  it('the citation says where the equation was read', () => {
    expect(ATMOSPHERE['west-1996']).toContain('baillielab/oxygen_delivery');
    expect(ATMOSPHERE['west-1996']).not.toContain('equation from memory');
  });
});

describe('the molar mass of haemoglobin against the tetramer\'s as read', () => {
  it('the monomer\'s 16,114.5 g/mol is a quarter of the 64,458 read, and 1 mmol/L of it is 1.61145 g/dL', () => {
    expect(HB_MONOMER_G_PER_MOL).toBe(HB_TETRAMER_G_PER_MOL_AS_READ / 4);
    expect(HB_G_PER_DL_PER_MMOL_L).toBeCloseTo(1.61145, 12);
  });

  it('four O2 per 64,458 g at the molar volume read, 22.41 L/mol, is 1.39 mL/g: the all-active figure the Hüfner abstract gives, above the default 1.34', () => {
    const mlPerG = (4 * MOLAR_VOLUME_ML_AS_READ) / HB_TETRAMER_G_PER_MOL_AS_READ;
    expect(mlPerG).toBeCloseTo(1.391, 3);
    expect(Math.round(mlPerG * 100) / 100).toBe(1.39);
    expect(DEFAULT_HUFNER_ML_PER_G).toBeLessThan(mlPerG);
  });

  it('the citations say where the molar mass was read', () => {
    expect(UNIT_SOURCES['haemoglobin-molar-mass']).toContain('baillielab/oxygen_delivery');
    expect(hbUnits.source).toContain('baillielab/oxygen_delivery');
    expect(hbUnits.source).not.toContain('from memory');
  });
});

describe('the PO2 from a saturation against Ellis\'s inversion as read', () => {
  it.each([0.3, 0.5, 0.75, 0.88, 0.9, 0.94, 0.97, 0.99])('S %f: the PO2 is the inversion\'s, and gives S back by Severinghaus\'s equation', (s) => {
    const po2 = po2FromSaturation(s)!;
    expect(po2).toBeCloseTo(ELLIS_1989_AS_READ(s), 6);
    expect(saturationFromPo2Severinghaus(po2)!).toBeCloseTo(s, 9);
  });

  it('the citation says where the inversion was read', () => {
    expect(GAS_EXCHANGE['ellis-1989']).toContain('10.1152/jappl.1989.67.2.902');
    expect(GAS_EXCHANGE['ellis-1989']).toContain('UMCG-SEH/acutelines.datatoolbox');
  });
});

describe('Mellemgaard 1966: the citation as read, the rule still recalled', () => {
  it('2.5 + 0.21 × age: 40 years 10.9 mmHg, 80 years 19.3 (from memory)', () => {
    expect(aaGradientUpperNormal(40, 'mellemgaard')!).toBeCloseTo(10.9, 9);
    expect(aaGradientUpperNormal(80, 'mellemgaard')!).toBeCloseTo(19.3, 9);
  });

  it('the citation and the rule are recalled', () => {
    expect(GAS_EXCHANGE['mellemgaard-1966']).toContain('Acta Physiol Scand 1966;67:10–20');
    expect(GAS_EXCHANGE['mellemgaard-1966']).toContain('from memory');
  });
});

// The oscillation frequencies of neonates on nasal HFOV, as read (session 32) in table 2 of De Luca D, Dell'Orto V.
// Non-invasive high-frequency oscillatory ventilation in neonates: review of physiology, biology and clinical data.
// Arch Dis Child Fetal Neonatal Ed 101(6):F565 (fn.bmj.com; the year, 2016, from memory): 10–12 Hz after
// extubation, 8–10 Hz for neonates at risk of bronchopulmonary dysplasia. The usual upper 15 Hz is still recalled.
const NEONATAL_NASAL_HFOV_HZ = [[10, 12], [8, 10]] as const;

describe('HFOV: the usual set rate against the neonatal frequencies as read', () => {
  it.each(NEONATAL_NASAL_HFOV_HZ)('%d to %d Hz lies within the usual range in HFOV', (low, high) => {
    expect(low * 60).toBeGreaterThanOrEqual(HFOV_USUAL_RATE_PER_MIN.min!);
    expect(high * 60).toBeLessThanOrEqual(HFOV_USUAL_RATE_PER_MIN.max!);
  });

  it('the bounds say where they were read, and that 15 Hz is recalled', () => {
    const source = fieldById('vent_rate')!.boundsSource;
    expect(source).toContain('De Luca D, Dell\'Orto V');
    expect(source).toContain('up to about 15 Hz from memory');
  });
});

// Roca and coauthors' first paper on the ROX index, as read (session 32) on the first page of its accepted manuscript
// (a copy at scribd.com): Roca O, Messika J, Caralt B, García-de-Acilu M, Sztrymf B, Ricard JD, Masclans JR.
// Predicting success of high flow nasal cannula in pneumonia patients with hypoxemic respiratory failure: the
// utility of the ROX index. Journal of Critical Care (2016), doi 10.1016/j.jcrc.2016.05.022. Volume and pages
// not shown there (from memory).
describe('the ROX index: the citation of 2016 as read', () => {
  it('names its first three authors, its journal and year, and its doi; the volume and pages are recalled', () => {
    const source = GAS_EXCHANGE['roca-2016'];
    expect(source).toContain('Roca O, Messika J, Caralt B');
    expect(source).toContain('J Crit Care 2016');
    expect(source).toContain('10.1016/j.jcrc.2016.05.022');
    expect(source).toContain('the volume and pages from memory');
  });
});

// The expired tidal volume during NIV for de novo acute hypoxaemic respiratory failure, as read in the abstract of
// Carteaux G et al., Crit Care Med 2016, "Failure of noninvasive ventilation for de novo acute hypoxemic respiratory
// failure: role of tidal volume" (PMID 26584191), in a reproduction of its PubMed record (an address 47.251.13.51,
// /26584191; read December 2026, session 32): averaged over the NIV sessions, median 10.6 mL/kg PBW (IQR 9.6–12.0) in
// the patients in whom NIV failed against 8.5 (7.6–10.2) in those in whom it succeeded, and independently associated
// with NIV failure. The abstract's cut-off (about 9.5 mL/kg PBW, from memory) was past the part read: no threshold.
const CARTEAUX_2016_MEDIANS = { failed: 10.6, succeeded: 8.5 } as const;

describe('VT/PBW under NIV against Carteaux 2016 as read', () => {
  it('the medians shown beside VT/PBW under NIV are those read', () => {
    expect(NIV_VT_MEDIAN_ML_PER_KG).toEqual(CARTEAUX_2016_MEDIANS);
    const vt = derived('patient sex male, height 175 cm\n@ 08:00\noxygen niv ipap 14, epap 6, fio2 0.4\nvent vt 600', 'vt_per_kg_pbw');
    expect(vt?.notes[1]).toContain('a median of 10.6 mL/kg where NIV failed, 8.5 where it succeeded');
    expect(vt?.notes[1]).toContain('was associated with failure of NIV');
  });

  it('the citation says where it was read, and that no threshold was read', () => {
    expect(MECHANICS['carteaux-2016']).toContain('read in its abstract, in a reproduction of its PubMed record');
    expect(MECHANICS['carteaux-2016']).toContain('was not read, so Pneumark gives no threshold of it');
  });
});
