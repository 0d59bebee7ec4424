// `pneumark show` and the SpO2 target (invented notes): a target written is shown on its oxygen line
// and carried as other values are; the spo2Target setting's (read from pneumark.config.json) is shown
// on a line of its own where the note writes none, and checked against (PN327). The targets: BTS 2017
// (O'Driscoll BR, Howard LS, Earis J, Mak V, Thorax 2017;72(Suppl 1):ii1–ii90), 88–92 % and 94–98 %,
// from memory.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';

async function show(note: string, config: string | null = null, command = 'show'): Promise<string[]> {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-target-'));
  writeFileSync(join(dir, 'n.pneu'), note);
  if (config !== null) writeFileSync(join(dir, 'pneumark.config.json'), config);
  const io = memoryIo({ cwd: dir, env: { NO_COLOR: '1' }, tty: false });
  await run([command, 'n.pneu'], io);
  return io.out().split('\n');
}

describe('the SpO2 target in `pneumark show`', () => {
  it('is shown where written, as a range, and carried to later timepoints', async () => {
    const out = await show('@ day 1 09:00\noxygen cannula 2 L/min, target 88-92\n@ 10:00\noxygen room air\nvitals spo2 90\n');
    expect(out).toContain('  oxygen   device cannula · flow 2.0 L/min · SpO2 target 88–92 %');
    expect(out.find((l) => l.startsWith('  carried '))).toBe('  carried  SpO2 target 88–92 % (carried from day 1 09:00, line 2)');
    expect(out.some((l) => l.startsWith('  target '))).toBe(false);
  });

  it('names the setting\'s target where the note writes none, and checks against it', async () => {
    const out = await show('@ day 1 09:00\noxygen cannula 2 L/min\nvitals spo2 96\n', '{ "spo2Target": "88-92" }\n');
    expect(out).toContain('  target   SpO2 target 88–92 % (spo2Target setting)');
    expect(out.some((l) => l.includes('PN327') && l.includes('SpO2 96 % on oxygen (cannula) is above the target 88–92 % of the spo2Target setting.'))).toBe(true);
    expect((await show('@ day 1 09:00\noxygen cannula 2 L/min\nvitals spo2 96\n')).some((l) => l.startsWith('  target '))).toBe(false);
  });
});

describe('a target written with blanks around its dash, or with a decimal end, on the command line', () => {
  it('`show` reads `88 – 92` as the range 88–92 %, and `fmt` writes it `88-92`', async () => {
    const note = '@ day 1 09:00\noxygen    cannula 2 L/min, target 88 – 92 %\nvitals    spo2 96\n';
    const out = await show(note);
    expect(out).toContain('  oxygen   device cannula · flow 2.0 L/min · SpO2 target 88–92 %');
    expect(out.some((l) => l.includes('PN327') && l.includes('above the target 88–92 % written at this timepoint'))).toBe(true);
    expect(out.some((l) => l.includes('PN102') || l.includes('PN105'))).toBe(false);
    expect(await show(note, null, 'fmt')).toEqual(['@ day 1 09:00', 'oxygen    cannula 2 L/min, target 88-92 %', 'vitals    spo2 96', '']);
  });

  it('`show` gives a decimal end as written and says PN302 with the rounded range', async () => {
    const out = await show('@ day 1 09:00\noxygen cannula 2 L/min, target 88.5-92\n');
    expect(out).toContain('  oxygen   device cannula · flow 2.0 L/min · SpO2 target 88.5–92 %');
    expect(out.some((l) => l.includes('PN302') && l.includes('rounded, it is 89-92'))).toBe(true);
  });
});
