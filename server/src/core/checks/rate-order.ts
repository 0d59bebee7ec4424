/**
 * Rates on the ventilator: a measured respiratory rate below the rate set in a mode that delivers
 * every set breath (the total rate cannot be lower than the set one, so one of the two is wrong),
 * and a set rate of 0 in such a mode (no mandatory breath would be given).
 */
import { MODES_WITH_SET_BREATHS } from '../physiology';
import { toRange } from '../syntax/tree';
import { formatShort } from '../util/format';
import { defineCheck } from './check';
import { carriedFromText } from '../present';

export { MODES_WITH_SET_BREATHS };

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
    const mode = values.wordOf('mode');
    if (mode === null || !MODES_WITH_SET_BREATHS.has(mode)) return;
    const rr = values.get('rr');
    const setRate = values.get('vent_rate');
    if (!rr || !setRate) return;
    const o = setRate.origin;
    ctx.report({
      range: toRange(rr.stated.line, rr.stated.item.span),
      message: `Measured respiratory rate ${formatShort(measured)} /min is below the set rate ${formatShort(set)} /min in ${mode}, which delivers every set breath: check both rates.`,
      ...(o.kind === 'carried' || o.kind === 'here' || o.kind === 'header'
        ? { related: [{ range: toRange(o.line, o.span), message: o.kind === 'carried' ? `set rate ${formatShort(set)} /min, ${carriedFromText(o, 'here')}` : `set rate ${formatShort(set)} /min` }] }
        : {}),
    });
  },
});

export const setRateZero = defineCheck({
  code: 'PN312',
  alias: 'set-rate-zero',
  title: 'Set rate of 0 in a mode with mandatory breaths',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: `The set ventilator rate is 0 in a mode that delivers mandatory breaths (${[...MODES_WITH_SET_BREATHS].join(', ')}): such a mode would give no breath unless the patient triggers one, so the rate or the mode is likely mistyped. Reported where the rate or the mode is written. Spontaneous modes (PS, CPAP) and a vent line without a mode are not reported. Nor is APRV: its rate is the release frequency, and with no releases the patient breathes spontaneously at the high pressure, a CPAP-like state that may be meant (the last step of a wean from APRV before the mode is changed to CPAP), so it is treated as a spontaneous mode. Without a measured rate (vitals \`rr\`), minute ventilation and what follows from it (mechanical power, ventilatory ratio) are withheld rather than shown as 0.`,
    example: '@ 08:00\nvent mode VC, vt 420 mL, rate 0, peep 8',
    fix: 'Write the set rate (`rate 16`), or the mode the patient is on (`mode PS`) if the breaths are spontaneous. A measured rate on the vitals line gives the minute ventilation.',
  },
  source: 'common practice, no source: volume control, pressure control, PRVC and SIMV deliver at least the set number of breaths; APRV with no releases is continuous pressure with spontaneous breathing',
  // APRV is left out on purpose (see the doc): a release rate of 0 is unusual but describes a state
  // that may be meant, not a contradiction; minute ventilation then needs a measured rate, as in PS.
  runTimepoint(ctx) {
    const values = ctx.timepoint.values;
    // Asked without building the values: most timepoints set no rate of 0.
    if (values.numberOf('vent_rate') !== 0) return;
    const rateOrigin = values.originOf('vent_rate');
    if (rateOrigin !== 'here' && values.originOf('mode') !== 'here') return;
    const mode = values.get('mode');
    const word = mode?.stated.word ?? null;
    if (!mode || word === null || !MODES_WITH_SET_BREATHS.has(word)) return;
    const rate = values.get('vent_rate');
    if (!rate) return;
    const here = rate.origin.kind === 'here';
    const anchor = here ? rate.stated : mode.stated;
    const o = rate.origin;
    ctx.report({
      range: toRange(anchor.line, here ? anchor.item.value?.span ?? anchor.item.span : anchor.item.span),
      message: `Set rate 0 /min in ${word}, which delivers mandatory breaths: no breath would be given unless the patient triggers one. Check the rate and the mode; minute ventilation is ${values.originOf('rr') === 'here' ? 'worked out from the measured rate' : 'not worked out from a rate of 0'}.`,
      ...(!here && (o.kind === 'carried' || o.kind === 'header')
        ? { related: [{ range: toRange(o.line, o.span), message: o.kind === 'carried' ? `set rate 0 /min, ${carriedFromText(o, 'here')}` : 'set rate 0 /min, carried from here' }] }
        : {}),
    });
  },
});
