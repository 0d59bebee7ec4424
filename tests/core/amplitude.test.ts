// The pressure amplitude of high-frequency oscillation (`amplitude`, `amp`): the peak-to-trough
// swing of pressure around the mean airway pressure, a setting of the oscillator, in cmH2O. Its
// bounds (impossible outside 0–150 cmH2O, unusual outside 10–90 cmH2O) are from memory.
// 1 mbar = 100 Pa and 1 cmH2O = 98.0665 Pa (definitions of the units).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { exportColumns, timepointRows, toFhirBundle } from '../../server/src/core/export';
import { completionsAt, hoverAt } from '../../server/src/core/service';
import { noteAt } from '../service/cursor';

const HFOV = '@ 08:00\nvent mode hfov rate 8 Hz mpaw 24 amplitude 60';
const findings = (text: string, code?: string) => checkNote(text).findings.filter((f) => code === undefined || f.code === code);
const amplitudeAt = (text: string, index = 0) => checkNote(text).analysis.timeline.timepoints[index]?.values.numberOf('amplitude') ?? null;

describe('reading the amplitude', () => {
  it('`amplitude 60` and `amp 60` on a vent line read as 60 cmH2O, with no finding', () => {
    expect(findings(HFOV)).toEqual([]);
    expect(amplitudeAt(HFOV)).toBe(60);
    expect(amplitudeAt(HFOV.replace('amplitude', 'amp'))).toBe(60);
    expect(amplitudeAt(HFOV.replace('amplitude 60', 'AMPLITUDE 60 cmH2O'))).toBe(60);
  });

  it('takes mbar as the other airway pressures do: 60 mbar = 6000 Pa ÷ 98.0665 Pa = 61.18 cmH2O', () => {
    expect(amplitudeAt(HFOV.replace('amplitude 60', 'amplitude 60 mbar'))).toBeCloseTo(6000 / 98.0665, 9);
  });

  it('`dp` is not a key of it: ΔP is the driving pressure', () => {
    const text = HFOV.replace('amplitude 60', 'dp 60');
    expect(amplitudeAt(text)).toBeNull();
    expect(findings(text, 'PN201')).toHaveLength(1);
  });

  it('is a setting: carried to the next timepoint, and dropped when the mode changes', () => {
    const text = `${HFOV}\n@ 09:00\nvent rate 9 Hz\n@ 10:00\nvent mode vc, rate 14, vt 400 mL`;
    expect(amplitudeAt(text, 1)).toBe(60);
    expect(checkNote(text).analysis.timeline.timepoints[1]?.values.get('amplitude')?.origin.kind).toBe('carried');
    expect(amplitudeAt(text, 2)).toBeNull();
  });
});

describe('bounds of the amplitude (from memory)', () => {
  it('above 150 cmH2O is impossible, and not used', () => {
    const [f] = findings(HFOV.replace('amplitude 60', 'amplitude 200'), 'PN301');
    expect(f?.message).toBe('Oscillation amplitude 200 cmH2O is impossible (expected 0 cmH2O to 150 cmH2O); it is not used in calculations.');
  });

  it('outside 10–90 cmH2O is unusual; 10 and 90 are not', () => {
    expect(findings(HFOV.replace('amplitude 60', 'amplitude 95'), 'PN302')[0]?.message).toBe('Oscillation amplitude 95 cmH2O is unusual (usually 10 cmH2O to 90 cmH2O): check the unit and the transcription.');
    expect(findings(HFOV.replace('amplitude 60', 'amplitude 5'), 'PN302')).toHaveLength(1);
    expect(findings(HFOV.replace('amplitude 60', 'amplitude 10'))).toEqual([]);
    expect(findings(HFOV.replace('amplitude 60', 'amplitude 90'))).toEqual([]);
  });
});

describe('the amplitude in the editor and the exports', () => {
  it('is offered after a vent line\'s section word, and its hover names it', () => {
    const { result, position } = noteAt('@ 08:00\nvent mode hfov, amp|');
    expect(completionsAt(result, position).map((c) => c.label)).toContain('amplitude');
    const hover = noteAt('@ 08:00\nvent mode hfov, ampli|tude 60');
    expect(hoverAt(hover.result, hover.position)?.markdown ?? '').toMatch(/Oscillation amplitude/);
  });

  it('has a CSV and JSON Lines column added after the first published ones, `amplitude_cmH2O`, in cmH2O', () => {
    const columns = exportColumns();
    const at = columns.findIndex((c) => c.name === 'amplitude_cmH2O');
    // After every column of the first published list and the one added before it; later additions follow it.
    expect(columns.slice(at - 2, at).map((c) => c.name)).toEqual(['findings_information', 'mechanical_power_surrogate_J_min']);
    expect(columns[at]?.ucum).toBe('cm[H2O]');
    const [row] = timepointRows('n.pneu', checkNote(HFOV.replace('amplitude 60', 'amplitude 60 mbar')), { redactProse: false, shiftDays: 0 });
    expect(row?.['amplitude_cmH2O']).toBeCloseTo(6000 / 98.0665, 9);
  });

  it('is a FHIR Observation in the therapy category, uncoded (no LOINC code is known here)', () => {
    const bundle = toFhirBundle('n.pneu', checkNote(HFOV), { redactProse: false, shiftDays: 0 });
    const resources = (bundle.entry ?? []).map((e) => e.resource as { code?: { text?: string; coding?: unknown[] }; valueQuantity?: { value?: number; code?: string }; category?: { coding?: { code?: string }[] }[] });
    const amplitude = resources.find((r) => r.code?.text === 'Oscillation amplitude');
    expect(amplitude?.valueQuantity).toMatchObject({ value: 60, code: 'cm[H2O]' });
    expect(amplitude?.code?.coding).toBeUndefined();
    expect(amplitude?.category?.[0]?.coding?.[0]?.code).toBe('therapy');
  });
});
