/** Derived values of the air breathed: barometric pressure and inspired PO2. */
import { SOURCES, WATER_VAPOUR_37C_MMHG, barometricFromAltitudeStandard, barometricFromAltitudeWest, inspiredPo2Humidified, waterVapourPressureMmhg } from '../physiology';
import { formatNumber } from '../util/format';
import { fieldById } from '../fields/registry';
import { defineDerived, type DeriveContext, type Outcome, type Term, type ValueExtras } from './context';

export const SEA_LEVEL_MMHG = 760;

/**
 * How far (a fraction) a pressure stated beside an altitude may lie outside the span of the two
 * model atmospheres' pressures at that altitude and still belong to it: weather and season move
 * the pressure at one place by a few percent (Pneumark's own convention, no source).
 */
export const PLACE_PRESSURE_MARGIN = 0.05;

/**
 * Whether a pressure (mmHg) stated beside an altitude (m) can belong to it: within
 * PLACE_PRESSURE_MARGIN of the span of West's model and the standard atmosphere there (true where
 * either model gives none: nothing to compare with). PN320 reports one that cannot; the altitude
 * beside it is then not used.
 */
export function pressureFitsAltitude(pbMmhg: number, altitudeM: number): boolean {
  const west = barometricFromAltitudeWest(altitudeM);
  const standard = barometricFromAltitudeStandard(altitudeM);
  if (west === null || standard === null) return true;
  return pbMmhg >= Math.min(west, standard) * (1 - PLACE_PRESSURE_MARGIN) && pbMmhg <= Math.max(west, standard) * (1 + PLACE_PRESSURE_MARGIN);
}

export const barometric = defineDerived({
  id: 'barometric',
  label: 'Barometric pressure',
  short: 'PB',
  unit: 'mmHg',
  decimals: 0,
  category: 'atmosphere',
  // Each way the pressure is had, as the table in grammar/README.md gives them (the standard
  // atmosphere is a setting); a value names the one it used.
  formula: 'PB as stated | exp(6.63268 − 0.1112 × {altitude}/1000 − 0.00149 × ({altitude}/1000)²) | PB assumed at sea level',
  source: `Stated, or estimated from the altitude. Default model: ${SOURCES['west-1996']} Other model: ${SOURCES['us-standard-atmosphere-1976']}`,
  anchors: ['barometric', 'altitude', 'pao2'],
  compute(c) {
    const stated = c.field('barometric', 'PB');
    if (stated) return c.value(stated.value, [stated], PB_STATED);
    const alt = c.field('altitude', 'altitude');
    if (alt) {
      const west = c.settings.barometricModel === 'west';
      const pb = west ? barometricFromAltitudeWest(alt.value) : barometricFromAltitudeStandard(alt.value);
      return c.value(pb, [alt], west ? PB_WEST : PB_STANDARD);
    }
    // A place is stated but cannot be used (a unit in doubt, PN204; an impossible value, PN301):
    // the patient is somewhere, not at sea level, so no pressure is assumed until it is mended.
    if (c.input('barometric') !== null || c.input('altitude') !== null) return PLACE_NOT_USABLE;
    return c.value(SEA_LEVEL_MMHG, SEA_LEVEL_TERMS, PB_SEA_LEVEL);
  },
});

/** What a place that is stated but cannot be used lacks: said once for every timepoint. */
const PLACE_NOT_USABLE: Outcome = { kind: 'missing', needs: ['a usable barometric pressure or altitude (the one on the place line is not used: see its finding)'] };

// The formulas and notes of the barometric pressure, and the sea-level input: one object each for every timepoint.
const PB_STATED: ValueExtras = { formula: 'PB as stated' };
const PB_WEST: ValueExtras = { formula: 'exp(6.63268 − 0.1112 × {altitude}/1000 − 0.00149 × ({altitude}/1000)²)', notes: ['model atmosphere for high-altitude physiology (West 1996)'] };
const PB_STANDARD: ValueExtras = { formula: '760 × (1 − 2.25577×10⁻⁵ × H)^5.25588, H = 6,356,766 × {altitude} ÷ (6,356,766 + {altitude})', notes: ['U.S. Standard Atmosphere 1976; H is the geopotential altitude (m) of the altitude stated'] };
const PB_SEA_LEVEL: ValueExtras = { formula: 'PB assumed at sea level', notes: ['no altitude or barometric pressure in the note: sea level assumed'] };
const SEA_LEVEL_TERMS: readonly Term[] = [{ name: 'PB', value: SEA_LEVEL_MMHG, unit: 'mmHg', decimals: 0, origin: { kind: 'default', description: 'sea level assumed: no place stated' } }];

/** Where PH2O came from, as the hover says it: the setting, and the temperature used or left out. */
const FIXED_WHY = 'humidified at 37 °C, the pinned convention (setting waterVapour: fixed)';

/** PH2O under the pinned convention (setting `waterVapour: fixed`, the default): one term for every timepoint. */
const PH2O_FIXED: Term = {
  name: 'PH2O',
  value: WATER_VAPOUR_37C_MMHG,
  unit: 'mmHg',
  decimals: 0,
  origin: { kind: 'default', description: FIXED_WHY },
  note: '37 °C',
};

/** PH2O with the setting `waterVapour: body-temperature` when no temperature is stated at the timepoint. */
const PH2O_NO_TEMPERATURE: Term = {
  name: 'PH2O',
  value: WATER_VAPOUR_37C_MMHG,
  unit: 'mmHg',
  decimals: 0,
  origin: { kind: 'default', description: 'humidified at 37 °C: no temperature at this timepoint (setting waterVapour: body-temperature)' },
  note: '37 °C',
};

/** The decimals a temperature input shows with (its field's, as every input's). */
const TEMPERATURE_DECIMALS = fieldById('temp')?.decimals ?? 1;

/**
 * PH2O under the pinned convention at a timepoint that states a temperature, which it names as
 * not used. Kept by temperature (few: a note's temperatures repeat), up to a bound: the key
 * comes from the note.
 */
const FIXED_BESIDE: Map<number, Term> = new Map();
function fixedBesideTemperature(celsius: number): Term {
  const known = FIXED_BESIDE.get(celsius);
  if (known !== undefined) return known;
  const description = `${FIXED_WHY}; the temperature ${formatNumber(celsius, TEMPERATURE_DECIMALS)} °C stated here is not used`;
  const term: Term = { ...PH2O_FIXED, origin: { kind: 'default', description } };
  if (FIXED_BESIDE.size < 1000) FIXED_BESIDE.set(celsius, term);
  return term;
}

/**
 * The water vapour pressure term of the inspired PO2, or null when the temperature stated is
 * outside the range of Buck's equation (`body-temperature` only). `fixed` (the default): 47 mmHg
 * always, naming a temperature stated at the timepoint as not used; `body-temperature`: the
 * saturated vapour pressure at the temperature stated at the timepoint, else 47 mmHg.
 */
function waterVapourTerm(c: DeriveContext): Term | null {
  const here = c.statedHere('temp');
  if (c.settings.waterVapour !== 'body-temperature') {
    // Only the number is named: asked without building the temperature as an input.
    const celsius = here ? c.number('temp') : null;
    return celsius === null ? PH2O_FIXED : fixedBesideTemperature(celsius);
  }
  const temp = here ? c.field('temp', 'temp') : null;
  if (temp === null) return PH2O_NO_TEMPERATURE;
  const ph2o = waterVapourPressureMmhg(temp.value);
  if (ph2o === null) return null;
  return {
    name: 'PH2O',
    value: ph2o,
    unit: 'mmHg',
    decimals: 1,
    origin: temp.origin,
    note: `saturated at ${formatNumber(temp.value, temp.decimals)} °C, setting waterVapour: body-temperature`,
  };
}

export const pio2 = defineDerived({
  id: 'pio2',
  label: 'Inspired PO2 of humidified gas',
  short: 'PiO2',
  unit: 'mmHg',
  decimals: 0,
  category: 'atmosphere',
  formula: '{FiO2} × ({PB} − {PH2O})',
  source: `${SOURCES['inspired-po2']} With the setting waterVapour: body-temperature, the saturated water vapour pressure at the temperature stated: ${SOURCES['buck-1981']}`,
  anchors: ['pao2', 'fio2', 'altitude', 'barometric'],
  compute(c) {
    const fio2 = c.fio2();
    const pb = c.derived('barometric', 'PB');
    if (!fio2 || !pb) return c.missing([fio2, c.fio2Need()], [pb, c.lacking('barometric')]);
    const ph2o = waterVapourTerm(c);
    if (ph2o === null) return c.value(null, []);
    return c.value(inspiredPo2Humidified(fio2.value, pb.value, ph2o.value), [fio2, pb, ph2o]);
  },
});
