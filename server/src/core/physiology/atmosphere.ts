/**
 * Barometric pressure from altitude, water vapour pressure, and inspired oxygen pressure.
 *
 * Units: altitude in metres above mean sea level (geometric, as on a map), pressures in mmHg,
 * temperature in °C, FiO2 a fraction. Every function returns `null` (never NaN or ±Infinity,
 * never throws) when an input is non-finite or outside the stated domain.
 */
import { allFinite, finiteOrNull, inClosedRange, isFio2Fraction } from './numeric';
import { PA_PER_ATMOSPHERE, PA_PER_MMHG } from './units';

/** Citations for the formulas in this module (key → citation). */
export const SOURCES = Object.freeze({
  'west-1996':
    'West JB. Prediction of barometric pressures at high altitudes with the use of model atmospheres. J Appl Physiol 1996;81(4):1850–1854 (the paper not read here, its citation from memory): its equation, PB = exp(6.63268 − 0.1112 h − 0.00149 h²) mmHg with h the altitude in km, read in its reproduction in the oxygen delivery model of Bretherick A and Baillie JK (2018), whose function calculatedconstants names West 1996 as its source and turns the mmHg into kPa (× 0.1333) (baillielab/oxygen_delivery, oxygen_delivery.py, in a stored copy of the repository, December 2026); the pressures it gives lie within 1.3 % (4.3 mmHg) of the four mean pressures measured on Mount Everest that the abstract of West et al. 1983 gives (read December 2026).',
  'west-1983':
    'West JB, Lahiri S, Maret KH, Peters RM Jr, Pizzo CJ. Barometric pressures at extreme altitudes on Mt. Everest: physiological significance. J Appl Physiol 1983;54(5):1188–1194: mean pressures 400.4 Torr at 5,400 m, 351.0 at 6,300 m, 283.6 at 8,050 m and 253.0 Torr on the summit, 8,848 m, all considerably higher than the ICAO Standard Atmosphere predicts (read in its abstract, in a copy of the article).',
  'us-standard-atmosphere-1976':
    'NOAA, NASA, US Air Force. U.S. Standard Atmosphere, 1976 (NOAA-S/T 76-1562). Washington DC: US Government Printing Office, 1976; its troposphere layer is the same as the ICAO Standard Atmosphere (ICAO Doc 7488) (the document not read here, its citation from memory): its constants read in its reproduction in the table of crnslab.org/util/atmo.php (sea-level pressure 101325 Pa and temperature 288.15 K, lapse rate 6.5 K/km, g0 9.80665 m/s², molecular weight of air 28.9644 kg/kmol, R* 8.31432 J/(K·mol), Earth radius 6356766 m, 22632 Pa at the tropopause, 11 km) and in the layer table at av8n.com/physics/altimetry.htm (22632.1 Pa at 11,000 m).',
  'buck-1981':
    'Buck AL. New equations for computing vapor pressure and enhancement factor. J Appl Meteorol 1981;20(12):1527–1532 (the paper not read here): its equation 3 over liquid water, 6.1121 exp(17.502 T/(240.97 + T)) hPa, the form used here, read in its reproduction in the R package HeatStress (rdrr.io/github/anacv/HeatStress, esat.R, which names it Buck 1981 equation 3, written with T + 240.97 as Tk − 32.18). Its later form over liquid water, 6.1121 exp((18.678 − T/234.5) × T/(257.14 + T)) hPa, read in the Wikipedia article "Arden Buck equation" (en.wikipedia.org/wiki/Arden_Buck_equation), gives the same pressure within 0.05 % from 0 to 42 °C.',
  'inspired-po2':
    'Inspired PO2 = FiO2 × (PB − PH2O), water vapour 47 mmHg at 37 °C: standard respiratory physiology, e.g. West JB. Respiratory Physiology: The Essentials (from memory); common practice. The water vapour pressure at body temperature, 47 mmHg (6.25 kPa), read among the sample values for air at sea level at 37 °C of the English Wikipedia article Alveolar gas equation (its copy at primidi.com), with a barometric pressure of 760 mmHg.',
} as const);

/** Altitudes (m) for which West's model atmosphere is evaluated; outside → `null`. */
export const WEST_MODEL_ALTITUDE_RANGE_M = Object.freeze({ min: -1000, max: 10000 });
/** Altitudes (m, geometric) of the standard atmosphere's lowest layer, as tabulated from −5 km; outside → `null`. */
export const STANDARD_ATMOSPHERE_ALTITUDE_RANGE_M = Object.freeze({ min: -5000, max: 11000 });
/** Temperatures (°C) over which Buck's equation was fitted; outside → `null`. */
export const BUCK_TEMPERATURE_RANGE_C = Object.freeze({ min: -20, max: 50 });
/** Water vapour pressure (mmHg) of gas saturated at 37 °C, as used in the inspired PO2 formula. Source: `inspired-po2`. */
export const WATER_VAPOUR_37C_MMHG = 47;

/** Effective Earth radius (m) used by the 1976 standard to turn geometric into geopotential altitude. */
const EARTH_RADIUS_STANDARD_M = 6356766;
/** Temperature lapse rate ÷ sea-level temperature of the standard troposphere (0.0065 K/m ÷ 288.15 K), per metre. */
const STANDARD_LAPSE_OVER_T0_PER_M = 2.25577e-5;
/** Exponent g0·M / (R*·L) of the standard troposphere. */
const STANDARD_PRESSURE_EXPONENT = 5.25588;
/** mmHg per hPa. */
const MMHG_PER_HPA = 100 / PA_PER_MMHG;

/**
 * Barometric pressure (mmHg) from altitude by West's model atmosphere, the DEFAULT model:
 * PB = exp(6.63268 − 0.1112·h − 0.00149·h²), h in km. Fitted to radiosonde data at the latitudes
 * of the Himalaya; it agrees with pressures measured on Mount Everest (`west-1983`).
 * Domain −1,000 m to 10,000 m (a margin around the altitudes of human habitation and climbing).
 * Source: `west-1996`.
 */
export function barometricFromAltitudeWest(altitudeM: number): number | null {
  if (!inClosedRange(altitudeM, WEST_MODEL_ALTITUDE_RANGE_M.min, WEST_MODEL_ALTITUDE_RANGE_M.max)) return null;
  const h = altitudeM / 1000;
  return finiteOrNull(Math.exp(6.63268 - 0.1112 * h - 0.00149 * h * h));
}

/**
 * Barometric pressure (mmHg) from altitude by the standard atmosphere (U.S. Standard Atmosphere
 * 1976 = ICAO, troposphere layer): P = 101325 × (1 − 2.25577×10⁻⁵·H)^5.25588 Pa, where H is the
 * geopotential altitude H = r0·z / (r0 + z), r0 = 6,356,766 m, from the geometric altitude z.
 * The conversion makes the result match the standard's tables by geometric altitude (it changes
 * the pressure by < 0.4 mmHg below 9 km). It reads about 16 mmHg lower than West's model near
 * 8–9 km, because the standard describes mid-latitudes. Domain −5,000 m to 11,000 m.
 * Source: `us-standard-atmosphere-1976`.
 */
export function barometricFromAltitudeStandard(altitudeM: number): number | null {
  const range = STANDARD_ATMOSPHERE_ALTITUDE_RANGE_M;
  if (!inClosedRange(altitudeM, range.min, range.max)) return null;
  const geopotentialM = (EARTH_RADIUS_STANDARD_M * altitudeM) / (EARTH_RADIUS_STANDARD_M + altitudeM);
  const pressurePa =
    PA_PER_ATMOSPHERE * Math.pow(1 - STANDARD_LAPSE_OVER_T0_PER_M * geopotentialM, STANDARD_PRESSURE_EXPONENT);
  return finiteOrNull(pressurePa / PA_PER_MMHG);
}

/**
 * Saturation vapour pressure of water (mmHg) at a temperature (°C), by Buck's equation over
 * liquid water: e = 6.1121 × exp(17.502·T / (240.97 + T)) hPa. Gives 47.1 mmHg at 37 °C.
 * Domain −20 °C to 50 °C (the range Buck fitted). Source: `buck-1981`.
 */
export function waterVapourPressureMmhg(tempC: number): number | null {
  if (!inClosedRange(tempC, BUCK_TEMPERATURE_RANGE_C.min, BUCK_TEMPERATURE_RANGE_C.max)) return null;
  const pressureHpa = 6.1121 * Math.exp((17.502 * tempC) / (240.97 + tempC));
  return finiteOrNull(pressureHpa * MMHG_PER_HPA);
}

/**
 * Inspired PO2 (mmHg) of gas warmed and saturated with water in the airways:
 * PiO2 = FiO2 × (PB − PH2O), PH2O 47 mmHg at 37 °C by default.
 * `null` unless 0 < FiO2 ≤ 1, PB > 0, PH2O ≥ 0 and PB > PH2O. Source: `inspired-po2`.
 */
export function inspiredPo2Humidified(
  fio2: number,
  pbMmhg: number,
  ph2oMmhg: number = WATER_VAPOUR_37C_MMHG,
): number | null {
  if (!isFio2Fraction(fio2) || !allFinite(pbMmhg, ph2oMmhg)) return null;
  if (pbMmhg <= 0 || ph2oMmhg < 0 || pbMmhg <= ph2oMmhg) return null;
  return finiteOrNull(fio2 * (pbMmhg - ph2oMmhg));
}

/**
 * Inspired PO2 (mmHg) of dry gas: PiO2 = FiO2 × PB (0.21 × 760 ≈ 159 mmHg).
 * `null` unless 0 < FiO2 ≤ 1 and PB > 0. Source: `inspired-po2`.
 */
export function inspiredPo2Dry(fio2: number, pbMmhg: number): number | null {
  if (!isFio2Fraction(fio2) || !allFinite(pbMmhg) || pbMmhg <= 0) return null;
  return finiteOrNull(fio2 * pbMmhg);
}
