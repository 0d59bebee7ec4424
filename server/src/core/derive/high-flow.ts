/**
 * How long high-flow nasal oxygen has run at a timepoint, and the ROX index read against the
 * thresholds of that hour (`roca-2019`). The timeline knows the run; a derived value reads it
 * through its context (`DeriveContext.highFlowHours`).
 */
import type { Timepoint } from '../analysis/model';
import { deviceInForce } from '../analysis/noninvasive-support';
import { ROX_FAILURE_BELOW, ROX_HOUR_WINDOW_H, ROX_SUCCESS_FROM, roxSideAt, roxThresholdHour } from '../physiology';
import { formatNumber, formatShort } from '../util/format';

/** Hours of high flow at a timepoint; `atLeast` where the run may have begun before the note (or before the look-back). */
export interface HighFlowHours {
  readonly hours: number;
  readonly atLeast: boolean;
}

/** The device word of high-flow nasal oxygen. */
const HIGH_FLOW = 'hfnc';

/** No run is looked back further than this (minutes): beyond the last hour a threshold is read at, only "at least" matters. */
const LOOK_BACK_MINUTES = (12 + ROX_HOUR_WINDOW_H) * 60;

/**
 * Whether high-flow nasal oxygen is the device in force at a timepoint (stated there, carried, or
 * kept by a later oxygen line that names no device): read through `deviceInForce`, the one reading
 * of the device the rest of the core asks (a device word is usable exactly when it is read).
 */
export function onHighFlow(tp: Timepoint): boolean {
  return deviceInForce(tp.values) === HIGH_FLOW;
}

/**
 * The hours of high flow at timepoint `index`: from the time of the timepoint where the current
 * uninterrupted run began (high flow in force there and not at the timepoint before it; another
 * device or room air ends a run, high flow named again continues it) to this timepoint's time.
 * Null where high flow is not in force here, where either time is unknown, or where the start's
 * time is after this one's. A run in force from the note's first timepoint may have begun before
 * the note: its hours are "at least" (`atLeast`), as are those of a run longer than the look-back.
 */
export function highFlowHoursAt(timepoints: readonly Timepoint[], index: number): HighFlowHours | null {
  const tp = timepoints[index];
  if (tp === undefined || !onHighFlow(tp)) return null;
  const now = tp.time.minutes;
  if (now === null) return null;
  let start = index;
  while (start > 0 && onHighFlow(timepoints[start - 1]!)) {
    start--;
    const at = timepoints[start]!.time.minutes;
    if (at !== null && at <= now && now - at > LOOK_BACK_MINUTES) return { hours: (now - at) / 60, atLeast: true };
  }
  const from = timepoints[start]!.time.minutes;
  if (from === null || from > now) return null;
  return { hours: (now - from) / 60, atLeast: start === 0 };
}

/** What a ROX index adds beside its number when read against the thresholds of its hour of high flow. */
export interface RoxAtHour {
  readonly note: string;
  readonly caveat: string;
}

/**
 * A ROX index (as shown, two decimals, so that the number read is the one compared) against the
 * thresholds of 2, 6 or 12 h of high flow where the hours are known (not "at least") and within
 * `ROX_HOUR_WINDOW_H` of one of them; else null. Source: `roca-2019`.
 */
export function roxAtHour(rox: number, run: HighFlowHours | null): RoxAtHour | null {
  if (run === null || run.atLeast) return null;
  const hour = roxThresholdHour(run.hours);
  if (hour === null) return null;
  const shown = formatNumber(rox, 2);
  const side = roxSideAt(Number(shown), hour);
  const failure = formatNumber(ROX_FAILURE_BELOW.get(hour)!, 2);
  const success = formatNumber(ROX_SUCCESS_FROM, 2);
  if (side === null) return null;
  const lead = `ROX ${shown} after ${formatShort(run.hours, 1)} h of high flow, read at ${hour} h`;
  if (side === 'failure') return { note: `${lead}: below ${failure}, the ${hour} h threshold associated with failure of high flow (Roca 2019)`, caveat: `${hour} h: < ${failure}` };
  if (side === 'success') return { note: `${lead}: ${success} or more, the threshold associated with success of high flow (Roca 2019)`, caveat: `${hour} h: ≥ ${success}` };
  return { note: `${lead}: between ${failure} and ${success}, the ${hour} h thresholds associated with failure and with success of high flow (Roca 2019)`, caveat: `${hour} h: ${failure}–${success}` };
}
