// A clinician's audit of Pneumark's numbers and readings: invented notes (invented patients, no
// places or times of anyone real) across the topics, each value worked out by hand from the
// formula and the source named beside the case (the formulas and conventions of
// ../shared/REFERENCES.md), and compared with what Pneumark derives. Cases kept here are those no
// other test covered as a whole note: sea level and altitude (PB 500 mmHg, 80 kPa, 4,000 m, 5,280 ft),
// the hypoxaemia and hypercapnia thresholds exactly met, type 1 and type 2 failure, acute, chronic
// and mixed acid–base disorders with and without compensation, the anion gap with and without
// albumin, ventilator mechanics, NIV in kPa, FiO2 1.0, oxygen content from an Hb in mmol/L, and the
// settings that change a formula (full alveolar equation, water vapour at body temperature,
// standard atmosphere). Conventions pinned in REFERENCES.md are followed, not re-argued.
//
// Shared conventions used below (REFERENCES.md): PiO2 = FiO2 × (PB − 47) (common practice);
// PAO2 = PiO2 − PaCO2 / 0.8 (simplified alveolar gas equation; Fenn, Rahn & Otis 1946 and Riley &
// Cournand 1949, from memory); 1 kPa = 7.50062 mmHg (the definitions of the units);
// HCO3 = 0.0307 × PaCO2 × 10^(pH − 6.1) (Henderson–Hasselbalch); hypoxaemia PaO2 < 60 mmHg and
// hypercapnia PaCO2 > 50 mmHg (common practice, no source).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import type { InterpretationTopic } from '../../server/src/core/derive/model';
import { inspiredPo2Dry } from '../../server/src/core/physiology';
import type { Settings } from '../../server/src/core/settings';
import { derivation } from '../derive/helpers';

const KPA = 1000 / 133.322387415; // mmHg per kPa, 7.500617 (NIST SP 811: 1 mmHg = 133.322387415 Pa)

interface AuditCase {
  readonly name: string;
  /** The published source (or "common practice", "from memory") of what the case checks. */
  readonly source: string;
  readonly note: string;
  readonly settings?: Partial<Settings>;
  /** Derived value id → [hand-computed value, decimals it must agree to]. */
  readonly values: Readonly<Record<string, readonly [number, number]>>;
  /** Derived value id → a part of one of its notes that must be there. */
  readonly notes?: Readonly<Record<string, string>>;
  /** Reading topic → a part of its text that must be there. */
  readonly readings?: Partial<Record<InterpretationTopic, string>>;
  /** Reading topics that must be absent. */
  readonly noReading?: readonly InterpretationTopic[];
  /** Check codes that must fire, and codes that must not. */
  readonly fires?: readonly string[];
  readonly silent?: readonly string[];
}

const CASES: readonly AuditCase[] = [
  {
    name: 'PB 500 mmHg on air: type 1 failure from low inspired oxygen, A–a normal for age',
    source: 'PiO2 and simplified alveolar gas equation (REFERENCES.md); P/F × PB/760 (ARDS Definition Task Force, JAMA 2012;307:2526–2533); upper normal A–a age/4 + 4 (common practice, no source)',
    note: 'patient age 40 y\nplace barometric 500 mmHg\n@ 08:00\noxygen room air\nabg 7.48/28/52/20.5',
    values: {
      // 0.21 × (500 − 47) = 95.13; 95.13 − 28/0.8 = 60.13; 60.13 − 52 = 8.13
      pio2: [95.13, 6],
      pao2_alveolar: [60.13, 6],
      aa_gradient: [8.13, 6],
      aa_gradient_upper_normal: [14, 6], // 40/4 + 4
      pf_ratio: [52 / 0.21, 6], // 247.6
      pf_ratio_altitude_adjusted: [((52 / 0.21) * 500) / 760, 6], // 162.9
      hco3_calculated: [0.0307 * 28 * 10 ** (7.48 - 6.1), 6], // 20.62
    },
    readings: {
      'respiratory-failure': 'type 1 (hypoxaemic) respiratory failure: hypoxaemia with normal or low PaCO2',
      'hypoxaemia-mechanism': 'Consistent with hypoxaemia from low inspired oxygen (PiO2 95 mmHg). The A–a gradient (8 mmHg) is within the age-based normal of 14 mmHg.',
    },
  },
  {
    name: 'PB given in kPa (80 kPa) in a kPa note; PaO2 8.0 kPa is on the 60 mmHg threshold, not below it',
    source: '1 kPa = 7.50062 mmHg; hypoxaemia PaO2 < 60 mmHg (8 kPa), common practice, no source (REFERENCES.md)',
    note: 'patient age 50 y\nplace barometric 80 kPa\nunits gas kPa\n@ 08:00\noxygen room air\nabg ph 7.45, pco2 4.3, po2 8.0, hco3 22',
    values: {
      barometric: [80 * KPA, 6], // 600.05 mmHg
      pio2: [0.21 * (80 * KPA - 47), 6], // 116.14
      pao2_alveolar: [0.21 * (80 * KPA - 47) - (4.3 * KPA) / 0.8, 6], // 75.82
      aa_gradient: [0.21 * (80 * KPA - 47) - (4.3 * KPA) / 0.8 - 8 * KPA, 6], // 15.82
    },
    readings: { oxygenation: 'PaO2 8.0 kPa (60 mmHg): consistent with mildly reduced oxygenation, at the hypoxaemia threshold of 8.0 kPa, not below it.' },
    noReading: ['respiratory-failure', 'hypoxaemia-mechanism'],
  },
  {
    name: 'PaO2 exactly 60 and PaCO2 exactly 50 mmHg on air: neither hypoxaemia nor hypercapnia, no failure reading',
    source: 'hypoxaemia PaO2 < 60 mmHg, hypercapnia PaCO2 > 50 mmHg: common practice, no source (REFERENCES.md); respiratory HCO3 responses, acute +1, chronic +3.5 to +5 per 10 mmHg ± 2 (Narins & Emmett 1980; Adrogué & Madias 2010, from memory)',
    note: 'patient age 70 y\n@ 08:00\noxygen room air\nabg 7.33/50/60/26',
    values: {
      pao2_alveolar: [0.21 * 713 - 50 / 0.8, 6], // 87.23
      aa_gradient: [0.21 * 713 - 62.5 - 60, 6], // 27.23
      hco3_calculated: [0.0307 * 50 * 10 ** (7.33 - 6.1), 6], // 26.07
    },
    readings: {
      oxygenation: 'at the hypoxaemia threshold of 60 mmHg, not below it',
      ventilation: 'PaCO2 50 mmHg: consistent with a mildly raised PaCO2, at the hypercapnia threshold of 50 mmHg, not above it.',
      // acute 24 + 1 ± 2 = 23–27, chronic 24 + 3.5…5 ± 2 = 25.5–31: 26 is in both
      'acid-base': 'within both the acute (23–27 mmol/L) and the chronic (25.5–31.0 mmol/L) range',
    },
    noReading: ['respiratory-failure', 'hypoxaemia-mechanism'],
  },
  {
    name: 'hypoventilation on air: type 2 failure, A–a normal, HCO3 between the acute and chronic ranges',
    source: 'alveolar gas equation (REFERENCES.md); respiratory responses (Narins & Emmett 1980; Adrogué & Madias 2010, from memory)',
    note: 'patient age 70 y\n@ 08:00\noxygen room air\nabg 7.25/70/50/30',
    values: {
      pao2_alveolar: [0.21 * 713 - 70 / 0.8, 6], // 62.23
      aa_gradient: [0.21 * 713 - 87.5 - 50, 6], // 12.23, normal ≤ 21.5
      hco3_calculated: [0.0307 * 70 * 10 ** (7.25 - 6.1), 6], // 30.36
    },
    readings: {
      'respiratory-failure': 'Consistent with type 2 (hypercapnic) respiratory failure: hypoxaemia with hypercapnia (PaO2 50 mmHg, below 60 mmHg; PaCO2 70 mmHg, above 50 mmHg).',
      'hypoxaemia-mechanism': 'Consistent with hypoxaemia from hypoventilation (PaCO2 70 mmHg). The A–a gradient (12 mmHg) is within the age-based normal of 22 mmHg.',
      // acute 24 + 3 ± 2 = 25–29; chronic 24 + 10.5…15 ± 2 = 32.5–41
      'acid-base': 'between the acute and chronic ranges (25–29 mmol/L if acute, 33–41 mmol/L if chronic): evolving, or acute on chronic',
    },
  },
  {
    name: 'chronic respiratory acidosis on a cannula (FiO2 not stated): fully compensated, type 2 with PaO2 held up by oxygen',
    source: 'chronic response +3.5 to +5 mmol/L per 10 mmHg ± 2 (Narins & Emmett 1980; Adrogué & Madias 2010, from memory); cannula FiO2 estimate 0.21 + 0.04 per L/min, not used for P/F (common practice, no source)',
    note: 'patient age 68 y\n@ 08:00\noxygen cannula 1 L/min\nabg 7.36/60/65/33',
    values: {
      fio2_estimated: [0.25, 9],
      hco3_calculated: [0.0307 * 60 * 10 ** (7.36 - 6.1), 6], // 33.52
    },
    readings: {
      'respiratory-failure': 'type 2 (hypercapnic) respiratory failure, with PaO2 held up by supplemental oxygen (PaCO2 60 mmHg, above 50 mmHg; PaO2 65 mmHg with oxygen by cannula, FiO2 not stated)',
      // chronic 24 + 7…10 ± 2 = 29–36
      'acid-base': 'Consistent with a fully compensated chronic respiratory acidosis (pH 7.36, PaCO2 60 mmHg, HCO3 33.0 mmol/L), with HCO3 within the 29–36 mmol/L expected if chronic',
    },
  },
  {
    name: 'metabolic acidosis without respiratory compensation, low albumin: corrected gap and a mixed delta ratio',
    source: "Winters' formula 1.5 × HCO3 + 8 ± 2 (Albert, Dell & Winters 1967, coefficients from memory); AG + 2.5 × (4.0 − albumin) (Figge et al 1998); delta ratio 0.4–0.8 mixed (Rastegar 2007, bands from memory)",
    note: 'patient age 45 y\n@ 08:00\noxygen room air\nabg 7.15/40/90/13.5\nlabs na 138, cl 112, albumin 2.0 g/dL',
    values: {
      anion_gap: [138 - 112 - 13.5, 9], // 12.5
      anion_gap_albumin_corrected: [12.5 + 2.5 * 2, 9], // 17.5
      delta_ratio: [(17.5 - 12) / (24 - 13.5), 9], // 0.524
    },
    readings: {
      // 1.5 × 13.5 + 8 = 28.25 ± 2: 26.25–30.25; PaCO2 40 is above it
      'acid-base': 'Consistent with metabolic acidosis with high and normal anion-gap components (pH 7.15, PaCO2 40 mmHg, HCO3 13.5 mmol/L; anion gap 18 mmol/L corrected for albumin, delta ratio 0.52); PaCO2 40 mmHg is above the expected 26–30 mmHg: consistent with an added respiratory acidosis.',
    },
  },
  {
    name: 'metabolic alkalosis with the expected respiratory response',
    source: 'expected PaCO2 40 + 0.7 × (HCO3 − 24) ± 2 (Berend et al, NEJM 2014;371:1434–1445, the rule read in its reproduction at physician.tw)',
    note: 'patient age 80 y\n@ 08:00\noxygen room air\nabg 7.50/48/85/36.5\nlabs na 136, cl 88',
    values: {
      paco2_expected: [40 + 0.7 * 12.5, 9], // centre 48.75: 46.75–50.75
      anion_gap: [136 - 88 - 36.5, 9], // 11.5, not high
    },
    readings: { 'acid-base': 'Consistent with metabolic alkalosis (pH 7.50, PaCO2 48 mmHg, HCO3 36.5 mmol/L), with the expected respiratory response (PaCO2 within the expected 47–51 mmHg).' },
  },
  {
    name: 'metabolic alkalosis with PaCO2 above 50 on air: hypercapnia without hypoxaemia, and an added respiratory acidosis',
    source: 'Berend et al 2014 (rule read in its reproduction at physician.tw); hypercapnia > 50 mmHg, common practice, no source',
    note: 'patient age 75 y\n@ 08:00\noxygen room air\nabg 7.49/56/68/42\nlabs na 138, cl 84',
    values: { paco2_expected: [40 + 0.7 * 18, 9] }, // 52.6: 50.6–54.6
    readings: {
      'respiratory-failure': 'Consistent with hypercapnia (PaCO2 56 mmHg, above 50 mmHg) without hypoxaemia on air (PaO2 68 mmHg, not below 60 mmHg)',
      'acid-base': 'PaCO2 56 mmHg is above the expected 51–55 mmHg: consistent with an added respiratory acidosis.',
    },
  },
  {
    name: 'high-gap acidosis with a delta ratio above 2: an added metabolic alkalosis',
    source: 'delta ratio > 2 (Rastegar A, JASN 2007;18:2429–2431, bands from memory); Winters 1967',
    note: 'patient age 50 y\n@ 08:00\noxygen room air\nabg 7.30/33/92/16\nlabs na 145, cl 95',
    values: { anion_gap: [34, 9], delta_ratio: [22 / 8, 9], paco2_expected: [1.5 * 16 + 8, 9] },
    readings: { 'acid-base': 'also consistent with an added metabolic alkalosis (delta ratio 2.75, above 2).' },
  },
  {
    name: 'pH 7.45 with PaCO2 20 and a high anion gap: respiratory alkalosis with an added metabolic acidosis, which lowers the HCO3 too, so no timing is read from it',
    source: 'chronic alkalosis −4 to −5 mmol/L per 10 mmHg ± 2, the HCO3 read as the response alone (Narins & Emmett 1980; Adrogué & Madias 2010, from memory); anion gap normal 12 (common practice, no source)',
    note: 'patient age 30 y\n@ 08:00\noxygen room air\nabg 7.45/20/105/13.5\nlabs na 140, cl 102',
    values: { anion_gap: [24.5, 9], delta_ratio: [12.5 / 10.5, 9] },
    readings: { 'acid-base': 'HCO3 13.5 mmol/L does not tell acute from chronic, as the added metabolic acidosis lowers it too (18–22 mmol/L expected if acute, 12–18 mmol/L if chronic); also consistent with an added metabolic acidosis (anion gap 25 mmol/L, above 12 mmol/L).' },
  },
  {
    name: 'mixed metabolic and respiratory alkalosis',
    source: 'reference intervals PaCO2 35–45 mmHg, HCO3 22–26 mmol/L (common practice, no source)',
    note: 'patient age 70 y\n@ 08:00\noxygen room air\nabg 7.60/32/80/31',
    values: { hco3_calculated: [0.0307 * 32 * 10 ** 1.5, 6] }, // 31.07
    readings: { 'acid-base': 'Consistent with a mixed metabolic and respiratory alkalosis (pH 7.60; PaCO2 32 mmHg below 35 mmHg and HCO3 31.0 mmol/L above 26 mmol/L).' },
  },
  {
    name: 'volume control: minute ventilation, PBW, driving pressure, compliances, resistance, mechanical power, ventilatory ratio',
    source: 'PBW 50 + 0.91 × (height − 152.4) (ARDS Network, NEJM 2000;342:1301–1308); ΔP = Pplat − PEEP (Amato et al, NEJM 2015); MP 0.098 × RR × VT × (Ppeak − ½ΔP) (Gattinoni et al, ICM 2016); MP surrogate VE × (Ppeak + PEEP + flow/6) / 20 (Giosa et al, ICM Exp 2019); VR (Sinha et al 2009, 2019); OI, OSI (Ortiz 1987; PALICC 2015, from memory)',
    note: 'patient age 50 y, sex male, height 175 cm\n@ 08:00\nvent mode VC, vt 450 mL, rate 18, peep 10, fio2 0.5, plateau 28, peak 35, flow 60 L/min, map 16\nvitals spo2 95 %\nabg 7.38/42/90/24.3',
    values: {
      minute_ventilation: [8.1, 9], // 450 × 18 / 1000
      predicted_body_weight: [70.566, 9], // 50 + 0.91 × 22.6
      vt_per_kg_pbw: [450 / 70.566, 9], // 6.38
      driving_pressure: [18, 9],
      compliance_static: [25, 9], // 450 / 18
      compliance_dynamic: [18, 9], // 450 / 25
      airway_resistance: [7, 9], // (35 − 28) / (60/60)
      mechanical_power: [0.098 * 18 * 0.45 * (35 - 9), 9], // 20.64 J/min
      mechanical_power_surrogate: [(8.1 * (35 + 10 + 10)) / 20, 9], // 22.28 J/min
      ventilatory_ratio: [(8100 * 42) / (70.566 * 100 * 37.5), 9], // 1.29
      oxygenation_index: [(0.5 * 16 * 100) / 90, 9], // 8.89
      oxygen_saturation_index: [(0.5 * 16 * 100) / 95, 9], // 8.42
      pf_ratio: [180, 9],
      pio2: [0.5 * 713, 9], // 356.5
    },
    readings: { 'oxygenation-band': 'P/F 180 mmHg with PEEP 10 cmH2O: consistent with the 100–200 mmHg oxygenation band of the Berlin definition' },
    fires: ['PN405'], // ΔP 18 > 15 (common practice, no source)
    silent: ['PN403', 'PN404'], // VT 6.4 mL/kg ≤ 8; plateau 28 ≤ 30
  },
  {
    name: 'the lung-protective limits exactly met do not fire: plateau 30, ΔP 15, VT 7.9 mL/kg',
    source: 'plateau ≤ 30 cmH2O and VT 4–8 mL/kg PBW (ARDS Network 2000); ΔP above 15 flagged (common practice, no source)',
    note: 'patient age 50 y, sex male, height 170 cm\n@ 08:00\nvent mode VC, vt 521, rate 18, peep 15, fio2 0.5, plateau 30, peak 34, flow 60\nabg 7.36/44/85/24.1',
    values: { driving_pressure: [15, 9], vt_per_kg_pbw: [521 / (50 + 0.91 * 17.6), 9], mechanical_power: [0.098 * 18 * 0.521 * (34 - 7.5), 9] },
    silent: ['PN403', 'PN404', 'PN405'],
  },
  {
    name: 'NIV with the gas in kPa: type 2 on oxygen, chronic respiratory acidosis, below the noninvasive Berlin band',
    source: '1 kPa = 7.50062 mmHg; Berlin noninvasive band only 200–300 mmHg (ARDS Definition Task Force 2012); chronic response (Narins & Emmett 1980, from memory)',
    note: 'patient age 72 y\nunits gas kPa\n@ 08:00\noxygen niv ipap 16, epap 6, fio2 40 %\nabg ph 7.30, pco2 8.5, po2 9.5, hco3 31',
    values: {
      pao2_alveolar: [0.4 * 713 - (8.5 * KPA) / 0.8, 6], // 205.51 mmHg
      aa_gradient: [0.4 * 713 - (8.5 * KPA) / 0.8 - 9.5 * KPA, 6], // 134.25
      pf_ratio: [(9.5 * KPA) / 0.4, 6], // 178.14 mmHg = 23.75 kPa
      hco3_calculated: [0.0307 * 8.5 * KPA * 10 ** 1.2, 6], // 31.02
    },
    readings: {
      'oxygenation-band': 'P/F 23.8 kPa (178 mmHg) with EPAP 6 cmH2O: below the 200–300 mmHg oxygenation band',
      'respiratory-failure': 'type 2 (hypercapnic) respiratory failure, with PaO2 held up by supplemental oxygen (PaCO2 8.5 kPa (64 mmHg), above 6.7 kPa; PaO2 9.5 kPa (71 mmHg) on FiO2 0.40)',
      'acid-base': 'Consistent with chronic respiratory acidosis (pH 7.30, PaCO2 8.5 kPa (64 mmHg), HCO3 31.0 mmol/L), with HCO3 within the 30–38 mmol/L expected if chronic',
    },
  },
  {
    name: 'FiO2 1.0 on high flow: P/F exactly 300 is read as supported oxygenation; ROX; S/F above SpO2 97 % carries its caveat',
    source: 'P/F ≤ 300 (Berlin 2012); ROX = SpO2/FiO2/RR (Roca et al 2016, 2019); S/F tracks P/F for SpO2 ≤ 97 % (Rice et al, Chest 2007;132:410–417)',
    note: 'patient age 40 y\n@ 08:00\noxygen hfnc 60 L/min, fio2 100 %\nvitals rr 25, spo2 98 %\nabg 7.35/42/300/23',
    values: { pio2: [713, 9], pao2_alveolar: [713 - 52.5, 9], aa_gradient: [360.5, 9], pf_ratio: [300, 9], rox_index: [98 / 25, 9], sf_ratio: [98, 9] },
    notes: { sf_ratio: 'SpO2 above 97 %: the S/F ratio no longer tracks P/F' },
    readings: { oxygenation: 'PaO2 300 mmHg on FiO2 1.00 (P/F 300 mmHg): consistent with impaired oxygenation supported by oxygen.' },
  },
  {
    name: "altitude 4,000 m by West's model: PB 475 mmHg, hypoxaemia from low inspired oxygen",
    source: "PB = exp(6.63268 − 0.1112 h − 0.00149 h²), h in km (West JB, J Appl Physiol 1996;81:1850–1854, its equation read in a reproduction)",
    note: 'patient age 28 y\nplace altitude 4000 m\n@ 08:00\noxygen room air\nabg 7.47/27/48/19.5',
    values: {
      barometric: [Math.exp(6.63268 - 0.4448 - 0.00149 * 16), 6], // 475.34
      pio2: [0.21 * (Math.exp(6.63268 - 0.4448 - 0.02384) - 47), 6], // 89.95
      pao2_alveolar: [0.21 * (Math.exp(6.63268 - 0.4448 - 0.02384) - 47) - 27 / 0.8, 6], // 56.20
    },
    readings: { 'hypoxaemia-mechanism': 'Consistent with hypoxaemia from low inspired oxygen (PiO2 90 mmHg).' },
  },
  {
    name: 'altitude written in feet: 5,280 ft is 1,609.344 m, PB 633 mmHg',
    source: '1 ft = 0.3048 m (NIST SP 811); West 1996 (its equation read in a reproduction); P/F × PB/760 (Berlin 2012)',
    note: 'patient age 40 y\nplace altitude 5280 ft\n@ 08:00\noxygen room air\nabg 7.43/35/68/22.8',
    values: {
      barometric: [Math.exp(6.63268 - 0.1112 * 1.609344 - 0.00149 * 1.609344 ** 2), 6], // 632.61
      pf_ratio_altitude_adjusted: [((68 / 0.21) * Math.exp(6.63268 - 0.1112 * 1.609344 - 0.00149 * 1.609344 ** 2)) / 760, 6], // 269.5
    },
  },
  {
    name: 'kPa gas, severe hypoxaemia with hypercapnia on air: type 2 from hypoventilation',
    source: 'severe hypoxaemia < 40 mmHg (common practice, no source); 1 kPa = 7.50062 mmHg',
    note: 'patient age 77 y\nunits gas kPa\n@ 08:00\noxygen room air\nabg ph 7.22, pco2 9.8, po2 5.0, hco3 29.5',
    values: { pao2_alveolar: [0.21 * 713 - (9.8 * KPA) / 0.8, 6], aa_gradient: [0.21 * 713 - (9.8 * KPA) / 0.8 - 5 * KPA, 6] }, // 57.85, 20.34
    readings: {
      oxygenation: 'PaO2 5.0 kPa (38 mmHg): consistent with severe hypoxaemia (below 8.0 kPa, and below 5.3 kPa).',
      'hypoxaemia-mechanism': 'Consistent with hypoxaemia from hypoventilation (PaCO2 9.8 kPa (74 mmHg)).',
    },
  },
  {
    name: 'oxygen content from an Hb in mmol/L and the SpO2 (no SaO2), and delivery',
    source: 'CaO2 = 1.34 × Hb × SaO2 + 0.003 × PaO2, DO2 = CO × CaO2 × 10 (West, from memory); Hb 1 mmol/L (monomer) = 1.61145 g/dL (REFERENCES.md; haemoglobin-molar-mass in physiology/units.ts)',
    note: 'patient age 60 y\n@ 08:00\noxygen room air\nvitals spo2 94 %, co 4.5\nabg ph 7.40, pco2 40, po2 75, hco3 24, hb 6.2 mmol/L',
    values: {
      cao2: [1.34 * 6.2 * 1.61145 * 0.94 + 0.003 * 75, 6], // 12.81 mL/dL
      do2: [4.5 * (1.34 * 6.2 * 1.61145 * 0.94 + 0.003 * 75) * 10, 4], // 576.4 mL/min
    },
  },
  {
    name: 'simple mask at 6 L/min: FiO2 estimate 0.39, oxygen content and delivery',
    source: 'simple mask 0.35 at 5 L/min to 0.55 at 10 L/min (common practice, no source); CaO2 and DO2 (West, from memory)',
    note: 'patient age 60 y\n@ 08:00\noxygen mask 6 L/min\nvitals co 5 L/min\nabg ph 7.40, pco2 40, po2 60, hco3 24, sao2 90 %, hb 10 g/dL',
    values: { fio2_estimated: [0.39, 9], cao2: [1.34 * 10 * 0.9 + 0.003 * 60, 9], do2: [5 * 12.24 * 10, 6] },
  },
  {
    name: 'setting alveolarEquation full: PAO2 on air 2 mmHg above the simplified form, 10 on FiO2 1.0',
    source: 'PAO2 = PiO2 − PaCO2 × [FiO2 + (1 − FiO2)/R] (REFERENCES.md; Fenn, Rahn & Otis 1946, from memory)',
    note: 'patient age 40 y\n@ 08:00\noxygen room air\nabg 7.40/40/90/24.4',
    settings: { alveolarEquation: 'full' },
    values: { pao2_alveolar: [0.21 * 713 - 40 * (0.21 + 0.79 / 0.8), 6] }, // 101.83
  },
  {
    name: 'setting waterVapour body-temperature at 39.5 °C: PH2O 53.9 mmHg, PiO2 148.3 mmHg',
    source: 'Buck AL, J Appl Meteorol 1981;20:1527–1532 (its eqn 3 read in its reproduction in the R package HeatStress): e = 6.1121 × exp(17.502 T / (240.97 + T)) hPa',
    note: 'patient age 40 y\n@ 08:00\noxygen room air\nvitals temp 39.5 C\nabg 7.40/40/90/24.4',
    settings: { waterVapour: 'body-temperature' },
    values: { pio2: [0.21 * (760 - (6.1121 * Math.exp((17.502 * 39.5) / 280.47) * 100) / 133.322387415), 6] },
  },
  {
    name: 'setting barometricModel standard at 2,500 m: PB 560 mmHg',
    source: 'U.S. Standard Atmosphere 1976: 101325 × (1 − 2.25577×10⁻⁵ H)^5.25588 Pa, H geopotential (from memory)',
    note: 'patient age 40 y\nplace altitude 2500 m\n@ 08:00\noxygen room air\nabg 7.44/34/60/22.8',
    settings: { barometricModel: 'standard' },
    values: { barometric: [(101325 * (1 - 2.25577e-5 * ((6356766 * 2500) / (6356766 + 2500))) ** 5.25588) / 133.322387415, 6] }, // 560.23
  },
  {
    name: 'kPa thresholds: PaCO2 6.7 kPa is on the 50 mmHg threshold, PaO2 7.9 kPa below 60: type 1 with a mildly raised PaCO2',
    source: 'hypoxaemia < 60 mmHg, hypercapnia > 50 mmHg (common practice, no source); a value in kPa read at the resolution written (REFERENCES.md conversions)',
    note: 'patient age 55 y\nunits gas kPa\n@ 08:00\noxygen room air\nabg ph 7.34, pco2 6.7, po2 7.9, hco3 26.5',
    values: { aa_gradient: [0.21 * 713 - (6.7 * KPA) / 0.8 - 7.9 * KPA, 6] }, // 27.66 mmHg
    readings: { 'respiratory-failure': 'Consistent with type 1 (hypoxaemic) respiratory failure: hypoxaemia without hypercapnia, PaCO2 mildly raised (PaO2 7.9 kPa (59 mmHg), below 8.0 kPa; PaCO2 6.7 kPa (50 mmHg), not above 6.7 kPa).' },
  },
];

describe("a clinician's audit: invented notes, values worked out by hand, against Pneumark", () => {
  for (const c of CASES) {
    it(`${c.name} (${c.source})`, () => {
      const d = derivation(c.note, c.settings ?? {});
      for (const [id, [expected, digits]] of Object.entries(c.values)) {
        const value = d.derived.find((x) => x.id === id)?.value;
        expect(value, `${id} derived`).toBeTypeOf('number');
        expect(value, id).toBeCloseTo(expected, digits);
      }
      for (const [id, part] of Object.entries(c.notes ?? {})) expect((d.derived.find((x) => x.id === id)?.notes ?? []).join(' | '), `${id} notes`).toContain(part);
      const texts = new Map<InterpretationTopic, string>();
      for (const r of d.interpretations) texts.set(r.topic, `${texts.get(r.topic) ?? ''}${r.text}`);
      for (const [topic, part] of Object.entries(c.readings ?? {})) expect(texts.get(topic as InterpretationTopic) ?? '', topic).toContain(part);
      for (const topic of c.noReading ?? []) expect(texts.has(topic), topic).toBe(false);
      for (const r of d.interpretations) expect(r.text).toMatch(/^(Consistent with|PaO2|PaCO2|P\/F|Venous)|consistent with/);
      const codes = new Set(checkNote(c.note, c.settings ?? {}).findings.map((f) => f.code));
      for (const code of c.fires ?? []) expect(codes.has(code), `${code} fires`).toBe(true);
      for (const code of c.silent ?? []) expect(codes.has(code), `${code} silent`).toBe(false);
    });
  }

  it('the two anchors of dry inspired PO2 of air: about 159 mmHg at PB 760 and 126 at PB 600 (FiO2 × PB, common practice; REFERENCES.md)', () => {
    // 0.21 × 760 = 159.6 (0.2093 × 760 = 159.1, the 159 of the texts); 0.21 × 600 = 126.0.
    expect(inspiredPo2Dry(0.21, 760)).toBeCloseTo(159.6, 9);
    expect(inspiredPo2Dry(0.2093, 760)).toBeCloseTo(159.068, 9);
    expect(Math.abs(inspiredPo2Dry(0.21, 760)! - 159)).toBeLessThan(1);
    expect(inspiredPo2Dry(0.21, 600)).toBeCloseTo(126, 9);
  });
});
