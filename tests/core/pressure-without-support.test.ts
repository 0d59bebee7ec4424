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

// The other support's pressure beside a device that is named: CPAP holds one pressure, its level,
// and gives no IPAP and no EPAP; bilevel ventilation (NIV) gives an IPAP and an EPAP, not one level
// (common practice, no source). `oxygen cpap ipap 14, epap 6` and `oxygen niv level 8` passed in
// silence, and each pressure was used: with a CPAP level and an EPAP both written under CPAP, the
// EPAP was taken as the end-expiratory pressure, not the CPAP level the device gives.
describe('a pressure of the other support beside `niv` or `cpap` (PN318)', () => {
  it('fires on an IPAP or an EPAP beside `cpap`, and on a CPAP level beside `niv` or `bilevel`, once per pressure', () => {
    const at = (line: string) => pn318(`@ 08:00\n${line}`).map((f) => line.slice(f.range.start.character, f.range.end.character));
    expect(at('oxygen cpap ipap 14, epap 6')).toEqual(['ipap 14', 'epap 6']);
    expect(at('oxygen cpap epap 6, fio2 0.4')).toEqual(['epap 6']);
    expect(at('oxygen niv level 8')).toEqual(['level 8']);
    expect(at('oxygen bilevel level 8, fio2 0.5')).toEqual(['level 8']);
    expect(at('oxygen device cpap, ipap 14')).toEqual(['ipap 14']);
    // With the device's own pressures written too, only the other one is reported.
    expect(at('oxygen niv ipap 14, epap 6, level 8')).toEqual(['level 8']);
    expect(at('oxygen cpap level 8, epap 6')).toEqual(['epap 6']);
    expect(at('oxygen cpap 8, ipap 14')).toEqual(['ipap 14']);
  });

  // Pressures of both supports with no device (`oxygen ipap 14, epap 6, level 8`) are reported: see below.
  it('stays silent on the support\'s own pressures, on one support\'s pressures without a device, and on a pressure of 0', () => {
    for (const line of ['oxygen niv ipap 14, epap 6', 'oxygen cpap level 8', 'oxygen cpap 8', 'oxygen ipap 14, epap 6', 'oxygen niv ipap 14, epap 6, level 0', 'oxygen cpap 8, epap 0']) {
      expect(pn318(`@ 08:00\n${line}`), line).toEqual([]);
    }
  });

  it('says what the device gives and what to write instead', () => {
    const messages = (line: string) => pn318(`@ 08:00\n${line}`).map((f) => f.message);
    expect(messages('oxygen cpap ipap 14, epap 6')).toEqual([
      '`ipap 14` beside `cpap`: CPAP gives one pressure, its level, and no IPAP, so the IPAP is not used. An IPAP and an EPAP are the pressures of bilevel support: if it is given, write `niv` as the device.',
      '`epap 6` beside `cpap`: CPAP gives one pressure, its level, and no EPAP, so the EPAP is not used (not as the end-expiratory pressure either). An IPAP and an EPAP are the pressures of bilevel support: if it is given, write `niv` as the device.',
    ]);
    expect(messages('oxygen cpap epap 6')).toEqual(['`epap 6` beside `cpap`: CPAP gives one pressure, its level, and no EPAP, so the EPAP is not used (not as the end-expiratory pressure either). Under CPAP the one pressure is the level: write `level` for `epap`, or `niv` as the device if the support is bilevel.']);
    expect(messages('oxygen niv level 8')).toEqual(['`level 8` beside `niv`: NIV gives an IPAP and an EPAP, not one CPAP level, so the CPAP level is not used (not as the end-expiratory pressure either). One level is continuous pressure: if so, write `cpap` as the device.']);
    expect(messages('oxygen cpap level 8, epap 6')).toEqual(['`epap 6` beside `cpap`: CPAP gives one pressure, its level, and no EPAP, so the EPAP is not used (not as the end-expiratory pressure either). The line writes the CPAP level too: remove the EPAP, or name the device that gives it.']);
  });

  it('offers only the fix that is surely right, and each leaves the line without PN318', () => {
    const cases: readonly (readonly [string, readonly string[], string])[] = [
      // Two pressures, an IPAP among them: bilevel support with the wrong device word.
      ['oxygen cpap ipap 14, epap 6', ['Change the device to `niv`'], 'oxygen niv ipap 14, epap 6'],
      ['oxygen device cpap, ipap 14', ['Change the device to `niv`'], 'oxygen device niv, ipap 14'],
      // One level under NIV is CPAP; a number after `niv` is its flow, which `cpap` would read as its level.
      ['oxygen niv level 8', ['Change the device to `cpap`'], 'oxygen cpap level 8'],
      ['oxygen niv 4, level 8', ['Change the device to `cpap`'], 'oxygen cpap flow 4, level 8'],
      // CPAP's one pressure is its expiratory pressure too: an EPAP alone is its level.
      ['oxygen cpap epap 6, fio2 0.4', ['Change `epap` to `level`'], 'oxygen cpap level 6, fio2 0.4'],
      // The device's own pressure is written too: the other one goes.
      ['oxygen cpap level 8, epap 6', ['Remove `epap 6`'], 'oxygen cpap level 8'],
      ['oxygen niv ipap 14, epap 6, level 8 # a remark', ['Remove `level 8`'], 'oxygen niv ipap 14, epap 6 # a remark'],
    ];
    for (const [line, titles, fixed] of cases) {
      const text = `@ 08:00\n${line}`;
      const [first] = pn318(text);
      expect(first?.fixes.map((x) => x.title), line).toEqual(titles);
      expect(first!.fixes.some((x) => x.preferred === true), line).toBe(false);
      const after = applyEdits(text, first!.fixes[0]!.edits);
      expect(after.split('\n')[1], line).toBe(fixed);
      expect(pn318(after), line).toEqual([]);
    }
    // Not offered where the pressures, then used, would be out of order (PN315).
    expect(pn318('@ 08:00\noxygen cpap ipap 6, epap 12').map((f) => f.fixes.map((x) => x.title))).toEqual([[], []]);
  });

  // Driving pressure Pplat − PEEP (Amato MBP et al., "Driving pressure and survival in the acute
  // respiratory distress syndrome", NEJM 2015;372:747–755), the end-expiratory pressure being the
  // one the device gives.
  const withReadings = (oxygen: string) => `${PATIENT}@ 08:00\n${oxygen}\nvent peak 18, plateau 16\nvitals rr 22`;

  it('takes as the end-expiratory pressure the one the device gives, whichever is written first', () => {
    const dp = (oxygen: string) => derivation(withReadings(oxygen)).derived.find((v) => v.id === 'driving_pressure')?.value;
    // Under CPAP the level: 16 − 8 = 8 cmH2O; under NIV the EPAP: 16 − 6 = 10 cmH2O.
    expect(dp('oxygen cpap level 8, epap 6')).toBe(8);
    expect(dp('oxygen cpap epap 6, level 8')).toBe(8);
    expect(dp('oxygen niv ipap 14, epap 6, level 8')).toBe(10);
    expect(dp('oxygen niv level 8, ipap 14, epap 6')).toBe(10);
    // With no device the pressures decide (NIV: an EPAP is written), as before.
    expect(dp('oxygen ipap 14, epap 6, level 8')).toBe(10);
    // The other support's pressure alone is not used, and the missing value says what to mend.
    const d = derivation(withReadings('oxygen cpap ipap 14, epap 6'));
    expect(d.derived.find((v) => v.id === 'driving_pressure')).toBeUndefined();
    expect(d.missing.find((m) => m.id === 'driving_pressure')?.needs).toEqual(['a device that gives the epap on line 3 (niv: cpap gives no EPAP, see PN318)']);
    expect(derivation(withReadings('oxygen niv level 8')).missing.find((m) => m.id === 'driving_pressure')?.needs).toEqual(['a device that gives the CPAP level on line 3 (cpap: niv gives no CPAP level, see PN318)']);
  });

  it('compares with a peak (PN314) and with the IPAP (PN315) only the pressures the device gives', () => {
    const codes = (text: string) => checkNote(text).findings.map((f) => f.code);
    // The CPAP level 8 is the end-expiratory pressure, at or below the peak of 10; the EPAP 12 is reported.
    expect(codes('@ 08:00\noxygen cpap level 8, epap 12\nvent peak 10')).toEqual(['PN318']);
    expect(codes('@ 08:00\noxygen cpap level 12, epap 8\nvent peak 10')).toEqual(['PN318', 'PN314']);
    expect(codes('@ 08:00\noxygen cpap ipap 6, epap 12')).toEqual(['PN318', 'PN318']);
    expect(codes('@ 08:00\noxygen niv ipap 6, epap 12, level 4')).toEqual(['PN315', 'PN318']);
  });

  it('the hover of the pressure says what the device gives', () => {
    const hover = (text: string) => { const { result, position } = noteAt(text); return hoverAt(result, position)?.markdown ?? ''; };
    expect(hover('@ 08:00\noxygen cpap ipap 1|4, epap 6')).toContain('Not used in calculations: the device `cpap` gives one pressure, its level, and no IPAP (PN318).');
    expect(hover('@ 08:00\noxygen niv level |8')).toContain('Not used in calculations: the device `niv` gives an IPAP and an EPAP, not one CPAP level (PN318).');
    expect(hover('@ 08:00\noxygen cpap level |8, epap 6')).not.toContain('Not used in calculations');
  });

  it('a misspelt key beside `niv` or `cpap` is not offered the other support\'s pressure', () => {
    const offered = (line: string) => checkNote(`@ 08:00\n${line}`).findings.filter((f) => f.code === 'PN201').flatMap((f) => f.fixes.map((x) => x.title));
    expect(offered('oxygen cpap, ipa 14')).not.toContain('Change to `ipap`');
    expect(offered('oxygen niv, levl 8, ipap 12')).not.toContain('Change to `level`');
    expect(offered('oxygen niv, ipa 14')).toEqual(['Change to `ipap`']);
    expect(offered('oxygen cpap, levl 8')).toEqual(['Change to `level`']);
  });
});

// Bilevel pressures are commonly written as a pair, the inspiratory first (`niv 16/6`: IPAP 16, EPAP
// 6; common practice, no source). The pair has no key and is not read (PN105); it was offered no fix.
describe('a pair after `niv` (PN105)', () => {
  const pn105 = (line: string) => checkNote(`@ 08:00\n${line}`).findings.filter((f) => f.code === 'PN105');

  it('is offered its keys, IPAP first, where the first is the higher', () => {
    for (const [line, keys, fixed] of [
      ['oxygen niv 16/6, fio2 0.4', 'ipap 16, epap 6', 'oxygen niv ipap 16, epap 6, fio2 0.4'],
      ['oxygen bilevel 14/5', 'ipap 14, epap 5', 'oxygen bilevel ipap 14, epap 5'],
      ['oxygen device niv, 18/8', 'ipap 18, epap 8', 'oxygen device niv, ipap 18, epap 8'],
    ] as const) {
      const [f] = pn105(line);
      expect(f?.message, line).toBe(`\`${line.match(/\d+\/\d+/)![0]}\` has no key; write it as \`key value\`, e.g. \`hr 118\`. Did you mean \`${keys}\`?`);
      expect(f?.fixes.map((x) => x.title), line).toEqual([`Write \`${keys}\``]);
      const after = applyEdits(`@ 08:00\n${line}`, f!.fixes[0]!.edits);
      expect(after.split('\n')[1], line).toBe(fixed);
      expect(checkNote(after).findings.filter((x) => x.severity === 'error' || x.severity === 'warning'), line).toEqual([]);
    }
  });

  it('is offered nothing where the order or the device leaves it open', () => {
    for (const line of ['oxygen niv 6/16', 'oxygen niv 8/8', 'oxygen cpap 16/6', 'oxygen mask 16/6', 'oxygen niv ipap 16, 16/6']) {
      expect(pn105(line).flatMap((f) => f.fixes), line).toEqual([]);
    }
  });
});

// With no device named, the one rule (`noninvasiveSupport`) reads an oxygen line with an IPAP or an
// EPAP as NIV, and one with only a CPAP level as CPAP. A line that writes a CPAP level beside an
// IPAP or an EPAP (`oxygen epap 6, level 8`) holds pressures of two supports: it reads as NIV, and
// its level, which NIV does not give, was left unused in silence. Bilevel support gives an IPAP
// and an EPAP, CPAP one level (common practice, no source). It is now reported, as beside a device.
describe('a CPAP level beside an IPAP or an EPAP with no device named (PN318)', () => {
  it('fires at the level, says the line reads as NIV, and does not use the level', () => {
    const text = `${PATIENT}@ 08:00\noxygen epap 6, level 8\nvent peak 18, plateau 16`;
    const f = pn318(text);
    expect(f.map((x) => [x.range.start.line, x.range.start.character, x.range.end.character, x.severity])).toEqual([[2, 15, 22, 'warning']]);
    expect(f[0]!.message).toBe('`level 8` beside `epap 6`, with no device named: an IPAP or an EPAP makes the line NIV, which gives an IPAP and an EPAP, not one CPAP level, so the CPAP level is not used (not as the end-expiratory pressure either). If NIV is given, remove the level; if CPAP, remove the EPAP. Naming the device (`niv` or `cpap`) says which.');
    // Driving pressure Pplat − EPAP = 16 − 6 = 10 cmH2O (Amato MBP et al., "Driving pressure and
    // survival in the acute respiratory distress syndrome", NEJM 2015;372:747–755): the EPAP, not the level.
    expect(derivation(text).derived.find((v) => v.id === 'driving_pressure')?.value).toBe(10);
    expect(pn318(`@ 08:00\noxygen ipap 12, level 8`).map((x) => x.message)).toEqual([expect.stringMatching(/^`level 8` beside `ipap 12`, with no device named: .*If NIV is given, remove the level; if CPAP, remove the IPAP\./)]);
  });

  it('offers to remove the level (NIV) or the IPAP and EPAP (CPAP at the level); each leaves the line without PN318', () => {
    const text = '@ 08:00\noxygen epap 6, level 8, fio2 0.4';
    const [f] = pn318(text);
    expect(f!.fixes.map((x) => x.title)).toEqual(['Remove `level 8`', 'Remove `epap 6`']);
    expect(applyEdits(text, f!.fixes[0]!.edits).split('\n')[1]).toBe('oxygen epap 6, fio2 0.4');
    expect(applyEdits(text, f!.fixes[1]!.edits).split('\n')[1]).toBe('oxygen level 8, fio2 0.4');
    const both = '@ 08:00\noxygen ipap 14, epap 6, level 8';
    const [g] = pn318(both);
    expect(g!.fixes.map((x) => x.title)).toEqual(['Remove `level 8`', 'Remove `ipap 14` and `epap 6`']);
    expect(applyEdits(both, g!.fixes[1]!.edits).split('\n')[1]).toBe('oxygen level 8');
    for (const [t, finding] of [[text, f!], [both, g!]] as const) {
      for (const fix of finding.fixes) expect(pn318(applyEdits(t, fix.edits)), fix.title).toEqual([]);
    }
    expect(f!.fixes.some((x) => x.preferred === true)).toBe(false);
  });

  it('stays silent on one support\'s pressures alone (the device is inferred), on a level of 0, and on a named device that gives the pressures', () => {
    for (const line of ['oxygen epap 6', 'oxygen ipap 12', 'oxygen level 8', 'oxygen ipap 12, epap 6', 'oxygen epap 6, level 0', 'oxygen niv ipap 12, epap 6', 'oxygen cpap level 8']) {
      expect(pn318(`@ 08:00\n${line}`), line).toEqual([]);
    }
    // The inferred support: an EPAP alone is NIV, a level alone CPAP; each one's pressure is the end-expiratory one.
    expect(derivation(`${PATIENT}@ 08:00\noxygen epap 6\nvent peak 18, plateau 16`).derived.find((v) => v.id === 'driving_pressure')?.value).toBe(10);
    expect(derivation(`${PATIENT}@ 08:00\noxygen level 8\nvent peak 18, plateau 16`).derived.find((v) => v.id === 'driving_pressure')?.value).toBe(8);
  });

  it('the hover of the level says why it is not used', () => {
    const { result, position } = noteAt('@ 08:00\noxygen epap 6, lev|el 8');
    expect(hoverAt(result, position)?.markdown).toContain('Not used in calculations: with no device named, the EPAP on this line makes it NIV, which gives an IPAP and an EPAP, not one CPAP level (PN318).');
  });
});
