// PN407: a static compliance no respiratory system gives. Ventilated patients with normal lungs have
// a static compliance of 50–100 mL/cmH2O (read on the Royal North Shore Hospital intensive care
// unit's teaching page on pressure, rnshicu.org/topic/pressure); Pneumark reports one above 200
// mL/cmH2O, twice the top of that range (its own margin: common practice, no source), and a tidal
// volume delivered with the plateau equal to the PEEP (no rise in pressure: static compliance
// VT / (Pplat − PEEP) has no value, respiratory mechanics, common practice, no source).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const pn407 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN407');
const codes = (text: string) => checkNote(text).findings.map((f) => f.code).filter((c) => /^PN30[34]$|^PN407$/.test(c));

describe('Compliance no respiratory system gives (PN407)', () => {
  it('fires above 200 mL/cmH2O, on the plateau, with the numbers it rests on', () => {
    // 450 ÷ (12 − 10) = 225 mL/cmH2O.
    const f = pn407('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, plateau 12');
    expect(f).toHaveLength(1);
    expect(f[0]?.severity).toBe('warning');
    expect(f[0]?.message).toBe(
      'Static compliance 225 mL/cmH2O (450 ÷ (12 − 10)) is above 200 mL/cmH2O, more than the lungs and chest wall of a healthy adult give together: consistent with a transcription error in the plateau, the PEEP or the tidal volume.',
    );
    // `plateau 12` on line 1 (0-based), at character 43.
    expect(f[0]?.range.start).toEqual({ line: 1, character: 43 });
  });

  it('keeps the compliance shown: it reports, it does not withhold', () => {
    const r = checkNote('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, plateau 12');
    expect(r.analysis.derivation(0).derived.find((d) => d.id === 'compliance_static')?.value).toBe(225);
  });

  it('is silent at and below the ceiling, and for ordinary mechanics', () => {
    // 400 ÷ 2 = 200: at the ceiling, not above it.
    expect(pn407('@ 08:00\nvent mode VC, vt 400 mL, rate 14, peep 10, plateau 12')).toEqual([]);
    expect(pn407('@ 08:00\nvent mode VC, vt 402 mL, rate 14, peep 10, plateau 12')).toHaveLength(1);
    // 450 ÷ (20 − 5) = 30 mL/cmH2O, a stiff lung: PN407 says nothing of it.
    expect(pn407('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 5, plateau 20')).toEqual([]);
  });

  it('fires where the plateau equals the PEEP while a volume was delivered', () => {
    const f = pn407('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, plateau 10');
    expect(f.map((x) => x.message)).toEqual([
      'Plateau pressure 10 cmH2O equals the PEEP with a tidal volume of 450 mL: a breath delivered with no rise in pressure, which no respiratory system allows; consistent with a transcription error in the plateau or the PEEP.',
    ]);
  });

  it('leaves a plateau below the PEEP to PN303, and needs a plateau written at the timepoint', () => {
    expect(codes('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, plateau 9')).toEqual(['PN303']);
    // The plateau of 08:00 is a reading of its timepoint; at 09:00 only the settings carry.
    expect(codes('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, plateau 20\n@ 09:00\nvent peep 19')).toEqual([]);
    // A PEEP carried from an earlier timepoint counts with a plateau written here: 450 ÷ (11 − 10).
    expect(pn407('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10\n@ 09:00\nvent plateau 11')).toHaveLength(1);
  });

  it('works in cmH2O whatever the unit written', () => {
    // 12 mbar = 12.24 cmH2O (1 mbar = 100 Pa, 1 cmH2O = 98.0665 Pa): 450 ÷ 2.24 = 201 mL/cmH2O.
    expect(pn407('@ 08:00\nvent mode VC, vt 0.45 L, rate 14, peep 10, plateau 12 mbar')).toHaveLength(1);
  });

  // Under volume control (VC, SIMV, SIMV-VC: fields/modes.ts) the set volume is driven in by the
  // ventilator, so the airway pressure must rise above the PEEP; the peak includes the plateau
  // (peak = plateau + resistive pressure), so the dynamic compliance VT / (Ppeak − PEEP) is never
  // above the static one and a dynamic one above the ceiling means a static one above it too
  // (respiratory mechanics, common practice, no source).
  const peakIssue = (text: string) => pn407(text).map((f) => `${f.range.start.line}:${f.range.start.character} ${f.message}`);

  it('fires on the peak where it equals the PEEP with a set tidal volume under volume control, and no plateau is written', () => {
    expect(peakIssue('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, peak 10')).toEqual([
      '1:43 Peak pressure 10 cmH2O equals the PEEP with a tidal volume of 450 mL set under VC: the ventilator drove the volume in without raising the pressure, which no respiratory system allows; consistent with a transcription error in the peak pressure or the PEEP.',
    ]);
    // The dynamic compliance has no value there (the pressure rise is 0).
    const r = checkNote('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, peak 10');
    expect(r.analysis.derivation(0).derived.find((d) => d.id === 'compliance_dynamic')?.value).toBeUndefined();
    // SIMV and SIMV-VC are volume-targeted too; the settings may be carried from an earlier timepoint.
    expect(pn407('@ 08:00\nvent mode SIMV-VC, vt 450 mL, rate 14, peep 10, peak 10')).toHaveLength(1);
    expect(pn407('@ 08:00\nvent mode SIMV, vt 450 mL, rate 14, peep 10\n@ 09:00\nvent peak 10')).toHaveLength(1);
  });

  it('says nothing of the peak under other modes, with no mode, or with no volume', () => {
    // Under pressure support or pressure control a breath the patient draws in may leave the peak at the PEEP.
    expect(pn407('@ 08:00\nvent mode PS, ps 0, peep 10, vt 450 mL, peak 10')).toEqual([]);
    expect(pn407('@ 08:00\nvent mode PC, pinsp 12, rate 14, peep 10, vt 450 mL, peak 10')).toEqual([]);
    expect(pn407('@ 08:00\nvent vt 450 mL, rate 14, peep 10, peak 10')).toEqual([]);
    expect(pn407('@ 08:00\nvent mode VC, vt 0 mL, rate 14, peep 10, peak 10')).toEqual([]);
    // A peak below the PEEP is PN314's.
    expect(codes('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, peak 9')).toEqual([]);
    expect(checkNote('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, peak 9').findings.map((f) => f.code)).toEqual(['PN314']);
  });

  it('leaves the peak alone where a plateau is written: the plateau\'s report stands, and no second one', () => {
    expect(peakIssue('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, plateau 10, peak 10').map((m) => m.slice(0, 28))).toEqual(['1:43 Plateau pressure 10 cmH']);
    expect(codes('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, plateau 25, peak 10')).toEqual(['PN304']);
    expect(pn407('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, plateau 11, peak 12')).toHaveLength(1);
  });

  it('fires on the peak where the dynamic compliance is above 200 mL/cmH2O under volume control, and no plateau is written', () => {
    // 450 ÷ (12 − 10) = 225 mL/cmH2O.
    expect(peakIssue('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, peak 12')).toEqual([
      '1:43 Dynamic compliance 225 mL/cmH2O (450 ÷ (12 − 10)) is above 200 mL/cmH2O, more than the lungs and chest wall of a healthy adult give together, and a static compliance is higher still: consistent with a transcription error in the peak pressure, the PEEP or the tidal volume.',
    ]);
    // Shown all the same: the check reports, it does not withhold.
    const r = checkNote('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, peak 12');
    expect(r.analysis.derivation(0).derived.find((d) => d.id === 'compliance_dynamic')?.value).toBe(225);
    // 400 ÷ 2 = 200: at the ceiling, not above it; 450 ÷ (25 − 10) = 30, ordinary.
    expect(pn407('@ 08:00\nvent mode VC, vt 400 mL, rate 14, peep 10, peak 12')).toEqual([]);
    expect(pn407('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peep 10, peak 25')).toEqual([]);
    // Not under pressure support, where the patient's own effort moves the volume.
    expect(pn407('@ 08:00\nvent mode PS, ps 2, peep 10, vt 450 mL, peak 12')).toEqual([]);
  });

  // PRVC (fields/modes.ts, the adaptive family) sets the tidal volume as a target and raises the
  // inspiratory pressure breath by breath until that volume goes in: in a passive patient the airway
  // pressure must rise above the PEEP as under VC (respiratory mechanics, common practice, no source).
  // It also lowers that pressure as the patient's own effort draws in more of the target (from
  // memory), so a peak at or just above the PEEP may be a patient breathing the target alone with
  // little or no support: the finding names that reading beside a transcription error.
  it("fires on the peak under PRVC too, naming the patient's own effort as the other reading", () => {
    expect(peakIssue('@ 08:00\nvent mode PRVC, vt 450 mL, rate 14, peep 10, peak 10')).toEqual([
      "1:45 Peak pressure 10 cmH2O equals the PEEP with a target tidal volume of 450 mL under PRVC: in a passive patient the ventilator cannot deliver the volume without raising the pressure; consistent with a transcription error in the peak pressure or the PEEP, or with a patient drawing in the whole target volume with no support, since PRVC lowers its pressure as the patient's effort grows.",
    ]);
    // 450 ÷ (12 − 10) = 225 mL/cmH2O.
    expect(peakIssue('@ 08:00\nvent mode PRVC, vt 450 mL, rate 14, peep 10, peak 12')).toEqual([
      "1:45 Dynamic compliance 225 mL/cmH2O (450 ÷ (12 − 10)) is above 200 mL/cmH2O, more than the lungs and chest wall of a healthy adult give together: consistent with a transcription error in the peak pressure, the PEEP or the tidal volume, or with a patient drawing in most of the target volume with little support, since PRVC lowers its pressure as the patient's effort grows.",
    ]);
    // Carried settings count; an ordinary rise says nothing: 450 ÷ (22 − 10) = 38 mL/cmH2O.
    expect(pn407('@ 08:00\nvent mode PRVC, vt 450 mL, rate 14, peep 10\n@ 09:00\nvent peak 10')).toHaveLength(1);
    expect(pn407('@ 08:00\nvent mode PRVC, vt 450 mL, rate 14, peep 10, peak 22')).toEqual([]);
    // At the ceiling, not above it: 400 ÷ 2 = 200.
    expect(pn407('@ 08:00\nvent mode PRVC, vt 400 mL, rate 14, peep 10, peak 12')).toEqual([]);
  });

  // A volume mode and the EPAP or CPAP level of an oxygen line are never in force together: a vent
  // line with a setting (a mode) ends the oxygen line's therapy, and an oxygen line ends ventilation
  // (analysis/timeline.ts, PN311 says which line was ended). So the peak under VC is compared with a
  // PEEP or with nothing, never with an EPAP or a CPAP level the note no longer holds.
  it('compares the peak under VC with no EPAP or CPAP level, which a volume mode never holds beside it', () => {
    const findings = (text: string) => checkNote(text).findings.map((f) => f.code).filter((c) => c === 'PN311' || c === 'PN407');
    expect(findings('@ 08:00\noxygen niv ipap 14, epap 6, fio2 40 %\nvent mode VC, vt 450 mL, rate 14, peak 6')).toEqual(['PN311']);
    expect(findings('@ 08:00\noxygen cpap 8, fio2 40 %\nvent mode VC, vt 450 mL, rate 14, peak 8')).toEqual(['PN311']);
    expect(findings('@ 08:00\nvent mode VC, vt 450 mL, rate 14, peak 8\noxygen cpap 8, fio2 40 %')).toEqual(['PN311']);
    // The CPAP level of 08:00 is not carried into the ventilation that follows, nor is the ventilation into NIV.
    const r = checkNote('@ 08:00\noxygen cpap 8, fio2 40 %\n@ 09:00\nvent mode VC, vt 450 mL, rate 14, peak 8');
    expect(r.findings.filter((f) => f.code === 'PN407')).toEqual([]);
    expect(r.analysis.derivation(1).missing.map((m) => m.id)).toContain('compliance_dynamic');
    expect(findings('@ 08:00\nvent mode VC, vt 450 mL, rate 14\n@ 09:00\noxygen niv ipap 14, epap 6\nvent peak 6')).toEqual([]);
  });
});
