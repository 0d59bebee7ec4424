/**
 * Unit spellings for the exports: a slug that is safe inside a column name, and UCUM codes
 * for the units derived values use (the unit registry holds the codes of the units a note may
 * write; a few derived units, such as mL/cmH2O, appear nowhere else).
 */
import { unitById } from '../fields/units';
import { displayUnit } from '../analysis/read-value';

/**
 * A unit id made safe for a column name: `mmHg` → `mmHg`, `L/min` → `L_min`, `/min` → `per_min`,
 * `%` and `%sat` → `pct`, `cmH2O/L/s` → `cmH2O_L_s`, `ph` → `pH`, '' → ''. Case is kept, since
 * it carries meaning in units (mL, dL).
 */
export function unitSlug(unitId: string): string {
  if (unitId === 'ph') return 'pH';
  return unitId
    .replace(/^\//, 'per_')
    .replace(/%(sat)?/g, 'pct')
    .replace(/\//g, '_')
    .replace(/[^A-Za-z0-9_]/g, '')
    .replace(/_+/g, '_')
    .replace(/^_|_$/g, '');
}

/** UCUM codes of the units that only derived values use (checked against a UCUM library in the tests). */
const DERIVED_UCUM: Readonly<Record<string, string>> = {
  '': '1',
  'mL/kg': 'mL/kg',
  'mL/cmH2O': 'mL/cm[H2O]',
  'cmH2O/L/s': 'cm[H2O]/L/s',
  'J/min': 'J/min',
  'mL/dL': 'mL/dL',
  'mL/min': 'mL/min',
};

/** The UCUM code of a unit id (registry unit or derived-value unit); null when there is none. */
export function ucumCode(unitId: string): string | null {
  return unitById(unitId)?.ucum ?? DERIVED_UCUM[unitId] ?? null;
}

/** Where a unit id would mislead a reader of the exports: `C` is the coulomb's symbol, `ph` no unit's. */
const FOR_PEOPLE: Readonly<Record<string, string>> = { ph: 'pH', C: '°C', F: '°F' };

/**
 * How a unit is written for people in the exports (`%sat` → `%`, `C` → `°C`, `ph` → `pH`): the
 * unit of a column in README's table and of a FHIR Quantity; null for a dimensionless value.
 */
export function unitForPeople(unitId: string): string | null {
  return unitId === '' ? null : FOR_PEOPLE[unitId] ?? displayUnit(unitId);
}
