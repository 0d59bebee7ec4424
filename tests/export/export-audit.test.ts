// A dataset researcher's audit of the exports, value by value: invented notes (invented patients and
// places, tests/fixtures/export-audit/) run through CSV, JSON Lines and FHIR, and every column that
// matters worked out by hand beside its expected value: raw values in the column's unit, the derived
// values, `carried_fields`, the times, the findings counts. Then: the JSON Lines objects are the CSV
// rows (numbers as numbers, empty as null), and each FHIR Observation has the LOINC code, display,
// UCUM code, value and effective time worked out here.
//
// Conventions used below (those of the project, REFERENCES.md and grammar/README.md "Derived values"):
// - 1 kPa = 1000 ÷ 133.322387415 = 7.500617 mmHg: the conventional millimetre of mercury is
//   133.322387415 Pa (NIST Special Publication 811, 2008 edition, Appendix B, from memory); UCUM's
//   mm[Hg] (133.3220 Pa) agrees to 3e-6 (tests/physiology/units.test.ts checks both).
// - PiO2 = FiO2 × (PB − 47) (common practice); PAO2 = PiO2 − PaCO2 ÷ 0.8 (simplified alveolar gas
//   equation; Fenn, Rahn & Otis 1946 and Riley & Cournand 1949, from memory); A–a = PAO2 − PaO2, shown
//   as 0 where the PaO2 is above that PAO2 but not above the full equation's (the project's convention);
//   upper normal A–a = age ÷ 4 + 4 (common practice, no source); a/A = PaO2 ÷ PAO2; P/F = PaO2 ÷ FiO2
//   (ARDS Definition Task Force, JAMA 2012;307:2526–2533); P/F × PB ÷ 760 at altitude (same).
// - HCO3 calc = 0.0307 × PaCO2 × 10^(pH − 6.1) (Henderson–Hasselbalch); HCO3 gap = HCO3 − HCO3 calc.
// - Expected HCO3 in a respiratory disorder: 24 + k × (PaCO2 − 40) ÷ 10 ± 2, k acute 1 (acidosis) or 2
//   (alkalosis), chronic 3.5–5 or 4–5 (Narins & Emmett 1980; Adrogué & Madias 2010, from memory); a
//   PaCO2 written in kPa stands for ± half its last decimal (0.05 kPa = 0.375 mmHg), the low end taken
//   at the lowest, the high end at the highest (the project's convention).
// - Winters' formula 1.5 × HCO3 + 8 ± 2 (Albert, Dell & Winters 1967, from memory); alkalosis
//   40 + 0.7 × (HCO3 − 24) ± 2 (common practice).
// - Anion gap Na − (Cl + HCO3), serum HCO3 first; albumin-corrected AG + 2.5 × (4.0 − albumin g/dL)
//   (Figge et al. 1998, from memory); delta ratio (AG − 12) ÷ (24 − HCO3) (common practice).
// - PBW 50 (male) or 45.5 (female) + 0.91 × (height cm − 152.4) (ARDS Network, NEJM 2000;342:1301–1308);
//   VE = VT × RR ÷ 1000, measured RR first; driving pressure Pplat − PEEP; Cstat VT ÷ (Pplat − PEEP);
//   Cdyn VT ÷ (Ppeak − PEEP); Raw (Ppeak − Pplat) ÷ (flow ÷ 60); mechanical power 0.098 × RR × VT ÷
//   1000 × (Ppeak − (Pplat − PEEP) ÷ 2) (Gattinoni et al. 2016, from memory); its surrogate VE ×
//   (Ppeak + PEEP + flow ÷ 6) ÷ 20 (Giosa et al. 2019, from memory); ventilatory ratio VE × 1000 ×
//   PaCO2 ÷ (PBW × 100 × 37.5) (Sinha et al. 2009); OI FiO2 × MAP × 100 ÷ PaO2, OSI with SpO2.
// - CaO2 = 1.34 × Hb × SaO2 ÷ 100 + 0.003 × PaO2 (common practice), SaO2 first, else SpO2; DO2 = CO ×
//   CaO2 × 10; MAP estimate = DBP + (SBP − DBP) ÷ 3 (common practice); S/F = SpO2 ÷ FiO2; ROX = S/F ÷ RR
//   (Roca et al. 2016, from memory); cannula FiO2 estimate 0.21 + 0.04 × flow (common practice).
// - PB from altitude, West's model: exp(6.63268 − 0.1112 h − 0.00149 h²), h in km (West 1996, its equation read in a reproduction).
// - Hb 1 mmol/L = 1.61145 g/dL (monomer, 16,114.5 g/mol, a quarter of the tetramer's 64,458 as read); 1 hPa = 100 ÷ 133.322387415 mmHg;
//   °C = (°F − 32) × 5 ÷ 9.
import { readdirSync, readFileSync } from 'node:fs';
import { UcumLhcUtils } from '@lhncbc/ucum-lhc';
import { describe, expect, it } from 'vitest';
import { checkNote, type NoteResult } from '../../server/src/core/check-note';
import { bundleObservations, type Cell, exportColumns, type FhirObservation, observationEntries, type Row, timepointRows, toCsv, toFhirBundle, toJsonl } from '../../server/src/core/export';

const KPA = 1000 / 133.322387415; // mmHg per kPa, 7.500617
const HPA = 100 / 133.322387415; // mmHg per hPa, 0.750062
const HB_G_DL_PER_MMOL_L = 1.61145;
const DIR = 'tests/fixtures/export-audit';
const plain = { redactProse: false, shiftDays: 0 } as const;
const ANCHOR = '2030-01-01T00:00:00Z';

function note(name: string): { readonly path: string; readonly text: string; readonly result: NoteResult } {
  const path = `${DIR}/${name}.pneu`;
  const text = readFileSync(path, 'utf8');
  return { path, text, result: checkNote(text) };
}

/** A hand-computed row: column → expected cell (a number within 12 significant digits, a text, or null for empty). */
type Expected = Readonly<Record<string, number | string | null>>;

function expectRow(actual: Row, expected: Expected, where: string): void {
  for (const [column, value] of Object.entries(expected)) {
    expect(Object.keys(actual), `${where}: column ${column} exists`).toContain(column);
    const cell = actual[column];
    if (typeof value === 'number') {
      expect(typeof cell, `${where} ${column}`).toBe('number');
      // The exports write 12 significant digits (precision.ts).
      expect(Math.abs((cell as number) - value), `${where} ${column}: ${String(cell)} vs ${value}`).toBeLessThanOrEqual(Math.abs(value) * 1e-11 + 1e-12);
    } else {
      expect(cell ?? null, `${where} ${column}`).toBe(value);
    }
  }
}

/** PiO2, PAO2, A–a, a/A and P/F of a gas at sea level (PB 760), for cases where all of them are shown. */
function oxygenation(fio2: number, paco2: number, pao2: number, pb = 760): Expected {
  const pio2 = fio2 * (pb - 47);
  const alveolar = pio2 - paco2 / 0.8;
  return { pio2_mmHg: pio2, pao2_alveolar_mmHg: alveolar, aa_gradient_mmHg: alveolar - pao2, a_to_A_ratio: pao2 / alveolar, pf_ratio: pao2 / fio2, fio2_in_force: fio2 };
}

const hco3Calc = (paco2: number, ph: number): number => 0.0307 * paco2 * 10 ** (ph - 6.1);

/** The hand-worked rows of each note, in timepoint order. */
const ROWS: Readonly<Record<string, readonly Expected[]>> = {
  '01-kpa-shorthand': [{
    // @ day 1 10:00 → 600 min; the first known time, offset 0
    timepoint: 0, label: 'arrival', day: 1, minutes: 600, offset_minutes: 0,
    age_y: 64, sex: 'male', height_cm: 178, weight_kg: 80, gas_unit: 'kPa', device: 'venturi',
    fio2_fraction: 0.4, // fio2 40 %
    ph_pH: 7.26,
    paco2_mmHg: 9.6 * KPA, // 72.0059
    pao2_mmHg: 10.8 * KPA, // 81.0067
    hco3_mmol_L: 31,
    barometric_derived_mmHg: 760,
    // 0.4 × 713 = 285.2; 285.2 − 72.0059/0.8 = 195.1926; − 81.0067 = 114.1860; 81.0067/195.1926 = 0.4150; 81.0067/0.4 = 202.5166
    ...oxygenation(0.4, 9.6 * KPA, 10.8 * KPA),
    aa_gradient_upper_normal_mmHg: 64 / 4 + 4, // 20
    hco3_calculated_mmol_L: hco3Calc(9.6 * KPA, 7.26), // 0.0307 × 72.0059 × 10^1.16 = 31.9526
    hco3_gap_mmol_L: 31 - hco3Calc(9.6 * KPA, 7.26), // −0.9526
    // PaCO2 9.6 kPa stands for 9.55–9.65 kPa (71.6309–72.3809 mmHg)
    hco3_expected_acute_low_mmol_L: 24 + (9.55 * KPA - 40) / 10 - 2, // 25.1631
    hco3_expected_acute_high_mmol_L: 24 + (9.65 * KPA - 40) / 10 + 2, // 29.2381
    hco3_expected_chronic_low_mmol_L: 24 + (3.5 * (9.55 * KPA - 40)) / 10 - 2, // 33.0708
    hco3_expected_chronic_high_mmol_L: 24 + (5 * (9.65 * KPA - 40)) / 10 + 2, // 42.1905
    carried_fields: '', findings_errors: 0, findings_warnings: 0, findings_information: 4,
  }],
  '02-per-value-units': [{
    timepoint: 0, label: null, day: 1, minutes: 540, offset_minutes: 0,
    gas_unit: 'mmHg', // no bare gas pressure, no units line: the setting
    ph_pH: 7.4,
    paco2_mmHg: 5.3 * KPA, // 39.7533
    pao2_mmHg: 12 * KPA, // 90.0074
    // 0.5 × 713 = 356.5; 356.5 − 39.7533/0.8 = 306.8084; − 90.0074 = 216.8010; P/F 180.0148
    ...oxygenation(0.5, 5.3 * KPA, 12 * KPA),
    aa_gradient_upper_normal_mmHg: 50 / 4 + 4, // 16.5
    hco3_calculated_mmol_L: hco3Calc(5.3 * KPA, 7.4), // 24.3507
    // pH 7.40: no primary respiratory disorder, no expected range
    hco3_expected_acute_low_mmol_L: null,
    findings_information: 1,
  }],
  '03-carried': [
    {
      timepoint: 0, minutes: 480, offset_minutes: 0, fio2_fraction: 0.6, mode: 'VC', vt_mL: 400, vent_rate_per_min: 18, peep_cmH2O: 10,
      // 0.6 × 713 = 427.8; − 45/0.8 = 371.55; − 90 = 281.55; P/F 150
      ...oxygenation(0.6, 45, 90),
      aa_gradient_upper_normal_mmHg: 70 / 4 + 4, // 21.5
      minute_ventilation_L_min: (400 * 18) / 1000, // no measured RR: the set rate, 7.2
      predicted_body_weight_kg: 45.5 + 0.91 * (160 - 152.4), // female, 52.416
      vt_per_kg_pbw_mL_kg: 400 / (45.5 + 0.91 * (160 - 152.4)), // 7.631
      ventilatory_ratio: (7.2 * 1000 * 45) / (52.416 * 100 * 37.5), // 1.6484
      carried_fields: '', findings_information: 2,
    },
    {
      // @ 10:00, same day: 600 min, 120 after the first
      timepoint: 1, day: 1, minutes: 600, offset_minutes: 120,
      // the ventilator settings carry: FiO2, mode, VT, rate, PEEP, in registry order
      fio2_fraction: 0.6, mode: 'VC', vt_mL: 400, vent_rate_per_min: 18, peep_cmH2O: 10,
      carried_fields: 'fio2;mode;vt;vent_rate;peep',
      ...oxygenation(0.6, 42, 120), // P/F 120/0.6 = 200; PAO2 427.8 − 52.5 = 375.3
      // VE's inputs are all carried: not reported here (grammar/README.md "Derived values"), though VR, anchored on PaCO2, is
      minute_ventilation_L_min: null,
      ventilatory_ratio: (7.2 * 1000 * 42) / (52.416 * 100 * 37.5), // 1.5385
      findings_information: 2,
    },
  ],
  '04-cannula-no-fio2': [
    {
      device: 'cannula', o2_flow_L_min: 2, fio2_fraction: null,
      fio2_estimated: 0.21 + 0.04 * 2, // 0.29, never used as an FiO2
      fio2_in_force: null, pf_ratio: null, pio2_mmHg: null, aa_gradient_mmHg: null,
      aa_gradient_upper_normal_mmHg: 30 / 4 + 4, // 11.5
      hco3_calculated_mmol_L: hco3Calc(36, 7.44), // 24.1791
    },
    {
      // room air: FiO2 0.21 in force, none written; the cannula's flow does not carry past the device change
      device: 'room air', o2_flow_L_min: null, fio2_fraction: null, offset_minutes: 60,
      ...oxygenation(0.21, 38, 70), // 0.21 × 713 = 149.73; − 47.5 = 102.23; − 70 = 32.23; P/F 333.33
      fio2_estimated: null, carried_fields: '',
    },
  ],
  '05-niv': [{
    minutes: 1200, gas_unit: 'kPa', device: 'niv', ipap_cmH2O: 16, epap_cmH2O: 6, fio2_fraction: 0.35,
    paco2_mmHg: 8 * KPA, pao2_mmHg: 9 * KPA, // 60.0049, 67.5055
    ...oxygenation(0.35, 8 * KPA, 9 * KPA), // 249.55; 249.55 − 75.0062 = 174.5438; A–a 107.0383; P/F 192.8730
    aa_gradient_upper_normal_mmHg: 75 / 4 + 4, // 22.75
    hco3_expected_acute_low_mmol_L: 24 + (7.95 * KPA - 40) / 10 - 2, // 23.9630
    hco3_expected_acute_high_mmol_L: 24 + (8.05 * KPA - 40) / 10 + 2, // 28.0380
    hco3_expected_chronic_low_mmol_L: 24 + (3.5 * (7.95 * KPA - 40)) / 10 - 2, // 28.8705
    hco3_expected_chronic_high_mmol_L: 24 + (5 * (8.05 * KPA - 40)) / 10 + 2, // 36.1900
    findings_information: 5,
  }],
  '06-cpap': [{
    minutes: 180, device: 'cpap', cpap_level_cmH2O: 10, fio2_fraction: 0.5,
    ...oxygenation(0.5, 40, 100), // 356.5; 306.5; 206.5; P/F 200
    aa_gradient_upper_normal_mmHg: 45 / 4 + 4, // 15.25
    hco3_calculated_mmol_L: hco3Calc(40, 7.38), // 23.3991
  }],
  '07-hfov': [{
    mode: 'HFOV', vent_rate_per_min: 5 * 60, // 5 Hz = 300 /min
    mean_airway_pressure_cmH2O: 25, amplitude_cmH2O: 60, fio2_fraction: 0.6,
    ...oxygenation(0.6, 55, 70), // 427.8; 359.05; 289.05; P/F 116.667
    oxygenation_index: (0.6 * 25 * 100) / 70, // 21.4286
    minute_ventilation_L_min: null, // HFOV: the set rate is an oscillation frequency
    hco3_expected_acute_low_mmol_L: 24 + (55 - 40) / 10 - 2, // 23.5
    hco3_expected_acute_high_mmol_L: 24 + (55 - 40) / 10 + 2, // 27.5
    hco3_expected_chronic_low_mmol_L: 24 + (3.5 * (55 - 40)) / 10 - 2, // 27.25
    hco3_expected_chronic_high_mmol_L: 24 + (5 * (55 - 40)) / 10 + 2, // 33.5
  }],
  '08-altitude': [{
    altitude_m: 3000, barometric_mmHg: null, // not stated: estimated
    barometric_derived_mmHg: Math.exp(6.63268 - 0.1112 * 3 - 0.00149 * 9), // 536.8238
    ...oxygenation(0.21, 30, 55, Math.exp(6.63268 - 0.1112 * 3 - 0.00149 * 9)), // PiO2 0.21 × 489.8238 = 102.863; PAO2 65.363; A–a 10.363
    pf_ratio_altitude_adjusted_mmHg: ((55 / 0.21) * Math.exp(6.63268 - 0.1112 * 3 - 0.00149 * 9)) / 760, // 184.996
    aa_gradient_upper_normal_mmHg: 35 / 4 + 4, // 12.75
    // respiratory alkalosis: acute k = 2, chronic 4–5, per 10 mmHg below 40
    hco3_expected_acute_low_mmol_L: 24 - 2 * 1 - 2, // 20
    hco3_expected_acute_high_mmol_L: 24 - 2 * 1 + 2, // 24
    hco3_expected_chronic_low_mmol_L: 24 - 5 * 1 - 2, // 17
    hco3_expected_chronic_high_mmol_L: 24 - 4 * 1 + 2, // 22
  }],
  '09-barometric-kpa': [{
    barometric_mmHg: 90 * KPA, barometric_derived_mmHg: 90 * KPA, // 675.0555
    ...oxygenation(0.4, 40, 80, 90 * KPA), // 0.4 × 628.0555 = 251.2222; 201.2222; 121.2222; P/F 200
    pf_ratio_altitude_adjusted_mmHg: (200 * 90 * KPA) / 760, // 177.6462
  }],
  '10-hb-units': [
    { hb_g_dL: 12.5, offset_minutes: 0 },
    { hb_g_dL: 7.5 * HB_G_DL_PER_MMOL_L, offset_minutes: 60, carried_fields: '' }, // 12.0859; a measurement, never carried
    { hb_g_dL: 110 / 10, offset_minutes: 120 }, // g/L → 11
  ],
  '11-lactate-ag': [{
    lactate_mmol_L: 6.2, na_mmol_L: 140, cl_mmol_L: 102, hco3_serum_mmol_L: 12, hco3_mmol_L: 11.5, albumin_g_dL: 4,
    anion_gap_mmol_L: 140 - (102 + 12), // serum HCO3 first: 26
    anion_gap_albumin_corrected_mmol_L: 26 + 2.5 * (4.0 - 4.0), // 26
    delta_ratio: (26 - 12) / (24 - 12), // 1.1667
    paco2_expected_low_mmHg: 1.5 * 11.5 + 8 - 2, // Winters on the gas HCO3: 23.25
    paco2_expected_high_mmHg: 1.5 * 11.5 + 8 + 2, // 27.25
    ...oxygenation(0.21, 30, 95), // 149.73; 112.23; 17.23; P/F 452.38
    hco3_calculated_mmol_L: hco3Calc(30, 7.2), // 11.5947
    findings_information: 2,
  }],
  '12-temperature': [
    { temp_C: 38.5, hr_per_min: 110 },
    { temp_C: ((101.3 - 32) * 5) / 9, hr_per_min: null, carried_fields: '' }, // 38.5; HR is not carried
  ],
  '13-midnight': [
    { timepoint: 0, label: 'evening round, "quiet", no distress', day: 1, minutes: 22 * 60 + 30, offset_minutes: 0 }, // 1350
    { timepoint: 1, day: 1, minutes: 23 * 60 + 50, offset_minutes: 80 }, // 1430
    { timepoint: 2, day: 2, minutes: 1440 + 10, offset_minutes: 100 }, // +20m past midnight: day 2 00:10
    { timepoint: 3, day: 2, minutes: 1440 + 75, offset_minutes: 165 }, // 01:15, clock later than 00:10: same day
    { timepoint: 4, day: 2, minutes: 1440 + 75 + 150, offset_minutes: 315 }, // +2h30: 03:45
    { timepoint: 5, day: 3, minutes: 2 * 1440 + 480, offset_minutes: 2 * 1440 + 480 - 1350 }, // 3360, 2010
  ],
  '14-impossible': [{
    // hr 400 (above 350), spo2 104 and pH 9.1 are impossible: empty, and reported as errors
    hr_per_min: null, spo2_pct: null, ph_pH: null, paco2_mmHg: 40, pao2_mmHg: 90,
    hco3_calculated_mmol_L: null, findings_errors: 3, findings_warnings: 0,
  }],
  '15-vt-per-kg': [{
    // vt 6 mL/kg of the PBW of a man of 175 cm: 50 + 0.91 × 22.6 = 70.566 kg → 423.396 mL
    predicted_body_weight_kg: 50 + 0.91 * (175 - 152.4),
    vt_mL: 6 * (50 + 0.91 * (175 - 152.4)),
    vt_per_kg_pbw_mL_kg: 6,
    minute_ventilation_L_min: (423.396 * 20) / 1000, // measured RR 20: 8.4679
    driving_pressure_cmH2O: 24 - 8, // 16
    compliance_static_mL_cmH2O: 423.396 / 16, // 26.4623
    compliance_dynamic_mL_cmH2O: 423.396 / (30 - 8), // 19.2453
    mechanical_power_J_min: ((0.098 * 20 * 423.396) / 1000) * (30 - (24 - 8) / 2), // 18.2568
    ventilatory_ratio: (8.46792 * 1000 * 44) / (70.566 * 100 * 37.5), // 1.408
    ...oxygenation(0.5, 44, 85), // P/F 170
    findings_warnings: 1, // PN405 on the vent line
  }],
  '16-decimal-comma': [{
    fio2_fraction: 0.4, ph_pH: 7.31, paco2_mmHg: 6.2 * KPA, pao2_mmHg: 9.5 * KPA, // 46.5038, 71.2558
    ...oxygenation(0.4, 6.2 * KPA, 9.5 * KPA), // 285.2; 227.0702; 155.8144; P/F 178.1396
    hco3_expected_acute_low_mmol_L: 24 + (6.15 * KPA - 40) / 10 - 2, // 22.6129
    hco3_expected_chronic_high_mmol_L: 24 + (5 * (6.25 * KPA - 40)) / 10 + 2, // 29.4394
    findings_warnings: 4, // PN103 on fio2 0,4, ph 7,31, pco2 6,2 and po2 9,5
  }],
  '17-vbg-lactate-hb': [{
    base_excess_mmol_L: -1, base_excess_venous_mmol_L: -2, // a column per kind of gas
    ph_venous_pH: 7.32, pvco2_mmHg: 50, pvo2_mmHg: 40, hco3_venous_mmol_L: 25,
    lactate_mmol_L: 2.9, // on both gases: the one written last (abg)
    hb_g_dL: 9.3, sao2_pct: 96,
    cao2_mL_dL: (1.34 * 9.3 * 96) / 100 + 0.003 * 85, // 11.9635 + 0.255 = 12.2185
    pf_ratio: null, fio2_in_force: null, // no FiO2 known
  }],
  '18-mechanics-ve': [{
    minute_ventilation_L_min: (450 * 18) / 1000, // measured RR 18 (set 16): 8.1
    predicted_body_weight_kg: 45.5 + 0.91 * (165 - 152.4), // 56.966
    vt_per_kg_pbw_mL_kg: 450 / 56.966, // 7.8994
    driving_pressure_cmH2O: 15, compliance_static_mL_cmH2O: 450 / 15, compliance_dynamic_mL_cmH2O: 450 / 23,
    mechanical_power_J_min: ((0.098 * 18 * 450) / 1000) * (28 - 15 / 2), // 16.2729
    mechanical_power_surrogate_J_min: null, // needs the inspiratory flow
    ventilatory_ratio: (8.1 * 1000 * 40) / (56.966 * 100 * 37.5), // 1.5167
    bp_systolic_mmHg: 120, bp_diastolic_mmHg: 60,
    mean_arterial_pressure_mmHg: 60 + (120 - 60) / 3, // 80
    mean_bp_mmHg: null, // none measured
    etco2_mmHg: 35, paco2_etco2_difference_mmHg: 40 - 35,
    ...oxygenation(0.4, 40, 100), // 285.2; 235.2; 135.2; P/F 250
  }],
  '19-day-only-and-units-change': [
    { timepoint: 0, day: 1, minutes: 480, gas_unit: 'mmHg', pf_ratio: 90 / 0.3 },
    {
      // @ day 2: the day, no time of day
      timepoint: 1, day: 2, minutes: null, offset_minutes: null, gas_unit: 'kPa',
      paco2_mmHg: 5.3 * KPA, pao2_mmHg: 12 * KPA, pf_ratio: (12 * KPA) / 0.3, // 300.0246
      carried_fields: 'device;fio2',
    },
    {
      // @ +1h from a time unknown: no day, no minutes
      timepoint: 2, day: null, minutes: null, offset_minutes: null,
      hb_g_dL: 8.1 * HB_G_DL_PER_MMOL_L, // on an abg line in mmol/L: 13.0527
      ...oxygenation(0.3, 5.2 * KPA, 11.5 * KPA), // 213.9; 165.146; 78.889; P/F 287.5236
    },
  ],
  '20-extubated': [
    {
      // day 4 23:40: 3 × 1440 + 1420
      day: 4, minutes: 3 * 1440 + 23 * 60 + 40, label: 'before extubation',
      barometric_mmHg: 1013 * HPA, // 759.8124
      mode: 'PS', pressure_support_cmH2O: 8, peep_cmH2O: 5, fio2_fraction: 0.35,
      ...oxygenation(0.35, 41, 95, 1013 * HPA), // 249.4843; 198.2343; 103.2343; P/F 271.4286
      sf_ratio: 97 / 0.35, // 277.14
      paco2_expected_low_mmHg: 40 + 0.7 * (26.5 - 24) - 2, // metabolic alkalosis: 39.75
      paco2_expected_high_mmHg: 40 + 0.7 * (26.5 - 24) + 2, // 43.75
      cao2_mL_dL: (1.34 * 10.2 * 97) / 100 + 0.003 * 95, // SpO2, no SaO2: 13.5430
      aa_gradient_upper_normal_mmHg: 67 / 4 + 4, // 20.75
    },
    {
      // 00:20 after 23:40: next day
      day: 5, minutes: 4 * 1440 + 20, offset_minutes: 40,
      // the mask replaces the ventilator: nothing of it carries
      mode: null, peep_cmH2O: null, pressure_support_cmH2O: null, carried_fields: '',
      device: 'mask', fio2_fraction: 0.4,
      ...oxygenation(0.4, 43, 82, 1013 * HPA), // 285.1250; 231.3750; 149.3750; P/F 205
      sf_ratio: 95 / 0.4,
      hb_g_dL: null, lactate_mmol_L: null, temp_C: null,
    },
  ],
  '21-sampling-fio2': [
    {
      // the gas's sampling FiO2 (0.45) is the one in force for it; the ventilator's 0.5 is in FHIR only
      fio2_fraction: 0.45, ...oxygenation(0.45, 42, 75), // 320.85; 268.35; 193.35; P/F 166.67
      minute_ventilation_L_min: (480 * 14) / 1000, // 6.72
    },
    { device: 'venturi', fio2_fraction: 0.28, ...oxygenation(0.28, 39, 68), vt_mL: null, carried_fields: '' }, // venturi 28
    {
      device: 'hfnc', o2_flow_L_min: 50, fio2_fraction: 0.6, ...oxygenation(0.6, 35, 72), // P/F 120
      sf_ratio: 94 / 0.6, rox_index: 94 / 0.6 / 24, // 6.5278
      hco3_serum_mmol_L: 25, // written as tco2
    },
  ],
  '22-resistance-delivery': [
    {
      day: 2, minutes: 1440 + 840,
      ...oxygenation(0.7, 48, 66), // 499.1; 439.1; 373.1; P/F 94.29
      sf_ratio: 92 / 0.7, oxygenation_index: (0.7 * 16 * 100) / 66, oxygen_saturation_index: (0.7 * 16 * 100) / 92,
      predicted_body_weight_kg: 50 + 0.91 * (183 - 152.4), // 77.846
      minute_ventilation_L_min: (500 * 15) / 1000, // set rate: 7.5
      airway_resistance_cmH2O_L_s: (34 - 26) / (60 / 60), // 8
      mechanical_power_J_min: ((0.098 * 15 * 500) / 1000) * (34 - (26 - 10) / 2), // 19.11
      mechanical_power_surrogate_J_min: (7.5 * (34 + 10 + 60 / 6)) / 20, // 20.25
      cao2_mL_dL: (1.34 * 9.8 * 91) / 100 + 0.003 * 66, // SaO2 first: 12.1481
      do2_mL_min: 5.5 * ((1.34 * 9.8 * 91) / 100 + 0.003 * 66) * 10, // 668.1466
      hco3_expected_chronic_low_mmol_L: 24 + (3.5 * 8) / 10 - 2, // 24.8
      hco3_expected_chronic_high_mmol_L: 24 + (5 * 8) / 10 + 2, // 30
    },
    {
      // settings carry, readings (plateau, peak, mean airway pressure) do not
      carried_fields: 'fio2;mode;vt;vent_rate;peep;insp_flow',
      plateau_cmH2O: null, peak_cmH2O: null, mean_airway_pressure_cmH2O: null,
      sf_ratio: 95 / 0.7, pf_ratio: null,
    },
  ],
  '23-kpa-etco2-vbg': [{
    temp_C: ((98.6 - 32) * 5) / 9, // 37
    etco2_mmHg: 4.5 * KPA, // bare, in the note's kPa: 33.7528
    pvco2_mmHg: 6.4 * KPA, pvo2_mmHg: 5.1 * KPA, paco2_mmHg: 5.6 * KPA, pao2_mmHg: 13.2 * KPA,
    paco2_etco2_difference_mmHg: (5.6 - 4.5) * KPA, // 8.2507
    pio2_mmHg: 0.21 * 713, // 149.73
    pao2_alveolar_mmHg: 149.73 - (5.6 * KPA) / 0.8, // 97.2257
    // PaO2 99.0081 is above that PAO2 but below the full equation's, 149.73 − 42.0034 × (0.21 + 0.79/0.8) = 99.43:
    // the gradient is shown as 0 and a/A as 1 (not −1.78 and 1.018)
    aa_gradient_mmHg: 0, a_to_A_ratio: 1,
    pf_ratio: (13.2 * KPA) / 0.21, // 471.4673
  }],
};

const NAMES = readdirSync(DIR).filter((f) => f.endsWith('.pneu')).map((f) => f.slice(0, -'.pneu'.length)).sort();

describe('the audit notes', () => {
  it('are 15 to 25 invented notes, each audited here', () => {
    expect(NAMES.length).toBeGreaterThanOrEqual(15);
    expect(NAMES.length).toBeLessThanOrEqual(25);
    expect(Object.keys(ROWS).sort()).toEqual(NAMES);
  });
});

describe('CSV rows worked out by hand', () => {
  it.each(NAMES)('%s', (name) => {
    const { path, result } = note(name);
    const rows = timepointRows(path, result, plain);
    const expected = ROWS[name]!;
    expect(rows.length, 'one row per timepoint').toBe(expected.length);
    expected.forEach((e, i) => expectRow(rows[i]!, e, `${name} row ${i}`));
  });
});

/** RFC 4180 records of a CSV text (quoted fields, doubled quotes, LF line ends). */
function parseCsv(text: string): string[][] {
  const records: string[][] = [];
  let field = '';
  let record: string[] = [];
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i]!;
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else field += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') {
      record.push(field);
      field = '';
    } else if (ch === '\n') {
      record.push(field);
      records.push(record);
      record = [];
      field = '';
    } else field += ch;
  }
  expect(field === '' && record.length === 0, 'the CSV ends with a line end').toBe(true);
  return records;
}

describe('CSV text, JSON Lines and rows say the same', () => {
  const columns = exportColumns();

  it.each(NAMES)('%s', (name) => {
    const { path, result } = note(name);
    const rows = timepointRows(path, result, plain);
    const [header, ...records] = parseCsv(toCsv(columns, rows));
    expect(header).toEqual(columns.map((c) => c.name));
    const objects = toJsonl(path, result, plain).trimEnd().split('\n').map((line) => JSON.parse(line) as Record<string, unknown>);
    expect(records.length).toBe(rows.length);
    expect(objects.length).toBe(rows.length);
    rows.forEach((row, i) => {
      const record = records[i]!;
      const object = objects[i]!;
      // The same keys as the CSV header, in its order, then the findings.
      expect(Object.keys(object)).toEqual([...columns.map((c) => c.name), 'findings']);
      columns.forEach((c, k) => {
        const cell: Cell = row[c.name] ?? null;
        const text = record[k]!;
        const value = object[c.name];
        const where = `${name} row ${i} ${c.name}`;
        if (cell === null) {
          expect(text, where).toBe('');
          expect(value, where).toBeNull();
        } else if (c.type === 'number') {
          expect(typeof cell, where).toBe('number');
          expect(typeof value, where).toBe('number');
          expect(value, where).toBe(cell);
          expect(Number(text), where).toBe(cell); // the CSV text reads back as the same number
          expect(text, where).toBe(String(cell));
        } else {
          expect(typeof value, where).toBe('string');
          expect(value, where).toBe(cell);
          expect(text, where).toBe(cell);
        }
      });
      // carried_fields is text, never null
      expect(typeof object.carried_fields).toBe('string');
      // the findings listed are the ones counted
      const findings = object.findings as { severity: string }[];
      expect(findings.filter((f) => f.severity === 'error').length).toBe(row.findings_errors);
      expect(findings.filter((f) => f.severity === 'warning').length).toBe(row.findings_warnings);
      expect(findings.filter((f) => f.severity === 'information').length).toBe(row.findings_information);
    });
  });

  it('--shift-days moves day and minutes, not the offset; --redact empties the label and an unknown mode word', () => {
    const { result } = note('20-extubated');
    const shifted = timepointRows('20.pneu', result, { redactProse: true, shiftDays: 2 });
    // day 4 23:40 → day 6, 5740 + 2 × 1440 = 8620; day 5 00:20 → day 7, 5780 + 2880 = 8660
    expectRow(shifted[0]!, { day: 6, minutes: 5740 + 2 * 1440, offset_minutes: 0, label: null, mode: 'PS' }, 'shifted 0');
    expectRow(shifted[1]!, { day: 7, minutes: 5780 + 2 * 1440, offset_minutes: 40, label: null }, 'shifted 1');
    const own = timepointRows('x.pneu', checkNote('@ day 1 08:00\nvent mode Smithvent, fio2 0.5'), { redactProse: true, shiftDays: 0 })[0]!;
    expect(own.mode).toBe('[redacted]');
  });

  it('a label with commas and quotes is one quoted field, and the file name too', () => {
    const { result } = note('13-midnight');
    const rows = timepointRows('ward 4, bed "2".pneu', result, plain);
    const line = toCsv(columns, rows).split('\n')[1]!;
    expect(line.startsWith('"ward 4, bed ""2"".pneu",0,"evening round, ""quiet"", no distress",1,1350,0,')).toBe(true);
  });
});

describe('the columns\' units are valid UCUM', () => {
  const ucum = UcumLhcUtils.getInstance();
  it.each(exportColumns().filter((c) => c.ucum !== null).map((c) => [c.name, c.ucum!] as const))('%s: %s', (_name, code) => {
    expect(ucum.validateUnitString(code).status).toBe('valid');
  });
});

/** One Observation as audited: id, LOINC code and display (null: uncoded), value, UCUM code, effective time. */
type ExpectedObservation = readonly [id: string, code: string | null, display: string | null, value: number, ucum: string, effective: string | null];

function expectObservations(observations: readonly FhirObservation[], expected: readonly ExpectedObservation[], where: string): void {
  expect(observations.map((o) => o.id), where).toEqual(expected.map((e) => e[0]));
  observations.forEach((o, i) => {
    const [id, code, display, value, ucumUnit, effective] = expected[i]!;
    const coding = o.code.coding?.[0];
    expect(coding?.code ?? null, `${where} ${id} code`).toBe(code);
    expect(coding?.display ?? null, `${where} ${id} display`).toBe(display);
    if (coding) expect(coding.system).toBe('http://loinc.org');
    if (o.valueQuantity) {
      expect(Math.abs(o.valueQuantity.value - value), `${where} ${id} value ${o.valueQuantity.value}`).toBeLessThanOrEqual(Math.abs(value) * 1e-11 + 1e-12);
      expect(o.valueQuantity.code, `${where} ${id} UCUM`).toBe(ucumUnit);
      expect(o.valueQuantity.system).toBe('http://unitsofmeasure.org');
    }
    expect(o.effectiveDateTime ?? null, `${where} ${id} time`).toBe(effective);
  });
}

const PH_A = ['2744-1', 'pH of Arterial blood'] as const;
const PACO2 = ['2019-8', 'Carbon dioxide [Partial pressure] in Arterial blood'] as const;
const PAO2 = ['2703-7', 'Oxygen [Partial pressure] in Arterial blood'] as const;
const HCO3_A = ['1960-4', 'Bicarbonate [Moles/volume] in Arterial blood'] as const;
const PF = ['50984-4', 'Horowitz index in Arterial blood'] as const;
const FIO2 = ['3150-0', 'Inhaled oxygen concentration'] as const;
const FIO2_VENT = ['19994-3', 'Oxygen/Total gas setting [Volume Fraction] Ventilator'] as const;
const AGE = ['30525-0', 'Age'] as const;

describe('FHIR Observations worked out by hand', () => {
  const bundle = (name: string, anchor = ANCHOR, shiftDays = 0) => {
    const { path, result } = note(name);
    return toFhirBundle(path, result, { anchor, redactProse: false, shiftDays });
  };
  const observations = (name: string, anchor = ANCHOR, shiftDays = 0) => bundleObservations(bundle(name, anchor, shiftDays));

  it('kPa shorthand gas: values in mmHg, the P/F derived from the PaO2 and FiO2 Observations', () => {
    const t = '2030-01-01T10:00:00Z';
    expectObservations(observations('01-kpa-shorthand'), [
      ['obs-header-age', ...AGE, 64, 'a', null],
      ['obs-header-height', '8302-2', 'Body height', 178, 'cm', null],
      ['obs-header-weight', '29463-7', 'Body weight', 80, 'kg', null],
      ['obs-0-fio2', ...FIO2, 0.4, '1', t],
      ['obs-0-ph', ...PH_A, 7.26, '[pH]', t],
      ['obs-0-paco2', ...PACO2, 9.6 * KPA, 'mm[Hg]', t],
      ['obs-0-pao2', ...PAO2, 10.8 * KPA, 'mm[Hg]', t],
      ['obs-0-hco3', ...HCO3_A, 31, 'mmol/L', t],
      ['obs-0-pf-ratio', ...PF, (10.8 * KPA) / 0.4, 'mm[Hg]', t],
    ], '01');
    const b = bundle('01-kpa-shorthand');
    const url = (id: string) => observationEntries(b).find((e) => e.resource.id === id)!.fullUrl;
    expect(observationEntries(b).find((e) => e.resource.id === 'obs-0-pf-ratio')!.resource.derivedFrom).toEqual([{ reference: url('obs-0-pao2') }, { reference: url('obs-0-fio2') }]);
  });

  it('carried ventilator FiO2: coded as a ventilator setting, stated once, and the later P/F points back at it', () => {
    const list = observations('03-carried');
    expectObservations(list.filter((o) => o.id.startsWith('obs-1-')), [
      ['obs-1-ph', ...PH_A, 7.37, '[pH]', '2030-01-01T10:00:00Z'],
      ['obs-1-paco2', ...PACO2, 42, 'mm[Hg]', '2030-01-01T10:00:00Z'],
      ['obs-1-pao2', ...PAO2, 120, 'mm[Hg]', '2030-01-01T10:00:00Z'],
      ['obs-1-hco3', ...HCO3_A, 24, 'mmol/L', '2030-01-01T10:00:00Z'],
      ['obs-1-pf-ratio', ...PF, 200, 'mm[Hg]', '2030-01-01T10:00:00Z'],
    ], '03');
    expectObservations(list.filter((o) => /^obs-0-(fio2|vt|vent-rate|peep)$/.test(o.id)), [
      ['obs-0-fio2', ...FIO2_VENT, 0.6, '1', '2030-01-01T08:00:00Z'],
      ['obs-0-vt', '20112-9', 'Tidal volume setting Ventilator', 400, 'mL', '2030-01-01T08:00:00Z'],
      ['obs-0-vent-rate', null, null, 18, '/min', '2030-01-01T08:00:00Z'], // no code in the registry
      ['obs-0-peep', '20077-4', 'Positive end expiratory pressure setting Ventilator', 10, 'cm[H2O]', '2030-01-01T08:00:00Z'],
    ], '03 settings');
    const b = bundle('03-carried');
    const url = (id: string) => observationEntries(b).find((e) => e.resource.id === id)!.fullUrl;
    expect(observationEntries(b).find((e) => e.resource.id === 'obs-1-pf-ratio')!.resource.derivedFrom).toEqual([{ reference: url('obs-1-pao2') }, { reference: url('obs-0-fio2') }]);
  });

  it('room air: the P/F from the PaO2 alone (0.21 is no Observation)', () => {
    const pf = observations('04-cannula-no-fio2').filter((o) => o.id.endsWith('pf-ratio'));
    expectObservations(pf, [['obs-1-pf-ratio', ...PF, 70 / 0.21, 'mm[Hg]', '2030-01-01T13:00:00Z']], '04');
    expect(pf[0]!.derivedFrom).toHaveLength(1);
  });

  it('labs and a lactate: serum codes on a labs line, lactate in blood (32693-4)', () => {
    const t = '2030-01-01T14:00:00Z';
    expectObservations(observations('11-lactate-ag').filter((o) => /lactate|-na$|-cl$|serum|albumin/.test(o.id)), [
      ['obs-0-lactate', '32693-4', 'Lactate [Moles/volume] in Blood', 6.2, 'mmol/L', t],
      ['obs-0-na', '2951-2', 'Sodium [Moles/volume] in Serum or Plasma', 140, 'mmol/L', t],
      ['obs-0-cl', '2075-0', 'Chloride [Moles/volume] in Serum or Plasma', 102, 'mmol/L', t],
      ['obs-0-hco3-serum', '1963-8', 'Bicarbonate [Moles/volume] in Serum or Plasma', 12, 'mmol/L', t],
      ['obs-0-albumin', '1751-7', 'Albumin [Mass/volume] in Serum or Plasma', 4, 'g/dL', t],
    ], '11');
  });

  it('a Fahrenheit temperature in °C (UCUM Cel); Hb in g/dL whatever unit it was written in', () => {
    expectObservations(observations('12-temperature').filter((o) => o.id.endsWith('temp')), [
      ['obs-0-temp', '8310-5', 'Body temperature', 38.5, 'Cel', '2030-01-01T16:00:00Z'],
      ['obs-1-temp', '8310-5', 'Body temperature', ((101.3 - 32) * 5) / 9, 'Cel', '2030-01-01T18:00:00Z'],
    ], '12');
    expectObservations(observations('10-hb-units').filter((o) => o.id.endsWith('hb')), [
      ['obs-0-hb', '718-7', 'Hemoglobin [Mass/volume] in Blood', 12.5, 'g/dL', '2030-01-01T08:00:00Z'],
      ['obs-1-hb', '718-7', 'Hemoglobin [Mass/volume] in Blood', 7.5 * HB_G_DL_PER_MMOL_L, 'g/dL', '2030-01-01T09:00:00Z'],
      ['obs-2-hb', '718-7', 'Hemoglobin [Mass/volume] in Blood', 11, 'g/dL', '2030-01-01T10:00:00Z'],
    ], '10');
  });

  it('times across midnight and days, with an anchor in another zone and shifted days', () => {
    const times = (anchor: string, shift: number) => observations('13-midnight', anchor, shift).filter((o) => o.id !== 'obs-header-age').map((o) => o.effectiveDateTime);
    expect(times(ANCHOR, 0)).toEqual(['2030-01-01T22:30:00Z', '2030-01-01T23:50:00Z', '2030-01-02T00:10:00Z', '2030-01-02T01:15:00Z', '2030-01-02T03:45:00Z', '2030-01-03T08:00:00Z']);
    // 3 days later, written at the anchor's own offset
    expect(times('2030-01-01T00:00:00+02:00', 3)).toEqual(['2030-01-04T22:30:00+02:00', '2030-01-04T23:50:00+02:00', '2030-01-05T00:10:00+02:00', '2030-01-05T01:15:00+02:00', '2030-01-05T03:45:00+02:00', '2030-01-06T08:00:00+02:00']);
  });

  it('a day without a time gives a date; an offset from it, no time at all', () => {
    const list = observations('19-day-only-and-units-change');
    expect(list.find((o) => o.id === 'obs-1-pao2')?.effectiveDateTime).toBe('2030-01-02');
    expect(list.find((o) => o.id === 'obs-2-pao2')?.effectiveDateTime).toBeUndefined();
    expectObservations(list.filter((o) => o.id === 'obs-2-hb'), [['obs-2-hb', '718-7', 'Hemoglobin [Mass/volume] in Blood', 8.1 * HB_G_DL_PER_MMOL_L, 'g/dL', null]], '19');
  });

  it('impossible values are not exported', () => {
    expect(observations('14-impossible').map((o) => o.id)).toEqual(['obs-header-age', 'obs-0-paco2', 'obs-0-pao2']);
  });

  it('a tidal volume per kg: the Observation in mL', () => {
    expectObservations(observations('15-vt-per-kg').filter((o) => o.id === 'obs-0-vt'), [['obs-0-vt', '20112-9', 'Tidal volume setting Ventilator', 6 * 70.566, 'mL', '2030-01-01T10:00:00Z']], '15');
  });

  it('venous and arterial gases at one timepoint: venous codes on the vbg line, each lactate its own Observation', () => {
    const t = '2030-01-01T19:00:00Z';
    expectObservations(observations('17-vbg-lactate-hb').filter((o) => /base-excess|venous|pv|lactate|-hb$/.test(o.id)), [
      ['obs-0-base-excess', '1925-7', 'Base excess in Arterial blood by calculation', -1, 'mmol/L', t],
      ['obs-0-base-excess-vbg', '1927-3', 'Base excess in Venous blood by calculation', -2, 'mmol/L', t],
      ['obs-0-ph-venous', '2746-6', 'pH of Venous blood', 7.32, '[pH]', t],
      ['obs-0-pvco2', '2021-4', 'Carbon dioxide [Partial pressure] in Venous blood', 50, 'mm[Hg]', t],
      ['obs-0-pvo2', '2705-2', 'Oxygen [Partial pressure] in Venous blood', 40, 'mm[Hg]', t],
      ['obs-0-hco3-venous', '14627-4', 'Bicarbonate [Moles/volume] in Venous blood', 25, 'mmol/L', t],
      ['obs-0-lactate', '32693-4', 'Lactate [Moles/volume] in Blood', 2.9, 'mmol/L', t],
      ['obs-0-lactate-vbg', '32693-4', 'Lactate [Moles/volume] in Blood', 3.1, 'mmol/L', t],
      ['obs-0-hb', '718-7', 'Hemoglobin [Mass/volume] in Blood', 9.3, 'g/dL', t],
    ], '17');
  });

  it('vitals and ventilator mechanics: vital-sign codes, readings measured on the ventilator', () => {
    const t = '2030-01-01T09:00:00Z';
    const list = observations('18-mechanics-ve');
    expectObservations(list.filter((o) => /-(hr|rr|etco2|plateau|peak)$/.test(o.id)), [
      ['obs-0-hr', '8867-4', 'Heart rate', 80, '/min', t],
      ['obs-0-rr', '9279-1', 'Respiratory rate', 18, '/min', t],
      ['obs-0-etco2', '19891-1', 'Carbon dioxide [Partial pressure] in Exhaled gas --at end expiration', 35, 'mm[Hg]', t],
      ['obs-0-plateau', '76259-1', 'Pressure.plateau Respiratory system airway --on ventilator', 20, 'cm[H2O]', t],
      ['obs-0-peak', '76531-3', 'Pressure.max Respiratory system airway --on ventilator', 28, 'cm[H2O]', t],
    ], '18');
    const bp = list.find((o) => o.id === 'obs-0-bp')!;
    expect(bp.code.coding?.[0]?.code).toBe('85354-9');
    expect(bp.component?.map((c) => [c.code.coding?.[0]?.code, c.valueQuantity?.value, c.valueQuantity?.code])).toEqual([['8480-6', 120, 'mm[Hg]'], ['8462-4', 60, 'mm[Hg]']]);
  });

  it('a sampling FiO2 beside the ventilator\'s, a high-flow total gas flow uncoded, tco2 as total CO2', () => {
    const list = observations('21-sampling-fio2');
    expectObservations(list.filter((o) => /fio2|flow|serum/.test(o.id)), [
      ['obs-0-fio2', ...FIO2, 0.45, '1', '2030-01-01T07:00:00Z'],
      ['obs-0-fio2-vent', ...FIO2_VENT, 0.5, '1', '2030-01-01T07:00:00Z'],
      ['obs-1-fio2', ...FIO2, 0.28, '1', '2030-01-01T09:00:00Z'],
      ['obs-2-o2-flow', null, null, 50, 'L/min', '2030-01-01T11:00:00Z'],
      ['obs-2-fio2', ...FIO2, 0.6, '1', '2030-01-01T11:00:00Z'],
      ['obs-2-hco3-serum', '2028-9', 'Carbon dioxide, total [Moles/volume] in Serum or Plasma', 25, 'mmol/L', '2030-01-01T11:00:00Z'],
    ], '21');
    const b = bundle('21-sampling-fio2');
    const url = (id: string) => observationEntries(b).find((e) => e.resource.id === id)!.fullUrl;
    // The P/F used the sampling FiO2 (0.45), and says so.
    expect(observationEntries(b).find((e) => e.resource.id === 'obs-0-pf-ratio')!.resource.derivedFrom).toEqual([{ reference: url('obs-0-pao2') }, { reference: url('obs-0-fio2') }]);
  });

  it('cardiac output and an inspiratory flow setting; a measured mean airway pressure', () => {
    const t = '2030-01-02T14:00:00Z';
    expectObservations(observations('22-resistance-delivery').filter((o) => /cardiac|insp-flow|mean-airway|sao2/.test(o.id)), [
      ['obs-0-cardiac-output', '8741-1', 'Left ventricular Cardiac output', 5.5, 'L/min', t],
      ['obs-0-insp-flow', '76275-7', 'Inspiratory flow setting Ventilator', 60, 'L/min', t],
      ['obs-0-mean-airway-pressure', '76530-5', 'Mean pressure Respiratory system airway --on ventilator', 16, 'cm[H2O]', t],
      ['obs-0-sao2', '2708-6', 'Oxygen saturation in Arterial blood', 91, '%', t],
    ], '22');
  });

  it('every Observation\'s value is the cell of its field in the CSV row of its timepoint', () => {
    for (const name of NAMES) {
      const { path, result } = note(name);
      const rows = timepointRows(path, result, plain);
      const columns = exportColumns();
      for (const o of observations(name)) {
        const m = /^obs-(\d+)-([a-z0-9-]+)$/.exec(o.id);
        if (!m || !o.valueQuantity) continue;
        const field = m[2]!.replace(/-/g, '_');
        const column = columns.find((c) => c.kind === 'field' && c.source === field && c.section === null && c.part === null);
        if (!column) continue; // a field stated in a second section (`-vbg`, `-vent`), or a derived value
        expect(rows[Number(m[1])]![column.name], `${name} ${o.id}`).toBe(o.valueQuantity.value);
      }
    }
  });
});

/**
 * A researcher reads a column's description (README's table of columns) to know how to recompute
 * it. Where the cell is not what the description's formula gives from the other columns, the
 * description must say why.
 */
describe('column descriptions say how the cells were worked out', () => {
  const description = (name: string): string => exportColumns().find((c) => c.name === name)!.description;
  const row = timepointRows('23.pneu', note('23-kpa-etco2-vbg').result, plain)[0]!;

  it('the A–a gradient shown as 0, and a/A as 1, where the PaO2 is above the simplified equation\'s PAO2', () => {
    // 97.2257 − 99.0081 = −1.78 from the columns, yet the cell is 0 (and PaO2 ÷ PAO2 = 1.018, the cell 1)
    expect((row.pao2_alveolar_mmHg as number) - (row.pao2_mmHg as number)).toBeLessThan(-1.7);
    expect(row.aa_gradient_mmHg).toBe(0);
    expect(row.a_to_A_ratio).toBe(1);
    expect(description('aa_gradient_mmHg')).toMatch(/{PAO2} − {PaO2}.*shown as 0 where the PaO2 is above/);
    expect(description('a_to_A_ratio')).toMatch(/{PaO2} ÷ {PAO2}.*shown as 1 where the PaO2 is above/);
    // and empty where it is above even the full equation's (PN401)
    expect(description('aa_gradient_mmHg')).toContain('PN401');
    expect(description('a_to_A_ratio')).toContain('PN401');
  });

  it('the S/F ratio at an SpO2 above 97 %, given with a note the table loses, and the saturation index, left out there', () => {
    // Rice TW et al., Chest 2007;132:410–417: S/F tracks P/F where SpO2 is 97 % or less; PALICC 2015: OSI at SpO2 ≤ 97 %.
    const high = timepointRows('x.pneu', checkNote('patient age 40 y\n@ day 1 08:00\nvent mode VC, fio2 0.5, peep 5, map 12\nvitals spo2 99 %'), plain)[0]!;
    expect(high.sf_ratio).toBe(99 / 0.5); // 198, given
    expect(high.oxygen_saturation_index).toBeNull(); // (0.5 × 12 × 100) ÷ 99 = 6.06, not given
    expect(description('sf_ratio')).toMatch(/above 97 %.*`spo2_pct`/);
    expect(description('oxygen_saturation_index')).toMatch(/empty where the SpO2 is above 97 %/);
  });

  it('the ends of an expected range give their formula, and the width a PaCO2 written in kPa adds', () => {
    // 24 + (72.0059 − 40) ÷ 10 − 2 = 25.2006 from the PaCO2 column; the cell is 25.1631, from 9.55 kPa
    const kpa = timepointRows('01.pneu', note('01-kpa-shorthand').result, plain)[0]!;
    expect(24 + ((kpa.paco2_mmHg as number) - 40) / 10 - 2 - (kpa.hco3_expected_acute_low_mmol_L as number)).toBeGreaterThan(0.03);
    for (const chronicity of ['acute', 'chronic']) {
      for (const end of ['low', 'high']) {
        const text = description(`hco3_expected_${chronicity}_${end}_mmol_L`);
        expect(text, `${chronicity} ${end}`).toContain('24 + k × ({PaCO2} − 40) ÷ 10');
        expect(text, `${chronicity} ${end}`).toContain(end === 'low' ? '− 2' : '+ 2');
        expect(text, `${chronicity} ${end}`).toMatch(/written in kPa/);
      }
    }
    expect(description('hco3_expected_acute_low_mmol_L')).toContain('k = 1');
    expect(description('hco3_expected_chronic_high_mmol_L')).toContain('k = 3.5 to 5');
    expect(description('paco2_expected_low_mmHg')).toContain('1.5 × {HCO3} + 8 − 2');
    expect(description('paco2_expected_high_mmHg')).toContain('40 + 0.7 × ({HCO3} − 24) + 2');
  });
});
