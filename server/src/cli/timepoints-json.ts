/** The per-timepoint part of `check --format json`: values in force with units and origins. */
import type { NoteResult } from '../core/check-note';
import type { Timepoint } from '../core/analysis/model';
import type { InputOrigin, TimepointDerivation } from '../core/derive/model';
import { displayUnit } from '../core/analysis/read-value';
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

/** Each timepoint of the note as JSON; with `written`, each as `written` makes it of its JSON (then let go). */
export function timepointsJson(result: NoteResult): unknown[];
export function timepointsJson<T>(result: NoteResult, written: (json: unknown) => T): T[];
export function timepointsJson(result: NoteResult, written?: (json: unknown) => unknown): unknown[] {
  const lines = result.analysis.tree.lines;
  return result.analysis.timeline.timepoints.map((tp) => {
    const node = tp.line === null ? undefined : lines[tp.line];
    const json = timepointJson(tp, result.analysis.derivation(tp.index), node?.kind === 'timepoint' ? node.label?.text ?? null : null);
    return written === undefined ? json : written(json);
  });
}

/** `writtenLabel`: the label as the `@` line writes it, null when it has none (`label` then names the timepoint by its time, or `start`). */
function timepointJson(tp: Timepoint, derivation: TimepointDerivation, writtenLabel: string | null): unknown {
  return {
    index: tp.index,
    label: tp.label,
    writtenLabel,
    line: tp.line === null ? null : tp.line + 1,
    day: tp.time.day,
    minutes: tp.time.minutes,
    barometricMmhg: num(tp.barometricMmhg),
    values: [...tp.values.values()].map((v): JsonValue => ({
      field: v.stated.fieldId,
      value: statedJson(v.stated.word ?? v.stated.parts ?? v.stated.value),
      unit: v.stated.unit === null ? null : displayUnit(v.stated.unit),
      origin: originJson(v.origin),
      usable: v.stated.usable,
    })),
    derived: derivation.derived.map((d) => ({
      id: d.id,
      value: num(d.value),
      ...(d.range ? { low: num(d.range.low), high: num(d.range.high) } : {}),
      unit: d.unit,
      formula: d.formula,
      substituted: d.substituted,
      estimate: d.estimate,
      usesCarried: d.usesCarried,
      inputs: d.inputs.map((t) => ({ name: t.name, value: num(t.value), unit: t.unit, origin: originJson(t.origin), ...(t.note ? { note: t.note } : {}) })),
      notes: d.notes,
      source: d.source,
    })),
    missing: derivation.missing.map((m) => ({ id: m.id, needs: m.needs, message: m.message })),
    notApplicable: derivation.notApplicable.map((n) => ({ id: n.id, reason: n.reason, withheldBy: n.withheldBy })),
    readings: derivation.interpretations.map((i) => ({ topic: i.topic, text: i.text, notable: i.notable })),
  };
}
