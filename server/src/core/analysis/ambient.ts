/** Barometric pressure in force, from a stated pressure or from altitude with the chosen model. */
import { barometricFromAltitudeStandard, barometricFromAltitudeWest } from '../physiology/atmosphere';
import type { Settings } from '../settings';

export function barometricFromAltitude(altitudeM: number, model: Settings['barometricModel']): number | null {
  return model === 'standard' ? barometricFromAltitudeStandard(altitudeM) : barometricFromAltitudeWest(altitudeM);
}
