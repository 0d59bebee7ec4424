/**
 * Plain-text presentation shared by the CLI, hovers and exports: how a value is written
 * back for a person, in its unit, and in the other unit system where there is one.
 */
import type { InputValue, Origin, StatedValue } from './analysis/model';
import { displayUnit } from './analysis/read-value';
import { fieldById, shortName } from './fields/registry';
import { convert, unitById } from './fields/units';
import { formatNumber } from './util/format';

/** Decimals that keep a value's precision in another unit. */
export function decimalsFor(unitId: string, fallback: number): number {
  if (unitId === 'kPa') return 1;
  if (unitId === 'fraction') return 2;
  if (unitId === 'F' || unitId === 'C') return 1;
  if (unitId === 'g/L') return 0;
  return fallback;
}

/** `71 mmHg`, `0.40`, `female`, `96/58 mmHg`: the value in its canonical unit. */
export function formatStated(s: StatedValue, unitId?: string): string {
  if (s.word !== null) return s.word;
  const field = fieldById(s.fieldId);
  const canonical = unitById(s.unit ?? '');
  const target = unitById(unitId ?? s.unit ?? '') ?? canonical;
  if (!field || !canonical || !target) return s.item.value?.text ?? '';
  const decimals = decimalsFor(target.id, field.decimals);
  const show = (v: number) => formatNumber(convert(v, canonical, target) ?? v, decimals);
  const number = s.parts ? s.parts.map(show).join('/') : s.value !== null ? show(s.value) : '';
  const unit = target.id === 'fraction' || target.id === 'ph' ? '' : ` ${displayUnit(target.id)}`;
  return `${number}${unit}`;
}

/** The value in the other unit system, when the field has one (mmHg ↔ kPa, °C ↔ °F, ...). */
export function formatAlternative(s: StatedValue): string | null {
  const alt = ALTERNATIVE[s.unit ?? ''];
  if (!alt || s.word !== null || (s.value === null && !s.parts)) return null;
  const field = fieldById(s.fieldId);
  if (!field?.units?.includes(alt)) return null;
  return formatStated(s, alt);
}

const ALTERNATIVE: Readonly<Record<string, string>> = {
  mmHg: 'kPa',
  kPa: 'mmHg',
  fraction: '%',
  C: 'F',
  'g/dL': 'g/L',
};

export function describeOrigin(origin: Origin): string {
  switch (origin.kind) {
    case 'here': return `line ${origin.line + 1}`;
    case 'header': return `header, line ${origin.line + 1}`;
    case 'carried': return `carried from ${origin.timepointLabel || `timepoint ${origin.timepoint + 1}`}, line ${origin.line + 1}`;
    case 'default': return origin.description;
  }
}

export function labelOf(fieldId: string): string {
  return fieldById(fieldId)?.label ?? fieldId;
}

export function shortOf(fieldId: string): string {
  const f = fieldById(fieldId);
  return f ? shortName(f) : fieldId;
}

export function describeInput(input: InputValue): string {
  return `${labelOf(input.stated.fieldId)} ${formatStated(input.stated)} (${describeOrigin(input.origin)})`;
}
