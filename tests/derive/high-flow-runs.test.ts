// The hours of high flow are worked out once per analysis (`HighFlowRuns`, one pass over the
// timeline) rather than by walking back from each timepoint a ROX index is read at. They must be
// what the walk gave: the walk is kept here as the reference, as it was written before the change,
// and both are compared at every timepoint of generated notes and of a note of 500 timepoints.
// Invented patients and times. The thresholds the hours are read against: Roca O, Caralt B, Messika
// J, et al. An index combining respiratory rate and oxygenation to predict outcome of nasal
// high-flow therapy. Am J Respir Crit Care Med 2019;199(11):1368–1376 (see tests/derive/rox-hours.test.ts).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import '../helpers/property-seed';
import type { Timepoint } from '../../server/src/core/analysis/model';
import { checkNote } from '../../server/src/core/check-note';
import { HighFlowRuns, highFlowHoursAt, onHighFlow, type HighFlowHours } from '../../server/src/core/derive/high-flow';
import { ROX_HOUR_WINDOW_H } from '../../server/src/core/physiology';

/** The walk back from each timepoint, as derive/high-flow.ts had it (its look-back: 12 h + the window). */
function walkedHours(timepoints: readonly Timepoint[], index: number): HighFlowHours | null {
  const lookBack = (12 + ROX_HOUR_WINDOW_H) * 60;
  const tp = timepoints[index];
  if (tp === undefined || !onHighFlow(tp)) return null;
  const now = tp.time.minutes;
  if (now === null) return null;
  let start = index;
  while (start > 0 && onHighFlow(timepoints[start - 1]!)) {
    start--;
    const at = timepoints[start]!.time.minutes;
    if (at !== null && at <= now && now - at > lookBack) return { hours: (now - at) / 60, atLeast: true };
  }
  const from = timepoints[start]!.time.minutes;
  if (from === null || from > now) return null;
  return { hours: (now - from) / 60, atLeast: start === 0 };
}

const both = (text: string) => {
  const tps = checkNote(text).analysis.timeline.timepoints;
  const runs = new HighFlowRuns(tps);
  return { once: tps.map((_, i) => runs.at(i)), walked: tps.map((_, i) => walkedHours(tps, i)), tps };
};

const TIMES = ['@ 08:00', '@ 09:30', '@ 07:00', '@ 23:45', '@ +1h', '@ +20min', '@ +5h30', '@ +9h', '@ day 2 06:00', '@ day 1 12:00', '@ review', '@ day 3'];
const OXYGEN = ['oxygen hfnc 50 L/min, fio2 0.6', 'oxygen hfnc 40 L/min, fio2 0.45', 'oxygen fio2 0.5', 'oxygen mask 10 L/min', 'oxygen room air', 'oxygen nc 2 L/min', null, null, null];

describe('the hours of high flow, worked out once per timeline, are those of the walk back from each timepoint', () => {
  it('at every timepoint of generated notes: clock times, offsets, days, times unknown or earlier, devices changed, carried or kept', () => {
    fc.assert(fc.property(fc.array(fc.tuple(fc.constantFrom(...TIMES), fc.constantFrom(...OXYGEN)), { minLength: 1, maxLength: 40 }), (rows) => {
      const text = `patient age 58 y\n${rows.map(([time, oxygen]) => `${time}\n${oxygen === null ? '' : `${oxygen}\n`}vitals rr 28, spo2 92 %`).join('\n')}\n`;
      const { once, walked } = both(text);
      expect(once).toEqual(walked);
    }), { numRuns: 200 });
  });

  it('at each of 500 timepoints of high flow every 10 minutes for 83 h, and each of 500 at one time (the walk\'s worst case)', () => {
    // Every 10 minutes from 08:00: the look-back (12 h and the 1 h window, 780 min) reaches back 78
    // timepoints; at 500 timepoints 4,990 minutes, 83.2 h. Where all share one time the walk went back to the run's start each time.
    const every10 = `patient age 71 y\n@ day 1 08:00\noxygen hfnc 50 L/min, fio2 0.5\nvitals rr 26, spo2 94 %\n${Array.from({ length: 499 }, () => '@ +10min\nvitals rr 24, spo2 95 %').join('\n')}\n`;
    const a = both(every10);
    expect(a.tps).toHaveLength(500);
    expect(a.once).toEqual(a.walked);
    // From the note's first timepoint: at least; 499 × 10 min = 83.17 h at the last, 1 h at the 7th.
    expect(a.once[6]).toEqual({ hours: 1, atLeast: true });
    expect(a.once[499]!.atLeast).toBe(true);
    // Room air first: the run begins at the second timepoint and is known until the look-back.
    const fromSecond = every10.replace('@ day 1 08:00\noxygen hfnc 50 L/min, fio2 0.5', '@ day 1 07:50\noxygen room air\n@ +10min\noxygen hfnc 50 L/min, fio2 0.5');
    const b = both(fromSecond);
    expect(b.once).toEqual(b.walked);
    expect(b.once[13]).toEqual({ hours: 2, atLeast: false });
    // 79 × 10 min after the start (timepoint 1, 08:00): 13 h, the look-back, still known; 80 more than it.
    expect(b.once[79]).toEqual({ hours: 13, atLeast: false });
    expect(b.once[80]).toEqual({ hours: 790 / 60, atLeast: true });
    const oneTime = `patient age 71 y\n${Array.from({ length: 500 }, (_, i) => `@ day 1 08:00 round ${i}\n${i === 0 ? 'oxygen hfnc 50 L/min, fio2 0.5\n' : ''}vitals rr 24, spo2 95 %`).join('\n')}\n`;
    const c = both(oneTime);
    expect(c.tps).toHaveLength(500);
    expect(c.once).toEqual(c.walked);
    expect(c.once[499]).toEqual({ hours: 0, atLeast: true });
  });

  it('for one timepoint (`highFlowHoursAt`) as for the whole timeline', () => {
    const text = '@ 07:00\noxygen room air\n@ 09:00\noxygen hfnc 50 L/min, fio2 0.6\n@ 15:00\nvitals rr 45, spo2 88 %\n';
    const tps = checkNote(text).analysis.timeline.timepoints;
    expect(tps.map((_, i) => highFlowHoursAt(tps, i))).toEqual([null, { hours: 0, atLeast: false }, { hours: 6, atLeast: false }]);
    expect(new HighFlowRuns(tps).at(7)).toBeNull();
  });
});
