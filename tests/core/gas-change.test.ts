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

  it('says unchanged where a value is the same, and gives P/F and FiO2 0.21 on room air stated at both gases', () => {
    // 63 ÷ 0.21 = 300 and 57.75 ÷ 0.21 = 275 (the P/F formula above; air is FiO2 0.21, common practice, no source).
    const text = '@ day 1 08:00\noxygen air\nabg ph 7.40, pco2 40, po2 63\n@ day 1 08:45\noxygen air\nabg ph 7.40, pco2 41, po2 57.75\n';
    const change = changeSincePreviousGas(checkNote(text), 1)!;
    expect(gasChangeText(change)).toBe('from timepoint 1 (day 1 08:00), 45 min earlier: PaO2 down 5 mmHg (was 63) · PaCO2 up 1 mmHg (was 40) · pH unchanged (7.40) · P/F down 25 mmHg (was 300) · FiO2 unchanged (0.21)');
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
    expect(lines.some((l) => /^ {2}change {2,}at an arterial gas, each value against the previous arterial gas.*never a carried one; P\/F and the settings \(FiO2, O2 flow, PEEP, IPAP, EPAP, CPAP\) as in force at each gas, and the oxygen device where it changed \(\* where a setting was carried\); FiO2 est, a cannula's or simple mask's FiO2 estimated from its flow where none is stated, room air 0\.21$/.test(l))).toBe(true);
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

// Ward oxygen therapy between two gases: the pressures of NIV and CPAP, the device, its flow and a
// low-flow device's FiO2 estimate. Estimates: nasal cannula FiO2 ≈ 0.21 + 0.04 per L/min up to 6
// L/min, simple mask ≈ 0.35 at 5 L/min rising to ≈ 0.55 at 10 L/min (common practice, no source;
// the rules of physiology/oxygen-transport.ts, SOURCES 'nasal-cannula-fio2' and 'simple-mask-fio2').
// P/F = PaO2 ÷ FiO2 (ARDS Definition Task Force, the Berlin Definition, JAMA 2012). Room air is FiO2
// 0.21 (common practice, no source). The differences are plain subtraction of the numbers as shown.
describe('the change since the previous arterial gas, on oxygen therapy outside the ventilator', () => {
  const gasAt = (time: string, oxygen: string, abg: string) => `@ day 1 ${time}\noxygen ${oxygen}\nabg ${abg}\n`;

  it('compares the IPAP and EPAP of NIV: "EPAP up 2 cmH2O (was 6)"', () => {
    // 62 ÷ 0.35 = 177.1 → 177 and 66 ÷ 0.35 = 188.6 → 189: up 12.
    const text = gasAt('02:00', 'niv ipap 14, epap 6, fio2 35 %', 'ph 7.26, pco2 72, po2 62') + gasAt('03:00', 'niv ipap 18, epap 8, fio2 35 %', 'ph 7.30, pco2 64, po2 66');
    const change = changeSincePreviousGas(checkNote(text), 1)!;
    expect(change.changes.map((c) => [c.key, c.earlier, c.later, c.difference, c.unit])).toEqual([
      ['pao2', 62, 66, 4, 'mmHg'],
      ['paco2', 72, 64, -8, 'mmHg'],
      ['ph', 7.26, 7.3, 0.04, 'pH'],
      ['pf_ratio', 62 / 0.35, 66 / 0.35, 12, 'mmHg'],
      ['fio2', 0.35, 0.35, 0, 'fraction'],
      ['ipap', 14, 18, 4, 'cmH2O'],
      ['epap', 6, 8, 2, 'cmH2O'],
    ]);
    expect(gasChangeText(change)).toBe('from timepoint 1 (day 1 02:00), 1 h earlier: PaO2 up 4 mmHg (was 62) · PaCO2 down 8 mmHg (was 72) · pH up 0.04 (was 7.26) · P/F up 12 mmHg (was 177) · FiO2 unchanged (0.35) · IPAP up 4 cmH2O (was 14) · EPAP up 2 cmH2O (was 6)');
  });

  it('compares no FiO2 on a room-air line with an oxygen flow (PN310: room air is then not taken as 0.21)', () => {
    const text = gasAt('08:00', 'room air', 'ph 7.40, pco2 40, po2 80') + gasAt('09:00', 'room air 2', 'ph 7.40, pco2 40, po2 90');
    const change = changeSincePreviousGas(checkNote(text), 1)!;
    expect(change.changes.map((c) => c.key)).toEqual(['pao2', 'paco2', 'ph']); // no P/F, no FiO2, and no flow at the first gas to compare with
  });

  it('compares a CPAP level, and marks a pressure carried in with *', () => {
    const text = gasAt('12:00', 'cpap 8, fio2 0.5', 'ph 7.38, pco2 44, po2 72') + gasAt('14:00', 'cpap 10, fio2 0.5', 'ph 7.39, pco2 43, po2 84') + '@ day 1 16:00\nabg ph 7.40, pco2 42, po2 90\n';
    const result = checkNote(text);
    expect(gasChangeText(changeSincePreviousGas(result, 1))).toContain('FiO2 unchanged (0.50) · CPAP up 2 cmH2O (was 8)');
    expect(gasChangeText(changeSincePreviousGas(result, 2))).toContain('FiO2 unchanged (0.50)* · CPAP unchanged (10 cmH2O)*');
  });

  it('compares no pressure the device in force does not give (an EPAP beside a mask, PN318)', () => {
    const text = gasAt('08:00', 'niv ipap 14, epap 6, fio2 0.4', 'ph 7.30, pco2 60, po2 70') + gasAt('10:00', 'hfnc 50 L/min, fio2 0.4, epap 6', 'ph 7.33, pco2 55, po2 72');
    const change = changeSincePreviousGas(checkNote(text), 1)!;
    expect(change.changes.map((c) => c.key)).not.toContain('epap');
    expect(change.device).toEqual({ earlier: 'niv', later: 'hfnc', carried: false });
  });

  it('says a change of device, and gives each device\'s flow with no up or down: "device now mask (was cannula) · O2 flow 10.0 L/min (was 4.0)"', () => {
    // A flow is no measure of support from one device to another (common practice, no source).
    // Cannula 4 L/min: 0.21 + 0.04 × 4 = 0.37; simple mask 10 L/min: 0.55 (the rules above).
    const text = gasAt('11:00', 'cannula 4 L/min', 'ph 7.39, pco2 42, po2 70') + gasAt('12:00', 'mask 10 L/min', 'ph 7.40, pco2 41, po2 78');
    const change = changeSincePreviousGas(checkNote(text), 1)!;
    expect(gasChangeText(change)).toBe('from timepoint 1 (day 1 11:00), 1 h earlier: PaO2 up 8 mmHg (was 70) · PaCO2 down 1 mmHg (was 42) · pH up 0.01 (was 7.39) · device now mask (was cannula) · FiO2 est up 0.18 (was 0.37 est) · O2 flow 10.0 L/min (was 4.0)');
    expect(change.changes.find((c) => c.key === 'o2_flow')!.otherDevice).toBe(true);
  });

  it('gives a low-flow FiO2 estimate marked as one, also where the device is carried in', () => {
    // Cannula 1 L/min: 0.25; at 6 L/min: 0.45 (the rule above); carried to the third gas.
    const text = gasAt('07:00', 'cannula 1 L/min', 'ph 7.40, pco2 41, po2 62') + gasAt('13:00', 'cannula 6 L/min', 'ph 7.38, pco2 43, po2 75') + '@ day 1 15:00\nabg ph 7.38, pco2 44, po2 74\n';
    const result = checkNote(text);
    const second = changeSincePreviousGas(result, 1)!;
    const fio2 = second.changes.find((c) => c.key === 'fio2')!;
    expect([fio2.earlier, fio2.later, fio2.difference, fio2.earlierEstimated, fio2.laterEstimated]).toEqual([0.25, 0.45, 0.2, true, true]);
    expect(second.device).toBeNull(); // the same device at both: not said
    expect(gasChangeText(second)).toContain('FiO2 est up 0.20 (was 0.25 est) · O2 flow up 5.0 L/min (was 1.0)');
    expect(second.changes.find((c) => c.key === 'o2_flow')!.otherDevice).toBe(false);
    expect(gasChangeText(changeSincePreviousGas(result, 2))).toContain('FiO2 est unchanged (0.45 est)* · O2 flow unchanged (6.0 L/min)*');
  });

  it('compares an estimate with an FiO2 that is set, each marked for what it is', () => {
    // Cannula 2 L/min: 0.29 (the rule above), then a Venturi mask at 35 %: up 0.06.
    const text = gasAt('06:00', 'cannula 2 L/min', 'ph 7.33, pco2 58, po2 54') + gasAt('07:00', 'venturi 35 % 8 L/min', 'ph 7.32, pco2 61, po2 66');
    const change = changeSincePreviousGas(checkNote(text), 1)!;
    expect(gasChangeText(change)).toContain('device now venturi (was cannula) · FiO2 up 0.06 (was 0.29 est) · O2 flow 8.0 L/min (was 2.0)');
  });

  it('says oxygen stopped and restarted, with room air as FiO2 0.21', () => {
    // Cannula 2 L/min: 0.29, room air 0.21: down 0.08; then a cannula at 1 L/min: 0.25, up 0.04.
    const text = 'units gas kPa\n' + gasAt('08:00', 'cannula 2 L/min', 'ph 7.36, pco2 7.2, po2 8.1') + gasAt('12:00', 'room air', 'ph 7.37, pco2 6.9, po2 6.9') + gasAt('13:00', 'cannula 1 L/min', 'ph 7.35, pco2 7.3, po2 7.9');
    const result = checkNote(text);
    expect(gasChangeText(changeSincePreviousGas(result, 1))).toContain('pH up 0.01 (was 7.36) · device now room air (was cannula) · FiO2 down 0.08 (was 0.29 est)');
    // P/F on room air: 6.9 kPa ÷ 0.21 = 32.9 kPa; none on the cannula (an estimate is not used for P/F).
    expect(gasChangeText(changeSincePreviousGas(result, 2))).toContain('pH down 0.02 (was 7.37) · device now cannula (was room air) · FiO2 est up 0.04 (was 0.21)');
  });
});
