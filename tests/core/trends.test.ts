// Trend points: what a trend view plots per timepoint, each value with its unit, and which points
// used carried inputs. Gas pressures and P/F are given in the unit the note writes its gases in.
//
// Numbers: P/F = PaO2 ÷ FiO2 and ΔP = plateau − PEEP (common practice, no source). 1 kPa = 7.50062 mmHg
// (definition of the units: 1 mmHg = 133.3224 Pa, NIST SP 811 — from memory; the hints use the same
// conversion, tests/service/kpa-notes.test.ts cross-checks it with UCUM).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { NoteSession } from '../../server/src/core/session';
import { inlayHints, HINT_CATEGORIES } from '../../server/src/core/service';
import { timepointSummary, trendGasUnit, trendPoints, type TrendPointData } from '../../server/src/core/trends';

const note = [
  'patient sex male, height 175 cm',
  '@ 08:00  start',
  'vent mode VC, vt 420 mL, rate 20, peep 10, fio2 0.5, plateau 27',
  'abg 7.30/50/75/24',
  '@ 09:00',
  'vent plateau 25',
  'abg 7.32/48/80/24',
  '@ 10:00',
  'vitals spo2 95 %',
].join('\n');

const mmHg = (value: number) => ({ value, unit: 'mmHg' });
/** A value in kPa, to 3 decimals: 1000 ÷ 133.322387 and 7.50062 differ in the seventh digit. */
const kPa = (value: number) => ({ value: expect.closeTo(value, 3), unit: 'kPa' });
const cmH2O = (value: number) => ({ value, unit: 'cmH2O' });
const percent = (value: number) => ({ value, unit: '%' });

describe('trend points', () => {
  it('plot stated values where stated, settings where carried, and derived values with their carried mark', () => {
    const points = trendPoints(checkNote(note));
    expect(points.map((p) => p.label)).toEqual(['start', '09:00', '10:00']);
    expect(points[0]?.values).toMatchObject({ pao2: mmHg(75), paco2: mmHg(50), ph: { value: 7.3, unit: 'pH' }, fio2: percent(50), peep: cmH2O(10), pf_ratio: mmHg(150), driving_pressure: cmH2O(17) });
    // Cstat = VT ÷ (plateau − PEEP) = 420 ÷ 17 (common practice, no source).
    expect(points[0]?.values.compliance_static).toEqual({ value: expect.closeTo(420 / 17, 6), unit: 'mL/cmH2O' });
    expect(points[0]?.carried).toEqual([]);
    // PEEP and FiO2 carried to 09:00; the driving pressure there uses the carried PEEP.
    expect(points[1]?.values).toMatchObject({ fio2: percent(50), peep: cmH2O(10), pf_ratio: mmHg(160), driving_pressure: cmH2O(15) });
    expect(points[1]?.carried).toEqual(expect.arrayContaining(['fio2', 'peep', 'driving_pressure', 'pf_ratio']));
    expect(points[2]?.values).toEqual({ spo2: percent(95), fio2: percent(50), peep: cmH2O(10) });
    expect(timepointSummary(checkNote(note), 6)?.text).toMatch(/P\/F 160/);
  });

  it('keep the points of timepoints an edit did not touch, and recompute the edited one', () => {
    const session = new NoteSession();
    const first = trendPoints(session.update(note));
    const edited = note.replace('abg 7.32/48/80/24', 'abg 7.32/48/90/24');
    const second = trendPoints(session.update(edited));
    expect(second[0]).toBe(first[0]);
    expect(second[1]).not.toBe(first[1]);
    expect(second[1]?.values.pao2).toEqual(mmHg(90));
    expect(second[1]?.values.pf_ratio).toEqual(mmHg(180));
    expect(second).toEqual(trendPoints(checkNote(edited)));
  });
});

// Invented: a venturi mask, then non-invasive ventilation, the gases written in kPa.
const kpaNote = [
  'patient age 71 y, sex female',
  'units gas kPa',
  '@ day 1 14:50  venturi',
  'oxygen venturi, fio2 28 %',
  'abg ph 7.28, pco2 9.1, po2 7.9, hco3 31.5',
  '@ 16:00  ventilation',
  'oxygen niv ipap 18, epap 5, fio2 30 %',
  'abg ph 7.34, pco2 7.9, po2 8.3, hco3 31.8',
].join('\n');

const gasValues = (p: TrendPointData | undefined) => ({ pao2: p?.values.pao2, paco2: p?.values.paco2, pf_ratio: p?.values.pf_ratio });

describe('trend points in a kPa note', () => {
  it('give PaO2, PaCO2 and P/F in kPa, with the numbers the note wrote', () => {
    const result = checkNote(kpaNote);
    expect(trendGasUnit(result)).toBe('kPa');
    const points = trendPoints(result);
    // 7.9 ÷ 0.28 = 28.21 kPa; 8.3 ÷ 0.30 = 27.67 kPa (P/F holds in any pressure unit).
    expect(gasValues(points[0])).toEqual({ pao2: kPa(7.9), paco2: kPa(9.1), pf_ratio: kPa(7.9 / 0.28) });
    expect(gasValues(points[1])).toEqual({ pao2: kPa(8.3), paco2: kPa(7.9), pf_ratio: kPa(8.3 / 0.3) });
    // The rest keeps its units: pH, FiO2 as a percentage.
    expect(points[0]?.values.ph).toEqual({ value: 7.28, unit: 'pH' });
    expect(points[0]?.values.fio2).toEqual({ value: expect.closeTo(28, 9), unit: '%' });
  });

  it('agree with the hints: P/F 28.2 kPa', () => {
    const result = checkNote(kpaNote);
    const hint = inlayHints(result, { start: 4, end: 4 }, { categories: new Set(HINT_CATEGORIES) })[0];
    expect(hint?.label).toMatch(/^P\/F 28\.2 kPa \(212\)/);
    expect(trendPoints(result)[0]?.values.pf_ratio?.value.toFixed(1)).toBe('28.2');
  });

  it('follow the gasUnit setting, and gases written with kPa after them in a note read in mmHg', () => {
    const bySetting = checkNote('@ 08:00\noxygen venturi, fio2 0.4\nabg 7.32/7.2/9.8/26', { gasUnit: 'kPa' });
    expect(trendGasUnit(bySetting)).toBe('kPa');
    expect(gasValues(trendPoints(bySetting)[0])).toEqual({ pao2: kPa(9.8), paco2: kPa(7.2), pf_ratio: kPa(9.8 / 0.4) });
    const written = checkNote('@ 08:00\noxygen venturi, fio2 0.4\nabg 7.32/6.1/9.4/22 kPa');
    expect(trendGasUnit(written)).toBe('kPa');
    expect(gasValues(trendPoints(written)[0])).toEqual({ pao2: kPa(9.4), paco2: kPa(6.1), pf_ratio: kPa(9.4 / 0.4) });
  });

  it('stay in mmHg in an mmHg note, and in a note with no gas to plot', () => {
    expect(trendGasUnit(checkNote(note))).toBe('mmHg');
    const noGas = checkNote('@ 08:00\nvitals spo2 93 %');
    expect(trendGasUnit(noGas)).toBe('mmHg');
    // Without a gas, the gas unit in force at the last timepoint.
    expect(trendGasUnit(checkNote('units gas kPa\n@ 08:00\nvitals spo2 93 %'))).toBe('kPa');
  });
});

describe('trend points of a note that mixes units', () => {
  const mmhgGas = (time: string) => [`@ ${time}`, 'oxygen venturi, fio2 0.4', 'abg 7.30/56/71/26'];
  const kpaGas = (time: string) => [`@ ${time}`, 'oxygen venturi, fio2 0.4', 'abg 7.32/7.2/9.8/26 kPa'];

  it('plot every gas in the unit of most of them, converted where written in the other', () => {
    const result = checkNote([...kpaGas('08:00'), ...mmhgGas('09:00'), ...kpaGas('10:00')].join('\n'));
    expect(trendGasUnit(result)).toBe('kPa');
    const points = trendPoints(result);
    // 71 mmHg = 9.47 kPa, 56 mmHg = 7.47 kPa; P/F 71 ÷ 0.4 = 177.5 mmHg = 23.66 kPa.
    expect(gasValues(points[1])).toEqual({ pao2: kPa(71 / 7.50062), paco2: kPa(56 / 7.50062), pf_ratio: kPa(177.5 / 7.50062) });
    expect(points.every((p) => p.values.pao2?.unit === 'kPa' && p.values.pf_ratio?.unit === 'kPa')).toBe(true);
    const mostlyMmhg = checkNote([...mmhgGas('08:00'), ...kpaGas('09:00'), ...mmhgGas('10:00')].join('\n'));
    expect(trendGasUnit(mostlyMmhg)).toBe('mmHg');
    // 9.8 kPa = 73.5 mmHg.
    expect(trendPoints(mostlyMmhg)[1]?.values.pao2).toEqual({ value: expect.closeTo(9.8 * 7.50062, 3), unit: 'mmHg' });
  });

  it('give a tie to the unit of the gas written last', () => {
    expect(trendGasUnit(checkNote([...mmhgGas('08:00'), ...kpaGas('09:00')].join('\n')))).toBe('kPa');
    expect(trendGasUnit(checkNote([...kpaGas('08:00'), ...mmhgGas('09:00')].join('\n')))).toBe('mmHg');
  });

  it('derive the points again when an edit changes the unit, and keep them when it does not', () => {
    const session = new NoteSession();
    const text = [...mmhgGas('08:00'), ...mmhgGas('09:00'), '@ 10:00', 'vitals spo2 93 %'].join('\n');
    const first = trendPoints(session.update(text));
    const switched = text.replace('abg 7.30/56/71/26', 'abg 7.32/7.2/9.8/26 kPa');
    const second = trendPoints(session.update(switched));
    // One gas in each unit: the later one (mmHg) decides; nothing to derive again but the edited timepoint.
    expect(second[1]).toBe(first[1]);
    expect(second[0]).not.toBe(first[0]);
    const both = switched.replace('abg 7.30/56/71/26', 'abg 7.32/7.2/9.8/26 kPa');
    const third = trendPoints(session.update(both));
    expect(third.map((p) => p.values.pao2?.unit)).toEqual(['kPa', 'kPa', undefined]);
    expect(third).toEqual(trendPoints(checkNote(both)));
  });
});
