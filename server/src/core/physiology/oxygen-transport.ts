/**
 * Oxygen content and delivery, and rough FiO2 estimates for low-flow devices.
 *
 * Units: Hb g/dL, saturation a FRACTION 0–1 where the name says so, PaO2 mmHg, content mL O2/dL,
 * cardiac output L/min, delivery mL O2/min, oxygen flow L/min. Every function returns `null`
 * (never NaN or ±Infinity, never throws) when an input is non-finite or outside the stated domain.
 */
import { allFinite, finiteOrNull, inClosedRange } from './numeric';

/** Citations for the formulas in this module (key → citation). */
export const SOURCES = Object.freeze({
  'oxygen-content':
    'Arterial O2 content CaO2 = Hüfner constant × Hb × SaO2 + 0.003 × PaO2 (mL/dL), and O2 delivery DO2 = CO × CaO2 × 10: standard physiology, e.g. West JB. Respiratory Physiology: The Essentials (from memory); the form CaO2 = 1.34 × Hb × SaO2 + 0.003 × PaO2 and DO2 = CO × CaO2 read on OpenAnesthesia\'s page on O2 delivery (openanesthesia.org), and a worked arterial content of 200 mL/L (Hb 150 g/L × 1.34 × 0.98 + 0.23 mL/L per kPa × 13 kPa) with an O2 flux of 1,000 mL/min at a cardiac output of 5 L/min in the e-Learning for Healthcare anaesthesia session on oxygen delivery (e-safe-anaesthesia.org, December 2026). Hüfner constant 1.34 mL/g by default (1.36 and 1.39 also published): the oxygen binding capacity of human haemoglobin measured in 36 healthy men, mean 1.368 mL/g (range 1.322–1.387), and 1.39 mL/g were all haemoglobin active, read in its abstract (Dijkhuizen P, Buursma A, Fongers TME, et al. The oxygen binding capacity of human haemoglobin: Hüfner\'s factor redetermined. Pflugers Arch 1977;369:223–231, at link.springer.com), so each setting lies within what was measured or at the theoretical maximum.',
  'nasal-cannula-fio2':
    'Nasal cannula FiO2 ≈ 0.21 + 0.04 per L/min up to 6 L/min: common practice, no source (rough; depends on breathing pattern).',
  'mean-arterial-pressure':
    'Mean arterial pressure ≈ diastolic + (systolic − diastolic) ÷ 3: common practice, no single source; the "standard formula" in Razminia M et al. Validation of a new formula for mean arterial pressure calculation: the new formula is superior to the standard formula. Catheter Cardiovasc Interv 2004;63:419–425 (authors from memory). An estimate: fixed rules of this kind differ from the measured mean by several mmHg (Optimal calculation of mean pressure from pulse pressure. Am J Hypertens 2023;36:297–305).',
  'simple-mask-fio2':
    'Simple face mask FiO2 ≈ 0.35 at 5 L/min rising to ≈ 0.55 at 10 L/min (interpolated linearly between): common practice, no source (rough).',
} as const);

/** Default Hüfner constant (mL O2 bound per g Hb). Source: `oxygen-content`. */
export const DEFAULT_HUFNER_ML_PER_G = 1.34;
/** O2 dissolved in plasma, mL/dL per mmHg. Source: `oxygen-content`. */
export const DISSOLVED_O2_ML_PER_DL_PER_MMHG = 0.003;

/** Low-flow oxygen devices with a rough FiO2 rule. */
export type LowFlowDevice = 'cannula' | 'mask';

/** Flow ranges (L/min) over which each rough rule is quoted; outside → `null`. */
export const LOW_FLOW_RULE_RANGES_L_PER_MIN: Readonly<Record<LowFlowDevice, { readonly minExclusive: boolean; readonly min: number; readonly max: number }>> =
  Object.freeze({
    cannula: Object.freeze({ minExclusive: true, min: 0, max: 6 }),
    mask: Object.freeze({ minExclusive: false, min: 5, max: 10 }),
  });

/**
 * Arterial O2 content (mL O2/dL): Hüfner × Hb (g/dL) × SaO2 (fraction) + 0.003 × PaO2 (mmHg).
 * `null` unless Hb ≥ 0, 0 ≤ SaO2 ≤ 1, PaO2 ≥ 0 and Hüfner > 0. Source: `oxygen-content`.
 */
export function arterialO2Content(
  hbGdl: number,
  sao2Fraction: number,
  pao2Mmhg: number,
  hufnerMlPerG: number = DEFAULT_HUFNER_ML_PER_G,
): number | null {
  if (!allFinite(hbGdl, pao2Mmhg, hufnerMlPerG) || hbGdl < 0 || pao2Mmhg < 0 || hufnerMlPerG <= 0) return null;
  if (!inClosedRange(sao2Fraction, 0, 1)) return null;
  return finiteOrNull(hufnerMlPerG * hbGdl * sao2Fraction + DISSOLVED_O2_ML_PER_DL_PER_MMHG * pao2Mmhg);
}

/**
 * O2 delivery (mL O2/min): cardiac output (L/min) × CaO2 (mL/dL) × 10 (dL per L).
 * `null` unless CO ≥ 0 and CaO2 ≥ 0. Source: `oxygen-content`.
 */
export function oxygenDelivery(coLPerMin: number, cao2MlPerDl: number): number | null {
  if (!allFinite(coLPerMin, cao2MlPerDl) || coLPerMin < 0 || cao2MlPerDl < 0) return null;
  return finiteOrNull(coLPerMin * cao2MlPerDl * 10);
}

/**
 * ROUGH FiO2 estimate (fraction) for a low-flow device; label it an estimate and do not use it
 * for a P/F ratio without saying so.
 * - 'cannula': 0.21 + 0.04 × flow, for 0 < flow ≤ 6 L/min (`nasal-cannula-fio2`).
 * - 'mask' (simple face mask): 0.35 at 5 L/min to 0.55 at 10 L/min, linear between, for
 *   5 ≤ flow ≤ 10 L/min; below 5 L/min a simple mask risks rebreathing CO2 (`simple-mask-fio2`).
 * `null` outside the rule's flow range or for an unknown device. Worked out in percent and divided
 * by 100 once, so a whole or half flow gives the rule's decimal exactly (0.33, not 0.32999999999999996).
 */
export function fio2EstimateLowFlow(device: LowFlowDevice, flowLPerMin: number): number | null {
  if (!allFinite(flowLPerMin)) return null;
  switch (device) {
    case 'cannula': {
      const range = LOW_FLOW_RULE_RANGES_L_PER_MIN.cannula;
      if (flowLPerMin <= range.min || flowLPerMin > range.max) return null;
      // Worked in percent and divided once, so that the estimate is the rule's number to the last
      // digit (0.33 at 3 L/min, where 0.21 + 0.04 × 3 is 0.32999999999999996 in doubles).
      return finiteOrNull((21 + 4 * flowLPerMin) / 100);
    }
    case 'mask': {
      const range = LOW_FLOW_RULE_RANGES_L_PER_MIN.mask;
      if (flowLPerMin < range.min || flowLPerMin > range.max) return null;
      return finiteOrNull((35 + ((55 - 35) * (flowLPerMin - range.min)) / (range.max - range.min)) / 100);
    }
    default:
      return null;
  }
}

/**
 * Mean arterial pressure (mmHg) estimated from a cuff's systolic and diastolic pressures (mmHg):
 * diastolic + (systolic − diastolic) ÷ 3. `null` unless 0 ≤ diastolic ≤ systolic. An estimate.
 * Source: `mean-arterial-pressure`.
 */
export function meanArterialPressure(systolicMmhg: number, diastolicMmhg: number): number | null {
  if (!allFinite(systolicMmhg, diastolicMmhg) || diastolicMmhg < 0 || systolicMmhg < diastolicMmhg) return null;
  return finiteOrNull(diastolicMmhg + (systolicMmhg - diastolicMmhg) / 3);
}
