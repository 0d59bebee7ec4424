// High-frequency oscillation: the set rate is the oscillation frequency, written in Hz as it is
// set. 1 Hz = 1 cycle per second = 60 /min (UCUM: Hz = 1/s; checked against @lhncbc/ucum-lhc). The
// usual range of 3–15 Hz is common practice, from memory. Minute ventilation VT × RR (common
// practice, no source), mechanical power (Gattinoni L et al., Intensive Care Med 2016;42:1567–1575)
// and the ventilatory ratio (Sinha P et al., Br J Anaesth 2009;102:692–697) are formulas of
// conventional breaths: an oscillator's frequency is no rate of breaths for them.
import { UcumLhcUtils } from '@lhncbc/ucum-lhc';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { convert, unitById } from '../../server/src/core/fields/units';
import { exportColumns, timepointRows } from '../../server/src/core/export';
import { hoverAt } from '../../server/src/core/service';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { noteAt } from '../service/cursor';

const findings = (text: string, code?: string) => checkNote(text).findings.filter((f) => code === undefined || f.code === code);
const derivation = (text: string, index = 0) => checkNote(text).analysis.derivation(index);
const rateOf = (text: string, index = 0) => checkNote(text).analysis.timeline.timepoints[index]?.values.numberOf('vent_rate');

describe('Hz as a unit of the set rate', () => {
  it('1 Hz = 60 /min, as UCUM converts it', () => {
    const ucum = UcumLhcUtils.getInstance();
    const r = ucum.convertUnitTo('Hz', 1, '/min') as { status: string; toVal: number };
    expect(r.status).toBe('succeeded');
    expect(r.toVal).toBeCloseTo(60, 9);
    const hz = unitById('Hz')!;
    expect(hz.ucum).toBe('Hz');
    expect(convert(5, hz, unitById('/min')!)).toBe(300);
    expect(convert(330, unitById('/min')!, hz)).toBeCloseTo(5.5, 12);
  });

  it('`vent mode HFOV, rate 5 Hz, fio2 0.6` is read as 300 /min, with no finding', () => {
    const text = '@ 08:00\nvent mode HFOV, rate 5 Hz, fio2 0.6';
    expect(findings(text)).toEqual([]);
    expect(rateOf(text)).toBe(300);
    // Any case: `hz`, `HZ`.
    expect(rateOf('@ 08:00\nvent mode HFOV, rate 10 hz, fio2 0.6')).toBe(600);
  });

  it('is shown in /min with the Hz written beside it, in the hover', () => {
    const { result, position } = noteAt('@ 08:00\nvent mode HFOV, rate 5.5| Hz, fio2 0.6');
    const md = hoverAt(result, position)?.markdown ?? '';
    expect(md).toContain('330 /min');
    expect(md).toContain('5.5 Hz');
  });

  it('is exported in /min, the canonical unit of the column', () => {
    const text = '@ 08:00\nvent mode HFOV, rate 5 Hz, fio2 0.6';
    const columns = exportColumns().map((c) => c.name);
    expect(columns).toContain('vent_rate_per_min');
    const [row] = timepointRows('n.pneu', checkNote(text), { redactProse: false, shiftDays: 0 });
    expect(row?.['vent_rate_per_min']).toBe(300);
    // Minute ventilation is left empty in HFOV (its column says so).
    const [withVt] = timepointRows('n.pneu', checkNote('@ 08:00\nvent mode HFOV, rate 5 Hz, vt 100 mL, fio2 0.6'), { redactProse: false, shiftDays: 0 });
    expect(withVt?.['vent_rate_per_min']).toBe(300);
    expect(withVt?.['minute_ventilation_L_min'] ?? null).toBeNull();
    expect(exportColumns().find((c) => c.name === 'minute_ventilation_L_min')?.description).toMatch(/empty in HFOV/);
  });

  it('is impossible above 20 Hz (1200 /min)', () => {
    const [f] = findings('@ 08:00\nvent mode HFOV, rate 25 Hz, fio2 0.6', 'PN301');
    expect(f?.message).toBe('Set rate 25 Hz is impossible (expected 0 Hz to 20 Hz); it is not used in calculations.');
  });
});

describe('bounds shown in Hz', () => {
  // 180 /min = 3 Hz, 900 /min = 15 Hz, 60 /min = 1 Hz, 1200 /min = 20 Hz (1 Hz = 60 /min).
  it('read as the whole numbers they are: `3 Hz to 15 Hz`, not `3.0 Hz to 15.0 Hz`', () => {
    expect(findings('@ 08:00\nvent mode HFOV, rate 16 Hz', 'PN302')[0]?.message).toBe('Set rate 16 Hz is unusual (usually 3 Hz to 15 Hz): check the unit and the transcription.');
    expect(findings('@ 08:00\nvent mode HFOV, rate 2 Hz', 'PN302')[0]?.message).toBe('Set rate 2 Hz is unusual (usually 3 Hz to 15 Hz): check the unit and the transcription.');
  });

  it('keep a value written with decimals on its side, without trailing zeros', () => {
    // 15.004 Hz is 900.24 /min, above 900 /min; the bound reads 15 Hz, not 15.000 Hz.
    expect(findings('@ 08:00\nvent mode HFOV, rate 15.004 Hz', 'PN302')[0]?.message).toMatch(/^Set rate 15\.004 Hz is unusual \(usually 3 Hz to 15 Hz\)/);
  });

  it('outside HFOV, the usual maximum is also given in /min, the unit such a rate is set in', () => {
    expect(findings('@ 08:00\nvent mode VC, rate 2 Hz', 'PN302')[0]?.message).toMatch(/^Set rate 2 Hz is unusual \(usually at most 1 Hz, or 60 \/min\): /);
  });

  it('leave the precision of bounds in other units as it was: `2.0 kPa`, `6.80 to 7.80`', () => {
    expect(findings('@ 08:00\nabg pco2 25 kPa', 'PN302')[0]?.message).toMatch(/\(usually 2\.0 kPa to 20\.0 kPa\)/);
    expect(findings('@ 08:00\nabg ph 6.7', 'PN302')[0]?.message).toMatch(/\(usually 6\.80 to 7\.80\)/);
    // A bare rate under HFOV is read in /min, and its bounds are shown in /min.
    expect(findings('@ 08:00\nvent mode HFOV, rate 1000', 'PN302')[0]?.message).toMatch(/\(usually 180 \/min to 900 \/min\)/);
  });
});

describe('the usual set rate depends on the mode', () => {
  it('in HFOV 3–15 Hz is usual, and so is the same frequency written in /min', () => {
    expect(findings('@ 08:00\nvent mode HFOV, rate 3 Hz, fio2 0.6')).toEqual([]);
    expect(findings('@ 08:00\nvent mode HFOV, rate 15 Hz, fio2 0.6')).toEqual([]);
    expect(findings('@ 08:00\nvent mode HFOV, rate 300 /min, fio2 0.6')).toEqual([]);
    // The mode carried from an earlier timepoint counts.
    expect(findings('@ 08:00\nvent mode HFOV, rate 5 Hz, fio2 0.6\n@ 09:00\nvent rate 6 Hz')).toEqual([]);
  });

  it('in HFOV a bare `rate 5` (5 /min) is reported with Hz offered, and the fixed note is quiet', () => {
    const text = '@ 08:00\nvent mode HFOV, rate 5, fio2 0.6';
    const [f] = findings(text, 'PN302');
    expect(f?.message).toBe('Set rate 5 /min is unusual (usually 180 /min to 900 /min): check the unit and the transcription. In HFOV the rate is a frequency: 5 Hz would be usual.');
    expect(f?.fixes.map((x) => x.title)).toEqual(['Write 5 Hz']);
    const fixed = applyEdits(text, f!.fixes[0]!.edits);
    expect(fixed).toBe('@ 08:00\nvent mode HFOV, rate 5 Hz, fio2 0.6');
    expect(findings(fixed)).toEqual([]);
    // Written in /min, the unit is replaced.
    const written = '@ 08:00\nvent mode HFOV, rate 8 /min, fio2 0.6';
    const [g] = findings(written, 'PN302');
    expect(applyEdits(written, g!.fixes[0]!.edits)).toBe('@ 08:00\nvent mode HFOV, rate 8 Hz, fio2 0.6');
    // 1 /min is 1 Hz, below the usual 3 Hz: reported, with nothing offered.
    expect(findings('@ 08:00\nvent mode HFOV, rate 1, fio2 0.6', 'PN302')[0]?.fixes).toEqual([]);
  });

  it('outside HFOV a rate in Hz is read and used; above 1 Hz (60 /min) it is reported, with a word on HFOV', () => {
    // 0.25 Hz = 15 /min: a usual rate, written in an unusual unit, read exactly.
    const text = '@ 08:00\nvent mode VC, vt 400 mL, rate 0.25 Hz, peep 8, fio2 0.5';
    expect(findings(text)).toEqual([]);
    expect(rateOf(text)).toBe(15);
    expect(derivation(text).derived.find((v) => v.id === 'minute_ventilation')?.value).toBeCloseTo(6, 9); // 400 mL × 15 /min
    const [f] = findings('@ 08:00\nvent mode PC, rate 2 Hz, fio2 0.6', 'PN302');
    expect(f?.message).toBe('Set rate 2 Hz is unusual (usually at most 1 Hz, or 60 /min): check the unit and the transcription. A rate in Hz is usual in HFOV; the mode in force here is PC. As `2 /min` it would be usual.');
    expect(f?.fixes.map((x) => x.title)).toEqual(['Write /min instead of Hz']);
    expect(findings('@ 08:00\nvent rate 5 Hz, fio2 0.6', 'PN302')[0]?.message).toMatch(/the mode in force here is not stated\. As `5 \/min` it would be usual\.$/);
    // `rate 14 Hz` in VC (840 /min): 14 /min would be usual, and /min is offered.
    const text14 = '@ 08:00\nvent mode VC, vt 400 mL, rate 14 Hz, peep 8';
    const [g] = findings(text14, 'PN302');
    expect(g?.message).toBe('Set rate 14 Hz is unusual (usually at most 1 Hz, or 60 /min): check the unit and the transcription. A rate in Hz is usual in HFOV; the mode in force here is VC. As `14 /min` it would be usual.');
    expect(g?.fixes.map((x) => x.title)).toEqual(['Write /min instead of Hz']);
    expect(findings(applyEdits(text14, g!.fixes[0]!.edits))).toEqual([]);
  });

  it('a conventional rate above 60 /min stays unusual, not impossible (up to 1200 /min)', () => {
    expect(findings('@ 08:00\nvent mode VC, rate 200', 'PN302')).toHaveLength(1);
    expect(findings('@ 08:00\nvent mode VC, rate 200', 'PN301')).toEqual([]);
  });
});

describe('values of conventional breaths are not worked out in HFOV', () => {
  const hfov = 'patient sex male, height 175 cm\n@ 08:00\nvent mode HFOV, rate 5 Hz, vt 100 mL, peep 10, peak 40, plateau 30, fio2 0.6\nvitals rr 30\nabg 7.30/55/70/26';
  it('minute ventilation, mechanical power and the ventilatory ratio: not applicable, never asked for', () => {
    const d = derivation(hfov);
    for (const id of ['minute_ventilation', 'mechanical_power', 'ventilatory_ratio']) {
      expect(d.derived.find((v) => v.id === id), id).toBeUndefined();
      expect(d.missing.find((m) => m.id === id), id).toBeUndefined();
      expect(d.notApplicable.find((n) => n.id === id)?.reason, id).toMatch(/^not worked out in HFOV/);
    }
    // With a measured minute volume too.
    expect(derivation(hfov.replace('vitals rr 30', 'vent ve 8')).derived.find((v) => v.id === 'ventilatory_ratio')).toBeUndefined();
    // The same settings under PC give them (100 mL × 30 /min = 3 L/min).
    expect(derivation(hfov.replace('HFOV, rate 5 Hz', 'PC, rate 20')).derived.find((v) => v.id === 'minute_ventilation')?.value).toBeCloseTo(3, 9);
  });

  it('a measured rate below the oscillation frequency is no rate below the set one (PN309)', () => {
    expect(findings(hfov, 'PN309')).toEqual([]);
  });
});

describe('`mpaw`, a spelling of mean airway pressure', () => {
  it('reads as mean airway pressure, and gives the oxygenation index', () => {
    const text = '@ 08:00\nvent mode HFOV, rate 5 Hz, mpaw 25, fio2 0.6\nabg po2 70';
    expect(findings(text, 'PN201')).toEqual([]);
    const oi = derivation(text).derived.find((v) => v.id === 'oxygenation_index');
    // OI = FiO2 × MAP × 100 / PaO2 = 0.6 × 25 × 100 / 70 (Ortiz et al. 1987, from memory).
    expect(oi?.value).toBeCloseTo((0.6 * 25 * 100) / 70, 9);
  });
});
