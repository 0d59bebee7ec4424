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
 * the note: its hours are "at least" (`atLeast`), as are those of a run longer than the look-back
 * (from the latest earlier timepoint of the run that is more than LOOK_BACK_MINUTES before this one).
 *
 * For one timepoint: it goes over the timeline once. An analysis keeps one `HighFlowRuns` and asks
 * it (`deriverFor` in analysis/analyse.ts).
 */
export function highFlowHoursAt(timepoints: readonly Timepoint[], index: number): HighFlowHours | null {
  return new HighFlowRuns(timepoints).at(index);
}

/**
 * The hours of high flow of every timepoint of a timeline (`highFlowHoursAt`), worked out in one
 * pass when made: where each run begins is known as the pass reaches it, not walked back to from
 * each timepoint a ROX index is read at (which made a long run of high flow quadratic in its
 * timepoints). The look-back keeps, for the run so far, the timepoints with a time that no later
 * one of the run undercuts (their times rise with their order); the latest of them more than
 * LOOK_BACK_MINUTES before a timepoint is found by halving, so the pass is n log n at worst and
 * about linear where the times rise. Kept per analysis: hours in one typed array (NaN: none) and
 * the "at least" marks in another, an answer made when asked.
 */
export class HighFlowRuns {
  private readonly hours: Float64Array;
  private readonly atLeast: Uint8Array;

  constructor(timepoints: readonly Timepoint[]) {
    const n = timepoints.length;
    const hours = new Float64Array(n).fill(Number.NaN);
    const atLeast = new Uint8Array(n);
    // The run so far: its first timepoint, and the rising times of the look-back (indexes in `rising`).
    const rising = new Int32Array(n);
    let top = 0;
    let start = -1;
    let previousOn = false;
    for (let i = 0; i < n; i++) {
      const tp = timepoints[i]!;
      if (!onHighFlow(tp)) {
        previousOn = false;
        continue;
      }
      if (!previousOn) {
        start = i;
        top = 0;
      }
      previousOn = true;
      const now = tp.time.minutes;
      if (now === null) continue;
      // The latest earlier timepoint of the run more than the look-back before now: among the rising
      // times, those that are form a prefix, and its last is the latest of all that are.
      let low = 0;
      let high = top;
      while (low < high) {
        const mid = (low + high) >>> 1;
        if (beyondLookBack(timepoints[rising[mid]!]!.time.minutes!, now)) low = mid + 1;
        else high = mid;
      }
      if (low > 0) {
        hours[i] = (now - timepoints[rising[low - 1]!]!.time.minutes!) / 60;
        atLeast[i] = 1;
      } else {
        const from = timepoints[start]!.time.minutes;
        if (from !== null && from <= now) {
          hours[i] = (now - from) / 60;
          atLeast[i] = start === 0 ? 1 : 0;
        }
      }
      // This timepoint joins the look-back of the later ones: an earlier one at the same time or
      // later is never the latest that is beyond it.
      while (top > 0 && timepoints[rising[top - 1]!]!.time.minutes! >= now) top--;
      rising[top++] = i;
    }
    this.hours = hours;
    this.atLeast = atLeast;
  }

  /** The hours of high flow at timepoint `index`; null where there are none (see `highFlowHoursAt`). */
  at(index: number): HighFlowHours | null {
    const hours = this.hours[index];
    if (hours === undefined || Number.isNaN(hours)) return null;
    return { hours, atLeast: this.atLeast[index] === 1 };
  }
}

/** Whether an earlier time of a run (minutes) is more than the look-back before `now`. */
function beyondLookBack(at: number, now: number): boolean {
  return at <= now && now - at > LOOK_BACK_MINUTES;
}

/** The last hour of high flow a ROX index is read at (12 h and its window): "at least" more than this can be read at none. */
const LAST_WINDOW_END_H = Math.max(...ROX_FAILURE_BELOW.keys()) + ROX_HOUR_WINDOW_H;

/** The few words beside a ROX index of a run whose start is not in the note (`show`, the inlay hint). */
export const START_NOT_IN_NOTE = 'start of high flow not in the note';

/**
 * Why a ROX index of a run in force from the note's first timepoint is not read against the
 * thresholds of its hour, and how to write when high flow began: the oxygen line in force before it,
 * at an earlier timepoint (the run then begins at the first timepoint on high flow after it).
 */
function startNotInNote(hours: number): RoxAtHour {
  const since = hours > 0 ? `, ${formatShort(hours, 1)} h before this one,` : '';
  return {
    note: `not read against the 2, 6 or 12 h thresholds (Roca 2019): high flow is in force from the note's first timepoint${since} and may have begun before it, so its hours are not known. To have them counted, write what the patient had before high flow at an earlier timepoint (\`oxygen room air\` or \`oxygen cannula 2 L/min\`, with its time): high flow then counts from the first timepoint that names it`,
    caveat: START_NOT_IN_NOTE,
  };
}

/** What a ROX index adds beside its number when read against the thresholds of its hour of high flow. */
export interface RoxAtHour {
  readonly note: string;
  readonly caveat: string;
}

/**
 * A ROX index (as shown, two decimals, so that the number read is the one compared) against the
 * thresholds of 2, 6 or 12 h of high flow where the hours are known (not "at least") and within
 * `ROX_HOUR_WINDOW_H` of one of them; else null. Source: `roca-2019`. Where the hours are "at
 * least" and could still be within a window (high flow in force from the note's first timepoint,
 * so that when it began is not in the note), why it is not read, and how to write the start
 * (`START_NOT_IN_NOTE`): said rather than left silent.
 */
export function roxAtHour(rox: number, run: HighFlowHours | null): RoxAtHour | null {
  if (run === null) return null;
  if (run.atLeast) return run.hours <= LAST_WINDOW_END_H ? startNotInNote(run.hours) : null;
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
