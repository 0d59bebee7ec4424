/**
 * Acid–base formulas and the classifier.
 *
 * Classifier cases: the gases are constructed by us so that pH, PaCO2 and HCO3 agree by
 * Henderson–Hasselbalch (pH rounded to 0.01, as analysers print it); the expected reading of each
 * follows from the published rule named beside it. No worked example was copied from a paper.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import * as acidBase from '../../server/src/core/physiology/acid-base';
import {
  acidBaseConsistency,
  anionGap,
  anionGapAlbuminCorrected,
  classifyAcidBase,
  deltaRatio,
  deltaRatioBand,
  expectedHco3Respiratory,
  expectedPaco2MetabolicAcidosis,
  expectedPaco2MetabolicAlkalosis,
  hco3FromPhPco2,
  hydrogenIonNmol,
  kassirerBleichHydrogen,
  phFromHco3Paco2,
  type AcidBaseDisorder,
  type AcidBaseInput,
  type CompensationStatus,
  type MetabolicAcidosisKind,
  type PrimaryAcidBaseFinding,
  type RespiratoryChronicity,
  type RespiratoryChronicityInput,
} from '../../server/src/core/physiology/acid-base';
import { assertTotal, awkwardDouble, exportedFunctionNames, totality } from './helpers';

describe('Henderson–Hasselbalch and hydrogen ion', () => {
  it('pH 7.40, PaCO2 40 → HCO3 24.5 with solubility 0.0307 (standard physiology; 24 with the rounded 0.03)', () => {
    expect(hco3FromPhPco2(7.4, 40)).toBeCloseTo(24.5, 1);
  });
  it('pH 7.10, PaCO2 60 → HCO3 18.4 (Henderson–Hasselbalch, pK 6.1)', () => {
    expect(hco3FromPhPco2(7.1, 60)).toBeCloseTo(18.42, 2);
  });
  it('pH from HCO3 24 and PaCO2 40 is 7.39; inverse of hco3FromPhPco2', () => {
    expect(phFromHco3Paco2(24, 40)).toBeCloseTo(7.39, 2);
    fc.assert(
      fc.property(fc.double({ min: 6.8, max: 7.8, noNaN: true }), fc.double({ min: 10, max: 120, noNaN: true }), (ph, paco2) => {
        expect(phFromHco3Paco2(hco3FromPhPco2(ph, paco2) ?? 0, paco2)).toBeCloseTo(ph, 9);
      }),
    );
  });
  const hydrogen: ReadonlyArray<readonly [number, number]> = [
    [7.0, 100],
    [7.3, 50.1],
    [7.4, 39.8],
    [7.7, 20.0],
  ];
  it.each(hydrogen)('pH %f ↔ [H+] %f nmol/L (the pH–[H+] table used with Kassirer & Bleich 1965; from memory)', (ph, nmol) => {
    expect(hydrogenIonNmol(ph)).toBeCloseTo(nmol, 1);
  });
  it('Kassirer–Bleich: 24 × 40 / 24 = 40 nmol/L (pH ≈ 7.40); 24 × 60 / 30 = 48 nmol/L (pH ≈ 7.32) (Kassirer & Bleich, NEJM 1965; [H+] = 24 × PaCO2 / HCO3 read as the Henderson equation in Adrogué & Madias, JASN 2010)', () => {
    expect(kassirerBleichHydrogen(40, 24)).toBe(40);
    expect(kassirerBleichHydrogen(60, 30)).toBe(48);
    expect(Math.abs((hydrogenIonNmol(7.32) ?? 0) - 48)).toBeLessThan(0.5);
    expect(kassirerBleichHydrogen(40, 0)).toBeNull();
  });
});

describe('anion gap', () => {
  it('Na 140, Cl 104, HCO3 24 → 12; with K 4 → 16 (common practice, no source)', () => {
    expect(anionGap(140, 104, 24)).toBe(12);
    expect(anionGap(140, 104, 24, 4)).toBe(16);
  });
  it('Na 137, Cl 100, HCO3 10 → 27, a high gap (common practice, no source)', () => {
    expect(anionGap(137, 100, 10)).toBe(27);
    expect(anionGap(137, -1, 10)).toBeNull();
  });
  it('albumin correction +2.5 per g/dL below normal (Figge et al., Crit Care Med 1998, read in its abstract): AG 10, albumin 2.0 → 15 (normal 4.0) or 16 (Figge’s 4.4)', () => {
    expect(anionGapAlbuminCorrected(10, 2)).toBeCloseTo(15, 12);
    expect(anionGapAlbuminCorrected(10, 2, 4.4)).toBeCloseTo(16, 12);
    expect(anionGapAlbuminCorrected(10, -1)).toBeNull();
  });
  it('delta ratio (Rastegar, JASN 2007; the bands as read in Wikipedia, Delta ratio): AG 24, HCO3 12 → 1.0 (pure high gap); AG 14, HCO3 10 → 0.14 (mostly normal gap)', () => {
    expect(deltaRatio(24, 12)).toBeCloseTo(1, 12);
    expect(deltaRatio(14, 10)).toBeCloseTo(2 / 14, 12);
    expect(deltaRatio(20, 24)).toBeNull();
    expect(deltaRatio(20, 30)).toBeNull();
  });
  const bands: ReadonlyArray<readonly [number, ReturnType<typeof deltaRatioBand>]> = [
    [0.3, 'normal-gap-acidosis'],
    [0.4, 'mixed-high-and-normal-gap-acidosis'],
    [0.6, 'mixed-high-and-normal-gap-acidosis'],
    [0.8, 'high-gap-acidosis'],
    [2, 'high-gap-acidosis'],
    [2.5, 'high-gap-acidosis-with-alkalosis'],
  ];
  it.each(bands)('delta ratio %f reads as %s (Rastegar 2007; the bands as read in Wikipedia, Delta ratio)', (ratio, band) => {
    expect(deltaRatioBand(ratio)).toBe(band);
  });
  it('a ratio on a band boundary on paper is on it here, whatever floating point makes of the quotient (Rastegar 2007 bands; from memory)', () => {
    // (39.2 − 12) / (24 − 10.4) is 2 on paper and 2.0000000000000004 in floating point.
    expect(deltaRatio(39.2, 10.4)).not.toBe(2);
    expect(deltaRatioBand(deltaRatio(39.2, 10.4)!)).toBe('high-gap-acidosis');
    // (17.2 − 12) / (24 − 11) is 0.4 on paper and 0.39999999999999997 in floating point.
    expect(deltaRatioBand(deltaRatio(17.2, 11)!)).toBe('mixed-high-and-normal-gap-acidosis');
    expect(deltaRatioBand(2.001)).toBe('high-gap-acidosis-with-alkalosis');
  });
});

describe('expected compensation', () => {
  it('Winters (Albert, Dell & Winters, Ann Intern Med 1967; from memory): HCO3 12 → PaCO2 26 ± 2; HCO3 10 → 23 ± 2', () => {
    expect(expectedPaco2MetabolicAcidosis(12)).toEqual({ low: 24, centre: 26, high: 28 });
    expect(expectedPaco2MetabolicAcidosis(10)).toEqual({ low: 21, centre: 23, high: 25 });
  });
  it('metabolic alkalosis 40 + 0.7 × (HCO3 − 24) ± 2 (Berend et al., NEJM 2014): HCO3 34 → 47 ± 2; HCO3 40 → 51.2 ± 2', () => {
    const at34 = expectedPaco2MetabolicAlkalosis(34);
    expect(at34?.centre).toBeCloseTo(47, 12);
    expect(at34?.low).toBeCloseTo(45, 12);
    expect(at34?.high).toBeCloseTo(49, 12);
    expect(expectedPaco2MetabolicAlkalosis(40)?.centre).toBeCloseTo(51.2, 12);
  });
  // Span of coefficients per 10 mmHg (Narins & Emmett 1980; Adrogué & Madias 2010; from memory)
  // widened by the ±2 mmol/L tolerance.
  const respiratory: ReadonlyArray<readonly [number, RespiratoryChronicityInput, number, number, string]> = [
    [60, 'acute', 24, 28, 'acute acidosis +1 per 10: 26 ± 2'],
    [60, 'chronic', 29, 36, 'chronic acidosis +3.5 to +5 per 10: 31–34, ± 2'],
    [30, 'acute', 20, 24, 'acute alkalosis −2 per 10: 22 ± 2'],
    [30, 'chronic', 17, 22, 'chronic alkalosis −4 to −5 per 10: 19–20, ± 2'],
  ];
  it.each(respiratory)('PaCO2 %i, %s → HCO3 %f–%f (%s)', (paco2, chronicity, low, high) => {
    const range = expectedHco3Respiratory(paco2, chronicity);
    expect(range?.low).toBeCloseTo(low, 12);
    expect(range?.high).toBeCloseTo(high, 12);
  });
  it('with the resolution of a PaCO2 written in kPa, spans what every PaCO2 it stands for gives (same sources)', () => {
    // 12.0 kPa = 90.007 mmHg, written to ± 0.375 mmHg: acute 24 + (89.63 − 40) ÷ 10 − 2 = 26.96 to
    // 24 + (90.38 − 40) ÷ 10 + 2 = 31.04 mmol/L, which holds the 27 mmol/L that 90 mmHg gives.
    const range = expectedHco3Respiratory(12 * 7.50062, 'acute', 0.375);
    expect(range?.low).toBeCloseTo(26.963, 3);
    expect(range?.high).toBeCloseTo(31.038, 3);
    expect(classifyAcidBase({ ph: 7.09, paco2Mmhg: 12 * 7.50062, hco3MmolL: 27, paco2ResolutionMmhg: 0.375 })?.respiratoryChronicity).toBe('acute');
    expect(classifyAcidBase({ ph: 7.09, paco2Mmhg: 12 * 7.50062, hco3MmolL: 27 })?.compensation).toBe('insufficient');
  });
  it('returns null for an unknown chronicity or PaCO2 ≤ 0', () => {
    expect(expectedHco3Respiratory(60, 'subacute' as unknown as RespiratoryChronicityInput)).toBeNull();
    expect(expectedHco3Respiratory(0, 'acute')).toBeNull();
  });
});

describe('internal consistency (tolerance max(2 mmol/L, 10 %))', () => {
  it('a gas that obeys Henderson–Hasselbalch is consistent', () => {
    expect(acidBaseConsistency(7.4, 40, 24)?.consistent).toBe(true);
    expect(acidBaseConsistency(7.28, 26, 12)?.consistent).toBe(true);
  });
  it('a made-up gas with a transcription error (HCO3 15 for 24.5) is inconsistent', () => {
    const result = acidBaseConsistency(7.4, 40, 15);
    expect(result?.consistent).toBe(false);
    expect(result?.calculatedHco3MmolL).toBeCloseTo(24.5, 1);
    expect(result?.differenceMmolL).toBeCloseTo(-9.5, 1);
  });
  it('with the resolution of a PaCO2 written in kPa, fits when any PaCO2 it stands for fits', () => {
    // Henderson–Hasselbalch, HCO3 = 0.0307 × PaCO2 × 10^(pH − 6.1) (Hasselbalch 1916, from memory).
    // 40 mmHg written as 5.3 kPa stands for 5.25–5.35 kPa (39.38–40.13 mmHg; 1 kPa = 7.500617 mmHg,
    // NIST SP 811, 2008). With pH 7.35: 21.7 mmol/L at 39.75 mmHg (5.3 kPa as such), 21.9 at 40.13.
    const resolution = 0.05 * 7.500617;
    const asWritten = acidBaseConsistency(7.35, 5.3 * 7.500617, 24);
    expect(asWritten?.consistent).toBe(false);
    expect(asWritten?.calculatedHco3MmolL).toBeCloseTo(21.7, 1);
    const atResolution = acidBaseConsistency(7.35, 5.3 * 7.500617, 24, resolution);
    expect(atResolution?.consistent).toBe(true);
    // The figures stay those of the value as written.
    expect(atResolution?.calculatedHco3MmolL).toBeCloseTo(21.7, 1);
    // The mmHg twin (40 mmHg: 21.8 mmol/L, 2.2 from 24, within 2.45) agrees.
    expect(acidBaseConsistency(7.35, 40, 24)?.consistent).toBe(true);
    // A real disagreement stays one at any resolution.
    expect(acidBaseConsistency(7.4, 5.3 * 7.500617, 15, resolution)?.consistent).toBe(false);
  });

  it('the tolerance has a 2 mmol/L floor and is 10 % above 20 mmol/L', () => {
    expect(acidBaseConsistency(7.1, 20, 8)?.toleranceMmolL).toBe(2);
    expect(acidBaseConsistency(7.4, 40, 24)?.toleranceMmolL).toBeCloseTo(2.45, 2);
  });
});

interface ClassifierCase {
  readonly name: string;
  readonly input: AcidBaseInput;
  readonly primary: PrimaryAcidBaseFinding;
  readonly compensation: CompensationStatus;
  readonly chronicity?: RespiratoryChronicity | null;
  readonly additional?: readonly AcidBaseDisorder[];
  readonly fullyCompensated?: boolean;
  readonly acidosisKind?: MetabolicAcidosisKind | null;
}

const W = 'Winters: Albert, Dell & Winters 1967';
const ALK = 'metabolic alkalosis rule: Berend et al. 2014';
const RESP = 'respiratory rules: Narins & Emmett 1980; Adrogué & Madias 2010 (from memory)';
const STEPS = 'stepwise approach: Berend et al. 2014';
const DELTA = 'delta ratio: Rastegar 2007, its bands as read in Wikipedia, Delta ratio';
const COMP = 'uncompensated, partially and fully compensated: common practice, no source';

const classifierCases: readonly ClassifierCase[] = [
  { name: `normal gas (reference intervals, common practice)`, input: { ph: 7.4, paco2Mmhg: 40, hco3MmolL: 24 }, primary: 'normal', compensation: 'not-applicable', additional: [] },
  // Metabolic acidosis
  { name: `metabolic acidosis, appropriate (${W})`, input: { ph: 7.28, paco2Mmhg: 26, hco3MmolL: 12 }, primary: 'metabolic-acidosis', compensation: 'appropriate', additional: [] },
  { name: `metabolic acidosis + respiratory acidosis: PaCO2 above Winters (${W})`, input: { ph: 7.15, paco2Mmhg: 35, hco3MmolL: 12 }, primary: 'metabolic-acidosis', compensation: 'insufficient', additional: ['respiratory-acidosis'] },
  { name: `metabolic acidosis + respiratory alkalosis with a normal pH: PaCO2 below Winters (${W}; ${STEPS})`, input: { ph: 7.39, paco2Mmhg: 20, hco3MmolL: 12 }, primary: 'metabolic-acidosis', compensation: 'excessive', additional: ['respiratory-alkalosis'], fullyCompensated: false },
  { name: `metabolic and respiratory acidosis together (${STEPS})`, input: { ph: 7.13, paco2Mmhg: 55, hco3MmolL: 18 }, primary: 'mixed-acidosis', compensation: 'not-applicable', additional: [] },
  // Metabolic alkalosis
  { name: `metabolic alkalosis, appropriate (${ALK})`, input: { ph: 7.47, paco2Mmhg: 47, hco3MmolL: 34 }, primary: 'metabolic-alkalosis', compensation: 'appropriate', additional: [] },
  { name: `metabolic alkalosis + respiratory alkalosis: PaCO2 below expected (${ALK})`, input: { ph: 7.56, paco2Mmhg: 38, hco3MmolL: 34 }, primary: 'metabolic-alkalosis', compensation: 'insufficient', additional: ['respiratory-alkalosis'] },
  { name: `metabolic and respiratory alkalosis together (${STEPS})`, input: { ph: 7.67, paco2Mmhg: 30, hco3MmolL: 34 }, primary: 'mixed-alkalosis', compensation: 'not-applicable', additional: [] },
  // Respiratory acidosis
  { name: `acute respiratory acidosis (${RESP})`, input: { ph: 7.25, paco2Mmhg: 60, hco3MmolL: 26 }, primary: 'respiratory-acidosis', compensation: 'appropriate', chronicity: 'acute', additional: [] },
  { name: `chronic respiratory acidosis (${RESP})`, input: { ph: 7.34, paco2Mmhg: 60, hco3MmolL: 32 }, primary: 'respiratory-acidosis', compensation: 'appropriate', chronicity: 'chronic', additional: [] },
  { name: `chronic respiratory acidosis reaching pH 7.35 (${RESP}; ${STEPS})`, input: { ph: 7.35, paco2Mmhg: 60, hco3MmolL: 33 }, primary: 'respiratory-acidosis', compensation: 'appropriate', chronicity: 'chronic', additional: [], fullyCompensated: true },
  { name: `respiratory acidosis between acute and chronic (${RESP})`, input: { ph: 7.24, paco2Mmhg: 70, hco3MmolL: 30 }, primary: 'respiratory-acidosis', compensation: 'appropriate', chronicity: 'intermediate', additional: [] },
  { name: `respiratory acidosis + metabolic acidosis: HCO3 below the acute range (${RESP})`, input: { ph: 7.19, paco2Mmhg: 60, hco3MmolL: 22.5 }, primary: 'respiratory-acidosis', compensation: 'insufficient', chronicity: null, additional: ['metabolic-acidosis'] },
  { name: `respiratory acidosis + metabolic alkalosis, normal pH: HCO3 above the chronic range (${RESP}; ${STEPS})`, input: { ph: 7.39, paco2Mmhg: 70, hco3MmolL: 42 }, primary: 'respiratory-acidosis', compensation: 'excessive', chronicity: null, additional: ['metabolic-alkalosis'], fullyCompensated: false },
  { name: `borderline: pH 7.32 with PaCO2 45 and HCO3 22.5 reads as acute respiratory acidosis (${STEPS})`, input: { ph: 7.32, paco2Mmhg: 45, hco3MmolL: 22.5 }, primary: 'respiratory-acidosis', compensation: 'appropriate', chronicity: 'acute', additional: [] },
  { name: `pH exactly 7.40 with a compensating pair: the larger relative shift (HCO3) is primary (${STEPS})`, input: { ph: 7.4, paco2Mmhg: 60, hco3MmolL: 36.8 }, primary: 'metabolic-alkalosis', compensation: 'excessive', additional: ['respiratory-acidosis'], fullyCompensated: false },
  // Respiratory alkalosis
  { name: `acute respiratory alkalosis (${RESP})`, input: { ph: 7.56, paco2Mmhg: 25, hco3MmolL: 22 }, primary: 'respiratory-alkalosis', compensation: 'appropriate', chronicity: 'acute', additional: [] },
  { name: `chronic respiratory alkalosis (${RESP})`, input: { ph: 7.49, paco2Mmhg: 20, hco3MmolL: 15 }, primary: 'respiratory-alkalosis', compensation: 'appropriate', chronicity: 'chronic', additional: [] },
  { name: `chronic respiratory alkalosis with a normal pH, fully compensated (${RESP}; ${STEPS})`, input: { ph: 7.45, paco2Mmhg: 25, hco3MmolL: 17 }, primary: 'respiratory-alkalosis', compensation: 'appropriate', chronicity: 'chronic', additional: [], fullyCompensated: true },
  { name: `respiratory alkalosis + metabolic alkalosis: HCO3 above the acute range (${RESP})`, input: { ph: 7.56, paco2Mmhg: 28, hco3MmolL: 25 }, primary: 'respiratory-alkalosis', compensation: 'insufficient', chronicity: null, additional: ['metabolic-alkalosis'] },
  // "Fully compensated" only when the compensating component has itself left its reference interval
  { name: `metabolic acidosis with a normal pH and PaCO2 below 35: fully compensated (${W}; ${COMP})`, input: { ph: 7.36, paco2Mmhg: 33, hco3MmolL: 18 }, primary: 'metabolic-acidosis', compensation: 'appropriate', additional: [], fullyCompensated: true },
  { name: `metabolic alkalosis with a normal pH and PaCO2 still 40: not called fully compensated, nothing compensated (${ALK}; ${COMP})`, input: { ph: 7.44, paco2Mmhg: 40, hco3MmolL: 26.5 }, primary: 'metabolic-alkalosis', compensation: 'appropriate', additional: [], fullyCompensated: false },
  { name: `respiratory alkalosis with a normal pH and HCO3 22 (not below 22): not called fully compensated (${RESP}; ${COMP})`, input: { ph: 7.44, paco2Mmhg: 33, hco3MmolL: 22 }, primary: 'respiratory-alkalosis', compensation: 'appropriate', chronicity: 'acute-or-chronic', additional: [], fullyCompensated: false },
  { name: `respiratory acidosis with a normal pH and HCO3 above 26: fully compensated (${RESP}; ${COMP})`, input: { ph: 7.36, paco2Mmhg: 48, hco3MmolL: 26.5 }, primary: 'respiratory-acidosis', compensation: 'appropriate', additional: [], fullyCompensated: true },
  // Anion gap and delta ratio
  { name: `normal-looking gas hiding high-gap acidosis + metabolic alkalosis (AG 32, ${DELTA})`, input: { ph: 7.35, paco2Mmhg: 40, hco3MmolL: 22, anionGapMmolL: 32 }, primary: 'normal', compensation: 'not-applicable', additional: ['metabolic-acidosis', 'metabolic-alkalosis'], acidosisKind: 'high-anion-gap' },
  { name: `high-gap metabolic acidosis + metabolic alkalosis, delta ratio 3 (${W}; ${DELTA})`, input: { ph: 7.32, paco2Mmhg: 35, hco3MmolL: 18, anionGapMmolL: 30 }, primary: 'metabolic-acidosis', compensation: 'appropriate', additional: ['metabolic-alkalosis'], acidosisKind: 'high-anion-gap' },
  { name: `high- and normal-gap acidosis together, delta ratio 0.57 (${DELTA})`, input: { ph: 7.25, paco2Mmhg: 23, hco3MmolL: 10, anionGapMmolL: 20 }, primary: 'metabolic-acidosis', compensation: 'appropriate', additional: [], acidosisKind: 'mixed-anion-gap' },
  { name: `uncomplicated high-gap acidosis, delta ratio 1.14 (${DELTA})`, input: { ph: 7.25, paco2Mmhg: 23, hco3MmolL: 10, anionGapMmolL: 28 }, primary: 'metabolic-acidosis', compensation: 'appropriate', additional: [], acidosisKind: 'high-anion-gap' },
  { name: `normal-gap acidosis (AG 10; anion gap, common practice)`, input: { ph: 7.3, paco2Mmhg: 31, hco3MmolL: 15, anionGapMmolL: 10 }, primary: 'metabolic-acidosis', compensation: 'appropriate', additional: [], acidosisKind: 'normal-anion-gap' },
  // A metabolic disorder the anion gap adds moves the HCO3 too, so the HCO3 no longer tells acute
  // from chronic, nor shows a compensation alone (the timing rule reads the HCO3 as the response
  // only: ${RESP}; the gap adds a metabolic acidosis above 12 mmol/L, common practice, no source).
  { name: `respiratory acidosis with a high gap: acidosis added, raised HCO3 explained by the respiratory disorder, its timing not read from an HCO3 the acidosis lowered (${DELTA}; ${RESP})`, input: { ph: 7.34, paco2Mmhg: 60, hco3MmolL: 32, anionGapMmolL: 20 }, primary: 'respiratory-acidosis', compensation: 'appropriate', chronicity: null, additional: ['metabolic-acidosis'], acidosisKind: 'high-anion-gap' },
  { name: `respiratory alkalosis with a high gap (PaCO2 15, HCO3 12, AG 26): a metabolic acidosis added, not a chronic respiratory alkalosis (${RESP}; anion gap, common practice)`, input: { ph: 7.52, paco2Mmhg: 15, hco3MmolL: 12, anionGapMmolL: 26 }, primary: 'respiratory-alkalosis', compensation: 'appropriate', chronicity: null, additional: ['metabolic-acidosis'], acidosisKind: 'high-anion-gap' },
  { name: `respiratory alkalosis, normal pH, with a high gap (PaCO2 22, HCO3 14, AG 24): not fully compensated, the low HCO3 is an acidosis too (${RESP}; ${COMP})`, input: { ph: 7.42, paco2Mmhg: 22, hco3MmolL: 14, anionGapMmolL: 24 }, primary: 'respiratory-alkalosis', compensation: 'appropriate', chronicity: null, additional: ['metabolic-acidosis'], fullyCompensated: false },
  { name: `respiratory alkalosis, normal pH, gap 10 (PaCO2 22, HCO3 14): fully compensated chronic, as without a gap (${RESP}; ${COMP})`, input: { ph: 7.42, paco2Mmhg: 22, hco3MmolL: 14, anionGapMmolL: 10 }, primary: 'respiratory-alkalosis', compensation: 'appropriate', chronicity: 'chronic', additional: [], fullyCompensated: true },
  // Inconsistent
  { name: `pH low but neither PaCO2 nor HCO3 acidic: undetermined (made-up inconsistent gas)`, input: { ph: 7.3, paco2Mmhg: 38, hco3MmolL: 25 }, primary: 'undetermined', compensation: 'not-applicable', additional: [] },
];

describe('classifyAcidBase', () => {
  it.each(classifierCases)('$name', (c) => {
    const result = classifyAcidBase(c.input);
    expect(result).not.toBeNull();
    if (result === null) return;
    expect(result.primary).toBe(c.primary);
    expect(result.compensation).toBe(c.compensation);
    if (c.chronicity !== undefined) expect(result.respiratoryChronicity).toBe(c.chronicity);
    if (c.additional !== undefined) expect(result.additional).toEqual(c.additional);
    if (c.fullyCompensated !== undefined) expect(result.fullyCompensated).toBe(c.fullyCompensated);
    if (c.acidosisKind !== undefined) expect(result.anionGap?.metabolicAcidosisKind ?? null).toBe(c.acidosisKind);
  });

  it('every constructed gas except the made-up inconsistent one passes the consistency check', () => {
    for (const c of classifierCases) {
      const consistent = classifyAcidBase(c.input)?.consistency.consistent;
      expect(consistent, c.name).toBe(c.primary !== 'undetermined');
    }
  });

  it('reports the pH status and the expected range used', () => {
    const ma = classifyAcidBase({ ph: 7.28, paco2Mmhg: 26, hco3MmolL: 12 });
    expect(ma?.phStatus).toBe('acidaemia');
    expect(ma?.expected).toEqual({
      kind: 'respiratory-response',
      quantity: 'paco2-mmhg',
      observed: 26,
      range: { low: 24, centre: 26, high: 28 },
    });
    const ra = classifyAcidBase({ ph: 7.25, paco2Mmhg: 60, hco3MmolL: 26 });
    expect(ra?.expected?.kind).toBe('metabolic-response');
  });

  it('lists every disorder, the primary’s first', () => {
    expect(classifyAcidBase({ ph: 7.13, paco2Mmhg: 55, hco3MmolL: 18 })?.disorders).toEqual([
      'metabolic-acidosis',
      'respiratory-acidosis',
    ]);
    expect(classifyAcidBase({ ph: 7.15, paco2Mmhg: 35, hco3MmolL: 12 })?.disorders).toEqual([
      'metabolic-acidosis',
      'respiratory-acidosis',
    ]);
  });

  it('classifies a made-up inconsistent gas but flags it', () => {
    const result = classifyAcidBase({ ph: 7.25, paco2Mmhg: 60, hco3MmolL: 36 });
    expect(result?.consistency.consistent).toBe(false);
    expect(result?.consistency.calculatedHco3MmolL).toBeCloseTo(26, 0);
  });

  it('compares a PaCO2 at the resolution it was written with (paco2ResolutionMmhg)', () => {
    // 6.0 kPa = 45.004 mmHg, written to ± 0.05 kPa = ± 0.375 mmHg: on the 45 mmHg upper limit of the
    // reference interval 35–45 mmHg (common practice, no source), as 45 mmHg is. With HCO3 20, pH
    // 7.26 (0.0307 × 45 × 10^1.16 ≈ 19.9 mmol/L): a metabolic acidosis whose PaCO2 is above Winters'
    // 36–40 mmHg (Albert, Dell & Winters 1967, from memory), not a mixed acidosis.
    const paco2 = 6.0 * 7.50062;
    expect(classifyAcidBase({ ph: 7.26, paco2Mmhg: paco2, hco3MmolL: 20 })?.primary).toBe('mixed-acidosis');
    const written = classifyAcidBase({ ph: 7.26, paco2Mmhg: paco2, hco3MmolL: 20, paco2ResolutionMmhg: 0.375 });
    expect(written?.primary).toBe('metabolic-acidosis');
    expect(written?.additional).toEqual(['respiratory-acidosis']);
    // 3.7 kPa (27.75 mmHg) with HCO3 12: Winters 24–28 mmHg holds it; 3.8 kPa (28.5 mmHg) is above
    // it by more than the resolution.
    expect(classifyAcidBase({ ph: 7.24, paco2Mmhg: 3.7 * 7.50062, hco3MmolL: 12, paco2ResolutionMmhg: 0.375 })?.compensation).toBe('appropriate');
    expect(classifyAcidBase({ ph: 7.22, paco2Mmhg: 3.8 * 7.50062, hco3MmolL: 12, paco2ResolutionMmhg: 0.375 })?.compensation).toBe('insufficient');
  });

  it('returns null for impossible inputs', () => {
    expect(classifyAcidBase({ ph: Number.NaN, paco2Mmhg: 40, hco3MmolL: 24 })).toBeNull();
    expect(classifyAcidBase({ ph: 7.4, paco2Mmhg: 0, hco3MmolL: 24 })).toBeNull();
    expect(classifyAcidBase({ ph: 7.4, paco2Mmhg: 40, hco3MmolL: -1 })).toBeNull();
    expect(classifyAcidBase({ ph: 7.4, paco2Mmhg: 40, hco3MmolL: 24, anionGapMmolL: Number.POSITIVE_INFINITY })).toBeNull();
  });
});

describe('null safety (fast-check)', () => {
  const d = awkwardDouble;
  const chronicity = fc.constantFrom<RespiratoryChronicityInput>(
    'acute',
    'chronic',
    'bogus' as unknown as RespiratoryChronicityInput,
  );
  const maybeD = fc.option(d, { nil: undefined });
  const gasInput = fc.record({ ph: d, paco2Mmhg: d, hco3MmolL: d, anionGapMmolL: maybeD });
  // Plausible gases reach deep into the classifier more often than arbitrary doubles.
  const plausibleGas = fc.record({
    ph: fc.double({ min: 6.5, max: 8, noNaN: true }),
    paco2Mmhg: fc.double({ min: 5, max: 150, noNaN: true }),
    hco3MmolL: fc.double({ min: 1, max: 60, noNaN: true }),
    anionGapMmolL: fc.option(fc.double({ min: -5, max: 50, noNaN: true }), { nil: undefined }),
  });
  const cases = {
    hco3FromPhPco2: totality(fc.tuple(d, d), acidBase.hco3FromPhPco2),
    phFromHco3Paco2: totality(fc.tuple(d, d), acidBase.phFromHco3Paco2),
    hydrogenIonNmol: totality(fc.tuple(d), acidBase.hydrogenIonNmol),
    kassirerBleichHydrogen: totality(fc.tuple(d, d), acidBase.kassirerBleichHydrogen),
    anionGap: totality(fc.tuple(d, d, d, maybeD), acidBase.anionGap),
    anionGapAlbuminCorrected: totality(fc.tuple(d, d, d), acidBase.anionGapAlbuminCorrected),
    deltaRatio: totality(fc.tuple(d, d, d, d), acidBase.deltaRatio),
    deltaRatioBand: totality(fc.tuple(d), acidBase.deltaRatioBand),
    expectedPaco2MetabolicAcidosis: totality(fc.tuple(d), acidBase.expectedPaco2MetabolicAcidosis),
    expectedPaco2MetabolicAlkalosis: totality(fc.tuple(d), acidBase.expectedPaco2MetabolicAlkalosis),
    expectedHco3Respiratory: totality(fc.tuple(d, chronicity), acidBase.expectedHco3Respiratory),
    acidBaseConsistency: totality(fc.tuple(d, d, d), acidBase.acidBaseConsistency),
    classifyAcidBase: totality(fc.tuple(fc.oneof(gasInput, plausibleGas)), acidBase.classifyAcidBase),
    arterialPhFromVenous: totality(fc.tuple(d), acidBase.arterialPhFromVenous),
    venousPco2Screen: totality(fc.tuple(d, d), acidBase.venousPco2Screen),
    standardBaseExcess: totality(fc.tuple(d, d), acidBase.standardBaseExcess),
    actualBaseExcess: totality(fc.tuple(d, d, d), acidBase.actualBaseExcess),
    baseExcessSpan: totality(fc.tuple(d, d, fc.option(d, { nil: null })), acidBase.baseExcessSpan),
    baseExcessAgrees: totality(fc.tuple(d, fc.record({ low: d, high: d })), acidBase.baseExcessAgrees),
  };
  it('covers every exported function', () => {
    expect(Object.keys(cases).sort()).toEqual(exportedFunctionNames(acidBase));
  });
  it('no function throws or returns NaN/Infinity for arbitrary doubles', () => {
    assertTotal(cases);
  });
  it('every plausible gas gets a classification', () => {
    fc.assert(
      fc.property(plausibleGas, (input) => {
        expect(classifyAcidBase(input)).not.toBeNull();
      }),
    );
  });
});

describe('range ends and limits on paper are on them here (floating point)', () => {
  it('HCO3 29.7 at PaCO2 62 is within the chronic range 29.7–37 mmol/L (24 + 3.5…5 × 2.2 ± 2: Narins & Emmett 1980; Adrogué & Madias 2010, from memory)', () => {
    // 24 + 3.5 × 2.2 − 2 = 29.700000000000003 in floating point.
    expect(expectedHco3Respiratory(62, 'chronic')!.low).not.toBe(29.7);
    const result = classifyAcidBase({ ph: 7.29, paco2Mmhg: 62, hco3MmolL: 29.7 });
    expect(result?.respiratoryChronicity).toBe('chronic');
    expect(result?.compensation).toBe('appropriate');
  });

  it('HCO3 30.7 at PaCO2 127 is on the low end of the acute range, 24 + 1 × 8.7 − 2 = 30.7 mmol/L (same sources)', () => {
    // 24 + 8.7 − 2 is 30.700000000000003 in floating point; pH 7.00 fits (0.0307 × 127 × 10^0.9 ≈ 30.9).
    const result = classifyAcidBase({ ph: 7.0, paco2Mmhg: 127, hco3MmolL: 30.7 });
    expect(result?.consistency.consistent).toBe(true);
    expect(result?.respiratoryChronicity).toBe('acute');
  });

  it('an anion gap of 12 mmol/L on paper is not high (upper normal 12: common practice, no source)', () => {
    // 135 − (100.1 + 22.9) is 12.000000000000007 in floating point.
    const gap = anionGap(135, 100.1, 22.9)!;
    expect(gap).not.toBe(12);
    const result = classifyAcidBase({ ph: 7.4, paco2Mmhg: 40, hco3MmolL: 24, anionGapMmolL: gap });
    expect(result?.anionGap?.high).toBe(false);
    expect(result?.additional).toEqual([]);
  });
});
