/**
 * Code actions for a range of the note:
 * (a) every fix of every finding the range touches, as a quick fix tagged with its code;
 * (b) write the value under the cursor in the other unit (mmHg ↔ kPa, FiO2 fraction ↔ %,
 *     °C ↔ °F, g/dL ↔ g/L; a set rate in Hz to /min outside HFOV), number and unit together; a
 *     shorthand gas converts both pressures;
 * (c) write out the unit a bare value was read in (`po2 71` → `po2 71 mmHg`);
 * (d) fix all findings of one kind whose fix is marked safe, and one source action that
 *     applies every safe fix in the note (edits never overlap);
 * (e) convert every gas pressure in the note to mmHg or kPa (`convertNoteUnits`), offered on a
 *     gas pressure or on the `units` line.
 * Every action that changes the length of a line's content keeps its trailing comment in its
 * column (`keepingCommentColumns`, the rule renames and the note's conversion keep too).
 */
import type { NoteResult } from '../check-note';
import type { StatedValue } from '../analysis/model';
import { checkByCodeOrAlias } from '../checks/registry';
import type { FieldDef } from '../fields/registry';
import { comparePositions, type Finding, type Fix, type Range, type TextEdit } from '../types';
import { allStated, isValidPosition, itemAt, lineAt, statedOf, timepointOfLine } from './locate';
import { OSCILLATION_MODE } from '../physiology/mechanics';
import { parseLine } from '../syntax/parser';
import type { LineNode } from '../syntax/tree';
import { applyEdits, editsOverlap, keepingCommentColumns, withoutCommentColumnEdits } from './text-edits';
import { displayUnit } from '../analysis/read-value';
import { ITEMS_PER_STEP, runSteps, type Steps } from '../util/steps';
import { convertNoteUnits, convertNoteUnitSteps, itemConversionEdits, numberIn, otherUnits, shorthandConversionEdits, shorthandPressures, type GasUnit } from './unit-conversion';
import type { ActionInfo } from './types';
import { pushAll } from '../util/lists';
import { convert, unitById, unitsForSpelling, type UnitDef } from '../fields/units';
import { within } from '../analysis/bounds';

export { convertNoteUnits } from './unit-conversion';

function touches(a: Range, b: Range): boolean {
  return comparePositions(a.start, b.end) <= 0 && comparePositions(b.start, a.end) <= 0;
}

/**
 * `codeActions` in steps (see util/steps.ts): the whole-note work it may need first (the findings
 * with a safe fix and the edits of every one, the conversion of every gas pressure of the note),
 * yielding as it goes and kept per analysis, where `codeActions` then finds it.
 */
export function* codeActionSteps(result: NoteResult, range: Range): Steps<ActionInfo[]> {
  if (isValidPosition(range.start) && isValidPosition(range.end) && comparePositions(range.start, range.end) <= 0) {
    yield* fixAllSteps(result);
    if (offersNoteConversion(result, range)) for (const to of noteConversionUnits(result)) yield* convertNoteUnitSteps(result, to);
  }
  return codeActions(result, range);
}

const GAS_UNITS = ['mmHg', 'kPa'] as const;

/** Whether the value under the cursor offers to convert every gas pressure of the note: on a gas pressure, or on the `units` line. */
function offersNoteConversion(result: NoteResult, range: Range): boolean {
  const node = lineAt(result, range.start.line);
  if (!node || node.kind !== 'section' || range.start.character > node.text.length) return false;
  if (node.section === 'units') return true;
  const hit = itemAt(node, range.start.character);
  return hit !== null && statedOf(result, node.line, hit.item)?.field.dimension === 'gas-pressure';
}

/** The units the note's gas pressures can be converted to: those some pressure is not written in and can be. */
function noteConversionUnits(result: NoteResult): GasUnit[] {
  const stated = allStated(result);
  return GAS_UNITS.filter((to) => stated.some((s) => s.field.dimension === 'gas-pressure' && s.readUnit !== null && s.readUnit !== to && (s.field.units?.includes(to) ?? false)));
}

export function codeActions(result: NoteResult, range: Range): ActionInfo[] {
  if (!isValidPosition(range.start) || !isValidPosition(range.end) || comparePositions(range.start, range.end) > 0) return [];
  const actions: ActionInfo[] = [];

  // (a) fixes of the findings here; a fix that several of them share (the IPAP and the EPAP beside
  // `hfnc` both fixed by naming the device `niv`) is offered once, resolving them all
  const checks = new FixChecks(result);
  const quickFixes: { action: ActionInfo & { findingCodes: string[]; resolves: Finding[] }; edits: string }[] = [];
  for (const f of result.findings) {
    if (!touches(f.range, range)) continue;
    for (const fix of f.fixes) {
      if (!checks.keeps(fix)) continue;
      const edits = JSON.stringify(fix.edits);
      const same = quickFixes.find((q) => q.action.title === fix.title && q.edits === edits);
      if (same) {
        same.action.findingCodes.push(f.code);
        same.action.resolves.push(f);
        continue;
      }
      const action = { title: fix.title, kind: 'quickfix' as const, edits: keepingCommentColumns(lineTextOf(result), fix.edits), findingCodes: [f.code], resolves: [f], ...(fix.preferred ? { preferred: true } : {}) };
      quickFixes.push({ action, edits });
      actions.push(action);
    }
  }

  // (b), (c), (e): the value under the cursor
  pushAll(actions, valueActions(result, range));

  // (d) fix all of a kind
  pushAll(actions, fixAllActions(result, range));
  return actions;
}

/** The text of a line of the analysed note (for `keepingCommentColumns`). */
function lineTextOf(result: NoteResult): (line: number) => string | undefined {
  return (line) => result.analysis.tree.lines[line]?.text;
}

/** The actions with each changed line's trailing comment kept in its column. */
function keepingComments(result: NoteResult, actions: ActionInfo[]): ActionInfo[] {
  return actions.map((a) => ({ ...a, edits: keepingCommentColumns(lineTextOf(result), a.edits) }));
}

function valueActions(result: NoteResult, range: Range): ActionInfo[] {
  const node = lineAt(result, range.start.line);
  if (!node || node.kind !== 'section' || range.start.character > node.text.length) return [];
  const out: ActionInfo[] = [];
  const line = node.line;
  const hit = itemAt(node, range.start.character);

  if (hit) {
    const stated = statedOf(result, line, hit.item);
    if (stated) {
      if (hit.item.implied === 'shorthand') {
        pushAll(out, keepingComments(result, shorthandActions(result, line)));
      } else {
        pushAll(out, keepingComments(result, conversionActions(stated)));
        pushAll(out, keepingComments(result, rateInPerMinuteAction(result, stated)));
        pushAll(out, keepingComments(result, addUnitAction(result, stated)));
      }
    }
  }

  if (offersNoteConversion(result, range)) {
    for (const to of noteConversionUnits(result)) {
      const edits = noteConversion(result, to);
      if (edits.length > 0) out.push({ title: `Convert every gas pressure in the note to ${to}`, kind: 'refactor.rewrite', edits });
    }
  }
  return out;
}

/** Whole-note conversions, kept per analysis by `convertNoteUnits`: code actions are asked for at every move of the cursor. */
function noteConversion(result: NoteResult, to: GasUnit): TextEdit[] {
  return convertNoteUnits(result, to);
}

function keyOf(s: StatedValue): string {
  return s.item.key?.text ?? s.item.keyName;
}

/** The value written in each other unit it can be (`otherUnits`): one action per unit. */
function conversionActions(s: StatedValue): ActionInfo[] {
  if (s.unitDoubt || !s.usable) return [];
  const out: ActionInfo[] = [];
  for (const to of otherUnits(s)) {
    const edits = itemConversionEdits(s.line, s, to);
    const number = numberIn(s, s.field, to);
    if (!edits || number === null) continue;
    const title = to === 'fraction' ? `Write ${keyOf(s)} as a fraction: ${number}` : `Write ${keyOf(s)} in ${displayUnit(to)}: ${number} ${displayUnit(to)}`;
    out.push({ title, kind: 'refactor.rewrite', edits });
  }
  return out;
}

/**
 * A set rate written in Hz under a mode other than HFOV (or none): written in /min, the unit rates
 * of breaths are set in, keeping its value (`rate 0.25 Hz` → `rate 15 /min`, `rate 1.004 Hz` →
 * `60.24 /min`). Hz belongs to oscillators, so in HFOV nothing is offered.
 */
function rateInPerMinuteAction(result: NoteResult, s: StatedValue): ActionInfo[] {
  if (s.fieldId !== 'vent_rate' || s.readUnit !== 'Hz' || !s.usable || s.unitDoubt) return [];
  const tp = timepointOfLine(result, s.line);
  if (tp?.values.get('mode')?.stated.word === OSCILLATION_MODE) return [];
  const edits = itemConversionEdits(s.line, s, '/min');
  const number = numberIn(s, s.field, '/min');
  if (!edits || number === null) return [];
  return [{ title: `Write ${keyOf(s)} in /min: ${number} /min`, kind: 'refactor.rewrite', edits }];
}

/**
 * `po2 71` → `po2 71 mmHg`: the unit a bare value was read in, written out. Not for a value kept
 * out of calculations (a saturation written as a fraction, `spo2 0.9`, reads as 0.9 %; an
 * impossible heart rate) nor where a finding's fix writes something else right after the number
 * (`Write 5 Hz` for a bare HFOV rate): writing the unit it was read in would state the reading the
 * finding doubts, as for a value whose unit is in doubt (PN204).
 */
function addUnitAction(result: NoteResult, s: StatedValue): ActionInfo[] {
  if (!s.unitImplied || !s.usable || !s.readUnit || s.unitDoubt || s.readUnit === 'fraction' || s.readUnit === 'ph' || !s.item.value) return [];
  const unit = displayUnit(s.readUnit);
  const end = s.item.value.span.end;
  const after = { line: s.line, character: end };
  if (result.findings.some((f) => f.fixes.some((fix) => fix.edits.some((e) => comparePositions(e.range.start, after) === 0)))) return [];
  // Named as the line will show it: with its key, or where the key is implied by its place, the
  // value alone (a device's flow) or in its brackets (the mean after a blood pressure).
  const written = `${s.item.value.text} ${unit}`;
  const shown = s.item.key !== null ? `${s.item.key.text} ${written}` : s.item.implied === 'bracketed-mean' ? `(${written})` : written;
  // A bracket glued to the number (`bp 120/80(93)`) is kept apart from the unit: `mmHg(` would read as a word.
  const glued = lineAt(result, s.line)?.text.charCodeAt(end) === 0x28;
  return [{
    title: `Write the unit it was read in: ${shown}`,
    kind: 'refactor.rewrite',
    edits: [{ range: { start: { line: s.line, character: end }, end: { line: s.line, character: end } }, newText: glued ? ` ${unit} ` : ` ${unit}` }],
  }];
}

function shorthandActions(result: NoteResult, line: number): ActionInfo[] {
  const node = lineAt(result, line);
  const sh = node ? shorthandPressures(result, node) : null;
  if (!sh) return [];
  const read = sh.parts[0]?.readUnit;
  if (!read || sh.parts.some((p) => p.readUnit !== read || p.unitDoubt || !p.usable)) return [];
  const out: ActionInfo[] = [];
  const to: GasUnit = read === 'kPa' ? 'mmHg' : 'kPa';
  const edits = shorthandConversionEdits(sh, to);
  if (edits) out.push({ title: `Write the shorthand gas pressures in ${to}`, kind: 'refactor.rewrite', edits });
  if (!sh.unit && sh.parts.every((p) => p.unitImplied)) {
    out.push({
      title: `Write the unit the shorthand pressures were read in: ${read}`,
      kind: 'refactor.rewrite',
      edits: [{ range: { start: { line, character: sh.end }, end: { line, character: sh.end } }, newText: ` ${read}` }],
    });
  }
  return out;
}

/**
 * Whether a fix keeps every value of the lines it edits readable: the lines, re-parsed with the
 * fix applied, hold at least as many values together (one moved from a line to another, as PN201
 * moves an SpO2 target off a patient line, is still there) and none has more problems of any kind
 * that the line alone shows (`lineProblems`). (A guard: a fix that would break a line, such as a
 * unit inserted inside a shorthand gas, or that would trade one problem for another, such as
 * `temp 37 mmHg` changed to the impossible `37 F`, is not offered.)
 */
export function keepsValues(result: NoteResult, fix: Fix): boolean {
  const byLine = new Map<number, TextEdit[]>();
  for (const e of fix.edits) {
    if (e.range.start.line !== e.range.end.line) return true; // multi-line fixes are not checked here
    const list = byLine.get(e.range.start.line) ?? [];
    list.push(e);
    byLine.set(e.range.start.line, list);
  }
  let lost = 0;
  for (const [line, edits] of byLine) {
    const node = lineAt(result, line);
    if (!node) return false;
    let text: string;
    try {
      text = applyEdits(node.text, edits.map((e) => ({ range: { start: { line: 0, character: e.range.start.character }, end: { line: 0, character: e.range.end.character } }, newText: e.newText })));
    } catch {
      return false;
    }
    if (/[\r\n]/.test(text)) {
      // Lines added (a new oxygen line that takes a value moved off another): their values count.
      let added = 0;
      for (const part of text.split(/\r\n|\r|\n/)) added += valuesOf(parseLine(part, line));
      lost += valuesOf(node) - added;
      continue;
    }
    const fixed = parseLine(text, line);
    if (addsProblem(node, fixed)) return false;
    lost += valuesOf(node) - valuesOf(fixed);
  }
  return lost <= 0;
}

/** How many items of a line hold a value. */
function valuesOf(n: LineNode): number {
  return n.kind === 'section' ? n.items.filter((i) => i.value !== null).length : 0;
}

/**
 * At most this many fixes of one line are checked with `keepsValues` in one request, and so offered:
 * each check parses the whole line again, so a long line with thousands of fixable findings (a line
 * of 16 KB with doubled commas or no-break spaces all along it) took seconds at every move of the
 * cursor, the time growing with the square of the line's length. Once the fixes offered are
 * applied, the next ones on the line are.
 */
export const FIX_CHECKS_PER_LINE = 32;

/** `keepsValues` for the fixes of one request, at most `FIX_CHECKS_PER_LINE` a line. */
class FixChecks {
  private readonly perLine = new Map<number, number>();

  constructor(private readonly result: NoteResult) {}

  keeps(fix: Fix): boolean {
    const edits = fix.edits;
    for (let i = 0; i < edits.length; i++) {
      const line = edits[i]!.range.start.line;
      if (edits[i]!.range.end.line !== line) continue; // multi-line fixes are not parsed (see keepsValues)
      const n = this.perLine.get(line) ?? 0;
      if (n >= FIX_CHECKS_PER_LINE) return false;
      // A fix with several edits on one line counts once for it.
      if (i === 0 || !edits.slice(0, i).some((e) => e.range.start.line === line)) this.perLine.set(line, n + 1);
    }
    return keepsValues(this.result, fix);
  }
}

/**
 * Whether the fixed line has more problems of some kind than the line had: a fix that glues a
 * section word to a number (`patient,7,35` → `patient7,35`), that names a section for a key with
 * no value (`lac` → `abg lac`) or whose values it cannot read (`ht 07:40` → `patient ht 07:40`),
 * or that trades a wrong unit for an impossible value (`temp 37 mmHg` → `37 F`).
 */
function addsProblem(before: LineNode, after: LineNode): boolean {
  const counts = lineProblems(before);
  for (const [kind, n] of lineProblems(after)) if (n > (counts.get(kind) ?? 0)) return true;
  return false;
}

/**
 * The problems of one line that can be told from the line alone, by kind: its syntax problems,
 * keys its section does not have, units its fields do not take, and numbers written in a unit in
 * which they are impossible for their field but possible in another unit it takes (`temp 37 F`).
 */
function lineProblems(node: LineNode): Map<string, number> {
  const counts = new Map<string, number>();
  const add = (kind: string) => counts.set(kind, (counts.get(kind) ?? 0) + 1);
  for (const issue of node.issues) add(issue.check);
  if (node.kind !== 'section') return counts;
  for (const item of node.items) {
    const field = item.field;
    if (!field) {
      if (item.key) add('unknown-key');
      continue;
    }
    if (item.unitText === null || field.kind === 'word') continue;
    const written = unitsForSpelling(item.unitText).find((u) => field.units?.includes(u.id));
    if (!written) {
      add('unit');
      continue;
    }
    if (item.number !== null && impossibleIn(field, item.number, written) && (field.units ?? []).some((id) => !impossibleIn(field, item.number!, unitById(id)))) add('wrong-unit');
  }
  return counts;
}

/** Whether a number written in a unit is outside what is possible for the field (false when it cannot be told). */
function impossibleIn(field: FieldDef, written: number, unit: UnitDef | undefined): boolean {
  const canonical = field.unit ? unitById(field.unit) : undefined;
  const value = unit && canonical ? convert(written, unit, canonical) : null;
  return value !== null && field.hard !== undefined && !within(value, field.hard);
}

function preferredFix(f: Finding): Fix | undefined {
  return f.fixes.find((x) => x.preferred === true);
}

interface SafeEdits {
  readonly edits: TextEdit[];
  readonly codes: string[];
  readonly count: number;
  readonly fixed: Finding[];
}

/**
 * The ranges of edits taken so far, sorted, so that whether a new edit overlaps one of them is
 * found by looking at its two neighbours (ranges that do not overlap, sorted by start, also have
 * their ends in order). A note can have thousands of fixable findings, and code actions are asked
 * for at every move of the cursor.
 */
class TakenRanges {
  private readonly ranges: Range[] = [];

  /** Where `r` goes among the ranges, sorted by start then end (after equal ones). */
  private indexOf(r: Range): number {
    let lo = 0;
    let hi = this.ranges.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      const m = this.ranges[mid]!;
      const c = comparePositions(m.start, r.start) || comparePositions(m.end, r.end);
      if (c <= 0) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }

  /** Whether `r` overlaps a range taken (touching ranges and insertions at one point do not), as `editsOverlap` says. */
  overlaps(r: Range): boolean {
    const i = this.indexOf(r);
    const before = this.ranges[i - 1];
    const after = this.ranges[i];
    return (before !== undefined && comparePositions(r.start, before.end) < 0) || (after !== undefined && comparePositions(after.start, r.end) < 0);
  }

  add(r: Range): void {
    this.ranges.splice(this.indexOf(r), 0, r);
  }
}

/**
 * Edits of the safe fixes of these findings, skipping any that would overlap an earlier one, with
 * each changed line's trailing comment kept in its column: one edit of its blanks per line, made for
 * all the line's fixes together (`withoutCommentColumnEdits`), so that two renames of one line that
 * each keep the column on their own are both applied in one run.
 */
function safeEdits(result: NoteResult, findings: readonly Finding[]): SafeEdits {
  return runSteps(safeEditSteps(result, findings));
}

/** `safeEdits` in steps, yielding after every ITEMS_PER_STEP findings (see util/steps.ts). */
function* safeEditSteps(result: NoteResult, findings: readonly Finding[]): Steps<SafeEdits> {
  const edits: TextEdit[] = [];
  const lineText = lineTextOf(result);
  const taken = new TakenRanges();
  const codes = new Set<string>();
  const fixed: Finding[] = [];
  for (let i = 0; i < findings.length; i++) {
    if (i > 0 && i % ITEMS_PER_STEP === 0) yield;
    const f = findings[i]!;
    const fix = preferredFix(f);
    if (!fix || fix.edits.length === 0) continue;
    // The blanks that keep a comment in its column are made once per line, for all its fixes, below.
    const own = withoutCommentColumnEdits(lineText, fix.edits);
    if (editsOverlap(own) || own.some((e) => taken.overlaps(e.range))) continue;
    for (const e of own) taken.add(e.range);
    pushAll(edits, own);
    codes.add(f.code);
    fixed.push(f);
  }
  return { edits: keepingCommentColumns(lineText, edits), codes: [...codes], count: fixed.length, fixed };
}

/** The findings whose preferred fix is safe, and the fix-all edits, kept per analysis (a note that does not change gives the same result). */
interface FixAll {
  readonly withSafeFix: readonly Finding[];
  readonly byCode: Map<string, SafeEdits>;
  all: SafeEdits | null;
}

const FIX_ALL = new WeakMap<NoteResult, FixAll>();

function fixAllOf(result: NoteResult): FixAll {
  return runSteps(fixAllSteps(result));
}

/**
 * `fixAllOf` in steps, yielding after every ITEMS_PER_STEP findings (see util/steps.ts); the edits
 * of every safe fix (`all`) are made here too, as the first code action asked for would make them.
 */
function* fixAllSteps(result: NoteResult): Steps<FixAll> {
  let known = FIX_ALL.get(result);
  if (!known) {
    const checks = new FixChecks(result);
    const findings = result.findings;
    const withSafeFix: Finding[] = [];
    for (let i = 0; i < findings.length; i++) {
      if (i > 0 && i % ITEMS_PER_STEP === 0) yield;
      const f = findings[i]!;
      const fix = preferredFix(f);
      if (fix !== undefined && checks.keeps(fix)) withSafeFix.push(f);
    }
    known = { withSafeFix, byCode: new Map(), all: null };
    FIX_ALL.set(result, known);
  }
  if (known.withSafeFix.length > 0 && known.all === null) known.all = yield* safeEditSteps(result, known.withSafeFix);
  return known;
}

function fixAllActions(result: NoteResult, range: Range): ActionInfo[] {
  const known = fixAllOf(result);
  const withSafeFix = known.withSafeFix;
  if (withSafeFix.length === 0) return [];
  const out: ActionInfo[] = [];
  const codesHere = [...new Set(withSafeFix.filter((f) => touches(f.range, range)).map((f) => f.code))];
  for (const code of codesHere) {
    let ofCode = known.byCode.get(code);
    if (!ofCode) {
      ofCode = safeEdits(result, withSafeFix.filter((f) => f.code === code));
      known.byCode.set(code, ofCode);
    }
    const { edits, count, fixed } = ofCode;
    if (count < 2) continue;
    const title = checkByCodeOrAlias(code)?.title ?? code;
    out.push({ title: `Fix all in the note: ${title} (${code}, ${count} places)`, kind: 'quickfix', edits, findingCodes: [code], resolves: fixed });
  }
  const all = (known.all ??= safeEdits(result, withSafeFix));
  if (all.count > 0) out.push({ title: `Apply every safe fix in the note (${all.count})`, kind: 'source.fixAll', edits: all.edits, findingCodes: all.codes, resolves: all.fixed });
  return out;
}
