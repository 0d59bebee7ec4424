/**
 * The set inspiratory pressure of pressure control (`pinsp`) is read above PEEP, as pressure
 * support is. During a pressure-controlled breath the ventilator holds the airway at PEEP plus that
 * pressure, so the measured peak reads about their sum. A peak near `pinsp` itself and well below
 * the sum says the note wrote the absolute inspiratory level as `pinsp` (PN317).
 */
import { forBand } from '../physiology/numeric';
import { toRange } from '../syntax/tree';
import { formatShort } from '../util/format';
import { defineCheck } from './check';
import { carriedFromText } from '../present';

/** Below this PEEP the two readings of `pinsp` are too close to tell apart (our threshold). */
const MIN_PEEP_CMH2O = 5;
/** How near `pinsp` the peak must be to read as the absolute level (our tolerance). */
const NEAR_PINSP_CMH2O = 2;
/** How far below PEEP + `pinsp` the peak must be to doubt the sum (our tolerance). */
const BELOW_SUM_CMH2O = 4;

export const peakNearAbsolutePinsp = defineCheck({
  code: 'PN317',
  alias: 'pinsp-written-absolute',
  title: 'Peak pressure near the set inspiratory pressure, well below PEEP plus it',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: 'At one timepoint a set inspiratory pressure (`pinsp`), a PEEP of at least 5 cmH2O and a measured peak pressure are in force (the settings stated or carried, the peak stated there), and the peak is within 2 cmH2O of `pinsp` while more than 4 cmH2O below PEEP + `pinsp`, with `pinsp` above PEEP. Pneumark reads `pinsp` as the pressure above PEEP, so a pressure-controlled breath should peak at about PEEP + `pinsp`; a peak near `pinsp` itself is consistent with the absolute inspiratory level written as `pinsp`. A warning, not an error: the setting is then exported PEEP too high, but a peak below the set level can be real (a leak, a breath that does not reach its target). Reported on `pinsp` where it is written at that timepoint, else on the peak.',
    example: '@ 08:00\nvent mode PC, pinsp 26, peep 8, rate 20, peak 27',
    fix: 'Write the pressure above PEEP: the absolute level less PEEP (`pinsp 18` for a level of 26 with PEEP 8); the quick fix does it where `pinsp` is written in cmH2O. If `pinsp` is above PEEP already, check the peak.',
  },
  source: 'common practice, no source: in pressure control the airway is held at PEEP plus the set inspiratory pressure during inspiration, so the peak airway pressure is about their sum',
  runTimepoint(ctx) {
    const values = ctx.timepoint.values;
    // The usable numbers in force, asked without building the values: nearly every timepoint has no `pinsp` or no peak.
    const pinsp = values.numberOf('insp_pressure');
    if (pinsp === null) return;
    const peak = values.numberOf('peak');
    const peep = values.numberOf('peep');
    if (peak === null || peep === null || peep < MIN_PEEP_CMH2O || pinsp <= peep) return;
    const sum = pinsp + peep;
    // Differences as on paper (22 − 20 is 2, never 2.0000000000000018).
    if (forBand(Math.abs(peak - pinsp)) > NEAR_PINSP_CMH2O || forBand(sum - peak) <= BELOW_SUM_CMH2O) return;
    const pinspInput = values.get('insp_pressure');
    const peakInput = values.get('peak');
    const stated = pinspInput!.stated;
    const here = pinspInput!.origin.kind === 'here';
    const above = formatShort(pinsp - peep);
    const shownPinsp = formatShort(pinsp);
    const origin = pinspInput!.origin;
    // The fix writes the number alone: only where the number written is the one read (cmH2O).
    const value = stated.item.value;
    const written = value?.kind === 'number' ? value.value : null;
    ctx.report({
      range: here ? toRange(stated.line, stated.item.span) : toRange(peakInput!.stated.line, peakInput!.stated.item.span),
      message: `Peak pressure ${formatShort(peak)} cmH2O is near \`pinsp\` ${shownPinsp} cmH2O, well below PEEP ${formatShort(peep)} + \`pinsp\` ${shownPinsp} = ${formatShort(sum)} cmH2O: consistent with the absolute inspiratory level written as \`pinsp\`, which Pneumark reads as the pressure above PEEP. If ${shownPinsp} is the absolute level, write \`pinsp ${above}\` (${shownPinsp} less PEEP ${formatShort(peep)}).`,
      fixes: here && value && written === pinsp
        ? [{ title: `Write \`pinsp ${above}\` (the level less PEEP)`, edits: [{ range: toRange(stated.line, value.span), newText: above }], preferred: false }]
        : [],
      ...(origin.kind === 'carried' || origin.kind === 'header' ? { related: [{ range: toRange(origin.line, origin.span), message: origin.kind === 'carried' ? carriedFromText(origin, 'here') : 'carried from here' }] } : {}),
    });
  },
});
