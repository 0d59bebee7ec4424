// What `show` calls the values of a vent line. A field with no short name of its own was shown by its
// first key, in lower case: the exhaled minute volume read off the ventilator as `ve 8.4 L/min`, one
// line above the derived `VE 9.8 L/min` (VT × rate), two minute volumes by one name; the ventilatory
// ratio is worked out from the measured one where it is written, so a reader who checked it against
// the VE shown got another number. The measured one is now `VE meas`, and pressure support `PS`,
// as the other airway pressures are written (PEEP, Pinsp).
import { describe, expect, it } from 'vitest';
import { memoryIo } from '../helpers/memory-io';
import { run } from '../../server/src/cli/main';

async function show(text: string): Promise<string> {
  const io = memoryIo({ stdin: text, env: { NO_COLOR: '1' } });
  await run(['show', '-'], io);
  return io.out();
}

describe('names of vent-line values in show', () => {
  it('tells the measured minute volume from the derived one, and writes pressure support as PS', async () => {
    const out = await show('patient age 45 y, sex female, height 165 cm\n@ 10:00\nvent mode PS, ps 10, peep 5, fio2 0.4, vt 410 mL, ve 8.4\nvitals rr 24\nabg 7.36/44/70/24\n');
    expect(out).toContain('mode PS · PS 10 cmH2O · PEEP 5 cmH2O · FiO2 0.40 · VT 410 mL (measured) · VE meas 8.4 L/min');
    // VT × RR = 410 × 24 ÷ 1000 = 9.84 L/min (common practice, no source), shown beside it as VE.
    expect(out).toMatch(/derived .*· VE 9\.8 L\/min ·/);
    expect(out).not.toMatch(/· ve 8\.4/);
  });
});
