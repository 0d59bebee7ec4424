// PN318: a pressure of NIV or CPAP (an IPAP, an EPAP, a CPAP level) on an oxygen line whose device
// gives no set airway pressure (room air, a cannula, a mask, a venturi or reservoir mask, high-flow
// nasal oxygen). The one rule (`noninvasiveSupport`) reads such a line as neither NIV nor CPAP, so
// the pressure was accepted in silence and still used: as the end-expiratory pressure of driving
// pressure and the compliances, compared with a peak (PN314), and named as "noninvasive support" in
// the Berlin band reading (PN410). Only NIV and CPAP devices set an airway pressure; the other
// oxygen devices set a flow or an FiO2 (common practice, no source). Such a pressure is now reported
// and, like other values a check doubts, not used until the line says which is meant.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { hoverAt } from '../../server/src/core/service';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';
import { noteAt } from '../service/cursor';
import { derivation, readings } from '../derive/helpers';

const pn318 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN318');
const PATIENT = 'patient age 60 height 170 sex m\n';

/** The note of the report: an EPAP beside a mask, a CPAP level beside a cannula, an IPAP beside high flow. */
const REPORTED = `${PATIENT}
@ 08:00
oxygen mask, epap 6, fio2 0.5
abg ph 7.38 paco2 44 pao2 80
@ 09:00
oxygen cannula flow 2 level 8
@ 10:00
oxygen hfnc flow 50 fio2 0.6 ipap 12
`;

describe('a pressure of NIV or CPAP beside a device that gives none (PN318)', () => {
  it('fires once per pressure, at the pressure, as a warning that names the pressure and the device', () => {
    const f = pn318(REPORTED);
    expect(f.map((x) => [x.range.start.line, x.severity])).toEqual([[3, 'warning'], [6, 'warning'], [8, 'warning']]);
    // `epap 6` on line 4 (0-based 3), characters 13–19.
    expect(f[0]?.range).toEqual({ start: { line: 3, character: 13 }, end: { line: 3, character: 19 } });
    expect(f[0]?.message).toBe('`epap 6` beside `mask`: this device gives no set airway pressure, so the EPAP is not used (not as the end-expiratory pressure either). NIV is often given through a face mask: if so, write `niv` as the device; if not, remove the EPAP.');
    expect(f[1]?.message).toBe('`level 8` beside `cannula`: this device gives no set airway pressure, so the CPAP level is not used (not as the end-expiratory pressure either). If CPAP is given, write `cpap` as the device; if not, remove the level.');
    expect(f[2]?.message).toBe('`ipap 12` beside `hfnc`: this device gives no set airway pressure, so the IPAP is not used. NIV is often given through a face mask: if so, write `niv` as the device; if not, remove the IPAP.');
  });

  it('fires beside every device that gives no set pressure, however the device is written, and for each pressure of a line', () => {
    for (const device of ['room air', 'ra', 'cannula', 'nc', 'mask', 'venturi', 'reservoir', 'nrb', 'hfnc 40', 'highflow 40', 'device mask']) {
      expect(pn318(`@ 08:00\noxygen ${device}, epap 6`), device).toHaveLength(1);
    }
    expect(pn318('@ 08:00\noxygen mask, ipap 12, epap 6, level 8').map((f) => f.range.start.character)).toEqual([13, 22, 30]);
  });

  it('fires where the line is written, not at each timepoint it carries to', () => {
    expect(pn318('@ 08:00\noxygen mask, epap 6\n@ 09:00\nvitals hr 80\n@ 10:00\nabg 7.40/40/80/24').map((f) => f.range.start.line)).toEqual([1]);
  });

  it('stays silent on NIV and CPAP, on pressures without a device (read as NIV or CPAP), and on a pressure of 0 (none, as the device gives)', () => {
    for (const line of ['oxygen niv ipap 12 epap 6', 'oxygen bilevel ipap 12, epap 6', 'oxygen cpap level 8', 'oxygen cpap 8', 'oxygen epap 6', 'oxygen ipap 12, fio2 0.4', 'oxygen level 8, fio2 0.5', 'oxygen mask, fio2 0.5', 'oxygen hfnc 50, fio2 0.6', 'oxygen room air, epap 0', 'oxygen mask, level 0']) {
      expect(pn318(`@ 08:00\n${line}`), line).toEqual([]);
    }
  });

  it('offers to name the support as the device, and to remove the pressure; each fix leaves the line without PN318', () => {
    const text = '@ 08:00\noxygen mask, epap 6, fio2 0.5\n@ 09:00\noxygen cannula flow 2 level 8 # a remark\n@ 10:00\noxygen hfnc flow 50 fio2 0.6 ipap 12';
    const [epap, level, ipap] = pn318(text);
    expect(epap?.fixes.map((x) => x.title)).toEqual(['Change the device to `niv`', 'Remove `epap 6`']);
    expect(level?.fixes.map((x) => x.title)).toEqual(['Change the device to `cpap`', 'Remove `level 8`']);
    expect(ipap?.fixes.map((x) => x.title)).toEqual(['Change the device to `niv`', 'Remove `ipap 12`']);
    const lines = (fixed: string, line: number) => fixed.split('\n')[line];
    expect(lines(applyEdits(text, epap!.fixes[0]!.edits), 1)).toBe('oxygen niv, epap 6, fio2 0.5');
    expect(lines(applyEdits(text, epap!.fixes[1]!.edits), 1)).toBe('oxygen mask, fio2 0.5');
    expect(lines(applyEdits(text, level!.fixes[0]!.edits), 3)).toBe('oxygen cpap flow 2 level 8 # a remark');
    expect(lines(applyEdits(text, level!.fixes[1]!.edits), 3)).toBe('oxygen cannula flow 2 # a remark');
    expect(lines(applyEdits(text, ipap!.fixes[0]!.edits), 5)).toBe('oxygen niv flow 50 fio2 0.6 ipap 12');
    expect(lines(applyEdits(text, ipap!.fixes[1]!.edits), 5)).toBe('oxygen hfnc flow 50 fio2 0.6');
    for (const f of [epap!, level!, ipap!]) for (const fix of f.fixes) {
      const after = checkNote(applyEdits(text, fix.edits)).findings.filter((x) => x.code === 'PN318' && x.range.start.line === f.range.start.line);
      expect(after, fix.title).toEqual([]);
    }
    // After `cpap` a bare number is the level, not a flow: naming CPAP keys the flow of the device.
    const flowed = '@ 08:00\noxygen cannula 2, level 8';
    expect(applyEdits(flowed, pn318(flowed)[0]!.fixes[0]!.edits)).toBe('@ 08:00\noxygen cpap flow 2, level 8');
    // A device written with its key is replaced in place; a fix is not safe to apply unseen.
    const keyed = pn318('@ 08:00\noxygen device mask, epap 6')[0]!;
    expect(applyEdits('@ 08:00\noxygen device mask, epap 6', keyed.fixes[0]!.edits)).toBe('@ 08:00\noxygen device niv, epap 6');
    expect(keyed.fixes.some((x) => x.preferred === true)).toBe(false);
  });

  it('does not offer to name the support where its pressures would then be out of order (PN315, PN314)', () => {
    const titles = (text: string) => pn318(text).map((f) => f.fixes.map((x) => x.title));
    expect(titles('@ 08:00\noxygen mask, ipap 6, epap 12')).toEqual([['Remove `ipap 6`'], ['Remove `epap 12`']]);
    expect(titles('@ 08:00\noxygen mask, epap 12\nvent peak 10')).toEqual([['Remove `epap 12`']]);
    expect(titles('@ 08:00\noxygen mask, ipap 12, epap 6\nvent peak 14')).toEqual([['Change the device to `niv`', 'Remove `ipap 12`'], ['Change the device to `niv`', 'Remove `epap 6`']]);
  });
});

// The Berlin definition names its 200–300 mmHg band "with PEEP or CPAP ≥ 5 cmH2O" (ARDS Definition
// Task Force, Ranieri VM et al., "Acute respiratory distress syndrome: the Berlin Definition", JAMA
// 2012;307:2526–2533): a pressure the device does not give meets no such condition.
describe('a pressure PN318 reports is not used', () => {
  it('the Berlin band reading at 08:00 no longer names the EPAP beside a mask as noninvasive support', () => {
    expect(readings(REPORTED, {}, 0)['oxygenation-band']).toBeUndefined();
    // 80 ÷ 0.5 = 160, with the EPAP of NIV through a mask written as such.
    expect(readings(REPORTED.replace('oxygen mask, epap 6', 'oxygen niv epap 6'), {}, 0)['oxygenation-band']).toMatch(/^P\/F 160 mmHg with EPAP 6 cmH2O: below the 200–300 mmHg oxygenation band, the one band the Berlin definition names on noninvasive support/);
    expect(checkNote(REPORTED).findings.filter((f) => f.code === 'PN410').map((f) => f.message).join('\n')).not.toContain('EPAP');
  });

  // Driving pressure Pplat − PEEP (Amato MBP et al., "Driving pressure and survival in the acute
  // respiratory distress syndrome", NEJM 2015;372:747–755) and the compliances VT ÷ (Pplat − PEEP),
  // VT ÷ (Ppeak − PEEP) (respiratory mechanics, common practice, no source).
  // A vent line of readings only (no tidal volume: beside a mask, a set one would end the oxygen line).
  const withReadings = (oxygen: string) => `${PATIENT}@ 08:00\n${oxygen}\nvent peak 18, plateau 16\nvitals rr 22`;

  it('driving pressure and the compliances do not take it, and say what to write instead', () => {
    const d = derivation(withReadings('oxygen mask, epap 5, fio2 0.4'));
    const need = 'a device that gives the epap on line 3 (niv: mask gives no set airway pressure, see PN318)';
    expect(d.derived.find((v) => v.id === 'driving_pressure')).toBeUndefined();
    expect(d.missing.find((m) => m.id === 'driving_pressure')?.needs).toEqual([need]);
    for (const id of ['compliance_static', 'compliance_dynamic']) expect(d.missing.find((m) => m.id === id)?.needs, id).toEqual(['vt', need]);
    expect(derivation(withReadings('oxygen cannula 2, level 8')).missing.find((m) => m.id === 'driving_pressure')?.needs).toEqual(['a device that gives the CPAP level on line 3 (cpap: cannula gives no set airway pressure, see PN318)']);
    // Written as NIV, the EPAP is used: ΔP = 16 − 5 = 11 cmH2O.
    expect(derivation(withReadings('oxygen niv epap 5, fio2 0.4')).derived.find((v) => v.id === 'driving_pressure')?.value).toBe(11);
  });

  it('`show` and the hover of the timepoint say so', async () => {
    const text = withReadings('oxygen mask, epap 5, fio2 0.4');
    const io = memoryIo({ stdin: text });
    await run(['show', '-'], io);
    expect(io.out()).toContain('missing  add a device that gives the epap on line 3 (niv: mask gives no set airway pressure, see PN318) to get ΔP');
    const { result, position } = noteAt(text.replace('@ 08:00', '@ 0|8:00'));
    expect(hoverAt(result, position)?.markdown ?? '').toContain('add a device that gives the epap on line 3 (niv: mask gives no set airway pressure, see PN318) to get ΔP');
  });

  it('the hover of the pressure says that it is not used, and why', () => {
    const { result, position } = noteAt(`@ 08:00\noxygen mask, epap |6, fio2 0.5`);
    expect(hoverAt(result, position)?.markdown ?? '').toContain('Not used in calculations: the device `mask` gives no set airway pressure (PN318).');
    const niv = noteAt(`@ 08:00\noxygen niv, epap |6, fio2 0.5`);
    expect(hoverAt(niv.result, niv.position)?.markdown ?? '').not.toContain('Not used in calculations');
  });

  it('is compared with no peak (PN314) and no IPAP (PN315)', () => {
    const codes = (text: string) => checkNote(text).findings.map((f) => f.code);
    // EPAP 12 above a peak of 10 beside a mask: not an end-expiratory pressure there.
    expect(codes('@ 08:00\noxygen mask, epap 12\nvent peak 10')).toEqual(['PN318']);
    expect(codes('@ 08:00\noxygen niv epap 12\nvent peak 10')).toContain('PN314');
    expect(codes('@ 08:00\noxygen mask, ipap 6, epap 12')).toEqual(['PN318', 'PN318']);
    expect(codes('@ 08:00\noxygen niv ipap 6, epap 12')).toEqual(['PN315']);
  });

  it('the exports carry it as written: it is what the note says', () => {
    const io = memoryIo({ stdin: '@ 08:00\noxygen mask, epap 6, fio2 0.5' });
    return run(['export', '-', '--format', 'csv'], io).then(() => {
      const [head, row] = io.out().trim().split('\n');
      const at = head!.split(',').indexOf('epap_cmH2O');
      expect(row!.split(',')[at]).toBe('6');
    });
  });
});
