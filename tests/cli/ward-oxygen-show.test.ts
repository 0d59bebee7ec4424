// `pneumark show` on ward oxygen notes (invented patients). Inspired PO2 of humidified gas = FiO2 ×
// (PB − 47), water vapour 47 mmHg at 37 °C (West JB, Respiratory Physiology: The Essentials, from
// memory; common practice): on air 0.21 × 713 = 149.7 mmHg at PB 760 and 0.21 × 553 = 116.1 mmHg at
// PB 600, where the dry inspired PO2 (0.21 × PB) would be 159.6 and 126 mmHg. Which of the two is
// shown must be said where it is read.
import { describe, expect, it } from 'vitest';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';

async function show(note: string): Promise<string[]> {
  const io = memoryIo({ stdin: note, env: { NO_COLOR: '1' }, tty: false });
  await run(['show', '-'], io);
  return io.out().split('\n');
}

const onAir = (place: string) => `patient age 45 y, sex male, height 178 cm\n${place}@ day 1 09:00\noxygen room air\nvitals spo2 95 %\nabg ph 7.41, pco2 38, po2 82\n`;

describe('the inspired PO2 in `pneumark show`', () => {
  it('is the humidified one, 150 mmHg on air at sea level and 116 mmHg at PB 600, and the legend says so', async () => {
    const sea = await show(onAir(''));
    expect(sea.find((l) => l.startsWith('  derived '))).toMatch(/ PiO2 150 mmHg /);
    expect(sea.some((l) => /^ {2}PiO2 {2,}Inspired PO2 of humidified gas, in mmHg$/.test(l))).toBe(true);
    const high = await show(onAir('place barometric 600 mmHg\n'));
    expect(high.find((l) => l.startsWith('  derived '))).toMatch(/ PiO2 116 mmHg /);
  });
});
