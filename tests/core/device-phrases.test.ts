// Oxygen devices written as clinicians name them, in more than one word: `nasal cannula 2 L/min`,
// `simple face mask 6 L/min`, `venturi mask 28 %`, `non-rebreather mask 15 L/min`, `high flow 40 L/min`.
// Each is read as the device it names, and what follows it as after the one-word device; before,
// only `room air` was read as a device of two words, and `oxygen nasal cannula 2 L/min` lost its
// flow (`cannula` an unknown key), so FiO2 est, P/F and the A–a gradient waited for a flow that
// was written.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { formatNote } from '../../server/src/core/service';

const gas = 'abg 7.40/40/80/24';

function readAt(text: string) {
  const r = checkNote(`@ 08:00\n${text}\n${gas}`);
  const tp = r.analysis.timeline.timepoints[0]!;
  const d = r.analysis.derivation(0);
  return {
    // Findings but the readings (information), which a gas on oxygen always has.
    codes: r.findings.filter((f) => f.severity !== 'information').map((f) => f.code),
    device: tp.values.get('device')?.stated.value ?? null,
    deviceWord: tp.values.get('device')?.stated.word ?? null,
    flow: tp.values.get('o2_flow')?.stated.value ?? null,
    fio2: tp.values.get('fio2')?.stated.value ?? null,
    fio2Estimated: d.derived.find((v) => v.id === 'fio2_estimated')?.value ?? null,
  };
}

describe('oxygen devices of several words', () => {
  it.each([
    ['oxygen nasal cannula 2 L/min', 'cannula', 2],
    ['oxygen Nasal Cannula 2', 'cannula', 2],
    ['oxygen nasal prongs 3 L/min', 'cannula', 3],
    ['oxygen face mask 6 L/min', 'mask', 6],
    ['oxygen simple mask 6 L/min', 'mask', 6],
    ['oxygen simple face mask 6 L/min', 'mask', 6],
    ['oxygen reservoir mask 15 L/min', 'reservoir', 15],
    ['oxygen non-rebreather mask 15 L/min', 'reservoir', 15],
    ['oxygen non-rebreather 15 L/min', 'reservoir', 15],
    ['oxygen high flow 40 L/min, fio2 0.5', 'hfnc', 40],
    ['oxygen nasal high flow 40 L/min, fio2 0.5', 'hfnc', 40],
    ['oxygen high-flow 40 L/min, fio2 0.5', 'hfnc', 40],
    ['oxygen venturi mask 8 L/min 28 %', 'venturi', 8],
  ])('`%s` is the device %s with its flow', (line, device, flow) => {
    const r = readAt(line);
    expect(r.codes).toEqual([]);
    expect(r.deviceWord ?? r.device).toBe(device);
    expect(r.flow).toBe(flow);
  });

  it('gives the FiO2 estimate of the device it names', () => {
    // Nasal cannula FiO2 ≈ 0.21 + 0.04 per L/min (common practice, no source): 0.29 at 2 L/min.
    expect(readAt('oxygen nasal cannula 2 L/min').fio2Estimated).toBeCloseTo(0.29, 6);
    // Simple face mask ≈ 0.35 at 5 L/min + 0.04 per L/min above it (common practice, no source): 0.39 at 6.
    expect(readAt('oxygen simple face mask 6 L/min').fio2Estimated).toBeCloseTo(0.39, 6);
  });

  it('reads a Venturi mask named in two words by its setting, as `venturi` alone', () => {
    const r = readAt('oxygen venturi mask 28 %');
    expect(r.codes).toEqual([]);
    expect(r.fio2).toBeCloseTo(0.28, 6);
  });

  it('takes the device of several words after the `device` key too', () => {
    const r = readAt('oxygen device nasal cannula, flow 2 L/min');
    expect(r.codes).toEqual([]);
    expect(r.deviceWord ?? r.device).toBe('cannula');
    expect(r.flow).toBe(2);
  });

  it('offers the device for a phrase with a word misspelt', () => {
    const r = checkNote(`@ 08:00\noxygen nasal canula 2 L/min\n${gas}`);
    const f = r.findings.filter((x) => x.code === 'PN201');
    expect(f).toHaveLength(1);
    expect(JSON.stringify(f[0]?.fixes ?? [])).toContain('cannula');
  });

  it('keeps a single device word followed by a key as before', () => {
    const r = readAt('oxygen mask, flow 6 L/min');
    expect(r.codes).toEqual([]);
    expect(r.deviceWord ?? r.device).toBe('mask');
    expect(r.flow).toBe(6);
  });

  // A device's name of several words may have its words joined by hyphens instead of blanks, as
  // clinicians write them (`nasal-cannula`, `face-mask`): each such word is one word to the lexer,
  // and it reads as the device the spaced name reads as. Before, `nasal-cannula` was an unknown key
  // (PN201, offered as `cannula`) and its flow was lost.
  it.each([
    ['oxygen nasal-cannula 2 L/min', 'cannula', 2],
    ['oxygen Nasal-Cannula 2', 'cannula', 2],
    ['oxygen nasal-prongs 3 L/min', 'cannula', 3],
    ['oxygen face-mask 6 L/min', 'mask', 6],
    ['oxygen simple-face-mask 6 L/min', 'mask', 6],
    ['oxygen simple face-mask 6 L/min', 'mask', 6],
    ['oxygen reservoir-mask 15 L/min', 'reservoir', 15],
    ['oxygen non-rebreather-mask 15 L/min', 'reservoir', 15],
    ['oxygen nasal-high-flow 40 L/min, fio2 0.5', 'hfnc', 40],
    ['oxygen nasal high-flow 40 L/min, fio2 0.5', 'hfnc', 40],
    ['oxygen venturi-mask 8 L/min 28 %', 'venturi', 8],
    ['oxygen device nasal-cannula, flow 2 L/min', 'cannula', 2],
    ['oxygen HFNC 40 L/min, fio2 0.5', 'hfnc', 40],
  ])('`%s`, its words joined by hyphens, is the device %s with its flow', (line, device, flow) => {
    const r = readAt(line);
    expect(r.codes).toEqual([]);
    expect(r.deviceWord ?? r.device).toBe(device);
    expect(r.flow).toBe(flow);
  });

  it('reads room air joined by a hyphen as room air', () => {
    const r = readAt('oxygen room-air');
    expect(r.codes).toEqual([]);
    expect(r.deviceWord ?? r.device).toBe('room air');
  });

  it('gives a hyphen-joined name the FiO2 estimate of the spaced one', () => {
    expect(readAt('oxygen nasal-cannula 2 L/min').fio2Estimated).toBe(readAt('oxygen nasal cannula 2 L/min').fio2Estimated);
    expect(readAt('oxygen simple-face-mask 6 L/min').fio2Estimated).toBe(readAt('oxygen simple face mask 6 L/min').fio2Estimated);
  });

  it('still offers the device for a hyphen-joined name with a word misspelt', () => {
    const r = checkNote(`@ 08:00\noxygen nasal-canula 2 L/min\n${gas}`);
    const f = r.findings.filter((x) => x.code === 'PN201');
    expect(f).toHaveLength(1);
    expect(JSON.stringify(f[0]?.fixes ?? [])).toContain('cannula');
  });

  it('keeps a hyphen-joined name as written when the note is formatted', () => {
    const text = `@ 08:00\noxygen nasal-cannula 2 L/min\n${gas}`;
    expect(formatNote(text)).toContain('oxygen    nasal-cannula 2 L/min');
  });
});
