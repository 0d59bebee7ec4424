// The day and time a carried value came from, named wherever Pneumark says where it came from
// (show, hovers, readings, the JSON origin) when that was another day than the timepoint it is in
// force at. P/F = PaO2 ÷ FiO2 (ARDS Definition Task Force, JAMA 2012;307:2526–2533): PaO2 70 on
// the FiO2 0.5 carried from day 1 10:00 gives 140 at day 3 08:00, 2,760 min (46 h) later.
import { describe, expect, it } from 'vitest';
import { CARRIED_46_H, gasLater } from '../helpers/carried-notes';
import { checkNote } from '../../server/src/core';
import { hoverAt } from '../../server/src/core/service';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';
import { noteAt } from '../service/cursor';

const EXAMPLE = CARRIED_46_H;

const later = gasLater;

describe('where a value carried from another day came from', () => {
  it('names the day and time in readings, and not for a carry within the day', () => {
    const texts = checkNote(EXAMPLE).findings.filter((f) => f.code === 'PN410' && f.range.start.line === 5).map((f) => f.message);
    expect(texts).toContain('PaO2 70 mmHg on FiO2 0.50 (P/F 140 mmHg; FiO2 carried from day 1 10:00, line 3): consistent with impaired oxygenation supported by oxygen.');
    expect(texts.some((t) => t.includes('(FiO2 and PEEP carried from day 1 10:00, line 3)'))).toBe(true);
    const sameDay = checkNote(later('day 1 18:00')).findings.filter((f) => f.code === 'PN410').map((f) => f.message);
    expect(sameDay.some((t) => t.includes('(P/F 140 mmHg; FiO2 carried from line 2)'))).toBe(true);
  });

  it('names the day and time in the hover of a timepoint', () => {
    const marked = EXAMPLE.replace('@ day 3 08:00 later', '@ day 3 08:00 la|ter');
    const { result, position } = noteAt(marked);
    const md = hoverAt(result, position)!.markdown;
    expect(md).toContain('FiO2 0.50 (carried from start, day 1 10:00, line 3)');
    // A timepoint named by its time alone is not named twice.
    const unlabelled = noteAt(later('day 3 08:00').replace(' later', '').replace('@ day 1 10:00 start', '@ day 1 10:00').replace('@ day 3 08:00', '@ day 3 08:0|0'));
    expect(hoverAt(unlabelled.result, unlabelled.position)!.markdown).toContain('FiO2 0.50 (carried from day 1 10:00, line 2)');
  });

  it('names the day and time in show', async () => {
    const io = memoryIo({ stdin: EXAMPLE, env: { NO_COLOR: '1' }, tty: false });
    await run(['show', '-'], io);
    expect(io.out()).toContain('FiO2 0.50 (carried from start, day 1 10:00, line 3)');
    const sameDay = memoryIo({ stdin: later('day 1 18:00'), env: { NO_COLOR: '1' }, tty: false });
    await run(['show', '-'], sameDay);
    expect(sameDay.out()).toContain('FiO2 0.50 (carried from start, line 2)');
  });

  it('gives the minutes since a carried value was stated in its JSON origin, null where a time is unknown', async () => {
    const io = memoryIo({ stdin: EXAMPLE, env: { NO_COLOR: '1' }, tty: false });
    await run(['check', '--format', 'json', '-'], io);
    const tps = (JSON.parse(io.out()) as { files: { timepoints: { values: { field: string; origin: Record<string, unknown> }[] }[] }[] }).files[0]!.timepoints;
    expect(tps[1]!.values.find((v) => v.field === 'fio2')!.origin).toEqual({ kind: 'carried', line: 3, timepoint: 0, description: null, carriedMinutes: 2760 });
    // Stated here: no such key.
    expect(tps[0]!.values.find((v) => v.field === 'fio2')!.origin).toEqual({ kind: 'here', line: 3, timepoint: null, description: null });
    const untimed = memoryIo({ stdin: '@ start\noxygen fio2 0.4\n@ later\nabg 7.40/40/80/24', env: { NO_COLOR: '1' }, tty: false });
    await run(['check', '--format', 'json', '-'], untimed);
    const values = (JSON.parse(untimed.out()) as { files: { timepoints: { values: { field: string; origin: Record<string, unknown> }[] }[] }[] }).files[0]!.timepoints[1]!.values;
    expect(values.find((v) => v.field === 'fio2')!.origin['carriedMinutes']).toBeNull();
  });
});
