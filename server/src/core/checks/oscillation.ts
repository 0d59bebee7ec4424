/**
 * Settings of high-frequency oscillation (HFOV) under another mode: an oscillation amplitude is a
 * setting only an oscillator has, so one written where the mode in force is a conventional one
 * says that the mode or the key is mistaken (a mode line not updated, `amp` meant as something else).
 */
import { OSCILLATION_MODE } from '../physiology/mechanics';
import { toRange } from '../syntax/tree';
import { defineCheck, type TimepointContext } from './check';

/** Whether the mode in force at a timepoint is high-frequency oscillation. */
export function inHfov(at: TimepointContext): boolean {
  return at.timepoint.values.wordOf('mode') === OSCILLATION_MODE;
}

export const amplitudeOutsideHfov = defineCheck({
  code: 'PN313',
  alias: 'amplitude-outside-hfov',
  title: 'Oscillation amplitude under a mode other than HFOV',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: 'An oscillation amplitude (`amplitude`, `amp`) is written at a timepoint whose ventilator mode in force is not HFOV. The amplitude is the pressure swing of a high-frequency oscillator and a setting of no other mode, so the mode or the key is likely mistaken. Reported where the amplitude is written; not where no mode is known. An amplitude is dropped when the mode changes, so one set under HFOV is not carried into a later conventional mode.',
    example: '@ 08:00\nvent mode VC, vt 420 mL, rate 16, amp 40',
    fix: 'Write the mode the patient is on (`mode HFOV`), or remove the amplitude if another setting was meant.',
  },
  source: 'common practice, no source: the pressure amplitude is set on high-frequency oscillators only',
  runTimepoint(ctx) {
    const values = ctx.timepoint.values;
    // Asked without building the values: nearly every timepoint states no amplitude.
    if (values.originOf('amplitude') !== 'here') return;
    const mode = values.wordOf('mode');
    if (mode === null || mode === OSCILLATION_MODE) return;
    const amplitude = values.get('amplitude');
    if (!amplitude) return;
    // As written (`40 mbar`), or in cmH2O where no unit is.
    const item = amplitude.stated.item;
    const shown = `${item.value?.text ?? ''} ${item.unit?.text ?? 'cmH2O'}`;
    ctx.report({
      range: toRange(amplitude.stated.line, amplitude.stated.item.span),
      message: `Oscillation amplitude ${shown} is written under ${mode}: it is a setting of high-frequency oscillation (HFOV) only. Check the mode and the key.`,
    });
  },
});
