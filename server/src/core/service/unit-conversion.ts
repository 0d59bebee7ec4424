/**
 * Rewriting values in another unit: the edits that write one stated value (or a shorthand
 * gas's two pressures) in a target unit, and `convertNoteUnits`, which writes every gas
 * pressure of a note in mmHg or kPa and sets the note's `units gas` line to match.
 *
 * Rounding: kPa 1 decimal, mmHg 0, FiO2 fraction 2, FiO2 % 0 (1 when needed), °C/°F 1,
 * g/L 0, g/dL 1, Hb mmol/L 1, and one or two more where these would not convert back to the
 * number as written (`numberIn`). A converted number always gets its unit written, except a
 * fraction.
 */
import { checkNote, type NoteResult } from '../check-note';
import type { StatedValue } from '../analysis/model';
import { displayUnit } from '../analysis/read-value';
import type { Bounds, FieldDef } from '../fields/registry';
import { convert, unitById, unitsForSpelling, type UnitDef } from '../fields/units';
import { decimalsFor } from '../present';
import type { ItemNode, LineNode, SectionLine } from '../syntax/tree';
import type { TextEdit } from '../types';
import { formatNumber, formatShort } from '../util/format';
import { ITEM_COLUMN } from './format';
import { lineInsertion } from '../syntax/layout';
import { within, withinAsWritten } from '../analysis/bounds';
import { lineRange, statedOnLine } from './locate';
import { applyEdits, keepingCommentColumns } from './text-edits';
import { ITEMS_PER_STEP, runSteps, type Steps } from '../util/steps';

export type GasUnit = 'mmHg' | 'kPa';

/**
 * Unit pairs a value can be rewritten between, in the order the actions are offered: Hb in g/dL is
 * offered g/L first, then mmol/L (by the molar mass of the monomer, as it is read: fields/units.ts).
 */
const PAIRS: readonly (readonly [string, string])[] = [['mmHg', 'kPa'], ['fraction', '%'], ['C', 'F'], ['g/dL', 'g/L'], ['g/dL', 'mmolHb/L']];

/** The units a stated value can be rewritten in, other than the one it was read in, in the order of PAIRS. */
export function otherUnits(s: StatedValue): readonly string[] {
  const field = s.field;
  if (!s.readUnit || s.value === null || field.kind !== 'number') return [];
  const others: string[] = [];
  for (const [a, b] of PAIRS) {
    const other = s.readUnit === a ? b : s.readUnit === b ? a : null;
    if (other && field.units?.includes(a) && field.units.includes(b)) others.push(other);
  }
  return others;
}

/**
 * A canonical value written as a number in `to`, with that unit's usual decimals, or one or two
 * more where those would not convert back to the number as the note wrote it: 9.0 kPa is written
 * 67.5 mmHg, not 68 (which is 9.1 kPa), and 28.5 % is 0.285, not 0.29 (29 %). So converting a
 * value there and back gives the number written, and a possible value is not rounded past what
 * is possible. A usual value stays usual without more: PN302 compares a number written in another
 * unit at the precision written (`withinAsWritten`), so PaCO2 150 mmHg, the most that is usual, is
 * 20.0 kPa (150.01 mmHg, and as written the usual maximum).
 */
export function numberIn(s: StatedValue, field: FieldDef, to: string, extra = 0, lean: Lean = 'nearest'): string | null {
  const canonical = unitById(s.unit ?? '');
  const target = unitById(to);
  if (!canonical || !target || s.value === null) return null;
  const v = convert(s.value, canonical, target);
  if (v === null) return null;
  // `extra`: decimals more than the unit's usual ones, where the usual would move a finding (convertNoteUnits).
  const usual = extra + (to === '%' ? (Number.isInteger(Math.round(v * 10) / 10) ? 0 : 1) : to === 'mmHg' ? 0 : decimalsFor(to, field.decimals));
  const write = (decimals: number) => (to === '%' ? formatShort(v, decimals) : formatNumber(v, decimals));
  const written = writtenNumber(s);
  const from = s.readUnit ? unitById(s.readUnit) : undefined;
  // A possible value stays possible (200 mmHg, the most an EtCO2 can be, is 26.66 kPa: 26.7 kPa is over it),
  // and a usual one usual (1 kPa, usual as written for an EtCO2 from 10 mmHg, is 10 mmHg, not 8).
  const possible = within(s.value, field.hard);
  const usualAsWritten = written !== null && withinAsWritten(s.value, field.soft, field, s.readUnit, s.item.value?.text ?? null);
  if (written && from && from.id !== target.id) {
    for (let decimals = usual; decimals <= usual + 2; decimals++) {
      // The nearest number, or where that is past a bound the value is within, the one on its side;
      // leaning, first the lowest or highest number that still converts back to the number written.
      const candidates = [write(decimals), towardBound(v, decimals, target, canonical, field.hard), atBound(v, decimals, target, canonical, field.soft)];
      if (lean !== 'nearest') candidates.unshift(leaningNumber(written, from, target, decimals, lean));
      for (const text of candidates) {
        if (text === null) continue;
        const back = convert(Number(text), target, from);
        const read = convert(Number(text), target, canonical);
        if (back === null || formatNumber(back, written.decimals) !== formatNumber(written.value, written.decimals)) continue;
        if (possible && (read === null || !within(read, field.hard))) continue;
        if (usualAsWritten && (read === null || !withinAsWritten(read, field.soft, field, target.id, text))) continue;
        return text;
      }
    }
  }
  return write(usual);
}

/**
 * The bound of `bounds` (a field's usual range) `v` (in `to`) is past, written with `decimals` on
 * its inner side; null when `v` is within. PN302 reads a number in the field's own unit as exact,
 * so a usual value converted into it must land inside, not merely round to the bound's neighbour.
 */
function atBound(v: number, decimals: number, to: UnitDef, canonical: UnitDef, bounds: Bounds | undefined): string | null {
  const read = convert(v, to, canonical);
  if (read === null || !bounds) return null;
  const factor = 10 ** decimals;
  const end = bounds.min !== undefined && read < bounds.min ? convert(bounds.min, canonical, to) : bounds.max !== undefined && read > bounds.max ? convert(bounds.max, canonical, to) : null;
  if (end === null) return null;
  const n = read < (bounds.min ?? -Infinity) ? Math.ceil(end * factor - 1e-9) : Math.floor(end * factor + 1e-9);
  return formatNumber(n / factor, decimals);
}

/**
 * Which number a conversion writes among those that convert back to the number written: the
 * nearest to the value, or (`low`, `high`) the lowest or highest. A number written as 3.8 kPa
 * stands for 3.75–3.85 kPa, and the checks read it so (PN402); in mmHg, where a number is read
 * as exact, 28.2 and 28.8 mmHg are both still 3.8 kPa, and one of them may read as the kPa did.
 */
export type Lean = 'nearest' | 'low' | 'high';

/** The lowest or highest number with `decimals` (in `to`) that the written number stands for; null when none. */
function leaningNumber(written: { value: number; decimals: number }, from: UnitDef, to: UnitDef, decimals: number, lean: 'low' | 'high'): string | null {
  const half = 0.5 * 10 ** -written.decimals;
  const a = convert(written.value - half, from, to);
  const b = convert(written.value + half, from, to);
  if (a === null || b === null) return null;
  const factor = 10 ** decimals;
  // Strictly inside: an end itself rounds to the next number written.
  const n = lean === 'low' ? Math.ceil(Math.min(a, b) * factor + 1e-6) : Math.floor(Math.max(a, b) * factor - 1e-6);
  return formatNumber(n / factor, decimals);
}

/**
 * `v` (in `to`) rounded with `decimals` toward the inside of `bounds` (a field's possible or usual
 * range) where rounding to the nearest would cross one (PaO2 10 mmHg, its least, is 1.34 kPa
 * rather than 1.3, 9.75 mmHg).
 */
function towardBound(v: number, decimals: number, to: UnitDef, canonical: UnitDef, bounds: Bounds | undefined): string | null {
  const factor = 10 ** decimals;
  const nearest = Math.round(v * factor) / factor;
  const read = convert(nearest, to, canonical);
  if (read === null || !bounds) return null;
  if (bounds.min !== undefined && read < bounds.min) return formatNumber(Math.ceil(v * factor) / factor, decimals);
  if (bounds.max !== undefined && read > bounds.max) return formatNumber(Math.floor(v * factor) / factor, decimals);
  return null;
}

/** The number of a stated value as the note wrote it, with its decimals (a decimal comma read as a point). */
function writtenNumber(s: StatedValue): { value: number; decimals: number } | null {
  const value = s.item.value;
  if (!value || value.kind !== 'number') return null;
  const text = value.text.replace(',', '.');
  const n = Number(text);
  if (!Number.isFinite(n)) return null;
  const point = text.indexOf('.');
  return { value: n, decimals: point < 0 ? 0 : text.length - point - 1 };
}

/** Whether a written unit token reads as the unit id for this field. */
function unitReadsAs(text: string, field: FieldDef, id: string): boolean {
  return unitsForSpelling(text).find((u) => field.units?.includes(u.id))?.id === id;
}

/**
 * Edits that write one item's number in `to` and write (or replace, or for a fraction remove)
 * its unit. Null when the value cannot be converted.
 */
export function itemConversionEdits(line: number, s: StatedValue, to: string): TextEdit[] | null {
  const field = s.field;
  const item = s.item;
  const value = item.value;
  if (!value || value.kind !== 'number' || item.implied === 'shorthand') return null;
  const number = numberIn(s, field, to);
  if (number === null) return null;
  const edits: TextEdit[] = [{ range: lineRange(line, value.span.start, value.span.end), newText: number }];
  if (to === 'fraction') {
    if (item.unit) edits.push({ range: lineRange(line, value.span.end, item.unit.span.end), newText: '' });
  } else if (item.unit) {
    edits.push({ range: lineRange(line, item.unit.span.start, item.unit.span.end), newText: displayUnit(to) });
  } else {
    edits.push({ range: lineRange(line, value.span.end, value.span.end), newText: ` ${displayUnit(to)}` });
  }
  return edits;
}

/** The stated pressures of a shorthand gas on a line (PCO2 and PO2), with its unit token. */
export interface ShorthandPressures {
  readonly node: SectionLine;
  readonly parts: readonly StatedValue[];
  readonly unit: ItemNode['unit'];
  /** End of the whole shorthand group (where a unit is written). */
  readonly end: number;
}

export function shorthandPressures(result: NoteResult, node: LineNode): ShorthandPressures | null {
  if (node.kind !== 'section' || (node.section !== 'abg' && node.section !== 'vbg')) return null;
  const group = node.items.filter((i) => i.implied === 'shorthand');
  const last = group[group.length - 1];
  if (!last?.value) return null;
  const stated = statedOnLine(result, node.line).filter((s) => s.item.implied === 'shorthand' && (s.item.keyName === 'pco2' || s.item.keyName === 'po2'));
  if (stated.length === 0) return null;
  const unit = group.find((i) => i.unit)?.unit ?? null;
  return { node, parts: stated, unit, end: last.value.span.end };
}

/** Edits writing a shorthand gas's pressures in `to` (both numbers and the shared unit). */
export function shorthandConversionEdits(sh: ShorthandPressures, to: GasUnit): TextEdit[] | null {
  const line = sh.node.line;
  const edits: TextEdit[] = [];
  for (const s of sh.parts) {
    const field = s.field;
    if (!s.readUnit || !s.item.value) return null;
    const number = numberIn(s, field, to);
    if (number === null) return null;
    edits.push({ range: lineRange(line, s.item.value.span.start, s.item.value.span.end), newText: number });
  }
  edits.push(sh.unit
    ? { range: lineRange(line, sh.unit.span.start, sh.unit.span.end), newText: to }
    : { range: lineRange(line, sh.end, sh.end), newText: ` ${to}` });
  return edits;
}

function isGasPressure(field: FieldDef | undefined): field is FieldDef {
  return field !== undefined && field.dimension === 'gas-pressure' && (field.units?.includes('kPa') ?? false) && (field.units?.includes('mmHg') ?? false);
}

/** Lines of `units gas …` items (with a value), in order. */
function gasUnitItems(result: NoteResult): { line: number; item: ItemNode }[] {
  const out: { line: number; item: ItemNode }[] = [];
  for (const node of result.analysis.tree.lines) {
    if (node.kind !== 'section' || node.section !== 'units') continue;
    for (const item of node.items) if (item.keyName === 'gas' && item.value) out.push({ line: node.line, item });
  }
  return out;
}

/**
 * Where a new `units gas` line goes: after the leading patient lines, before anything else; at
 * the top of a note with nothing but blank lines (an empty note gets no blank line before it).
 */
function unitsLineInsertion(result: NoteResult): number {
  const lines = result.analysis.tree.lines;
  let at = -1;
  for (const node of lines) {
    if (node.kind === 'blank') continue;
    if (node.kind === 'section' && node.section === 'patient') {
      at = node.line + 1;
      continue;
    }
    return at >= 0 ? at : node.line;
  }
  return at >= 0 ? at : 0;
}

/**
 * Edits that write every gas pressure of the note in `to` (PaO2, PaCO2, venous pressures,
 * end-tidal CO2, barometric pressure; shorthand gases too) and make the note's `units gas`
 * say `to`, adding the line when there is none. The note then reads back to the same values,
 * within rounding. Values whose unit could not be read are left as they are. A value outside
 * its field's usual range keeps its number as written, so that a likely slip stays
 * recognisable, and gets the unit it was read in written out when it was bare. A bare number
 * whose unit is in doubt (PN204) is left as written: writing out the unit it was read in would
 * state the unit Pneumark found implausible, and put a number kept out of calculations into
 * them; left bare, it is read in the note's new gas unit, the one it is ordinary in (or stays
 * in doubt when the note keeps its unit); in a bare shorthand gas, the other pressure is converted
 * and left bare beside it. Converting twice changes nothing the second time.
 *
 * The converted note keeps the findings of physiology (PN4xx) and the bands of its notable
 * readings at every timepoint (in a note of up to 400 timepoints): where the usual decimals would move one (a PaO2 rounded across the alveolar limit of
 * PN401), the timepoint's pressures get more decimals, or the number at one end of what the
 * written one stands for; where no number does, they keep their number and unit as written.
 */
export function convertNoteUnits(result: NoteResult, to: GasUnit): TextEdit[] {
  return runSteps(convertNoteUnitSteps(result, to));
}

/** `convertNoteUnits` in steps (see util/steps.ts), yielding after every ITEMS_PER_STEP values converted; none when the memo has it. */
export function* convertNoteUnitSteps(result: NoteResult, to: GasUnit): Steps<TextEdit[]> {
  let known = CONVERSIONS.get(result);
  if (!known) CONVERSIONS.set(result, (known = {}));
  const kept = known[to];
  if (kept) return kept;
  const edits = keepingCommentColumns((line) => result.analysis.tree.lines[line]?.text, yield* keepingOutcomes(result, to));
  known[to] = edits;
  return edits;
}

/**
 * Whole-note conversions by analysis: code actions ask at every move of the cursor, and each
 * conversion reads the converted note again.
 */
const CONVERSIONS = new WeakMap<NoteResult, Partial<Record<GasUnit, TextEdit[]>>>();

/** `convertNoteUnits` without the memo. */
function* keepingOutcomes(result: NoteResult, to: GasUnit): Steps<TextEdit[]> {
  let edits = yield* conversionEdits(result, to, ALL_NEAREST);
  if (edits.length === 0 || result.analysis.timeline.timepoints.length > VERIFIED_UP_TO_TIMEPOINTS) return edits;
  // The note as converted must read as the note does: the same physiology findings and reading
  // bands at every timepoint. Rounding to a unit's usual decimals can move a value across a
  // threshold (PaO2 101 mmHg, 1 mmHg inside the alveolar limit of PN401, is 13.5 kPa = 101.26
  // mmHg, outside it), and a value written in kPa is compared at the resolution it was written
  // with (PN402 takes 5.3 kPa for 5.25–5.35 kPa). Where a timepoint reads otherwise, its converted
  // pressures get one more decimal, then two; each try is one analysis of the converted note.
  const lines = result.analysis.tree.lines;
  const text = lines.map((l) => l.text).join(result.analysis.tree.eol);
  const before = outcomes(result);
  const chosen = new Map<number, Choice>();
  const timepoints = result.analysis.timeline.timepoints;
  // A bare value in doubt (PN204) is read in the new unit, where it is ordinary, by design: its
  // timepoint then reads a value it could not before, and is not held to what it read.
  const inDoubt = timepoints.map((tp) => tp.stated.some((s) => s.unitDoubt !== null));
  for (const choice of [...RETRIES, KEEP]) {
    const after = outcomes(checkNote(applyEdits(text, edits), result.settings));
    let differs = false;
    for (let i = 0; i < timepoints.length; i++) {
      if (before[i] === after[i] || inDoubt[i]) continue;
      differs = true;
      const tp = timepoints[i]!;
      for (let line = tp.startLine; line <= tp.endLine; line++) chosen.set(line, choice);
    }
    if (!differs) return edits;
    edits = yield* conversionEdits(result, to, (s) => chosen.get(s.line) ?? NEAREST);
  }
  // A timepoint still read otherwise after every try keeps its pressures as written, with their
  // unit (a kPa value on two thresholds at once, 6.7 kPa at the hypercapnia threshold of 50 mmHg and
  // within the HCO3 tolerance only at its upper end, 50.6 mmHg, is no one number in mmHg).
  return edits;
}

/**
 * The most timepoints of a note whose conversion is read again to keep its findings: reading a
 * converted note of thousands of timepoints takes seconds, too long for an action offered at
 * every move of the cursor, so a longer note is converted with the usual decimals only.
 */
const VERIFIED_UP_TO_TIMEPOINTS = 400;

/** How the pressures of one timepoint are written: decimals more than usual, and which number. */
interface Choice {
  readonly extra: number;
  readonly lean: Lean;
  /** Lean only the CO2 pressures (PaCO2, PvCO2: PN402 reads them at their written resolution), the others nearest. */
  readonly co2Only: boolean;
  /** Not converted: the number kept as written, with the unit it was read in written out. */
  readonly keep: boolean;
}

const NEAREST: Choice = { extra: 0, lean: 'nearest', co2Only: false, keep: false };
const KEEP: Choice = { extra: 0, lean: 'nearest', co2Only: false, keep: true };

/** How one stated value is written under a timepoint's choice. */
function leanOf(choice: Choice, s: StatedValue): Lean {
  return choice.co2Only && !s.fieldId.endsWith('co2') ? 'nearest' : choice.lean;
}
/**
 * The tries for a timepoint that reads otherwise, in order: one more decimal, two more (a value
 * rounded across a threshold), then the lowest and the highest number with two more decimals that
 * the written one stands for (a kPa value read at the resolution written, which a number in mmHg
 * is not: 5.2 kPa, 5.15–5.25 kPa, is 38.64–39.37 mmHg).
 */
const RETRIES: readonly Choice[] = [
  { extra: 1, lean: 'nearest', co2Only: false, keep: false },
  { extra: 2, lean: 'nearest', co2Only: false, keep: false },
  { extra: 2, lean: 'low', co2Only: true, keep: false },
  { extra: 2, lean: 'high', co2Only: true, keep: false },
  { extra: 2, lean: 'low', co2Only: false, keep: false },
  { extra: 2, lean: 'high', co2Only: false, keep: false },
];

const ALL_NEAREST = (): Choice => NEAREST;

/**
 * What a conversion must keep, per timepoint: its physiology findings (PN4xx), each with its
 * message without numbers and units (`PaO2 10.3 kPa (77 mmHg): consistent with …` and `PaO2 77
 * mmHg: consistent with …` read alike), so that a notable reading keeps its band too. Findings
 * the checks already made: no timepoint is derived again for this. Findings of units and
 * plausibility may change by design (a bare value in doubt is read in the new unit).
 */
function outcomes(result: NoteResult): string[] {
  const timepoints = result.analysis.timeline.timepoints;
  const out = new Array<string>(timepoints.length).fill('');
  if (timepoints.length === 0) return out;
  const lineCount = result.analysis.tree.lines.length;
  const timepointAt = new Int32Array(lineCount).fill(-1);
  for (const tp of timepoints) for (let line = Math.max(0, tp.startLine); line <= tp.endLine && line < lineCount; line++) timepointAt[line] = tp.index;
  const parts: string[][] = timepoints.map(() => []);
  for (const f of result.findings) {
    if (!f.code.startsWith('PN4')) continue;
    const at = timepointAt[f.range.start.line] ?? -1;
    if (at >= 0) parts[at]?.push(`${f.code} ${withoutNumbers(f.message)}`);
  }
  for (let i = 0; i < parts.length; i++) out[i] = parts[i]!.sort().join(' | ');
  return out;
}

/**
 * A message's words without its numbers, units, bracketed figures and blanks: what a band is
 * named by (no regular expression here may backtrack: tests/hostile checks them all).
 */
function withoutNumbers(text: string): string {
  // Bracketed text left out, by depth (a regular expression would scan again from every bracket).
  let out = '';
  let depth = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x28) depth++;
    else if (c === 0x29) depth = depth > 0 ? depth - 1 : 0;
    else if (depth === 0) out += text.charAt(i);
  }
  return out.replace(/\d+(?:\.\d+)?/g, '#').replace(/\b(?:kPa|mmHg)\b/g, '').replace(/\s+/g, '');
}

/** `convertNoteUnits` with each converted value written as `choiceOf(value)` chooses. */
function* conversionEdits(result: NoteResult, to: GasUnit, choiceOf: (s: StatedValue) => Choice): Steps<TextEdit[]> {
  const edits: TextEdit[] = [];
  const tree = result.analysis.tree;
  const unitItems = gasUnitItems(result);
  for (const { line, item } of unitItems) {
    const value = item.value!;
    if (value.text !== to) edits.push({ range: lineRange(line, value.span.start, value.span.end), newText: to });
  }
  /** First line whose bare gas values will be read in `to` (after the first `units gas` line). */
  let bareFrom: number;
  const firstUnits = unitItems[0];
  if (firstUnits) {
    bareFrom = firstUnits.line + 1;
  } else {
    // Bare values are read from the line the units line takes (after blank lines where the note's
    // line end is a lone CR: `lineInsertion`).
    const { edit, line } = lineInsertion(tree, unitsLineInsertion(result), `${'units'.padEnd(ITEM_COLUMN)}gas ${to}`);
    edits.push(edit);
    bareFrom = line;
  }
  const bareReadsAs = (line: number): GasUnit | null => (line >= bareFrom ? to : null);

  const doneShorthand = new Set<number>();
  // The header's values, then each timepoint's (`allStated`, without a list of them all).
  const { header, timepoints } = result.analysis.timeline;
  let seen = 0;
  for (let t = -1; t < timepoints.length; t++) {
    const stated = t < 0 ? header : timepoints[t]!.stated;
    for (let i = 0; i < stated.length; i++) {
      if (++seen % ITEMS_PER_STEP === 0) yield;
      const s = stated[i]!;
      const field = s.field;
      if (!isGasPressure(field) || !s.readUnit || s.value === null || !s.item.value) continue;
      if (s.item.implied === 'shorthand') {
        if (doneShorthand.has(s.line)) continue;
        doneShorthand.add(s.line);
        const node = tree.lines[s.line];
        const sh = node ? shorthandPressures(result, node) : null;
        if (sh) edits.push(...shorthandEdits(sh, to, bareReadsAs(s.line), choiceOf));
        continue;
      }
      edits.push(...valueEdits(s, field, to, bareReadsAs(s.line), choiceOf(s)));
    }
  }
  return edits;
}

/**
 * Whether a value is ordinary for its field (within its usual and possible ranges). Only
 * ordinary values are converted: an unusual one keeps the number as written (a likely slip
 * stays recognisable) and gets the unit it was read in written out when it was bare.
 */
function ordinary(s: StatedValue, field: FieldDef): boolean {
  return s.value !== null && !s.unitDoubt && withinAsWritten(s.value, field.soft, field, s.readUnit, s.item.value?.text ?? null) && within(s.value, field.hard);
}

/** Edits that keep the numbers as read and write their unit when the reading would change. */
function keepAsRead(line: number, at: number, hasUnit: boolean, readUnit: string, bareAfter: GasUnit | null): TextEdit[] {
  return hasUnit || bareAfter === readUnit ? [] : [{ range: lineRange(line, at, at), newText: ` ${displayUnit(readUnit)}` }];
}

function valueEdits(s: StatedValue, field: FieldDef, to: GasUnit, bareAfter: GasUnit | null, choice: Choice): TextEdit[] {
  const item = s.item;
  const value = item.value!;
  const line = s.line;
  if (s.unitDoubt && !item.unit) return [];
  if (!ordinary(s, field) || choice.keep) return keepAsRead(line, value.span.end, item.unit !== null, s.readUnit!, bareAfter);
  const edits: TextEdit[] = [];
  if (s.readUnit !== to) {
    const number = numberIn(s, field, to, choice.extra, leanOf(choice, s));
    if (number === null) return [];
    edits.push({ range: lineRange(line, value.span.start, value.span.end), newText: number });
  }
  if (item.unit) {
    if (!unitReadsAs(item.unit.text, field, to)) edits.push({ range: lineRange(line, item.unit.span.start, item.unit.span.end), newText: to });
  } else if (bareAfter !== to) {
    edits.push({ range: lineRange(line, value.span.end, value.span.end), newText: ` ${to}` });
  }
  return edits;
}

/**
 * A bare shorthand gas with a pressure in doubt (PN204: implausible in the unit in force, ordinary
 * in the other). A shorthand has one unit for its two pressures, so none is written: every pressure
 * is left bare and read in the note's new gas unit. A pressure in doubt is left as written (in the
 * new unit it is ordinary: `7.35/40/9.1/24` in mmHg has a PaO2 of 9.1 kPa), the others are converted
 * (`7.35/5.3/9.1/24` in kPa); above the `units gas` line, where bare numbers keep the old unit, the
new unit is written after it (`7.35/5.3/9.1/24 kPa`). Left as it is when converting to the unit in force; when another
 * pressure is unusual too, the numbers are kept as read with their unit written, as for any
 * shorthand with an unusual pressure.
 */
function shorthandWithDoubt(sh: ShorthandPressures, to: GasUnit, bareAfter: GasUnit | null, readUnit: string, choiceOf: (s: StatedValue) => Choice): TextEdit[] {
  if (sh.parts.every((p) => p.unitDoubt)) return [];
  // Another pressure unusual too: the numbers are kept as read, with the unit they were read in written.
  if (sh.parts.some((p) => !p.unitDoubt && !ordinary(p, p.field))) return keepAsRead(sh.node.line, sh.end, false, readUnit, bareAfter);
  if (readUnit === to) return [];
  const edits: TextEdit[] = [];
  for (const s of sh.parts) {
    if (s.unitDoubt) continue;
    const number = numberIn(s, s.field, to, choiceOf(s).extra, leanOf(choiceOf(s), s));
    if (number === null || !s.item.value) return [];
    edits.push({ range: lineRange(sh.node.line, s.item.value.span.start, s.item.value.span.end), newText: number });
  }
  // Above the note's `units gas` line a bare number is still read in the old unit: the new one,
  // in which the pressure in doubt is ordinary, is written after the gas.
  if (bareAfter !== to) edits.push({ range: lineRange(sh.node.line, sh.end, sh.end), newText: ` ${to}` });
  return edits;
}

function shorthandEdits(sh: ShorthandPressures, to: GasUnit, bareAfter: GasUnit | null, choiceOf: (s: StatedValue) => Choice): TextEdit[] {
  const line = sh.node.line;
  const readUnit = sh.parts[0]?.readUnit ?? null;
  if (!readUnit || sh.parts.some((p) => p.readUnit !== readUnit || p.value === null)) return [];
  if (!sh.unit && sh.parts.some((p) => p.unitDoubt)) return shorthandWithDoubt(sh, to, bareAfter, readUnit, choiceOf);
  if (sh.parts.some((p) => !ordinary(p, p.field) || choiceOf(p).keep)) return keepAsRead(line, sh.end, sh.unit !== null, readUnit, bareAfter);
  const edits: TextEdit[] = [];
  if (readUnit !== to) {
    for (const s of sh.parts) {
      const number = numberIn(s, s.field, to, choiceOf(s).extra, leanOf(choiceOf(s), s));
      if (number === null || !s.item.value) return [];
      edits.push({ range: lineRange(line, s.item.value.span.start, s.item.value.span.end), newText: number });
    }
  }
  const field = sh.parts[0]?.field;
  if (sh.unit) {
    if (!field || !unitReadsAs(sh.unit.text, field, to)) edits.push({ range: lineRange(line, sh.unit.span.start, sh.unit.span.end), newText: to });
  } else if (bareAfter !== to) {
    edits.push({ range: lineRange(line, sh.end, sh.end), newText: ` ${to}` });
  }
  return edits;
}
