/**
 * The field registry: one declarative row per thing a note can state.
 * Everything that needs to know about a key (parser, checks, hovers, completion, exports)
 * reads it from here. To add a field, add a row; `tests/core/registry.test.ts` validates
 * the table with zod and checks that aliases are unambiguous within a section.
 *
 * Bounds are in the field's canonical unit. `hard` = impossible (an error); `soft` = possible
 * but unusual (a warning: check the unit or the transcription). Each row names the source of
 * its bounds; "common practice" marks a rule of thumb with no single published source.
 *
 * LOINC codes: a code read on a page that shows it with its name names that page in `source`
 * (the look-ups were made while writing this table; nothing here is fetched); a code recalled and
 * not found on such a page is marked `fromMemory`; a code with neither comes from the project's
 * reference notes.
 */
import type { SectionId } from './sections';
import type { Dimension } from './units';
import type { ModeFamily } from './modes';

export type FieldKind = 'number' | 'pair' | 'word';

export interface Bounds {
  readonly min?: number;
  readonly max?: number;
}

export interface LoincCode {
  readonly code: string;
  readonly display: string;
  /** true when the code was recalled rather than read from the LOINC table. */
  readonly fromMemory?: boolean;
  /** The page the code and its name were read on: title, address, and the year or version it shows. */
  readonly source?: string;
}

export interface FieldDef {
  readonly id: string;
  readonly label: string;
  /** Short name for compact output (defaults to the canonical key). */
  readonly short?: string;
  readonly description: string;
  readonly sections: readonly SectionId[];
  /** Keys as typed in a note, lower case; the first is the canonical key. */
  readonly aliases: readonly string[];
  readonly kind: FieldKind;
  readonly dimension?: Dimension;
  /** Canonical unit id (internal unit of the core). */
  readonly unit?: string;
  /** Unit ids a note may write for this field. */
  readonly units?: readonly string[];
  /**
   * How a bare number is read: 'canonical' (the canonical unit), 'gas' (the note's gas unit),
   * 'fraction-or-percent' (≤ 1 is a fraction, otherwise a percentage).
   */
  readonly bare?: 'canonical' | 'gas' | 'fraction-or-percent';
  readonly hard?: Bounds;
  readonly soft?: Bounds;
  /**
   * Where a bare number is plausible enough to be read in the unit in force rather than doubted
   * (PN204) and kept out of calculations; the soft bounds when not given. Wider than the soft
   * bounds where a value outside them is rare but real and must not vanish from the readings:
   * a PaO2 of 25 mmHg is critical, not a kPa value.
   */
  readonly doubt?: Bounds;
  readonly boundsSource?: string;
  readonly loinc?: LoincCode;
  /** A LOINC code of its own where the field is stated in a given section (a ventilator's FiO2 is a setting). */
  readonly loincBySection?: Readonly<Partial<Record<SectionId, LoincCode>>>;
  /** A LOINC code of its own where the value is written with a given key (`tco2` is total CO2, not bicarbonate). */
  readonly loincByKey?: Readonly<Record<string, LoincCode>>;
  /** For word fields: the words accepted (lower case), mapped to their canonical spelling. */
  readonly words?: Readonly<Record<string, string>>;
  /** For word fields: whether a word outside `words` is accepted as it is. */
  readonly openWords?: boolean;
  /**
   * A reading taken from a device in a setting section (plateau, peak, mean airway pressure):
   * it belongs to its timepoint and does not carry forward like a setting.
   */
  readonly reading?: boolean;
  /**
   * Ventilator mode families (fields/modes.ts) under which a vent-line value of this field, a setting
   * by default, is measured: in force at its timepoint only, never carried (a tidal volume under PS).
   */
  readonly measuredIn?: readonly ModeFamily[];
  /** Mode families under which a value of this field, a reading by default, is set and carried (the mean airway pressure in HFOV). */
  readonly setIn?: readonly ModeFamily[];
  /**
   * For pair fields: how the two numbers are joined. 'slash' (the default) as a blood pressure is
   * written (`120/80`); 'dash' for a range, by a hyphen or an en dash glued to both numbers
   * (`88-92`, `88–92`), the lower end first.
   */
  readonly join?: 'slash' | 'dash';
  /** Decimal places used when the value is written back or shown. */
  readonly decimals: number;
}

const CP = 'common practice, no source';

/** Pages the LOINC codes were read on (each shows the code with its LOINC name). */
const SEEN = {
  ageValueSet: 'HL7 Terminology (THO) 7.0.1, ValueSet LOINCObservationActContextAgeDefinitionCode — https://build.fhir.org/ig/HL7/UTG/ValueSet-v3-LOINCObservationActContextAgeDefinitionCode.json.html',
  bpPanel: 'FHIR 6.0.0-ballot2 (2024), ValueSet observation-vitalsign-bppanel — https://hl7.org/fhir/6.0.0-ballot2/valueset-observation-vitalsign-bppanel.html',
  satExample: 'FHIR R5 5.0.0, Observation example satO2 — https://hl7.org/FHIR/observation-example-satO2.html',
  saner: 'HL7 SANER IG 1.0.0 (2021), ValueSet Ventilator Observations — https://hl7.org/fhir/uv/saner/ValueSet-VentilatorObservations.json.html',
  mccPh: 'HL7 MCC eCare Plan IG 1.0.0, Observation ph-lab-observation — https://www.hl7.org/fhir/us/mcc/Observation-ph-lab-observation.xml.html',
  mccPo2: 'HL7 MCC eCare Plan IG 1.0.0, Observation pO2-arterial-observation — https://build.fhir.org/ig/HL7/fhir-us-mcc/Observation-pO2-arterial-observation.json.html',
  loinc2711: 'LOINC 2711-0 term page, LOINC 2.78 — https://cdn.loinc.org/2711-0',
  loinc1963: 'LOINC 1963-8 term page, LOINC 2.80 — https://cdn.loinc.org/1963-8',
  sodiumGroup: 'LOINC group LG11363-5 (sodium, substance concentration), LOINC 2.73 — https://loinc.org/LG11363-5/',
  potassiumValueSet: 'HL7 PDDI CDS IG 1.0.0, ValueSet valueset-potassium-LOINC — https://hl7.org/fhir/uv/pddi/en/ValueSet-valueset-potassium-LOINC.html',
  chlorideBlood: 'CH LAB-Order (R4) 2.0.0, ObservationDefinition observation-serum-chloride — https://build.fhir.org/ig/hl7ch/ch-lab-order/ObservationDefinition-observation-serum-chloride.html',
  chlorideSerum: 'CH LAB-Order (R4) 3.0.0 ci-build, ActivityDefinition procedure-chloride-serum — https://build.fhir.org/ig/hl7ch/ch-lab-order/ActivityDefinition-procedure-chloride-serum.html',
  top2000: 'CH LAB-Order (R4) 2.0.0 (2024), ValueSet top-2000-lab-observations-si — https://build.fhir.org/ig/hl7ch/ch-lab-order/ValueSet-top-2000-lab-observations-si.html',
  totalCo2: 'HL7 US Core 3.1.0, Observation serum-co2 — https://hl7.org/fhir/us/core/STU3.1/Observation-serum-co2.html',
  glucoseSerum: 'HL7 LIVD IG 1.0.0-ballot (2024), ValueSet testcode-mappings-livd (LOINC 2.65) — https://hl7.org/fhir/uv/livd/2024Jan/ValueSet-testcode-mappings-livd.html',
  glucoseBlood: 'FHIR R4 ballot 3 (2018), Observation example f001-glucose — https://hl7.org/fhir/2018Dec/observation-example-f001-glucose.html',
  baseExcessVenous: 'LOINC 2.82 term data of 1927-3 (long name, component Base excess, property SCnc, system BldV, scale Qn, method Calc) as reproduced by HealthAssure — https://www.healthassure.in/codes/loinc-1927-3-base-excess-calc-bldv-molesvol; beside 11555-0 and 1925-7 in DICOM PS3.16 CID 3527 Blood Base Excess, as a FHIR ValueSet in bvdh/dicom-terminology-in-fhir ("Venous Blood Base Excess", the DICOM code meaning) — https://github.com/bvdh/dicom-terminology-in-fhir/blob/6dd085a7b9424b77892c7d7e5b2290f6f3657567/input/fsh/ValueSet-dicom-cid-3527-BloodBaseExcess.fsh',
  miiVentLoinc: 'MII ICU module (kerndatensatzmodul-intensivmedizin) 2027.0.0-ballot.3, ValueSet-mii-vs-icu-code-observation-beatmung-loinc.json — https://github.com/medizininformatik-initiative/kerndatensatzmodul-intensivmedizin/blob/ff65203e72c0cf029196b3322a326ef4069c83c8/2027.0.0-ballot.3/ValueSet-mii-vs-icu-code-observation-beatmung-loinc.json',
  miiPlateau: 'MII ICU module (kerndatensatzmodul-intensivmedizin) 2027.0.0-ballot.3, StructureDefinition-mii-pr-icu-vent-plateau-beatmungsdruck.json — https://github.com/medizininformatik-initiative/kerndatensatzmodul-intensivmedizin/blob/58ca65e998b3598e98b3a9795d026af3283109ff/2027.0.0-ballot.3/StructureDefinition-mii-pr-icu-vent-plateau-beatmungsdruck.json',
  miiCardiacOutput: 'MII ICU module (kerndatensatzmodul-intensivmedizin), profile MII_PR_ICU_MUV_Herzzeitvolumen (cardiac output, a vital-signs profile) — https://github.com/medizininformatik-initiative/kerndatensatzmodul-intensivmedizin/blob/c00e913579eda959f02282bd8219ca144eff153e/input/fsh/profiles/Monitoring%20und%20Vitaldaten/MII_PR_ICU_MUV_Herzzeitvolumen.fsh',
  meanBp: 'FHIR R4 ballot 2 (2018Sep), Observation example mbp — https://hl7.org/fhir/2018Sep/observation-example-mbp.json',
  dicomBloodPh: 'DICOM PS3.16 CID 3528 Blood pH, as a FHIR ValueSet in bvdh/dicom-terminology-in-fhir (2746-6 with the DICOM code meaning "Venous Blood pH"; the LOINC long name not shown) — https://github.com/bvdh/dicom-terminology-in-fhir/blob/6dd085a7b9424b77892c7d7e5b2290f6f3657567/input/fsh/ValueSet-dicom-cid-3528-BloodpH.fsh',
  elexisLoincTable: 'Elexis LOINC table (at_medevit_elexis_loinc: code, LOINC long common name, short name, class), loaded in ngiger/elexis-jubula jubula-tests/rsc/db/mysql/simple.sql — https://github.com/ngiger/elexis-jubula/blob/5b7079c92711afba1a7f7837bd49af3ff99fb548/jubula-tests/rsc/db/mysql/simple.sql',
  flowsheetLhc: 'LHNCBC flowsheet-lhc, its table of lab rows with LOINC code (LOINC_MERGED), LOINC long common name (LONG_COMMON_NAME_LOINC) and LOINC short name (LOINC_SHORTNAME): row HCO3 BldA Qn Calc, 1960-4, "Bicarbonate [Moles/volume] in Arterial blood", HCO3 BldA-sCnc, mmol/L — https://github.com/LHNCBC/flowsheet-lhc/blob/43491805f8a2ca29d8b49d76e7fe0a6850ff4301/src/stores/c2.js',
  respRateExample: 'FHIR R4 ballot 1 (2018Jan), Observation example respiratory-rate — https://hl7.org/fhir/2018Jan/observation-example-respiratory-rate.xml.html',
  dicomBloodGasPressure: 'DICOM PS3.16 CID 3524 Blood Gas Pressure, as a FHIR ValueSet in bvdh/dicom-terminology-in-fhir (2021-4 "Venous Blood Carbon dioxide partial pressure", 2705-2 "Venous Oxygen partial pressure", DICOM code meanings; the LOINC long names not shown) — https://github.com/bvdh/dicom-terminology-in-fhir/blob/cc69e5bc894cbe9622785dd511ee7d1ca662ac78/input/fsh/ValueSet-dicom-cid-3524-BloodGasPressure.fsh',
  geccoHeight: 'GECCO (German Corona Consensus data set, hl7germany/forschungsnetz-covid19), Observation example body-height (8302-2 "Body height", 167 cm) — https://github.com/hl7germany/forschungsnetz-covid19/blob/0ae58236e41cf4fd148d7a30a68bc313bd62d959/input/fsh/instances/Example_BodyHeight.fsh',
  geccoWeight: 'GECCO (German Corona Consensus data set, hl7germany/forschungsnetz-covid19), Observation example body-weight (29463-7 "Body weight", 84 kg) — https://github.com/hl7germany/forschungsnetz-covid19/blob/0ae58236e41cf4fd148d7a30a68bc313bd62d959/input/fsh/instances/Example_BodyWeight.fsh',
  geccoHeartRate: 'GECCO (German Corona Consensus data set, hl7germany/forschungsnetz-covid19), Observation example HeartRateNormal (8867-4 "Heart rate", 81 /min) — https://github.com/hl7germany/forschungsnetz-covid19/blob/0ae58236e41cf4fd148d7a30a68bc313bd62d959/input/fsh/instances/Example_HeartRate.fsh',
  geccoTemperature: 'GECCO (German Corona Consensus data set, hl7germany/forschungsnetz-covid19), Observation example body-temperature (8310-5 "Body temperature", 36.8 Cel) — https://github.com/hl7germany/forschungsnetz-covid19/blob/046e59610e08ccff469a632d0a55d3755c57b01b/input/fsh/instances/Example_BodyTemperature.fsh',
  geccoPaco2: 'GECCO (German Corona Consensus data set, hl7germany/forschungsnetz-covid19), Observation example carbon-dioxide-partial-pressure (2019-8, 44 mm[Hg]) — https://github.com/hl7germany/forschungsnetz-covid19/blob/0ae58236e41cf4fd148d7a30a68bc313bd62d959/input/fsh/instances/Example_PaCO2.fsh',
  geccoFio2: 'GECCO (German Corona Consensus data set, hl7germany/forschungsnetz-covid19), Observation example inhaled-oxygen-concentration (3150-0, 21 %, a volume fraction) — https://github.com/hl7germany/forschungsnetz-covid19/blob/0ae58236e41cf4fd148d7a30a68bc313bd62d959/input/fsh/instances/Example_FiO2.fsh',
  usCoreO2Flow: 'HL7 US Core 7.0.0-ballot (2024Jan), Observation satO2-fiO2 (component 3151-8 "Inhaled oxygen flow rate", 6 L/min) — https://hl7.org/fhir/us/core/2024Jan/Observation-satO2-fiO2.html',
  baseExcessArterial: 'LOINC 2.82 term data of 1925-7 (long name, component Base excess, property SCnc, system BldA, method Calc) as reproduced by HealthAssure — https://www.healthassure.in/codes/loinc-1925-7-base-excess-calc-blda-molesvol; DICOM PS3.16 CID 3527 Blood Base Excess ("Arterial Blood Base Excess", the DICOM code meaning) — https://github.com/bvdh/dicom-terminology-in-fhir/blob/6dd085a7b9424b77892c7d7e5b2290f6f3657567/input/fsh/ValueSet-dicom-cid-3527-BloodBaseExcess.fsh',
  vulcanAlbumin: 'HL7 Vulcan Schedule of Activities IG, ObservationDefinition LOINC-1751-7 (LOINC 2.74, permitted unit g/dL, specimen Ser/Plas) — https://github.com/HL7/Vulcan-schedule-ig/blob/1814964ae606eed4b0104fbb6034d0671fa46b26/input/fsh/observationdefinitions/LOINC-1751-7-ObservationDefinition.fsh',
} as const;

/** Whole blood on a blood gas line, serum or plasma on a labs line. */
const NA_BLOOD: LoincCode = { code: '2947-0', display: 'Sodium [Moles/volume] in Blood', source: SEEN.sodiumGroup };
const K_BLOOD: LoincCode = { code: '6298-4', display: 'Potassium [Moles/volume] in Blood', source: SEEN.potassiumValueSet };
const CL_BLOOD: LoincCode = { code: '2069-3', display: 'Chloride [Moles/volume] in Blood', source: SEEN.chlorideBlood };
const GLUCOSE_BLOOD: LoincCode = { code: '15074-8', display: 'Glucose [Moles/volume] in Blood', source: SEEN.glucoseBlood };
/**
 * A base excess worked out from a venous gas: the venous term (system BldV), beside the arterial 1925-7 (BldA)
 * with the same component, property and method. The blood term 11555-0 (system Bld, blood of any kind; FHIR R4
 * ballot 3 example f002-excess) was used before; a `vbg` line states venous blood, as its other codes say.
 */
const BASE_EXCESS_VENOUS: LoincCode = { code: '1927-3', display: 'Base excess in Venous blood by calculation', source: SEEN.baseExcessVenous };

const ROWS: readonly FieldDef[] = [
  // ── patient ───────────────────────────────────────────────────────────
  { id: 'age', label: 'Age', description: 'Age in years (written in years, months, weeks or days).', sections: ['patient'], aliases: ['age'], kind: 'number', dimension: 'age', unit: 'y', units: ['y', 'mo', 'wk', 'd'], hard: { min: 0, max: 130 }, soft: { max: 110 }, doubt: { max: 130 }, boundsSource: `${CP}; the oldest verified age is 122 years (122 years and 164 days, read in the English Wikipedia article on Jeanne Calment, December 2026), and above 110 is rare enough to check the unit (an age in months written as years); a bare age is read in years wherever it is possible (our convention: 115 may be years), and doubted as months only above the hard maximum`, loinc: { code: '30525-0', display: 'Age', source: SEEN.ageValueSet }, decimals: 0 },
  { id: 'sex', label: 'Sex', description: 'Sex used by predicted-body-weight equations (female or male).', sections: ['patient'], aliases: ['sex'], kind: 'word', words: { female: 'female', f: 'female', woman: 'female', male: 'male', m: 'male', man: 'male' }, decimals: 0 },
  { id: 'height', label: 'Height', description: 'Standing height, used for predicted body weight.', sections: ['patient'], aliases: ['height', 'ht'], kind: 'number', dimension: 'length', unit: 'cm', units: ['cm', 'm', 'in', 'ft'], hard: { min: 20, max: 275 }, soft: { min: 120, max: 220 }, boundsSource: `${CP}; soft range is where the ARDS Network predicted-body-weight equations were used`, loinc: { code: '8302-2', display: 'Body height', source: SEEN.geccoHeight }, decimals: 0 },
  { id: 'weight', label: 'Weight', description: 'Actual body weight.', sections: ['patient'], aliases: ['weight', 'wt'], kind: 'number', dimension: 'mass', unit: 'kg', units: ['kg', 'lb'], hard: { min: 0.3, max: 700 }, soft: { min: 25, max: 250 }, boundsSource: CP, loinc: { code: '29463-7', display: 'Body weight', source: SEEN.geccoWeight }, decimals: 1 },

  // ── place ─────────────────────────────────────────────────────────────
  { id: 'altitude', label: 'Altitude', description: 'Altitude above sea level; barometric pressure is estimated from it when not stated.', sections: ['place'], aliases: ['altitude', 'alt', 'elevation'], kind: 'number', dimension: 'length', unit: 'm', units: ['m', 'ft'], hard: { min: -500, max: 9000 }, soft: { min: -450, max: 5100 }, doubt: { min: -500, max: 9000 }, boundsSource: `${CP}: the lowest dry land, the shore of the Dead Sea, is about −430 m, the highest summit about 8,850 m (the summit of Everest, 8,848 m, read in the abstract of West JB et al., J Appl Physiol 1983;54:1188–1194), and the highest permanently inhabited places about 5,100 m (those two others from memory), so higher is unusual (an altitude in feet written as metres) though real on an expedition; a bare altitude is read in metres wherever it is possible (our convention: a camp at 6,000 m stays in the estimate of barometric pressure), and doubted as feet only above the hard maximum`, decimals: 0 },
  { id: 'barometric', label: 'Barometric pressure', short: 'PB', description: 'Ambient barometric pressure where the patient breathes.', sections: ['place'], aliases: ['barometric', 'pb', 'pressure'], kind: 'number', dimension: 'gas-pressure', unit: 'mmHg', units: ['mmHg', 'kPa', 'hPa'], bare: 'gas', hard: { min: 150, max: 3000 }, soft: { min: 240, max: 800 }, boundsSource: `${CP}; about 253 mmHg was measured on the summit of Mount Everest (West JB et al., J Appl Physiol 1983;54:1188–1194, read in its abstract: 253.0 Torr on the summit); hyperbaric chambers reach about 2,300 mmHg`, decimals: 0 },

  // ── units ─────────────────────────────────────────────────────────────
  { id: 'gas_unit', label: 'Gas unit', description: 'Unit of gas pressures written without a unit in this note.', sections: ['units'], aliases: ['gas'], kind: 'word', words: { mmhg: 'mmHg', kpa: 'kPa', torr: 'mmHg' }, decimals: 0 },

  // ── vitals ────────────────────────────────────────────────────────────
  { id: 'hr', label: 'Heart rate', short: 'HR', description: 'Heart rate.', sections: ['vitals'], aliases: ['hr', 'pulse', 'hrate'], kind: 'number', dimension: 'rate', unit: '/min', units: ['/min'], hard: { min: 0, max: 350 }, soft: { min: 30, max: 220 }, boundsSource: CP, loinc: { code: '8867-4', display: 'Heart rate', source: SEEN.geccoHeartRate }, decimals: 0 },
  { id: 'rr', label: 'Respiratory rate', short: 'RR', description: 'Measured (total) respiratory rate.', sections: ['vitals'], aliases: ['rr', 'resp', 'rrate'], kind: 'number', dimension: 'rate', unit: '/min', units: ['/min'], hard: { min: 0, max: 150 }, soft: { min: 6, max: 60 }, boundsSource: `${CP}; below 6 /min is usual at no age (a measured rate under controlled ventilation is at least the set rate), so a lower one is more often a slip (rr 2 for 20) than a real bradypnoea or apnoea, and worth a second look`, loinc: { code: '9279-1', display: 'Respiratory rate', source: SEEN.respRateExample }, decimals: 0 },
  { id: 'spo2', label: 'SpO2', short: 'SpO2', description: 'Oxygen saturation by pulse oximetry.', sections: ['vitals'], aliases: ['spo2', 'sats', 'sat'], kind: 'number', dimension: 'percent', unit: '%sat', units: ['%sat'], hard: { min: 0, max: 100 }, soft: { min: 70 }, boundsSource: `${CP}; oximeter accuracy falls below about 70 %`, loinc: { code: '59408-5', display: 'Oxygen saturation in Arterial blood by Pulse oximetry', source: SEEN.satExample }, decimals: 0 },
  { id: 'temp', label: 'Temperature', description: 'Body temperature.', sections: ['vitals'], aliases: ['temp', 't', 'temperature'], kind: 'number', dimension: 'temperature', unit: 'C', units: ['C', 'F'], hard: { min: 13, max: 47 }, soft: { min: 30, max: 42 }, boundsSource: `${CP}; survival after accidental hypothermia to 13.7 °C has been reported (Gilbert M et al., Lancet 2000;355:375–376, its citation from memory; the 13.7 °C read in a Reuters report of the case that quotes its first author)`, loinc: { code: '8310-5', display: 'Body temperature', source: SEEN.geccoTemperature }, decimals: 1 },
  { id: 'bp', label: 'Blood pressure', short: 'BP', description: 'Systolic/diastolic arterial pressure.', sections: ['vitals'], aliases: ['bp', 'nibp', 'abp'], kind: 'pair', dimension: 'gas-pressure', unit: 'mmHg', units: ['mmHg'], hard: { min: 0, max: 350 }, soft: { min: 40, max: 250 }, boundsSource: CP, loinc: { code: '85354-9', display: 'Blood pressure panel with all children optional', source: SEEN.bpPanel }, decimals: 0 },
  // `map` on a vitals line is the mean arterial pressure (an arterial line's, or a monitor's); on a vent line, the mean airway pressure.
  { id: 'mean_bp', label: 'Mean arterial pressure', short: 'MAP', description: 'Mean arterial pressure as measured (an arterial line or a monitor); when absent, one is estimated from bp.', sections: ['vitals'], aliases: ['map', 'mean_bp', 'mabp'], kind: 'number', dimension: 'gas-pressure', unit: 'mmHg', units: ['mmHg'], hard: { min: 0, max: 300 }, soft: { min: 30, max: 200 }, boundsSource: CP, loinc: { code: '8478-0', display: 'Mean blood pressure', source: SEEN.meanBp }, decimals: 0 },
  { id: 'etco2', label: 'End-tidal CO2', short: 'EtCO2', description: 'End-tidal carbon dioxide pressure.', sections: ['vitals', 'vent'], aliases: ['etco2', 'petco2'], kind: 'number', dimension: 'gas-pressure', unit: 'mmHg', units: ['mmHg', 'kPa'], bare: 'gas', hard: { min: 0, max: 200 }, soft: { min: 10, max: 100 }, boundsSource: `${CP}; normal is about 35–45 mmHg (4.7–6.0 kPa), and below 10 mmHg a capnograph reads only in a cardiac arrest, a disconnection or a misplaced tube, worth a second look; so a bare value below 10 in an mmHg note, ordinary in kPa (\`etco2 4.5\`), is doubted as kPa`, loinc: { code: '19891-1', display: 'Carbon dioxide [Partial pressure] in Exhaled gas --at end expiration', source: SEEN.miiVentLoinc }, reading: true, decimals: 0 },
  { id: 'cardiac_output', label: 'Cardiac output', description: 'Cardiac output, used for oxygen delivery.', sections: ['vitals'], aliases: ['co', 'cardiac_output'], kind: 'number', dimension: 'flow', unit: 'L/min', units: ['L/min'], hard: { min: 0.1, max: 40 }, soft: { min: 1.5, max: 15 }, boundsSource: CP, loinc: { code: '8741-1', display: 'Left ventricular Cardiac output', source: SEEN.miiCardiacOutput }, decimals: 1 },

  // ── oxygen and ventilator settings ───────────────────────────────────
  { id: 'device', label: 'Oxygen device', description: 'How oxygen is given; written first on an oxygen line.', sections: ['oxygen'], aliases: ['device'], kind: 'word', words: { 'room air': 'room air', air: 'room air', ra: 'room air', cannula: 'cannula', nc: 'cannula', nasal: 'cannula', 'nasal cannula': 'cannula', 'nasal prongs': 'cannula', mask: 'mask', 'face mask': 'mask', 'simple mask': 'mask', 'simple face mask': 'mask', venturi: 'venturi', 'venturi mask': 'venturi', reservoir: 'reservoir', nrb: 'reservoir', 'reservoir mask': 'reservoir', 'non-rebreather': 'reservoir', 'non-rebreather mask': 'reservoir', hfnc: 'hfnc', highflow: 'hfnc', 'high-flow': 'hfnc', 'high flow': 'hfnc', 'nasal high flow': 'hfnc', niv: 'niv', bilevel: 'niv', cpap: 'cpap' }, decimals: 0 },
  { id: 'o2_flow', label: 'Oxygen flow', description: 'Oxygen (or total gas) flow of the device.', sections: ['oxygen'], aliases: ['flow', 'o2flow'], kind: 'number', dimension: 'flow', unit: 'L/min', units: ['L/min'], hard: { min: 0, max: 80 }, soft: { max: 70 }, boundsSource: CP, loinc: { code: '3151-8', display: 'Inhaled oxygen flow rate', source: SEEN.usCoreO2Flow }, decimals: 1 },
  { id: 'fio2', label: 'FiO2', short: 'FiO2', description: 'Fraction of inspired oxygen (a fraction 0.21–1.0, or a percentage).', sections: ['oxygen', 'vent', 'abg'], aliases: ['fio2', 'fi02', 'o2'], kind: 'number', dimension: 'fraction', unit: 'fraction', units: ['fraction', '%'], bare: 'fraction-or-percent', hard: { min: 0.21, max: 1 }, boundsSource: `${CP}: air is 0.21 and pure oxygen 1.0`, loinc: { code: '3150-0', display: 'Inhaled oxygen concentration', source: SEEN.geccoFio2 }, loincBySection: { vent: { code: '19994-3', display: 'Oxygen/Total gas setting [Volume Fraction] Ventilator', source: SEEN.saner } }, decimals: 2 },
  { id: 'ipap', label: 'IPAP', short: 'IPAP', description: 'Inspiratory positive airway pressure (non-invasive ventilation).', sections: ['oxygen'], aliases: ['ipap'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 50 }, soft: { max: 30 }, boundsSource: CP, decimals: 0 },
  { id: 'epap', label: 'EPAP', short: 'EPAP', description: 'Expiratory positive airway pressure (non-invasive ventilation); counts as PEEP.', sections: ['oxygen'], aliases: ['epap'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 30 }, soft: { max: 20 }, boundsSource: CP, decimals: 0 },
  { id: 'cpap_level', label: 'CPAP', short: 'CPAP', description: 'Continuous positive airway pressure level; counts as PEEP.', sections: ['oxygen'], aliases: ['level', 'pressure'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 30 }, soft: { max: 20 }, boundsSource: CP, decimals: 0 },
  { id: 'spo2_target', label: 'SpO2 target', short: 'SpO2 target', description: 'The SpO2 range the oxygen is prescribed to, two whole percentages joined by a hyphen or an en dash, the lower first (`target 88-92`, `target 94–98 %`; with blanks around the dash, `88 - 92`, the same range); in force from where it is written until another target is, through changes of device, room air and ventilation.', sections: ['oxygen'], aliases: ['target', 'spo2_target'], kind: 'pair', join: 'dash', dimension: 'percent', unit: '%sat', units: ['%sat'], hard: { min: 70, max: 100 }, boundsSource: `${CP}: a saturation is at most 100 %, and oximeter accuracy falls below about 70 % (the SpO2's usual minimum); the targets prescribed are 88–92 % and 94–98 % (O'Driscoll BR, Howard LS, Earis J, Mak V, BTS guideline for oxygen use in adults in healthcare and emergency settings, Thorax 2017;72(Suppl 1):ii1–ii90, both read in its table 2 at thorax.bmj.com) or 92–96 % (Beasley R and coauthors, Thoracic Society of Australia and New Zealand oxygen guidelines for acute oxygen use in adults, Respirology 2015;20(8):1182–1191, doi 10.1111/resp.12620, its citation read on the guideline's title page as reproduced at docslib.org; 92–96 % read as the range it recommends in the abstract of its authors' letter comparing it with 94–98 %, Respirology 2016, doi 10.1111/resp.12879, at ahro.austin.org.au, and its 88–92 % for COPD and other causes of chronic respiratory failure in its recommendation 8 as reproduced at fliphtml5.com); a range written with its ends reversed or equal is impossible as written`, decimals: 0 },
  { id: 'mode', label: 'Ventilator mode', description: 'Ventilation mode, one word (e.g. VC, PC, PS, SIMV, APRV); SIMV run volume-targeted or pressure-targeted is `SIMV-VC` or `SIMV-PC` (plain SIMV is read as volume-targeted).', sections: ['vent'], aliases: ['mode'], kind: 'word', openWords: true, words: { vc: 'VC', pc: 'PC', prvc: 'PRVC', ps: 'PS', simv: 'SIMV', 'simv-vc': 'SIMV-VC', 'simv-pc': 'SIMV-PC', aprv: 'APRV', cpap: 'CPAP', hfov: 'HFOV' }, decimals: 0 },
  { id: 'vt', label: 'Tidal volume', short: 'VT', description: 'Tidal volume (set in volume modes and PRVC; measured, and of its timepoint only, where the mode sets a pressure: PC, SIMV-PC, APRV, PS, CPAP, HFOV, and under NIV or CPAP of an oxygen line).', sections: ['vent'], aliases: ['vt', 'tidal', 'tv'], kind: 'number', dimension: 'volume', unit: 'mL', units: ['mL', 'L', 'mL/kg'], hard: { min: 0, max: 3000 }, soft: { min: 50, max: 1200 }, boundsSource: `${CP}; the usual minimum is 2 mL per kg of body size (the smaller of the weight and the predicted body weight in force; half the ARDS Network protocol's 4 mL/kg), 50 mL (2 mL/kg of the 25 kg soft minimum of weight) where the note gives neither, and none for a patient under 18 years where it gives neither (a child's size runs from a preterm newborn's to an adult's)`, loinc: { code: '20112-9', display: 'Tidal volume setting Ventilator', source: SEEN.miiVentLoinc }, measuredIn: ['pressure', 'spontaneous', 'oscillation'], decimals: 0 },
  { id: 'vent_rate', label: 'Set rate', description: 'Set ventilator rate; in HFOV the oscillation frequency, usually written in Hz (1 Hz = 60 /min).', sections: ['vent'], aliases: ['rate', 'f', 'set_rate'], kind: 'number', dimension: 'rate', unit: '/min', units: ['/min', 'Hz'], hard: { min: 0, max: 1200 }, soft: { max: 60 }, boundsSource: `${CP}; oscillators are set from about 3 to 15 Hz (180–900 /min: 3 to 10 Hz in adults read in the abstract of a clinical review of HFOV in adults in Critical Care, doi 10.1186/cc2182, at ccforum.biomedcentral.com; the higher frequencies of infants: 8–10 and 10–12 Hz suggested for two groups of neonates on nasal HFOV in table 2 of De Luca D, Dell'Orto V. Non-invasive high-frequency oscillatory ventilation in neonates: review of physiology, biology and clinical data. Arch Dis Child Fetal Neonatal Ed, volume 101, issue 6, page F565 (read at fn.bmj.com, December 2026; its year, 2016, from memory); up to about 15 Hz from memory), so up to 20 Hz (1200 /min) is possible, and in HFOV the usual range is 3–15 Hz rather than at most 60 /min`, decimals: 0 },
  { id: 'peep', label: 'PEEP', short: 'PEEP', description: 'Positive end-expiratory pressure.', sections: ['vent'], aliases: ['peep'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 50 }, soft: { max: 25 }, boundsSource: CP, loinc: { code: '20077-4', display: 'Positive end expiratory pressure setting Ventilator', source: SEEN.saner }, decimals: 0 },
  // No LOINC code: none was read in a LOINC source available here (the ucum-lhc package holds none), and none is recalled.
  { id: 'peep_total', label: 'Total PEEP', short: 'PEEPtot', description: 'Total PEEP measured in an end-expiratory hold: the set PEEP plus any intrinsic PEEP. Where written, driving pressure and static compliance use plateau − total PEEP.', sections: ['vent'], aliases: ['peep_total', 'tpeep', 'totalpeep'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 60 }, soft: { max: 30 }, boundsSource: `${CP}; the set PEEP's bounds with room for an intrinsic PEEP above them`, reading: true, decimals: 0 },
  { id: 'autopeep', label: 'Intrinsic PEEP', short: 'PEEPi', description: 'Intrinsic (auto-) PEEP: the total PEEP of an end-expiratory hold above the set PEEP, as the ventilator shows it. Checked against total − set PEEP where all three are written (PN418); where no total PEEP is written, driving pressure and static compliance use plateau − (set PEEP + intrinsic PEEP).', sections: ['vent'], aliases: ['autopeep', 'ipeep', 'peepi', 'auto_peep'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 40 }, soft: { max: 20 }, boundsSource: CP, reading: true, decimals: 0 },
  { id: 'plateau', label: 'Plateau pressure', description: 'End-inspiratory plateau pressure (inspiratory hold).', sections: ['vent'], aliases: ['plateau', 'pplat'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 100 }, soft: { max: 40 }, boundsSource: CP, loinc: { code: '76259-1', display: 'Pressure.plateau Respiratory system airway --on ventilator', source: SEEN.miiPlateau }, reading: true, decimals: 0 },
  { id: 'peak', label: 'Peak pressure', description: 'Peak inspiratory airway pressure.', sections: ['vent'], aliases: ['peak', 'ppeak', 'pip'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 120 }, soft: { max: 50 }, boundsSource: CP, loinc: { code: '76531-3', display: 'Pressure.max Respiratory system airway --on ventilator', source: SEEN.miiVentLoinc }, reading: true, decimals: 0 },
  { id: 'insp_flow', label: 'Inspiratory flow', description: 'Inspiratory flow (set in constant-flow volume control, VC, SIMV and SIMV-VC; measured, and of its timepoint only, under PRVC and where the mode sets a pressure: PC, SIMV-PC, APRV, PS, CPAP, HFOV, and under NIV or CPAP of an oxygen line).', sections: ['vent'], aliases: ['flow', 'insp_flow'], kind: 'number', dimension: 'flow', unit: 'L/min', units: ['L/min', 'L/s'], hard: { min: 0, max: 200 }, soft: { min: 10, max: 120 }, boundsSource: `${CP}; the usual minimum is an adult's: for a patient under 18 years (the age in force) it is a child's, 2 L/min, half the bottom of the 4–10 L/min an infant on a ventilator is usually given (from memory)`, loinc: { code: '76275-7', display: 'Inspiratory flow setting Ventilator', source: SEEN.miiVentLoinc }, measuredIn: ['adaptive', 'pressure', 'spontaneous', 'oscillation'], decimals: 0 },
  { id: 'mean_airway_pressure', label: 'Mean airway pressure', description: 'Mean airway pressure, for the oxygenation index; measured on conventional modes, set in HFOV (where it carries as a setting).', sections: ['vent'], aliases: ['map', 'mawp', 'pmean', 'mpaw'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 60 }, soft: { max: 35 }, boundsSource: CP, loinc: { code: '76530-5', display: 'Mean pressure Respiratory system airway --on ventilator', source: SEEN.miiVentLoinc }, reading: true, setIn: ['oscillation'], decimals: 0 },
  // `dp` and `delta_p` are no keys of the amplitude: ΔP names the driving pressure (plateau − PEEP).
  { id: 'amplitude', label: 'Oscillation amplitude', description: 'Pressure amplitude of high-frequency oscillation (HFOV): the peak-to-trough swing of pressure around the mean airway pressure.', sections: ['vent'], aliases: ['amplitude', 'amp'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 150 }, soft: { min: 10, max: 90 }, boundsSource: `${CP}; from memory, oscillators are set from about 10 cmH2O (small infants) to about 90 cmH2O (adults), and none delivers a swing of 150 cmH2O`, decimals: 0 },
  { id: 'pressure_support', label: 'Pressure support', short: 'PS', description: 'Pressure support above PEEP.', sections: ['vent'], aliases: ['ps', 'support'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 50 }, soft: { max: 30 }, boundsSource: CP, loinc: { code: '20079-0', display: 'Pressure support setting Ventilator', source: SEEN.saner }, decimals: 0 },
  // Above PEEP, as pressure support is (our convention): `pip`, `ppeak` are the measured peak, no keys of it.
  { id: 'insp_pressure', label: 'Set inspiratory pressure', short: 'Pinsp', description: 'Set inspiratory pressure of pressure-controlled breaths, above PEEP (as pressure support is). A ventilator that shows the absolute inspiratory level is written as that level less the PEEP: an absolute 26 cmH2O with PEEP 8 is `pinsp 18`.', sections: ['vent'], aliases: ['pinsp', 'insp_pressure', 'pcontrol'], kind: 'number', dimension: 'airway-pressure', unit: 'cmH2O', units: ['cmH2O', 'mbar'], hard: { min: 0, max: 60 }, soft: { max: 35 }, boundsSource: `${CP}; the pressure is above PEEP (our convention, the footing of pressure support; a pressure breath raised to a set pressure above the set PEEP, e.g. 15 above a PEEP of 5 held at 20, read on ventbasics.com/breath-types/pressure), so the breath's peak is about PEEP plus this value; from memory, pressure control is usually set some 10–25 cmH2O above PEEP (a safe starting pressure control of 14 cmH2O, keeping the peak well below 35 even with a slightly higher PEEP, read in the open textbook Mechanical Ventilators, its chapter on the pressure control setting, at ecampusontario.pressbooks.pub), and above 35 (a peak near 45–50 with the usual PEEP) is rare enough to check the value, while no ventilator setting above PEEP reaches 60`, decimals: 0 },
  { id: 'minute_volume', label: 'Measured minute volume', short: 'VE meas', description: 'Exhaled minute volume read from the ventilator.', sections: ['vent'], aliases: ['ve', 'mv', 'minute_volume'], kind: 'number', dimension: 'flow', unit: 'L/min', units: ['L/min'], hard: { min: 0, max: 60 }, soft: { max: 30 }, boundsSource: CP, reading: true, decimals: 1 },

  // ── arterial gas ──────────────────────────────────────────────────────
  { id: 'ph', label: 'pH (arterial)', short: 'pH', description: 'Arterial pH.', sections: ['abg'], aliases: ['ph'], kind: 'number', dimension: 'ph', unit: 'ph', units: ['ph'], hard: { min: 6.3, max: 8.0 }, soft: { min: 6.8, max: 7.8 }, boundsSource: `${CP}; survival near pH 6.5 has been reported, and an arterial pH of over 7.7 on the summit of Mount Everest (West JB, Human physiology at extreme altitudes on Mount Everest, Science 1984;223:784–788, read in its abstract)`, loinc: { code: '2744-1', display: 'pH of Arterial blood', source: SEEN.mccPh }, decimals: 2 },
  { id: 'paco2', label: 'PaCO2', short: 'PaCO2', description: 'Arterial partial pressure of carbon dioxide.', sections: ['abg'], aliases: ['pco2', 'paco2'], kind: 'number', dimension: 'gas-pressure', unit: 'mmHg', units: ['mmHg', 'kPa'], bare: 'gas', hard: { min: 5, max: 400 }, soft: { min: 15, max: 150 }, doubt: { min: 15, max: 200 }, boundsSource: `${CP}; below the soft minimum is expected at extreme altitude (mean 13.3 mmHg, range 10.3–15.7, at 8,400 m: Grocott MPW et al., NEJM 2009;360:140–149, read in its abstract), so the soft minimum is waived where barometric pressure is below 500 mmHg; a bare PaCO2 is doubted as the other unit only above 200 mmHg (150–200 mmHg is seen in severe hypercapnia and must stay in the readings; our convention)`, loinc: { code: '2019-8', display: 'Carbon dioxide [Partial pressure] in Arterial blood', source: SEEN.geccoPaco2 }, decimals: 0 },
  { id: 'pao2', label: 'PaO2', short: 'PaO2', description: 'Arterial partial pressure of oxygen.', sections: ['abg'], aliases: ['po2', 'pao2'], kind: 'number', dimension: 'gas-pressure', unit: 'mmHg', units: ['mmHg', 'kPa'], bare: 'gas', hard: { min: 10, max: 2500 }, soft: { min: 30, max: 700 }, doubt: { min: 20, max: 700 }, boundsSource: `${CP}; values near 20–25 mmHg were measured at 8,400 m (mean 24.6 mmHg, range 19.1–29.5: Grocott MPW et al., NEJM 2009;360:140–149, read in its abstract), so the soft minimum is waived where barometric pressure is below 500 mmHg; the hard maximum allows hyperbaric oxygen; a bare PaO2 is doubted as kPa only below 20 mmHg (20–30 mmHg is seen in critical hypoxaemia and must stay in the readings; our convention)`, loinc: { code: '2703-7', display: 'Oxygen [Partial pressure] in Arterial blood', source: SEEN.mccPo2 }, decimals: 0 },
  { id: 'hco3', label: 'HCO3 (arterial)', short: 'HCO3', description: 'Arterial bicarbonate as reported by the gas analyser.', sections: ['abg'], aliases: ['hco3', 'bicarb'], kind: 'number', dimension: 'substance-concentration', unit: 'mmol/L', units: ['mmol/L', 'mEq/L'], hard: { min: 1, max: 80 }, soft: { min: 5, max: 50 }, boundsSource: CP, loinc: { code: '1960-4', display: 'Bicarbonate [Moles/volume] in Arterial blood', source: SEEN.flowsheetLhc }, decimals: 1 },
  { id: 'base_excess', label: 'Base excess', short: 'BE', description: 'Base excess (negative for a base deficit).', sections: ['abg', 'vbg'], aliases: ['be', 'sbe', 'base_excess'], kind: 'number', dimension: 'substance-concentration', unit: 'mmol/L', units: ['mmol/L', 'mEq/L'], hard: { min: -50, max: 50 }, soft: { min: -25, max: 25 }, boundsSource: CP, loinc: { code: '1925-7', display: 'Base excess in Arterial blood by calculation', source: SEEN.baseExcessArterial }, loincBySection: { vbg: BASE_EXCESS_VENOUS }, decimals: 1 },
  { id: 'sao2', label: 'SaO2', short: 'SaO2', description: 'Arterial oxygen saturation measured by co-oximetry.', sections: ['abg'], aliases: ['sao2', 'so2'], kind: 'number', dimension: 'percent', unit: '%sat', units: ['%sat'], hard: { min: 0, max: 100 }, soft: { min: 50 }, boundsSource: CP, loinc: { code: '2708-6', display: 'Oxygen saturation in Arterial blood', source: SEEN.satExample }, decimals: 0 },

  // ── venous gas ────────────────────────────────────────────────────────
  { id: 'ph_venous', label: 'pH (venous)', short: 'pH(v)', description: 'Venous pH.', sections: ['vbg'], aliases: ['ph'], kind: 'number', dimension: 'ph', unit: 'ph', units: ['ph'], hard: { min: 6.3, max: 8.0 }, soft: { min: 6.8, max: 7.8 }, boundsSource: CP, loinc: { code: '2746-6', display: 'pH of Venous blood', source: SEEN.dicomBloodPh }, decimals: 2 },
  { id: 'pvco2', label: 'PvCO2', short: 'PvCO2', description: 'Venous partial pressure of carbon dioxide.', sections: ['vbg'], aliases: ['pco2', 'pvco2'], kind: 'number', dimension: 'gas-pressure', unit: 'mmHg', units: ['mmHg', 'kPa'], bare: 'gas', hard: { min: 5, max: 400 }, soft: { min: 15, max: 160 }, boundsSource: CP, loinc: { code: '2021-4', display: 'Carbon dioxide [Partial pressure] in Venous blood', source: SEEN.dicomBloodGasPressure }, decimals: 0 },
  { id: 'pvo2', label: 'PvO2', short: 'PvO2', description: 'Venous partial pressure of oxygen.', sections: ['vbg'], aliases: ['po2', 'pvo2'], kind: 'number', dimension: 'gas-pressure', unit: 'mmHg', units: ['mmHg', 'kPa'], bare: 'gas', hard: { min: 5, max: 700 }, soft: { min: 15, max: 100 }, boundsSource: CP, loinc: { code: '2705-2', display: 'Oxygen [Partial pressure] in Venous blood', source: SEEN.dicomBloodGasPressure }, decimals: 0 },
  { id: 'hco3_venous', label: 'HCO3 (venous)', short: 'HCO3(v)', description: 'Venous bicarbonate as reported by the gas analyser.', sections: ['vbg'], aliases: ['hco3', 'bicarb'], kind: 'number', dimension: 'substance-concentration', unit: 'mmol/L', units: ['mmol/L', 'mEq/L'], hard: { min: 1, max: 80 }, soft: { min: 5, max: 50 }, boundsSource: CP, loinc: { code: '14627-4', display: 'Bicarbonate [Moles/volume] in Venous blood', source: SEEN.elexisLoincTable }, decimals: 1 },
  { id: 'svo2', label: 'SvO2', short: 'SvO2', description: 'Venous oxygen saturation.', sections: ['vbg'], aliases: ['svo2', 'so2', 'scvo2'], kind: 'number', dimension: 'percent', unit: '%sat', units: ['%sat'], hard: { min: 0, max: 100 }, soft: { min: 20, max: 95 }, boundsSource: CP, loinc: { code: '2711-0', display: 'Oxygen saturation in Venous blood', source: SEEN.loinc2711 }, decimals: 0 },

  // ── laboratory ────────────────────────────────────────────────────────
  { id: 'lactate', label: 'Lactate', description: 'Blood lactate.', sections: ['abg', 'vbg', 'labs'], aliases: ['lactate', 'lac'], kind: 'number', dimension: 'substance-concentration', unit: 'mmol/L', units: ['mmol/L'], hard: { min: 0, max: 40 }, soft: { max: 20 }, boundsSource: CP, loinc: { code: '32693-4', display: 'Lactate [Moles/volume] in Blood', source: SEEN.elexisLoincTable }, decimals: 1 },
  { id: 'hb', label: 'Haemoglobin', short: 'Hb', description: 'Haemoglobin concentration.', sections: ['labs', 'abg', 'vbg'], aliases: ['hb', 'hgb', 'thb'], kind: 'number', dimension: 'mass-concentration', unit: 'g/dL', units: ['g/dL', 'g/L', 'mmolHb/L'], hard: { min: 0.5, max: 30 }, soft: { min: 3, max: 22 }, doubt: { min: 0.5, max: 22 }, boundsSource: `${CP}; mmol/L is read by the molar mass of the haemoglobin monomer (16,114.5 g/mol: 1 mmol/L = 1.61145 g/dL, from memory), and a bare Hb is read in g/dL: above 22 it is doubted as g/L, and a low one (below 3) stays in g/dL, unusual, rather than being doubted as mmol/L`, loinc: { code: '718-7', display: 'Hemoglobin [Mass/volume] in Blood', source: SEEN.top2000 }, decimals: 1 },
  { id: 'na', label: 'Sodium', short: 'Na', description: 'Serum or plasma sodium on a labs line, whole-blood sodium on a blood gas line.', sections: ['labs', 'abg', 'vbg'], aliases: ['na', 'sodium'], kind: 'number', dimension: 'substance-concentration', unit: 'mmol/L', units: ['mmol/L', 'mEq/L'], hard: { min: 80, max: 200 }, soft: { min: 110, max: 170 }, boundsSource: CP, loinc: { code: '2951-2', display: 'Sodium [Moles/volume] in Serum or Plasma', source: SEEN.sodiumGroup }, loincBySection: { abg: NA_BLOOD, vbg: NA_BLOOD }, decimals: 0 },
  { id: 'k', label: 'Potassium', short: 'K', description: 'Serum or plasma potassium on a labs line, whole-blood potassium on a blood gas line.', sections: ['labs', 'abg', 'vbg'], aliases: ['k', 'potassium'], kind: 'number', dimension: 'substance-concentration', unit: 'mmol/L', units: ['mmol/L', 'mEq/L'], hard: { min: 0.5, max: 12 }, soft: { min: 1.5, max: 8 }, boundsSource: CP, loinc: { code: '2823-3', display: 'Potassium [Moles/volume] in Serum or Plasma', source: SEEN.top2000 }, loincBySection: { abg: K_BLOOD, vbg: K_BLOOD }, decimals: 1 },
  { id: 'cl', label: 'Chloride', short: 'Cl', description: 'Serum or plasma chloride on a labs line, whole-blood chloride on a blood gas line.', sections: ['labs', 'abg', 'vbg'], aliases: ['cl', 'chloride'], kind: 'number', dimension: 'substance-concentration', unit: 'mmol/L', units: ['mmol/L', 'mEq/L'], hard: { min: 40, max: 180 }, soft: { min: 70, max: 140 }, boundsSource: CP, loinc: { code: '2075-0', display: 'Chloride [Moles/volume] in Serum or Plasma', source: SEEN.chlorideSerum }, loincBySection: { abg: CL_BLOOD, vbg: CL_BLOOD }, decimals: 0 },
  { id: 'hco3_serum', label: 'Bicarbonate (serum)', short: 'HCO3(serum)', description: 'Serum bicarbonate or total CO2 from the laboratory.', sections: ['labs'], aliases: ['hco3', 'tco2', 'bicarb'], kind: 'number', dimension: 'substance-concentration', unit: 'mmol/L', units: ['mmol/L', 'mEq/L'], hard: { min: 1, max: 80 }, soft: { min: 5, max: 50 }, boundsSource: CP, loinc: { code: '1963-8', display: 'Bicarbonate [Moles/volume] in Serum or Plasma', source: SEEN.loinc1963 }, loincByKey: { tco2: { code: '2028-9', display: 'Carbon dioxide, total [Moles/volume] in Serum or Plasma', source: SEEN.totalCo2 } }, decimals: 1 },
  { id: 'albumin', label: 'Albumin', description: 'Serum albumin (g/dL; write g/L explicitly).', sections: ['labs'], aliases: ['albumin', 'alb'], kind: 'number', dimension: 'mass-concentration', unit: 'g/dL', units: ['g/dL', 'g/L'], hard: { min: 0.3, max: 8 }, soft: { min: 1, max: 6 }, boundsSource: CP, loinc: { code: '1751-7', display: 'Albumin [Mass/volume] in Serum or Plasma', source: SEEN.vulcanAlbumin }, decimals: 1 },
  { id: 'glucose', label: 'Glucose', description: 'Serum or plasma glucose on a labs line, whole-blood glucose on a blood gas line.', sections: ['labs', 'abg', 'vbg'], aliases: ['glucose', 'glu'], kind: 'number', dimension: 'substance-concentration', unit: 'mmol/L', units: ['mmol/L', 'mg/dL'], hard: { min: 0.2, max: 150 }, soft: { min: 1.5, max: 40 }, boundsSource: `${CP}; mg/dL is read by the molar mass of glucose (18.016 mg/dL per mmol/L), and a bare glucose above 40 is doubted as mg/dL, the unit such values are written in`, loinc: { code: '14749-6', display: 'Glucose [Moles/volume] in Serum or Plasma', source: SEEN.glucoseSerum }, loincBySection: { abg: GLUCOSE_BLOOD, vbg: GLUCOSE_BLOOD }, decimals: 1 },
];

/**
 * Every row as an object of one shape: all properties present, in one order (absent ones
 * undefined). Code that reads fields runs for every value of a note, and rows of many shapes
 * would make each of those reads search a table of shapes.
 */
function oneShape(f: FieldDef): FieldDef {
  return {
    id: f.id, label: f.label, short: f.short, description: f.description, sections: f.sections, aliases: f.aliases, kind: f.kind,
    dimension: f.dimension, unit: f.unit, units: f.units, bare: f.bare, hard: f.hard && oneBounds(f.hard), soft: f.soft && oneBounds(f.soft), doubt: f.doubt && oneBounds(f.doubt),
    boundsSource: f.boundsSource, loinc: f.loinc, loincBySection: f.loincBySection, loincByKey: f.loincByKey, words: f.words && withHyphens(f.words), openWords: f.openWords, reading: f.reading, measuredIn: f.measuredIn, setIn: f.setIn, join: f.join, decimals: f.decimals,
  };
}

/**
 * `words` with the spellings of its names of several words with their words joined by hyphens
 * instead of blanks, wholly or in part (`nasal-cannula`, `simple face-mask`, `non-rebreather-mask`),
 * each read as the name is: a word with hyphens is one word to the lexer, and clinicians write
 * device names so. The docs and completion leave them out (`isHyphenSpelling`), since they follow
 * from the rule the spec states.
 */
function withHyphens(words: Readonly<Record<string, string>>): Readonly<Record<string, string>> {
  const out: Record<string, string> = { ...words };
  for (const [written, word] of Object.entries(words)) {
    const parts = written.split(' ');
    const gaps = parts.length - 1;
    // Every choice of blank or hyphen for each gap but all blanks (the row's own spelling).
    for (let mask = 1; mask < 1 << gaps; mask++) {
      let joined = parts[0]!;
      for (let g = 0; g < gaps; g++) joined += ((mask >> g) & 1 ? '-' : ' ') + parts[g + 1]!;
      if (!Object.hasOwn(out, joined)) out[joined] = word;
    }
  }
  return out;
}

/** Bounds of one shape too (`min` and `max` both present). */
function oneBounds(b: Bounds): Bounds {
  return { min: b.min, max: b.max };
}

export const FIELDS: readonly FieldDef[] = ROWS.map(oneShape);

/** The spellings `withHyphens` made, those of no row (lower case). */
const HYPHEN_SPELLINGS: ReadonlySet<string> = new Set(FIELDS.flatMap((f, i) => Object.keys(f.words ?? {}).filter((w) => !Object.hasOwn(ROWS[i]!.words ?? {}, w))));

/** Whether `spelling` (lower case) is a name joined by hyphens that `withHyphens` made, not one a row writes. */
export function isHyphenSpelling(spelling: string): boolean {
  return HYPHEN_SPELLINGS.has(spelling);
}

const bySectionKey = new Map<SectionId, Map<string, FieldDef>>();
const byId = new Map<string, FieldDef>();
for (const f of FIELDS) {
  byId.set(f.id, f);
  for (const s of f.sections) {
    const keys = bySectionKey.get(s) ?? new Map<string, FieldDef>();
    bySectionKey.set(s, keys);
    for (const a of f.aliases) if (!keys.has(a)) keys.set(a, f);
  }
}

export function fieldFor(section: SectionId, key: string): FieldDef | undefined {
  const keys = bySectionKey.get(section);
  return keys?.get(key) ?? keys?.get(key.toLowerCase());
}

export function fieldById(id: string): FieldDef | undefined {
  return byId.get(id);
}

export function shortName(field: FieldDef): string {
  return field.short ?? field.aliases[0] ?? field.id;
}

export function fieldsInSection(section: SectionId): readonly FieldDef[] {
  return FIELDS.filter((f) => f.sections.includes(section));
}

/** All keys that may be written in a section (canonical and aliases). */
export function keysInSection(section: SectionId): readonly string[] {
  const keys: string[] = [];
  for (const f of FIELDS) if (f.sections.includes(section)) keys.push(...f.aliases);
  return keys;
}

/** Reads a word value for a word field; null when the word is not accepted. */
export function canonicalWord(field: FieldDef, word: string): string | null {
  const known = field.words?.[word.toLowerCase()];
  if (known) return known;
  return field.openWords ? word : null;
}

/**
 * The LOINC code of a field as stated in `section` with `key` (lower case): the code of the key
 * where it has one, else the code of the section, else the field's.
 */
export function loincFor(field: FieldDef, section: SectionId, key: string | null = null): LoincCode | undefined {
  return (key === null ? undefined : field.loincByKey?.[key]) ?? field.loincBySection?.[section] ?? field.loinc;
}

/** Every LOINC code a field may carry (its own, per section, per key), each once. */
export function loincCodesOf(field: FieldDef): readonly LoincCode[] {
  const all = [field.loinc, ...Object.values(field.loincBySection ?? {}), ...Object.values(field.loincByKey ?? {})];
  return all.filter((c, i): c is LoincCode => c !== undefined && all.findIndex((d) => d?.code === c.code) === i);
}
