/**
 * FHIR R4 export: one `Bundle` of type `collection` per note, holding one `Observation` per number
 * the note states about the patient and the treatment.
 *
 * What becomes an Observation:
 * - each usable number (or pair) stated at a timepoint (`here`; carried values are not repeated:
 *   the Observation of the timepoint that stated them stands), a field stated in two sections there
 *   once per section (a ventilator's FiO2 beside a gas's sampling FiO2, sodium on a blood gas line
 *   and on a labs line; a value replaced in its own section, PN206, or a setting not used, PN311,
 *   is left out), from the sections patient, vitals,
 *   oxygen, vent, abg, vbg and labs. Words (sex, oxygen device, ventilator mode, gas unit) and the
 *   place (altitude, barometric pressure: the surroundings, not the patient) are not exported;
 *   CSV and JSON Lines have them;
 * - each header value (patient line before the first timepoint), once per note and without a
 *   time: age, height, weight describe the patient for the whole note (also in a note with no
 *   timepoint, and beside the value of a timepoint that states the field again);
 * - of the derived values, only those LOINC has a code for: the P/F ratio (Horowitz index,
 *   50984-4, value in mmHg), with `derivedFrom` pointing at the PaO2 and FiO2 Observations it
 *   used (at this timepoint or, for a carried FiO2, the one that stated it);
 * - blood pressure as one Observation with the panel code of the registry and two components.
 *
 * Codes: `code.text` is always our label; `code.coding` holds the field's LOINC code from the
 * registry (per key where it has one: a serum value written as `tco2` is total CO2; else per
 * section where it has one: a ventilator's FiO2 is a setting, sodium, potassium, chloride and
 * glucose on a blood gas line are whole blood, on a labs line serum or plasma, and a base excess
 * from a `vbg` line is coded as venous blood, the arterial code being for `abg` lines) only when what the
 * code's name says agrees with the value (`fhirLoinc`, `loincMismatch`):
 * - a `[Mass/volume]` code never on a value in mmol/L, nor `[Moles/volume]` on one in g/dL;
 * - an arterial-blood code never on a value from a `vbg` line, nor a venous one on an `abg` line;
 * - a serum-or-plasma code never on a value from a blood gas (`abg`, `vbg`: whole blood);
 * - the oxygen flow code (3151-8) never on the flow of a high-flow device (`hfnc`), which is the
 *   total gas flow;
 * - the bicarbonate code never on a value written as `tco2` (total CO2), nor the total CO2 code on a
 *   value written with another key;
 * - the tidal volume setting code (20112-9) never on a tidal volume written under a mode that sets
 *   none (PC, PS, APRV, CPAP, HFOV: it was delivered), nor the inspiratory flow setting code
 *   (76275-7) on a flow written under a mode that sets no flow (PC, PRVC, PS, APRV, CPAP, HFOV: the
 *   flow follows the pressure, so the value was measured), nor on a tidal volume measured under
 *   NIV or CPAP of an oxygen line (`noninvasiveSupport`: by its device, or with none named, its
 *   pressures; the rule by which the timeline reads that volume as measured);
 * - a code whose name says `setting` never on a reading (plateau, peak, mean airway pressure,
 *   minute volume, end-tidal CO2), nor one measured `--on ventilator` on a setting: a mean airway
 *   pressure set in HFOV, which the timeline holds as a setting, is exported without 76530-5 and
 *   in the therapy category.
 * A value whose field has no code, or whose code does not fit, is still exported, with `code.text`
 * alone and no coding: a wrong code is worse than none. A code marked `fromMemory` in the registry
 * was recalled, not read from the LOINC table; the others name in `source` the page they were read
 * on, or come from the project's reference notes. Nothing is looked up when exporting.
 *
 * Every Observation has `status: final` and a `valueQuantity` in the field's canonical unit
 * (gases in mmHg, whatever the note wrote; but the age in the unit it was written in: years `a`,
 * months `mo`, weeks `wk`, days `d`), to 12 significant digits (precision.ts), with the UCUM code of the unit
 * registry (`system` http://unitsofmeasure.org). Observations have no performer or identifier:
 * notes carry none.
 *
 * Subject: FHIR R4's vital-signs profile, which R4 applies to every Observation with one of its
 * codes (`VITAL_SIGN_LOINC`), asks for one patient in `subject`. Notes name nobody, so each Bundle
 * holds one anonymous Patient, its last entry: `id` `patient` and nothing else (no name,
 * identifier, birth date or sex), and every Observation of the Bundle (not only the vital signs)
 * names it in `subject` by its fullUrl. Its fullUrl is made from the Bundle's id, so it is unique to
 * the note as that is. A Bundle with no Observation has no Patient. An Observation with a code of
 * that list is in the vital-signs category as well as its field's (an arterial SaO2: laboratory
 * and vital-signs), since the profile asks for that category. Their units are of the profile's
 * units (ValueSet ucum-vitals-common: /min, %, Cel, mm[Hg], cm, kg), which
 * tests/export/fhir-vital-signs.test.ts checks.
 *
 * The Bundle: `type` collection (a set of resources to be read, not a transaction for a server to
 * run), no `timestamp` (the time of the export would make every run's output differ; the same note
 * gives the same bytes), and an `identifier` that says which note it came from, so a consumer can
 * find a note's Bundle or join it with the rows of CSV and JSON Lines: `system`
 * `urn:pneumark:note` (`NOTE_IDENTIFIER_SYSTEM`, a URN of our own, nothing to look up) and `value`
 * the path as the command names the note, the text of the `file` column (relative to the working
 * folder, forward slashes; `<stdin>`, or the `--stdin-name` path, for standard input). In a
 * redacted export the value is the pseudonym (`note-00001`), also the `file` column there, in a
 * system of its own (`urn:pneumark:redacted-note`, `pseudonymous`): a place in one run, which
 * another run may give another note, and no part of the path. Text from the note or its path (the
 * identifier, the labels in the notes) is written with each character a FHIR string may not hold
 * escaped (`fhirString`: a no-break space, a control), which the R4 JSON schema would refuse.
 *
 * Categories (http://terminology.hl7.org/CodeSystem/observation-category), by the field's first
 * section: vitals → vital-signs; abg, vbg and labs → laboratory (and the P/F ratio, a blood-gas
 * index); oxygen and vent → therapy for settings (FiO2, oxygen flow, tidal volume, PEEP, pressure
 * support and inspiratory flow are settings of the treatment, not measurements of the patient, and
 * their codes name settings; likewise the set rate, the set inspiratory pressure, the oscillation
 * amplitude, IPAP, EPAP and CPAP, which have no code) and
 * none for what is read off the ventilator (plateau, peak and mean airway pressure, minute volume:
 * the mechanics of the ventilated lung as the machine measures them, neither a setting nor one of
 * FHIR's vital signs, and their codes name measurements `--on ventilator`; but the mean airway
 * pressure set in HFOV, a setting there, is therapy); patient → vital-signs
 * for height and weight (both belong to FHIR's vital-signs set), no category for age. A field has
 * one category whatever its line: sodium, potassium, chloride, glucose and lactate are laboratory
 * values on a blood gas line too, and end-tidal CO2 (first in vitals) is vital-signs on a vent line
 * too: it measures the patient's exhaled gas (its code names exhaled gas, not the ventilator), on a
 * monitor or on the ventilator alike, and is no setting; its unit (mm[Hg]) is one of the
 * vital-signs profile's, whose code binding is extensible and has no code for it. Cardiac output
 * (vitals) has no category: it is not one of FHIR's vital signs (its code, 8741-1, is none of the
 * profile's, and L/min none of the profile's units, so a consumer that selects vital signs by
 * category and applies the profile would refuse it), nor a laboratory value, a setting or an
 * examination finding; and `procedure` (catheter thermodilution) or `imaging` (an echocardiogram)
 * would name a method the note does not write. An Observation in the vital-signs category meets
 * the profile whatever its code (tests/export/fhir-vital-signs.test.ts).
 *
 * Time: notes hold relative days and clock times only. With `anchor` (an ISO 8601 date-time with
 * seconds optional and a zone, `Z` or `±hh:mm`, meaning 00:00 of day 1, so its time must be
 * 00:00: `2024-03-01T08:00Z` would move every clock time of the note by 8 hours and is refused),
 * `effectiveDateTime` is the anchor plus the timepoint's minutes plus shiftDays × 1440 minutes, written with the
 * anchor's own offset: the note's clock times are read as wall-clock times at that fixed offset,
 * with no daylight-saving change applied (a note that crosses one is an hour off after it). A
 * timepoint whose day is known but not its time of day (`@ day 3`) gets the date alone
 * (`2024-03-03`, a dateTime to the day, as FHIR allows); one whose time is unknown (an offset
 * from an implicit first timepoint) gets no effective time.
 * Without an anchor no effective time is written, since a relative time is not a FHIR dateTime;
 * each Observation then says in `note` which timepoint (and relative day and clock time) it
 * belongs to. With redactProse that note leaves out the timepoint's label. Where no date is
 * written (no anchor, a header value, a timepoint whose time is unknown), `_effectiveDateTime`
 * holds FHIR's data-absent-reason extension with the code `unknown` (the vital-signs profile asks
 * for an effective time, or the reason there is none): the note gives no date. Not `masked`:
 * `--redact` withholds no date (an anchor is written with it as without).
 *
 * Ids: a resource's `id` is `obs-<timepoint>-<field>` (`obs-header-<field>` for header values;
 * `_` becomes `-`, which FHIR ids do not allow) for the value in force, and
 * `obs-<timepoint>-<field>-<section>` for the same field stated in another section there; its `fullUrl` is `urn:uuid:` with a UUID-shaped
 * id derived from the note's key (its path, or its pseudonym in a redacted export) and the
 * Observation as written (its JSON: id, codes, value, unit, time, note, and the fullUrls it is
 * derived from; not its `subject` nor `_effectiveDateTime`, which follow from the note's key and
 * from the absence of a date: the fullUrls are those written before Observations had them)
 * (stable-id.ts): the same on every run, and kept by every Observation a correction
 * elsewhere in the note leaves as it was, while a corrected value (and a P/F made from it) gets a
 * new one. The Bundle's id is made from the note's key alone, or with `bundleIdFromEntries` (a
 * redacted export, whose key is only a place in the run) from the key and every entry's fullUrl.
 * A note read from standard input with no path given for it (the CLI's `--stdin-name`) is named
 * by its text instead (`stdinNoteKey`).
 */
import type { NoteResult } from '../check-note';
import type { InputValue, StatedValue, Timepoint } from '../analysis/model';
import { noninvasiveSupport, SUPPORT_NAMES, type NoninvasiveSupport } from '../analysis/noninvasive-support';
import type { DerivedValue } from '../derive/model';
import { derivedValueOf } from '../derive/registry';
import { FIELDS, loincFor, type FieldDef, type LoincCode } from '../fields/registry';
import { measuredByMode } from '../fields/modes';
import { convert, unitById } from '../fields/units';
import type { SectionId } from '../fields/sections';
import { assertExportOptions, writtenLabel } from './columns';
import { exportedNumber } from './precision';
import { stableHex128, stableUuid, StableIds } from './stable-id';
import { unitForPeople } from './units';
import { escapedCode } from '../util/format';

export interface FhirOptions {
  /** ISO 8601 date-time with a zone for 00:00 of day 1 (`2024-03-01T00:00:00+01:00`). */
  readonly anchor?: string;
  /** Leave the timepoint labels out of the Observations' notes. */
  readonly redactProse: boolean;
  /** Whole days added to every time (to the effective time with an anchor, to the day in the note). */
  readonly shiftDays: number;
  /**
   * What names the note in the ids (the Bundle's id and each entry's fullUrl); the path when not
   * given. A note read from standard input has no path of its own: `stdinNoteKey` names it by its
   * text, so bundles exported from different inputs do not share ids.
   */
  readonly noteKey?: string;
  /**
   * Make the Bundle's id from the note's key and its entries' fullUrls rather than from the key
   * alone: for a redacted export, whose key (`note-00001`) is the same for the notes in the same
   * place of two exports, which must not share a Bundle id.
   */
  readonly bundleIdFromEntries?: boolean;
  /**
   * `path` is the note's pseudonym in a redacted export (`note-00001`), not a path: the Bundle's
   * identifier gives it in a system of its own (`REDACTED_NOTE_IDENTIFIER_SYSTEM`).
   */
  readonly pseudonymous?: boolean;
}

export interface FhirCoding {
  readonly system: string;
  readonly code: string;
  readonly display?: string;
}

export interface FhirCodeableConcept {
  /** Left out when no code fits (FHIR has no empty arrays): `text` alone says what was observed. */
  readonly coding?: readonly FhirCoding[];
  readonly text?: string;
}

export interface FhirQuantity {
  readonly value: number;
  readonly unit: string;
  readonly system: string;
  readonly code: string;
}

export interface FhirObservationComponent {
  readonly code: FhirCodeableConcept;
  readonly valueQuantity: FhirQuantity;
}

/** A reference to another entry of the Bundle, by its fullUrl. */
export interface FhirReference {
  readonly reference: string;
}

/** The primitive's extension saying why it has no value (FHIR's data-absent-reason). */
export interface FhirAbsentPrimitive {
  readonly extension: readonly { readonly url: string; readonly valueCode: 'unknown' }[];
}

export interface FhirObservation {
  readonly resourceType: 'Observation';
  readonly id: string;
  readonly status: 'final';
  readonly category?: readonly FhirCodeableConcept[];
  readonly code: FhirCodeableConcept;
  /** The Bundle's Patient (`FhirPatient`): the same reference in every Observation of the Bundle. */
  readonly subject: FhirReference;
  /** When the export knows the date (an anchor, a timepoint with a known day); else `_effectiveDateTime`. */
  readonly effectiveDateTime?: string;
  /** The data-absent-reason `unknown` where the note gives no date (see the header comment). */
  readonly _effectiveDateTime?: FhirAbsentPrimitive;
  readonly valueQuantity?: FhirQuantity;
  readonly derivedFrom?: readonly { readonly reference: string }[];
  readonly note?: readonly { readonly text: string }[];
  readonly component?: readonly FhirObservationComponent[];
}

/**
 * The subject of a Bundle's Observations: an anonymous patient, its id alone (no name, identifier,
 * birth date or anything else: notes carry no identity). One per Bundle, its last entry.
 */
export interface FhirPatient {
  readonly resourceType: 'Patient';
  readonly id: typeof PATIENT_ID;
}

export interface FhirObservationEntry {
  readonly fullUrl: string;
  readonly resource: FhirObservation;
}

export interface FhirPatientEntry {
  readonly fullUrl: string;
  readonly resource: FhirPatient;
}

export type FhirBundleEntry = FhirObservationEntry | FhirPatientEntry;

export interface FhirIdentifier {
  readonly system: string;
  readonly value: string;
}

export interface FhirBundle {
  readonly resourceType: 'Bundle';
  readonly id: string;
  /** Which note the Bundle came from: its path as the command names it, or its pseudonym (see the header comment). */
  readonly identifier: FhirIdentifier;
  readonly type: 'collection';
  /**
   * The Observations, then their Patient; left out when the note states nothing exported (FHIR has
   * no empty arrays, and a Patient that nothing is about is not written).
   */
  readonly entry?: readonly FhirBundleEntry[];
}

/** The Observations of a Bundle (every entry but its Patient), in order. */
export function bundleObservations(bundle: FhirBundle): FhirObservation[] {
  const out: FhirObservation[] = [];
  for (const e of bundle.entry ?? []) if (e.resource.resourceType === 'Observation') out.push(e.resource);
  return out;
}

/** The Observation entries of a Bundle (every entry but its Patient's), in order. */
export function observationEntries(bundle: FhirBundle): FhirObservationEntry[] {
  const out: FhirObservationEntry[] = [];
  for (const e of bundle.entry ?? []) if (e.resource.resourceType === 'Observation') out.push(e as FhirObservationEntry);
  return out;
}

const LOINC = 'http://loinc.org';
const UCUM = 'http://unitsofmeasure.org';
const CATEGORY_SYSTEM = 'http://terminology.hl7.org/CodeSystem/observation-category';
const MINUTES_PER_DAY = 1440;

/** The id of each Bundle's Patient (unique within its Bundle, as the Observations' ids are). */
export const PATIENT_ID = 'patient';
/** FHIR's extension for why an element has no value. */
export const DATA_ABSENT_REASON_URL = 'http://hl7.org/fhir/StructureDefinition/data-absent-reason';
/**
 * The LOINC codes for which an Observation is to conform to FHIR's vital-signs profile: the 12 of
 * its Vital Signs value set (observation-vitalsignresult, to which the profile binds the code,
 * extensibly), read in its R5 page and its current build, whose R4 and R4B pages give the same
 * definition, with the R4 oxygen saturation profile fixing 2708-6 (read at hl7.org/fhir/R4/oxygensat.html);
 * and two that the extensible binding allows and that are vital signs by their LOINC names, 59408-5
 * (SpO2 by pulse oximetry) and 8478-0 (mean blood pressure). Such an Observation is in the
 * vital-signs category whatever its field's category, since the profile asks for it (an arterial
 * SaO2, 2708-6, is laboratory and vital-signs). tests/export/fhir-vital-signs.test.ts pins the list.
 */
export const VITAL_SIGN_LOINC: ReadonlySet<string> = new Set(['85353-1', '9279-1', '8867-4', '2708-6', '59408-5', '8310-5', '8302-2', '9843-4', '29463-7', '39156-5', '85354-9', '8480-6', '8462-4', '8478-0']);

/** The effective time of an Observation whose date the export does not know: one object, shared. */
const EFFECTIVE_UNKNOWN: FhirAbsentPrimitive = Object.freeze({ extension: Object.freeze([Object.freeze({ url: DATA_ABSENT_REASON_URL, valueCode: 'unknown' as const })]) });

/**
 * The system of a Bundle's identifier when its value is the note's path, as the command names it
 * (the `file` column of CSV and JSON Lines). A URN of Pneumark's own: nothing to look up.
 */
export const NOTE_IDENTIFIER_SYSTEM = 'urn:pneumark:note';
/**
 * The system of a Bundle's identifier when its value is the note's pseudonym in a redacted export
 * (`note-00001`): a place in one run, which another run gives another note, never a path.
 */
export const REDACTED_NOTE_IDENTIFIER_SYSTEM = 'urn:pneumark:redacted-note';

export type ObservationCategory = 'vital-signs' | 'laboratory' | 'therapy';

const CATEGORY_DISPLAY: Readonly<Record<ObservationCategory, string>> = {
  'vital-signs': 'Vital Signs',
  laboratory: 'Laboratory',
  therapy: 'Therapy',
};

const CATEGORY_OF_SECTION: Readonly<Record<SectionId, ObservationCategory | null>> = {
  patient: 'vital-signs',
  place: null,
  units: null,
  vitals: 'vital-signs',
  oxygen: 'therapy',
  vent: 'therapy',
  abg: 'laboratory',
  vbg: 'laboratory',
  labs: 'laboratory',
  note: null,
};

/**
 * The observation category of a field (see the header comment); null for none. `reading` says
 * whether the value is read off the device, where that differs from its field (a mean airway
 * pressure set in HFOV is a setting: therapy).
 */
export function observationCategory(field: FieldDef, reading: boolean = field.reading === true): ObservationCategory | null {
  // Age: no observation of the body's functions. Cardiac output: not one of FHIR's vital signs (its
  // code is none of the profile's, L/min none of its units), and how it was measured is not
  // written (see the header comment).
  if (field.id === 'age' || field.id === 'cardiac_output') return null;
  const section = field.sections[0];
  const category = section ? CATEGORY_OF_SECTION[section] : null;
  // Plateau, peak and mean airway pressure, minute volume: read off the ventilator, not a setting.
  // End-tidal CO2 is first in vitals, so it is vital-signs on a vent line too (see the header comment).
  return category === 'therapy' && reading ? null : category;
}

/** Sections whose numbers are exported as Observations (see the header comment). */
const OBSERVED_SECTIONS: ReadonlySet<SectionId> = new Set<SectionId>(['patient', 'vitals', 'oxygen', 'vent', 'abg', 'vbg', 'labs']);

/**
 * Fields of those sections that are not exported: the SpO2 target is a prescription, neither a
 * measurement nor a setting of a device, and no LOINC code for a saturation target was found (none
 * is made up), so CSV and JSON Lines carry it and FHIR does not.
 */
const NOT_OBSERVED: ReadonlySet<string> = new Set(['spo2_target']);

/** Whether a field's values become Observations: numbers and pairs about the patient or the treatment. */
export function isObservedField(field: FieldDef): boolean {
  const section = field.sections[0];
  return field.kind !== 'word' && section !== undefined && OBSERVED_SECTIONS.has(section) && !NOT_OBSERVED.has(field.id);
}

/** What else decides whether a code fits: the key the note wrote, the oxygen device in force. */
export interface WrittenAs {
  /** The key as written, lower case (`tco2` for a serum bicarbonate written as total CO2). */
  readonly key: string | null;
  /** The oxygen device in force at the timepoint (`hfnc`, `cannula`, …). */
  readonly device: string | null;
  /** The ventilator mode in force at the timepoint (`VC`, `PS`, …). */
  readonly mode: string | null;
  /** The non-invasive support in force at the timepoint (`noninvasiveSupport`: by the device, or with none named, its pressures). */
  readonly support: NoninvasiveSupport | null;
  /**
   * Whether the value is a reading off the device, where the timeline reads it otherwise than its
   * field (a mean airway pressure set in HFOV is held as a setting); left out: as its field says.
   */
  readonly reading?: boolean;
}

const NOTHING_MORE: WrittenAs = { key: null, device: null, mode: null, support: null };

/**
 * Why a LOINC code does not fit a value of `field` stated in `section`, read from what the code's
 * name says (its property in brackets, its specimen after `in`); null when nothing contradicts it.
 */
export function loincMismatch(loinc: LoincCode, field: FieldDef, section: SectionId, written: WrittenAs = NOTHING_MORE): string | null {
  const name = loinc.display;
  const device = written.device;
  const reading = written.reading ?? field.reading === true;
  // `tco2` is total CO2 (bicarbonate plus dissolved CO2 and carbamino CO2), which LOINC codes apart from bicarbonate.
  if (/^Bicarbonate\b/.test(name) && written.key === 'tco2') return `${loinc.code} is bicarbonate, the value was written as total CO2 (tco2)`;
  if (/^Carbon dioxide, total\b/.test(name) && written.key !== null && written.key !== 'tco2') return `${loinc.code} is total CO2, the value was written as ${written.key}`;
  // A setting is what the clinician chose, a reading what was measured: neither code fits the other.
  if (/\bsetting\b/.test(name) && reading) return `${loinc.code} is a setting, the value is a reading`;
  if (/--on ventilator\b/.test(name) && !reading) return `${loinc.code} is measured on the ventilator, the value is a setting`;
  // A volume or a flow written under a mode that sets none was delivered, so it was measured.
  // Settings some ventilator modes do not set (the registry's `measuredIn`, per mode family: no set tidal
  // volume under pressure-controlled or -supported breaths, no set inspiratory flow there nor under PRVC).
  const notSet = field.measuredIn !== undefined ? field.label.toLowerCase() : null;
  // The one rule (fields/modes.ts): under the mode, or with none under NIV or CPAP (a vent line of readings).
  const support = written.mode === null ? written.support : null;
  if (notSet && /\bsetting\b/.test(name) && measuredByMode(field, written.mode, support)) return `${loinc.code} is a set ${notSet}, and ${written.mode ?? SUPPORT_NAMES[support!]} sets none`;
  // A high-flow device's flow is the total gas flow (air and oxygen blended to the FiO2), not the oxygen flow.
  if (/^Inhaled oxygen flow rate\b/.test(name) && device === 'hfnc') return `${loinc.code} is the oxygen flow, the value is the total gas flow of a high-flow device`;
  if (name.includes('[Mass/volume]') && field.dimension !== 'mass-concentration') return `${loinc.code} is a mass concentration, the value is not`;
  if (name.includes('[Moles/volume]') && field.dimension !== 'substance-concentration') return `${loinc.code} is a substance concentration, the value is not`;
  if (/ in Arterial blood\b/.test(name) && section === 'vbg') return `${loinc.code} is for arterial blood, the value is from a venous gas`;
  if (/ in Venous blood\b/.test(name) && section === 'abg') return `${loinc.code} is for venous blood, the value is from an arterial gas`;
  if (/ in Serum or Plasma\b/.test(name) && (section === 'abg' || section === 'vbg')) return `${loinc.code} is for serum or plasma, the value is from a blood gas (whole blood)`;
  return null;
}

/** The LOINC code an Observation of `field` stated in `section` carries, or null (see the header comment). */
export function fhirLoinc(field: FieldDef, section: SectionId, written: WrittenAs = NOTHING_MORE): LoincCode | null {
  const loinc = loincFor(field, section, written.key);
  return loinc && loincMismatch(loinc, field, section, written) === null ? loinc : null;
}

// Blood pressure components (the registry holds only the panel code), as the blood pressure example
// of FHIR 6.0.0-ballot1 codes them: https://hl7.org/fhir/6.0.0-ballot1/observation-example-bloodpressure.html
const SYSTOLIC: FhirCoding = { system: LOINC, code: '8480-6', display: 'Systolic blood pressure' };
const DIASTOLIC: FhirCoding = { system: LOINC, code: '8462-4', display: 'Diastolic blood pressure' };

// The P/F ratio (Horowitz index), with the LOINC name the value set of ventilation codes of the MII
// ICU module shows for it (CPG on EBMonFHIR 1.0.2 build, ValueSet vs-mii-icu-code-observation-beatmung-loinc:
// https://build.fhir.org/ig/CEOsys/cpg-on-ebm-on-fhir/ValueSet-vs-mii-icu-code-observation-beatmung-loinc.json.html).
// The name this code was written with before ("… in Arterial blood+Inspired gas") was recalled, and wrong.
const PF_RATIO: FhirCoding = { system: LOINC, code: '50984-4', display: 'Horowitz index in Arterial blood' };

// ── time ──────────────────────────────────────────────────────────────────────

interface Anchor {
  /** The anchor's wall-clock time as if it were UTC, in milliseconds. */
  readonly wallMs: number;
  /** `Z` or `±hh:mm`, written back after every shifted time. */
  readonly zone: string;
}

const ANCHOR_PATTERN = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?(Z|[+-]\d{2}:\d{2})$/;

function parseAnchor(anchor: string): Anchor | string {
  const m = ANCHOR_PATTERN.exec(anchor);
  if (!m) return `the anchor \`${anchor}\` is not an ISO 8601 date-time with a zone, e.g. 2024-03-01T00:00:00Z or 2024-03-01T00:00+01:00`;
  const [year, month, day, hour, minute, second] = [m[1], m[2], m[3], m[4], m[5], m[6] ?? '0'].map(Number) as [number, number, number, number, number, number];
  const ms = Number((m[7] ?? '').padEnd(3, '0').slice(0, 3));
  const zone = m[8] ?? 'Z';
  // `Date.UTC` reads years 0 to 99 as 1900 to 1999: the year is set on its own.
  const back = new Date(Date.UTC(2000, 0, 1, hour, minute, second, ms));
  back.setUTCFullYear(year, month - 1, day);
  const wallMs = back.getTime();
  // Offsets run from -14:00 to +14:00, as FHIR's dateTime pattern has them (+14:30 is no zone, and not FHIR).
  const zoneHours = Number(zone.slice(1, 3));
  const zoneMinutes = Number(zone.slice(4, 6));
  const zoneOk = zone === 'Z' || (zoneMinutes < 60 && (zoneHours < 14 || (zoneHours === 14 && zoneMinutes === 0)));
  if (year < 1 || back.getUTCFullYear() !== year || back.getUTCMonth() !== month - 1 || back.getUTCDate() !== day || hour > 23 || minute > 59 || second > 59 || !zoneOk) {
    return `the anchor \`${anchor}\` is not a valid date and time`;
  }
  // The note's clock times are added to the anchor: any other time than 00:00 would move every one.
  if (hour !== 0 || minute !== 0 || second !== 0 || ms !== 0) {
    return `the anchor \`${anchor}\` is 00:00 of day 1, and the note's clock times are added to it: write its time as 00:00 (${m[1]}-${m[2]}-${m[3]}T00:00:00${zone})`;
  }
  return { wallMs, zone };
}

/** Why an anchor cannot be used, or null when it can (for the CLI's usage errors). */
export function anchorProblem(anchor: string): string | null {
  const parsed = parseAnchor(anchor);
  return typeof parsed === 'string' ? parsed : null;
}

const pad = (n: number, width = 2): string => String(n).padStart(width, '0');

/** The anchor plus some minutes, as a FHIR dateTime in the anchor's offset; null outside years 1–9999. */
function shiftedDateTime(anchor: Anchor, minutes: number): string | null {
  const d = new Date(anchor.wallMs + minutes * 60_000);
  const year = d.getUTCFullYear();
  if (!Number.isFinite(d.getTime()) || year < 1 || year > 9999) return null;
  const ms = d.getUTCMilliseconds();
  return `${pad(year, 4)}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())}T${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}:${pad(d.getUTCSeconds())}${ms ? `.${pad(ms, 3)}` : ''}${anchor.zone}`;
}

/** `day 2 08:00` (shifted), `day 2` when only the day is known, null when nothing is. */
function relativeTime(tp: Timepoint, shiftDays: number): string | null {
  const minutes = tp.time.minutes;
  if (minutes !== null && Number.isFinite(minutes)) {
    const total = minutes + shiftDays * MINUTES_PER_DAY;
    const day = Math.floor(total / MINUTES_PER_DAY) + 1;
    const clock = total - (day - 1) * MINUTES_PER_DAY;
    return `day ${day} ${pad(Math.floor(clock / 60))}:${pad(Math.round(clock % 60))}`;
  }
  return tp.time.day !== null && Number.isFinite(tp.time.day) ? `day ${tp.time.day + shiftDays}` : null;
}

/**
 * Whether a UTF-16 code unit is a character a FHIR string may not hold as it is: a control below
 * U+0020 but tab, LF and CR (FHIR R4 datatypes, string: they SHOULD not be there, and XML cannot
 * hold them), or a blank other than those and the space, which the pattern of string in the R4 JSON
 * schema, `^[ \r\n\t\S]+$`, refuses (JSON Schema reads it as ECMAScript does, where `\S` leaves
 * out U+00A0, U+1680, U+2000–U+200A, U+2028, U+2029, U+202F, U+205F, U+3000 and U+FEFF). Lone
 * surrogates are dealt with apart (they are no characters at all).
 */
function notFhirChar(c: number): boolean {
  if (c < 0x20) return c !== 0x09 && c !== 0x0a && c !== 0x0d;
  if (c < 0xa0) return false;
  return c === 0xa0 || c === 0x1680 || (c >= 0x2000 && c <= 0x200a) || c === 0x2028 || c === 0x2029 || c === 0x202f || c === 0x205f || c === 0x3000 || c === 0xfeff;
}

/**
 * Text from the note or its path as a FHIR string: each character a FHIR string may not hold
 * (`notFhirChar`), and each lone surrogate, written as the text output writes such characters
 * (`\x07`, `\u{00A0}`: see `shownEscaped`); anything else as it is. Most text has none, and is
 * returned as it is.
 */
export function fhirString(text: string): string {
  let out: string | null = null;
  let from = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    let bad = notFhirChar(c);
    if (!bad && c >= 0xd800 && c <= 0xdfff) {
      const pair = c <= 0xdbff && i + 1 < text.length && (text.charCodeAt(i + 1) & 0xfc00) === 0xdc00;
      if (pair) {
        i++;
        continue;
      }
      bad = true;
    }
    if (!bad) continue;
    out = (out ?? '') + text.slice(from, i) + escapedCode(c);
    from = i + 1;
  }
  return out === null ? text : out + text.slice(from);
}

function timepointNote(tp: Timepoint, written: string | null, options: FhirOptions): string {
  const when = relativeTime(tp, options.shiftDays);
  const label = options.redactProse || !written ? '' : `: ${fhirString(written)}`;
  return `Pneumark timepoint ${tp.index}${when ? ` (${when})` : ''}${label}`;
}

// ── observations ──────────────────────────────────────────────────────────────

const finite = (value: number | null | undefined): value is number => value !== null && value !== undefined && Number.isFinite(value);

function quantity(value: number, unitId: string): FhirQuantity | null {
  const unit = unitById(unitId);
  const exported = exportedNumber(value);
  if (!unit || exported === null) return null;
  return { value: exported, unit: unitForPeople(unitId) ?? unit.id, system: UCUM, code: unit.ucum };
}

/**
 * An age in the unit it was written in (`age 3 d` is 3 `d`, `age 8 mo` 8 `mo`, a bare age years,
 * `a`), not in years: an age of days in years is a long fraction a reader of the bundle would have
 * to convert back. `value` is in the field's unit (years), `readUnit` the unit it was read in.
 */
function ageQuantity(value: number, unitId: string, readUnit: string | null): FhirQuantity | null {
  const canonical = unitById(unitId);
  const written = readUnit === null ? undefined : unitById(readUnit);
  if (!canonical || !written || written.dimension !== canonical.dimension) return quantity(value, unitId);
  const inWritten = convert(value, canonical, written);
  return inWritten === null ? null : quantity(inWritten, written.id);
}

/** An Observation while it is made, its members added in the order they are written. */
type ObservationParts = { -readonly [K in keyof FhirObservation]?: FhirObservation[K] };

/**
 * The members every Observation starts with, in order: resourceType, id, status, category (when
 * it has one), code, effectiveDateTime (when known). Added one by one rather than spread from
 * objects made for the purpose, which costs more than the rest of the Observation; the order of
 * the members is that of the JSON.
 */
function observationStart(id: string, category: ObservationCategory | null, code: FhirCodeableConcept, place: Place, vitalSign = false): ObservationParts {
  const observation: ObservationParts = { resourceType: 'Observation', id, status: 'final' };
  if (category) observation.category = vitalSign && category !== 'vital-signs' ? [categoryConcept(category), categoryConcept('vital-signs')] : [categoryConcept(category)];
  else if (vitalSign) observation.category = [categoryConcept('vital-signs')];
  observation.code = code;
  observation.subject = place.subject;
  if (place.effective) observation.effectiveDateTime = place.effective;
  else observation._effectiveDateTime = EFFECTIVE_UNKNOWN;
  return observation;
}

function categoryConcept(category: ObservationCategory): FhirCodeableConcept {
  return { coding: [{ system: CATEGORY_SYSTEM, code: category, display: CATEGORY_DISPLAY[category] }] };
}

/**
 * What the fullUrl of an Observation is made from: its JSON but its subject and the reason for a
 * missing effective time, which follow from the note's key and from the absence of a date, both in
 * what the fullUrl is made of already (so the fullUrls are those written before Observations had them).
 */
function identifyingMember(key: string, value: unknown): unknown {
  return key === 'subject' || key === '_effectiveDateTime' ? undefined : value;
}

/** The `id` of an Observation: `obs-<timepoint>-<what>`, with `-` for `_` (see the header comment). */
function observationId(place: Place, what: string): string {
  return `obs-${place.key}-${idPart(what)}`;
}

interface Place {
  /** `0`, `1`, … or `header`: the timepoint part of ids. */
  readonly key: string;
  /** The Bundle's Patient, the one object shared by all its Observations (its fullUrl set last). */
  readonly subject: FhirReference;
  readonly effective: string | null;
  readonly note: string;
  /** The oxygen device in force there (its flow means another thing on a high-flow device). */
  readonly device: string | null;
  /** The ventilator mode in force there (a tidal volume is set only in some). */
  readonly mode: string | null;
  /** The non-invasive support in force there (which sets no tidal volume). */
  readonly support: NoninvasiveSupport | null;
}

/**
 * The Observation of one stated value (`what`: the last part of its id); null when the field is
 * not exported or has no usable number.
 */
function fieldObservation(field: FieldDef, input: InputValue, place: Place, what: string): FhirObservation | null {
  // A reading field's value held as a setting (a mean airway pressure set in HFOV) is a setting here.
  const reading = field.reading === true && input.stated.hereOnly;
  // A ventilator's FiO2, a blood gas sodium, a value written as tco2 have codes of their own; a code that does not fit is left out.
  const loinc = fhirLoinc(field, input.stated.section, { key: input.stated.item.keyName, device: place.device, mode: place.mode, support: place.support, reading });
  const unitId = input.stated.unit;
  if (!isObservedField(field) || !input.stated.usable || unitId === null) return null;
  let s: FhirQuantity | null = null;
  let d: FhirQuantity | null = null;
  let q: FhirQuantity | null = null;
  if (field.kind === 'pair') {
    const [systolic, diastolic] = input.stated.parts ?? [];
    s = finite(systolic) ? quantity(systolic, unitId) : null;
    d = finite(diastolic) ? quantity(diastolic, unitId) : null;
    if (!s || !d) return null;
  } else {
    const value = input.stated.value;
    q = finite(value) ? (field.dimension === 'age' ? ageQuantity(value, unitId, input.stated.readUnit) : quantity(value, unitId)) : null;
    if (!q) return null;
  }
  const code: FhirCodeableConcept = loinc ? { coding: [{ system: LOINC, code: loinc.code, display: loinc.display }], text: field.label } : { text: field.label };
  const observation = observationStart(observationId(place, what), observationCategory(field, reading), code, place, loinc !== null && VITAL_SIGN_LOINC.has(loinc.code));
  const note = [{ text: place.note }];
  if (s && d) {
    observation.note = note;
    observation.component = [{ code: { coding: [SYSTOLIC] }, valueQuantity: s }, { code: { coding: [DIASTOLIC] }, valueQuantity: d }];
  } else {
    observation.valueQuantity = q!;
    observation.note = note;
  }
  return observation as FhirObservation;
}

const idPart = (id: string): string => id.replace(/_/g, '-');

/** The `noteKey` of a note read from standard input: derived from its text, line by line (the line ends do not count). */
export function stdinNoteKey(result: NoteResult): string {
  return `stdin\u0000${stableHex128(result.analysis.tree.lines.map((line) => line.text).join('\n'))}`;
}

/** One Bundle of the note's Observations. Throws a RangeError for a bad anchor or shiftDays (see `anchorProblem`). */
export function toFhirBundle(path: string, result: NoteResult, options: FhirOptions): FhirBundle {
  assertExportOptions(options);
  const anchor = options.anchor === undefined ? null : parseAnchor(options.anchor);
  if (typeof anchor === 'string') throw new RangeError(anchor);

  const noteKey = options.noteKey ?? path;
  const entries: FhirObservationEntry[] = [];
  /** fullUrl of each field Observation by the stated value it comes from (`statedKey`), for derivedFrom. */
  const fullUrls = new Map<string, string>();
  // Every fullUrl's text starts with the note's key: read once.
  const ids = new StableIds(`${noteKey}\u0000`);
  // The Patient's fullUrl is made from the Bundle's id, known once every Observation is made: the
  // one reference object all Observations share is filled in then.
  const subject: { reference: string } = { reference: '' };
  const add = (place: Place, what: string, resource: FhirObservation): string => {
    // The Observation as written is in its id: one a correction leaves as it was keeps its id.
    const fullUrl = `urn:uuid:${ids.uuid(`${place.key}\u0000${what}\u0000${JSON.stringify(resource, identifyingMember)}`)}`;
    entries.push({ fullUrl, resource });
    return fullUrl;
  };

  const timepoints = result.analysis.timeline.timepoints;

  // Header values, once: read from the header itself, not from the values in force at the
  // timepoints, where a note without a timepoint has none and a value restated at the first
  // timepoint has replaced the header's. Stated twice there, the later one (PN206).
  const header = new Map<string, InputValue>();
  for (const s of result.analysis.timeline.header) header.set(s.fieldId, { stated: s, origin: { kind: 'header', line: s.line, span: s.item.span } });
  const headerPlace: Place = { key: 'header', subject, effective: null, note: 'Pneumark note header (describes the patient for the whole note)', device: null, mode: null, support: null };
  for (const field of FIELDS) {
    const input = header.get(field.id);
    const resource = input ? fieldObservation(field, input, headerPlace, field.id) : null;
    if (resource) add(headerPlace, field.id, resource);
  }

  for (const tp of timepoints) {
    const minutes = tp.time.minutes;
    const day = tp.time.day;
    const effective = !anchor ? null
      : finite(minutes) ? shiftedDateTime(anchor, minutes + options.shiftDays * MINUTES_PER_DAY)
        // A day without a time of day: a FHIR dateTime to the day (`2024-03-02`), never an invented midnight.
        : finite(day) ? shiftedDateTime(anchor, (day - 1 + options.shiftDays) * MINUTES_PER_DAY)?.slice(0, 10) ?? null
          : null;
    const word = (id: string): string | null => {
      const input = tp.values.get(id);
      return input?.stated.usable ? input.stated.word : null;
    };
    const device = word('device');
    const place: Place = { key: String(tp.index), subject, effective, note: timepointNote(tp, writtenLabel(result, tp), options), device, mode: word('mode'), support: noninvasiveSupport(device, tp.values) };
    const repeated = repeatedFields(tp);
    for (const field of FIELDS) {
      const input = tp.values.get(field.id);
      if (input && input.origin.kind === 'here') {
        const resource = fieldObservation(field, input, place, field.id);
        if (resource) fullUrls.set(statedKey(field.id, input.stated), add(place, field.id, resource));
      }
      // The same field stated here in another section too (a ventilator's FiO2 beside the gas's
      // sampling FiO2, sodium on a blood gas and on a labs line): each is an Observation of its own.
      if (!repeated?.has(field.id)) continue;
      for (const other of alsoStated(tp, field.id, input?.stated)) {
        const what = `${field.id}_${other.stated.section}`;
        const resource = fieldObservation(field, other, place, what);
        if (resource) fullUrls.set(statedKey(field.id, other.stated), add(place, what, resource));
      }
    }
    const pf = derivedValueOf(result.analysis.derivation(tp.index), 'pf_ratio');
    if (pf) {
      const resource = pfObservation(pf, place, fullUrls);
      if (resource) add(place, pf.id, resource);
    }
  }

  const id = `pneumark-${stableHex128(options.bundleIdFromEntries ? `${noteKey}\u0000${entries.map((e) => e.fullUrl).join('\u0000')}` : noteKey).slice(0, 16)}`;
  let all: FhirBundleEntry[] = entries;
  if (entries.length) {
    // The Patient's fullUrl, from the Bundle's id: unique to the note as the Bundle's id is (in a
    // redacted export, made from the note's entries, not from its place in the run).
    subject.reference = `urn:uuid:${stableUuid(`patient\u0000${id}`)}`;
    all = [...entries, { fullUrl: subject.reference, resource: { resourceType: 'Patient', id: PATIENT_ID } }];
  }
  return {
    resourceType: 'Bundle',
    id,
    identifier: { system: options.pseudonymous ? REDACTED_NOTE_IDENTIFIER_SYSTEM : NOTE_IDENTIFIER_SYSTEM, value: fhirString(path) },
    type: 'collection',
    ...(all.length ? { entry: all } : {}),
  };
}

/** A stated value's key among the Observations: its field, line and where its item starts (a shorthand gas's numbers share one item). */
function statedKey(fieldId: string, at: StatedValue | { readonly line: number; readonly span: { readonly start: number } }): string {
  return `${fieldId}:${at.line}:${'item' in at ? at.item.span.start : at.span.start}`;
}

/** The fields stated more than once at a timepoint (in one section or in several), or null: most timepoints have none. */
function repeatedFields(tp: Timepoint): Set<string> | null {
  const stated = tp.stated;
  let repeated: Set<string> | null = null;
  for (let i = 1; i < stated.length; i++) {
    const id = stated[i]!.fieldId;
    for (let j = 0; j < i; j++) {
      if (stated[j]!.fieldId === id) {
        (repeated ??= new Set()).add(id);
        break;
      }
    }
  }
  return repeated;
}

/**
 * Values of a field stated at a timepoint besides the one in force there (`inForce`), each in a
 * section of its own: the last of the field in each section (an earlier one in the same section is
 * replaced, PN206), when it is a measurement or the setting the timepoint holds and carries. A
 * setting that is not held (on an oxygen line ended by a vent line at the same timepoint, PN311)
 * is not used, and not exported.
 */
function alsoStated(tp: Timepoint, fieldId: string, inForce: StatedValue | undefined): InputValue[] {
  const out: InputValue[] = [];
  const stated = tp.stated;
  let held: StatedValue | null | undefined;
  for (let i = 0; i < stated.length; i++) {
    const s = stated[i]!;
    if (s.fieldId !== fieldId || s === inForce) continue;
    let replaced = false;
    for (let j = i + 1; j < stated.length && !replaced; j++) replaced = stated[j]!.fieldId === fieldId && stated[j]!.section === s.section;
    if (replaced) continue;
    if (!s.hereOnly) {
      if (held === undefined) {
        const setting = tp.values.heldSetting(fieldId);
        held = setting && setting.origin.kind === 'here' ? setting.stated : null;
      }
      if (s !== held) continue;
    }
    out.push({ stated: s, origin: { kind: 'here', line: s.line, span: s.item.span } });
  }
  return out;
}

function pfObservation(pf: DerivedValue, place: Place, fullUrls: ReadonlyMap<string, string>): FhirObservation | null {
  const q = quantity(pf.value, 'mmHg');
  if (!q) return null;
  const references: { reference: string }[] = [];
  for (const term of pf.inputs) {
    if (!term.fieldId) continue;
    const origin = term.origin;
    const url = origin.kind === 'here' || origin.kind === 'carried' ? fullUrls.get(statedKey(term.fieldId, origin)) : undefined;
    if (url && !references.some((r) => r.reference === url)) references.push({ reference: url });
  }
  const observation = observationStart(observationId(place, pf.id), 'laboratory', { coding: [PF_RATIO], text: pf.label }, place);
  observation.valueQuantity = q;
  if (references.length) observation.derivedFrom = references;
  observation.note = [{ text: place.note }];
  return observation as FhirObservation;
}
