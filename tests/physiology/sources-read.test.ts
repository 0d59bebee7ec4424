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
 */
import { describe, expect, it } from 'vitest';
import {
  expectedPaco2MetabolicAcidosis,
  RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG,
  SOURCES as ACID_BASE,
} from '../../server/src/core/physiology/acid-base';
import { OSI_MAX_SPO2_PERCENT, oxygenSaturationIndex, SOURCES as GAS_EXCHANGE } from '../../server/src/core/physiology/gas-exchange';

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
