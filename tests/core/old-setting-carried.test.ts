// A setting carried into a gas's derived values from long before (PN326).
// P/F = PaO2 ÷ FiO2 (ARDS Definition Task Force, JAMA 2012;307:2526–2533): at day 3 08:00 the
// P/F of PaO2 70 on the FiO2 0.5 of day 1 10:00 is 140, 46 h after the FiO2 was written.
// The default of 12 h (one shift) is common practice, no source.
import { describe, expect, it } from 'vitest';
import { CARRIED_46_H, CARRIED_VOLUME, gasLater } from '../helpers/carried-notes';
import { checkNote } from '../../server/src/core';
import { NoteSession } from '../../server/src/core/session';
import type { Settings } from '../../server/src/core/settings';

const EXAMPLE = CARRIED_46_H;

const found = (text: string, settings: Partial<Settings> = {}) => checkNote(text, settings).findings.filter((f) => f.code === 'PN326');

const later = gasLater;

describe('a setting carried into a gas from long before (PN326)', () => {
  it('is reported once, on the gas line, naming the settings, their values, when and where they were stated, and how long ago', () => {
    const f = found(EXAMPLE);
    expect(f).toHaveLength(1);
    expect(f[0]!.severity).toBe('warning');
    expect(f[0]!.range.start.line).toBe(5);
    // The ventilatory ratio rests on the set tidal volume and rate too (VE = VT × set rate, no rate measured here).
    expect(f[0]!.message).toBe('PiO2, PAO2, A–a, a/A, P/F, VR and the readings here rest on FiO2 0.50, PEEP 8 cmH2O, VT 420 mL and set rate 16 /min, stated at day 1 10:00 (line 3), 46 h before this timepoint: check that they still held at this timepoint, and write them here if so, or the ones that did.');
    expect(f[0]!.related).toEqual([{ range: { start: { line: 2, character: 19 }, end: { line: 2, character: 52 } }, message: 'FiO2, PEEP, VT and set rate carried from here, day 1 10:00' }]);
    expect(f[0]!.fixes ?? []).toEqual([]);
    // The first gas, on settings of its own timepoint, is not reported.
    expect(found(EXAMPLE).every((x) => x.range.start.line !== 3)).toBe(true);
  });

  it('is silent for a carry within the limit, also across midnight, and at exactly the limit', () => {
    expect(found(later('day 1 18:00'))).toEqual([]);
    // 10 h across midnight: within the limit, though its origin names the day before.
    expect(found('@ day 1 20:00\nvent mode VC, vt 420, rate 16, peep 8, fio2 0.5\n@ day 2 06:00\nabg 7.38/42/70/24')).toEqual([]);
    expect(found(later('day 2 06:00'))[0]!.message).toContain('20 h before this timepoint');
    // 12 h exactly: not more than the limit.
    expect(found(later('day 1 22:00'))).toEqual([]);
    expect(found(later('day 1 22:01'))).toHaveLength(1);
    expect(found(later('day 1 22:01'))[0]!.message).toContain('12 h 1 min before this timepoint');
  });

  it('counts from the timepoint that restated a setting, with the same value', () => {
    const restated = '@ day 1 10:00\nvent mode VC, vt 420, rate 16, peep 8, fio2 0.5\n@ day 2 06:00\nvent peep 8, fio2 0.5\n@ day 2 12:00\nabg 7.38/42/70/24';
    expect(found(restated)).toEqual([]);
  });

  it('names a carried PEEP alone where the FiO2 was written since', () => {
    const f = found(later('day 2 12:00', 'vent      fio2 0.4'));
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toBe('The readings here rest on PEEP 8 cmH2O, stated at day 1 10:00 (line 2), 26 h before this timepoint: check that it still held at this timepoint, and write it here if so, or the one that did.');
    expect(f[0]!.range.start.line).toBe(4);
  });

  it('names the FiO2 of a room-air device, a mean airway pressure set on an oscillator, and what rests on them beside a gas', () => {
    const air = found('@ day 1 10:00\noxygen room air\n@ day 2 10:00\nabg 7.40/40/70/24');
    expect(air.map((f) => f.message)).toEqual(['PiO2, PAO2, A–a, a/A and P/F here rest on oxygen device room air, stated at day 1 10:00 (line 2), 24 h before this timepoint: check that it still held at this timepoint, and write it here if so, or the one that did.']);
    expect(found('@ day 1 10:00\nvent mode HFOV, map 20, amplitude 40, hz 6, fio2 0.6\n@ day 2 10:00\nabg 7.40/40/70/24')[0]!.message).toContain('OI and the readings here rest on FiO2 0.60 and mean airway pressure 20 cmH2O,');
    expect(found('@ day 1 10:00\nvent mode VC, vt 420, rate 16, peep 8, fio2 0.5\n@ day 2 10:00\nvitals spo2 93')[0]!.message).toMatch(/^S\/F here rests on FiO2 0\.50, stated at day 1 10:00 \(line 2\), 24 h before/);
    const plateau = found('@ day 1 10:00\nvent mode VC, vt 420, rate 16, peep 8, fio2 0.5\n@ day 2 10:00\nvent plateau 25');
    expect(plateau[0]!.message).toMatch(/^ΔP and Cstat here rest on PEEP 8 cmH2O and VT 420 mL,/);
    expect(plateau[0]!.range.start.line).toBe(3);
    // Nothing measured here rests on them: nothing to report.
    expect(found('@ day 1 10:00\nvent mode VC, vt 420, rate 16, peep 8, fio2 0.5\n@ day 2 10:00\nvitals hr 80')).toEqual([]);
  });

  it('names a set tidal volume carried into compliance and VE, on the line whose values they combine it with', () => {
    // Static compliance VT ÷ (Pplat − PEEP), VE = VT × RR ÷ 1000 (standard respiratory mechanics,
    // common practice, no source): 450 ÷ (24 − 5) and 450 × 16, on a volume set 50 h before.
    const f = found(CARRIED_VOLUME);
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toBe('VE and Cstat here rest on VT 450 mL, stated at day 1 08:00 (line 2), 50 h before this timepoint: check that it still held at this timepoint, and write it here if so, or the one that did.');
    // The plateau's line: the first line whose stated value is combined with the old setting.
    expect(f[0]!.range.start.line).toBe(4);
    expect(f[0]!.related).toEqual([{ range: { start: { line: 1, character: 19 }, end: { line: 1, character: 25 } }, message: 'VT carried from here, day 1 08:00' }]);
  });

  it('names a set rate carried into VE, and through VE into the ventilatory ratio, with the volume', () => {
    // VR = VE × PaCO2 ÷ (PBW × 100 × 37.5) (Sinha P et al., Am J Respir Crit Care Med 2009): VE from the
    // volume and rate set 50 h before, the rate measured nowhere at this timepoint.
    const f = found(`patient sex female, height 165 cm
${CARRIED_VOLUME.replace('vitals    rr 16', 'abg       ph 7.38, pco2 42, po2 80')}`);
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toMatch(/^Cstat and VR here rest on VT 450 mL and set rate 14 \/min, stated at day 1 08:00 \(line 3\), 50 h before this timepoint/);
    // VR combines the gas's PaCO2 with them: the gas's line asks.
    expect(f[0]!.range.start.line).toBe(6);
    // With no PBW there is no VR, and the gas's P/F rests on the FiO2 written here: the gas's line
    // asks for nothing old, the plateau's does.
    const plateauOnly = found(CARRIED_VOLUME.replace('vitals    rr 16', 'abg       ph 7.38, pco2 42, po2 80'));
    expect(plateauOnly.map((x) => [x.range.start.line, x.message.slice(0, x.message.indexOf(','))])).toEqual([[4, 'Cstat here rests on VT 450 mL']]);
  });

  it('reports the gas line where the gas rests on an old setting, naming every old setting once', () => {
    const f = found(CARRIED_VOLUME.replace('vent      peep 5, fio2 0.4\n', '').replace('vitals    rr 16', 'abg       ph 7.38, pco2 42, po2 80'));
    expect(f).toHaveLength(1);
    expect(f[0]!.range.start.line).toBe(4);
    expect(f[0]!.message).toMatch(/^PiO2, PAO2, A–a, a\/A, P\/F, ΔP, Cstat and the readings here rest on FiO2 0\.40, PEEP 5 cmH2O and VT 450 mL, stated at day 1 08:00 \(line 2\), 50 h before/);
  });

  it('is silent for a tidal volume the mode measures (never carried), a volume restated, and one within the limit', () => {
    // Under PS the volume is measured: none is carried, and VE asks for the measured one.
    expect(found(CARRIED_VOLUME.replace('mode VC, vt 450, rate 14', 'mode PS, ps 10, vt 450, rate 14'))).toEqual([]);
    expect(found(CARRIED_VOLUME.replace('vent      peep 5, fio2 0.4', 'vent      vt 450, peep 5, fio2 0.4'))).toEqual([]);
    expect(found(CARRIED_VOLUME.replace('@ day 3 10:00', '@ day 1 19:00'))).toEqual([]);
  });

  it('is silent where no times are written, where a time is unknown, and for a header value', () => {
    expect(found('@ start\nvent mode VC, vt 420, rate 16, peep 8, fio2 0.5\n@ later\nabg 7.38/42/70/24')).toEqual([]);
    expect(found('@ day 1\nvent mode VC, vt 420, rate 16, peep 8, fio2 0.5\n@ day 3\nabg 7.38/42/70/24')).toEqual([]);
    // A place written in the header: its barometric pressure is no carried setting.
    expect(found('place barometric 700\n@ day 1 10:00\noxygen fio2 0.4\nabg 7.40/40/90/24\n@ day 3 10:00\noxygen fio2 0.4\nabg 7.40/40/80/24')).toEqual([]);
  });

  it('takes its limit from the setting, and is switched off with the others', () => {
    expect(found(later('day 1 18:00'), { carriedSettingHours: 6 })).toHaveLength(1);
    expect(found(later('day 1 16:00'), { carriedSettingHours: 6 })).toEqual([]);
    expect(found(EXAMPLE, { carriedSettingHours: 48 })).toEqual([]);
    expect(found(EXAMPLE, { disabledChecks: ['PN326'] })).toEqual([]);
    expect(found(EXAMPLE, { disabledChecks: ['old-setting-carried'] })).toEqual([]);
  });

  it('follows an edit of the time the settings were written at, in an open note', () => {
    const session = new NoteSession();
    const messages = (text: string) => session.update(text).findings.filter((f) => f.code === 'PN326' || f.code === 'PN410').map((f) => f.message);
    expect(messages(EXAMPLE)).toEqual(checkNote(EXAMPLE).findings.filter((f) => f.code === 'PN326' || f.code === 'PN410').map((f) => f.message));
    // Written the evening before the gas: within the limit, and its day still named.
    const moved = EXAMPLE.replace('@ day 1 10:00 start', '@ day 2 22:00 start');
    const after = messages(moved);
    expect(after).toEqual(checkNote(moved).findings.filter((f) => f.code === 'PN326' || f.code === 'PN410').map((f) => f.message));
    expect(after.some((m) => m.includes('PN326') || m.startsWith('PiO2'))).toBe(false);
    expect(after.some((m) => m.includes('FiO2 carried from day 2 22:00, line 3'))).toBe(true);
  });
});
