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

/**
 * A volume and a rate set at day 1 08:00 and carried 50 h to a plateau and a measured rate, with
 * PEEP and FiO2 written again there: compliance and VE rest on the old volume alone.
 */
export const CARRIED_VOLUME = [
  '@ day 1 08:00',
  'vent      mode VC, vt 450, rate 14, peep 5, fio2 0.4',
  '@ day 3 10:00',
  'vent      peep 5, fio2 0.4',
  'vent      plateau 24',
  'vitals    rr 16',
].join('\n');
