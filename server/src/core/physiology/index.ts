/**
 * The physiology layer: pure formulas, no I/O, no editor or LSP types.
 *
 * What lives here: one module per topic (atmosphere, gas exchange, acid–base, mechanics, oxygen
 * transport, units, children's growth). Internal units are fixed (gas pressures mmHg, airway pressures cmH2O,
 * volumes mL, flows L/min, Hb g/dL, electrolytes mmol/L, FiO2 a fraction, SpO2/SaO2 percent
 * unless a name says fraction). Every function is total: it returns `null`, never NaN or
 * ±Infinity, and never throws. Each module exports its own `SOURCES` (key → citation) and each
 * function's doc names its source key; `SOURCES` here merges them all.
 *
 * May import: nothing outside this folder. Adding a formula: put it in the module of its topic,
 * cite it in that module's `SOURCES`, add checks from a named published source and an entry in
 * the module's null-safety property test under tests/physiology/.
 */
import { SOURCES as ACID_BASE_SOURCES } from './acid-base';
import { SOURCES as ATMOSPHERE_SOURCES } from './atmosphere';
import { SOURCES as GAS_EXCHANGE_SOURCES } from './gas-exchange';
import { SOURCES as GROWTH_SOURCES } from './growth';
import { SOURCES as MECHANICS_SOURCES } from './mechanics';
import { SOURCES as OXYGEN_TRANSPORT_SOURCES } from './oxygen-transport';
import { SOURCES as UNITS_SOURCES } from './units';

export * from './acid-base';
export * from './atmosphere';
export * from './gas-exchange';
export * from './growth';
export * from './mechanics';
export * from './oxygen-transport';
export * from './units';

export {
  ACID_BASE_SOURCES,
  ATMOSPHERE_SOURCES,
  GAS_EXCHANGE_SOURCES,
  GROWTH_SOURCES,
  MECHANICS_SOURCES,
  OXYGEN_TRANSPORT_SOURCES,
  UNITS_SOURCES,
};

/** Every module's citations in one record (keys are unique across modules). */
export const SOURCES = Object.freeze({
  ...UNITS_SOURCES,
  ...ATMOSPHERE_SOURCES,
  ...GAS_EXCHANGE_SOURCES,
  ...ACID_BASE_SOURCES,
  ...MECHANICS_SOURCES,
  ...OXYGEN_TRANSPORT_SOURCES,
  ...GROWTH_SOURCES,
});

/** Citations grouped by module. */
export const SOURCES_BY_MODULE = Object.freeze({
  units: UNITS_SOURCES,
  atmosphere: ATMOSPHERE_SOURCES,
  'gas-exchange': GAS_EXCHANGE_SOURCES,
  'acid-base': ACID_BASE_SOURCES,
  mechanics: MECHANICS_SOURCES,
  'oxygen-transport': OXYGEN_TRANSPORT_SOURCES,
  growth: GROWTH_SOURCES,
});
