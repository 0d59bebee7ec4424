/**
 * Ventilation and respiratory mechanics: minute ventilation, predicted body weight, driving
 * pressure, compliance, resistance, mechanical power and ventilatory ratio.
 *
 * Units: volumes mL (minute ventilation out in L/min where the name says so), airway pressures
 * cmH2O, flows L/min, PaCO2 mmHg, height cm, weight kg, rate per minute. Every function returns
 * `null` (never NaN or ±Infinity, never throws) when an input is non-finite or outside the
 * stated domain.
 */
import { allFinite, finiteOrNull } from './numeric';

const ARDSNET_2000 =
  'The Acute Respiratory Distress Syndrome Network. Ventilation with lower tidal volumes as compared with traditional tidal volumes for acute lung injury and the acute respiratory distress syndrome. N Engl J Med 2000;342(18):1301–1308';

/** Citations for the formulas in this module (key → citation). */
export const SOURCES = Object.freeze({
  'ardsnet-2000':
    `${ARDSNET_2000} (predicted body weight: male 50 + 0.91 × (height cm − 152.4), female 45.5 + 0.91 × (height cm − 152.4); tidal volume 6 mL/kg, 4–8): the paper itself not read here, its abstract read in its reproduction at themednet.org (an initial tidal volume of 6 mL per kg of predicted body weight against a traditional 12, traditional approaches using 10 to 15 mL per kg of body weight), its per-cm slope 0.91 from memory; the network's protocol card, male 50 + 2.3 × (height in − 60), female 45.5 + 2.3 × (height in − 60), VT 6 mL/kg PBW, at least 4 and at most 8, read in its reproduction at thorax.us/ventilator_settings_pulmonary_me.htm (2.3 per inch is 0.906 per cm, the same to the rounding).`,
  'ardsnet-2000-plateau': `${ARDSNET_2000} (plateau pressure kept at or below 30 cmH2O): the paper not read here; the network's protocol card, plateau pressure goal 30 cmH2O or less, read in its reproduction at thorax.us/ventilator_settings_pulmonary_me.htm.`,
  'amato-2015':
    'Amato MBP, Meade MO, Slutsky AS, et al. Driving pressure and survival in the acute respiratory distress syndrome. N Engl J Med 2015;372(8):747–755: driving pressure ΔP = VT / Crs, a 1-SD increment (about 7 cmH2O) associated with increased mortality, relative risk 1.41 (read in its abstract; the issue number from memory).',
  'respiratory-mechanics':
    'Static compliance VT / (Pplat − PEEP), dynamic compliance VT / (Ppeak − PEEP), resistance (Ppeak − Pplat) / flow in constant-flow volume control, minute ventilation VT × RR: standard respiratory mechanics; common practice, no single source.',
  'compliance-ceiling':
    'Static compliance of the respiratory system in ventilated patients with normal lungs, 50–100 mL/cmH2O (read on the Royal North Shore Hospital intensive care unit\'s teaching page on pressure, rnshicu.org/topic/pressure; a healthy adult\'s lungs and chest wall each about 200 mL/cmH2O, in series about 100: in 24 normal subjects breathing spontaneously, a chest wall of 0.224 L/cmH2O and a whole respiratory system of 0.119 L/cmH2O, so lungs of about 0.25 in series with it, read in the abstract of "Compliance of the respiratory system and its components in health and obesity" at scilit.com, submitted in 1959; its authors and journal, Naimark A and Cherniack RM, J Appl Physiol 1960;15:377–382, from memory). The ceiling of 200 mL/cmH2O above which Pneumark reports a compliance is its own margin, twice the top of that range: common practice, no source.',
  'gattinoni-2016':
    'Gattinoni L, Tonetti T, Cressoni M, et al. Ventilator-related causes of lung injury: the mechanical power. Intensive Care Med 2016;42(10):1567–1575, doi 10.1007/s00134-016-4505-2: mechanical power from the equation of motion multiplied by the change of volume and the rate, which it reports rises with tidal volume, driving pressure and flow squared (read in its abstract on link.springer.com; the full equation, 0.098 × RR × {VT² × [½ × Ers + RR × (1 + I:E) / (60 × I:E) × Raw] + VT × PEEP}, read as quoted in the abstract of Wu SH and coauthors, J Clin Monit Comput 2022, doi 10.1007/s10877-022-00823-3; the simplified form Pneumark uses, 0.098 × RR × VT × (Ppeak − ½ × (Pplat − PEEP)), equals it under constant inspiratory flow, and is not read as such: from memory).',
  'becher-2019':
    'Becher T, van der Staay M, Schädler D, Frerichs I, Weiler N. Calculation of mechanical power for pressure-controlled ventilation. Intensive Care Med 2019 (letter; doi 10.1007/s00134-019-05636-8): the simplified equation assumes volume control with a linear rise of airway pressure and does not suit pressure-controlled breaths (read in its opening paragraph, on link.springer.com/article/10.1007/s00134-019-05636-8; its own equations for those modes not read in full, so not used).',
  'giosa-2019':
    'Giosa L, Busana M, Pasticci I, et al. Mechanical power at a glance: a simple surrogate for volume-controlled ventilation. Intensive Care Med Exp 2019;7:61 (doi 10.1186/s40635-019-0276-8): mechanical power ≈ VE × (Ppeak + PEEP + F/6) ÷ 20 J/min, VE and inspiratory flow F in L/min, pressures in cmH2O, for volume control (read in its abstract, pmc.ncbi.nlm.nih.gov/articles/PMC6879677).',
  'sinha-2009':
    'Sinha P, Fauvel NJ, Singh S, Soni N. Ventilatory ratio: a simple bedside measure of ventilation. Br J Anaesth 2009;102(5):692–697: predicted minute ventilation 100 mL/kg/min of predicted body weight and predicted PaCO2 5 kPa (read in its abstract, profiles.wustl.edu).',
  'sinha-2019':
    'Sinha P, Calfee CS, Beitler JR, et al. Physiologic analysis and clinical performance of the ventilatory ratio in acute respiratory distress syndrome. Am J Respir Crit Care Med 2019;199(3):333–341: ventilatory ratio = minute ventilation (mL/min) × PaCO2 (mmHg) / (PBW × 100 × 37.5) (read in its abstract on scilit.net; the journal, volume and pages from memory).',
  'carteaux-2016':
    'Carteaux G, Millán-Guilarte T, De Prost N, et al. Failure of noninvasive ventilation for de novo acute hypoxemic respiratory failure: role of tidal volume. Crit Care Med 2016 (PMID 26584191, doi 10.1097/CCM.0000000000001379): in 62 patients given NIV for de novo acute hypoxaemic respiratory failure, the expired tidal volume averaged over the NIV sessions had a median of 9.8 mL/kg PBW (8.1–11.1), was higher in those in whom NIV failed than in those in whom it succeeded (10.6 mL/kg PBW, 9.6–12.0, against 8.5, 7.6–10.2) and was independently associated with NIV failure (read in its abstract, in a reproduction of its PubMed record; the cut-off of about 9.5 mL/kg PBW the abstract goes on to give was not read, so Pneumark gives no threshold of it; the volume and pages from memory).',
} as const);

export type Sex = 'male' | 'female';

/**
 * Ventilator modes that deliver mandatory breaths, at least the set number a minute: volume
 * control, pressure control, PRVC and SIMV, volume- or pressure-targeted (common practice, no source). Pressure support and
 * CPAP deliver none; APRV and HFOV are set otherwise: APRV's rate is the release frequency, and
 * with none the patient breathes spontaneously at the high pressure, a CPAP-like state that may be
 * meant (common practice, no source), so a rate of 0 there is no mistake of the kind PN312 reports.
 */
export const MODES_WITH_SET_BREATHS: ReadonlySet<string> = new Set(['VC', 'PC', 'PRVC', 'SIMV', 'SIMV-VC', 'SIMV-PC']);

/**
 * Ventilator modes in which the patient sets the rate of breathing: pressure support and CPAP
 * deliver no mandatory breath, and a rate set there is a backup (apnoea) rate, given only if the
 * patient stops breathing, so it is no rate of breathing and VT × that rate is no minute
 * ventilation (common practice, no source). A measured rate is needed there.
 */
export const MODES_WITH_BACKUP_RATE: ReadonlySet<string> = new Set(['PS', 'CPAP']);

/**
 * The ventilator mode (its canonical word) of high-frequency oscillation: its rate is an
 * oscillation frequency and it gives no conventional breath, so what is worked out from breaths
 * (VT × rate, plateau or peak − PEEP) and the limits of breaths do not apply (common practice, no source).
 */
export const OSCILLATION_MODE = 'HFOV';

/** Plateau pressure limit of the ARDS Network protocol (cmH2O). Source: `ardsnet-2000-plateau`. */
export const PLATEAU_LIMIT_CMH2O = 30;

/** Top of the lung-protective tidal volume range, mL per kg predicted body weight (target 6, range 4–8). Source: `ardsnet-2000`. */
export const LUNG_PROTECTIVE_VT_MAX_ML_PER_KG = 8;

/**
 * The expired tidal volumes during NIV for de novo acute hypoxaemic respiratory failure, mL per kg
 * predicted body weight, medians of the patients in whom NIV failed and of those in whom it
 * succeeded (`carteaux-2016`): shown beside a VT/PBW under NIV as what was associated with failure,
 * not as a limit; PN403's 8 mL/kg is a ventilator's, and does not apply to a breath the patient takes.
 */
export const NIV_VT_MEDIAN_ML_PER_KG = Object.freeze({ failed: 10.6, succeeded: 8.5 });

/** Driving pressure commonly flagged (cmH2O), after `amato-2015`: the flag itself is common practice, no source. */
export const DRIVING_PRESSURE_FLAG_CMH2O = 15;

/** Static compliance (mL/cmH2O) above which Pneumark reports one, twice the top of the normal range. Source: `compliance-ceiling`. */
export const COMPLIANCE_CEILING_ML_PER_CMH2O = 200;

/** Height (cm) at which the ARDSNet formulas give their base weights (60 inches). Source: `ardsnet-2000`. */
export const PBW_REFERENCE_HEIGHT_CM = 152.4;
/** Joules in one L·cmH2O (98.0665 Pa × 0.001 m³ = 0.0980665 J, rounded), the power equation's factor. Source: `gattinoni-2016`. */
export const MECHANICAL_POWER_FACTOR = 0.098;
/** Predicted minute ventilation, mL/min per kg PBW, in the ventilatory ratio. Source: `sinha-2009`. */
export const VENTILATORY_RATIO_VE_ML_PER_KG = 100;
/** Predicted PaCO2 (mmHg) in the ventilatory ratio. Source: `sinha-2009`. */
export const VENTILATORY_RATIO_PACO2_MMHG = 37.5;

/**
 * Minute ventilation (L/min): tidal volume (mL) × rate (/min) ÷ 1000.
 * `null` unless VT ≥ 0 and RR ≥ 0. Source: `respiratory-mechanics`.
 */
export function minuteVentilationLPerMin(vtMl: number, respiratoryRatePerMin: number): number | null {
  if (!allFinite(vtMl, respiratoryRatePerMin) || vtMl < 0 || respiratoryRatePerMin < 0) return null;
  return finiteOrNull((vtMl * respiratoryRatePerMin) / 1000);
}

/**
 * Predicted body weight (kg), ARDS Network: male 50 + 0.91 × (height − 152.4), female
 * 45.5 + 0.91 × (height − 152.4), height in cm. Meant for adults; below 152.4 cm it is an
 * extrapolation and it is not valid for children. `null` unless 0 < height ≤ 300 cm, the sex is
 * known, and the result is > 0. Source: `ardsnet-2000`.
 */
export function predictedBodyWeightKg(heightCm: number, sex: Sex): number | null {
  if (!allFinite(heightCm) || heightCm <= 0 || heightCm > 300) return null;
  let base: number;
  if (sex === 'male') base = 50;
  else if (sex === 'female') base = 45.5;
  else return null;
  const pbw = base + 0.91 * (heightCm - PBW_REFERENCE_HEIGHT_CM);
  return pbw > 0 ? finiteOrNull(pbw) : null;
}

/**
 * Tidal volume per kg predicted body weight (mL/kg): VT ÷ PBW.
 * `null` unless VT ≥ 0 and PBW > 0. Source: `ardsnet-2000`.
 */
export function vtPerKgPbw(vtMl: number, pbwKg: number): number | null {
  if (!allFinite(vtMl, pbwKg) || vtMl < 0 || pbwKg <= 0) return null;
  return finiteOrNull(vtMl / pbwKg);
}

/**
 * Driving pressure (cmH2O): Pplat − PEEP (equal to VT / respiratory-system compliance).
 * `null` unless PEEP ≥ 0 and Pplat ≥ PEEP (a plateau below PEEP is impossible). Source: `amato-2015`.
 */
export function drivingPressure(pplatCmh2o: number, peepCmh2o: number): number | null {
  if (!allFinite(pplatCmh2o, peepCmh2o) || peepCmh2o < 0 || pplatCmh2o < peepCmh2o) return null;
  return finiteOrNull(pplatCmh2o - peepCmh2o);
}

/**
 * Static compliance of the respiratory system (mL/cmH2O): VT / (Pplat − PEEP).
 * `null` unless VT ≥ 0, PEEP ≥ 0 and Pplat > PEEP. Sources: `respiratory-mechanics`, `amato-2015`.
 */
export function complianceStatic(vtMl: number, pplatCmh2o: number, peepCmh2o: number): number | null {
  if (!allFinite(vtMl, pplatCmh2o, peepCmh2o) || vtMl < 0 || peepCmh2o < 0 || pplatCmh2o <= peepCmh2o) return null;
  return finiteOrNull(vtMl / (pplatCmh2o - peepCmh2o));
}

/**
 * Dynamic compliance (mL/cmH2O): VT / (Ppeak − PEEP).
 * `null` unless VT ≥ 0, PEEP ≥ 0 and Ppeak > PEEP. Source: `respiratory-mechanics`.
 */
export function complianceDynamic(vtMl: number, ppeakCmh2o: number, peepCmh2o: number): number | null {
  if (!allFinite(vtMl, ppeakCmh2o, peepCmh2o) || vtMl < 0 || peepCmh2o < 0 || ppeakCmh2o <= peepCmh2o) return null;
  return finiteOrNull(vtMl / (ppeakCmh2o - peepCmh2o));
}

/**
 * Inspiratory airway resistance (cmH2O·s/L): (Ppeak − Pplat) / flow, flow converted from L/min
 * to L/s. Valid for constant-flow volume control only. `null` unless Pplat ≥ 0, Ppeak ≥ Pplat and
 * flow > 0. Source: `respiratory-mechanics`.
 */
export function airwayResistance(ppeakCmh2o: number, pplatCmh2o: number, flowLPerMin: number): number | null {
  if (!allFinite(ppeakCmh2o, pplatCmh2o, flowLPerMin)) return null;
  if (pplatCmh2o < 0 || ppeakCmh2o < pplatCmh2o || flowLPerMin <= 0) return null;
  return finiteOrNull((ppeakCmh2o - pplatCmh2o) / (flowLPerMin / 60));
}

/**
 * The ventilator mode (its canonical word) whose breaths the simplified equation of mechanical power
 * describes: volume control, with a constant inspiratory flow, the airway pressure rising in a
 * straight line. It does not suit pressure-controlled or -supported breaths. Sources:
 * `gattinoni-2016`, `becher-2019`.
 */
export const MECHANICAL_POWER_MODE = 'VC';

/**
 * Mechanical power (J/min), simplified equation for volume control (`MECHANICAL_POWER_MODE`):
 * 0.098 × RR × VT (L) × (Ppeak − ½ × (Pplat − PEEP)).
 * `null` unless RR ≥ 0, VT ≥ 0, PEEP ≥ 0, Pplat ≥ PEEP and Ppeak ≥ Pplat. Source: `gattinoni-2016`.
 */
export function mechanicalPowerSimplified(
  respiratoryRatePerMin: number,
  vtMl: number,
  ppeakCmh2o: number,
  pplatCmh2o: number,
  peepCmh2o: number,
): number | null {
  if (!allFinite(respiratoryRatePerMin, vtMl, ppeakCmh2o, pplatCmh2o, peepCmh2o)) return null;
  if (respiratoryRatePerMin < 0 || vtMl < 0 || peepCmh2o < 0) return null;
  if (pplatCmh2o < peepCmh2o || ppeakCmh2o < pplatCmh2o) return null;
  const driving = pplatCmh2o - peepCmh2o;
  return finiteOrNull(MECHANICAL_POWER_FACTOR * respiratoryRatePerMin * (vtMl / 1000) * (ppeakCmh2o - driving / 2));
}

/**
 * Mechanical power (J/min), surrogate for volume control: VE (L/min) × (Ppeak + PEEP + F / 6) / 20,
 * F the inspiratory flow in L/min. Needs no plateau pressure. `null` unless VE ≥ 0, PEEP ≥ 0,
 * Ppeak ≥ PEEP and F > 0. Source: `giosa-2019`.
 */
export function mechanicalPowerSurrogate(veLPerMin: number, ppeakCmh2o: number, peepCmh2o: number, flowLPerMin: number): number | null {
  if (!allFinite(veLPerMin, ppeakCmh2o, peepCmh2o, flowLPerMin)) return null;
  if (veLPerMin < 0 || peepCmh2o < 0 || ppeakCmh2o < peepCmh2o || flowLPerMin <= 0) return null;
  return finiteOrNull((veLPerMin * (ppeakCmh2o + peepCmh2o + flowLPerMin / 6)) / 20);
}

/**
 * Ventilatory ratio (dimensionless): (VE (mL/min) × PaCO2) / (PBW × 100 × 37.5); about 1 in
 * health, higher with more dead space. `null` unless VE ≥ 0, PaCO2 ≥ 0 and PBW > 0.
 * Sources: `sinha-2009`, `sinha-2019`.
 */
export function ventilatoryRatio(veMlPerMin: number, paco2Mmhg: number, pbwKg: number): number | null {
  if (!allFinite(veMlPerMin, paco2Mmhg, pbwKg) || veMlPerMin < 0 || paco2Mmhg < 0 || pbwKg <= 0) return null;
  return finiteOrNull(
    (veMlPerMin * paco2Mmhg) / (pbwKg * VENTILATORY_RATIO_VE_ML_PER_KG * VENTILATORY_RATIO_PACO2_MMHG),
  );
}
