/** Timepoints must move forward in time. */
import { toRange } from '../syntax/tree';
import { defineCheck } from './check';

export const timeGoesBack = defineCheck({
  code: 'PN308',
  alias: 'time-goes-back',
  title: 'Timepoint earlier than the one before',
  severity: 'warning',
  tags: ['timeline'],
  doc: {
    fires: 'A timepoint with an explicit day is earlier than the timepoint before it, by its time or, when it has no time of day (`@ day 2`), by its day. (A clock time without a day that is earlier than the previous one is read as the next day.)',
    example: '@ day 2 08:00\n@ day 1 09:00',
    fix: 'Put timepoints in order, or correct the day.',
  },
  source: 'format rule (grammar/README.md)',
  run(ctx) {
    // The latest time and the latest day read so far: a day without a time of day (`@ day 2`) is
    // compared by its day, so `@ day 2` after `@ day 3` goes back as `@ day 2 08:00` would.
    let lastMinutes: number | null = null;
    let lastDay: number | null = null;
    const { tree, timeline } = ctx.analysis;
    for (const tp of timeline.timepoints) {
      const { day, minutes } = tp.time;
      const back = (minutes !== null && lastMinutes !== null && minutes < lastMinutes) || (day !== null && lastDay !== null && day < lastDay);
      if (back && tp.line !== null) {
        const node = tree.lines[tp.line];
        const span = node?.kind === 'timepoint' && node.time ? node.time.span : { start: 0, end: node?.text.length ?? 0 };
        // Named by its time as written: its label may be any words (`@ day 1 00:39  but this is`).
        const time = node?.kind === 'timepoint' && node.time ? `@ ${node.time.text}` : tp.label;
        ctx.report({ range: toRange(tp.line, span), message: `This timepoint (${time}) is earlier than the one before it.` });
      }
      if (minutes !== null) lastMinutes = minutes;
      if (day !== null) lastDay = day;
    }
  },
});
