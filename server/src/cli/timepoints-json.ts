/**
 * The per-timepoint part of `check --format json`: values in force with units and origins. Version
 * 1 writes each timepoint whole; version 2 (`--json-version 2`) writes it from version 1's object
 * (`timepointV2`), with what is the same for every use of a derived value in a table of the run.
 */
import { createHash } from 'node:crypto';
import type { NoteResult } from '../core/check-note';
import type { Timepoint } from '../core/analysis/model';
import type { DerivedValue, InputOrigin, TimepointDerivation } from '../core/derive/model';
import { displayUnit } from '../core/analysis/read-value';
import { DERIVED } from '../core/derive/registry';
import { exportedNumber } from '../core/export/precision';
import { carriedMinutes } from '../core/present';

/** A number as every export writes it (12 significant digits: see core/export/precision.ts). */
const num = exportedNumber;

/** A stated value as JSON: a word, the numbers of a pair, or a number. */
function statedJson(value: string | readonly number[] | number | null): string | readonly number[] | number | null {
  if (value === null || typeof value === 'string') return value;
  if (typeof value === 'number') return num(value);
  return value.map((n) => num(n) ?? n);
}

export interface JsonValue {
  readonly field: string;
  readonly value: number | string | readonly number[] | null;
  readonly unit: string | null;
  readonly origin: JsonOrigin;
  readonly usable: boolean;
}

function originJson(origin: InputOrigin): JsonOrigin {
  if (origin.kind === 'derived') return { kind: 'derived', line: null, timepoint: null, description: null, derived: origin.id };
  return {
    kind: origin.kind,
    line: origin.kind === 'default' ? null : origin.line + 1,
    timepoint: origin.kind === 'carried' ? origin.timepoint : null,
    description: origin.kind === 'default' ? origin.description : null,
    // Added in version 1 for carried values only: how long before this timepoint it was stated.
    ...(origin.kind === 'carried' ? { carriedMinutes: carriedMinutes(origin) } : {}),
  };
}

export interface JsonOrigin {
  readonly kind: InputOrigin['kind'];
  readonly line: number | null;
  readonly timepoint: number | null;
  readonly description: string | null;
  readonly derived?: string;
  /** Carried values only: minutes from the timepoint the value was stated at to this one; null where a time is unknown. */
  readonly carriedMinutes?: number | null;
}

/** An input of a derived value (version 1); an input that is a word (the device of an FiO2 estimate) gives it as its value. */
export interface JsonInput {
  readonly name: string;
  readonly value: number | string | null;
  readonly unit: string;
  readonly origin: JsonOrigin;
  readonly note?: string;
}

/** A derived value (version 1). */
export interface JsonDerived {
  readonly id: string;
  readonly value: number | null;
  readonly low?: number | null;
  readonly high?: number | null;
  readonly unit: string;
  readonly formula: string;
  readonly substituted: string;
  readonly estimate: boolean;
  readonly usesCarried: boolean;
  readonly inputs: readonly JsonInput[];
  readonly notes: readonly string[];
  readonly source: string;
}

/** A timepoint (version 1). */
export interface JsonTimepoint {
  readonly index: number;
  readonly label: string;
  readonly writtenLabel: string | null;
  readonly line: number | null;
  readonly day: number | null;
  readonly minutes: number | null;
  readonly barometricMmhg: number | null;
  readonly values: readonly JsonValue[];
  readonly derived: readonly JsonDerived[];
  readonly missing: readonly { readonly id: string; readonly needs: readonly string[]; readonly message: string }[];
  readonly notApplicable: readonly { readonly id: string; readonly reason: string; readonly withheldBy: string | null }[];
  readonly readings: readonly { readonly topic: string; readonly text: string; readonly notable: boolean }[];
}

/** Each timepoint of the note as JSON; with `written`, each as `written` makes it of its JSON (then let go). */
export function timepointsJson(result: NoteResult): JsonTimepoint[];
export function timepointsJson<T>(result: NoteResult, written: (json: JsonTimepoint) => T): T[];
export function timepointsJson(result: NoteResult, written?: (json: JsonTimepoint) => unknown): unknown[] {
  const lines = result.analysis.tree.lines;
  return result.analysis.timeline.timepoints.map((tp) => {
    const node = tp.line === null ? undefined : lines[tp.line];
    const json = timepointJson(tp, result.analysis.derivation(tp.index), node?.kind === 'timepoint' ? node.label?.text ?? null : null);
    return written === undefined ? json : written(json);
  });
}

/**
 * Each timepoint of the note as version 2 writes it, made directly (what `timepointV2` makes of
 * version 1's object, without making that object first), each as `written` makes it of its JSON;
 * the definitions its derived values point to are put in `used`.
 */
export function timepointsJsonV2<T>(result: NoteResult, used: Map<string, KeyedDefinition>, written: (json: unknown) => T): T[] {
  const lines = result.analysis.tree.lines;
  return result.analysis.timeline.timepoints.map((tp) => {
    const node = tp.line === null ? undefined : lines[tp.line];
    return written(timepointJson(tp, result.analysis.derivation(tp.index), node?.kind === 'timepoint' ? node.label?.text ?? null : null, used));
  });
}

/** An origin as version 2 writes it: `originV2(originJson(o))`. */
function originJsonV2(o: InputOrigin): Partial<JsonOrigin> & Pick<JsonOrigin, 'kind'> {
  switch (o.kind) {
    case 'derived': return { kind: 'derived', derived: o.id };
    case 'default': return { kind: 'default', description: o.description };
    case 'carried': {
      const minutes = carriedMinutes(o);
      return minutes === null ? { kind: 'carried', line: o.line + 1, timepoint: o.timepoint } : { kind: 'carried', line: o.line + 1, timepoint: o.timepoint, carriedMinutes: minutes };
    }
    default: return { kind: o.kind, line: o.line + 1 };
  }
}

/** A derived value as version 2 writes it (see `timepointV2`). */
function derivedJsonV2(d: DerivedValue, used: Map<string, KeyedDefinition>): unknown {
  const definition = definitionKey(d.id, d.formula, d.source);
  if (!used.has(definition.key)) used.set(definition.key, definition);
  return {
    id: d.id,
    value: num(d.value),
    ...(d.range ? { low: num(d.range.low), high: num(d.range.high) } : {}),
    unit: d.unit,
    definition: definition.key,
    substituted: d.substituted,
    estimate: d.estimate,
    usesCarried: d.usesCarried,
    inputs: d.inputs.map((t) => ({ name: t.name, value: t.word ?? num(t.value), unit: t.unit, origin: originJsonV2(t.origin), ...(t.note ? { note: t.note } : {}) })),
    notes: d.notes,
  };
}

/**
 * `writtenLabel`: the label as the `@` line writes it, null when it has none (`label` then names
 * the timepoint by its time, or `start`). With `used`, as version 2 writes it (see `timepointsJsonV2`).
 */
function timepointJson(tp: Timepoint, derivation: TimepointDerivation, writtenLabel: string | null): JsonTimepoint;
function timepointJson(tp: Timepoint, derivation: TimepointDerivation, writtenLabel: string | null, used: Map<string, KeyedDefinition>): unknown;
function timepointJson(tp: Timepoint, derivation: TimepointDerivation, writtenLabel: string | null, used?: Map<string, KeyedDefinition>): unknown {
  return {
    index: tp.index,
    label: tp.label,
    writtenLabel,
    line: tp.line === null ? null : tp.line + 1,
    day: tp.time.day,
    minutes: tp.time.minutes,
    barometricMmhg: num(tp.barometricMmhg),
    values: [...tp.values.values()].map((v) => ({
      field: v.stated.fieldId,
      value: statedJson(v.stated.word ?? v.stated.parts ?? v.stated.value),
      unit: v.stated.unit === null ? null : displayUnit(v.stated.unit),
      origin: used === undefined ? originJson(v.origin) : originJsonV2(v.origin),
      usable: v.stated.usable,
    })),
    derived: used !== undefined ? derivation.derived.map((d) => derivedJsonV2(d, used)) : derivation.derived.map((d): JsonDerived => ({
      id: d.id,
      value: num(d.value),
      ...(d.range ? { low: num(d.range.low), high: num(d.range.high) } : {}),
      unit: d.unit,
      formula: d.formula,
      substituted: d.substituted,
      estimate: d.estimate,
      usesCarried: d.usesCarried,
      inputs: d.inputs.map((t) => ({ name: t.name, value: t.word ?? num(t.value), unit: t.unit, origin: originJson(t.origin), ...(t.note ? { note: t.note } : {}) })),
      notes: d.notes,
      source: d.source,
    })),
    missing: derivation.missing.map((m) => ({ id: m.id, needs: m.needs, message: m.message })),
    notApplicable: derivation.notApplicable.map((n) => ({ id: n.id, reason: n.reason, withheldBy: n.withheldBy })),
    readings: derivation.interpretations.map((i) => ({ topic: i.topic, text: i.text, notable: i.notable })),
  };
}

/** What version 2 writes once per run for each derived value: its formula in words and its source. */
export interface JsonDefinition {
  readonly formula: string;
  readonly source: string;
}

/** A definition with the key its derived values point to it by. */
export interface KeyedDefinition extends JsonDefinition {
  readonly key: string;
}

/** The definitions of the registry (formula as values show it, source) by id: a value that uses one is keyed by its id alone. */
const REGISTERED: ReadonlyMap<string, JsonDefinition> = new Map(DERIVED.map((d) => [d.id, { formula: d.shownFormula, source: d.source }]));

/**
 * The definitions met so far, by id: few per id (a formula chosen by a setting or by the gas, such
 * as the barometric pressure's, is one per choice), so a list each, compared by content.
 */
const KEYS = new Map<string, KeyedDefinition[]>();

/**
 * The key a derived value of `id` with this formula and source points to its definition by: the
 * id, when they are those of the registry's definition; else the id, `~` and 8 hexadecimal
 * digits of a SHA-256 of the formula and source. Made from the text alone, so every thread of a run
 * (and every run) gives one definition the same key.
 */
export function definitionKey(id: string, formula: string, source: string): KeyedDefinition {
  let known = KEYS.get(id);
  if (known === undefined) KEYS.set(id, (known = []));
  for (const k of known) if (k.formula === formula && k.source === source) return k;
  const registered = REGISTERED.get(id);
  const key = registered !== undefined && registered.formula === formula && registered.source === source
    ? id
    : `${id}~${createHash('sha256').update(`${formula}\u0000${source}`).digest('hex').slice(0, 8)}`;
  const made: KeyedDefinition = { key, formula, source };
  // Bounded: ids and formulas come from the registry; a redacted run may make more of one id.
  if (known.length < 64) known.push(made);
  return made;
}

/** An origin in version 2: its members that are not null. */
function originV2(o: JsonOrigin): Partial<JsonOrigin> & Pick<JsonOrigin, 'kind'> {
  const out: { kind: JsonOrigin['kind']; line?: number; timepoint?: number; description?: string; derived?: string; carriedMinutes?: number } = { kind: o.kind };
  if (o.line !== null) out.line = o.line;
  if (o.timepoint !== null) out.timepoint = o.timepoint;
  if (o.description !== null) out.description = o.description;
  if (o.derived !== undefined) out.derived = o.derived;
  if (o.carriedMinutes !== undefined && o.carriedMinutes !== null) out.carriedMinutes = o.carriedMinutes;
  return out;
}

/**
 * A timepoint of version 2 from its version-1 object: each derived value's `formula` and `source`
 * replaced by `definition`, the key of its entry in the run's `definitions` (each definition a
 * value points to is put in `used`, by key); origins without their null members. Everything else
 * as in version 1.
 */
export function timepointV2(tp: JsonTimepoint, used: Map<string, KeyedDefinition>): unknown {
  return {
    index: tp.index,
    label: tp.label,
    writtenLabel: tp.writtenLabel,
    line: tp.line,
    day: tp.day,
    minutes: tp.minutes,
    barometricMmhg: tp.barometricMmhg,
    values: tp.values.map((v) => ({ field: v.field, value: v.value, unit: v.unit, origin: originV2(v.origin), usable: v.usable })),
    derived: tp.derived.map((d) => {
      const definition = definitionKey(d.id, d.formula, d.source);
      if (!used.has(definition.key)) used.set(definition.key, definition);
      return {
        id: d.id,
        value: d.value,
        ...(d.low !== undefined ? { low: d.low, high: d.high } : {}),
        unit: d.unit,
        definition: definition.key,
        substituted: d.substituted,
        estimate: d.estimate,
        usesCarried: d.usesCarried,
        inputs: d.inputs.map((t) => ({ name: t.name, value: t.value, unit: t.unit, origin: originV2(t.origin), ...(t.note !== undefined ? { note: t.note } : {}) })),
        notes: d.notes,
      };
    }),
    missing: tp.missing,
    notApplicable: tp.notApplicable,
    readings: tp.readings,
  };
}
