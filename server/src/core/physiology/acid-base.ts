/**
 * Acid–base: Henderson–Hasselbalch, hydrogen ion, anion gap, expected compensation, and a
 * classifier following the physiological (bicarbonate-centred) stepwise approach.
 *
 * Units: PaCO2 mmHg, HCO3 and electrolytes mmol/L, albumin g/dL, hydrogen ion nmol/L. Every
 * function returns `null` (never NaN or ±Infinity, never throws) when an input is non-finite
 * or outside the stated domain. pH must lie on the aqueous scale 0–14 to be accepted here;
 * whether it is plausible for blood is the check layer's business.
 */
import { allFinite, finiteOrNull, forBand, inClosedRange, sideOf } from './numeric';

/** Citations for the formulas in this module (key → citation). */
export const SOURCES = Object.freeze({
  'henderson-hasselbalch':
    'Henderson–Hasselbalch equation for the carbonic acid–bicarbonate buffer, pH = 6.1 + log10(HCO3 / (0.0307 × PaCO2)), with pK′ 6.1 and CO2 solubility 0.0307 mmol/L per mmHg in plasma at 37 °C: standard physiology (Hasselbalch KA. Biochem Z 1916;78:112–144, from memory). The solubility 0.0307 read in table 1 of a 2018 study in Vet Med Sci (4(3):206–217, doi 10.1002/vms3.101, PMC6090410), which computes HCO3 = 0.0307 × PCO2 × 10^(pH − 6.105) after NCCLS 1994; and 0.0304 with pK′ 6.1 in the form recommended in the abstract of Lang W, Zander R, Clin Chem Lab Med 2002;40:404–410: HCO3 by either is within 1.2 % of HCO3 here, inside the spread of analysers the consistency tolerance allows for.',
  'kassirer-bleich-1965':
    'Kassirer JP, Bleich HL. Rapid estimation of plasma carbon dioxide tension from pH and total carbon dioxide content. N Engl J Med 1965;272:1067–1068 (its title and opening read on scilit.net; [H+] (nmol/L) = 24 × PaCO2 / HCO3 read as the Henderson equation in Adrogué & Madias 2010; the volume and pages from memory).',
  'winters-1967':
    'Albert MS, Dell RB, Winters RW. Quantitative displacement of acid-base equilibrium in metabolic acidosis. Ann Intern Med 1967;66(2):312–322 (its title and abstract read on scilit.net: 60 patients with untreated metabolic acidosis, PCO2 regressed on plasma bicarbonate with 95 % limits; the coefficients 1.5 × HCO3 + 8 ± 2 not given there: from memory). The regression PCO2 = 1.54 × HCO3 + 8.36 ± 2.2 read in table 3 of a 2022 review in Kidney360 (3:1458–1466, PMC9416819), of which 1.5 × HCO3 + 8 ± 2 is the rounding in common use (within 1.5 mmHg of it from HCO3 5 to 24 mmol/L).',
  'berend-2014':
    'Berend K, de Vries APJ, Gans ROB. Physiological approach to assessment of acid–base disturbances. N Engl J Med 2014;371(15):1434–1445 (authors, title, journal and pages read on its first page, doi 10.1056/NEJMra1003327): the metabolic alkalosis rule taken from it, PaCO2 40 + 0.7 × (HCO3 − 24) ± 2, read in its reproduction in a table of compensation rules headed by the citation NEJM 2014;371:1434, at physician.tw/Compensation-for-Acid-Base-Disorders (the paper\'s own table not read here).',
  'narins-emmett-1980':
    'Narins RG, Emmett M. Simple and mixed acid-base disorders: a practical approach. Medicine (Baltimore) 1980;59(3):161–187 (the paper not read here, its citation from memory): its respiratory coefficients, HCO3 up 0.1 (acute) and 0.35 (chronic) mmol/L per mmHg of PaCO2 above 40 and down 0.2 (acute) and 0.5 (chronic) per mmHg below it, read in its table as adapted in Hong Kong Practitioner 2005;27, table 3 (hkcfp.org.hk); the same 0.1, 0.35 and 0.2, and 0.41 for chronic alkalosis, in table 3 of a 2022 review in Kidney360 (3:1458–1466, PMC9416819).',
  'adrogue-madias-2010':
    'Adrogué HJ, Madias NE. Secondary responses to altered acid-base status: the rules of engagement. J Am Soc Nephrol 2010;21(6):920–923 (the citation and the Henderson equation [H+] = 24 × PaCO2 / [HCO3] read in its opening paragraphs, doi 10.1681/ASN.2009121211; the coefficients of the secondary responses not read there: from memory).',
  'figge-1998':
    'Figge J, Jabor A, Kazda A, Fencl V. Anion gap and hypoalbuminemia. Crit Care Med 1998;26(11):1807–1810: the observed gap plus 0.25 × (normal − observed albumin) in g/L, 2.5 in g/dL (read in its abstract, PubMed 9824071; the normal albumin is not given there, 4.0 g/dL here and 4.4 in some use).',
  'rastegar-2007':
    'Rastegar A. Use of the ΔAG/ΔHCO3− ratio in the diagnosis of mixed acid-base disorders. J Am Soc Nephrol 2007;18(9):2429–2431 (the citation, doi 10.1681/ASN.2006121408, read in its opening paragraph, which gives albumin 2.5 mEq/L of gap per g/dL; the bands of the ratio not read there). The bands Pneumark uses, below 0.4 a normal-gap (hyperchloraemic) acidosis, 0.4 to 0.8 a high-gap and a normal-gap acidosis together, 0.8 to 2 an uncomplicated high-gap acidosis and above 2 a high-gap acidosis with a metabolic alkalosis or a compensated respiratory acidosis, read in the English Wikipedia article "Delta ratio" (in its copy at wiki-gateway.eudic.net/wikipedia_en/Delta_Ratio.html, undated, which names no source for them); ABG teaching notes at scribd.com/document/629212188 give the same bands but 1 to 2, not 0.8 to 2, as usual for an uncomplicated high-gap acidosis.',
  'madias-1979':
    'Madias NE, Ayus JC, Adrogué HJ. Increased anion gap in metabolic alkalosis: the role of plasma-protein equivalency. N Engl J Med 1979;300:1421–1423 (from memory): in a metabolic alkalosis the anion gap rises modestly from the alkalaemia itself (the net negative charge of albumin rises with the pH, and volume contraction concentrates it), not from an added acid. The margin Pneumark reads so, up to 4 mmol/L above the upper normal gap (ALKALOSIS_ANION_GAP_MARGIN_MMOL_L): common practice, no source.',
  'anion-gap':
    'Anion gap = Na − (Cl + HCO3), optionally + K; normal about 12 mmol/L (8–12 with modern analysers): common practice, no source.',
  'acid-base-reference-intervals':
    'Arterial reference intervals pH 7.35–7.45, PaCO2 35–45 mmHg, HCO3 22–26 mmol/L: common practice, no source.',
  'compensation-terms':
    'Uncompensated (pH abnormal, the other component in its reference interval), partially compensated (pH abnormal, both components beyond their intervals in opposite directions) and fully compensated (pH in its interval, both components beyond their intervals in opposite directions): common practice, no source.',
  'bloom-2014':
    'Bloom BM, Grundlingh J, Bestwick JP, Harris T. The role of venous blood gas in the emergency department: a systematic review and meta-analysis. Eur J Emerg Med 2014;21(2):81–88 (read in its abstract; volume and pages from memory): pooled venous minus arterial pH −0.033 with narrow limits of agreement; PCO2 +4.4 mmHg with limits of agreement −20.4 to +25.8 mmHg, so a venous PCO2 cannot stand for the arterial one, though a normal one screens out arterial hypercapnia.',
  'kelly-2010':
    'Kelly AM. Review article: Can venous blood gas analysis replace arterial in emergency medical care. Emerg Med Australas 2010;22:493–498 (read in its abstract): mean arterio–venous pH difference 0.035 with narrow limits of agreement; venous pH and bicarbonate agree well enough with arterial values in patients not in shock; venous pCO2 does not.',
  'kelly-2005':
    'Kelly AM, Kerr D, Middleton P. Validation of venous pCO2 to screen for arterial hypercarbia in patients with chronic obstructive airways disease. J Emerg Med 2005;28(4):377–379 (read in its abstract): a venous pCO2 above 45 mmHg caught all 43 patients whose arterial pCO2 was above 50 mmHg; none of the 30 with a venous pCO2 below 45 mmHg had one.',
  'van-slyke-sbe':
    'Standard base excess (of the extracellular fluid), SBE = HCO3 − 24.8 + 16.2 × (pH − 7.40) mmol/L, and the actual (blood) base excess, ABE = (1 − 0.014 × Hb) × (HCO3 − 24.8 + (1.43 × Hb + 7.7) × (pH − 7.40)) with Hb in g/dL: the forms of CLSI (NCCLS) C46-A, Blood Gas and pH Analysis and Related Measurements, 2001, and C46-A2, 2009 (the standard not read here). The SBE read in table 1 of a 2018 study in Vet Med Sci 4(3):206–217 (PMC6090410, December 2026), after Shapiro and coauthors 1989; the ABE\'s constants from memory. Until December 2026 Pneumark used 0.93 × (HCO3 − 24.4 + 14.8 × (pH − 7.40)), recalled as the standard\'s SBE: it is not the form read, and differs from it by up to 2.7 mmol/L. The general form, BE = Z × ((HCO3 − HCO3 at pH 7.40) + β × (pH − 7.40)), Z depending on the Hb only, read in the abstract of Lang W, Zander R. The accuracy of calculated base excess in blood. Clin Chem Lab Med 2002;40(4):404–410 (metajournal.com), which recommends (1 − 0.0143 × Hb) × ((0.0304 × PCO2 × 10^(pH − 6.1) − 24.26) + (9.5 + 1.63 × Hb) × (pH − 7.40)) − 0.2 × Hb × (1 − sO2), Hb in g/dL: with the same HCO3 the ABE here is within 2 mmol/L of it in oxygenated blood (pH 7.0–7.7, HCO3 5–50 mmol/L, Hb 7–17 g/dL).',
  'pneumark-base-excess-tolerance':
    'A stated base excess is accepted within ±3 mmol/L of the span from the lowest to the highest of the standard and the actual base excess (BASE_EXCESS_TOLERANCE_MMOL_L), the actual one over the stated Hb or, with none, over Hb 7–17 g/dL: common practice, no source; reasoning given beside the constants.',
  'pneumark-consistency-tolerance':
    'Tolerance for reported vs calculated HCO3 (HCO3_CONSISTENCY_TOLERANCE): Pneumark’s own choice, no source; reasoning given beside the constant.',
} as const);

/** A closed numeric interval. */
export interface NumericRange {
  readonly low: number;
  readonly high: number;
}

/** A closed numeric interval with the formula's central value. */
export interface RangeWithCentre extends NumericRange {
  readonly centre: number;
}

/** Reference intervals. Source: `acid-base-reference-intervals`. */
export const PH_NORMAL: NumericRange = Object.freeze({ low: 7.35, high: 7.45 });
export const PACO2_NORMAL_MMHG: NumericRange = Object.freeze({ low: 35, high: 45 });
export const HCO3_NORMAL_MMOL_L: NumericRange = Object.freeze({ low: 22, high: 26 });
/** Centre values used as the baseline of compensation rules. Source: `berend-2014`. */
export const PH_CENTRE = 7.4;
export const PACO2_CENTRE_MMHG = 40;
export const HCO3_CENTRE_MMOL_L = 24;

/** pK′ of the carbonic acid–bicarbonate system in plasma at 37 °C. Source: `henderson-hasselbalch`. */
export const HH_PK = 6.1;
/** Solubility of CO2 in plasma at 37 °C, mmol/L per mmHg. Source: `henderson-hasselbalch`. */
export const CO2_SOLUBILITY_MMOL_PER_L_PER_MMHG = 0.0307;

/** Half-width (mmHg) of Winters' expected PaCO2 band. Source: `winters-1967`. */
export const WINTERS_TOLERANCE_MMHG = 2;
/** Half-width (mmHg) of the expected PaCO2 band in metabolic alkalosis. Source: `berend-2014`. */
export const METABOLIC_ALKALOSIS_TOLERANCE_MMHG = 2;

/**
 * Change in HCO3 (mmol/L) per 10 mmHg change in PaCO2 from 40, as [smallest, largest] published
 * coefficient; the expected range spans them. Sources: `narins-emmett-1980`, `adrogue-madias-2010`.
 */
export const RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG = Object.freeze({
  acuteAcidosis: Object.freeze([1, 1] as const),
  chronicAcidosis: Object.freeze([3.5, 5] as const),
  acuteAlkalosis: Object.freeze([2, 2] as const),
  chronicAlkalosis: Object.freeze([4, 5] as const),
});

/**
 * Tolerance (± mmol/L) added on both sides of the expected HCO3 range of a respiratory disorder,
 * acute and chronic alike. Pneumark's choice: ±2 mmol/L is the half-width of the 22–26 mmol/L
 * reference interval, i.e. the uncertainty of the patient's unknown baseline HCO3, and mirrors
 * the ±2 band of Winters' formula. Without it a single coefficient (e.g. acute +1 per 10 mmHg)
 * would give a zero-width range.
 */
export const RESPIRATORY_RESPONSE_TOLERANCE_MMOL_L = 2;

/**
 * Tolerance for the internal consistency of a gas: reported HCO3 and the HCO3 calculated from
 * the reported pH and PaCO2 by Henderson–Hasselbalch are judged inconsistent when they differ by
 * more than max(2 mmol/L, 10 % of the calculated value). Pneumark's choice, reasoned as follows:
 * rounding pH to 0.01 shifts HCO3 by up to ~1.2 %; rounding PaCO2 to 1 mmHg or 0.1 kPa by up to
 * ~2–3 % at low PaCO2; analysers differ in pK′ and solubility (6.09–6.10, 0.0301–0.0307) by
 * ~2–3 %; and a chemistry "total CO2" exceeds bicarbonate by the dissolved CO2 (~1.2 mmol/L).
 * Together these reach ~8 %, so 10 % leaves no false alarm on honest results while still
 * catching transcription errors (swapped or dropped digits, a venous value beside an arterial
 * gas). The 2 mmol/L floor covers the dissolved-CO2 offset and integer rounding when HCO3 is low.
 * 10 % in HCO3 is about 0.04 pH units. Source: `pneumark-consistency-tolerance`.
 */
export const HCO3_CONSISTENCY_TOLERANCE = Object.freeze({ absoluteMmolL: 2, relative: 0.1 });

/** Normal anion gap (mmol/L) used as the baseline of the delta ratio. Source: `anion-gap`. */
export const NORMAL_ANION_GAP_MMOL_L = 12;
/** Anion gap (mmol/L, without K) above which the gap counts as high. Source: `anion-gap`. */
export const ANION_GAP_UPPER_NORMAL_MMOL_L = 12;
/**
 * How far (mmol/L) above ANION_GAP_UPPER_NORMAL_MMOL_L an anion gap beside a primary metabolic
 * alkalosis is read as the alkalaemia's own rise of the gap rather than an added high-gap acidosis:
 * the rise the alkalaemia gives is modest (a few mmol/L), and one above the margin is more than it
 * explains. Sources: `madias-1979` for the phenomenon; the margin common practice, no source.
 */
export const ALKALOSIS_ANION_GAP_MARGIN_MMOL_L = 4;
/** Normal albumin (g/dL) for the albumin correction (Figge used 4.4 g/dL). Source: `figge-1998`. */
export const NORMAL_ALBUMIN_G_DL = 4.0;
/** Anion gap change (mmol/L) per g/dL of albumin. Source: `figge-1998`. */
export const ANION_GAP_PER_G_DL_ALBUMIN = 2.5;

/** Reading of a delta ratio. Source: `rastegar-2007`. */
export type DeltaRatioBand =
  /** < 0.4: the fall in HCO3 is mostly a normal-gap (hyperchloraemic) acidosis. */
  | 'normal-gap-acidosis'
  /** 0.4 to < 0.8: high-gap and normal-gap acidosis together. */
  | 'mixed-high-and-normal-gap-acidosis'
  /** 0.8 to 2: an uncomplicated high-gap acidosis. */
  | 'high-gap-acidosis'
  /** > 2: HCO3 higher than the gap explains: added metabolic alkalosis, or a pre-existing compensated respiratory acidosis. */
  | 'high-gap-acidosis-with-alkalosis';

export type AcidBaseDisorder = 'metabolic-acidosis' | 'metabolic-alkalosis' | 'respiratory-acidosis' | 'respiratory-alkalosis';

/**
 * The primary finding: a single disorder; 'mixed-acidosis' (metabolic and respiratory acidosis
 * both beyond their reference intervals); 'mixed-alkalosis' (likewise); 'normal' (all three in
 * their reference intervals; hidden disorders may still show in `additional` via the anion gap);
 * 'undetermined' (the pH is outside its interval but neither PaCO2 nor HCO3 moves that way: see
 * `consistency`).
 */
export type PrimaryAcidBaseFinding = AcidBaseDisorder | 'mixed-acidosis' | 'mixed-alkalosis' | 'normal' | 'undetermined';

export type PhStatus = 'acidaemia' | 'alkalaemia' | 'normal';

/** Whether the secondary response matches the expected range for the primary disorder. */
export type CompensationStatus = 'appropriate' | 'insufficient' | 'excessive' | 'not-applicable';

/**
 * Timing of a respiratory disorder judged from the HCO3 response: in the acute range only, in
 * the chronic range only, between the two ('intermediate': evolving, or acute on chronic), or in
 * both ranges at once ('acute-or-chronic': small changes cannot tell).
 */
export type RespiratoryChronicity = 'acute' | 'chronic' | 'intermediate' | 'acute-or-chronic';

export type MetabolicAcidosisKind = 'high-anion-gap' | 'normal-anion-gap' | 'mixed-anion-gap';

export type RespiratoryChronicityInput = 'acute' | 'chronic';

/** Expected secondary response: PaCO2 for a metabolic primary, HCO3 (acute and chronic) for a respiratory one. */
export type ExpectedCompensation =
  | {
      readonly kind: 'respiratory-response';
      readonly quantity: 'paco2-mmhg';
      readonly observed: number;
      readonly range: RangeWithCentre;
    }
  | {
      readonly kind: 'metabolic-response';
      readonly quantity: 'hco3-mmol-l';
      readonly observed: number;
      readonly acute: NumericRange;
      readonly chronic: NumericRange;
    };

export interface AcidBaseConsistency {
  /** HCO3 (mmol/L) calculated from the reported pH and PaCO2 by Henderson–Hasselbalch. */
  readonly calculatedHco3MmolL: number;
  /** Reported minus calculated HCO3 (mmol/L). */
  readonly differenceMmolL: number;
  /** Allowed |difference| (mmol/L): max(2, 10 % of calculated). */
  readonly toleranceMmolL: number;
  readonly consistent: boolean;
}

export interface AnionGapFinding {
  readonly valueMmolL: number;
  readonly high: boolean;
  /** (AG − 12) / (24 − HCO3); `null` when HCO3 is not below 24. */
  readonly deltaRatio: number | null;
  readonly deltaRatioBand: DeltaRatioBand | null;
  /** Kind of metabolic acidosis, when one is identified. */
  readonly metabolicAcidosisKind: MetabolicAcidosisKind | null;
  /**
   * A high gap beside a primary metabolic alkalosis with an alkalaemia (pH above 7.45), no more than
   * ALKALOSIS_ANION_GAP_MARGIN_MMOL_L above the upper normal: read as the alkalaemia itself raising
   * the gap, and no metabolic acidosis is added for it (`madias-1979`). With a pH within its
   * reference interval nothing raises the charge of albumin, and the gap is read as before.
   */
  readonly raisedByAlkalosis: boolean;
}

export interface AcidBaseInput {
  readonly ph: number;
  readonly paco2Mmhg: number;
  readonly hco3MmolL: number;
  /** Anion gap (mmol/L, without K; albumin-corrected if the caller wishes). Optional. */
  readonly anionGapMmolL?: number | undefined;
  /**
   * The HCO3 (mmol/L) the anion gap was computed with, for the delta ratio: a laboratory's serum
   * bicarbonate where the gap used it. Defaults to `hco3MmolL`.
   */
  readonly gapHco3MmolL?: number | undefined;
  /**
   * How far (mmHg) the PaCO2 as written can be from what it stands for, for comparisons with the
   * reference interval and the expected range: half a unit of the last decimal of a PaCO2 written
   * in kPa (0.05 kPa = 0.375 mmHg for one decimal), so that 6.0 kPa (45.004 mmHg) is on the 45 mmHg
   * upper limit as its writer reads it, not above it. Default 0: compared exactly (mmHg as written).
   */
  readonly paco2ResolutionMmhg?: number | undefined;
}

export interface AcidBaseClassification {
  readonly phStatus: PhStatus;
  readonly primary: PrimaryAcidBaseFinding;
  readonly compensation: CompensationStatus;
  /**
   * pH within its reference interval while a single primary disorder is appropriately compensated
   * and the compensating component has itself moved beyond its reference interval (PaCO2 below 35
   * or above 45 mmHg for a metabolic primary, HCO3 below 22 or above 26 mmol/L for a respiratory
   * one). A normal pH with the other component still in its interval is a mild disorder, not a
   * compensated one: nothing has compensated. Source: `compensation-terms`.
   */
  readonly fullyCompensated: boolean;
  readonly expected: ExpectedCompensation | null;
  /**
   * Timing of a respiratory primary; `null` otherwise or when a second disorder blurs it: an HCO3
   * outside both expected ranges, or a metabolic disorder the anion gap adds, which moves the HCO3 too.
   */
  readonly respiratoryChronicity: RespiratoryChronicity | null;
  /** Suspected further disorders beyond the primary finding. */
  readonly additional: readonly AcidBaseDisorder[];
  /** Every disorder identified, the primary's first. */
  readonly disorders: readonly AcidBaseDisorder[];
  readonly anionGap: AnionGapFinding | null;
  readonly consistency: AcidBaseConsistency;
}

function validPh(ph: number): boolean {
  return inClosedRange(ph, 0, 14);
}

/**
 * HCO3 (mmol/L) from pH and PaCO2 by Henderson–Hasselbalch: HCO3 = 0.0307 × PaCO2 × 10^(pH − 6.1).
 * `null` unless 0 ≤ pH ≤ 14 and PaCO2 > 0. Source: `henderson-hasselbalch`.
 */
export function hco3FromPhPco2(ph: number, paco2Mmhg: number): number | null {
  if (!validPh(ph) || !allFinite(paco2Mmhg) || paco2Mmhg <= 0) return null;
  return finiteOrNull(CO2_SOLUBILITY_MMOL_PER_L_PER_MMHG * paco2Mmhg * Math.pow(10, ph - HH_PK));
}

/**
 * pH from HCO3 and PaCO2 by Henderson–Hasselbalch: pH = 6.1 + log10(HCO3 / (0.0307 × PaCO2)).
 * `null` unless HCO3 > 0 and PaCO2 > 0. Source: `henderson-hasselbalch`.
 */
export function phFromHco3Paco2(hco3MmolL: number, paco2Mmhg: number): number | null {
  if (!allFinite(hco3MmolL, paco2Mmhg) || hco3MmolL <= 0 || paco2Mmhg <= 0) return null;
  return finiteOrNull(HH_PK + Math.log10(hco3MmolL / (CO2_SOLUBILITY_MMOL_PER_L_PER_MMHG * paco2Mmhg)));
}

/**
 * Hydrogen ion concentration (nmol/L) from pH: [H+] = 10^(9 − pH) (pH 7.40 → 39.8).
 * `null` unless 0 ≤ pH ≤ 14. Source: `kassirer-bleich-1965`.
 */
export function hydrogenIonNmol(ph: number): number | null {
  if (!validPh(ph)) return null;
  return finiteOrNull(Math.pow(10, 9 - ph));
}

/**
 * Hydrogen ion concentration (nmol/L) by the Kassirer–Bleich form of Henderson's equation:
 * [H+] = 24 × PaCO2 / HCO3. `null` unless PaCO2 > 0 and HCO3 > 0. Source: `kassirer-bleich-1965`.
 */
export function kassirerBleichHydrogen(paco2Mmhg: number, hco3MmolL: number): number | null {
  if (!allFinite(paco2Mmhg, hco3MmolL) || paco2Mmhg <= 0 || hco3MmolL <= 0) return null;
  return finiteOrNull((24 * paco2Mmhg) / hco3MmolL);
}

/**
 * Anion gap (mmol/L): Na − (Cl + HCO3), plus K when given. May be negative (a lab error or an
 * unmeasured cation). `null` unless every given concentration is ≥ 0. Source: `anion-gap`.
 */
export function anionGap(naMmolL: number, clMmolL: number, hco3MmolL: number, kMmolL?: number): number | null {
  if (!allFinite(naMmolL, clMmolL, hco3MmolL) || naMmolL < 0 || clMmolL < 0 || hco3MmolL < 0) return null;
  let potassium = 0;
  if (kMmolL !== undefined) {
    if (!allFinite(kMmolL) || kMmolL < 0) return null;
    potassium = kMmolL;
  }
  return finiteOrNull(naMmolL + potassium - clMmolL - hco3MmolL);
}

/**
 * Albumin-corrected anion gap (mmol/L): AG + 2.5 × (normal albumin − albumin), albumin in g/dL,
 * normal 4.0 g/dL by default (Figge used 4.4). `null` unless albumin ≥ 0 and normal albumin > 0.
 * Source: `figge-1998`.
 */
export function anionGapAlbuminCorrected(
  anionGapMmolL: number,
  albuminGdl: number,
  normalAlbuminGdl: number = NORMAL_ALBUMIN_G_DL,
): number | null {
  if (!allFinite(anionGapMmolL, albuminGdl, normalAlbuminGdl) || albuminGdl < 0 || normalAlbuminGdl <= 0) return null;
  return finiteOrNull(anionGapMmolL + ANION_GAP_PER_G_DL_ALBUMIN * (normalAlbuminGdl - albuminGdl));
}

/**
 * Delta ratio (dimensionless): (AG − normal AG) / (normal HCO3 − HCO3), defaults 12 and 24.
 * Defined only while HCO3 is below its normal value: `null` when the denominator is ≤ 0, and
 * unless HCO3 ≥ 0. Source: `rastegar-2007`.
 */
export function deltaRatio(
  anionGapMmolL: number,
  hco3MmolL: number,
  normalAnionGapMmolL: number = NORMAL_ANION_GAP_MMOL_L,
  normalHco3MmolL: number = HCO3_CENTRE_MMOL_L,
): number | null {
  if (!allFinite(anionGapMmolL, hco3MmolL, normalAnionGapMmolL, normalHco3MmolL) || hco3MmolL < 0) return null;
  const fallInHco3 = normalHco3MmolL - hco3MmolL;
  if (fallInHco3 <= 0) return null;
  return finiteOrNull((anionGapMmolL - normalAnionGapMmolL) / fallInHco3);
}

/**
 * Reading of a delta ratio: < 0.4 normal-gap acidosis; 0.4 to < 0.8 high- and normal-gap
 * together; 0.8–2 high-gap acidosis; > 2 high-gap acidosis with metabolic alkalosis (or a
 * pre-existing compensated respiratory acidosis). `null` for a non-finite ratio.
 * Source: `rastegar-2007`.
 */
export function deltaRatioBand(ratio: number): DeltaRatioBand | null {
  if (!allFinite(ratio)) return null;
  const r = forBand(ratio);
  if (r < 0.4) return 'normal-gap-acidosis';
  if (r < 0.8) return 'mixed-high-and-normal-gap-acidosis';
  if (r <= 2) return 'high-gap-acidosis';
  return 'high-gap-acidosis-with-alkalosis';
}

/**
 * Expected PaCO2 (mmHg) in metabolic acidosis, Winters' formula: 1.5 × HCO3 + 8 ± 2.
 * `null` unless HCO3 > 0. Source: `winters-1967`.
 */
export function expectedPaco2MetabolicAcidosis(hco3MmolL: number): RangeWithCentre | null {
  if (!allFinite(hco3MmolL) || hco3MmolL <= 0) return null;
  const centre = 1.5 * hco3MmolL + 8;
  return rangeAround(centre, WINTERS_TOLERANCE_MMHG);
}

/**
 * Expected PaCO2 (mmHg) in metabolic alkalosis: 40 + 0.7 × (HCO3 − 24) ± 2 (published variants
 * differ by up to 5 mmHg). `null` unless HCO3 > 0. Source: `berend-2014`.
 */
export function expectedPaco2MetabolicAlkalosis(hco3MmolL: number): RangeWithCentre | null {
  if (!allFinite(hco3MmolL) || hco3MmolL <= 0) return null;
  const centre = PACO2_CENTRE_MMHG + 0.7 * (hco3MmolL - HCO3_CENTRE_MMOL_L);
  return rangeAround(centre, METABOLIC_ALKALOSIS_TOLERANCE_MMHG);
}

/**
 * Expected HCO3 (mmol/L) in a respiratory disorder: 24 + k × (PaCO2 − 40) / 10 over the span of
 * published coefficients k (acute acidosis +1; chronic acidosis +3.5 to +5; acute alkalosis −2;
 * chronic alkalosis −4 to −5 per 10 mmHg), widened by ±2 mmol/L on both sides
 * (RESPIRATORY_RESPONSE_TOLERANCE_MMOL_L). Acidosis coefficients apply at PaCO2 ≥ 40, alkalosis
 * ones below. Given the resolution a PaCO2 in kPa was written with (`paco2ResolutionMmhg`, half a
 * unit of its last decimal in mmHg), the range holds what every PaCO2 it stands for gives: the
 * expected HCO3 rises with the PaCO2, so from the low end at the lowest to the high end at the
 * highest (12.0 kPa stands for 89.6–90.4 mmHg, and holds the 27 mmol/L that 90 mmHg gives as its
 * low end, as the same gas written in mmHg does). `null` unless PaCO2 > 0 and the chronicity is known.
 * Sources: `narins-emmett-1980`, `adrogue-madias-2010`.
 */
export function expectedHco3Respiratory(paco2Mmhg: number, chronicity: RespiratoryChronicityInput, paco2ResolutionMmhg = 0): NumericRange | null {
  if (!allFinite(paco2Mmhg) || paco2Mmhg <= 0) return null;
  if (chronicity !== 'acute' && chronicity !== 'chronic') return null;
  if (allFinite(paco2ResolutionMmhg) && paco2ResolutionMmhg > 0) {
    const lowest = expectedHco3Respiratory(Math.max(paco2Mmhg - paco2ResolutionMmhg, Number.MIN_VALUE), chronicity);
    const highest = expectedHco3Respiratory(paco2Mmhg + paco2ResolutionMmhg, chronicity);
    if (lowest === null || highest === null) return null;
    return { low: lowest.low, high: highest.high };
  }
  const tens = (paco2Mmhg - PACO2_CENTRE_MMHG) / 10;
  const c = RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG;
  const k =
    tens >= 0
      ? chronicity === 'acute'
        ? c.acuteAcidosis
        : c.chronicAcidosis
      : chronicity === 'acute'
        ? c.acuteAlkalosis
        : c.chronicAlkalosis;
  // Indexed, not destructured: destructuring goes through an iterator at every gas.
  const kSmall = k[0];
  const kLarge = k[1];
  // Above 40 mmHg HCO3 rises by k per 10 mmHg; below 40 it falls by k per 10 mmHg (tens < 0).
  const sign = tens >= 0 ? 1 : -1;
  const a = HCO3_CENTRE_MMOL_L + sign * kSmall * Math.abs(tens);
  const b = HCO3_CENTRE_MMOL_L + sign * kLarge * Math.abs(tens);
  const low = finiteOrNull(Math.min(a, b) - RESPIRATORY_RESPONSE_TOLERANCE_MMOL_L);
  const high = finiteOrNull(Math.max(a, b) + RESPIRATORY_RESPONSE_TOLERANCE_MMOL_L);
  if (low === null || high === null) return null;
  return { low, high };
}

/**
 * Internal consistency of a reported gas: reported HCO3 against HCO3 calculated from the
 * reported pH and PaCO2 (Henderson–Hasselbalch), within max(2 mmol/L, 10 %) —
 * see HCO3_CONSISTENCY_TOLERANCE — at the PaCO2 as written or, given the resolution a PaCO2 in kPa
 * was written with (`paco2ResolutionMmhg`), at any PaCO2 it stands for. `null` unless 0 ≤ pH ≤ 14, PaCO2 > 0 and HCO3 > 0.
 * Sources: `henderson-hasselbalch`, `pneumark-consistency-tolerance`.
 */
export function acidBaseConsistency(ph: number, paco2Mmhg: number, hco3MmolL: number, paco2ResolutionMmhg = 0): AcidBaseConsistency | null {
  if (!allFinite(hco3MmolL) || hco3MmolL <= 0) return null;
  const calculated = hco3FromPhPco2(ph, paco2Mmhg);
  if (calculated === null) return null;
  const difference = finiteOrNull(hco3MmolL - calculated);
  const tolerance = finiteOrNull(consistencyTolerance(calculated));
  if (difference === null || tolerance === null) return null;
  return {
    calculatedHco3MmolL: calculated,
    differenceMmolL: difference,
    toleranceMmolL: tolerance,
    consistent: Math.abs(difference) <= tolerance || fitsWithinResolution(ph, paco2Mmhg, hco3MmolL, paco2ResolutionMmhg),
  };
}

function consistencyTolerance(calculatedHco3: number): number {
  return Math.max(HCO3_CONSISTENCY_TOLERANCE.absoluteMmolL, HCO3_CONSISTENCY_TOLERANCE.relative * calculatedHco3);
}

/**
 * Whether the HCO3 fits a PaCO2 anywhere within the resolution the PaCO2 was written with (a value
 * in kPa: 5.3 kPa stands for 5.25–5.35 kPa, 39.4–40.1 mmHg), so that a gas in kPa agrees or
 * disagrees as the same gas written in mmHg does. The HCO3 pH and PaCO2 give rises with the PaCO2:
 * it fits when it lies between the two ends' HCO3 or within the tolerance of either end.
 */
function fitsWithinResolution(ph: number, paco2Mmhg: number, hco3MmolL: number, resolutionMmhg: number): boolean {
  if (!(resolutionMmhg > 0) || !Number.isFinite(resolutionMmhg)) return false;
  const low = hco3FromPhPco2(ph, Math.max(paco2Mmhg - resolutionMmhg, Number.MIN_VALUE));
  const high = hco3FromPhPco2(ph, paco2Mmhg + resolutionMmhg);
  if (low === null || high === null) return false;
  if (hco3MmolL >= low && hco3MmolL <= high) return true;
  return Math.abs(hco3MmolL - low) <= consistencyTolerance(low) || Math.abs(hco3MmolL - high) <= consistencyTolerance(high);
}

type Direction = 'acid' | 'alkali';

function metabolicDisorder(direction: Direction): AcidBaseDisorder {
  return direction === 'acid' ? 'metabolic-acidosis' : 'metabolic-alkalosis';
}

function respiratoryDisorder(direction: Direction): AcidBaseDisorder {
  return direction === 'acid' ? 'respiratory-acidosis' : 'respiratory-alkalosis';
}

function rangeAround(centre: number, halfWidth: number): RangeWithCentre | null {
  const low = finiteOrNull(centre - halfWidth);
  const high = finiteOrNull(centre + halfWidth);
  const mid = finiteOrNull(centre);
  if (low === null || high === null || mid === null) return null;
  return { low, centre: mid, high };
}

/**
 * Whether `value` lies in the closed `range`, its ends compared as `sideOf` compares a threshold: an
 * end that is the value on paper is the value here (24 + 3.5 × 2.2 − 2 is 29.7, not the
 * 29.700000000000003 floating point makes of it), so a measured HCO3 on an end is within the range.
 */
function within(value: number, range: NumericRange): boolean {
  return sideOf(value, range.low) >= 0 && sideOf(value, range.high) <= 0;
}

/**
 * Which finding is primary. Outside the pH interval: the component moving the pH's way (both →
 * mixed); if neither is beyond its interval, the one with the larger shift that way (log scale).
 * Inside the pH interval: the only abnormal component; for a compensating pair, the one on the
 * pH's side of 7.40 (at exactly 7.40, the larger relative shift).
 */
function primaryFinding(ph: number, paco2: number, hco3: number, paco2Resolution: number): PrimaryAcidBaseFinding {
  const metabolic: Direction | null =
    hco3 < HCO3_NORMAL_MMOL_L.low ? 'acid' : hco3 > HCO3_NORMAL_MMOL_L.high ? 'alkali' : null;
  const respiratory: Direction | null =
    sideOf(paco2, PACO2_NORMAL_MMHG.high, paco2Resolution) > 0 ? 'acid' : sideOf(paco2, PACO2_NORMAL_MMHG.low, paco2Resolution) < 0 ? 'alkali' : null;
  const phDirection: Direction | null = ph < PH_NORMAL.low ? 'acid' : ph > PH_NORMAL.high ? 'alkali' : null;

  if (metabolic !== null && metabolic === respiratory) {
    return metabolic === 'acid' ? 'mixed-acidosis' : 'mixed-alkalosis';
  }
  // Positive shift = towards alkali, on a log scale so that the two components compare.
  const metabolicShift = Math.log10(hco3 / HCO3_CENTRE_MMOL_L);
  const respiratoryShift = Math.log10(PACO2_CENTRE_MMHG / paco2);

  if (phDirection !== null) {
    if (metabolic === phDirection) return metabolicDisorder(phDirection);
    if (respiratory === phDirection) return respiratoryDisorder(phDirection);
    const sign = phDirection === 'alkali' ? 1 : -1;
    const m = sign * metabolicShift;
    const r = sign * respiratoryShift;
    if (m <= 0 && r <= 0) return 'undetermined';
    return m >= r ? metabolicDisorder(phDirection) : respiratoryDisorder(phDirection);
  }
  if (metabolic === null && respiratory === null) return 'normal';
  if (metabolic === null && respiratory !== null) return respiratoryDisorder(respiratory);
  if (respiratory === null && metabolic !== null) return metabolicDisorder(metabolic);
  // Both abnormal in opposite directions: a compensating pair.
  let side: Direction;
  if (ph < PH_CENTRE) side = 'acid';
  else if (ph > PH_CENTRE) side = 'alkali';
  else if (Math.abs(metabolicShift) >= Math.abs(respiratoryShift)) side = metabolicShift < 0 ? 'acid' : 'alkali';
  else side = respiratoryShift < 0 ? 'acid' : 'alkali';
  return metabolic === side ? metabolicDisorder(side) : respiratoryDisorder(side);
}

interface CompensationResult {
  readonly compensation: CompensationStatus;
  readonly expected: ExpectedCompensation | null;
  readonly chronicity: RespiratoryChronicity | null;
  readonly additional: readonly AcidBaseDisorder[];
}

const NOT_APPLICABLE: CompensationResult = Object.freeze({
  compensation: 'not-applicable',
  expected: null,
  chronicity: null,
  additional: Object.freeze([]),
});

function compensationFor(primary: PrimaryAcidBaseFinding, paco2: number, hco3: number, paco2Resolution: number): CompensationResult {
  switch (primary) {
    case 'metabolic-acidosis':
    case 'metabolic-alkalosis': {
      const range =
        primary === 'metabolic-acidosis' ? expectedPaco2MetabolicAcidosis(hco3) : expectedPaco2MetabolicAlkalosis(hco3);
      if (range === null) return NOT_APPLICABLE;
      const expected: ExpectedCompensation = {
        kind: 'respiratory-response',
        quantity: 'paco2-mmhg',
        observed: paco2,
        range,
      };
      // The response lowers PaCO2 in metabolic acidosis and raises it in metabolic alkalosis.
      const acidosis = primary === 'metabolic-acidosis';
      if (sideOf(paco2, range.high, paco2Resolution) > 0) {
        return { compensation: acidosis ? 'insufficient' : 'excessive', expected, chronicity: null, additional: ONLY_RESPIRATORY_ACIDOSIS };
      }
      if (sideOf(paco2, range.low, paco2Resolution) < 0) {
        return { compensation: acidosis ? 'excessive' : 'insufficient', expected, chronicity: null, additional: ONLY_RESPIRATORY_ALKALOSIS };
      }
      return { compensation: 'appropriate', expected, chronicity: null, additional: NO_DISORDERS };
    }
    case 'respiratory-acidosis':
    case 'respiratory-alkalosis': {
      const acute = expectedHco3Respiratory(paco2, 'acute', paco2Resolution);
      const chronic = expectedHco3Respiratory(paco2, 'chronic', paco2Resolution);
      if (acute === null || chronic === null) return NOT_APPLICABLE;
      const expected: ExpectedCompensation = {
        kind: 'metabolic-response',
        quantity: 'hco3-mmol-l',
        observed: hco3,
        acute,
        chronic,
      };
      const inAcute = within(hco3, acute);
      const inChronic = within(hco3, chronic);
      if (inAcute && inChronic) return { compensation: 'appropriate', expected, chronicity: 'acute-or-chronic', additional: NO_DISORDERS };
      if (inAcute) return { compensation: 'appropriate', expected, chronicity: 'acute', additional: NO_DISORDERS };
      if (inChronic) return { compensation: 'appropriate', expected, chronicity: 'chronic', additional: NO_DISORDERS };
      // The response raises HCO3 in respiratory acidosis and lowers it in respiratory alkalosis.
      const acidosis = primary === 'respiratory-acidosis';
      if (sideOf(hco3, acute.high) > 0 && sideOf(hco3, chronic.high) > 0) {
        return { compensation: acidosis ? 'excessive' : 'insufficient', expected, chronicity: null, additional: ONLY_METABOLIC_ALKALOSIS };
      }
      if (sideOf(hco3, acute.low) < 0 && sideOf(hco3, chronic.low) < 0) {
        return { compensation: acidosis ? 'insufficient' : 'excessive', expected, chronicity: null, additional: ONLY_METABOLIC_ACIDOSIS };
      }
      // Between the acute and the chronic range.
      return { compensation: 'appropriate', expected, chronicity: 'intermediate', additional: NO_DISORDERS };
    }
    default:
      return NOT_APPLICABLE;
  }
}

// Lists of disorders shared by every classification: the classification copies what it returns.
const NO_DISORDERS: readonly AcidBaseDisorder[] = Object.freeze([]);
const ONLY_RESPIRATORY_ACIDOSIS: readonly AcidBaseDisorder[] = Object.freeze(['respiratory-acidosis']);
const ONLY_RESPIRATORY_ALKALOSIS: readonly AcidBaseDisorder[] = Object.freeze(['respiratory-alkalosis']);
const ONLY_METABOLIC_ACIDOSIS: readonly AcidBaseDisorder[] = Object.freeze(['metabolic-acidosis']);
const ONLY_METABOLIC_ALKALOSIS: readonly AcidBaseDisorder[] = Object.freeze(['metabolic-alkalosis']);
const MIXED_ACIDOSIS: readonly AcidBaseDisorder[] = Object.freeze(['metabolic-acidosis', 'respiratory-acidosis']);
const MIXED_ALKALOSIS: readonly AcidBaseDisorder[] = Object.freeze(['metabolic-alkalosis', 'respiratory-alkalosis']);

function primaryDisorders(primary: PrimaryAcidBaseFinding): readonly AcidBaseDisorder[] {
  switch (primary) {
    case 'mixed-acidosis':
      return MIXED_ACIDOSIS;
    case 'mixed-alkalosis':
      return MIXED_ALKALOSIS;
    case 'normal':
    case 'undetermined':
      return NO_DISORDERS;
    case 'metabolic-acidosis':
      return ONLY_METABOLIC_ACIDOSIS;
    case 'metabolic-alkalosis':
      return ONLY_METABOLIC_ALKALOSIS;
    case 'respiratory-acidosis':
      return ONLY_RESPIRATORY_ACIDOSIS;
    case 'respiratory-alkalosis':
      return ONLY_RESPIRATORY_ALKALOSIS;
  }
}

/**
 * A list of one's own to add to (`slice` takes a slow path on the shared, frozen lists). Made at
 * its length: a list grown by push from empty takes room for 17 entries, and most hold one.
 */
function copyOf(list: readonly AcidBaseDisorder[]): AcidBaseDisorder[] {
  if (list.length === 0) return [];
  const copy = new Array<AcidBaseDisorder>(list.length);
  for (let i = 0; i < list.length; i++) copy[i] = list[i]!;
  return copy;
}

/**
 * Whether the component that compensates a single primary disorder has moved beyond its
 * reference interval, the way the compensation moves it: PaCO2 below 35 mmHg for a metabolic
 * acidosis and above 45 for a metabolic alkalosis (compared at the resolution the PaCO2 was
 * written with), HCO3 above 26 mmol/L for a respiratory acidosis and below 22 for a respiratory
 * alkalosis. Source: `compensation-terms`.
 */
function compensatorMoved(primary: PrimaryAcidBaseFinding, paco2: number, hco3: number, paco2Resolution: number): boolean {
  switch (primary) {
    case 'metabolic-acidosis':
      return sideOf(paco2, PACO2_NORMAL_MMHG.low, paco2Resolution) < 0;
    case 'metabolic-alkalosis':
      return sideOf(paco2, PACO2_NORMAL_MMHG.high, paco2Resolution) > 0;
    case 'respiratory-acidosis':
      return hco3 > HCO3_NORMAL_MMOL_L.high;
    case 'respiratory-alkalosis':
      return hco3 < HCO3_NORMAL_MMOL_L.low;
    default:
      return false;
  }
}

/** Whether a disorder is among the primary ones or those added so far. */
function identifiedIn(d: AcidBaseDisorder, fromPrimary: readonly AcidBaseDisorder[], additional: readonly AcidBaseDisorder[]): boolean {
  return fromPrimary.includes(d) || additional.includes(d);
}

/**
 * Classifies an arterial gas by the physiological stepwise approach (`berend-2014`):
 * 1. pH status against 7.35–7.45; PaCO2 against 35–45 mmHg; HCO3 against 22–26 mmol/L
 *    (`acid-base-reference-intervals`).
 * 2. Primary finding (see PrimaryAcidBaseFinding): the component moving pH its way; both →
 *    mixed; with a normal pH and a compensating pair, the component on the pH's side of 7.40.
 * 3. Compensation against the expected range: Winters' formula (`winters-1967`) for metabolic
 *    acidosis; 40 + 0.7 × (HCO3 − 24) ± 2 for metabolic alkalosis (`berend-2014`); the span of
 *    published coefficients ± 2 mmol/L for respiratory disorders, which also gives acute,
 *    chronic or intermediate (`narins-emmett-1980`, `adrogue-madias-2010`). A response outside
 *    the range suggests a second disorder.
 * 4. With an anion gap: a gap above 12 mmol/L adds a high-gap metabolic acidosis if none is
 *    identified yet (beside a primary metabolic alkalosis with an alkalaemia, only a gap more than
 *    4 mmol/L above 12: a smaller rise is the alkalaemia's own, `madias-1979`); the delta ratio (`rastegar-2007`) refines it (< 0.8 also a normal-gap
 *    acidosis; > 2, or a high gap with HCO3 ≥ 24, a metabolic alkalosis unless a respiratory
 *    acidosis explains the high HCO3). A metabolic disorder so added beside a respiratory primary
 *    moves the HCO3 too: no timing is read from it, and the gas is not called fully compensated.
 * 5. Internal consistency of reported HCO3 against Henderson–Hasselbalch (HCO3_CONSISTENCY_TOLERANCE).
 * The result is still given for an inconsistent gas; callers should show `consistency` first.
 * `null` unless 0 ≤ pH ≤ 14, PaCO2 > 0, HCO3 > 0, and a given anion gap is finite.
 */
export function classifyAcidBase(input: AcidBaseInput): AcidBaseClassification | null {
  const { ph, paco2Mmhg: paco2, hco3MmolL: hco3, anionGapMmolL: gap } = input;
  const gapHco3 = input.gapHco3MmolL ?? hco3;
  if (!validPh(ph) || !allFinite(paco2, hco3) || paco2 <= 0 || hco3 <= 0) return null;
  if (gap !== undefined && !allFinite(gap)) return null;
  if (!allFinite(gapHco3) || gapHco3 <= 0) return null;
  const resolution = input.paco2ResolutionMmhg !== undefined && allFinite(input.paco2ResolutionMmhg) && input.paco2ResolutionMmhg > 0 ? input.paco2ResolutionMmhg : 0;
  const consistency = acidBaseConsistency(ph, paco2, hco3, resolution);
  if (consistency === null) return null;

  const phStatus: PhStatus = ph < PH_NORMAL.low ? 'acidaemia' : ph > PH_NORMAL.high ? 'alkalaemia' : 'normal';
  const primary = primaryFinding(ph, paco2, hco3, resolution);
  const { compensation, expected, chronicity, additional: fromCompensation } = compensationFor(primary, paco2, hco3, resolution);

  const fromPrimary = primaryDisorders(primary);
  const additional: AcidBaseDisorder[] = copyOf(fromCompensation);

  let anionGapFinding: AnionGapFinding | null = null;
  if (gap !== undefined) {
    // A gap of 12 on paper (135 − 100.1 − 22.9, 12.000000000000007 in floating point) is not high.
    const high = sideOf(gap, ANION_GAP_UPPER_NORMAL_MMOL_L) > 0;
    const ratio = deltaRatio(gap, gapHco3);
    const band = ratio === null ? null : deltaRatioBand(ratio);
    const acidosisBefore = identifiedIn('metabolic-acidosis', fromPrimary, additional);
    let kind: MetabolicAcidosisKind | null = null;
    // A modest rise beside a primary metabolic alkalosis is the alkalaemia's own (`madias-1979`).
    // Only with an alkalaemia: the rise comes from the raised pH (and the volume contraction with it).
    const raisedByAlkalosis = high && primary === 'metabolic-alkalosis' && phStatus === 'alkalaemia' && sideOf(gap, ANION_GAP_UPPER_NORMAL_MMOL_L + ALKALOSIS_ANION_GAP_MARGIN_MMOL_L) <= 0;
    if (raisedByAlkalosis) {
      // Nothing is added: the alkalosis is the primary, and the gap is its own.
    } else if (high) {
      kind = band === 'normal-gap-acidosis' || band === 'mixed-high-and-normal-gap-acidosis' ? 'mixed-anion-gap' : 'high-anion-gap';
      if (!acidosisBefore) additional.push('metabolic-acidosis');
      const hco3HigherThanGapExplains = ratio === null || band === 'high-gap-acidosis-with-alkalosis';
      if (hco3HigherThanGapExplains && !identifiedIn('respiratory-acidosis', fromPrimary, additional) && !identifiedIn('metabolic-alkalosis', fromPrimary, additional)) {
        additional.push('metabolic-alkalosis');
      }
    } else if (acidosisBefore) {
      kind = 'normal-anion-gap';
    }
    anionGapFinding = { valueMmolL: gap, high, deltaRatio: ratio, deltaRatioBand: band, metabolicAcidosisKind: kind, raisedByAlkalosis };
  }

  const disorders: AcidBaseDisorder[] = copyOf(fromPrimary);
  for (let i = 0; i < additional.length; i++) if (!disorders.includes(additional[i]!)) disorders.push(additional[i]!);
  const singlePrimary = fromPrimary.length === 1;
  // A respiratory primary whose HCO3 fell in an expected range (a timing was read), beside a metabolic
  // disorder the anion gap adds: that disorder moves the HCO3 too, so the HCO3 tells neither acute
  // from chronic nor a compensation on its own (PaCO2 15 with HCO3 12 and a gap of 26 is a metabolic
  // acidosis beside the respiratory alkalosis, not a chronic one).
  const hco3MovedByGap = chronicity !== null && (additional.includes('metabolic-acidosis') || additional.includes('metabolic-alkalosis'));

  return {
    phStatus,
    primary,
    compensation,
    fullyCompensated: phStatus === 'normal' && singlePrimary && compensation === 'appropriate' && !hco3MovedByGap && compensatorMoved(primary, paco2, hco3, resolution),
    expected,
    respiratoryChronicity: hco3MovedByGap ? null : chronicity,
    additional,
    disorders,
    anionGap: anionGapFinding,
    consistency,
  };
}

/**
 * How far (pH units) a peripheral venous pH runs below the arterial pH of the same moment: about
 * 0.03 (pooled differences 0.033 and 0.035, with narrow limits of agreement). Sources: `bloom-2014`, `kelly-2010`.
 */
export const VENOUS_PH_BELOW_ARTERIAL = 0.03;

/**
 * The arterial pH a venous pH stands for: the venous pH plus `VENOUS_PH_BELOW_ARTERIAL`. An
 * estimate for reading acidaemia or alkalaemia, never a substitute for an arterial gas.
 * `null` unless 0 ≤ pH ≤ 14. Sources: `bloom-2014`, `kelly-2010`.
 */
export function arterialPhFromVenous(venousPh: number): number | null {
  if (!validPh(venousPh)) return null;
  return finiteOrNull(venousPh + VENOUS_PH_BELOW_ARTERIAL);
}

/** A venous PCO2 (mmHg) above this leaves arterial hypercapnia (PaCO2 above 50 mmHg) possible. Source: `kelly-2005`. */
export const VENOUS_PCO2_SCREEN_MMHG = 45;

/** What a venous PCO2 says of the arterial one: only a screen, as the two can differ by 20 mmHg either way. */
export type VenousPco2Screen = 'hypercapnia-not-excluded' | 'hypercapnia-unlikely';

/**
 * A venous PCO2 read as a screen for arterial hypercapnia: above 45 mmHg, hypercapnia is not
 * excluded; at or below it, arterial hypercapnia (PaCO2 above 50 mmHg) is unlikely. A value
 * written in kPa is compared at the resolution it was written with (`sideOf`). `null` unless
 * PvCO2 > 0. Sources: `kelly-2005`, `bloom-2014`.
 */
export function venousPco2Screen(pvco2Mmhg: number, resolutionMmhg = 0): VenousPco2Screen | null {
  if (!allFinite(pvco2Mmhg, resolutionMmhg) || pvco2Mmhg <= 0) return null;
  return sideOf(pvco2Mmhg, VENOUS_PCO2_SCREEN_MMHG, resolutionMmhg) > 0 ? 'hypercapnia-not-excluded' : 'hypercapnia-unlikely';
}

/**
 * Base excess: the standard base excess of the extracellular fluid (SBE) and the actual base excess
 * of blood (ABE), both as the CLSI guideline has them (`van-slyke-sbe`: the SBE's form read in
 * December 2026 in a published study's table, the ABE's constants from memory; the general form, and
 * another standardisation the ABE is held against, read then too).
 *
 * Hb units: the ABE form takes Hb in g/dL (zero at pH 7.40 and HCO3 24.8 whatever the Hb). Some texts print a form with ctHb in mmol/L (of the monomer; 1 g/dL ≈
 * 0.6206 mmol/L) and other constants. A stated Hb, held in g/dL inside the core, is put in as it is.
 */

/** pH at which a base excess is worked out against (the standard's reference), and the HCO3 base and buffer slope of the SBE, and the HCO3 base of the ABE. Source: `van-slyke-sbe`. */
export const BASE_EXCESS_REFERENCE_PH = 7.4;
export const SBE_HCO3_BASE_MMOL_L = 24.8;
export const SBE_BUFFER_SLOPE = 16.2;
const ABE_HCO3_BASE = 24.8;

/**
 * The Hb span (g/dL) the actual base excess is taken over when no Hb is stated: from a severe
 * anaemia that still needs no transfusion to a high normal value in men. Common practice, no
 * source (`pneumark-base-excess-tolerance`).
 */
export const BASE_EXCESS_HB_SPAN_G_DL: NumericRange = Object.freeze({ low: 7, high: 17 });

/**
 * How far (± mmol/L) a stated base excess may lie beyond the span of the standard and the actual
 * base excess and still agree with the pH and HCO3: analysers differ in the form they print (SBE
 * or ABE, ECF Hb 3 or 5 mmol/L, their own constants), a pH rounded to 0.01 moves the SBE by about
 * 0.16 mmol/L and an HCO3 rounded to 1 mmol/L by about 0.5; ±3 leaves room for these together
 * while a sign written wrong or a value from another gas (most differ by more) is still caught.
 * Common practice, no source (`pneumark-base-excess-tolerance`).
 */
export const BASE_EXCESS_TOLERANCE_MMOL_L = 3;

/**
 * Standard base excess (mmol/L): HCO3 − 24.8 + 16.2 × (pH − 7.40). Negative for a base deficit.
 * `null` unless 0 ≤ pH ≤ 14 and HCO3 ≥ 0. Source: `van-slyke-sbe`.
 */
export function standardBaseExcess(ph: number, hco3MmolL: number): number | null {
  if (!validPh(ph) || !allFinite(hco3MmolL) || hco3MmolL < 0) return null;
  return finiteOrNull(hco3MmolL - SBE_HCO3_BASE_MMOL_L + SBE_BUFFER_SLOPE * (ph - BASE_EXCESS_REFERENCE_PH));
}

/**
 * Actual (blood) base excess (mmol/L), Hb in g/dL: (1 − 0.014 × Hb) × (HCO3 − 24.8 + (1.43 × Hb
 * + 7.7) × (pH − 7.40)). `null` unless 0 ≤ pH ≤ 14, HCO3 ≥ 0 and 0 < Hb ≤ 50 g/dL (the factor
 * 1 − 0.014 × Hb stays positive). Source: `van-slyke-sbe`.
 */
export function actualBaseExcess(ph: number, hco3MmolL: number, hbGdl: number): number | null {
  if (!validPh(ph) || !allFinite(hco3MmolL, hbGdl) || hco3MmolL < 0 || hbGdl <= 0 || hbGdl > 50) return null;
  return finiteOrNull((1 - 0.014 * hbGdl) * (hco3MmolL - ABE_HCO3_BASE + (1.43 * hbGdl + 7.7) * (ph - BASE_EXCESS_REFERENCE_PH)));
}

/**
 * The span (mmol/L) from the lowest to the highest base excess the pH and HCO3 give: the standard
 * base excess and the actual one, the latter at the stated Hb (g/dL) or, with none (`null`), over
 * every Hb of BASE_EXCESS_HB_SPAN_G_DL (the actual base excess is a quadratic in Hb: its ends and,
 * where it falls inside, its turning point). `null` where either form is; a given Hb must be usable
 * by `actualBaseExcess`. Source: `van-slyke-sbe`.
 */
export function baseExcessSpan(ph: number, hco3MmolL: number, hbGdl: number | null = null): NumericRange | null {
  const sbe = standardBaseExcess(ph, hco3MmolL);
  if (sbe === null) return null;
  let low = sbe;
  let high = sbe;
  const take = (hb: number): boolean => {
    const abe = actualBaseExcess(ph, hco3MmolL, hb);
    if (abe === null) return false;
    if (abe < low) low = abe;
    if (abe > high) high = abe;
    return true;
  };
  if (hbGdl !== null) {
    if (!take(hbGdl)) return null;
    return { low, high };
  }
  const span = BASE_EXCESS_HB_SPAN_G_DL;
  if (!take(span.low) || !take(span.high)) return null;
  // ABE = A + (B − 0.014 A) × Hb − 0.014 B × Hb², with A = HCO3 − 24.8 + 7.7 × (pH − 7.40) and
  // B = 1.43 × (pH − 7.40): a turning point at Hb = (B − 0.014 A) ÷ (0.028 B) where B ≠ 0.
  const x = ph - BASE_EXCESS_REFERENCE_PH;
  const a = hco3MmolL - ABE_HCO3_BASE + 7.7 * x;
  const b = 1.43 * x;
  if (b !== 0) {
    const turning = (b - 0.014 * a) / (0.028 * b);
    if (Number.isFinite(turning) && turning > span.low && turning < span.high) take(turning);
  }
  return { low, high };
}

/**
 * Whether a stated base excess (mmol/L) agrees with a span from `baseExcessSpan`: within it widened by
 * BASE_EXCESS_TOLERANCE_MMOL_L on both sides, ends included as on paper (`sideOf`).
 * Source: `pneumark-base-excess-tolerance`.
 */
export function baseExcessAgrees(statedMmolL: number, span: NumericRange): boolean {
  if (!allFinite(statedMmolL, span.low, span.high)) return false;
  return sideOf(statedMmolL, span.low - BASE_EXCESS_TOLERANCE_MMOL_L) >= 0 && sideOf(statedMmolL, span.high + BASE_EXCESS_TOLERANCE_MMOL_L) <= 0;
}
