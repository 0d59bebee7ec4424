/**
 * Bounds in context. Soft lower bounds of arterial gas pressures are waived where the
 * barometric pressure is low, because extreme altitude makes such values real
 * (see the `boundsSource` of pao2 and paco2 in the field registry).
 */
import type { Bounds, FieldDef } from '../fields/registry';
import { convert, unitById, type UnitDef } from '../fields/units';
import { halfLastDigit } from '../util/format';

export const LOW_PRESSURE_WAIVER_MMHG = 500;
const WAIVED_AT_ALTITUDE = new Set(['pao2', 'paco2', 'pvo2', 'pvco2', 'spo2', 'sao2']);

export interface BoundsContext {
  /** Barometric pressure in force, mmHg, when known. */
  readonly barometricMmhg: number | null;
}

/**
 * The lowest usual tidal volume, mL per kg of body size: half the 4 mL/kg predicted body weight at
 * the bottom of the ARDS Network protocol's range, to leave room for ultra-protective settings
 * (common practice, no source). With no body size in force, the tidal volume's soft minimum in the
 * field registry applies: this figure times the 25 kg soft minimum of weight (50 mL).
 */
export const VT_USUAL_MIN_ML_PER_KG = 2;

/**
 * The soft bounds of a field where the barometric pressure in force is `barometricMmhg` (null:
 * unknown) and the patient's body size is `bodyKg` (the smaller of the weight and the predicted
 * body weight in force; null: unknown). A tidal volume's usual minimum follows the body size when
 * one is known (`VT_USUAL_MIN_ML_PER_KG`): 5 mL is usual only for the smallest infants.
 */
export function softBoundsAt(field: FieldDef, barometricMmhg: number | null, bodyKg: number | null = null): Bounds | undefined {
  const soft = field.soft;
  if (!soft) return undefined;
  if (bodyKg !== null && bodyKg > 0 && field.id === 'vt') return { min: VT_USUAL_MIN_ML_PER_KG * bodyKg, max: soft.max };
  if (barometricMmhg !== null && barometricMmhg < LOW_PRESSURE_WAIVER_MMHG && WAIVED_AT_ALTITUDE.has(field.id)) {
    return soft.max === undefined ? {} : { max: soft.max };
  }
  return soft;
}

/**
 * Where a bare number is read in the unit in force without doubt (see `FieldDef.doubt`): the
 * field's doubt window, else its soft bounds, with the same waiver at low barometric pressure.
 */
export function doubtBoundsAt(field: FieldDef, barometricMmhg: number | null): Bounds | undefined {
  const doubt = field.doubt;
  if (!doubt) return softBoundsAt(field, barometricMmhg);
  if (barometricMmhg !== null && barometricMmhg < LOW_PRESSURE_WAIVER_MMHG && WAIVED_AT_ALTITUDE.has(field.id)) {
    return doubt.max === undefined ? {} : { max: doubt.max };
  }
  return doubt;
}

export function within(value: number, bounds: Bounds | undefined): boolean {
  if (!bounds) return true;
  if (bounds.min !== undefined && value < bounds.min) return false;
  if (bounds.max !== undefined && value > bounds.max) return false;
  return true;
}

/**
 * Whether `value` (in the field's own unit) lies within usual `bounds` at the precision it was
 * written with. A number written in another unit than the field's own carries a rounding of the
 * conversion that its writer did not make: 20.0 kPa is 150.01 mmHg, yet written to a tenth of a
 * kPa it is the usual maximum of PaCO2, 150 mmHg. Such a number lies within when some number it
 * can stand for (its last written digit give or take a half) does. A number in the field's own
 * unit is compared as it is. `readUnit`: the unit it was read in; `text`: the number as written.
 */
export function withinAsWritten(value: number, bounds: Bounds | undefined, field: FieldDef, readUnit: string | null, text: string | null): boolean {
  if (within(value, bounds)) return true;
  if (!bounds || readUnit === null || text === null || readUnit === field.unit) return false;
  const from = unitById(readUnit);
  const canonical = unitById(field.unit ?? '');
  const written = from && canonical ? convert(value, canonical, from) : null;
  if (!from || !canonical || written === null) return false;
  const half = halfLastDigit(text);
  const a = convert(written - half, from, canonical);
  const b = convert(written + half, from, canonical);
  if (a === null || b === null) return false;
  const low = Math.min(a, b);
  const high = Math.max(a, b);
  return (bounds.min === undefined || high >= bounds.min) && (bounds.max === undefined || low <= bounds.max);
}

/**
 * The field's units, other than `except`, in which the number as written (`written`) lies within
 * every one of `bounds` once read into the field's canonical unit: where a number written or
 * read in one unit would be ordinary (PN204 for a bare number, PN301's fix for a written unit).
 */
export function unitsWithin(field: FieldDef, written: number, except: string | null, ...bounds: readonly (Bounds | undefined)[]): UnitDef[] {
  const canonical = unitById(field.unit ?? '');
  const out: UnitDef[] = [];
  if (!canonical) return out;
  for (const id of field.units ?? []) {
    if (id === except) continue;
    const unit = unitById(id);
    const value = unit ? convert(written, unit, canonical) : null;
    if (unit && value !== null && bounds.every((b) => within(value, b))) out.push(unit);
  }
  return out;
}
