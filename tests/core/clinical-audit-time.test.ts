// A clinician's second audit: what Pneumark works out across timepoints and settings. Invented
// notes (invented patients, no places or times of anyone real), several timepoints each, every value
// worked out by hand beside its case from the formulas and conventions of ../shared/REFERENCES.md
// and the spec (grammar/README.md: values in force, carry-forward, times, units lines). The first
// audit (clinical-audit.test.ts) checked single timepoints; this one checks FiO2 and PEEP carried
// and changed, devices changed, the place changed mid-note, kPa and mixed-unit notes, NIV, CPAP,
// HFOV and pressure-control lines, and measured against set rates.
//
// Shared conventions (REFERENCES.md): PiO2 = FiO2 × (PB − 47) (common practice); PAO2 = PiO2 −
// PaCO2 / 0.8 (simplified alveolar gas equation; Fenn, Rahn & Otis 1946 and Riley & Cournand 1949,
// from memory); P/F = PaO2 / FiO2, Berlin bands and P/F × PB/760 above 1,000 m (ARDS Definition Task
// Force, JAMA 2012;307:2526–2533); PB by West's model atmosphere, exp(6.63268 − 0.1112 h − 0.00149 h²)
// (West JB, J Appl Physiol 1996;81:1850–1854, its equation read in a reproduction); 1 kPa = 7.50062 mmHg (the definitions of
// the units); PBW male 50 + 0.91 × (height − 152.4), female 45.5 + 0.91 × (height − 152.4) (ARDS
// Network, NEJM 2000;342:1301–1308); VE = VT × RR, compliance VT / (P − PEEP) (common practice, no
// source); ventilatory ratio VE × PaCO2 / (PBW × 100 × 37.5) (Sinha P et al., AJRCCM 2019;199:333–341);
// OI = FiO2 × MAP × 100 / PaO2 (Ortiz et al. 1987; the form read in table 1 of BJA Education 2022, PMC9217163); ROX = SpO2 / FiO2 / RR (Roca O et al.,
// AJRCCM 2019;199:1368–1376).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import type { InterpretationTopic } from '../../server/src/core/derive/model';
import { derivation } from '../derive/helpers';

const KPA = 1000 / 133.322387415; // mmHg per kPa, 7.500617
const westPb = (km: number) => Math.exp(6.63268 - 0.1112 * km - 0.00149 * km * km);
const pbwMale = (cm: number) => 50 + 0.91 * (cm - 152.4);
const pbwFemale = (cm: number) => 45.5 + 0.91 * (cm - 152.4);

interface TimeCase {
  readonly name: string;
  /** The published source (or "common practice", "from memory") of what the case checks. */
  readonly source: string;
  readonly note: string;
  /** The timepoint checked (0-based). */
  readonly timepoint: number;
  /** Derived value id → [hand-computed value, decimals it must agree to]. */
  readonly values?: Readonly<Record<string, readonly [number, number]>>;
  /** Derived values that must not be worked out here. */
  readonly absent?: readonly string[];
  /** Reading topic → a part of its text that must be there. */
  readonly readings?: Partial<Record<InterpretationTopic, string>>;
  /** A part of what is asked for (missing values) that must be there. */
  readonly asks?: string;
  /** Check codes that must fire at this timepoint's lines, and codes that must not fire in the note. */
  readonly fires?: readonly string[];
  readonly silent?: readonly string[];
  /** [day, minutes since day 1 00:00] of the timepoint (null where unknown). */
  readonly time?: readonly [number | null, number | null];
}

const VENTED = 'patient age 60 y, sex male, height 175 cm\n@ day 1 08:00\noxygen mask 8 L/min\nabg 7.40/40/70/24\n@ 09:00\noxygen fio2 0.5\nabg 7.40/40/80/24\n@ 10:00\nvent mode VC, vt 450, rate 14, peep 8, fio2 0.6\nabg 7.38/42/90/24\n@ +2h30\nvent peep 12\nabg 7.36/45/100/25\n@ day 3 08:00\nabg 7.35/46/110/25';
const PLACES = 'patient age 50 y, weight 80 kg\nplace altitude 0 m\n@ day 1 08:00\noxygen room air\nabg 7.42/38/90/24\n@ 12:00\nplace altitude 3000 m\nabg 7.46/32/55/22.5\n@ 18:00\nplace barometric 760 mmHg\noxygen cannula 2 L/min\nabg 7.44/36/85/24\n@ 20:00\noxygen room air\nabg 7.44/36/80/24';
const DESCENT = 'patient age 30 y\nplace altitude 4000 m\n@ day 1 08:00\noxygen room air\nabg 7.48/28/48/20.5\n@ day 2 08:00\nplace barometric 700 mmHg\nabg 7.44/34/75/23\n@ day 2 09:00\nplace altitude 1000 m\noxygen fio2 0.3\nabg 7.44/34/75/23';
const KPA_NOTE = 'patient age 64 y, sex female, height 160 cm\nunits gas kPa\n@ day 1 08:00\noxygen venturi 0.4\nabg ph 7.30, pco2 6.7, po2 8.0, hco3 24\n@ 14:00\nabg ph 7.28, pco2 7.5, po2 7.9, hco3 26\n@ 16:00\nunits gas mmHg\nabg 7.30/52/62/25\n@ 18:00\nabg ph 7.30, pco2 6.7 kPa, po2 60, hco3 24';
const MODES = 'patient age 45 y, sex male, height 180 cm\n@ day 1 08:00\nvent mode VC, vt 480, rate 16, peep 10, fio2 0.6, flow 60\nvent plateau 26, peak 32\nvitals rr 20\nabg 7.32/48/70/24\n@ 10:00\nvent mode PC, pinsp 18, rate 18\nvent peak 28, vt 500\nabg 7.34/46/72/24\n@ 12:00\nvent mode HFOV, rate 5 Hz, mpaw 25, amplitude 60, fio2 0.8\nabg 7.30/55/65/26\n@ 14:00\nabg 7.31/53/70/26\n@ 16:00\nvent mode VC, vt 400, rate 20, peep 12\nvent plateau 28\nabg 7.33/50/75/26';
const SUPPORT = 'patient age 72 y, sex female, height 158 cm, weight 60 kg\n@ 22:00\noxygen niv ipap 20, epap 8, fio2 0.5\nvitals rr 24\nvent vt 420, plateau 18\nabg 7.25/70/60/30\n@ 01:30\nvent mode VC, vt 380, rate 18, peep 8\nabg 7.30/60/70/29\n@ +1d\noxygen cpap 10, fio2 0.4\nvent vt 400, peak 18\nvitals rr 18\nabg 7.36/52/75/29';
const HIGH_FLOW = 'patient age 55 y, sex male, height 170 cm\nplace altitude 2500 m\n@ day 1 06:00\noxygen hfnc 50 L/min, fio2 0.6\nvitals spo2 92, rr 30\n@ +2h\nvitals spo2 94, rr 24\n@ +10h\nvitals spo2 90, rr 28\nabg 7.45/33/58/22.5';
const MEASURED = 'patient age 50 y, sex female, height 165 cm\nunits gas kPa\n@ day 1 08:00\nvent mode VC, vt 450, rate 14, peep 8, fio2 0.4\nvent ve 9.5, etco2 4.5, plateau 22, peak 30\nvitals rr 20\nabg 7.38/6.0/11/26\n@ +4h\nvent mode PS, ps 10\nvent vt 420\nvitals rr 24\nabg 7.40/5.5/10.5/25';
const REINTUBATED = 'patient age 60 y, sex male, height 175 cm\n@ day 1 08:00\nvent mode VC, vt 500, rate 16, peep 10, fio2 0.5\nabg 7.40/40/90/24\n@ day 2 08:00\noxygen cannula 2 L/min\nabg 7.40/40/70/24\n@ day 3 08:00\nvent peep 5, fio2 0.4\nabg 7.35/45/80/24';

const CASES: readonly TimeCase[] = [
  {
    name: 'an oxygen line with an FiO2 and no device replaces a mask: the gas after it uses 0.5',
    source: 'PiO2 and the simplified alveolar gas equation (REFERENCES.md); P/F (ARDS Definition Task Force 2012)',
    note: VENTED,
    timepoint: 1,
    // 0.5 × 713 = 356.5; 356.5 − 40/0.8 = 306.5; 306.5 − 80 = 226.5; 80/0.5 = 160
    values: { pio2: [356.5, 9], pao2_alveolar: [306.5, 9], aa_gradient: [226.5, 9], pf_ratio: [160, 9] },
    absent: ['fio2_estimated'],
  },
  {
    name: 'the mask before it gives only an estimate: no P/F or A–a on an estimated FiO2',
    source: 'FiO2 of a low-flow device only an estimate, never used for P/F (REFERENCES.md, common practice, no source)',
    note: VENTED,
    timepoint: 0,
    absent: ['pf_ratio', 'aa_gradient', 'pio2'],
    asks: "add fio2 (a mask's FiO2 is only an estimate)",
  },
  {
    name: 'a vent line ends the oxygen line: FiO2 0.6 and PEEP 8 from it, VE from the set rate, VR at PaCO2 42',
    source: 'VE = VT × RR (common practice); PBW (ARDS Network 2000); ventilatory ratio (Sinha et al. 2019); Berlin bands (ARDS Definition Task Force 2012)',
    note: VENTED,
    timepoint: 2,
    values: {
      pio2: [0.6 * 713, 9], // 427.8
      pf_ratio: [150, 9],
      minute_ventilation: [6.3, 9], // 450 × 14 / 1000
      predicted_body_weight: [pbwMale(175), 9], // 70.566
      ventilatory_ratio: [(6300 * 42) / (pbwMale(175) * 3750), 9], // 0.9999
    },
    readings: { 'oxygenation-band': 'P/F 150 mmHg with PEEP 8 cmH2O: consistent with the 100–200 mmHg oxygenation band' },
  },
  {
    name: 'PEEP raised 2 h 30 later: the FiO2 carried from the vent line is named, the new PEEP is used',
    source: 'P/F and Berlin bands (ARDS Definition Task Force 2012); alveolar gas equation (REFERENCES.md)',
    note: VENTED,
    timepoint: 3,
    // 427.8 − 45/0.8 = 371.55; 371.55 − 100 = 271.55; 100/0.6 = 166.67; VR 6300 × 45 / (70.566 × 3750) = 1.0713
    values: { pao2_alveolar: [371.55, 9], aa_gradient: [271.55, 9], pf_ratio: [100 / 0.6, 9], ventilatory_ratio: [(6300 * 45) / (pbwMale(175) * 3750), 9] },
    // VE rests only on carried settings here: reported where one of its main inputs is stated (spec).
    absent: ['minute_ventilation'],
    readings: { 'oxygenation-band': 'P/F 167 mmHg with PEEP 12 cmH2O (FiO2 carried from line 9)' },
    time: [1, 12 * 60 + 30],
  },
  {
    name: 'two days later nothing restated: FiO2 and PEEP carried, each named by its line and the day and time it was written',
    source: 'P/F (ARDS Definition Task Force 2012); chronic respiratory response +3.5 to +5 per 10 mmHg ± 2 (Narins & Emmett 1980; Adrogué & Madias 2010, from memory)',
    note: VENTED,
    timepoint: 4,
    values: { pf_ratio: [110 / 0.6, 9] }, // 183.3
    readings: { 'oxygenation-band': 'P/F 183 mmHg with PEEP 12 cmH2O (FiO2 carried from day 1 10:00, line 9; PEEP carried from day 1 12:30, line 12)' },
    time: [3, 2 * 1440 + 8 * 60],
  },
  {
    name: 'ascent to 3,000 m mid-note: PB from West, PiO2 and A–a follow it, P/F adjusted (above 1,000 m)',
    source: "West's model atmosphere (West 1996, its equation read in a reproduction); P/F × PB/760 above 1,000 m (ARDS Definition Task Force 2012)",
    note: PLACES,
    timepoint: 1,
    values: {
      barometric: [westPb(3), 9], // 536.9
      pio2: [0.21 * (westPb(3) - 47), 9], // 102.9
      pao2_alveolar: [0.21 * (westPb(3) - 47) - 40, 9], // 62.9
      aa_gradient: [0.21 * (westPb(3) - 47) - 40 - 55, 9], // 7.9
      pf_ratio_altitude_adjusted: [((55 / 0.21) * westPb(3)) / 760, 9], // 185.0
    },
    readings: { 'hypoxaemia-mechanism': 'Consistent with hypoxaemia from low inspired oxygen (PiO2 103 mmHg)' },
  },
  {
    name: 'back at 760 mmHg on a cannula: only an estimate, 0.21 + 0.04 × 2',
    source: 'cannula FiO2 estimate 0.21 + 0.04 per L/min (REFERENCES.md, common practice, no source)',
    note: PLACES,
    timepoint: 2,
    values: { fio2_estimated: [0.29, 9] },
    absent: ['pf_ratio', 'aa_gradient'],
  },
  {
    name: 'then room air: 0.21 used again, PB 760 carried from the timepoint line',
    source: 'PiO2 and the alveolar gas equation (REFERENCES.md)',
    note: PLACES,
    timepoint: 3,
    // 0.21 × 713 = 149.73; 149.73 − 36/0.8 = 104.73; 104.73 − 80 = 24.73; 80 / 0.21 = 380.95
    values: { pio2: [149.73, 9], aa_gradient: [24.73, 9], pf_ratio: [80 / 0.21, 9] },
    absent: ['pf_ratio_altitude_adjusted'],
  },
  {
    name: 'descent from 4,000 m to a stated 700 mmHg: PiO2 follows it, P/F not adjusted (700 > 678.6 mmHg)',
    source: 'P/F × PB/760 only above 1,000 m (ARDS Definition Task Force 2012); PiO2 (REFERENCES.md)',
    note: DESCENT,
    timepoint: 1,
    // 0.21 × 653 = 137.13; 137.13 − 34/0.8 = 94.63; 94.63 − 75 = 19.63
    values: { barometric: [700, 9], pio2: [137.13, 9], aa_gradient: [19.63, 9] },
    absent: ['pf_ratio_altitude_adjusted'],
  },
  {
    name: 'at 4,000 m on air: PB 475 mmHg, adjusted P/F 143',
    source: "West's model atmosphere (West 1996, its equation read in a reproduction); P/F × PB/760 (ARDS Definition Task Force 2012)",
    note: DESCENT,
    timepoint: 0,
    values: { barometric: [westPb(4), 9], pio2: [0.21 * (westPb(4) - 47), 9], pf_ratio_altitude_adjusted: [((48 / 0.21) * westPb(4)) / 760, 9] },
  },
  {
    name: 'at exactly 1,000 m: PB 678.6 mmHg, P/F used as it is',
    source: 'P/F × PB/760 only above 1,000 m (ARDS Definition Task Force 2012, read in its table footnote)',
    note: DESCENT,
    timepoint: 2,
    values: { barometric: [westPb(1), 9], pio2: [0.3 * (westPb(1) - 47), 9], pf_ratio: [250, 9] },
    absent: ['pf_ratio_altitude_adjusted'],
  },
  {
    name: 'kPa note, Venturi 40 %: PaO2 8.0 kPa and PaCO2 6.7 kPa at the thresholds, A–a and P/F in kPa',
    source: '1 kPa = 7.50062 mmHg; hypoxaemia < 8 kPa, hypercapnia > 50 mmHg, compared at the resolution written (REFERENCES.md; spec)',
    note: KPA_NOTE,
    timepoint: 0,
    values: {
      pao2_alveolar: [0.4 * 713 - (6.7 * KPA) / 0.8, 6], // 222.38 mmHg = 29.6 kPa
      aa_gradient: [0.4 * 713 - (6.7 * KPA) / 0.8 - 8 * KPA, 6], // 162.38 mmHg = 21.6 kPa
      pf_ratio: [(8 * KPA) / 0.4, 6], // 150.01 mmHg = 20.0 kPa
    },
    readings: {
      oxygenation: 'PaO2 8.0 kPa (60 mmHg) on FiO2 0.40 (P/F 20.0 kPa, 150 mmHg)',
      ventilation: 'at the hypercapnia threshold of 6.7 kPa, not above it',
    },
  },
  {
    name: 'kPa note, Venturi carried 6 h: 7.9 kPa below 8.0, the carried FiO2 named',
    source: '1 kPa = 7.50062 mmHg; hypoxaemia < 8 kPa (REFERENCES.md, common practice); acute response +1 per 10 mmHg ± 2 (Narins & Emmett 1980, from memory)',
    note: KPA_NOTE,
    timepoint: 1,
    values: {
      aa_gradient: [0.4 * 713 - (7.5 * KPA) / 0.8 - 7.9 * KPA, 6], // 155.63 mmHg = 20.7 kPa
      pf_ratio: [(7.9 * KPA) / 0.4, 6], // 148.14 mmHg = 19.8 kPa
      hco3_expected_acute: [24 + (7.5 * KPA - 40) / 10, 6], // 25.63 ± 2
    },
    readings: {
      oxygenation: 'PaO2 7.9 kPa (59 mmHg): consistent with moderate hypoxaemia (below 8.0 kPa) despite FiO2 0.40 (carried from line 4).',
      'hypoxaemia-mechanism': 'The PiO2 uses FiO2 0.40 (carried from line 4).',
    },
  },
  {
    name: 'a `units gas mmHg` line mid-note: bare pressures in mmHg from its line on, shown in mmHg',
    source: 'P/F (ARDS Definition Task Force 2012); hypercapnia > 50 mmHg (common practice, no source)',
    note: KPA_NOTE,
    timepoint: 2,
    values: { pf_ratio: [62 / 0.4, 9], aa_gradient: [0.4 * 713 - 52 / 0.8 - 62, 9] }, // 155; 158.2
    readings: { ventilation: 'PaCO2 52 mmHg: consistent with hypercapnia (above 50 mmHg)' },
  },
  {
    name: 'a PCO2 written in kPa in a gas of an mmHg timepoint: 6.7 kPa is read as 50.25 mmHg and judged as 50',
    source: '1 kPa = 7.50062 mmHg; threshold compared at the resolution written (spec; hypercapnia > 50 mmHg, common practice, no source)',
    note: KPA_NOTE,
    timepoint: 3,
    values: { pao2_alveolar: [0.4 * 713 - (6.7 * KPA) / 0.8, 6], pf_ratio: [150, 9] },
    readings: { ventilation: 'PaCO2 50 mmHg: consistent with a mildly raised PaCO2, at the hypercapnia threshold of 50 mmHg, not above it.' },
  },
  {
    name: 'VC with a measured rate above the set one: VE, mechanical power and VR take the measured rate',
    source: 'VE = VT × RR; Gattinoni et al., Intensive Care Med 2016 (simplified power); Giosa et al., ICM Exp 2019 (surrogate); Sinha et al. 2019',
    note: MODES,
    timepoint: 0,
    values: {
      minute_ventilation: [9.6, 9], // 480 × 20
      driving_pressure: [16, 9],
      compliance_static: [30, 9], // 480 / 16
      compliance_dynamic: [480 / 22, 9],
      airway_resistance: [6, 9], // (32 − 26) / (60 / 60)
      mechanical_power: [0.098 * 20 * 0.48 * (32 - 16 / 2), 9], // 22.58
      mechanical_power_surrogate: [(9.6 * (32 + 10 + 60 / 6)) / 20, 9], // 24.96
      ventilatory_ratio: [(9600 * 48) / (pbwMale(180) * 3750), 9], // 1.636
    },
  },
  {
    name: 'a change to PC: only PEEP and FiO2 carry; the delivered VT and peak give Cdyn, no power (not volume control)',
    source: 'compliance VT / (Ppeak − PEEP) (common practice, no source); simplified power only for volume control (Becher et al., Intensive Care Med 2019)',
    note: MODES,
    timepoint: 1,
    values: { compliance_dynamic: [500 / 18, 9], minute_ventilation: [9, 9], pf_ratio: [120, 9] },
    absent: ['mechanical_power', 'driving_pressure'],
    readings: { 'oxygenation-band': 'P/F 120 mmHg with PEEP 10 cmH2O (FiO2 and PEEP carried from line 3)' },
  },
  {
    name: 'HFOV: OI from the set mean airway pressure, no VE or compliance',
    source: 'OI = FiO2 × MAP × 100 / PaO2 (Ortiz et al. 1987; PALICC 2015; the form read in table 1 of BJA Education 2022, PMC9217163)',
    note: MODES,
    timepoint: 2,
    values: { oxygenation_index: [(0.8 * 25 * 100) / 65, 9], pf_ratio: [65 / 0.8, 9] }, // 30.77; 81.25
    absent: ['minute_ventilation', 'compliance_dynamic', 'driving_pressure'],
  },
  {
    name: 'HFOV two hours on: the mean airway pressure is a setting there, carried into the OI',
    source: 'OI = FiO2 × MAP × 100 / PaO2 (Ortiz et al. 1987; PALICC 2015; the form read in table 1 of BJA Education 2022, PMC9217163)',
    note: MODES,
    timepoint: 3,
    values: { oxygenation_index: [(0.8 * 25 * 100) / 70, 9] }, // 28.57
  },
  {
    name: 'back to VC from HFOV: only the FiO2 carries; P/F 93.75 is in the ≤ 100 band',
    source: 'Berlin bands (ARDS Definition Task Force 2012); driving pressure Pplat − PEEP (Amato et al., NEJM 2015)',
    note: MODES,
    timepoint: 4,
    values: { pf_ratio: [75 / 0.8, 9], driving_pressure: [16, 9], compliance_static: [25, 9], minute_ventilation: [8, 9] },
    absent: ['oxygenation_index'],
    readings: { 'oxygenation-band': 'the ≤ 100 mmHg oxygenation band of the Berlin definition' },
  },
  {
    name: 'NIV with an exhaled VT and a plateau: EPAP is the end-expiratory pressure, VE from the measured rate',
    source: 'driving pressure and compliance (Amato et al., NEJM 2015; common practice); PBW female (ARDS Network 2000); Berlin mild band on noninvasive support (ARDS Definition Task Force 2012)',
    note: SUPPORT,
    timepoint: 0,
    values: {
      driving_pressure: [10, 9], // 18 − 8
      compliance_static: [42, 9], // 420 / 10
      minute_ventilation: [420 * 24 / 1000, 9], // 10.08
      vt_per_kg_pbw: [420 / pbwFemale(158), 9], // 8.30
      ventilatory_ratio: [(10080 * 70) / (pbwFemale(158) * 3750), 9], // 3.72
    },
    absent: ['mechanical_power'],
    readings: { 'oxygenation-band': 'P/F 120 mmHg with EPAP 8 cmH2O: below the 200–300 mmHg oxygenation band' },
    // VT/PBW 8.30 is shown, but under NIV the volume is the patient's own breath: the 8 mL/kg limit of
    // a ventilator's breath (ARDS Network 2000) is not applied.
    silent: ['PN403'],
  },
  {
    name: 'a vent line with settings ends NIV: the NIV line\'s FiO2 is not the ventilator\'s, and is asked for on the vent line',
    source: 'format rule (grammar/README.md: a vent line with a setting ends oxygen-line therapy)',
    note: SUPPORT,
    timepoint: 1,
    values: { minute_ventilation: [380 * 18 / 1000, 9] },
    absent: ['pf_ratio', 'pio2'],
    asks: 'add fio2 (on the vent line)',
    time: [2, 1440 + 90],
  },
  {
    name: 'CPAP a day later with an exhaled VT and a peak: no Cdyn, as the patient\'s own effort moves the volume',
    source: 'compliance VT / (Ppeak − PEEP) holds for breaths the ventilator alone delivers (respiratory mechanics, common practice, no source)',
    note: SUPPORT,
    timepoint: 2,
    values: { minute_ventilation: [7.2, 9], pf_ratio: [75 / 0.4, 9] },
    absent: ['compliance_dynamic'],
    time: [3, 2 * 1440 + 90],
  },
  {
    name: 'high flow at 2,500 m: ROX at each timepoint from the carried FiO2',
    source: 'ROX = SpO2 / FiO2 / RR (Roca O et al., AJRCCM 2019)',
    note: HIGH_FLOW,
    timepoint: 1,
    values: { rox_index: [94 / 0.6 / 24, 9], sf_ratio: [94 / 0.6, 9] }, // 6.53; 156.7
  },
  {
    name: 'high flow ten hours on at 2,500 m: PiO2 at West\'s 570 mmHg, P/F adjusted, FiO2 carried',
    source: "West's model atmosphere (West 1996, its equation read in a reproduction); P/F × PB/760 above 1,000 m (ARDS Definition Task Force 2012)",
    note: HIGH_FLOW,
    timepoint: 2,
    values: {
      pio2: [0.6 * (westPb(2.5) - 47), 9], // 313.7
      aa_gradient: [0.6 * (westPb(2.5) - 47) - 33 / 0.8 - 58, 9], // 214.5
      pf_ratio_altitude_adjusted: [((58 / 0.6) * westPb(2.5)) / 760, 9], // 72.5
      rox_index: [90 / 0.6 / 28, 9],
    },
    readings: { oxygenation: 'despite FiO2 0.60 (carried from line 4)' },
  },
  {
    name: 'kPa ventilator note: a measured minute volume goes into the VR, the computed VE stays VT × RR',
    source: 'ventilatory ratio with measured minute ventilation (Sinha et al., Br J Anaesth 2009; AJRCCM 2019); 1 kPa = 7.50062 mmHg',
    note: MEASURED,
    timepoint: 0,
    values: {
      minute_ventilation: [9, 9], // 450 × 20
      ventilatory_ratio: [(9500 * 6 * KPA) / (pbwFemale(165) * 3750), 6], // 2.00
      paco2_etco2_difference: [1.5 * KPA, 6], // 11.25 mmHg = 1.5 kPa
      mechanical_power: [0.098 * 20 * 0.45 * (30 - 14 / 2), 9], // 20.29
    },
  },
  {
    name: 'a change to PS: VE from the exhaled VT and the measured rate; PEEP and FiO2 carried',
    source: 'VE = VT × RR with the measured rate in spontaneous modes (spec; common practice, no source)',
    note: MEASURED,
    timepoint: 1,
    values: { minute_ventilation: [420 * 24 / 1000, 9], pf_ratio: [(10.5 * KPA) / 0.4, 6] },
    readings: { 'oxygenation-band': 'P/F 26.3 kPa (197 mmHg) with PEEP 8 cmH2O (FiO2 and PEEP carried from line 4)' },
  },
  {
    name: 'reintubated after a day on a cannula: the old VT and rate are not brought back',
    source: 'format rule (grammar/README.md: an oxygen line ends ventilation); P/F (ARDS Definition Task Force 2012)',
    note: REINTUBATED,
    timepoint: 2,
    values: { pf_ratio: [200, 9] },
    absent: ['minute_ventilation', 'vt_per_kg_pbw'],
    readings: { 'oxygenation-band': 'P/F 200 mmHg with PEEP 5 cmH2O: consistent with the 100–200 mmHg oxygenation band' },
  },
];

describe("a clinician's second audit: values across timepoints and settings, worked out by hand", () => {
  for (const c of CASES) {
    it(`${c.name} (${c.source})`, () => {
      const d = derivation(c.note, {}, c.timepoint);
      for (const [id, [expected, digits]] of Object.entries(c.values ?? {})) {
        const value = d.derived.find((x) => x.id === id)?.value;
        expect(value, `${id} derived`).toBeTypeOf('number');
        expect(value, id).toBeCloseTo(expected, digits);
      }
      for (const id of c.absent ?? []) expect(d.derived.some((x) => x.id === id), `${id} absent`).toBe(false);
      const texts = new Map<InterpretationTopic, string>();
      for (const r of d.interpretations) texts.set(r.topic, `${texts.get(r.topic) ?? ''} | ${r.text}`);
      for (const [topic, part] of Object.entries(c.readings ?? {})) expect(texts.get(topic as InterpretationTopic) ?? '', topic).toContain(part);
      if (c.asks) expect(d.missing.map((m) => m.message).join(' | ')).toContain(c.asks);
      const result = checkNote(c.note);
      const tp = result.analysis.timeline.timepoints[c.timepoint]!;
      const codes = new Set(result.findings.filter((f) => f.range.start.line >= tp.startLine && f.range.start.line <= tp.endLine).map((f) => f.code));
      for (const code of c.fires ?? []) expect(codes.has(code), `${code} fires`).toBe(true);
      for (const code of c.silent ?? []) expect(result.findings.some((f) => f.code === code), `${code} silent`).toBe(false);
      if (c.time) expect([tp.time.day, tp.time.minutes]).toEqual(c.time);
    });
  }

  it('the gas above the change of FiO2 at its timepoint is read with the new FiO2 and said (PN324): 70 / 0.6 = 116.7, not 70 / 0.3 = 233.3 (P/F, ARDS Definition Task Force 2012)', () => {
    const text = 'patient age 50 y\n@ 08:00\noxygen fio2 0.3\n@ 09:00\nabg 7.40/40/70/24\noxygen fio2 0.6';
    expect(derivation(text).derived.find((x) => x.id === 'pf_ratio')?.value).toBeCloseTo(70 / 0.6, 9);
    expect(checkNote(text).findings.map((f) => f.code)).toContain('PN324');
    // Written with its sampling FiO2, the gas is read on what it was drawn on: 70 / 0.3.
    const sampled = 'patient age 50 y\n@ 08:00\noxygen fio2 0.3\n@ 09:00\nabg 7.40/40/70/24, fio2 0.3\noxygen fio2 0.6';
    expect(derivation(sampled).derived.find((x) => x.id === 'pf_ratio')?.value).toBeCloseTo(70 / 0.3, 9);
    expect(checkNote(sampled).findings.map((f) => f.code)).not.toContain('PN324');
  });

  it('a clock earlier than the timepoint before is the next day (a night passed), and no PN308; `@ day N` earlier is PN308 (spec: times)', () => {
    const result = checkNote('@ 23:00\nvitals hr 80\n@ +2h\nvitals hr 81\n@ 02:00\nvitals hr 82\n@ day 2 01:30\nvitals hr 83\n@ +1d2h30\nvitals hr 84\n@ 03:59\nvitals hr 85');
    const times = result.analysis.timeline.timepoints.map((t) => [t.time.day, t.time.minutes]);
    // 23:00 = 1380; +2h = day 2 01:00 = 1500; 02:00 = 1560; day 2 01:30 = 1530 (back); +1d2h30 = day 3 04:00 = 3120; 03:59 = day 4 = 4559
    expect(times).toEqual([[1, 1380], [2, 1500], [2, 1560], [2, 1530], [3, 3120], [4, 4559]]);
    expect(result.findings.filter((f) => f.code === 'PN308').map((f) => f.range.start.line)).toEqual([6]);
  });
});
