// Respiratory mechanics of conventional breaths under high-frequency oscillation (HFOV). Driving
// pressure = Pplat − PEEP (Amato MBP et al., "Driving pressure and survival in the acute
// respiratory distress syndrome", NEJM 2015;372:747–755), static compliance VT ÷ (Pplat − PEEP)
// and dynamic compliance VT ÷ (Ppeak − PEEP) (common practice, no source) are pressures and volumes
// of a conventional breath with an end-inspiratory plateau or peak; an oscillator delivers no such
// breath (common practice, no source), so they are not worked out in HFOV, and the limits of
// conventional breaths (PN403 8 mL/kg PBW and PN404 plateau 30 cmH2O: ARDS Network, "Ventilation
// with lower tidal volumes as compared with traditional tidal volumes for acute lung injury and
// the acute respiratory distress syndrome", NEJM 2000;342:1301–1308; PN405 15 cmH2O, common
// practice, no source) are not applied there.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { exportColumns, timepointRows, toFhirBundle, toJsonl } from '../../server/src/core/export';
import { HINT_CATEGORIES, inlayHints, type HintCategory } from '../../server/src/core/service';
import { derivation } from './helpers';

const HFOV = 'patient sex male, height 175 cm\n@ 07:40\nvent mode hfov rate 10 Hz mpaw 20 plateau 30 peep 10 vt 0.1 L peak 40';
const VC = HFOV.replace('mode hfov rate 10 Hz mpaw 20', 'mode vc rate 14').replace('vt 0.1 L', 'vt 450 mL');
const BREATH_VALUES = ['driving_pressure', 'compliance_static', 'compliance_dynamic'];

const findings = (text: string, code: string) => checkNote(text).findings.filter((f) => f.code === code);

describe('values of a conventional breath in HFOV', () => {
  it('driving pressure and static and dynamic compliance are not worked out, and say why', () => {
    const d = derivation(HFOV);
    for (const id of BREATH_VALUES) {
      expect(d.derived.find((v) => v.id === id), id).toBeUndefined();
      expect(d.missing.find((m) => m.id === id), id).toBeUndefined();
      const reason = d.notApplicable.find((n) => n.id === id)?.reason ?? '';
      expect(reason, id).toMatch(/^not worked out in HFOV: an oscillator gives no conventional breath/);
    }
    // Airway resistance and the power surrogate hold for volume control only, as before.
    expect(d.derived.find((v) => v.id === 'airway_resistance')).toBeUndefined();
    expect(d.derived.find((v) => v.id === 'mechanical_power_surrogate')).toBeUndefined();
  });

  it('with no PEEP written, nothing is asked for', () => {
    const d = derivation(HFOV.replace(' peep 10', ''));
    for (const id of BREATH_VALUES) expect(d.missing.find((m) => m.id === id), id).toBeUndefined();
  });

  it('the same pressures under VC give them: ΔP 30 − 10 = 20, Cstat 450 ÷ 20 = 22.5, Cdyn 450 ÷ 30 = 15', () => {
    const d = derivation(VC);
    expect(d.derived.find((v) => v.id === 'driving_pressure')?.value).toBe(20);
    expect(d.derived.find((v) => v.id === 'compliance_static')?.value).toBeCloseTo(22.5, 9);
    expect(d.derived.find((v) => v.id === 'compliance_dynamic')?.value).toBeCloseTo(15, 9);
  });

  it('a mode of HFOV carried from an earlier timepoint counts', () => {
    const d = derivation(`${HFOV}\n@ 08:40\nvent plateau 32 peak 42`);
    for (const id of BREATH_VALUES) expect(d.derived.find((v) => v.id === id), id).toBeUndefined();
  });

  it('VT per kg PBW is still the quotient, without the lung-protective range of conventional breaths', () => {
    // PBW (male, 175 cm) = 50 + 0.91 × (175 − 152.4) = 70.566 kg (ARDS Network, NEJM 2000).
    const hfov = derivation(HFOV).derived.find((v) => v.id === 'vt_per_kg_pbw');
    expect(hfov?.value).toBeCloseTo(100 / 70.566, 9);
    expect(hfov?.notes.join(' ')).not.toMatch(/lung-protective target/);
    expect(derivation(VC).derived.find((v) => v.id === 'vt_per_kg_pbw')?.notes.join(' ')).toMatch(/lung-protective target 6 mL\/kg/);
  });
});

describe('checks of conventional breaths in HFOV', () => {
  it('PN405 (driving pressure above 15) does not fire in HFOV, and still fires under VC', () => {
    expect(findings(HFOV, 'PN405')).toEqual([]);
    expect(findings(VC, 'PN405').map((f) => f.message)).toEqual(['Driving pressure is 20 cmH2O (plateau − PEEP), above 15 cmH2O.']);
  });

  it('PN404 (plateau above 30) does not fire in HFOV, and still fires under VC', () => {
    expect(findings(HFOV.replace('plateau 30', 'plateau 33'), 'PN404')).toEqual([]);
    expect(findings(VC.replace('plateau 30', 'plateau 33'), 'PN404')).toHaveLength(1);
  });

  it('PN403 (VT above 8 mL/kg PBW) does not fire in HFOV, and still fires under VC', () => {
    // 600 mL ÷ 70.566 kg = 8.5 mL/kg.
    expect(findings(HFOV.replace('vt 0.1 L', 'vt 600 mL'), 'PN403')).toEqual([]);
    expect(findings(VC.replace('vt 450 mL', 'vt 600 mL'), 'PN403')).toHaveLength(1);
  });

  it('PEEP above plateau and plateau above peak stay reported in HFOV: transcription slips either way', () => {
    expect(findings(HFOV.replace('peep 10', 'peep 32'), 'PN303')).toHaveLength(1);
    expect(findings(HFOV.replace('peak 40', 'peak 25'), 'PN304')).toHaveLength(1);
  });
});

describe('what shows them in HFOV', () => {
  it('no mechanics hint of ΔP or Cstat', () => {
    const all = { categories: new Set<HintCategory>(HINT_CATEGORIES) };
    const labels = inlayHints(checkNote(HFOV), { start: 0, end: 100 }, all).map((h) => h.label).join(' | ');
    expect(labels).not.toMatch(/ΔP|Cstat/);
    expect(inlayHints(checkNote(VC), { start: 0, end: 100 }, all).map((h) => h.label).join(' | ')).toMatch(/ΔP 20/);
  });

  it('CSV and JSON Lines leave their cells empty, and the columns say so; FHIR has no Observation of them', () => {
    const options = { redactProse: false, shiftDays: 0 };
    const [row] = timepointRows('n.pneu', checkNote(HFOV), options);
    for (const name of ['driving_pressure_cmH2O', 'compliance_static_mL_cmH2O', 'compliance_dynamic_mL_cmH2O']) {
      expect(row?.[name] ?? null, name).toBeNull();
      expect(exportColumns().find((c) => c.name === name)?.description, name).toMatch(/empty in HFOV/);
    }
    const [record] = toJsonl('n.pneu', checkNote(HFOV), options).trim().split('\n').map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(record?.['driving_pressure_cmH2O']).toBeNull();
    expect(record?.['compliance_static_mL_cmH2O']).toBeNull();
    const [vcRow] = timepointRows('n.pneu', checkNote(VC), options);
    expect(vcRow?.['driving_pressure_cmH2O']).toBe(20);
    const bundle = JSON.stringify(toFhirBundle('n.pneu', checkNote(HFOV), { redactProse: false, shiftDays: 0 }));
    expect(bundle).not.toMatch(/[Dd]riving pressure|[Cc]ompliance/);
  });
});
