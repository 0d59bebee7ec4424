// A value written on a vent line is a setting (carried until changed) or a measurement (in force
// at its timepoint only) by the ventilator mode in force: the field registry says which for each
// family of modes (`measuredIn`, `setIn`; grammar/README.md, "Values in force"). Where the machine
// sets a pressure, the tidal volume follows the lungs and the patient and changes from breath to
// breath: Scottish Intensive Care Society, SICS induction modules, "Ventilation – pressure control
// ventilation" (pressure and rate set, the tidal volume depending on compliance and changing from
// breath to breath; read on scottishintensivecare.org.uk). Pressure support, CPAP, APRV, PRVC's
// flow and HFOV: common practice, no source.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import type { Timepoint } from '../../server/src/core/analysis/model';
import { hoverAt } from '../../server/src/core/service';
import { timepointRows, toFhirBundle } from '../../server/src/core/export';
import { fieldById } from '../../server/src/core/fields/registry';
import { isMeasuredUnder, modeFamily } from '../../server/src/core/fields/modes';
import { noteAt } from '../service/cursor';

const PATIENT = 'patient   age 60 y, sex female, height 165 cm\n';
const PS_THEN_GAS = `${PATIENT}@ day 3 09:00\nvent      mode PS, ps 10, peep 8, vt 380, fio2 0.4\n@ day 3 10:00\nvent      mode PS, ps 8, peep 8\nabg       ph 7.38, pco2 42, po2 80\n`;

const timepoints = (text: string): readonly Timepoint[] => checkNote(text).analysis.timeline.timepoints;
function inForce(tp: Timepoint | undefined, id: string): number | string | null | undefined {
  const v = tp?.values.get(id);
  return v ? (v.stated.word ?? v.stated.value) : undefined;
}
const plain = { redactProse: false, shiftDays: 0 } as const;

describe('the registry says, per mode family, what is measured', () => {
  it('reads the families of the modes the spec lists, in any case; another word has none', () => {
    expect(['VC', 'SIMV', 'PRVC', 'PC', 'APRV', 'PS', 'CPAP', 'HFOV', 'ps'].map(modeFamily)).toEqual(
      ['volume', 'volume', 'adaptive', 'pressure', 'pressure', 'spontaneous', 'spontaneous', 'oscillation', 'spontaneous']);
    expect([modeFamily('ASV'), modeFamily(null)]).toEqual([null, null]);
  });

  it('a tidal volume is set in volume modes and PRVC, measured where a pressure is set (SICS page, header)', () => {
    const vt = fieldById('vt')!;
    expect(['VC', 'SIMV', 'PRVC'].map((m) => isMeasuredUnder(vt, m))).toEqual([false, false, false]);
    expect(['PC', 'APRV', 'PS', 'CPAP', 'HFOV'].map((m) => isMeasuredUnder(vt, m))).toEqual([true, true, true, true, true]);
    // No mode, or a mode Pneumark does not know: as before, a setting.
    expect([isMeasuredUnder(vt, null), isMeasuredUnder(vt, 'ASV')]).toEqual([false, false]);
  });

  it('plateau, peak, minute volume and EtCO2 are measured in every mode; the mean airway pressure is set in HFOV only', () => {
    for (const id of ['plateau', 'peak', 'minute_volume', 'etco2']) {
      for (const mode of ['VC', 'PC', 'PS', 'HFOV', null]) expect(isMeasuredUnder(fieldById(id)!, mode)).toBe(true);
    }
    const map = fieldById('mean_airway_pressure')!;
    expect([isMeasuredUnder(map, 'VC'), isMeasuredUnder(map, 'PS'), isMeasuredUnder(map, 'HFOV')]).toEqual([true, true, false]);
    // The set rate (a backup rate under PS or CPAP), PEEP, FiO2 and the set pressures are settings in every mode.
    for (const id of ['vent_rate', 'peep', 'fio2', 'pressure_support', 'insp_pressure']) {
      for (const mode of ['VC', 'PC', 'PS', 'APRV', null]) expect(isMeasuredUnder(fieldById(id)!, mode)).toBe(false);
    }
    // The inspiratory flow is set in constant-flow volume control only (common practice, no source).
    const flow = fieldById('insp_flow')!;
    expect(['VC', 'SIMV', 'PRVC', 'PC', 'PS'].map((m) => isMeasuredUnder(flow, m))).toEqual([false, false, true, true, true]);
  });
});

describe('a measurement is not carried', () => {
  it('under PS, a tidal volume is in force at its timepoint only, and a later gas has none', () => {
    const tps = timepoints(PS_THEN_GAS);
    expect(inForce(tps[0], 'vt')).toBe(380);
    expect(tps[0]?.values.get('vt')?.stated.hereOnly).toBe(true);
    expect([inForce(tps[1], 'vt'), inForce(tps[1], 'fio2'), inForce(tps[1], 'peep')]).toEqual([undefined, 0.4, 8]);
    // VT/PBW at 09:00: 380 ÷ (45.5 + 0.91 × (165 − 152.4)) (ARDS Network, NEJM 2000;342:1301–1308).
    const d = checkNote(PS_THEN_GAS).analysis.derivation(0);
    expect(d?.derived.find((v) => v.id === 'vt_per_kg_pbw')?.value).toBeCloseTo(380 / 56.966, 9);
  });

  it('under VC, a tidal volume is a setting and is carried', () => {
    const tps = timepoints(PS_THEN_GAS.replace('mode PS, ps 10', 'mode VC, rate 14').replace('mode PS, ps 8', 'mode VC, rate 16'));
    expect([inForce(tps[1], 'vt'), tps[1]?.values.get('vt')?.origin.kind]).toEqual([380, 'carried']);
  });

  it('under PC, a tidal volume and an inspiratory flow are measured; the set pressure and rate carry', () => {
    const tps = timepoints(`${PATIENT}@ 09:00\nvent mode PC, pinsp 16, rate 18, peep 8, vt 420, flow 50, fio2 0.5\n@ 10:00\nvitals rr 18\n`);
    expect([inForce(tps[0], 'vt'), inForce(tps[0], 'insp_flow')]).toEqual([420, 50]);
    expect([inForce(tps[1], 'vt'), inForce(tps[1], 'insp_flow'), inForce(tps[1], 'insp_pressure'), inForce(tps[1], 'vent_rate')]).toEqual([undefined, undefined, 16, 18]);
  });

  it('under HFOV the mean airway pressure is still held as a setting', () => {
    const tps = timepoints('@ 09:00\nvent mode HFOV, rate 5 Hz, mpaw 25, amplitude 60, fio2 0.6\n@ 10:00\nabg 7.30/50/70\n');
    expect([inForce(tps[1], 'mean_airway_pressure'), tps[1]?.values.get('mean_airway_pressure')?.origin.kind]).toEqual([25, 'carried']);
  });

  it('a mode change between timepoints: a volume measured under PS is no setting of the VC that follows', () => {
    const tps = timepoints(`${PATIENT}@ 09:00\nvent mode PS, ps 10, peep 8, vt 380\n@ 10:00\nvent mode VC, rate 14\n@ 11:00\nvent mode VC, vt 450\n@ 12:00\nvitals rr 16\n`);
    expect(inForce(tps[1], 'vt')).toBeUndefined();
    // Set under VC, it carries.
    expect([inForce(tps[3], 'vt'), tps[3]?.values.get('vt')?.origin.kind]).toEqual([450, 'carried']);
  });

  it('a mode change between timepoints: a volume written with no mode is not carried into PS', () => {
    const tps = timepoints('@ 09:00\nvent vt 450, peep 5\n@ 10:00\nvent mode PS, ps 10\n@ 11:00\nvitals rr 20\n');
    expect(inForce(tps[0], 'vt')).toBe(450);
    expect([inForce(tps[1], 'vt'), inForce(tps[2], 'vt'), inForce(tps[2], 'peep')]).toEqual([undefined, undefined, 5]);
  });

  it('at one timepoint, a volume written above the line that sets PS is of that timepoint only', () => {
    // Every line of a timepoint describes the same moment (grammar/README.md): the volume was measured under PS.
    const tps = timepoints('@ 08:00\nvent mode VC, vt 450, rate 14, peep 5\n@ 09:00\nvent vt 400, rate 20\nvent mode PS, ps 10\n@ 10:00\nvitals rr 20\n');
    expect([inForce(tps[1], 'vt'), tps[1]?.values.get('vt')?.stated.hereOnly, inForce(tps[1], 'vent_rate'), inForce(tps[1], 'mode')]).toEqual([400, true, 20, 'PS']);
    expect([inForce(tps[2], 'vt'), inForce(tps[2], 'vent_rate'), inForce(tps[2], 'peep')]).toEqual([undefined, 20, 5]);
  });

  it('a vent line that only measures a volume under PS ends nothing and holds nothing', () => {
    const tps = timepoints('@ 09:00\nvent mode PS, ps 10, peep 8\n@ 10:00\nvent vt 410\n@ 11:00\nvitals rr 20\n');
    expect([inForce(tps[1], 'vt'), inForce(tps[1], 'mode'), inForce(tps[2], 'vt'), inForce(tps[2], 'mode')]).toEqual([410, 'PS', undefined, 'PS']);
  });
});

describe('what to add, worded for a measurement', () => {
  it('asks for the measured vt at the timepoint of a gas under PS', () => {
    const d = checkNote(PS_THEN_GAS).analysis.derivation(1);
    const vr = d?.missing.find((m) => m.id === 'ventilatory_ratio');
    expect(vr?.message).toBe('add the measured vt at this timepoint and rr to get VR');
  });

  it('asks for it where a peak is written under PC without a volume', () => {
    const d = checkNote('@ 09:00\nvent mode PC, pinsp 16, rate 18, peep 8, vt 420\n@ 10:00\nvent peak 25\n').analysis.derivation(1);
    expect(d?.missing.find((m) => m.id === 'compliance_dynamic')?.message).toBe('add the measured vt at this timepoint to get Cdyn');
  });

  it('asks for a plain vt under VC', () => {
    const d = checkNote('@ 09:00\nvent mode VC, rate 18, peep 8\nvent peak 25\n').analysis.derivation(0);
    expect(d?.missing.find((m) => m.id === 'compliance_dynamic')?.message).toBe('add vt to get Cdyn');
  });

  it('show gives no carried VT, and says what to add', async () => {
    const { renderShow } = await import('../../server/src/cli/render-show');
    const { paint } = await import('../../server/src/cli/colour');
    const shown = renderShow('ps.pneu', checkNote(PS_THEN_GAS), paint(false));
    expect(shown).not.toContain('VT 380 mL (carried');
    expect(shown).toContain('carried  FiO2 0.40 (carried from day 3 09:00, line 3)');
    expect(shown).toContain('add the measured vt at this timepoint and rr to get VR');
  });

  it('show marks a tidal volume measured under PS or on a vent line of readings under NIV, not one set under VC, and lists the mark in its legend', async () => {
    const { renderShow } = await import('../../server/src/cli/render-show');
    const { paint } = await import('../../server/src/cli/colour');
    const shown = renderShow('ps.pneu', checkNote(PS_THEN_GAS), paint(false));
    expect(shown).toContain('vent     mode PS · PS 10 cmH2O · PEEP 8 cmH2O · VT 380 mL (measured) · FiO2 0.40');
    expect(shown).toMatch(/\n {2}\(measured\) +a value that is a setting under other modes, measured here/);
    const niv = renderShow('niv.pneu', checkNote(`${PATIENT}@ 08:00\noxygen    niv ipap 14, epap 6\nvent      vt 500, peak 18\n`), paint(false));
    expect(niv).toContain('vent     VT 500 mL (measured) · peak 18 cmH2O');
    const vc = renderShow('vc.pneu', checkNote(`${PATIENT}@ 08:00\nvent      mode VC, vt 420, rate 16, peep 5\n`), paint(false));
    expect(vc).toContain('vent     mode VC · VT 420 mL · rate 16 /min · PEEP 5 cmH2O');
    expect(vc).not.toContain('(measured)');
  });
});

describe('hovers', () => {
  it('a tidal volume under PS says it is measured there and not carried', () => {
    const { result, position } = noteAt('@ 09:00\nvent mode PS, ps 10, peep 8, vt 38|0\n');
    const text = hoverAt(result, position)?.markdown ?? '';
    expect(text).toContain('Carries forward: no — under PS the tidal volume is measured, not set');
  });

  it('a tidal volume under VC still carries', () => {
    const { result, position } = noteAt('@ 09:00\nvent mode VC, rate 14, peep 8, vt 45|0\n');
    expect(hoverAt(result, position)?.markdown ?? '').toContain('Carries forward: yes, until restated');
  });

  it('the timepoint after it lists no carried tidal volume', () => {
    const { result, position } = noteAt(PS_THEN_GAS.replace('@ day 3 10:00', '@ day 3 10:0|0'));
    const text = hoverAt(result, position)?.markdown ?? '';
    expect(text).toContain('FiO2');
    expect(text).not.toMatch(/VT 380/);
  });
});

describe('exports', () => {
  it('CSV carried_fields no longer lists a tidal volume measured under PS', () => {
    const rows = timepointRows('ps.pneu', checkNote(PS_THEN_GAS), plain);
    expect(rows[0]?.vt_mL).toBe(380);
    expect(rows[1]?.vt_mL).toBeNull();
    expect(rows[1]?.carried_fields).toBe('fio2');
    // Under VC it still does.
    const vc = timepointRows('vc.pneu', checkNote(PS_THEN_GAS.replace('mode PS, ps 10', 'mode VC, rate 14').replace('mode PS, ps 8', 'mode VC, rate 16')), plain);
    expect(vc[1]?.carried_fields).toBe('fio2;vt');
  });

  it('FHIR gives the volume measured under PS no code of a set tidal volume', () => {
    const bundle = JSON.stringify(toFhirBundle('ps.pneu', checkNote(PS_THEN_GAS), plain));
    expect(bundle).toContain('"text":"Tidal volume"');
    expect(bundle).not.toContain('20112-9');
  });
});
