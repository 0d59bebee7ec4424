/**
 * Bounds in context. Soft lower bounds of arterial gas pressures are waived where the
 * barometric pressure is low, because extreme altitude makes such values real
 * (see the `boundsSource` of pao2 and paco2 in the field registry).
 */
import type { Bounds, FieldDef } from '../fields/registry';

export const LOW_PRESSURE_WAIVER_MMHG = 500;
const WAIVED_AT_ALTITUDE = new Set(['pao2', 'paco2', 'pvo2', 'pvco2', 'spo2', 'sao2']);

export interface BoundsContext {
  /** Barometric pressure in force, mmHg, when known. */
  readonly barometricMmhg: number | null;
}

export function softBounds(field: FieldDef, ctx: BoundsContext): Bounds | undefined {
  return softBoundsAt(field, ctx.barometricMmhg);
}

/** `softBounds` with the barometric pressure given alone (no context object per value). */
export function softBoundsAt(field: FieldDef, barometricMmhg: number | null): Bounds | undefined {
  const soft = field.soft;
  if (!soft) return undefined;
  if (barometricMmhg !== null && barometricMmhg < LOW_PRESSURE_WAIVER_MMHG && WAIVED_AT_ALTITUDE.has(field.id)) {
    return soft.max === undefined ? NO_BOUNDS : (WAIVED.get(field.id) ?? keepWaived(field.id, soft.max));
  }
  return soft;
}

const NO_BOUNDS: Bounds = Object.freeze({});
/** The waived bounds of each field, built once. */
const WAIVED = new Map<string, Bounds>();

function keepWaived(id: string, max: number): Bounds {
  const bounds = Object.freeze({ max });
  WAIVED.set(id, bounds);
  return bounds;
}

export function within(value: number, bounds: Bounds | undefined): boolean {
  if (!bounds) return true;
  if (bounds.min !== undefined && value < bounds.min) return false;
  if (bounds.max !== undefined && value > bounds.max) return false;
  return true;
}
