// FiO2 in the exports. `fio2_fraction` is the FiO2 as written (stated or carried), so it is empty
// on room air, where nothing is written; `fio2_in_force` is the FiO2 the calculations use (P/F,
// A–a gradient, PiO2): the written one, else 0.21 on room air. FHIR has no Observation for the
// 0.21 of room air, which nobody measured or set: it is implied by the device.
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { checked } from './helpers';
import { csvCells, csvHeader, exportColumns, observationEntries, timepointCells, toFhirBundle, toJsonl } from '../../server/src/core/export';

const plain = { redactProse: false, shiftDays: 0 } as const;

/** Room air however it is spelt, then a cannula with its estimate, then a venturi with an FiO2. */
const NOTE = [
  '@ day 1 08:00', 'oxygen room air', 'abg 7.40/40/90/24',
  '@ day 1 09:00', 'oxygen air', 'abg 7.40/40/88/24',
  '@ day 1 10:00', 'oxygen ra', 'vitals spo2 95 %',
  '@ day 1 11:00', 'oxygen cannula 2 L/min', 'abg 7.40/40/100/24',
  '@ day 1 12:00', 'oxygen venturi, fio2 40 %', 'abg 7.40/40/120/24',
  // Room air with an oxygen flow (PN310): the device is in doubt, so no FiO2 is taken.
  '@ day 1 13:00', 'oxygen room air 2', 'abg 7.40/40/90/24',
].join('\n') + '\n';

describe('FiO2 on room air in the exports', () => {
  const result = checked(NOTE);

  it('CSV: fio2_fraction empty (nothing written), fio2_in_force 0.21 on room air, the written FiO2 elsewhere, none where the device is in doubt', () => {
    const csv = csvHeader(exportColumns()) + timepointCells('a.pneu', result, plain).map((c) => csvCells(c)).join('');
    const rows = parse(csv, { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.fio2_fraction)).toEqual(['', '', '', '', '0.4', '']);
    // Room air is an FiO2 of 0.21 (REFERENCES.md, "Atmosphere and inspired oxygen": common practice, no source).
    expect(rows.map((r) => r.fio2_in_force)).toEqual(['0.21', '0.21', '0.21', '', '0.4', '']);
    // A cannula's FiO2 is only estimated, in its own column, and never used for P/F.
    expect(rows.map((r) => r.fio2_estimated)).toEqual(['', '', '', '0.29', '', '']);
  });

  it('JSON Lines: the same cells, as numbers', () => {
    const records = toJsonl('a.pneu', result, plain).trim().split('\n').map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(records.map((r) => r.fio2_fraction)).toEqual([null, null, null, null, 0.4, null]);
    expect(records.map((r) => r.fio2_in_force)).toEqual([0.21, 0.21, 0.21, null, 0.4, null]);
  });

  it('is the FiO2 P/F was worked out with, wherever a P/F is given', () => {
    const records = toJsonl('a.pneu', result, plain).trim().split('\n').map((l) => JSON.parse(l) as Record<string, number | null>);
    const withPf = records.filter((r) => r.pf_ratio !== null);
    expect(withPf.length).toBe(3);
    for (const r of withPf) expect(r.pf_ratio).toBeCloseTo(r.pao2_mmHg! / r.fio2_in_force!, 6);
  });

  it('FHIR: no FiO2 Observation on room air (0.21 is implied, not measured), and its P/F derives from the PaO2 alone', () => {
    const bundle = toFhirBundle('a.pneu', result, plain);
    const ids = (bundle.entry ?? []).map((e) => e.resource.id);
    expect(ids.filter((id) => /-fio2/.test(id))).toEqual(['obs-4-fio2']);
    const pf0 = observationEntries(bundle).find((e) => e.resource.id === 'obs-0-pf-ratio')?.resource;
    const pao2 = observationEntries(bundle).find((e) => e.resource.id === 'obs-0-pao2');
    expect(pf0?.derivedFrom).toEqual([{ reference: pao2?.fullUrl }]);
  });
});
