// The column model of the tabular exports: the pinned list of names, what a cell holds, and the
// two options (redactProse, shiftDays).
import { readFileSync } from 'node:fs';
import { UcumLhcUtils } from '@lhncbc/ucum-lhc';
import { describe, expect, it } from 'vitest';
import { allDerivations } from '../../server/src/core/analysis/analyse';
import { DERIVED } from '../../server/src/core/derive/registry';
import { FIELDS } from '../../server/src/core/fields/registry';
import { fixtureFiles } from '../helpers/expectations';
import { checked, samples } from './helpers';
import { renderColumnTable } from '../../server/src/core/export/docs';
import { exportColumns, findingsByTimepoint, findingsOfTimepoint, observationEntries, RANGE_DERIVED_IDS, type Row, timepointRows, toFhirBundle, unitSlug } from '../../server/src/core/export';

const plain = { redactProse: false, shiftDays: 0 } as const;
/** 1 kPa in mmHg: 1000 Pa ÷ 133.322387415 Pa (NIST SP 811). */
const MMHG_PER_KPA = 1000 / 133.322387415;

/** Rows of a note by timepoint index. */
const columnDescription = (name: string): string => exportColumns().find((c) => c.name === name)?.description ?? '';

function rowsOf(text: string, options: { redactProse: boolean; shiftDays: number } = plain): Row[] {
  return timepointRows('note.pneu', checked(text), options);
}

describe('the column list', () => {
  it('is pinned: a change to it must show in review', () => {
    expect(exportColumns().map((c) => c.name)).toEqual([
      'file', 'timepoint', 'label', 'day', 'minutes', 'offset_minutes',
      'age_y', 'sex', 'height_cm', 'weight_kg', 'altitude_m', 'barometric_mmHg', 'gas_unit',
      'hr_per_min', 'rr_per_min', 'spo2_pct', 'temp_C', 'bp_systolic_mmHg', 'bp_diastolic_mmHg', 'etco2_mmHg', 'cardiac_output_L_min',
      'device', 'o2_flow_L_min', 'fio2_fraction', 'ipap_cmH2O', 'epap_cmH2O', 'cpap_level_cmH2O',
      'mode', 'vt_mL', 'vent_rate_per_min', 'peep_cmH2O', 'plateau_cmH2O', 'peak_cmH2O', 'insp_flow_L_min', 'mean_airway_pressure_cmH2O', 'pressure_support_cmH2O', 'minute_volume_L_min',
      'ph_pH', 'paco2_mmHg', 'pao2_mmHg', 'hco3_mmol_L', 'base_excess_mmol_L', 'sao2_pct',
      'ph_venous_pH', 'pvco2_mmHg', 'pvo2_mmHg', 'hco3_venous_mmol_L', 'svo2_pct',
      'lactate_mmol_L', 'hb_g_dL', 'na_mmol_L', 'k_mmol_L', 'cl_mmol_L', 'hco3_serum_mmol_L', 'albumin_g_dL', 'glucose_mmol_L',
      'barometric_derived_mmHg', 'pio2_mmHg', 'fio2_estimated', 'pao2_alveolar_mmHg', 'aa_gradient_mmHg', 'aa_gradient_upper_normal_mmHg',
      'a_to_A_ratio', 'pf_ratio', 'pf_ratio_altitude_adjusted_mmHg', 'sf_ratio', 'rox_index', 'oxygenation_index', 'oxygen_saturation_index',
      'hco3_calculated_mmol_L', 'hco3_gap_mmol_L', 'anion_gap_mmol_L', 'anion_gap_albumin_corrected_mmol_L', 'delta_ratio',
      'paco2_expected_low_mmHg', 'paco2_expected_high_mmHg',
      'hco3_expected_acute_low_mmol_L', 'hco3_expected_acute_high_mmol_L', 'hco3_expected_chronic_low_mmol_L', 'hco3_expected_chronic_high_mmol_L',
      'minute_ventilation_L_min', 'predicted_body_weight_kg', 'vt_per_kg_pbw_mL_kg', 'driving_pressure_cmH2O',
      'compliance_static_mL_cmH2O', 'compliance_dynamic_mL_cmH2O', 'airway_resistance_cmH2O_L_s', 'mechanical_power_J_min', 'ventilatory_ratio',
      'cao2_mL_dL', 'do2_mL_min',
      'carried_fields', 'findings_errors', 'findings_warnings', 'findings_information',
      // Added later: after every earlier column.
      'mechanical_power_surrogate_J_min', 'amplitude_cmH2O', 'base_excess_venous_mmol_L',
      'mean_arterial_pressure_mmHg', 'paco2_etco2_difference_mmHg', 'mean_bp_mmHg', 'insp_pressure_cmH2O',
      'fio2_in_force',
      'peep_total_cmH2O',
      'autopeep_cmH2O',
      'sbe_mmol_L', 'sbe_venous_mmol_L',
      'spo2_target_low_pct',
      'spo2_target_high_pct',
    ]);
  });

  it('has unique names made of letters, digits and underscores', () => {
    const names = exportColumns().map((c) => c.name);
    expect(new Set(names).size).toBe(names.length);
    for (const n of names) expect(n).toMatch(/^[a-z][A-Za-z0-9]*(_[A-Za-z0-9]+)*$/);
    expect(names).not.toContain('findings'); // reserved for the JSON Lines findings list
  });

  it('covers every field and every derived value of the registries', () => {
    const sources = new Set(exportColumns().map((c) => c.source));
    for (const f of FIELDS) expect(sources, f.id).toContain(f.id);
    for (const d of DERIVED) expect(sources, d.id).toContain(d.id);
  });

  it('gives every column a description, and a UCUM code that a UCUM library reads', () => {
    const ucum = UcumLhcUtils.getInstance();
    for (const c of exportColumns()) {
      expect(c.description.length, c.name).toBeGreaterThan(10);
      if (c.type === 'number' && c.kind !== 'summary' && c.name !== 'timepoint' && c.name !== 'day') expect(c.ucum, c.name).not.toBeNull();
      if (c.ucum !== null) expect(ucum.validateUnitString(c.ucum, true).status, `${c.name}: ${c.ucum}`).toBe('valid');
    }
  });
});

describe('the unit a column names for people', () => {
  it('is the unit the FHIR export writes for the same field: °C and pH, not C (the coulomb\'s symbol) and ph', () => {
    const note = [
      'patient   age 40 y, height 170 cm, weight 70 kg',
      '@ 08:00',
      'vitals    hr 80, rr 14, spo2 97 %, temp 99.5 F, bp 120/80, etco2 38, co 5',
      'vent      mode VC, vt 450, rate 14, peep 5, fio2 0.4, plateau 18, peak 24, flow 50, map 10',
      'abg       7.40/40/90/24, be 0, sao2 97 %, hb 14, lactate 1.1',
      'vbg       ph 7.36, pco2 46, po2 40, hco3 25, svo2 70 %',
      'labs      na 140, k 4, cl 104, hco3 24, albumin 4, glucose 5.5',
      '',
    ].join('\n');
    const bundle = toFhirBundle('note.pneu', checked(note), { redactProse: false, shiftDays: 0 });
    const byField = new Map(exportColumns().filter((c) => c.kind === 'field' && c.section === null && c.part === null).map((c) => [c.source, c]));
    const compared: string[] = [];
    for (const entry of observationEntries(bundle)) {
      const fieldId = /^obs-(?:\d+|header)-(.+)$/.exec(entry.resource.id)?.[1]?.replace(/-/g, '_');
      const column = fieldId === undefined ? undefined : byField.get(fieldId);
      const quantity = entry.resource.valueQuantity;
      if (!column || !quantity) continue;
      expect(column.unit, column.name).toBe(quantity.unit);
      compared.push(column.name);
    }
    expect(compared).toEqual(expect.arrayContaining(['temp_C', 'ph_pH', 'ph_venous_pH', 'paco2_mmHg', 'fio2_fraction', 'spo2_pct', 'hb_g_dL']));
    expect(compared.length).toBeGreaterThan(30);
  });
});

describe('derived columns in rows where nothing they rest on is stated', () => {
  const note = [
    'patient   age 60 y, sex male, height 175 cm',
    'place     altitude 1500 m',
    '@ day 1 08:00',
    'vent      mode VC, vt 450, rate 14, peep 8, fio2 0.5',
    'abg       7.40/40/90/24',
    '@ 10:00',
    'vent      fio2 0.4',
    '',
  ].join('\n');

  it('are empty, as the editor shows them only where one of their main inputs is stated; README says so', () => {
    const [first, second] = rowsOf(note);
    // At 08:00 a PaO2 and a tidal volume are stated: the barometric pressure and the predicted body weight are given.
    expect(first?.barometric_derived_mmHg).toEqual(expect.any(Number));
    expect(first?.predicted_body_weight_kg).toEqual(expect.any(Number));
    // At 10:00 only the FiO2 is: its PiO2 is given, computed with the same pressure, which its row leaves empty.
    const pb = first!.barometric_derived_mmHg as number;
    // PiO2 = FiO2 × (PB − 47 mmHg): common practice, no source (REFERENCES.md, "Atmosphere and inspired oxygen").
    expect(second?.pio2_mmHg as number).toBeCloseTo(0.4 * (pb - 47), 9);
    expect(second?.barometric_derived_mmHg).toBeNull();
    expect(second?.predicted_body_weight_kg).toBeNull();
    // What a reader of README's column table is told, beside "empty when unknown or not usable".
    const intro = renderColumnTable().replace(/\s+/g, ' ');
    expect(intro).toContain('A derived value is in the rows of the timepoints where Pneumark reports it');
    expect(intro).toContain('`barometric_derived_mmHg` is given where a PaO2 or a place line is stated, not in every row whose `pio2_mmHg` used it');
  });
});

describe('descriptions of derived columns', () => {
  it('say how the value is made, never a formula that is only the value itself (`{PB}`)', () => {
    for (const c of exportColumns().filter((x) => x.kind === 'derived')) {
      expect(c.description, c.name).not.toMatch(/derived: \{[^}]*\}\.$/);
    }
    expect(exportColumns().find((c) => c.name === 'barometric_derived_mmHg')?.description).toBe(
      'Barometric pressure (PB) the calculations use: as stated on a place line, else estimated from the altitude (the barometricModel setting), else 760 mmHg (sea level).',
    );
  });
});

describe('unit slugs', () => {
  it.each([
    ['mmHg', 'mmHg'], ['L/min', 'L_min'], ['/min', 'per_min'], ['%sat', 'pct'], ['%', 'pct'], ['cmH2O/L/s', 'cmH2O_L_s'],
    ['mL/kg', 'mL_kg'], ['g/dL', 'g_dL'], ['mmol/L', 'mmol_L'], ['ph', 'pH'], ['fraction', 'fraction'], ['C', 'C'], ['', ''],
  ])('%s → %s', (unit, slug) => {
    expect(unitSlug(unit)).toBe(slug);
  });
});

describe('expected ranges', () => {
  it('are exactly the derived values that come with a range, in the samples and fixtures', () => {
    const withRange = new Set<string>();
    const without = new Set<string>();
    for (const { text } of fixtureFiles('tests/fixtures', 'samples')) {
      for (const d of allDerivations(checked(text).analysis).flatMap((x) => x.derived)) (d.range ? withRange : without).add(d.id);
    }
    expect([...withRange].sort()).toEqual([...RANGE_DERIVED_IDS].sort());
    for (const id of RANGE_DERIVED_IDS) expect(without.has(id), id).toBe(false);
  });
});

describe('cells', () => {
  const note = [
    'patient age 60 y, sex male, height 180 cm',
    'units gas kPa',
    '@ day 1 08:00  first look',
    'vent mode VC, vt 0.45 L, rate 18, peep 10, fio2 50 %, plateau 25',
    'vitals hr 90, temp 100.4 F, bp 120/70, spo2 104',
    'abg 7.30/6.0/9.0/22',
    '@ +90m  later',
    'abg po2 12',
    '@ day 3  no clock',
    'vitals hr 80',
  ].join('\n');
  const rows = rowsOf(note);

  it('hold values in force in the canonical unit, unrounded', () => {
    const [first] = rows;
    expect(first?.vt_mL).toBe(450);
    expect(first?.fio2_fraction).toBe(0.5);
    expect(first?.temp_C).toBeCloseTo(38, 12);
    expect(first?.paco2_mmHg).toBeCloseTo(6.0 * MMHG_PER_KPA, 9);
    expect(first?.paco2_mmHg).not.toBe(45); // not rounded
    expect(first?.bp_systolic_mmHg).toBe(120);
    expect(first?.bp_diastolic_mmHg).toBe(70);
    expect(first?.mode).toBe('VC');
    expect(first?.sex).toBe('male');
    expect(first?.gas_unit).toBe('kPa');
    expect(first?.age_y).toBe(60);
  });

  it('name the gas unit bare pressures were read in, from the note or the setting', () => {
    expect(rows.map((r) => r.gas_unit)).toEqual(['kPa', 'kPa', 'kPa']);
    expect(rowsOf('@ day 1 08:00\nabg po2 80\n@ +1h\nunits gas kPa\nabg po2 10').map((r) => r.gas_unit)).toEqual(['mmHg', 'kPa']);
  });

  it('name the unit the bare gas pressures of the timepoint were read in, also where a `units gas` line below them changes it (README, "Export columns": `gas_unit` tells what bare numbers were read as)', () => {
    // `abg 7.30/45/80/24` is read in mmHg, the unit in force at its line; the kPa of the line below holds from there on.
    const [before, after] = rowsOf('@ day 1 08:00\nabg 7.30/45/80/24\nunits gas kPa\n@ +1h\nabg pco2 6');
    expect([before?.gas_unit, before?.paco2_mmHg]).toEqual(['mmHg', 45]);
    expect(after?.gas_unit).toBe('kPa');
    // A unit written beside the number is not a bare number's: the unit in force is named.
    expect(rowsOf('units gas kPa\n@ day 1 08:00\nabg pco2 45 mmHg').map((r) => r.gas_unit)).toEqual(['kPa']);
  });

  it('describe the delta ratio by the columns it is computed from: the albumin-corrected gap when there is one (Rastegar A, JASN 2007;18:2429–2431, from memory; Figge J et al., Crit Care Med 1998;26:1807–1810, from memory)', () => {
    // AG 140 − (100 + 20) = 20; corrected 20 + 2.5 × (4.0 − 3.0) = 22.5; (22.5 − 12) ÷ (24 − 20) = 2.625.
    const [row] = rowsOf('@ day 1 08:00\nlabs na 140, cl 100, hco3 20, albumin 3.0');
    expect([row?.anion_gap_mmol_L, row?.anion_gap_albumin_corrected_mmol_L, row?.delta_ratio]).toEqual([20, 22.5, 2.625]);
    const description = exportColumns().find((c) => c.name === 'delta_ratio')?.description ?? '';
    expect(description).toContain('`anion_gap_albumin_corrected_mmol_L`');
    const [plain] = rowsOf('@ day 1 08:00\nlabs na 140, cl 100, hco3 20');
    expect(plain?.delta_ratio).toBe((20 - 12) / (24 - 20));
  });

  it('describe minute ventilation, mechanical power and CaO2 by the columns they use: the measured rate else the set rate, SaO2 else SpO2 (standard respiratory mechanics, common practice; Gattinoni L et al., Intensive Care Med 2016;42:1567–1575, from memory)', () => {
    // VE 500 × 20 ÷ 1000 = 10 L/min with the measured rate 20 (set rate 14); MP 0.098 × 20 × 0.5 × (25 − 15 ÷ 2) = 17.15 J/min;
    // CaO2 1.34 × 10 × 90 ÷ 100 + 0.003 × 60 = 12.24 mL/dL with SpO2 90 standing in for SaO2.
    const [row] = rowsOf('@ day 1 08:00\nvent mode VC, vt 500, rate 14, peep 5, plateau 20, peak 25\nvitals rr 20, spo2 90\nabg po2 60, pco2 40\nlabs hb 10');
    expect(row?.minute_ventilation_L_min).toBe(10);
    expect(row?.mechanical_power_J_min).toBeCloseTo(17.15, 9);
    expect(row?.cao2_mL_dL).toBeCloseTo(12.24, 9);
    const descriptionOf = (name: string) => exportColumns().find((c) => c.name === name)?.description ?? '';
    for (const name of ['minute_ventilation_L_min', 'mechanical_power_J_min']) expect(descriptionOf(name), name).toContain('the measured rate (`rr_per_min`), else the set rate (`vent_rate_per_min`)');
    expect(descriptionOf('cao2_mL_dL')).toContain('the SaO2 (`sao2_pct`), else the SpO2 (`spo2_pct`)');
  });

  it('hold the measurement written last when one is stated in two sections of a timepoint, and the sampling FiO2 over the ventilator\'s (README, "Export columns")', () => {
    const [row] = rowsOf('@ day 1 08:00\nlabs na 141, hb 13\nabg na 139, hb 12\nvent etco2 40\nvitals etco2 30\nabg fio2 0.5\nvent mode VC, fio2 0.4');
    expect([row?.na_mmol_L, row?.hb_g_dL, row?.etco2_mmHg, row?.fio2_fraction]).toEqual([139, 12, 30, 0.5]);
  });

  it('keep an arterial and a venous base excess of one timepoint apart, neither lost: LOINC codes them as two values (1925-7 in arterial blood, 1927-3 in venous blood)', () => {
    const [both] = rowsOf('@ day 1 08:00\nabg 7.30/50/80/24, be 0.5\nvbg 7.28/55/40/25, be 1');
    expect([both?.base_excess_mmol_L, both?.base_excess_venous_mmol_L]).toEqual([0.5, 1]);
    // Written the other way round, each still in its own column.
    const [reversed] = rowsOf('@ day 1 08:00\nvbg 7.28/55/40/25, be 1\nabg 7.30/50/80/24, be 0.5');
    expect([reversed?.base_excess_mmol_L, reversed?.base_excess_venous_mmol_L]).toEqual([0.5, 1]);
    // A venous base excess alone is never read as the arterial one; an arterial one alone leaves the venous column empty.
    const [venous, arterial] = rowsOf('@ day 1 08:00\nvbg 7.28/55/40/25, be -3\n@ +1h\nabg 7.30/50/80/24, be -2, be -2.5');
    expect([venous?.base_excess_mmol_L, venous?.base_excess_venous_mmol_L]).toEqual([null, -3]);
    // Restated on its own line (PN206), the later arterial value is the one used.
    expect([arterial?.base_excess_mmol_L, arterial?.base_excess_venous_mmol_L]).toEqual([-2.5, null]);
    expect(columnDescription('base_excess_mmol_L')).toContain('`base_excess_venous_mmol_L`');
    expect(columnDescription('base_excess_venous_mmol_L')).toContain('`vbg` line');
  });

  it('say which line gives lactate and Hb when several do: the same analyte in every sample, so one column with the one written last (README, "Export columns")', () => {
    const [row] = rowsOf('@ day 1 08:00\nabg 7.35/40/90/24, lactate 2.0, hb 12.1\nvbg 7.33/46/40/25, lactate 2.4, hb 11.9\nlabs hb 11.5');
    expect([row?.lactate_mmol_L, row?.hb_g_dL]).toEqual([2.4, 11.5]);
    for (const column of ['lactate_mmol_L', 'hb_g_dL']) expect(columnDescription(column)).toContain('the one written last is in the cell');
  });

  it('describe the anion gap by the HCO3 column it uses: the serum bicarbonate, else the arterial gas HCO3, else the venous one (common practice, no source)', () => {
    // Serum 20 beside a gas HCO3 of 24: 140 − (100 + 20) = 20; the gas HCO3 alone: 140 − (100 + 24) = 16.
    const [both] = rowsOf('@ day 1 08:00\nabg 7.40/40/90/24\nlabs na 140, cl 100, hco3 20');
    expect([both?.hco3_mmol_L, both?.hco3_serum_mmol_L, both?.anion_gap_mmol_L]).toEqual([24, 20, 20]);
    const [gasOnly] = rowsOf('@ day 1 08:00\nabg 7.40/40/90/24\nlabs na 140, cl 100');
    expect(gasOnly?.anion_gap_mmol_L).toBe(16);
    // A venous gas alone: 140 − (100 + 26) = 14.
    const [venousOnly] = rowsOf('@ day 1 08:00\nvbg 7.35/46/40/26\nlabs na 140, cl 100');
    expect(venousOnly?.anion_gap_mmol_L).toBe(14);
    for (const name of ['anion_gap_mmol_L', 'delta_ratio']) {
      expect(exportColumns().find((c) => c.name === name)?.description, name).toContain('`hco3_serum_mmol_L`), else the arterial gas HCO3 (`hco3_mmol_L`), else the venous gas HCO3 (`hco3_venous_mmol_L`)');
    }
  });

  it('give a FiO2 written as a percentage the same number as one written as a fraction (70 % is 0.7, not 0.7000000000000001)', () => {
    const written = ['fio2 70 %', 'fio2 0.7', 'fio2 70', 'fio2 35 %', 'fio2 0.35'];
    const r = rowsOf(written.map((w, i) => `@ day 1 0${i}:00\noxygen venturi, ${w}\nabg po2 70`).join('\n'));
    expect(r.map((x) => x.fio2_fraction)).toEqual([0.7, 0.7, 0.7, 0.35, 0.35]);
    expect(r.map((x) => x.pf_ratio)).toEqual([100, 100, 100, 200, 200]);
    expect(rowsOf('@ day 1 08:00\nlabs albumin 34 g/L, hb 123 g/L').map((x) => [x.albumin_g_dL, x.hb_g_dL])).toEqual([[3.4, 12.3]]);
  });

  it('give the low-flow FiO2 estimate as the rule\'s decimal, unrounded and without a floating-point tail (0.21 + 0.04 per L/min: common practice, no source)', () => {
    const cells = [3, 5, 6].map((flow) => rowsOf(`@ day 1 08:00\noxygen cannula ${flow} L/min`)[0]?.fio2_estimated);
    expect(cells).toEqual([0.33, 0.41, 0.45]);
    expect(rowsOf('@ day 1 08:00\noxygen mask 8 L/min')[0]?.fio2_estimated).toBe(0.47);
  });

  it('leave out a value Pneumark does not use (SpO2 104 % is impossible)', () => {
    expect(rows[0]?.spo2_pct).toBeNull();
    expect(rows[0]?.findings_errors).toBeGreaterThan(0);
  });

  it('carry settings forward and name them in carried_fields', () => {
    const later = rows[1];
    expect(later?.peep_cmH2O).toBe(10);
    expect(later?.hr_per_min).toBeNull(); // measurements do not carry
    expect(later?.carried_fields).toBe('fio2;mode;vt;vent_rate;peep');
    expect(rows[0]?.carried_fields).toBe('');
    // An empty list, not an unknown value: the description says so, as JSON Lines readers see `""` there, not null.
    expect(exportColumns().find((c) => c.name === 'carried_fields')?.description).toContain('`""` in JSON Lines, never null');
  });

  it('give time since day 1 00:00 and since the first known time; a day without a time of day leaves both empty', () => {
    // `@ day 3` without a clock: the day is known, the time of day is not (no invented midnight).
    expect(rows.map((r) => [r.day, r.minutes, r.offset_minutes])).toEqual([[1, 480, 0], [1, 570, 90], [3, null, null]]);
  });

  it('hold derived values at full precision, ranges as two ends, never NaN', () => {
    const first = rows[0]!;
    expect(first.pf_ratio).toBeCloseTo((9.0 * MMHG_PER_KPA) / 0.5, 9);
    expect(typeof first.hco3_expected_acute_low_mmol_L).toBe('number');
    expect(first.hco3_expected_acute_low_mmol_L as number).toBeLessThan(first.hco3_expected_acute_high_mmol_L as number);
    for (const row of rows) for (const [name, v] of Object.entries(row)) if (typeof v === 'number') expect(Number.isFinite(v), name).toBe(true);
  });

  it('have every column in every row, in column order', () => {
    for (const row of rows) expect(Object.keys(row)).toEqual(exportColumns().map((c) => c.name));
  });

  it('findings by timepoint in one pass agree with the per-timepoint filter, on every fixture', () => {
    for (const { path, text } of fixtureFiles('tests/fixtures', 'samples')) {
      const result = checked(text);
      const fast = findingsByTimepoint(result);
      expect(fast, path).toEqual(result.analysis.timeline.timepoints.map((tp) => findingsOfTimepoint(result, tp)));
    }
  });

  it('count findings of the timepoint lines only', () => {
    const s = samples().find((x) => x.name === 'icu-ventilated-lung-injury')!;
    const r = timepointRows(s.path, s.result, plain);
    expect(r.map((x) => [x.findings_errors, x.findings_warnings, x.findings_information])).toEqual([[0, 1, 3], [0, 0, 3], [0, 0, 3], [0, 0, 2]]);
  });

  it('leave out findings of header lines among the lines of an implicit first timepoint, as of any header line', () => {
    // Lines 1, 4 and 5 are the header (patient and units lines before the first `@`), also after
    // the vitals line that opened the implicit first timepoint; lines 2 and 3 belong to it.
    const note = 'patient age 50, qq 3\nvitalz hr 80\nvitals hr 80 zz 4\npatient age 500\nunits gas kPa\n@ day 1 08:00 a\nvitals hr 70';
    const result = checked(note);
    expect(result.findings.map((f) => [f.code, f.range.start.line + 1])).toEqual([['PN201', 1], ['PN101', 2], ['PN201', 3], ['PN206', 4], ['PN204', 4]]);
    const r = timepointRows('a.pneu', result, plain);
    expect(r.map((x) => [x.findings_errors, x.findings_warnings])).toEqual([[2, 0], [0, 0]]);
    expect(findingsByTimepoint(result).map((list) => list.map((f) => f.range.start.line + 1))).toEqual([[2, 3], []]);
    // With an `@` first, the header's findings belong to no row either.
    const explicit = checked('patient age 50, qq 3\n@ day 1 08:00\nvitals hr 80 zz 4');
    expect(timepointRows('b.pneu', explicit, plain).map((x) => x.findings_errors)).toEqual([1]);
  });

  it('leave out a finding on a line before the first `@` where no timepoint starts (a misspelt section after the header); README says so', () => {
    const result = checked('patient age 40\nvitlas hr 80\n@ day 1 08:00\nvitals hr 90, spo2 104');
    expect(result.findings.map((f) => [f.code, f.range.start.line + 1])).toEqual([['PN101', 2], ['PN306', 4]]);
    expect(timepointRows('c.pneu', result, plain).map((x) => x.findings_errors)).toEqual([1]);
    expect(findingsByTimepoint(result).map((list) => list.map((f) => f.range.start.line + 1))).toEqual([[4]]);
    const readme = readFileSync('README.md', 'utf8').replace(/\s+/g, ' ');
    expect(readme.includes('Findings on header lines belong to no timepoint, nor do those on lines before the first `@` where no timepoint starts'), 'README.md says so').toBe(true);
  });
});

describe('options', () => {
  const note = '@ day 1 23:30  Mrs Example, bed 4\nvitals hr 90\n@ +1h\nvitals hr 80';

  it('redactProse empties the label and nothing else', () => {
    const open = rowsOf(note);
    const redacted = rowsOf(note, { redactProse: true, shiftDays: 0 });
    expect(open[0]?.label).toBe('Mrs Example, bed 4');
    expect(redacted.map((r) => r.label)).toEqual([null, null]);
    expect(redacted.map((r) => ({ ...r, label: 'x' }))).toEqual(open.map((r) => ({ ...r, label: 'x' })));
  });

  it('shiftDays moves day and minutes by whole days and keeps offsets', () => {
    const open = rowsOf(note);
    const shifted = rowsOf(note, { redactProse: false, shiftDays: 100 });
    expect(shifted.map((r) => [r.day, r.minutes, r.offset_minutes])).toEqual([[101, 100 * 1440 + 1410, 0], [102, 100 * 1440 + 1470, 60]]);
    expect(open.map((r) => [r.day, r.minutes])).toEqual([[1, 1410], [2, 1470]]);
    const back = rowsOf(note, { redactProse: false, shiftDays: -1 });
    expect(back.map((r) => [r.day, r.minutes])).toEqual([[0, 1410 - 1440], [1, 1470 - 1440]]);
  });

  it('shiftDays must be a whole number', () => {
    expect(() => rowsOf(note, { redactProse: false, shiftDays: 0.5 })).toThrow(RangeError);
    expect(() => rowsOf(note, { redactProse: false, shiftDays: Number.NaN })).toThrow(RangeError);
  });

  it('label holds only what is written after the time (not the time, not `start`)', () => {
    expect(rowsOf('@ day 1 08:00  first look\nvitals hr 90\n@ +1h\nvitals hr 80').map((r) => r.label)).toEqual(['first look', null]);
    expect(rowsOf('vitals hr 90\n@ +1h  later\nvitals hr 80').map((r) => r.label)).toEqual([null, 'later']);
  });

  it('a note with no timepoint has no rows', () => {
    expect(rowsOf('patient age 40 y\n')).toEqual([]);
  });
});
