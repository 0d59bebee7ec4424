// The change since the previous arterial gas (core/gas-change.ts), on invented notes. P/F = PaO2 ÷
// FiO2 (ARDS Definition Task Force, Acute respiratory distress syndrome: the Berlin Definition,
// JAMA 2012): 80 ÷ 0.40 = 200 and 60 ÷ 0.60 = 100. The differences are plain subtraction of the
// numbers as shown; no threshold is applied, so no source beyond the P/F formula is needed.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { changeSincePreviousGas, gasChangeText, hasArterialGas } from '../../server/src/core/gas-change';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';

const TWO_GASES = [
  'patient   age 60 y, sex male, height 175 cm',
  '@ day 1 08:00  first gas',
  'vent      mode VC, vt 450 mL, rate 18, peep 8, fio2 0.4',
  'abg       ph 7.30, pco2 50, po2 80',
  '@ day 1 10:00  no gas here',
  'vitals    hr 90',
  '@ day 1 14:30  second gas',
  'vent      peep 10, fio2 0.6',
  'abg       ph 7.34, pco2 46, po2 60',
  '',
].join('\n');

describe('the change since the previous arterial gas', () => {
  it('gives the earlier value, the difference and the time between, for the gas values, P/F, FiO2 and PEEP', () => {
    const result = checkNote(TWO_GASES);
    const change = changeSincePreviousGas(result, 2)!;
    expect(change.from).toEqual({ timepoint: 0, label: 'first gas', time: 'day 1 08:00' });
    expect(change.minutesBetween).toBe(390);
    expect(change.changes.map((c) => [c.key, c.earlier, c.later, c.difference, c.unit])).toEqual([
      ['pao2', 80, 60, -20, 'mmHg'],
      ['paco2', 50, 46, -4, 'mmHg'],
      ['ph', 7.3, 7.34, 0.04, 'pH'],
      ['pf_ratio', 200, 100, -100, 'mmHg'],
      ['fio2', 0.4, 0.6, 0.2, 'fraction'],
      ['peep', 8, 10, 2, 'cmH2O'],
    ]);
    expect(gasChangeText(change)).toBe('from timepoint 1 (first gas, day 1 08:00), 6 h 30 min earlier: PaO2 down 20 mmHg (was 80) · PaCO2 down 4 mmHg (was 50) · pH up 0.04 (was 7.30) · P/F down 100 mmHg (was 200) · FiO2 up 0.20 (was 0.40) · PEEP up 2 cmH2O (was 8)');
  });

  it('is null at the first gas and at a timepoint without an arterial gas', () => {
    const result = checkNote(TWO_GASES);
    expect(changeSincePreviousGas(result, 0)).toBeNull();
    expect(changeSincePreviousGas(result, 1)).toBeNull();
    expect(hasArterialGas(result.analysis.timeline.timepoints[1]!)).toBe(false);
  });

  it('compares the settings in force at each gas, carried ones marked *, and the P/F computed with them', () => {
    // No vent line at the second gas: the FiO2 0.4 and PEEP 8 of the first are still in force, so
    // the second P/F is 60 ÷ 0.40 = 150, marked as computed with a carried FiO2.
    const text = TWO_GASES.replace('vent      peep 10, fio2 0.6\n', '');
    const change = changeSincePreviousGas(checkNote(text), 2)!;
    expect(change.changes.map((c) => [c.key, c.earlier, c.later, c.carried])).toEqual([
      ['pao2', 80, 60, false],
      ['paco2', 50, 46, false],
      ['ph', 7.3, 7.34, false],
      ['pf_ratio', 200, 150, true],
      ['fio2', 0.4, 0.4, true],
      ['peep', 8, 8, true],
    ]);
    expect(gasChangeText(change)).toBe('from timepoint 1 (first gas, day 1 08:00), 6 h 30 min earlier: PaO2 down 20 mmHg (was 80) · PaCO2 down 4 mmHg (was 50) · pH up 0.04 (was 7.30) · P/F down 50 mmHg (was 200)* · FiO2 unchanged (0.40)* · PEEP unchanged (8 cmH2O)*');
  });

  it('compares no gas value carried in, nor a P/F computed with a PaO2 carried in', () => {
    // The second gas states a pH alone: its PaO2 and PaCO2, if carried, are no new measurement.
    const text = TWO_GASES.replace('abg       ph 7.34, pco2 46, po2 60', 'abg       ph 7.34');
    const change = changeSincePreviousGas(checkNote(text), 2)!;
    expect(change.changes.map((c) => c.key)).toEqual(['ph', 'fio2', 'peep']);
    expect(change.changes.map((c) => c.carried)).toEqual([false, false, false]);
  });

  it('passes over a venous gas: only an arterial gas counts as the previous gas', () => {
    const text = TWO_GASES.replace('vitals    hr 90', 'vbg       ph 7.25, pco2 60, po2 40');
    const result = checkNote(text);
    expect(changeSincePreviousGas(result, 1)).toBeNull();
    expect(changeSincePreviousGas(result, 2)?.from.timepoint).toBe(0);
  });

  it('says unchanged where a value is the same, and gives P/F on room air stated at both gases', () => {
    // 63 ÷ 0.21 = 300 and 57.75 ÷ 0.21 = 275 (the P/F formula above; air is FiO2 0.21).
    const text = '@ day 1 08:00\noxygen air\nabg ph 7.40, pco2 40, po2 63\n@ day 1 08:45\noxygen air\nabg ph 7.40, pco2 41, po2 57.75\n';
    const change = changeSincePreviousGas(checkNote(text), 1)!;
    expect(gasChangeText(change)).toBe('from timepoint 1 (day 1 08:00), 45 min earlier: PaO2 down 5 mmHg (was 63) · PaCO2 up 1 mmHg (was 40) · pH unchanged (7.40) · P/F down 25 mmHg (was 300)');
  });

  it('gives gas pressures and P/F in kPa in a note that writes its gases in kPa', () => {
    // 10.0 kPa ÷ 0.40 = 25.0 kPa and 8.0 kPa ÷ 0.50 = 16.0 kPa (the P/F formula above, in kPa).
    const text = 'units gas kPa\n@ day 1 08:00\noxygen mask, fio2 0.4\nabg ph 7.35, pco2 6.0, po2 10.0\n@ day 2 09:00\noxygen mask, fio2 0.5\nabg ph 7.33, pco2 6.5, po2 8.0\n';
    const change = changeSincePreviousGas(checkNote(text), 1)!;
    expect(change.minutesBetween).toBe(1500);
    const text2 = gasChangeText(change);
    expect(text2).toContain('from timepoint 1 (day 1 08:00), 25 h earlier: PaO2 down 2.0 kPa (was 10.0) · PaCO2 up 0.5 kPa (was 6.0) · pH down 0.02 (was 7.35) · P/F down 9.0 kPa (was 25.0) · FiO2 up 0.10 (was 0.40)');
  });

  it('leaves the time out when a timepoint has none', () => {
    const text = 'abg ph 7.40, pco2 40, po2 90\n@ later  after the change\nabg ph 7.38, pco2 42, po2 80\n';
    const result = checkNote(text);
    const change = changeSincePreviousGas(result, 1);
    expect(change?.minutesBetween).toBeNull();
    expect(gasChangeText(change)).toMatch(/^from timepoint 1 \(start\): PaO2 down 10 mmHg \(was 90\)/);
  });
});

describe('the change since the previous arterial gas, in `pneumark show`', () => {
  it('writes a change line under the derived values of a later gas, none at the first, and explains it in the legend', async () => {
    const io = memoryIo({ stdin: TWO_GASES, env: { NO_COLOR: '1' }, tty: false });
    await run(['show', '-'], io);
    const out = io.out();
    const lines = out.split('\n');
    const change = lines.filter((l) => l.startsWith('  change   from '));
    expect(change).toEqual(['  change   from timepoint 1 (first gas, day 1 08:00), 6 h 30 min earlier: PaO2 down 20 mmHg (was 80) · PaCO2 down 4 mmHg (was 50) · pH up 0.04 (was 7.30) · P/F down 100 mmHg (was 200) · FiO2 up 0.20 (was 0.40) · PEEP up 2 cmH2O (was 8)']);
    const at = lines.indexOf(change[0]!);
    expect(lines[at - 1]).toMatch(/^ {2}derived /);
    expect(lines.some((l) => /^ {2}change {2,}at an arterial gas, each value against the previous arterial gas.*never a carried one; FiO2, PEEP and P\/F as in force at each gas \(\* where a setting was carried\)$/.test(l))).toBe(true);
  });

  it('marks a carried setting on the change line with *, and the legend explains the mark there', async () => {
    const io = memoryIo({ stdin: TWO_GASES.replace('vent      peep 10, fio2 0.6\n', ''), env: { NO_COLOR: '1' }, tty: false });
    await run(['show', '-'], io);
    const lines = io.out().split('\n');
    expect(lines.filter((l) => l.startsWith('  change   from '))).toEqual(['  change   from timepoint 1 (first gas, day 1 08:00), 6 h 30 min earlier: PaO2 down 20 mmHg (was 80) · PaCO2 down 4 mmHg (was 50) · pH up 0.04 (was 7.30) · P/F down 50 mmHg (was 200)* · FiO2 unchanged (0.40)* · PEEP unchanged (8 cmH2O)*']);
    expect(lines.some((l) => /^ {2}\* {2,}a derived value computed with a value carried from an earlier timepoint; on a change line, a setting carried in or a ratio computed with one$/.test(l))).toBe(true);
  });

  it('writes no change line, and no legend entry, in a note with one arterial gas', async () => {
    const io = memoryIo({ stdin: TWO_GASES.split('@ day 1 10:00')[0], env: { NO_COLOR: '1' }, tty: false });
    await run(['show', '-'], io);
    expect(io.out()).not.toMatch(/^ {2}change /m); // neither a change line nor the legend's entry
  });
});

describe('the time between two gases', () => {
  it('follows an offset from the previous timepoint, and is left out after `@ day N` alone (no time of day)', () => {
    const offset = '@ day 1 08:00  first\nabg ph 7.40, pco2 40, po2 90\n@ +2h30  second\nabg ph 7.38, pco2 42, po2 80\n';
    const change = changeSincePreviousGas(checkNote(offset), 1)!;
    expect(change.minutesBetween).toBe(150);
    expect(gasChangeText(change)).toMatch(/^from timepoint 1 \(first, day 1 08:00\), 2 h 30 min earlier: /);
    const dayOnly = '@ day 1  first\nabg ph 7.40, pco2 40, po2 90\n@ day 2 09:00  second\nabg ph 7.38, pco2 42, po2 80\n';
    const noTime = changeSincePreviousGas(checkNote(dayOnly), 1)!;
    expect(noTime.minutesBetween).toBeNull();
    expect(gasChangeText(noTime)).toMatch(/^from timepoint 1 \(first, day 1\): PaO2 down 10 mmHg \(was 90\)/);
  });
});
