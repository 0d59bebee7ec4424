/**
 * Plain-text presentation shared by the CLI, hovers and exports: how a value is written
 * back for a person, in its unit, and in the other unit system where there is one.
 */
import type { InputValue, Origin, StatedValue, Timepoint, TimepointTime } from './analysis/model';
import { displayUnit } from './analysis/read-value';
import type { Timeline } from './analysis/timeline';
import { fieldById, shortName } from './fields/registry';
import { convert, unitById, UNITS, type UnitDef } from './fields/units';
import { formatAgeYears, formatNumber, formatShort, halfLastDigit, writtenDecimals } from './util/format';
import { MMHG_PER_KPA } from './physiology/units';

/** Decimals that keep a value's precision in another unit. */
export function decimalsFor(unitId: string, fallback: number): number {
  if (unitId === 'kPa') return 1;
  if (unitId === 'fraction') return 2;
  if (unitId === 'F' || unitId === 'C') return 1;
  if (unitId === 'g/L') return 0;
  if (unitId === 'Hz') return 1;
  return fallback;
}

/**
 * `71 mmHg`, `0.40`, `female`, `96/58 mmHg`: the value in its canonical unit (or `unitId`), never
 * with fewer decimals than it was written with (`pco2 7.5` shows as 7.5 mmHg, `fio2 0.355` as 0.355).
 * A value whose unit could not be read is shown as written (`71 mmhgg`, `3 kPa` for a plateau).
 */
export function formatStated(s: StatedValue, unitId?: string): string {
  if (s.word !== null) return s.word;
  const target = unitById(unitId ?? s.unit ?? '') ?? unitById(s.unit ?? '');
  const number = statedNumber(s, unitId);
  if (number === null || !target) return asWritten(s);
  const unit = target.id === 'fraction' || target.id === 'ph' ? '' : ` ${displayUnit(target.id)}`;
  return `${number}${unit}`;
}

/**
 * A range (`target 88-92`) as people read it, `88–92`: each end with its own decimals as written
 * (`88.5–92`, not `88.5–92.0`), as a range of whole percents is the rule and a decimal end the slip
 * PN302 points out.
 */
function rangeShown(s: StatedValue, canonical: UnitDef, target: UnitDef): string {
  const written = s.item.value?.kind === 'pair' ? s.item.value.parts : null;
  return s.parts!.map((v, k) => {
    const text = written?.[k]?.text;
    return formatNumber(convert(v, canonical, target) ?? v, Math.max(decimalsFor(target.id, s.field.decimals), text === undefined ? 0 : writtenDecimals(text)));
  }).join('–');
}

/** The number(s) of a stated value in its canonical unit (or `unitId`), without the unit; null when it has none. */
export function statedNumber(s: StatedValue, unitId?: string): string | null {
  const field = s.field;
  const canonical = unitById(s.unit ?? '');
  const target = unitById(unitId ?? s.unit ?? '') ?? canonical;
  if (s.word !== null || !canonical || !target) return null;
  // An age written in months, weeks or days is not rounded to whole years (8 mo is 0.67 y, not 1 y;
  // 3 d is 0.0082 y, not 0 y): see `formatAgeYears`.
  if (field.dimension === 'age' && s.readUnit !== null && s.readUnit !== 'y' && target.id === 'y' && s.value !== null && !s.parts) return formatAgeYears(convert(s.value, canonical, target) ?? s.value);
  const decimals = Math.max(decimalsFor(target.id, field.decimals), writtenPrecisionIn(s, target));
  const show = (v: number) => formatNumber(convert(v, canonical, target) ?? v, decimals);
  if (s.parts && field.join === 'dash') return rangeShown(s, canonical, target);
  return s.parts ? s.parts.map(show).join('/') : s.value !== null ? show(s.value) : null;
}

/** The value and unit as the note wrote them: `71 mmhgg`. */
function asWritten(s: StatedValue): string {
  const text = s.item.value?.text ?? '';
  return s.item.unit ? `${text} ${s.item.unit.text}` : text;
}

/**
 * The decimals a value needs in `target` to keep the digits it was written with: the written
 * decimals in the unit it was read in, shifted by the power of ten between the two units
 * (35.5 % is 0.355); 0 when the units are not a power of ten apart (mmHg and kPa).
 */
function writtenPrecisionIn(s: StatedValue, target: UnitDef): number {
  const read = unitById(s.readUnit ?? '');
  const text = s.item.value?.text;
  if (!read || !text) return 0;
  const written = writtenDecimals(text);
  if (read === target) return written;
  const factor = convert(1, read, target);
  if (factor === null || factor <= 0) return 0;
  // A rate in Hz shown in /min: the decimals that give back the number written (1.004 Hz is 60.24
  // /min, not 60, which is 1 Hz; 5.5 Hz is 330 /min).
  if (read.id === 'Hz') return roundTripDecimals(Number(text.replace(',', '.')), written, factor);
  const shift = -Math.log10(factor);
  const whole = Math.round(shift);
  if (Math.abs(shift - whole) < 1e-9) return Math.max(0, written + whole);
  // Units a few percent apart (mbar and cmH2O): one decimal more than written, or the value would
  // show as the same number in both (25 mbar as 25 cmH2O, not 25.5) and sums of them look wrong.
  return Math.abs(shift) < NEAR_UNITS_LOG10 ? written + 1 : 0;
}

/** Units whose ratio is within this power of ten of 1 (about ±12 %) are shown with a decimal more. */
const NEAR_UNITS_LOG10 = 0.05;

/** The fewest decimals (up to those written) with which `written × factor` converts back to `written` at its decimals. */
function roundTripDecimals(written: number, decimals: number, factor: number): number {
  if (!Number.isFinite(written)) return 0;
  const shown = formatNumber(written, decimals);
  for (let d = 0; d < decimals; d++) if (formatNumber(Number(formatNumber(written * factor, d)) / factor, decimals) === shown) return d;
  return decimals;
}

/**
 * How far (mmHg) a stated gas pressure can be from what it stands for when it was written in kPa:
 * half a unit of its last written decimal, one decimal at least (6.7 kPa stands for 6.65–6.75 kPa,
 * ± 0.375 mmHg). 0 for a pressure written in mmHg, which thresholds in mmHg take as it is.
 */
export function kpaResolutionMmhg(stated: StatedValue): number {
  if (stated.readUnit !== 'kPa') return 0;
  return halfLastDigit(stated.item.value?.text ?? '', 1) * MMHG_PER_KPA;
}

export { writtenDecimals } from './util/format';

// ── gas pressures in a kPa note ─────────────────────────────────────────
// Inside the core gas pressures are mmHg. Where the gas unit in force at a timepoint is kPa
// (`units gas kPa`, or the gasUnit setting), they are shown in kPa first, with mmHg in
// parentheses: `28.2 kPa (212 mmHg)`, compact `28.2 kPa (212)`.

const MMHG = unitById('mmHg')!;
const KPA = unitById('kPa')!;
/** Decimals of a gas pressure shown in kPa. */
export const KPA_DECIMALS = decimalsFor('kPa', 1);

/**
 * Whether gas pressures at this timepoint are shown in kPa first: its gas pressures were read in
 * kPa, or it states none (or in both units) and its gas unit in force is kPa.
 */
export function showsKpa(tp: Timepoint | null | undefined): boolean {
  return tp?.shownGasUnit === 'kPa';
}

/**
 * Whether gas pressures on the note's header lines (before the first timepoint) are shown in kPa
 * first: by the same rule as at a timepoint, the gas unit in force at the header's end is kPa.
 */
export function headerShowsKpa(timeline: Timeline): boolean {
  return timeline.headerGasUnit === 'kPa';
}

/** A pressure in mmHg, in kPa (the unit registry's conversion: 1 kPa = 7.50062 mmHg). */
export function kpaFromMmhg(mmHg: number): number {
  return convert(mmHg, MMHG, KPA) ?? Number.NaN;
}

/** `28.2`: a pressure in mmHg as a number of kPa. */
export function kpaNumber(mmHg: number): string {
  return formatNumber(kpaFromMmhg(mmHg), KPA_DECIMALS);
}

/** `28.2 kPa (212)`: a pressure in mmHg, compact, kPa first (inlay hints, the status bar). */
export function kpaFirstCompact(mmHg: number, decimals: number): string {
  return `${kpaNumber(mmHg)} kPa (${formatNumber(mmHg, decimals)})`;
}

/** `160 mmHg`, or where gas pressures are shown in kPa first (`kpa`), `21.3 kPa (160 mmHg)`: a pressure in a message. */
export function gasPressureText(mmHg: number, decimals: number, kpa: boolean): string {
  const inMmhg = `${formatNumber(mmHg, decimals)} mmHg`;
  return kpa ? `${kpaNumber(mmHg)} kPa (${inMmhg})` : inMmhg;
}

/**
 * A stated gas pressure quoted back in a message, its number as the note wrote it: `6.68 kPa (50
 * mmHg)` where gas pressures are shown in kPa first (`kpa`), `40.5 mmHg` otherwise.
 */
export function statedGasText(s: StatedValue, kpa: boolean): string {
  const mmHg = s.value ?? Number.NaN;
  const inKpa = kpa ? statedKpaNumber(s) : null;
  return inKpa !== null ? `${inKpa} kPa (${formatNumber(mmHg, 0)} mmHg)` : `${statedNumber(s) ?? formatNumber(mmHg, 0)} mmHg`;
}

/** Whether a field is a gas pressure a note may write in kPa (PaO2, PaCO2; not a blood pressure). */
export function isKpaField(fieldId: string): boolean {
  return fieldById(fieldId)?.units?.includes('kPa') === true;
}

/**
 * `9.6 kPa` in a kPa note: a stated gas pressure in kPa, with the decimals it was written with;
 * null when the value is not a gas pressure (then it is shown as `formatStated` shows it).
 */
export function statedInKpa(s: StatedValue): string | null {
  const number = statedKpaNumber(s);
  return number === null ? null : `${number} kPa`;
}

/** `9.6`: the number of `statedInKpa` without its unit; null when the value is not a gas pressure. */
export function statedKpaNumber(s: StatedValue): string | null {
  if (s.unit !== 'mmHg' || !isKpaField(s.fieldId)) return null;
  const number = statedNumber(s, 'kPa');
  return number;
}

/** The value in the other unit system, when the field has one (mmHg ↔ kPa, °C ↔ °F, ...). */
export function formatAlternative(s: StatedValue): string | null {
  // The unit the number was written in, when it is not the canonical one (`height 5.9 ft` shows
  // `180 cm = 5.9 ft`); else the other unit system of the canonical unit.
  const written = s.readUnit !== null && s.readUnit !== s.unit && !s.unitImplied;
  const alt = written ? s.readUnit : ALTERNATIVE[s.unit ?? ''];
  if (!alt || s.word !== null || (s.value === null && !s.parts)) return null;
  // As written: the number the note holds, not one converted back, in the unit as written.
  if (written && s.value !== null && s.item.valueKind === 'number' && s.item.value) return `${s.item.value.text} ${readUnitName(s)}`;
  const field = s.field;
  if (!field.units?.includes(alt)) return null;
  return formatStated(s, alt);
}

/**
 * The name of the unit a stated value was read in, as the note wrote it where the spelling is the
 * name of another unit of the same size: `mbar` for a barometric pressure read in hPa, `hPa` for an
 * airway pressure read in mbar (1 mbar = 1 hPa = 100 Pa). Else the unit's own name (`hpa` is hPa).
 */
export function readUnitName(s: StatedValue): string {
  const id = s.readUnit ?? '';
  const written = s.unitImplied ? undefined : s.item.unit?.text.toLowerCase();
  if (written !== undefined && written !== id.toLowerCase()) {
    const aliases = unitById(id)?.aliases ?? [];
    for (const u of UNITS) if (u.id !== id && u.id.toLowerCase() === written && aliases.some((a) => a.toLowerCase() === written)) return displayUnit(u.id);
  }
  return displayUnit(id);
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
    case 'carried': return carriedFromText(origin, 'label');
    case 'default': return origin.description;
  }
}

/** A carried origin. */
export type CarriedOrigin = Extract<Origin, { readonly kind: 'carried' }>;

/**
 * Where a carried value came from, the one wording of it (show, hovers, hints, readings, findings):
 * `carried from start, line 3` with its timepoint's label (`label`), `carried from line 3` without
 * it (`line`: readings, where the label, free text of the note, is left out), or `carried from here`
 * (`here`: a finding's related information, placed on the line). The day and time of the timepoint
 * it came from are named when that was another day than the timepoint it is in force at
 * (`carried from start, day 1 10:00, line 3`): a setting from the day before is worth a look
 * before what rests on it.
 */
export function carriedFromText(origin: CarriedOrigin, naming: 'label' | 'line' | 'here'): string {
  const when = origin.fromTime.day !== null && origin.atTime.day !== null && origin.fromTime.day !== origin.atTime.day ? timeText(origin.fromTime) : null;
  if (naming === 'here') return when === null ? 'carried from here' : `carried from here, ${when}`;
  let label = naming === 'label' ? origin.timepointLabel || (when === null ? `timepoint ${origin.timepoint + 1}` : '') : '';
  // A timepoint without a label is named by its time as written (`@ 08:00`): the day and time say it.
  if (when !== null && (label === when || when.endsWith(` ${label}`))) label = '';
  return `carried from ${label ? `${label}, ` : ''}${when !== null ? `${when}, ` : ''}line ${origin.line + 1}`;
}

/** Minutes from the timepoint a carried value was stated at to the one it is in force at (below 0 where the note's times go back, PN308); null where either time is unknown. */
export function carriedMinutes(origin: CarriedOrigin): number | null {
  return origin.fromTime.minutes !== null && origin.atTime.minutes !== null ? origin.atTime.minutes - origin.fromTime.minutes : null;
}

/** `day 1 10:00`, as a timepoint line writes it; `day 1` when only the day is known; null when neither is. */
export function timeText(time: TimepointTime): string | null {
  if (time.minutes !== null && Number.isFinite(time.minutes)) {
    const { day, clock } = dayAndClock(time.minutes);
    return `day ${day} ${clock}`;
  }
  return time.day !== null ? `day ${time.day}` : null;
}

/** Minutes since day 1 00:00 (finite) as a day and a clock: 2,040 is day 2 and `10:00`. */
export function dayAndClock(minutes: number): { readonly day: number; readonly clock: string } {
  const whole = Math.round(minutes);
  const day = Math.floor(whole / 1440) + 1;
  const inDay = whole - (day - 1) * 1440;
  return { day, clock: `${String(Math.floor(inDay / 60)).padStart(2, '0')}:${String(inDay % 60).padStart(2, '0')}` };
}

export function labelOf(fieldId: string): string {
  return fieldById(fieldId)?.label ?? fieldId;
}

export function shortOf(fieldId: string): string {
  const f = fieldById(fieldId);
  return f ? shortName(f) : fieldId;
}

/** `FiO2 0.40 (line 3)`; at a timepoint whose gas unit is kPa, a gas pressure in kPa first (`PB 83.7 kPa = 628 mmHg (header, line 2)`). */
export function describeInput(input: InputValue, tp: Timepoint | null = null): string {
  const kpa = showsKpa(tp) ? statedInKpa(input.stated) : null;
  const value = kpa ? `${kpa} = ${formatStated(input.stated)}` : formatStated(input.stated);
  return `${labelOf(input.stated.fieldId)} ${value} (${describeOrigin(input.origin)})`;
}

/** How an oxygen device is named in a message: the note's canonical word, with NIV, CPAP and HFNC in capitals. */
const DEVICE_NAMES: Readonly<Record<string, string>> = { niv: 'NIV', cpap: 'CPAP', hfnc: 'HFNC' };

/** `NIV` for `niv`, `mask` for `mask`: a device's canonical word as messages name it. */
export function deviceShown(word: string): string {
  return DEVICE_NAMES[word] ?? word;
}
