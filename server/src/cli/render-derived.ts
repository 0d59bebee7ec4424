/** Derived values and interpretations under a timepoint (filled in by the physiology layer). */
import type { Timepoint } from '../core/analysis/model';
import type { Paint } from './colour';

export function renderDerived(_tp: Timepoint, _p: Paint): string[] {
  return [];
}
