/** Derived values of the air breathed: barometric pressure and inspired PO2. */
import { SOURCES, barometricFromAltitudeStandard, barometricFromAltitudeWest, inspiredPo2Humidified, waterVapourPressureMmhg } from '../physiology';
import { defineDerived, type Term } from './context';

export const SEA_LEVEL_MMHG = 760;

export const barometric = defineDerived({
  id: 'barometric',
  label: 'Barometric pressure',
  short: 'PB',
  unit: 'mmHg',
  decimals: 0,
  category: 'atmosphere',
  formula: '{PB}',
  source: `stated, or from altitude: ${SOURCES['west-1996']} (default model) or ${SOURCES['us-standard-atmosphere-1976']}`,
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

export const pio2 = defineDerived({
  id: 'pio2',
  label: 'Inspired PO2',
  short: 'PiO2',
  unit: 'mmHg',
  decimals: 0,
  category: 'atmosphere',
  formula: '{FiO2} × ({PB} − {PH2O})',
  source: `${SOURCES['inspired-po2']}; water vapour pressure at body temperature: ${SOURCES['buck-1981']}`,
  anchors: ['pao2', 'fio2', 'altitude', 'barometric'],
  compute(c) {
    const fio2 = c.fio2();
    const pb = c.derived('barometric', 'PB');
    if (!fio2 || !pb) return c.missing([fio2, c.fio2Need()], [pb, 'place']);
    const temp = c.field('temp', 'temp');
    const useTemp = temp !== null && c.statedHere('temp');
    const ph2o = useTemp ? waterVapourPressureMmhg(temp.value) : 47;
    if (ph2o === null) return c.value(null, []);
    const ph2oTerm: Term = useTemp
      ? { name: 'PH2O', value: ph2o, unit: 'mmHg', decimals: 1, origin: temp.origin, note: `saturated water vapour at ${temp.value} °C` }
      : { name: 'PH2O', value: 47, unit: 'mmHg', decimals: 0, origin: { kind: 'default', description: 'water vapour at 37 °C (no temperature at this timepoint)' } };
    return c.value(inspiredPo2Humidified(fio2.value, pb.value, ph2o), [fio2, pb, ph2oTerm]);
  },
});
