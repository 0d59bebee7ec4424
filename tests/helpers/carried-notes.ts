// Invented notes with ventilator settings carried into a later gas, shared by the tests of where a
// carried value came from (carried-origin-day) and of PN326 (old-setting-carried).

/** Settings at day 1 10:00, a gas on them, and a gas at day 3 08:00 on the same settings carried 46 h. */
export const CARRIED_46_H = [
  'patient   age 60 y, sex female, height 165 cm',
  '@ day 1 10:00 start',
  'vent      mode VC, vt 420, rate 16, peep 8, fio2 0.5',
  'abg       ph 7.38, pco2 42, po2 90',
  '@ day 3 08:00 later',
  'abg       ph 7.38, pco2 42, po2 70',
].join('\n');

/** A note with the ventilator set at day 1 10:00 and a gas at `time` (its line, `then`, first). */
export const gasLater = (time: string, then = ''): string => [
  '@ day 1 10:00 start',
  'vent      mode VC, vt 420, rate 16, peep 8, fio2 0.5',
  `@ ${time} later`,
  ...(then ? [then] : []),
  'abg       ph 7.38, pco2 42, po2 70',
].join('\n');
