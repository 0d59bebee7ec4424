/** The per-timepoint part of `check --format json`: values in force with units and origins. */
import type { NoteResult } from '../core/check-note';
import type { Origin } from '../core/analysis/model';
import { displayUnit } from '../core/analysis/read-value';

export interface JsonValue {
  readonly field: string;
  readonly value: number | string | readonly number[] | null;
  readonly unit: string | null;
  readonly origin: { readonly kind: Origin['kind']; readonly line: number | null; readonly timepoint: number | null; readonly description: string | null };
  readonly usable: boolean;
}

export function timepointsJson(result: NoteResult): unknown[] {
  return result.analysis.timeline.timepoints.map((tp) => ({
    index: tp.index,
    label: tp.label,
    line: tp.line === null ? null : tp.line + 1,
    day: tp.time.day,
    minutes: tp.time.minutes,
    barometricMmhg: tp.barometricMmhg,
    values: [...tp.values.values()].map((v): JsonValue => ({
      field: v.stated.fieldId,
      value: v.stated.word ?? v.stated.parts ?? v.stated.value,
      unit: v.stated.unit === null ? null : displayUnit(v.stated.unit),
      origin: {
        kind: v.origin.kind,
        line: v.origin.kind === 'default' ? null : v.origin.line + 1,
        timepoint: v.origin.kind === 'carried' ? v.origin.timepoint : null,
        description: v.origin.kind === 'default' ? v.origin.description : null,
      },
      usable: v.stated.usable,
    })),
  }));
}
