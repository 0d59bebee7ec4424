/**
 * The column model of the tabular exports (CSV, JSON Lines): one row per timepoint, one column
 * per value. The list comes from the registries, so a new field or derived value adds a column;
 * `tests/export/columns.test.ts` pins the full list so that every change shows in review.
 *
 * The columns, in order:
 *   file, timepoint (0-based index), label, day, minutes (since day 1 00:00), offset_minutes
 *     (since the first timepoint whose time is known);
 *   every field of FIELDS in registry order (but those added later, below): a number as `<fieldId>_<unitSlug>` in the field's
 *     canonical unit (`pao2_mmHg`, `fio2_fraction`, `spo2_pct`), blood pressure as
 *     `bp_systolic_mmHg` and `bp_diastolic_mmHg`, a word as the bare field id (`device`, `mode`);
 *   every derived value of DERIVED in order as `<id>_<unitSlug>`, bare when the id ends in `_ratio`
 *     or `_index` or the value has no unit (`pf_ratio`, `rox_index`, `fio2_estimated`), as
 *     `<id>_low_<unitSlug>` and `<id>_high_<unitSlug>` for an expected range, and with `_derived`
 *     after the id when a field has the same id (`barometric_derived_mmHg`);
 *   carried_fields, findings_errors, findings_warnings, findings_information;
 *   then the fields and derived values added after the first published list (`ADDED_LATER`), in
 *   the order added: mechanical_power_surrogate_J_min, amplitude_cmH2O, base_excess_venous_mmol_L
 *   (a field stated on another kind of line, whose value is another one: see `COLUMN_SECTION`),
 *   mean_arterial_pressure_mmHg (estimated from the blood pressure), paco2_etco2_difference_mmHg,
 *   mean_bp_mmHg (a mean arterial pressure as measured), insp_pressure_cmH2O (the set inspiratory
 *   pressure of pressure control, above PEEP), fio2_in_force (the FiO2 the calculations use: 0.21
 *   on room air, where fio2_fraction, the FiO2 written, is empty), peep_total_cmH2O and autopeep_cmH2O
 *   (total and intrinsic PEEP of an end-expiratory hold), sbe_mmol_L and sbe_venous_mmol_L (the
 *   standard base excess the arterial and the venous gas's pH and HCO3 give), spo2_target_low_pct
 *   and spo2_target_high_pct (the two ends of the SpO2 target in force: written, carried, or the
 *   spo2Target setting's).
 *
 * Cells:
 * - Field values are those in force at the timepoint: stated there, carried from an earlier
 *   timepoint (settings) or from the header (patient, place, units), in the canonical unit at
 *   12 significant digits (a gas written in kPa appears in mmHg: precision.ts). A value Pneumark does not
 *   use in calculations (impossible, or in a doubtful unit: see its finding) is left empty.
 * - A field whose value differs with the kind of line it is stated on (base excess of an arterial
 *   and of a venous gas) has a column per kind (`COLUMN_SECTION`): each holds the value stated on
 *   its kind of line, never the other's. Other measurements stated on several kinds of line at one
 *   timepoint (sodium on a blood gas and a labs line, lactate, Hb) have the one written last.
 * - `gas_unit` is the unit bare gas pressures were read in at the timepoint: the unit of those
 *   stated there when they agree (a `units gas` line counts from its line on), else the note's
 *   `units gas` in force at its end, else the gasUnit setting (so it is never empty).
 * - Derived values appear at the timepoints where Pneumark reports them, that is where one of
 *   their main inputs was stated (see grammar/README.md, "Derived values").
 * - Numbers are never NaN or infinite: such a value is left empty (null).
 * - carried_fields lists, `;`-joined in registry order, the fields whose cell in this row holds
 *   a value carried from an earlier timepoint (header values are not "carried").
 * - The findings counts cover the findings that start on this timepoint's lines (from its `@`
 *   line to the line before the next timepoint); findings on header lines belong to no row, also
 *   those of a patient, place or units line among the lines of an implicit first timepoint.
 *
 * - label is the text written after the timepoint's time, empty when there is none.
 *
 * Options:
 * - redactProse: the label column is left empty (labels are free text and may hold identifiers),
 *   and a word of a field that takes any word (`mode`) is `REDACTED_WORD` unless Pneumark knows it:
 *   only Pneumark's own words (field words, units, keys, check titles) are written.
 * - shiftDays: N days are added to `day` and N × 1440 to `minutes`, so a shared dataset need not
 *   keep the note's real day numbers; `offset_minutes` is unchanged. N must be a whole number.
 */
import type { NoteResult } from '../check-note';
import type { InputValue, StatedValue, Timepoint } from '../analysis/model';
import type { DerivedValue } from '../derive/model';
import { SEA_LEVEL_MMHG } from '../derive/atmosphere';
import { fio2InForce } from '../derive/context';
import { targetInForce } from '../analysis/spo2-target';
import type { Settings } from '../settings';
import { ALVEOLAR_ROUNDING_MMHG } from '../derive/gas-exchange';
import { DERIVED } from '../derive/registry';
import { FIELDS, type FieldDef } from '../fields/registry';
import { sectionById, type SectionId } from '../fields/sections';
import type { Finding } from '../types';
import { exportedNumber } from './precision';
import { ucumCode, unitForPeople, unitSlug } from './units';

export type ColumnKind = 'timepoint' | 'field' | 'derived' | 'in-force' | 'summary';

export interface ColumnDef {
  readonly name: string;
  readonly description: string;
  /** The unit as written for people (`mmHg`, `%`, `L/min`); null for words, counts and pure numbers. */
  readonly unit: string | null;
  /** The UCUM code of the unit (`mm[Hg]`, `%`, `1` for a pure number); null for words and text. */
  readonly ucum: string | null;
  readonly type: 'number' | 'string';
  readonly kind: ColumnKind;
  /** The field id or derived-value id the column comes from; null for timepoint and summary columns. */
  readonly source: string | null;
  /** Which part of the source: the two numbers of blood pressure, the two ends of an expected range. */
  readonly part: 'systolic' | 'diastolic' | 'low' | 'high' | null;
  /**
   * The kind of line a field column's value is read from where the kind changes the value (base
   * excess: `abg` for the arterial column, `vbg` for the venous one); null for the value in force.
   */
  readonly section: SectionId | null;
}

export type Cell = string | number | null;
export type Row = Record<string, Cell>;

export interface ExportOptions {
  /** Leave out free text written in the note (timepoint labels). */
  readonly redactProse: boolean;
  /** Whole days added to every day number (and N × 1440 to minutes since day 1 00:00). */
  readonly shiftDays: number;
}

/** Derived values that are expected ranges: exported as their two ends, not their centre. */
export const RANGE_DERIVED_IDS: ReadonlySet<string> = new Set(['paco2_expected', 'hco3_expected_acute', 'hco3_expected_chronic']);

interface RowContext {
  readonly path: string;
  readonly timepoint: Timepoint;
  /** The usable value in force of each field, by its index in FIELDS (null: none, or not usable). */
  readonly inputs: readonly (InputValue | null)[];
  /** The derived values reported at the timepoint, by their index in DERIVED. */
  readonly derived: readonly (DerivedValue | undefined)[];
  readonly findings: readonly Finding[];
  /** Minutes of the first timepoint with a known time. */
  readonly firstMinutes: number | null;
  /** The unit bare gas pressures were read in at this timepoint. */
  readonly gasUnit: string;
  readonly label: string | null;
  readonly options: ExportOptions;
  /** The settings the note was analysed with (the SpO2 target of a note that writes none). */
  readonly settings: Pick<Settings, 'spo2Target'>;
}

interface Column extends ColumnDef {
  readonly cell: (c: RowContext) => Cell;
}

const MINUTES_PER_DAY = 1440;

/** A number as the exports write it (`exportedNumber`: 12 significant digits), null when not finite. */
const finite = exportedNumber;

function timepointColumns(): Column[] {
  const meta = (name: string, type: ColumnDef['type'], unit: 'min' | null, description: string, cell: Column['cell']): Column =>
    ({ name, description, unit, ucum: unit, type, kind: 'timepoint', source: null, part: null, section: null, cell });
  return [
    meta('file', 'string', null, 'Path of the note relative to the working folder (also when it was named by its absolute path), or for standard input its `--stdin-name` path, else `<stdin>`; with `--redact`, the note\'s place in the run instead (`note-00001`, `note-00002` … in the sorted order of the paths, standard input last, or in the place of its `--stdin-name` path).', (c) => c.path),
    meta('timepoint', 'number', null, 'Index of the timepoint in the note, from 0.', (c) => c.timepoint.index),
    meta('label', 'string', null, 'Label written after the timepoint\'s time; empty when none is written, and with `--redact`.', (c) => (c.options.redactProse ? null : c.label)),
    meta('day', 'number', null, 'Day number of the timepoint (day 1 is the first day), plus `--shift-days`.', (c) => {
      const day = finite(c.timepoint.time.day);
      return day === null ? null : day + c.options.shiftDays;
    }),
    meta('minutes', 'number', 'min', 'Minutes since 00:00 of day 1, plus `--shift-days` × 1440; empty when the time is unknown.', (c) => {
      const minutes = finite(c.timepoint.time.minutes);
      return minutes === null ? null : minutes + c.options.shiftDays * MINUTES_PER_DAY;
    }),
    meta('offset_minutes', 'number', 'min', 'Minutes since the first timepoint whose time is known; empty when this time is unknown.', (c) => {
      const minutes = finite(c.timepoint.time.minutes);
      return minutes === null || c.firstMinutes === null ? null : minutes - c.firstMinutes;
    }),
  ];
}

/** The index of each derived value in DERIVED (its slot in `RowContext`). */
const DERIVED_INDEX: ReadonlyMap<string, number> = new Map(DERIVED.map((d, i) => [d.id, i]));

/**
 * The usable values in force at a timepoint by field index, each asked for once (its column and
 * `carried_fields` both read it). Asking field by field beats going over the values in force,
 * which builds a map of them all per timepoint.
 */
function inputsAt(tp: Timepoint): (InputValue | null)[] {
  const values = tp.values;
  const inputs = new Array<InputValue | null>(FIELDS.length);
  for (let k = 0; k < FIELDS.length; k++) {
    const input = values.get(FIELDS[k]!.id);
    inputs[k] = input && input.stated.usable ? input : null;
  }
  return inputs;
}

/** The derived values of a derivation by index in DERIVED (the last of an id wins, as in a map). */
function derivedAt(list: readonly DerivedValue[]): (DerivedValue | undefined)[] {
  const derived = new Array<DerivedValue | undefined>(DERIVED.length);
  for (const d of list) {
    const k = DERIVED_INDEX.get(d.id);
    if (k !== undefined) derived[k] = d;
  }
  return derived;
}

const GAS_UNIT = 'gas_unit';

/**
 * The unit bare gas pressures were read in at each timepoint: the unit the bare gas pressures stated
 * there were read in, when it states some and they agree (a `units gas` line below them at the same
 * timepoint counts only from its line on, as the note is read: `abg 7.30/45/80/24` above `units gas
 * kPa` was read in mmHg); else the unit in force at its end, the last `units gas` of the header or
 * of a timepoint up to this one, else the setting.
 */
function gasUnits(result: NoteResult): string[] {
  const word = (stated: readonly StatedValue[]): string | null => {
    let found: string | null = null;
    for (const s of stated) if (s.fieldId === GAS_UNIT && s.word !== null) found = s.word;
    return found;
  };
  /** The one unit the bare gas pressures of a timepoint were read in; null when none is bare, or they differ. */
  const readIn = (stated: readonly StatedValue[]): string | null => {
    let found: string | null = null;
    for (const s of stated) {
      if (s.field.bare !== 'gas' || !s.unitImplied || s.readUnit === null) continue;
      if (found !== null && found !== s.readUnit) return null;
      found = s.readUnit;
    }
    return found;
  };
  let unit = word(result.analysis.timeline.header) ?? result.settings.gasUnit;
  return result.analysis.timeline.timepoints.map((tp) => {
    unit = word(tp.stated) ?? unit;
    return readIn(tp.stated) ?? unit;
  });
}

/**
 * Fields that have a column per kind of sample where the sample changes what the value is: base
 * excess from an arterial gas (`abg`) and from a venous one (`vbg`) are two values (LOINC codes
 * them apart, and FHIR exports both), which one cell written last would lose one of. The field's
 * own column holds the value of its first section here, and `SECTION_COLUMNS` in `ADDED_LATER`
 * the others. Lactate and haemoglobin are the same analyte in every sample and keep one column.
 */
const COLUMN_SECTION: Readonly<Record<string, SectionId>> = { base_excess: 'abg' };

/** What the field's own column of `COLUMN_SECTION` says, after the field's description. */
const SECTION_NOTE: Readonly<Record<string, string>> = {
  base_excess: ' From an `abg` line (arterial); a `vbg` line\'s base excess is in `base_excess_venous_mmol_L`, so both are kept when a timepoint states both.',
};

/**
 * Fields stated on several kinds of line whose one cell holds the value written last at the
 * timepoint (FHIR gives each its own Observation), said in their column's description.
 */
const LAST_WRITTEN_NOTE: Readonly<Record<string, string>> = {
  lactate: ' The same analyte on an `abg`, a `vbg` and a `labs` line: when a timepoint states it on more than one, the one written last is in the cell (FHIR gives each its own Observation).',
  hb: ' The same analyte on a `labs`, an `abg` and a `vbg` line: when a timepoint states it on more than one, the one written last is in the cell (FHIR gives each its own Observation).',
};

/** Fields written in several units whose column holds one of them, said in their column's description. */
const ONE_UNIT_NOTE: Readonly<Record<string, string>> = {
  age: ' Always in years, whatever unit the note wrote, at the 12 significant digits and 12 decimals at most of every exported number (`age 8 mo` is 0.666666666667, `age 3 d` 0.008213552361, a year being 365.25 days): an age of days is never rounded to 0. FHIR gives the age in the unit written (`a`, `mo`, `wk`, `d`).',
};

/**
 * The usable value of a field stated at a timepoint on a line of one section: the last one written
 * there (an earlier one in the same section is replaced, PN206); null when none, or not usable.
 * For measurements only, which are never carried.
 */
function statedInSection(tp: Timepoint, fieldId: string, section: SectionId): number | null {
  const stated = tp.stated;
  for (let i = stated.length - 1; i >= 0; i--) {
    const s = stated[i]!;
    if (s.fieldId === fieldId && s.section === section) return s.usable ? finite(s.value) : null;
  }
  return null;
}

function fieldColumns(field: FieldDef, index: number, onlySection: SectionId | null = null): Column[] {
  const base = { kind: 'field' as const, source: field.id, section: null };
  if (field.id === GAS_UNIT) {
    // The timeline keeps the gas unit apart from the values in force: it is how bare numbers are read.
    return [{ ...base, name: field.id, description: `${field.label}: ${field.description} The unit the bare gas pressures stated at the timepoint were read in (a \`units gas\` line counts from its line on), else the note's \`units gas\` in force at the end of the timepoint, else the gasUnit setting.`, unit: null, ucum: null, type: 'string', part: null, cell: (c) => c.gasUnit }];
  }
  if (field.kind === 'word') {
    const own = ownWords(field);
    const open = own !== null ? `${field.label}: ${field.description} With \`--redact\`, a word Pneumark does not know is \`${REDACTED_WORD}\`.` : `${field.label}: ${field.description}`;
    return [{ ...base, name: field.id, description: open, unit: null, ucum: null, type: 'string', part: null, cell: (c) => {
      const word = c.inputs[index]?.stated.word ?? null;
      return word !== null && own !== null && c.options.redactProse && !own.has(word) ? REDACTED_WORD : word;
    } }];
  }
  const unitId = field.unit ?? '';
  const unit = unitForPeople(unitId);
  const ucum = ucumCode(unitId);
  const slug = unitSlug(unitId);
  if (field.kind === 'pair' && field.join === 'dash') {
    // A range (the SpO2 target): its lower and upper ends, as in force (written, carried, or the setting's).
    const end = (which: 'low' | 'high'): Column => ({
      ...base,
      name: `${field.id}_${which}_${slug}`,
      description: `${field.label}, its ${which === 'low' ? 'lower' : 'upper'} end: ${field.description} Else the \`spo2Target\` setting's, where it gives one; empty where no target is in force, or the one written is not used (PN301).`,
      unit,
      ucum,
      type: 'number',
      part: which,
      cell: (c) => {
        const target = targetInForce(c.timepoint.values, c.settings);
        return target === null ? null : finite(which === 'low' ? target.lowPct : target.highPct);
      },
    });
    return [end('low'), end('high')];
  }
  if (field.kind === 'pair') {
    const part = (which: 'systolic' | 'diastolic', at: number): Column => ({
      ...base,
      name: `${field.id}_${which}_${slug}`,
      description: `${field.label}, ${which}: ${field.description}`,
      unit,
      ucum,
      type: 'number',
      part: which,
      cell: (c) => finite(c.inputs[index]?.stated.parts?.[at]),
    });
    return [part('systolic', 0), part('diastolic', 1)];
  }
  const section = onlySection ?? COLUMN_SECTION[field.id] ?? null;
  if (section !== null && section !== COLUMN_SECTION[field.id]) {
    // A column of its own for the field stated on another kind of line (`base_excess_venous_mmol_L`).
    return [{
      ...base,
      name: `${field.id}_${SECTION_WORD[section] ?? section}_${slug}`,
      description: `${field.label} (${SECTION_WORD[section] ?? section}): ${field.description} From a \`${section}\` line; that of an \`${COLUMN_SECTION[field.id] ?? section}\` line is in \`${field.id}_${slug}\`.`,
      unit,
      ucum,
      type: 'number',
      part: null,
      section,
      cell: (c) => statedInSection(c.timepoint, field.id, section),
    }];
  }
  return [{
    ...base,
    name: slug ? `${field.id}_${slug}` : field.id,
    description: `${field.label}: ${field.description}${SECTION_NOTE[field.id] ?? LAST_WRITTEN_NOTE[field.id] ?? ONE_UNIT_NOTE[field.id] ?? ''}`,
    unit,
    ucum,
    type: 'number',
    part: null,
    section,
    cell: section === null ? (c) => finite(c.inputs[index]?.stated.value) : (c) => statedInSection(c.timepoint, field.id, section),
  }];
}

/**
 * What `--redact` writes in place of a word the note's writer chose: a word of a field that takes
 * any word (a ventilator mode Pneumark does not know, `mode Smithvent`) may be a person's or a
 * place's name. Fixed, so that a reader sees a word was written; described in README.md.
 */
export const REDACTED_WORD = '[redacted]';

/** The words Pneumark knows for a field that takes any word (its canonical spellings); null for a field that takes only those. */
function ownWords(field: FieldDef): ReadonlySet<string> | null {
  return field.openWords ? new Set(Object.values(field.words ?? {})) : null;
}

/** The word a column of a field stated on another kind of line takes after the field's id. */
const SECTION_WORD: Readonly<Partial<Record<SectionId, string>>> = { vbg: 'venous' };

/**
 * Descriptions of derived values whose formula is the value itself (`{PB}`), which would say
 * nothing, or does not say which column an input is: where the value comes from instead.
 */
const WHERE_FROM: Readonly<Record<string, string>> = {
  barometric: `Barometric pressure (PB) the calculations use: as stated on a place line, else estimated from the altitude (the barometricModel setting), else ${SEA_LEVEL_MMHG} mmHg (sea level).`,
  // The derivation takes the albumin-corrected gap where there is one: the formula's {AG} alone would
  // send a reader recomputing the column to `anion_gap_mmol_L`, and to another number.
  delta_ratio: 'Delta ratio (Δ ratio), derived: ({AG} − 12) ÷ (24 − {HCO3}), where {AG} is the anion gap corrected for albumin (`anion_gap_albumin_corrected_mmol_L`) when albumin is known, else the anion gap (`anion_gap_mmol_L`), and {HCO3} the serum bicarbonate (`hco3_serum_mmol_L`), else the arterial gas HCO3 (`hco3_mmol_L`), else the venous gas HCO3 (`hco3_venous_mmol_L`).',
  minute_ventilation: 'Minute ventilation (VE), derived: {VT} × {RR} ÷ 1000, where {RR} is the measured rate (`rr_per_min`), else the set rate (`vent_rate_per_min`); empty in HFOV, whose set rate is an oscillation frequency.',
  mechanical_power: 'Mechanical power (simplified) (MP), derived: 0.098 × {RR} × {VT} ÷ 1000 × ({Ppeak} − ({Pplat} − {PEEP}) ÷ 2), where {RR} is the measured rate (`rr_per_min`), else the set rate (`vent_rate_per_min`); empty in HFOV, whose set rate is an oscillation frequency, in any mode but VC, whose constant-flow breaths the equation describes, and under NIV or CPAP on an oxygen line.',
  driving_pressure: 'Driving pressure (ΔP), derived: {Pplat} − {PEEP}; empty in HFOV, which gives no conventional breath with a plateau.',
  compliance_static: 'Static compliance (Cstat), derived: {VT} ÷ ({Pplat} − {PEEP}); empty in HFOV, which gives no conventional breath with a plateau.',
  compliance_dynamic: 'Dynamic compliance (Cdyn), derived: {VT} ÷ ({Ppeak} − {PEEP}); empty in HFOV, which gives no conventional breath with a peak, and under PS, CPAP or NIV, where the patient\'s own effort moves part of the volume.',
  cao2: 'Arterial oxygen content (CaO2), derived: {Hüfner} × {Hb} × {SaO2} ÷ 100 + 0.003 × {PaO2}, where {Hb} is the Hb of the `abg` line, else the one written last (`hb_g_dL`), {SaO2} the SaO2 (`sao2_pct`), else the SpO2 (`spo2_pct`), and {Hüfner} the hufnerConstant setting (1.34 mL/g by default).',
  mean_arterial_pressure: 'Mean arterial pressure, estimated from the blood pressure (MAP (BP)), derived: {BP diastolic} + ({BP systolic} − {BP diastolic}) ÷ 3, from `bp_systolic_mmHg` and `bp_diastolic_mmHg`; an estimate (common practice).',
  anion_gap: 'Anion gap (AG), derived: {Na} − ({Cl} + {HCO3}), where {HCO3} is the serum bicarbonate (`hco3_serum_mmol_L`), else the arterial gas HCO3 (`hco3_mmol_L`), else the venous gas HCO3 (`hco3_venous_mmol_L`); without potassium.',
  // The editor notes an S/F above 97 % SpO2 beside the value; a table has no room for the note.
  sf_ratio: 'S/F ratio (S/F), derived: {SpO2} ÷ {FiO2}; given at any SpO2, though above 97 % it no longer tracks the P/F ratio (Rice 2007, Chest 132:410), so rows to compare with P/F are those with `spo2_pct` at 97 or less.',
  oxygen_saturation_index: 'Oxygen saturation index (OSI), derived: {FiO2} × {MAP} × 100 ÷ {SpO2}; empty where the SpO2 is above 97 %, where it is not valid (PALICC 2015).',
  // Recomputed from `pao2_alveolar_mmHg` and `pao2_mmHg`, a PaO2 just above the simplified equation's
  // alveolar PO2 gives a negative number where the cell holds 0 (and a ratio above 1 where it holds 1).
  aa_gradient: `A–a gradient (A–a), derived: {PAO2} − {PaO2}, from \`pao2_alveolar_mmHg\` and \`pao2_mmHg\`; shown as 0 where the PaO2 is above that alveolar PO2 by no more than rounding (${ALVEOLAR_ROUNDING_MMHG} mmHg) or than the full alveolar gas equation's alveolar PO2, which reads higher on oxygen; empty where it is above both, or where the alveolar PO2 comes out negative (PN401).`,
  a_to_A_ratio: `a/A ratio (a/A), derived: {PaO2} ÷ {PAO2}, from \`pao2_mmHg\` and \`pao2_alveolar_mmHg\`; shown as 1 where the PaO2 is above that alveolar PO2 by no more than rounding (${ALVEOLAR_ROUNDING_MMHG} mmHg) or than the full alveolar gas equation's alveolar PO2, as the A–a gradient is then shown as 0; empty where it is above both (PN401).`,
};

/**
 * The ends of the expected ranges, which the derived value's formula (its centre) does not give:
 * each end's own formula, and where the ends move with how the input was written.
 */
const RANGE_WHERE_FROM: Readonly<Record<string, (end: 'low' | 'high') => string>> = {
  paco2_expected: (end) => {
    const sign = end === 'low' ? '−' : '+';
    return `Expected PaCO2 for the metabolic disorder, ${end === 'low' ? 'lower' : 'upper'} end of the range: 1.5 × {HCO3} + 8 ${sign} 2 in a metabolic acidosis (Winters' formula), 40 + 0.7 × ({HCO3} − 24) ${sign} 2 in a metabolic alkalosis, where {HCO3} is the arterial gas HCO3 (\`hco3_mmol_L\`); empty where the primary disorder is not metabolic, or where the gas's pH, PaCO2 and HCO3 disagree (PN402).`;
  },
  hco3_expected_acute: (end) => respiratoryRangeEnd('acute', end, 'k = 1 in a respiratory acidosis, k = 2 in a respiratory alkalosis'),
  hco3_expected_chronic: (end) => respiratoryRangeEnd('chronic', end, 'k = 3.5 to 5 in a respiratory acidosis, k = 4 to 5 in a respiratory alkalosis'),
};

function respiratoryRangeEnd(chronicity: 'acute' | 'chronic', end: 'low' | 'high', coefficients: string): string {
  const low = end === 'low';
  return `Expected HCO3 if the respiratory disorder is ${chronicity}, ${low ? 'lower' : 'upper'} end of the range: 24 + k × ({PaCO2} − 40) ÷ 10 ${low ? '− 2' : '+ 2'}, the ${low ? 'lowest' : 'highest'} over ${coefficients} (per 10 mmHg; HCO3 falls with a PaCO2 below 40), where {PaCO2} is \`paco2_mmHg\`; for a PaCO2 written in kPa, the ${low ? 'lowest' : 'highest'} PaCO2 the written value stands for (half a unit of its last decimal ${low ? 'less' : 'more'}: 9.6 kPa ${low ? 'as 9.55' : 'as 9.65'} kPa), so that the range holds every PaCO2 it may be; empty where the primary disorder is not respiratory, or where the gas's pH, PaCO2 and HCO3 disagree (PN402).`;
}

function derivedColumns(def: (typeof DERIVED)[number], fieldIds: ReadonlySet<string>): Column[] {
  const index = DERIVED_INDEX.get(def.id)!;
  const id = fieldIds.has(def.id) ? `${def.id}_derived` : def.id;
  const slug = unitSlug(def.unit);
  const base = { kind: 'derived' as const, source: def.id, section: null, unit: unitForPeople(def.unit), ucum: ucumCode(def.unit), type: 'number' as const };
  if (RANGE_DERIVED_IDS.has(def.id)) {
    const end = (which: 'low' | 'high'): Column => ({
      ...base,
      name: `${id}_${which}${slug ? `_${slug}` : ''}`,
      description: RANGE_WHERE_FROM[def.id]?.(which) ?? `${def.label}, ${which === 'low' ? 'lower' : 'upper'} end of the range.`,
      part: which,
      cell: (c) => {
        const range = c.derived[index]?.range;
        return range ? finite(range[which]) : null;
      },
    });
    return [end('low'), end('high')];
  }
  const bare = /_(ratio|index)$/.test(def.id) || !slug;
  return [{
    ...base,
    name: bare ? id : `${id}_${slug}`,
    description: WHERE_FROM[def.id] ?? `${def.label} (${def.short}), derived: ${def.formula}.`,
    part: null,
    cell: (c) => finite(c.derived[index]?.value),
  }];
}

function summaryColumns(): Column[] {
  const count = (name: string, severity: Finding['severity'], words: string): Column => ({
    name,
    description: `Number of ${words} on this timepoint's lines.`,
    unit: null,
    ucum: null,
    type: 'number',
    kind: 'summary',
    source: null,
    part: null,
    section: null,
    cell: (c) => {
      let n = 0;
      for (const f of c.findings) if (f.severity === severity) n++;
      return n;
    },
  });
  return [
    {
      name: 'carried_fields',
      description: 'Ids of the fields whose value in this row was carried from an earlier timepoint, `;`-joined; an empty text (`""` in JSON Lines, never null) when none was.',
      unit: null,
      ucum: null,
      type: 'string',
      kind: 'summary',
      source: null,
      part: null,
      section: null,
      cell: (c) => {
        let ids = '';
        for (let k = 0; k < FIELDS.length; k++) {
          const input = c.inputs[k];
          if (input && input.origin.kind === 'carried' && (input.stated.value !== null || input.stated.parts !== null || input.stated.word !== null)) ids += ids === '' ? FIELDS[k]!.id : `;${FIELDS[k]!.id}`;
        }
        return ids;
      },
    },
    count('findings_errors', 'error', 'error findings'),
    count('findings_warnings', 'warning', 'warning findings'),
    count('findings_information', 'information', 'information findings'),
  ];
}

/**
 * Fields and derived values added after the first published column list: their columns come
 * after every earlier column, in the order added, so a reader that counts columns finds the old
 * ones where they were.
 */
const ADDED_LATER: readonly { readonly kind: 'field' | 'derived' | 'in-force'; readonly id: string; readonly section?: SectionId }[] = [
  { kind: 'derived', id: 'mechanical_power_surrogate' },
  { kind: 'field', id: 'amplitude' },
  // A venous base excess, which the arterial one's column kept before only when no abg line stated one.
  { kind: 'field', id: 'base_excess', section: 'vbg' },
  { kind: 'derived', id: 'mean_arterial_pressure' },
  { kind: 'derived', id: 'paco2_etco2_difference' },
  { kind: 'field', id: 'mean_bp' },
  { kind: 'field', id: 'insp_pressure' },
  // The FiO2 the calculations use: `fio2_fraction` is the FiO2 written, empty on room air.
  { kind: 'in-force', id: 'fio2' },
  { kind: 'field', id: 'peep_total' },
  { kind: 'field', id: 'autopeep' },
  { kind: 'derived', id: 'sbe' },
  { kind: 'derived', id: 'sbe_venous' },
  // The SpO2 target in force, its two ends (`spo2_target_low_pct`, `spo2_target_high_pct`).
  { kind: 'field', id: 'spo2_target' },
];

/**
 * Values the calculations use that no field or derived value holds (`fio2_in_force`, by its field
 * id): the FiO2 in force, 0.21 on room air where the field's own column holds what was written.
 */
const IN_FORCE: Readonly<Record<string, Column>> = {
  fio2: {
    name: 'fio2_in_force',
    description: 'FiO2 the calculations use (P/F, A–a gradient, PiO2): the FiO2 in force as in `fio2_fraction` (written, or carried), else 0.21 on room air, where `fio2_fraction` is empty since no FiO2 is written; empty where neither is known, and on a room-air line with an oxygen flow (PN310) or an FiO2 above 0.21 (PN316). A cannula\'s or a simple mask\'s estimate is in `fio2_estimated`, never here.',
    unit: unitForPeople('fraction'),
    ucum: ucumCode('fraction'),
    type: 'number',
    kind: 'in-force',
    source: 'fio2',
    part: null,
    section: null,
    cell: (c) => finite(fio2InForce(c.timepoint.values)),
  },
};

function buildColumns(): readonly Column[] {
  const fieldIds = new Set(FIELDS.map((f) => f.id));
  const laterFields = new Set(ADDED_LATER.filter((a) => a.kind === 'field' && a.section === undefined).map((a) => a.id));
  const laterDerived = new Set(ADDED_LATER.filter((a) => a.kind === 'derived').map((a) => a.id));
  const columns = [
    ...timepointColumns(),
    ...FIELDS.flatMap((f, i) => (laterFields.has(f.id) ? [] : fieldColumns(f, i))),
    ...DERIVED.filter((d) => !laterDerived.has(d.id)).flatMap((d) => derivedColumns(d, fieldIds)),
    ...summaryColumns(),
    ...ADDED_LATER.flatMap(({ kind, id, section }) => {
      if (kind === 'in-force') {
        const column = IN_FORCE[id];
        if (!column) throw new Error(`export column for ${id} in force: none is defined`);
        return [column];
      }
      if (kind === 'field') {
        const index = FIELDS.findIndex((f) => f.id === id);
        if (index < 0) throw new Error(`export column for ${id}: no such field`);
        if (section !== undefined && !FIELDS[index]!.sections.includes(section)) throw new Error(`export column for ${id} on ${section} lines: the field is not stated there`);
        return fieldColumns(FIELDS[index]!, index, section ?? null);
      }
      const def = DERIVED.find((d) => d.id === id);
      if (!def) throw new Error(`export column for ${id}: no such derived value`);
      return derivedColumns(def, fieldIds);
    }),
  ];
  const names = new Set<string>();
  for (const c of columns) {
    if (names.has(c.name)) throw new Error(`export column ${c.name} is defined twice`);
    names.add(c.name);
  }
  return columns;
}

const COLUMNS: readonly Column[] = buildColumns();
const COLUMN_DEFS: readonly ColumnDef[] = Object.freeze(COLUMNS.map(({ cell: _cell, ...def }) => Object.freeze(def)));

/** The columns of the tabular exports, in order. */
export function exportColumns(): readonly ColumnDef[] {
  return COLUMN_DEFS;
}

/** Throws a RangeError for options no export accepts (the CLI validates them first). */
export function assertExportOptions(options: ExportOptions): void {
  if (!Number.isSafeInteger(options.shiftDays)) throw new RangeError(`shiftDays must be a whole number of days, not ${options.shiftDays}`);
}

/**
 * Whether a line of a timepoint is a line of a header section: a patient, place or units line
 * before the first `@`, which the implicit first timepoint's lines (from the first line with
 * content) may include. Whether or not it states a value (compare `statesHeaderValues` in
 * service/locate.ts, which asks whether a line states header values).
 */
function isHeaderSectionLine(result: NoteResult, timepoint: Timepoint, line: number): boolean {
  if (timepoint.line !== null) return false;
  const lines = result.analysis.tree.lines;
  const node = lines[line]?.line === line ? lines[line] : lines.find((l) => l.line === line);
  return node?.kind === 'section' && sectionById(node.section).kind === 'header';
}

/** Findings that start on a timepoint's lines (header lines left out), in the order of the result. */
export function findingsOfTimepoint(result: NoteResult, timepoint: Timepoint): Finding[] {
  return result.findings.filter((f) => f.range.start.line >= timepoint.startLine && f.range.start.line <= timepoint.endLine && !isHeaderSectionLine(result, timepoint, f.range.start.line));
}

/**
 * The findings of every timepoint at once (index = timepoint index), in one pass over the
 * findings: timepoints are in line order, so each finding's timepoint is found by bisection.
 */
export function findingsByTimepoint(result: NoteResult): Finding[][] {
  const timepoints = result.analysis.timeline.timepoints;
  const out: Finding[][] = timepoints.map(() => []);
  for (const f of result.findings) {
    const line = f.range.start.line;
    let lo = 0;
    let hi = timepoints.length - 1;
    let found = -1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const tp = timepoints[mid];
      if (!tp) break;
      if (line < tp.startLine) hi = mid - 1;
      else if (line > tp.endLine) lo = mid + 1;
      else {
        found = mid;
        break;
      }
    }
    if (found >= 0 && !isHeaderSectionLine(result, timepoints[found]!, line)) out[found]?.push(f);
  }
  return out;
}

/**
 * The label written after a timepoint's time, or null. (The timeline names an unlabelled
 * timepoint by its time, `+5m`, and the implicit first one `start`; those are not labels.)
 */
export function writtenLabel(result: NoteResult, timepoint: Timepoint): string | null {
  if (timepoint.line === null) return null;
  const lines = result.analysis.tree.lines;
  const node = lines[timepoint.line]?.line === timepoint.line ? lines[timepoint.line] : lines.find((l) => l.line === timepoint.line);
  return node?.kind === 'timepoint' && node.label ? node.label.text : null;
}

/** Minutes of the first timepoint whose time is known. */
export function firstKnownMinutes(result: NoteResult): number | null {
  for (const tp of result.analysis.timeline.timepoints) {
    const minutes = finite(tp.time.minutes);
    if (minutes !== null) return minutes;
  }
  return null;
}

/**
 * One list of cells per timepoint of the note, in column order (`exportColumns()`), null when
 * empty. What CSV writes, without building a keyed object per row.
 */
export function timepointCells(path: string, result: NoteResult, options: ExportOptions): Cell[][] {
  assertExportOptions(options);
  const firstMinutes = firstKnownMinutes(result);
  const gasUnitAt = gasUnits(result);
  const findingsAt = findingsByTimepoint(result);
  return result.analysis.timeline.timepoints.map((timepoint, i) => {
    const derived = derivedAt(result.analysis.derivation(timepoint.index).derived);
    const context: RowContext = { path, timepoint, inputs: inputsAt(timepoint), derived, findings: findingsAt[i] ?? [], firstMinutes, gasUnit: gasUnitAt[i] ?? result.settings.gasUnit, label: writtenLabel(result, timepoint), options, settings: result.settings };
    const cells = new Array<Cell>(COLUMNS.length);
    for (let k = 0; k < COLUMNS.length; k++) cells[k] = COLUMNS[k]!.cell(context);
    return cells;
  });
}

/** One row per timepoint of the note, keyed by column name (every column present, null when empty). */
export function timepointRows(path: string, result: NoteResult, options: ExportOptions): Row[] {
  return timepointCells(path, result, options).map((cells) => {
    const row: Row = {};
    for (let k = 0; k < COLUMNS.length; k++) row[COLUMNS[k]!.name] = cells[k]!;
    return row;
  });
}
