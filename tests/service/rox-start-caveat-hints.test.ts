// The ROX index ((SpO2 ÷ FiO2) ÷ RR; Roca O, Caralt B, Messika J, et al. Am J Respir Crit Care Med
// 2019;199:1368–1376, thresholds read in its abstract) of a run of high flow in force from the note's
// first timepoint is not read against the 2, 6 or 12 h thresholds: when high flow began is not in
// the note. The caveat "(start of high flow not in the note)" is the same at every ROX of that run;
// the inlay hints say it once a note, beside the first ROX that has it, and not on the later ones
// (noise once read); every hover, the hint's tooltip included, `show` and the JSON keep it with each
// value (a design choice of Pneumark's; no source). Invented values.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { inlayHints, inlayHintSteps } from '../../server/src/core/service';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';
import { runSteps } from '../../server/src/core/util/steps';

const CAVEAT = '(start of high flow not in the note)';

// High flow from the first timepoint; ROX at 08:00, 10:00 and 12:00 (all within 13 h, so each has the caveat).
// 90 ÷ 0.6 ÷ 30 = 5.00; 88 ÷ 0.6 ÷ 40 = 3.67; 86 ÷ 0.6 ÷ 44 = 3.26 (Roca 2016: SpO2 ÷ FiO2 ÷ RR).
const LONG = [
  'patient age 62 y',
  '@ 08:00',
  'oxygen hfnc 50 L/min, fio2 0.6',
  'vitals rr 30, spo2 90 %',
  '@ 10:00',
  'vitals rr 40, spo2 88 %',
  '@ 12:00',
  'vitals rr 44, spo2 86 %',
  '',
].join('\n');

const oxygenation = (text: string, start = 0, end?: number) => {
  const result = checkNote(text);
  return inlayHints(result, { start, end: end ?? result.analysis.tree.lines.length - 1 }, { categories: new Set(['oxygenation']) });
};
const roxLabels = (text: string, start = 0, end?: number) => oxygenation(text, start, end).map((h) => h.label).filter((l) => l.includes('ROX'));

describe('the caveat of a ROX whose start of high flow is not in the note, in the inlay hints', () => {
  it('is said beside the first ROX only', () => {
    expect(roxLabels(LONG)).toEqual([`S/F 150 · ROX 5.00 ${CAVEAT}`, 'S/F 147* · ROX 3.67*', 'S/F 143* · ROX 3.26*']);
  });

  it('a request for the later lines only does not say it again (the first ROX is found before them)', () => {
    // Lines 4 to 7: the timepoints at 10:00 and 12:00.
    expect(roxLabels(LONG, 4)).toEqual(['S/F 147* · ROX 3.67*', 'S/F 143* · ROX 3.26*']);
  });

  it('hints made in steps say the same as hints made at once', () => {
    const result = checkNote(LONG);
    const lines = { start: 0, end: result.analysis.tree.lines.length - 1 };
    const options = { categories: new Set(['oxygenation'] as const) };
    expect(runSteps(inlayHintSteps(result, lines, options)).map((h) => h.label)).toEqual(inlayHints(result, lines, options).map((h) => h.label));
  });

  it('the tooltip of a later hint still says why the ROX is not read against the thresholds', () => {
    const later = oxygenation(LONG).filter((h) => h.label.includes('ROX'))[2]!;
    expect(later.tooltipMarkdown).toContain('not read against the 2, 6 or 12 h thresholds (Roca 2019)');
    expect(later.tooltipMarkdown).toContain('write what the patient had before high flow at an earlier timepoint');
  });

  it('the first ROX with it need not be at the first timepoint: no SpO2 at 08:00, said at 10:00', () => {
    const text = 'patient age 62 y\n@ 08:00\noxygen hfnc 50 L/min, fio2 0.6\n@ 10:00\nvitals rr 40, spo2 88 %\n@ 12:00\nvitals rr 44, spo2 86 %\n';
    expect(roxLabels(text)).toEqual([`S/F 147* · ROX 3.67* ${CAVEAT}`, 'S/F 143* · ROX 3.26*']);
  });

  it('other caveats are still said at every timepoint (a threshold read, an SpO2 above 97 %)', () => {
    // Room air at 07:00, high flow from 08:00: at 10:00 2 h (88 ÷ 0.6 ÷ 40 = 3.67, between 2.85 and 4.88),
    // at 14:00 6 h (86 ÷ 0.6 ÷ 44 = 3.26 < 3.47), both read against their hour (Roca 2019).
    const timed = 'patient age 62 y\n@ 07:00\noxygen room air\n@ 08:00\noxygen hfnc 50 L/min, fio2 0.6\n@ 10:00\nvitals rr 40, spo2 88 %\n@ 14:00\nvitals rr 44, spo2 86 %\n';
    expect(roxLabels(timed)).toEqual(['S/F 147* · ROX 3.67* (2 h: 2.85–4.88)', 'S/F 143* · ROX 3.26* (6 h: < 3.47)']);
    // SpO2 99 % at both (Rice 2007: S/F no longer tracks P/F above 97 %).
    const high = `patient age 62 y\n@ 08:00\noxygen hfnc 50 L/min, fio2 0.6\nvitals rr 30, spo2 99 %\n@ 10:00\nvitals rr 40, spo2 99 %\n`;
    expect(roxLabels(high)).toEqual([`S/F 165 (SpO2 > 97 %) · ROX 5.50 ${CAVEAT}`, 'S/F 165* (SpO2 > 97 %) · ROX 4.13*']);
  });

  it('`show` keeps it beside every ROX', async () => {
    const io = memoryIo({ stdin: LONG, env: { NO_COLOR: '1' }, tty: false });
    await run(['show', '-'], io);
    expect(io.out().split(CAVEAT).length - 1).toBe(3);
  });

  it('the JSON keeps why with every ROX (its note)', async () => {
    const io = memoryIo({ stdin: LONG });
    await run(['check', '--format', 'json', '-'], io);
    expect(io.out().split('not read against the 2, 6 or 12 h thresholds (Roca 2019)').length - 1).toBe(3);
  });
});
