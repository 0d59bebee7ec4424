// PN310: an oxygen flow on a room-air line. Room air is breathing without supplemental oxygen,
// so it has no oxygen flow (common practice, no source); such a line gives no FiO2 of 0.21, so
// the values that need FiO2 wait for the device to be named instead of being computed on air.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const pn310 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN310');
const gas = 'abg 7.40/40/80/24';

function derivedAt(text: string, id: string) {
  const r = checkNote(text);
  const d = r.analysis.derivation(0);
  return { value: d.derived.find((v) => v.id === id) ?? null, missing: d.missing.find((m) => m.id === id) ?? null };
}

describe('an oxygen flow on room air (PN310)', () => {
  it('fires on the flow, written bare after the device or with its key', () => {
    const f = pn310(`@ 08:00\noxygen room air 2\n${gas}`);
    expect(f).toHaveLength(1);
    expect(f[0]?.severity).toBe('warning');
    expect(f[0]?.message).toBe('Room air with an oxygen flow of 2 L/min: room air means no added oxygen. Name the device (e.g. `oxygen cannula 2`) or remove the flow; FiO2 is not taken as 0.21 until then.');
    expect(f[0]?.range).toEqual({ start: { line: 1, character: 16 }, end: { line: 1, character: 17 } });
    expect(pn310('@ 08:00\noxygen ra, flow 2 L/min')).toHaveLength(1);
  });

  it('fires where the line is written, not at each timepoint it carries to', () => {
    expect(pn310('@ 08:00\noxygen room air 2\n@ 09:00\nvitals hr 80').map((f) => f.range.start.line)).toEqual([1]);
  });

  it('stays silent for room air alone, a zero flow, and a flow through a device', () => {
    expect(pn310('@ 08:00\noxygen room air')).toEqual([]);
    expect(pn310('@ 08:00\noxygen room air 0')).toEqual([]);
    expect(pn310('@ 08:00\noxygen cannula 2')).toEqual([]);
  });

  it('takes no FiO2 of 0.21 from such a line: P/F waits for the device', () => {
    // Room air alone: P/F = 80 ÷ 0.21 = 381 (P/F = PaO2 ÷ FiO2; FiO2 of air 0.21, common practice).
    expect(derivedAt(`@ 08:00\noxygen room air\n${gas}`, 'pf_ratio').value?.value).toBeCloseTo(80 / 0.21, 6);
    const withFlow = derivedAt(`@ 08:00\noxygen room air 2\n${gas}`, 'pf_ratio');
    expect(withFlow.value).toBeNull();
    expect(withFlow.missing?.needs).toEqual(['the oxygen device (room air takes no oxygen flow)']);
  });
});

// PN316: an FiO2 above 0.21 on a room-air line. Room air is an FiO2 of 0.21 (common practice, no
// source), so the device or the FiO2 is wrong; neither is used until the line is mended.
const pn316 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN316');

describe('an FiO2 above 0.21 on room air (PN316)', () => {
  it('fires on the FiO2, as a fraction or a percentage', () => {
    const f = pn316(`@ 08:00\noxygen room air, fio2 0.4\n${gas}`);
    expect(f).toHaveLength(1);
    expect(f[0]?.severity).toBe('warning');
    expect(f[0]?.message).toBe('Room air with FiO2 0.40: room air is an FiO2 of 0.21. Name the device that gives this FiO2, or remove the FiO2; neither FiO2 is used until then.');
    expect(f[0]?.range).toEqual({ start: { line: 1, character: 17 }, end: { line: 1, character: 25 } });
    expect(pn316('@ 08:00\noxygen ra fio2 35 %')).toHaveLength(1);
  });

  it('fires where the line is written, not at each timepoint it carries to, and also beside a sampling FiO2', () => {
    expect(pn316('@ 08:00\noxygen room air, fio2 0.4\n@ 09:00\nvitals hr 80').map((f) => f.range.start.line)).toEqual([1]);
    expect(pn316('@ 08:00\noxygen room air, fio2 0.4\nabg 7.40/40/80/24, fio2 0.21').map((f) => f.range.start.line)).toEqual([1]);
  });

  it('stays silent for the FiO2 of air written out, and for an FiO2 on a device that gives oxygen', () => {
    expect(pn316('@ 08:00\noxygen room air, fio2 0.21')).toEqual([]);
    expect(pn316('@ 08:00\noxygen room air, fio2 21 %')).toEqual([]);
    expect(pn316('@ 08:00\noxygen venturi 8, fio2 0.4')).toEqual([]);
  });

  it('uses neither FiO2 there: P/F, the A–a gradient and the oxygen readings wait for the line to be mended', () => {
    // Taken as written, P/F = 102 ÷ 0.4 = 255 would read as impaired oxygenation on oxygen; on air
    // it is 102 ÷ 0.21 = 486 with an A–a gradient of 0 (P/F = PaO2 ÷ FiO2; ARDS Definition Task
    // Force, JAMA 2012, from memory). Neither is given until the note says which.
    const text = '@ 08:00\noxygen room air, fio2 0.4\nabg 7.40/40/102/24';
    const pf = derivedAt(text, 'pf_ratio');
    expect(pf.value).toBeNull();
    expect(pf.missing?.needs).toEqual(['the oxygen device, or an FiO2 of 0.21 (room air is no added oxygen)']);
    expect(derivedAt(text, 'aa_gradient').value).toBeNull();
    const reading = checkNote(text).analysis.derivation(0).interpretations.find((i) => i.topic === 'oxygenation');
    expect(reading?.text).toBe('PaO2 102 mmHg: consistent with adequate arterial oxygenation.');
    // Carried to a later gas, the line still gives no FiO2.
    expect(checkNote('@ 08:00\noxygen room air, fio2 0.4\n@ 09:00\nabg 7.40/40/102/24').analysis.derivation(1).derived.find((v) => v.id === 'pf_ratio')).toBeUndefined();
    // A sampling FiO2 on the gas line is used as usual: 102 ÷ 0.21 = 486.
    expect(derivedAt(`${text}, fio2 0.21`, 'pf_ratio').value?.value).toBeCloseTo(102 / 0.21, 6);
  });
});

describe('an oxygen line without a device or an FiO2', () => {
  it('asks for the FiO2 on that line, not for an oxygen line it already has', () => {
    // `oxygen flow 2`: oxygen is given, by a device not named; P/F = PaO2 ÷ FiO2 needs the FiO2.
    expect(derivedAt(`@ 08:00\noxygen flow 2\n${gas}`, 'pf_ratio').missing?.needs).toEqual(['fio2 (on the oxygen line)']);
    expect(derivedAt(`@ 08:00\noxygen epap 6\n${gas}`, 'pf_ratio').missing?.needs).toEqual(['fio2 (on the oxygen line)']);
    // Without any oxygen or vent line, either will do.
    expect(derivedAt(`@ 08:00\n${gas}`, 'pf_ratio').missing?.needs).toEqual(['fio2 (or an oxygen line)']);
  });
});
