/** Derived values of the air breathed: barometric pressure and inspired PO2. */
import { SOURCES, WATER_VAPOUR_37C_MMHG, barometricFromAltitudeStandard, barometricFromAltitudeWest, inspiredPo2Humidified, waterVapourPressureMmhg } from '../physiology';
import { formatNumber } from '../util/format';
import { defineDerived, type DeriveContext, type Term } from './context';

export const SEA_LEVEL_MMHG = 760;

export const barometric = defineDerived({
  id: 'barometric',
  label: 'Barometric pressure',
  short: 'PB',
  unit: 'mmHg',
  decimals: 0,
  category: 'atmosphere',
  formula: '{PB}',
  source: `Stated, or estimated from the altitude. Default model: ${SOURCES['west-1996']} Other model: ${SOURCES['us-standard-atmosphere-1976']}`,
  anchors: ['barometric', 'altitude', 'pao2'],
  compute(c) {
    const stated = c.field('barometric', 'PB');
    if (stated) return c.value(stated.value, [stated], { formula: 'PB as stated' });
    const alt = c.field('altitude', 'altitude');
    if (alt) {
      const west = c.settings.barometricModel === 'west';
      const pb = west ? barometricFromAltitudeWest(alt.value) : barometricFromAltitudeStandard(alt.value);
      return c.value(pb, [alt], {
        formula: west ? 'exp(6.63268 − 0.1112 × {altitude}/1000 − 0.00149 × ({altitude}/1000)²)' : '760 × (1 − 2.25577×10⁻⁵ × {altitude})^5.25588',
        notes: [west ? 'model atmosphere for high-altitude physiology (West 1996)' : 'U.S. Standard Atmosphere 1976'],
      });
    }
    const sea: Term = { name: 'PB', value: SEA_LEVEL_MMHG, unit: 'mmHg', decimals: 0, origin: { kind: 'default', description: 'sea level assumed: no place stated' } };
    return c.value(SEA_LEVEL_MMHG, [sea], { formula: 'PB assumed at sea level', notes: ['no altitude or barometric pressure in the note: sea level assumed'] });
  },
});

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

/**
 * The water vapour pressure term of the inspired PO2, or null when the temperature stated is
 * outside the range of Buck's equation (`body-temperature` only). `fixed` (the default): 47 mmHg
 * always, naming a temperature stated at the timepoint as not used; `body-temperature`: the
 * saturated vapour pressure at the temperature stated at the timepoint, else 47 mmHg.
 */
function waterVapourTerm(c: DeriveContext): Term | null {
  const here = c.statedHere('temp');
  const temp = here ? c.field('temp', 'temp') : null;
  if (c.settings.waterVapour !== 'body-temperature') {
    if (temp === null) return PH2O_FIXED;
    const description = `${FIXED_WHY}; the temperature ${formatNumber(temp.value, temp.decimals)} °C stated here is not used`;
    return { ...PH2O_FIXED, origin: { kind: 'default', description } };
  }
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
  label: 'Inspired PO2',
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
    if (!fio2 || !pb) return c.missing([fio2, c.fio2Need()], [pb, 'place']);
    const ph2o = waterVapourTerm(c);
    if (ph2o === null) return c.value(null, []);
    return c.value(inspiredPo2Humidified(fio2.value, pb.value, ph2o.value), [fio2, pb, ph2o]);
  },
});
