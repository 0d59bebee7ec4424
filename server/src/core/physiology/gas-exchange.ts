/**
 * Gas exchange: alveolar gas equation, A–a gradient, oxygenation ratios and indices, and the
 * oxygen dissociation curve.
 *
 * Units: gas pressures mmHg, airway pressures cmH2O, FiO2 a fraction 0–1, SpO2 percent 0–100,
 * respiratory rate per minute, age in years. Every function returns `null` (never NaN or
 * ±Infinity, never throws) when an input is non-finite or outside the stated domain.
 */
import { allFinite, finiteOrNull, forBand, inClosedRange, isFio2Fraction, isPercent } from './numeric';

/** Citations for the formulas in this module (key → citation). */
export const SOURCES = Object.freeze({
  'arterial-end-tidal-co2':
    'Arterial to end-tidal CO2 difference P(a–et)CO2 = PaCO2 − EtCO2: usually about 2–5 mmHg and wider with more alveolar dead space (pulmonary embolism, low cardiac output): normally less than 5 mmHg, and raised by such dead space, with the AARC guideline below as its reference, read in its reproduction in Malley WJ, Clinical Blood Gases: Assessment and Intervention, 2nd edition, 2005, pages 406–415, as quoted at sagamigaoka-ac.com; the usual 2–5 mmHg, its lower figure included, read at derangedphysiology.com (its notes for the CICM primary exam, "Difference between end-tidal and arterial PCO2", which give Satoh and coauthors, 2015, as their source) and on Medtronic\'s capnography page "Understanding the gap" (medtronic.com/dcp/en-us/blog), neither of them the guideline; McArthur CD. AARC Clinical Practice Guideline. Capnography/capnometry during mechanical ventilation, 2003 revision & update. Respir Care 2003;48(5):534–539 (its title and citation read on its page at rcjournal.com/cpgs/05.03.0534.html, its author in the National Guideline Clearinghouse summary of its 2011 update; its own text on the gradient not read here); Hatle L, Rokseth R. The arterial to end-expiratory carbon dioxide tension gradient in acute pulmonary embolism and other cardiopulmonary diseases. Chest 1974;66:352–357 (as cited, not read here).',
  'alveolar-gas-equation':
    'Fenn WO, Rahn H, Otis AB. A theoretical study of the composition of the alveolar air at altitude. Am J Physiol 1946;146:637–653; Riley RL, Cournand A. "Ideal" alveolar air and the analysis of ventilation-perfusion relationships in the lungs. J Appl Physiol 1949;1:825–847 (both from memory). The simplified form with R = 0.8 is common practice. A worked value read (December 2026): air at sea level at 37 °C, 760 mmHg, water vapour 47 mmHg, PaCO2 36 mmHg and R 0.8 give an alveolar PO2 of 107 mmHg, among the sample values of the English Wikipedia article Alveolar gas equation (its copy at primidi.com); the full form here gives 106.6, the simplified 104.7.',
  'aa-gradient-age-rules':
    'Upper normal A–a gradient age/4 + 4 and (age + 10)/4: common practice, no source.',
  'mellemgaard-1966':
    'Mellemgaard K. The alveolar-arterial oxygen difference: its size and components in normal man. Acta Physiol Scand 1966;67:10–20 (the citation and its upper normal, 2.5 + 0.21 × age mmHg, from memory).',
  'gilbert-keighley-1974':
    'Gilbert R, Keighley JF. The arterial/alveolar oxygen tension ratio: an index of gas exchange applicable to varying inspired oxygen concentrations. Am Rev Respir Dis 1974;109(1):142–145 (the paper from memory). The ratio as arterial over alveolar PO2, unaffected by FiO2 or barometric pressure, and one above 75 % probably normal, read in the chapter on oxygen tension-based indices of oxygenation at derangedphysiology.com (December 2026).',
  'berlin-2012':
    'ARDS Definition Task Force (Ranieri VM et al.). Acute respiratory distress syndrome: the Berlin Definition. JAMA 2012;307(23):2526–2533, doi 10.1001/jama.2012.5669: the paper itself not read here; its oxygenation bands with PEEP or CPAP of at least 5 cmH2O (200 < P/F ≤ 300, 100 < P/F ≤ 200, P/F ≤ 100) and its altitude correction above 1,000 m, P/F × PB/760, read in its table as adapted in Crit Care 2012 (ccforum.biomedcentral.com/articles/10.1186/cc11867/tables/1), the citation in the Merck Manual\'s table adapted from it.',
  'rice-2007':
    'Rice TW, Wheeler AP, Bernard GR, Hayden DL, Schoenfeld DA, Ware LB. Comparison of the SpO2/FIO2 ratio and the PaO2/FIO2 ratio in patients with acute lung injury or ARDS. Chest 2007;132(2):410–417: S/F = 64 + 0.84 × P/F in SpO2 below 97 %, S/F 235 corresponding to P/F 200 and 315 to P/F 300 (read in its abstract; the journal, volume and pages from memory).',
  'roca-2016':
    'Roca O, Messika J, Caralt B, et al. Predicting success of high-flow nasal cannula in pneumonia patients with hypoxemic respiratory failure: the utility of the ROX index. J Crit Care 2016;35:200–205, doi 10.1016/j.jcrc.2016.05.022 (its authors, title, journal, year and doi read on the first page of its accepted manuscript, in a copy at scribd.com, December 2026; the volume and pages from memory).',
  'roca-2019':
    'Roca O, Caralt B, Messika J, et al. An index combining respiratory rate and oxygenation to predict outcome of nasal high-flow therapy. Am J Respir Crit Care Med 2019;199(11):1368–1376, doi 10.1164/rccm.201803-0589OC: ROX ≥ 4.88 at 2, 6 or 12 h of high flow associated with a lower risk of intubation, and < 2.85, < 3.47 and < 3.85 at 2, 6 and 12 h predicting failure (read in its abstract on atsjournals.org; the title from memory).',
  'ortiz-1987':
    'Ortiz RM, Cilley RE, Bartlett RH. Extracorporeal membrane oxygenation in pediatric respiratory failure. Pediatr Clin North Am 1987;34(1):39–46 (oxygenation index): the citation read on pure.psu.edu, whose abstract does not give the index; OI = FiO2 × MAP × 100 ÷ PaO2 read in its use for the PALICC bands (4 to under 8, 8 to under 16, 16 or more) in table 1 of a 2022 review in BJA Education (22(9):364–370, doi 10.1016/j.bjae.2022.04.004, PMC9217163); the same form (FiO2 × mean airway pressure) ÷ PaO2 read in the abstract of Thomas NJ and coauthors, Pediatr Crit Care Med 2010;11(1):12–17, PMC2936504.',
  'palicc-2015':
    'Pediatric Acute Lung Injury Consensus Conference Group. Pediatric acute respiratory distress syndrome: consensus recommendations. Pediatr Crit Care Med 2015;16(5):428–439 (oxygenation index and oxygen saturation index, SpO2 ≤ 97 %): the citation as listed in the references of pages citing it; the consensus itself not read here, its OI and OSI bands (OI 4–8, 8–16, 16 or more; OSI 5–7.5, 7.5–12.3, 12.3 or more) read in its table as reproduced in table 1 at pmc.ncbi.nlm.nih.gov/articles/PMC6589490 (Pediatr Allergy Immunol Pulmonol 2019;32:35–44); the SpO2 limit, SpO2 to be 97 % or less wherever SpO2 is used, read in a footnote of table 5 of the second conference (PALICC-2) at pmc.ncbi.nlm.nih.gov/articles/PMC9848214, its title and journal not read here.',
  'severinghaus-1979':
    'Severinghaus JW. Simple, accurate equations for human blood O2 dissociation computations. J Appl Physiol 1979;46(3):599–602: S = (((PO2³ + 150 × PO2)^−1 × 23,400) + 1)^−1, within ±0.0055 of the standard curve (read in its abstract on jap.physiology.org).',
  'ellis-1989':
    'Ellis RK. Determination of PO2 from saturation. J Appl Physiol 1989;67(2):902, doi 10.1152/jappl.1989.67.2.902 (letter, with a reply by Severinghaus; not read here): its exact inversion of the Severinghaus equation, PO2 = ∛(A + √(50³ + A²)) + ∛(A − √(50³ + A²)) mmHg with A = 11,700 ÷ (1/S − 1), read in its reproduction in the R package acutelines.datatoolbox of the University Medical Center Groningen (UMCG-SEH/acutelines.datatoolbox, R/respiration.r, spo2_to_pao2, a version of which names this letter by its doi among its references, with Severinghaus 1979 and Brown and coauthors, Chest 2016, doi 10.1016/j.chest.2016.01.003; in a stored copy of the repository, December 2026); the author, title, volume and page as other public code cites them. The root is taken here as u − 50/u with u = ∛(A + √(A² + 50³)), the same number, since ∛(A − √(50³ + A²)) = −50/u.',
} as const);

/** Default respiratory quotient (R) of the alveolar gas equation. Source: `alveolar-gas-equation`. */
export const DEFAULT_RESPIRATORY_QUOTIENT = 0.8;
/** Reference barometric pressure (mmHg) for the Berlin altitude adjustment of P/F. Source: `berlin-2012`. */
export const SEA_LEVEL_PB_MMHG = 760;
/** The Berlin definition adjusts the P/F for altitude where the altitude is higher than this (m). Source: `berlin-2012`. */
export const BERLIN_ADJUSTED_ABOVE_M = 1000;
/** Highest SpO2 (%) at which the oxygen saturation index is valid. Source: `palicc-2015`. */
export const OSI_MAX_SPO2_PERCENT = 97;

/** Rules for the age-dependent upper normal of the A–a gradient. */
export type AaGradientAgeRule = 'age-over-4-plus-4' | 'age-plus-10-over-4' | 'mellemgaard';

/**
 * Berlin definition oxygenation bands (our own names; the Berlin definition calls them mild,
 * moderate and severe ARDS, which also needs PEEP/CPAP ≥ 5 cmH2O and the other criteria).
 */
export type BerlinOxygenationBand = 'pf-200-to-300' | 'pf-100-to-200' | 'pf-100-or-below';

/** The Berlin definition's own severity word for each band. Source: `berlin-2012`. */
export const BERLIN_BAND_SEVERITY: Readonly<Record<BerlinOxygenationBand, 'mild' | 'moderate' | 'severe'>> =
  Object.freeze({ 'pf-200-to-300': 'mild', 'pf-100-to-200': 'moderate', 'pf-100-or-below': 'severe' });

function validRq(rq: number): boolean {
  return Number.isFinite(rq) && rq > 0;
}

/**
 * Alveolar PO2 (mmHg), simplified alveolar gas equation: PAO2 = PiO2 − PaCO2 / R (R = 0.8 by
 * default). `null` unless PiO2 > 0, PaCO2 ≥ 0, R > 0; also `null` when the result is negative
 * (no alveolar gas can have a negative PO2: the inputs contradict each other).
 * Source: `alveolar-gas-equation`.
 */
export function alveolarPo2Simplified(
  pio2Mmhg: number,
  paco2Mmhg: number,
  rq: number = DEFAULT_RESPIRATORY_QUOTIENT,
): number | null {
  const pAo2 = alveolarPo2SimplifiedSigned(pio2Mmhg, paco2Mmhg, rq);
  return pAo2 === null || pAo2 < 0 ? null : pAo2;
}

/**
 * The simplified alveolar gas equation as computed, negative results included: a negative
 * alveolar PO2 says the PiO2 and PaCO2 stated cannot go together (callers report it).
 * `null` unless PiO2 > 0, PaCO2 ≥ 0, R > 0. Source: `alveolar-gas-equation`.
 */
export function alveolarPo2SimplifiedSigned(pio2Mmhg: number, paco2Mmhg: number, rq: number = DEFAULT_RESPIRATORY_QUOTIENT): number | null {
  if (!allFinite(pio2Mmhg, paco2Mmhg) || pio2Mmhg <= 0 || paco2Mmhg < 0 || !validRq(rq)) return null;
  return finiteOrNull(pio2Mmhg - paco2Mmhg / rq);
}

/**
 * Alveolar PO2 (mmHg), full alveolar gas equation: PAO2 = PiO2 − PaCO2 × [FiO2 + (1 − FiO2) / R].
 * About 2 mmHg above the simplified form on air and 10 mmHg above it on FiO2 1.0.
 * `null` unless 0 < FiO2 ≤ 1, PiO2 > 0, PaCO2 ≥ 0, R > 0, or when the result is negative.
 * Source: `alveolar-gas-equation`.
 */
export function alveolarPo2Full(
  fio2: number,
  pio2Mmhg: number,
  paco2Mmhg: number,
  rq: number = DEFAULT_RESPIRATORY_QUOTIENT,
): number | null {
  const pAo2 = alveolarPo2FullSigned(fio2, pio2Mmhg, paco2Mmhg, rq);
  return pAo2 === null || pAo2 < 0 ? null : pAo2;
}

/**
 * The full alveolar gas equation as computed, negative results included (see
 * `alveolarPo2SimplifiedSigned`). Source: `alveolar-gas-equation`.
 */
export function alveolarPo2FullSigned(fio2: number, pio2Mmhg: number, paco2Mmhg: number, rq: number = DEFAULT_RESPIRATORY_QUOTIENT): number | null {
  if (!isFio2Fraction(fio2) || !allFinite(pio2Mmhg, paco2Mmhg) || !validRq(rq)) return null;
  if (pio2Mmhg <= 0 || paco2Mmhg < 0) return null;
  return finiteOrNull(pio2Mmhg - paco2Mmhg * (fio2 + (1 - fio2) / rq));
}

/**
 * How far (mmHg) the full alveolar gas equation puts the alveolar PO2 above the simplified one with
 * the same inputs: full − simplified = PaCO2 × FiO2 × (1/R − 1), about 2 mmHg on air and 10 mmHg on
 * FiO2 1.0 with PaCO2 40 and R 0.8; 0 where R ≥ 1 (the simplified form is then the higher).
 * `null` unless 0 < FiO2 ≤ 1, PaCO2 ≥ 0, R > 0. Source: `alveolar-gas-equation`.
 */
export function fullFormExcessMmhg(fio2: number, paco2Mmhg: number, rq: number = DEFAULT_RESPIRATORY_QUOTIENT): number | null {
  if (!isFio2Fraction(fio2) || !allFinite(paco2Mmhg) || paco2Mmhg < 0 || !validRq(rq)) return null;
  return finiteOrNull(Math.max(0, paco2Mmhg * fio2 * (1 / rq - 1)));
}

/**
 * Alveolar–arterial PO2 difference (mmHg): PAO2 − PaO2. May be negative (a PaO2 above PAO2 by
 * more than rounding is impossible at the stated FiO2 and pressure; callers flag it).
 * `null` unless both pressures are ≥ 0. Source: `alveolar-gas-equation`.
 */
export function aaGradient(alveolarPo2Mmhg: number, pao2Mmhg: number): number | null {
  if (!allFinite(alveolarPo2Mmhg, pao2Mmhg) || alveolarPo2Mmhg < 0 || pao2Mmhg < 0) return null;
  return finiteOrNull(alveolarPo2Mmhg - pao2Mmhg);
}

/**
 * Upper normal A–a gradient (mmHg, breathing air) for an age in years, by one of three rules:
 * 'age-over-4-plus-4' (default) age/4 + 4 and 'age-plus-10-over-4' (age + 10)/4 (both
 * `aa-gradient-age-rules`, common practice); 'mellemgaard' 2.5 + 0.21 × age (`mellemgaard-1966`).
 * All were derived in adults. `null` unless 0 ≤ age ≤ 130 and the rule is known.
 */
export function aaGradientUpperNormal(
  ageYears: number,
  rule: AaGradientAgeRule = 'age-over-4-plus-4',
): number | null {
  if (!inClosedRange(ageYears, 0, 130)) return null;
  switch (rule) {
    case 'age-over-4-plus-4':
      return finiteOrNull(ageYears / 4 + 4);
    case 'age-plus-10-over-4':
      return finiteOrNull((ageYears + 10) / 4);
    case 'mellemgaard':
      return finiteOrNull(2.5 + 0.21 * ageYears);
    default:
      return null;
  }
}

/**
 * Arterial/alveolar PO2 ratio (a/A, dimensionless): PaO2 / PAO2.
 * `null` unless PaO2 ≥ 0 and PAO2 > 0. Source: `gilbert-keighley-1974`.
 */
export function arterialAlveolarRatio(pao2Mmhg: number, alveolarPo2Mmhg: number): number | null {
  if (!allFinite(pao2Mmhg, alveolarPo2Mmhg) || pao2Mmhg < 0 || alveolarPo2Mmhg <= 0) return null;
  return finiteOrNull(pao2Mmhg / alveolarPo2Mmhg);
}

/**
 * P/F ratio (mmHg): PaO2 / FiO2. `null` unless PaO2 ≥ 0 and 0 < FiO2 ≤ 1. Source: `berlin-2012`.
 */
export function pfRatio(pao2Mmhg: number, fio2: number): number | null {
  if (!allFinite(pao2Mmhg) || pao2Mmhg < 0 || !isFio2Fraction(fio2)) return null;
  return finiteOrNull(pao2Mmhg / fio2);
}

/**
 * P/F ratio adjusted for altitude as the Berlin definition suggests: P/F × PB / 760.
 * `null` unless P/F ≥ 0 and PB > 0. Source: `berlin-2012`.
 */
export function pfRatioAltitudeAdjusted(pfRatioMmhg: number, pbMmhg: number): number | null {
  if (!allFinite(pfRatioMmhg, pbMmhg) || pfRatioMmhg < 0 || pbMmhg <= 0) return null;
  return finiteOrNull((pfRatioMmhg * pbMmhg) / SEA_LEVEL_PB_MMHG);
}

/**
 * Berlin definition oxygenation band of a P/F ratio (mmHg): 200 < P/F ≤ 300 → 'pf-200-to-300',
 * 100 < P/F ≤ 200 → 'pf-100-to-200', P/F ≤ 100 → 'pf-100-or-below'; `null` above 300, for a
 * negative or non-finite value. The band alone is not a diagnosis of ARDS. Source: `berlin-2012`.
 */
export function berlinOxygenationBand(pfRatioMmhg: number): BerlinOxygenationBand | null {
  if (!allFinite(pfRatioMmhg)) return null;
  const pf = forBand(pfRatioMmhg);
  if (pf < 0 || pf > 300) return null;
  if (pf > 200) return 'pf-200-to-300';
  if (pf > 100) return 'pf-100-to-200';
  return 'pf-100-or-below';
}

/**
 * S/F ratio: SpO2 (%) / FiO2. S/F 235 corresponds to P/F 200 and S/F 315 to P/F 300 (`rice-2007`).
 * `null` unless 0 ≤ SpO2 ≤ 100 and 0 < FiO2 ≤ 1. Source: `rice-2007`.
 */
export function sfRatio(spo2Percent: number, fio2: number): number | null {
  if (!isPercent(spo2Percent) || !isFio2Fraction(fio2)) return null;
  return finiteOrNull(spo2Percent / fio2);
}

/**
 * ROX index: (SpO2 (%) / FiO2) / respiratory rate. ≥ 4.88 at 12 h of high-flow oxygen was
 * associated with success. `null` unless 0 ≤ SpO2 ≤ 100, 0 < FiO2 ≤ 1 and RR > 0.
 * Sources: `roca-2016`, `roca-2019`.
 */
export function roxIndex(spo2Percent: number, fio2: number, respiratoryRatePerMin: number): number | null {
  if (!isPercent(spo2Percent) || !isFio2Fraction(fio2)) return null;
  if (!allFinite(respiratoryRatePerMin) || respiratoryRatePerMin <= 0) return null;
  return finiteOrNull(spo2Percent / fio2 / respiratoryRatePerMin);
}

/** A ROX index at or above this at 2, 6 or 12 h of high flow was associated with success (`roca-2019`). */
export const ROX_SUCCESS_FROM = 4.88;

/** The hours of high flow the ROX thresholds were given for, each with the ROX below which failure was predicted (`roca-2019`). */
export const ROX_FAILURE_BELOW: ReadonlyMap<number, number> = new Map([[2, 2.85], [6, 3.47], [12, 3.85]]);

/**
 * How far (h) from 2, 6 or 12 h of high flow a ROX index is still read against that hour's
 * thresholds: a charted round seldom falls on the hour (common practice, no source). The windows
 * (1–3, 5–7 and 11–13 h) do not meet.
 */
export const ROX_HOUR_WINDOW_H = 1;

/** The hour of the ROX thresholds (2, 6 or 12: `roca-2019`) that `hours` of high flow are read against, or null (`ROX_HOUR_WINDOW_H`). */
export function roxThresholdHour(hours: number): number | null {
  if (!Number.isFinite(hours)) return null;
  for (const hour of ROX_FAILURE_BELOW.keys()) if (Math.abs(hours - hour) <= ROX_HOUR_WINDOW_H) return hour;
  return null;
}

/** Where a ROX index falls against the thresholds of `hour` (2, 6 or 12 h): below failure's, at or above success's, or between (`roca-2019`). */
export function roxSideAt(rox: number, hour: number): 'failure' | 'between' | 'success' | null {
  const failure = ROX_FAILURE_BELOW.get(hour);
  if (failure === undefined || !Number.isFinite(rox)) return null;
  return rox < failure ? 'failure' : rox >= ROX_SUCCESS_FROM ? 'success' : 'between';
}

/**
 * Oxygenation index: FiO2 × mean airway pressure (cmH2O) × 100 / PaO2 (mmHg).
 * `null` unless 0 < FiO2 ≤ 1, MAP ≥ 0 and PaO2 > 0. Sources: `ortiz-1987`, `palicc-2015`.
 */
export function oxygenationIndex(fio2: number, meanAirwayPressureCmh2o: number, pao2Mmhg: number): number | null {
  if (!isFio2Fraction(fio2) || !allFinite(meanAirwayPressureCmh2o, pao2Mmhg)) return null;
  if (meanAirwayPressureCmh2o < 0 || pao2Mmhg <= 0) return null;
  return finiteOrNull((fio2 * meanAirwayPressureCmh2o * 100) / pao2Mmhg);
}

/**
 * Oxygen saturation index: FiO2 × mean airway pressure (cmH2O) × 100 / SpO2 (%).
 * Valid only for SpO2 ≤ 97 % (the flat top of the curve hides oxygenation): `null` above 97,
 * and unless 0 < FiO2 ≤ 1, MAP ≥ 0 and SpO2 > 0. Source: `palicc-2015`.
 */
export function oxygenSaturationIndex(
  fio2: number,
  meanAirwayPressureCmh2o: number,
  spo2Percent: number,
): number | null {
  if (!isFio2Fraction(fio2) || !allFinite(meanAirwayPressureCmh2o) || meanAirwayPressureCmh2o < 0) return null;
  if (!isPercent(spo2Percent) || spo2Percent <= 0 || spo2Percent > OSI_MAX_SPO2_PERCENT) return null;
  return finiteOrNull((fio2 * meanAirwayPressureCmh2o * 100) / spo2Percent);
}

/**
 * Haemoglobin O2 saturation (a FRACTION 0–1) from PO2 (mmHg) for standard human blood
 * (pH 7.40, 37 °C, P50 26.8 mmHg), Severinghaus' equation:
 * S = 1 / (23400 / (PO2³ + 150·PO2) + 1). `null` for a negative PO2. Source: `severinghaus-1979`.
 */
export function saturationFromPo2Severinghaus(po2Mmhg: number): number | null {
  if (!allFinite(po2Mmhg) || po2Mmhg < 0) return null;
  if (po2Mmhg === 0) return 0;
  const cubicTerm = po2Mmhg * po2Mmhg * po2Mmhg + 150 * po2Mmhg;
  return finiteOrNull(1 / (23400 / cubicTerm + 1));
}

/**
 * ESTIMATED PO2 (mmHg) from a saturation FRACTION (0–1): the exact real root of the
 * Severinghaus equation, x³ + 150x = 23400·S/(1 − S), solved by Cardano's formula
 * (x = u − 50/u with u = ∛(a + √(a² + 50³)), a = 11700·S/(1 − S)). It assumes standard blood
 * (pH 7.40, 37 °C, normal P50), so any PaO2 inferred from SpO2 is an estimate and must be
 * labelled as one. `null` unless 0 ≤ S < 1. Sources: `ellis-1989`, `severinghaus-1979`.
 */
export function po2FromSaturation(saturationFraction: number): number | null {
  if (!allFinite(saturationFraction) || saturationFraction < 0 || saturationFraction >= 1) return null;
  if (saturationFraction === 0) return 0;
  const a = (11700 * saturationFraction) / (1 - saturationFraction);
  const u = Math.cbrt(a + Math.sqrt(a * a + 125000));
  const po2 = u - 50 / u;
  return finiteOrNull(Math.max(0, po2));
}

/**
 * Arterial to end-tidal CO2 difference (mmHg): PaCO2 − EtCO2, both in mmHg. Negative values are
 * kept (an EtCO2 above the PaCO2 is seen at times). `null` unless both are ≥ 0. Source:
 * `arterial-end-tidal-co2`.
 */
export function arterialEndTidalCo2Difference(paco2Mmhg: number, etco2Mmhg: number): number | null {
  if (!allFinite(paco2Mmhg, etco2Mmhg) || paco2Mmhg < 0 || etco2Mmhg < 0) return null;
  return finiteOrNull(paco2Mmhg - etco2Mmhg);
}
