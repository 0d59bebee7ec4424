/**
 * Unit constants and conversions used by the physiology layer.
 *
 * Internal units of the core: gas pressures mmHg, airway pressures cmH2O, volumes mL, flows L/min,
 * Hb g/dL, electrolytes mmol/L, FiO2 a fraction. Everything here converts into or out of those.
 * Functions are total: a non-finite input, an input outside the physical domain, or a result that
 * would overflow gives `null`.
 */
import { allFinite, finiteOrNull } from './numeric';

/** Citations for the constants in this module (key → citation). */
export const SOURCES = Object.freeze({
  'nist-sp811':
    'Thompson A, Taylor BN. Guide for the Use of the International System of Units (SI). NIST Special Publication 811, 2008 edition, appendix B: the conventional mmHg, 133.3224 Pa, read in its reproduction in the R package NISTunits 1.0.1 by Gama J, whose conversion NISTmillimeterOfMercuryConvtnlTOpascal multiplies by 133.3224 and names appendix B.8 of the guide as its source (its help page at rdrr.io/rforge/NISTunits/man/NISTmillimeterOfMercuryConvtnlTOpascal.html, the function body in a stored copy of the package source); in the same source, NISTunits/R/NISTfactors.R in the stored copy TypeFox/R-Examples, NISTcmOfWaterConvtnlTOpascal multiplies by 98.0665 (the conventional centimetre of water) and NISTftTOmeter by 0.3048 (the foot), both read there in December 2026; the guide itself not read, and its degree Fahrenheit, (°F − 32) ÷ 1.8, from memory, and checked against UCUM\'s [degF] in the library @lhncbc/ucum-lhc 7.1.10.',
  'si-brochure':
    'Bureau International des Poids et Mesures. The International System of Units (SI Brochure), 9th edition, 2019: standard atmosphere 101 325 Pa, kelvin and degree Celsius (from memory).',
  'glucose-molar-mass':
    'Molar mass of glucose C6H12O6 = 6 × 12.011 + 12 × 1.008 + 6 × 15.999 = 180.16 g/mol, from the conventional standard atomic weights of IUPAC/CIAAW (Prohaska T et al. Standard atomic weights of the elements 2021 (IUPAC Technical Report). Pure Appl Chem 2022;94(5):573–600) (from memory).',
  'haemoglobin-molar-mass':
    'Haemoglobin as a substance concentration is counted per haem-carrying globin chain (the monomer), molar mass 16,114.5 g/mol, a quarter of the tetramer\'s 64,458 g/mol: the convention laboratories reporting Hb in mmol/L use, 1 g/dL ≈ 0.6206 mmol/L (the factor × 0.62063 from g/dL to mmol/L, with the note that it counts haemoglobin subunits and that the tetramer of about 64 kDa gives a quarter of it, read in its table 1 at pmc.ncbi.nlm.nih.gov/articles/PMC3934467, a review of iron-status tests; the tetramer\'s 64,458 g/mol read in the oxygen delivery model of Bretherick A and Baillie JK (2018), which takes the molar concentration of haemoglobin as its mass concentration ÷ 64,458 and binds four O2 to each (baillielab/oxygen_delivery, oxygen_delivery.py, in a stored copy of the repository, December 2026), so the monomer\'s is 64,458 ÷ 4 = 16,114.5 g/mol, which agrees with that factor to four figures: 1 ÷ 1.61145 = 0.62056; the arithmetic from g/dL to mmol/L with that molar mass checked against the library @lhncbc/ucum-lhc 7.1.10). A tetramer basis, 0.155 mmol/L per g/dL, is also met and is not used.',
} as const);

/** Pascals in one conventional millimetre of mercury (13.5951 g/cm³ × 9.80665 m/s² × 1 mm). Source: `nist-sp811`. */
export const PA_PER_MMHG = 133.322387415;
/**
 * mmHg in one kilopascal: 1000 ÷ 133.322387415 = 7.500617 (7.50062 to six figures). The exact
 * quotient, not the rounded figure, so every kPa value in Pneumark (read, shown, converted) goes
 * through one factor. Source: `nist-sp811`.
 */
export const MMHG_PER_KPA = 1000 / PA_PER_MMHG;
/** Pascals in one conventional centimetre of water (1 g/cm³ × 9.80665 m/s² × 1 cm). Source: `nist-sp811`. */
export const PA_PER_CMH2O = 98.0665;
/** mmHg in one cmH2O (98.0665 / 133.322387415, rounded). Source: `nist-sp811`. */
export const MMHG_PER_CMH2O = 0.735559;
/** Pascals in one standard atmosphere. Source: `si-brochure`. */
export const PA_PER_ATMOSPHERE = 101325;
/** Metres in one international foot (exact). Source: `nist-sp811`. */
export const METRES_PER_FOOT = 0.3048;
/**
 * mg/dL of glucose in one mmol/L: 180.16 g/mol × 1 mmol/L = 180.16 mg/L = 18.016 mg/dL. For
 * glucose only: another substance has another molar mass. Source: `glucose-molar-mass`.
 */
export const GLUCOSE_MG_PER_DL_PER_MMOL_L = 18.016;
/** Molar mass of haemoglobin per haem-carrying chain (the monomer), g/mol. Source: `haemoglobin-molar-mass`. */
export const HB_MONOMER_G_PER_MOL = 16114.5;
/**
 * g/dL of haemoglobin in one mmol/L (monomer basis): 16,114.5 g/mol × 1 mmol/L = 16.1145 g/L =
 * 1.61145 g/dL. For haemoglobin only. Source: `haemoglobin-molar-mass`.
 */
export const HB_G_PER_DL_PER_MMOL_L = HB_MONOMER_G_PER_MOL / 10000;
/** Absolute zero in degrees Celsius. Source: `si-brochure`. */
export const ABSOLUTE_ZERO_CELSIUS = -273.15;

/** Kilopascals to mmHg: kPa × 7.500617 (`MMHG_PER_KPA`). Any finite pressure (gauge pressures may be negative). Source: `nist-sp811`. */
export function kpaToMmhg(pressureKpa: number): number | null {
  if (!allFinite(pressureKpa)) return null;
  return finiteOrNull(pressureKpa * MMHG_PER_KPA);
}

/** mmHg to kilopascals: mmHg ÷ 7.500617 (`MMHG_PER_KPA`). Source: `nist-sp811`. */
export function mmhgToKpa(pressureMmhg: number): number | null {
  if (!allFinite(pressureMmhg)) return null;
  return finiteOrNull(pressureMmhg / MMHG_PER_KPA);
}

/** Pascals to mmHg: Pa ÷ 133.322387415. Source: `nist-sp811`. */
export function paToMmhg(pressurePa: number): number | null {
  if (!allFinite(pressurePa)) return null;
  return finiteOrNull(pressurePa / PA_PER_MMHG);
}

/** Hectopascals (millibars, as weather stations report) to mmHg: hPa × 100 ÷ 133.322387415. Source: `nist-sp811`. */
export function hpaToMmhg(pressureHpa: number): number | null {
  if (!allFinite(pressureHpa)) return null;
  return finiteOrNull((pressureHpa * 100) / PA_PER_MMHG);
}

/** cmH2O to mmHg: cmH2O × 0.735559. Source: `nist-sp811`. */
export function cmh2oToMmhg(pressureCmh2o: number): number | null {
  if (!allFinite(pressureCmh2o)) return null;
  return finiteOrNull(pressureCmh2o * MMHG_PER_CMH2O);
}

/** mmHg to cmH2O: mmHg ÷ 0.735559. Source: `nist-sp811`. */
export function mmhgToCmh2o(pressureMmhg: number): number | null {
  if (!allFinite(pressureMmhg)) return null;
  return finiteOrNull(pressureMmhg / MMHG_PER_CMH2O);
}

/**
 * Degrees Fahrenheit to degrees Celsius: (°F − 32) × 5/9. `null` below absolute zero
 * (−459.67 °F). Source: `nist-sp811`.
 */
export function celsiusFromFahrenheit(temperatureF: number): number | null {
  if (!allFinite(temperatureF)) return null;
  const celsius = ((temperatureF - 32) * 5) / 9;
  if (celsius < ABSOLUTE_ZERO_CELSIUS) return null;
  return finiteOrNull(celsius);
}

/** Degrees Celsius to degrees Fahrenheit: °C × 9/5 + 32. `null` below absolute zero. Source: `nist-sp811`. */
export function fahrenheitFromCelsius(temperatureC: number): number | null {
  if (!allFinite(temperatureC) || temperatureC < ABSOLUTE_ZERO_CELSIUS) return null;
  return finiteOrNull((temperatureC * 9) / 5 + 32);
}

/** Feet to metres: ft × 0.3048 (altitudes below sea level are negative). Source: `nist-sp811`. */
export function metresFromFeet(lengthFt: number): number | null {
  if (!allFinite(lengthFt)) return null;
  return finiteOrNull(lengthFt * METRES_PER_FOOT);
}

/** Metres to feet: m ÷ 0.3048. Source: `nist-sp811`. */
export function feetFromMetres(lengthM: number): number | null {
  if (!allFinite(lengthM)) return null;
  return finiteOrNull(lengthM / METRES_PER_FOOT);
}

/** Percent to fraction (e.g. FiO2 40 % → 0.4): percent ÷ 100. `null` outside 0–100. Source: `si-brochure`. */
export function fractionFromPercent(percent: number): number | null {
  if (!allFinite(percent) || percent < 0 || percent > 100) return null;
  return finiteOrNull(percent / 100);
}

/** Fraction to percent (e.g. SaO2 0.97 → 97): fraction × 100. `null` outside 0–1. Source: `si-brochure`. */
export function percentFromFraction(fraction: number): number | null {
  if (!allFinite(fraction) || fraction < 0 || fraction > 1) return null;
  return finiteOrNull(fraction * 100);
}
