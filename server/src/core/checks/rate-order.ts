/**
 * A measured respiratory rate below the rate set on the ventilator, in a mode that delivers every
 * set breath: the total rate cannot be lower than the set one, so one of the two is wrong.
 */
import { toRange } from '../syntax/tree';
import { formatShort } from '../util/format';
import { defineCheck } from './check';

/** Modes in which the ventilator delivers at least the set number of breaths a minute. */
export const MODES_WITH_SET_BREATHS: ReadonlySet<string> = new Set(['VC', 'PC', 'PRVC', 'SIMV']);

/** A count over a minute may differ by a breath from the setting (our convention). */
export const RATE_TOLERANCE_PER_MIN = 1;

export const rateBelowSet = defineCheck({
  code: 'PN309',
  alias: 'rate-below-set',
  title: 'Measured rate below the set ventilator rate',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: `The respiratory rate measured at a timepoint (vitals \`rr\`) is more than ${RATE_TOLERANCE_PER_MIN} breath a minute below the rate set on the ventilator, in a mode that delivers every set breath (${[...MODES_WITH_SET_BREATHS].join(', ')}). The total rate includes the set breaths, so it cannot be lower.`,
    example: '@ 08:00\nvent mode VC, vt 420, rate 30, peep 8\nvitals rr 8',
    fix: 'Check both rates (a rate written on the wrong line, or a setting changed since), and the mode. Minute ventilation uses the measured rate when there is one, so a wrong one changes it.',
  },
  source: 'ventilator modes: volume control, pressure control, PRVC and SIMV deliver at least the set number of breaths (common practice, no source); the tolerance of one breath a minute is our convention',
  runTimepoint(ctx) {
    const values = ctx.timepoint.values;
    // Compared without building the values: most timepoints have no measured rate, or no ventilator.
    if (values.originOf('rr') !== 'here') return;
    const measured = values.numberOf('rr');
    const set = values.numberOf('vent_rate');
    if (measured === null || set === null || measured >= set - RATE_TOLERANCE_PER_MIN) return;
    const mode = values.get('mode')?.stated.word ?? null;
    if (mode === null || !MODES_WITH_SET_BREATHS.has(mode)) return;
    const rr = values.get('rr');
    const setRate = values.get('vent_rate');
    if (!rr || !setRate) return;
    const o = setRate.origin;
    ctx.report({
      range: toRange(rr.stated.line, rr.stated.item.span),
      message: `Measured respiratory rate ${formatShort(measured)} /min is below the set rate ${formatShort(set)} /min in ${mode}, which delivers every set breath: check both rates.`,
      ...(o.kind === 'carried' || o.kind === 'here' || o.kind === 'header'
        ? { related: [{ range: toRange(o.line, o.span), message: o.kind === 'carried' ? `set rate ${formatShort(set)} /min, carried from here` : `set rate ${formatShort(set)} /min` }] }
        : {}),
    });
  },
});
