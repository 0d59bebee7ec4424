/**
 * Builds the timeline: groups lines into timepoints, reads every stated value, and works out
 * which values are in force at each timepoint — stated there, carried forward from an
 * earlier timepoint (settings), or from the note's header (patient, place, units).
 *
 * Carry rules: patient and place values carry until restated (a `place` line replaces the
 * whole place); an `oxygen` line replaces the previous oxygen line and ends ventilation (but for a
 * line with a `fio2` and no device beside one whose device gives the FiO2, `venturi 28`: the two
 * hold as one, see `pairsAcrossLines`; and for a line at a later timepoint that names no device
 * and writes only settings of the device in force, `oxygen flow 4` after `oxygen cannula 2`, which
 * updates that therapy (as does such a line below the device's at its own timepoint, and one there
 * that names the same device again): the device and the settings it does not restate carry, see
 * `updatedDevice`;
 * NIV or CPAP written by its pressures alone counts as that device, none being made up);
 * a `vent` line that states a setting ends oxygen-line therapy (one of readings only ends nothing;
 * under NIV or CPAP its tidal volume is the measured one, of its timepoint) and updates the ventilator settings it restates,
 * keeping the rest (a change of mode keeps only PEEP and FiO2, a change to or from HFOV only
 * FiO2); measurements (vitals, gases,
 * labs) and device readings never carry, nor does a value the mode in force measures rather than
 * sets (a tidal volume under PS: the field registry's `measuredIn`, per mode family).
 *
 * Incremental: the note is processed block by block (the lines before the first `@`, then one
 * block per timepoint). Given the previous run's `TimelineCache`, a block whose line nodes are
 * the same objects and whose incoming carried state is the same is not processed again. The
 * carried state is kept in immutable maps, and a recomputed block reuses the previous block's
 * held values when they are equal, so an edit to one timepoint recomputes only that timepoint
 * and those that depend on what it carries.
 *
 * Lines added or removed: the caller passes the `LineShift` from the previous run's lines to
 * these (the session knows it from the text it compared). A block after the changed stretch is
 * then the same lines one shift further on; when it is also the same timepoint (same index) with
 * the same incoming carried state once that state is moved, it is relocated rather than read: a
 * copy of the previous result with every line number mapped through the shift (its timepoint,
 * stated values, held values and read issues; the origins of its values in force are built from
 * those). A line before the change keeps its number, so a value carried from there, or from the
 * header, keeps its line. One `Relocator` per run maps each previous object to one copy, so the
 * moved state a block hands on is the very state the next block's moved entry expects, and a
 * block read again (the changed one) keeps the moved copies of its previous held values when
 * they are equal. Not relocated, but read again: a block whose label is its line number (`@`
 * alone: `line 12`), one whose read issues cannot be moved (see `moveLineNames`), and one that
 * holds a value from a timepoint whose label reads like a line number (`@ 08:00 see line 7`: its
 * findings may name that timepoint by its label, unquoted, see `namesLine`).
 */
import { SPO2_TARGET_FIELD } from './spo2-target';
import { canonicalWord, FIELDS, type FieldDef } from '../fields/registry';
import { sectionById, type SectionId } from '../fields/sections';
import type { Settings } from '../settings';
import type { ItemNode, LineEdit, LineFix, LineNode, NoteTree, SectionLine, Span, TimepointLine } from '../syntax/tree';
import { itemsRemovalSpan } from '../syntax/tree';
import { renameKeepingColumns } from '../syntax/layout';
import { MAX_DAY } from '../syntax/parser';
import { OSCILLATION_MODE } from '../physiology/mechanics';
import { familyInForce, isMeasuredIn, isMeasuredUnder, modeFamily, type ModeFamily } from '../fields/modes';
import { PER_KG_PBW, pbwFrom, VT_PER_KG_HARD_MAX } from './per-kg-volume';
import { barometricFromAltitude } from './ambient';
import { deviceSets, noninvasiveSupport } from './noninvasive-support';
import { moveLineNames, namesLine, shiftedLine, type InputValue, type LineShift, type Origin, type StatedValue, type Timepoint, type TimepointTime, type ValuesInForce } from './model';
import type { ReadIssue } from './read-issues';
import { readItem, type ReadContext } from './read-value';
import { NONE } from '../util/lists';
import { compact } from '../util/numbers';
import { formatNumber, wordList, writtenDecimals } from '../util/format';

interface Held {
  readonly stated: StatedValue;
  /** Timepoint index where it was stated; -1 for the header. */
  readonly timepoint: number;
  readonly label: string;
  /** The time of the timepoint where it was stated (no time for the header). */
  readonly time: TimepointTime;
}

type HeldMap = ReadonlyMap<string, Held>;

/**
 * The settings held at the end of a block. Most blocks hold nothing new (their lines are
 * measurements) and hand on the state they were given, the same object; the time of the last
 * timepoint, which every block changes, goes along beside it (`timeIn`, `timeOut`).
 */
interface CarryState {
  readonly patient: HeldMap;
  readonly place: HeldMap;
  readonly oxygen: HeldMap;
  readonly vent: HeldMap;
  readonly gasUnit: Held | null;
  /**
   * The SpO2 target in force (`spo2_target`, written on an oxygen line): held apart from the oxygen
   * line's settings, since it is what the oxygen is given for, not how: a new device, room air or
   * ventilation leaves it in force, and only another target replaces it.
   */
  readonly target: Held | null;
}

export interface Timeline {
  readonly timepoints: readonly Timepoint[];
  readonly readIssues: readonly ReadIssue[];
  /** Values stated in the header (before the first timepoint). */
  readonly header: readonly StatedValue[];
  /**
   * The gas unit in force at the end of the header: its last `units gas`, else the gasUnit
   * setting. Header values are shown in it, as a timepoint's values are shown in its `gasUnit`.
   */
  readonly headerGasUnit: 'mmHg' | 'kPa';
  /**
   * The age (years) the header's lines were read with (`ageForReading`): its last age, wherever it
   * is written; null for none, or for one not used. The one reader of the header's age: PN302 asks it.
   */
  readonly headerAgeYears: number | null;
}

interface BlockResult {
  readonly timepoint: Timepoint | null;
  readonly header: readonly StatedValue[];
  readonly issues: readonly ReadIssue[];
  readonly stateOut: CarryState;
  /** The time of the last timepoint with a time, up to the end of the block. */
  readonly timeOut: TimepointTime;
  /** The age (years) the block's lines were read with (`ageForReading`); null: none. */
  readonly ageYears: number | null;
}

interface BlockEntry {
  /** First line of the block (in the cache's `lines`). */
  readonly start: number;
  readonly index: number;
  readonly endLine: number;
  readonly stateIn: CarryState;
  readonly timeIn: TimepointTime;
  readonly result: BlockResult;
}

/** What one run leaves for the next; opaque to callers. */
export interface TimelineCache {
  readonly settings: Settings;
  /** The line nodes the blocks were read from (the tree of that run). */
  readonly lines: readonly LineNode[];
  readonly blocks: readonly BlockEntry[];
}

/*
 * What the timeline keeps (held values, states, block results and entries, timepoints and their
 * times) is made by constructors, not object literals: V8 tracks each literal's allocation site and,
 * seeing that everything it makes survives, allocates it straight in the old generation, where it
 * keeps the young parts of every earlier result alive through young-generation collections (see
 * the performance notes in DEVELOPERS.md).
 */
class HeldValue implements Held {
  constructor(readonly stated: StatedValue, readonly timepoint: number, readonly label: string, readonly time: TimepointTime) {}
}

class State implements CarryState {
  constructor(readonly patient: HeldMap, readonly place: HeldMap, readonly oxygen: HeldMap, readonly vent: HeldMap, readonly gasUnit: Held | null, readonly target: Held | null) {}
}

class Block implements BlockResult {
  constructor(readonly timepoint: Timepoint | null, readonly header: readonly StatedValue[], readonly issues: readonly ReadIssue[], readonly stateOut: CarryState, readonly timeOut: TimepointTime, readonly ageYears: number | null) {}
}

class Entry implements BlockEntry {
  constructor(readonly start: number, readonly index: number, readonly endLine: number, readonly stateIn: CarryState, readonly timeIn: TimepointTime, readonly result: BlockResult) {}
}

class TimepointAt implements Timepoint {
  constructor(
    readonly index: number, readonly line: number | null, readonly label: string, readonly startLine: number, readonly endLine: number,
    readonly time: TimepointTime, readonly stated: readonly StatedValue[], readonly values: ValuesInForce, readonly barometricMmhg: number | null,
    readonly gasUnit: 'mmHg' | 'kPa', readonly shownGasUnit: 'mmHg' | 'kPa', readonly ageYears: number | null,
  ) {}
}

class TimeAt implements TimepointTime {
  constructor(readonly day: number | null, readonly minutes: number | null) {}
}

const EMPTY: HeldMap = new Map();
const START_STATE: CarryState = Object.freeze(new State(EMPTY, EMPTY, EMPTY, EMPTY, null, null));
const START_TIME: TimepointTime = Object.freeze(new TimeAt(null, null));

export function buildTimeline(tree: NoteTree, settings: Settings): Timeline {
  return buildTimelineIncremental(tree, settings, null).timeline;
}

/**
 * The timeline of `tree`, reusing the blocks of `previous` (see the module comment). `shift` maps
 * the line numbers of the previous run's lines to those of `tree` when lines were added or
 * removed. `moved` maps each relocated timepoint to the previous run's timepoint it was copied
 * from (its findings can be moved the same way).
 */
export function buildTimelineIncremental(
  tree: NoteTree,
  settings: Settings,
  previous: TimelineCache | null,
  shift: LineShift | null = null,
): { timeline: Timeline; cache: TimelineCache; moved: ReadonlyMap<Timepoint, Timepoint> } {
  const usable = previous && previous.settings === settings ? previous.blocks : [];
  const previousLines = previous?.lines ?? [];
  const lines = tree.lines;
  // Block 0: the lines before the first `@` (possibly none); then one block per `@` line. Blocks
  // are ranges of the line list, which the cache keeps (nothing is copied out of it).
  // Lists as long as the note's timepoints are made at their length (grown by push, each would be
  // copied a dozen times on the way).
  let blocks = 1;
  for (let i = 0; i < lines.length; i++) if (lines[i]!.kind === 'timepoint') blocks++;
  const starts = new Array<number>(blocks);
  starts[0] = 0;
  for (let i = 0, b = 1; i < lines.length; i++) if (lines[i]!.kind === 'timepoint') starts[b++] = i;
  const entries = new Array<BlockEntry>(blocks);
  // A timepoint per block, but for block 0 when the note has nothing before its first `@`: cut at the end.
  const timepoints = new Array<Timepoint>(blocks);
  let count = 0;
  const header: StatedValue[] = [];
  const readIssues: ReadIssue[] = [];
  const moved = new Map<Timepoint, Timepoint>();
  const relocator = shift && shift.delta !== 0 && usable.length > 0 ? new Relocator(shift) : null;
  let state = START_STATE;
  let time = START_TIME;
  const reading: Reading = { context: null };
  for (let b = 0; b < starts.length; b++) {
    const start = starts[b]!;
    const end = b + 1 < starts.length ? starts[b + 1]! : lines.length;
    const index = count;
    const endLine = end - 1;
    const old = usable[b];
    let result: BlockResult | null = null;
    if (old && old.index === index && old.endLine === endLine && old.start === start && sameNodes(previousLines, lines, start, end) && sameState(old.stateIn, state) && sameTime(old.timeIn, time)) {
      result = old.result;
    } else if (old && relocator && old.index === index) {
      result = relocator.block(old, previousLines, lines, start, end, state, time);
      if (result?.timepoint && old.result.timepoint) moved.set(result.timepoint, old.result.timepoint);
    }
    if (!result) {
      // A block read again keeps its previous held values where they are equal, moved with the lines.
      const previousOut = old ? (relocator ? relocator.state(old.result.stateOut) : old.result.stateOut) : null;
      result = processBlock(lines, start, end, index, state, time, settings, tree, previousOut, reading);
    }
    // A block taken from the cache with the very same incoming state keeps its entry (a big note
    // has thousands of blocks, and an edit changes one).
    entries[b] = old && result === old.result && old.stateIn === state && old.timeIn === time ? old : new Entry(start, index, endLine, state, time, result);
    if (result.timepoint) timepoints[count++] = result.timepoint;
    // Indexed: both lists are empty in most blocks.
    for (let k = 0; k < result.header.length; k++) header.push(result.header[k]!);
    for (let k = 0; k < result.issues.length; k++) readIssues.push(result.issues[k]!);
    state = result.stateOut;
    time = result.timeOut;
  }
  timepoints.length = count;
  const headerAgeYears = entries[0]!.result.ageYears;
  return { timeline: { timepoints, readIssues, header, headerGasUnit: headerGasUnit(header, settings), headerAgeYears }, cache: { settings, lines, blocks: entries }, moved };
}

/**
 * Moves the previous run's objects to the new line numbers (see the module comment): each object
 * is copied once per run, and one that does not move is itself. Local to one run.
 */
class Relocator {
  private readonly copies = new Map<object, object>();
  private readonly namingLines = new Map<HeldMap, boolean>();

  constructor(private readonly shift: LineShift) {}

  /**
   * The previous block `old` relocated to `[start, end)`, or null when it cannot be: its lines
   * are not all the same lines moved, it is not the same timepoint, or its incoming state moved
   * is not `state`.
   */
  block(old: BlockEntry, before: readonly LineNode[], lines: readonly LineNode[], start: number, end: number, state: CarryState, time: TimepointTime): BlockResult | null {
    const { end: movedFrom, delta } = this.shift;
    if (old.start < movedFrom || old.start + delta !== start || old.endLine + delta !== end - 1 || start === 0) return null;
    if (!sameNodesMoved(before, lines, start, end, delta)) return null;
    const first = lines[start]!;
    // `@` alone is labelled with its line number: the label moves, and with it the held values' labels.
    if (first.kind !== 'timepoint' || (!first.label && !first.time)) return null;
    if (!sameTime(old.timeIn, time) || !sameState(this.state(old.stateIn), state)) return null;
    // A finding may name where a value came from by its timepoint's label, unquoted (`carried from
    // see line 7, line 2`): moved, the label's number would move too.
    if (this.labelNamesLine(state)) return null;
    const result = old.result;
    const issues = result.issues.length === 0 ? result.issues : this.issues(result.issues);
    if (!issues) return null;
    const tp = result.timepoint;
    const stateOut = this.state(result.stateOut);
    const header = result.header.length === 0 ? result.header : result.header.map((s) => this.stated(s));
    return new Block(tp ? this.timepoint(tp, stateOut) : null, header, issues, stateOut, result.timeOut, result.ageYears);
  }

  private line(line: number): number {
    return line < this.shift.end ? line : line + this.shift.delta;
  }

  /** Whether a value held in `state` was stated at a timepoint whose label names a line (see `namesLine`). */
  private labelNamesLine(state: CarryState): boolean {
    return this.mapNamesLine(state.patient) || this.mapNamesLine(state.place) || this.mapNamesLine(state.oxygen) || this.mapNamesLine(state.vent) ||
      (state.gasUnit !== null && namesLine(state.gasUnit.label)) || (state.target !== null && namesLine(state.target.label));
  }

  /** Per map, once per run: consecutive blocks mostly hand on the same maps. */
  private mapNamesLine(m: HeldMap): boolean {
    if (m.size === 0) return false;
    let known = this.namingLines.get(m);
    if (known === undefined) {
      known = false;
      for (const held of m.values()) if (namesLine(held.label)) { known = true; break; }
      this.namingLines.set(m, known);
    }
    return known;
  }

  private timepoint(tp: Timepoint, state: CarryState): Timepoint {
    const stated = tp.stated.map((s) => this.stated(s));
    return new TimepointAt(
      tp.index, tp.line === null ? null : this.line(tp.line), tp.label, this.line(tp.startLine), this.line(tp.endLine),
      tp.time, stated, new ValuesAt(tp.index, tp.time, state, stated), tp.barometricMmhg, tp.gasUnit, tp.shownGasUnit, tp.ageYears,
    );
  }

  /** A stated value moved: a `MovedValue` of the value it was read as, on its new line. */
  private stated(s: StatedValue): StatedValue {
    if (s.line < this.shift.end) return s;
    const known = this.copies.get(s);
    if (known) return known as StatedValue;
    const copy = new MovedValue(s instanceof MovedValue ? s.read : s, s.line + this.shift.delta);
    this.copies.set(s, copy);
    return copy;
  }

  private held(h: Held): Held {
    const stated = this.stated(h.stated);
    if (stated === h.stated) return h;
    const known = this.copies.get(h);
    if (known) return known as Held;
    const copy: Held = new HeldValue(stated, h.timepoint, h.label, h.time);
    this.copies.set(h, copy);
    return copy;
  }

  private map(m: HeldMap): HeldMap {
    if (m.size === 0) return m;
    const known = this.copies.get(m);
    if (known) return known as HeldMap;
    let changed = false;
    const next = new Map<string, Held>();
    for (const [k, v] of m) {
      const h = this.held(v);
      if (h !== v) changed = true;
      next.set(k, h);
    }
    const out = changed ? next : m;
    this.copies.set(m, out);
    return out;
  }

  state(s: CarryState): CarryState {
    const known = this.copies.get(s);
    if (known) return known as CarryState;
    const patient = this.map(s.patient);
    const place = this.map(s.place);
    const oxygen = this.map(s.oxygen);
    const vent = this.map(s.vent);
    const gasUnit = s.gasUnit ? this.held(s.gasUnit) : null;
    const target = s.target ? this.held(s.target) : null;
    const same = patient === s.patient && place === s.place && oxygen === s.oxygen && vent === s.vent && gasUnit === s.gasUnit && target === s.target;
    const out: CarryState = same ? s : { patient, place, oxygen, vent, gasUnit, target };
    this.copies.set(s, out);
    return out;
  }

  /** Read issues moved, or null when one cannot be (see `moveLineNames`) or points at a changed line. */
  private issues(issues: readonly ReadIssue[]): readonly ReadIssue[] | null {
    const out: ReadIssue[] = [];
    for (const issue of issues) {
      const message = moveLineNames(this.shift, issue.message);
      const line = shiftedLine(this.shift, issue.line);
      if (message === null || line === null) return null;
      let related: { readonly line: number; readonly span: Span; readonly message: string }[] | undefined;
      if (issue.related) {
        related = [];
        for (const r of issue.related) {
          const at = shiftedLine(this.shift, r.line);
          const words = moveLineNames(this.shift, r.message);
          if (at === null || words === null) return null;
          related.push({ ...r, line: at, message: words });
        }
      }
      const fixes = this.fixes(issue.fixes);
      if (fixes === null) return null;
      out.push(related ? { ...issue, line, message, related, fixes } : { ...issue, line, message, fixes });
    }
    return out;
  }

  /**
   * Fixes moved: the lines an edit names (another line than its finding's) and the lines its title
   * names (`… as on line 2`), or null where one cannot be.
   */
  private fixes(fixes: readonly LineFix[]): readonly LineFix[] | null {
    let moves = false;
    for (const fix of fixes) {
      for (const e of fix.edits) if (e.line !== undefined || e.endLine !== undefined) moves = true;
      if (!moves && moveLineNames(this.shift, fix.title) !== fix.title) moves = true;
    }
    if (!moves) return fixes;
    const out: LineFix[] = [];
    for (const fix of fixes) {
      const title = moveLineNames(this.shift, fix.title);
      if (title === null) return null;
      const edits: LineEdit[] = [];
      for (const e of fix.edits) {
        const line = e.line === undefined ? undefined : shiftedLine(this.shift, e.line);
        const endLine = e.endLine === undefined ? undefined : shiftedLine(this.shift, e.endLine);
        if (line === null || endLine === null) return null;
        edits.push({ span: e.span, newText: e.newText, ...(line === undefined ? {} : { line }), ...(endLine === undefined ? {} : { endLine }) });
      }
      out.push({ ...fix, title, edits });
    }
    return out;
  }
}

/**
 * A stated value seen through another: every property is the value's as read, but those a
 * subclass gives (its line, or whether it is in force only where it is stated).
 */
abstract class ValueAsRead implements StatedValue {
  constructor(readonly read: StatedValue) {}
  abstract readonly line: number;
  abstract readonly hereOnly: boolean;
  get field(): FieldDef { return this.read.field; }
  get fieldId(): string { return this.read.fieldId; }
  get section(): SectionId { return this.read.section; }
  get item(): ItemNode { return this.read.item; }
  get value(): number | null { return this.read.value; }
  get parts(): readonly number[] | null { return this.read.parts; }
  get word(): string | null { return this.read.word; }
  get unit(): string | null { return this.read.unit; }
  get readUnit(): string | null { return this.read.readUnit; }
  get unitImplied(): boolean { return this.read.unitImplied; }
  get unitDoubt(): string | null { return this.read.unitDoubt; }
  get usable(): boolean { return this.read.usable; }
}

/**
 * A stated value on another line than the one it was read on (its line moved with lines added or
 * removed before it): the value as read, with its new line. A value moved again refers to the
 * value as read, never to another move, so no chain builds up.
 */
class MovedValue extends ValueAsRead {
  constructor(read: StatedValue, readonly line: number) { super(read); }
  get hereOnly(): boolean { return this.read.hereOnly; }
}

/** Whether the lines `[start, end)` are the previous run's lines `[start - delta, end - delta)` moved. */
function sameNodesMoved(before: readonly LineNode[], lines: readonly LineNode[], start: number, end: number, delta: number): boolean {
  if (start - delta < 0 || before.length < end - delta) return false;
  for (let i = start; i < end; i++) {
    const x = before[i - delta]!;
    const y = lines[i]!;
    if (y.line !== i || x.line !== i - delta || x.text !== y.text) return false;
  }
  return true;
}

/**
 * Whether the lines `[start, end)` are what they were in the previous run: the same nodes, or
 * nodes of the same line number and text (the parser is a pure function of both).
 */
function sameNodes(before: readonly LineNode[], lines: readonly LineNode[], start: number, end: number): boolean {
  if (before.length < end) return false;
  for (let i = start; i < end; i++) {
    const x = before[i]!;
    const y = lines[i]!;
    if (x !== y && (x.line !== y.line || x.text !== y.text)) return false;
  }
  return true;
}

/** Same entries in the same order (the order decides how carried values are listed). */
function sameMap(a: HeldMap, b: HeldMap): boolean {
  if (a === b) return true;
  if (a.size !== b.size) return false;
  const other = b.entries();
  for (const [k, v] of a) {
    const next = other.next().value;
    if (!next || next[0] !== k || next[1] !== v) return false;
  }
  return true;
}

function sameState(a: CarryState, b: CarryState): boolean {
  return a === b || (
    sameMap(a.patient, b.patient) && sameMap(a.place, b.place) && sameMap(a.oxygen, b.oxygen) && sameMap(a.vent, b.vent) && a.gasUnit === b.gasUnit && a.target === b.target
  );
}

function sameTime(a: TimepointTime, b: TimepointTime): boolean {
  return a === b || (a.day === b.day && a.minutes === b.minutes);
}

/**
 * How bare numbers are read (from the gas unit and the place in force), kept from block to block
 * of one run: few lines change it.
 */
interface Reading {
  context: ReadContextIn | null;
}

/** Reads the block `lines[start, end)`. */
function processBlock(lines: readonly LineNode[], start: number, end: number, index: number, stateIn: CarryState, timeIn: TimepointTime, settings: Settings, tree: NoteTree, previousOut: CarryState | null, reading: Reading): BlockResult {
  const endLine = end - 1;
  // The block's values and issues are read into scratch space (processBlock never nests) and
  // copied out at their exact length: most blocks have no header values and no issues.
  const issues = READ_ISSUES;
  // Empty unless a read threw part-way through a block (a note is then read afresh).
  if (issues.length > 0) issues.length = 0;
  let header: StatedValue[] | null = null;
  const stated = STATED;
  let count = 0;
  const first = start < end ? lines[start] : undefined;
  // The state as the block's lines change it, in scratch space: a new state is made only when it changed.
  const mutable = WORKING;
  mutable.patient = stateIn.patient;
  mutable.place = stateIn.place;
  mutable.oxygen = stateIn.oxygen;
  mutable.vent = stateIn.vent;
  mutable.gasUnit = stateIn.gasUnit;
  mutable.target = stateIn.target;
  let timeOut = timeIn;
  // Header values and timepoint values are told apart (a header line and a timepoint line of one block).
  const seenInHeader = SEEN_IN_HEADER.reset();
  const seenAtTimepoint = SEEN_AT_TIMEPOINT.reset();
  // The block's timepoint, when it has one (`tpLabel` not null): the `@` line (null for the implicit first timepoint).
  let tpLine: number | null = null;
  let tpLabel: string | null = null;
  let tpStart = 0;
  let tpTime: TimepointTime = START_TIME;
  if (first?.kind === 'timepoint') {
    let time = timeOf(first, timeIn, index === 0);
    if (time.minutes !== null && time.minutes > MAX_DAY * 1440 && first.time) {
      // Offsets (`@ +100000d` again and again) or clock times past midnight that go beyond what a
      // note can span: no time, as for `@ day 100001` or `@ +100001d` written out.
      issues.push({
        check: 'bad-time', line: first.line, span: first.time.span, fixes: NONE,
        message: `\`${first.time.text}\` takes this timepoint to day ${time.day}, beyond what a note can span (${MAX_DAY} days from day 1); it has no time.`,
      });
      time = new TimeAt(null, null);
    }
    if (time.minutes !== null || time.day !== null) timeOut = time;
    tpLine = tpStart = first.line;
    tpLabel = labelOf(first);
    tpTime = time;
  }
  let context = reading.context;
  // The age bare body sizes are read with, from the whole block, before any of its lines is read:
  // an age stated after the height, on its line or on a later one, reads as one stated before it.
  const ageYears = ageForReading(lines, start, end, stateIn);
  for (let i = start; i < end; i++) {
    const node = lines[i]!;
    if (node.kind !== 'section') continue;
    const kind = sectionById(node.section).kind;
    if (kind === 'prose') continue;
    // Every patient, place and units line before the first `@` is the header, also one after a
    // measurement that opened the implicit first timepoint (its line is null).
    const inHeader = tpLine === null && kind === 'header';
    if (!inHeader && tpLabel === null) {
      tpLabel = 'start';
      tpStart = firstContentLine(tree);
      tpTime = new TimeAt(null, null);
    }
    if (context === null || context.place !== mutable.place || context.gasUnit !== mutable.gasUnit || context.read.ageYears !== ageYears) context = reading.context = readContext(mutable, settings, ageYears);
    const into = inHeader ? (header ??= []) : stated;
    const from = inHeader ? into.length : count;
    const to = readLine(node, context.read, issues, into, from);
    if (!inHeader) count = to;
    // An SpO2 target is held apart (`CarryState.target`): the rest of its line is read as the oxygen
    // line it would be without it, and a line of a target alone leaves the therapy in force as it is.
    let upTo = to;
    if (node.section === 'oxygen' && !inHeader) {
      upTo = to > from ? targetsLast(into, from, to) : to;
      if (upTo < to) {
        // Two targets at one timepoint: the later is used, as for any value stated twice (PN206).
        duplicates(into, upTo, to, seenAtTimepoint, false, issues, lines, mutable.oxygen, null);
        mutable.target = new HeldValue(into[to - 1]!, index, tpLabel!, tpTime);
      }
      // A line of targets alone, read or not (`oxygen target 92`, PN102), leaves the therapy as it is.
      if (node.items.length > 0 && targetless(node.items).length === 0) continue;
    }
    // The device of the oxygen therapy in force that this oxygen line updates rather than replaces (`updatedDevice`).
    const updated = node.section === 'oxygen' && !inHeader ? updatedDevice(mutable.oxygen, into, from, upTo, targetless(node.items), index) : null;
    const paired = upTo > from ? duplicates(into, from, upTo, inHeader ? seenInHeader : seenAtTimepoint, inHeader, issues, lines, mutable.oxygen, updated) : null;
    if (paired !== null) {
      // The FiO2 of a device on one oxygen line and a `fio2` on another: the two lines state one therapy.
      mutable.oxygen = holdPaired(mutable.oxygen, into, from, upTo, index, tpLabel!, tpTime);
      mutable.vent = EMPTY;
    } else apply(node.section, into, from, upTo, inHeader ? -1 : index, inHeader ? 'header' : tpLabel!, inHeader ? START_TIME : tpTime, mutable, updated);
  }
  SEEN_IN_HEADER.reset();
  SEEN_AT_TIMEPOINT.reset();
  const stateOut = reuseEqual(mutable, stateIn, previousOut);
  mutable.patient = mutable.place = mutable.oxygen = mutable.vent = EMPTY;
  mutable.gasUnit = null;
  mutable.target = null;
  const keptHeader = header ?? NONE;
  const keptIssues = issues.length === 0 ? NONE : issues.slice();
  issues.length = 0;
  // Kept as long as the timepoint: a copy of its exact length, made by `slice` (an array made with
  // `new Array(n)` would be tracked by its allocation site and pretenured, see `HeldValue`).
  // A timepoint with nothing stated (a bare `@`) shares the empty list.
  const keptStated: readonly StatedValue[] = count === 0 ? NONE : stated.slice(0, count) as StatedValue[];
  for (let k = 0; k < count; k++) stated[k] = undefined;
  return new Block(tpLabel === null ? null : freeze(index, tpLine, tpLabel, tpStart, tpTime, keptStated, endLine, stateOut, settings, ageYears), keptHeader, keptIssues, stateOut, timeOut, ageYears);
}

/** The field held apart as the SpO2 target (`CarryState.target`). */
const TARGET = SPO2_TARGET_FIELD;

/**
 * Moves the SpO2 targets among `stated[from, to)` (an oxygen line's values) after its other values,
 * each part in the order written, and returns where they start (`to` when there are none): what is
 * before it is read as the oxygen line, the last target is held as the target in force.
 */
function targetsLast(stated: (StatedValue | undefined)[], from: number, to: number): number {
  let k = from;
  while (k < to && stated[k]!.fieldId !== TARGET) k++;
  if (k === to) return to;
  const targets: StatedValue[] = [];
  let write = from;
  for (let r = from; r < to; r++) {
    const s = stated[r]!;
    if (s.fieldId === TARGET) targets.push(s);
    else stated[write++] = s;
  }
  const start = write;
  for (const t of targets) stated[write++] = t;
  return start;
}

/** An oxygen line's items but its SpO2 targets (the same list where it writes none). */
function targetless(items: readonly ItemNode[]): readonly ItemNode[] {
  for (let k = 0; k < items.length; k++) if (items[k]!.field?.id === TARGET) return items.filter((item) => item.field?.id !== TARGET);
  return items;
}

/** Scratch space of `processBlock`: the values stated at the block's timepoint, and its read issues. */
const STATED: (StatedValue | undefined)[] = [];
const READ_ISSUES: ReadIssue[] = [];

function firstContentLine(tree: NoteTree): number {
  const first = tree.lines.find((l) => l.kind === 'section' || l.kind === 'unknown');
  return first?.line ?? 0;
}

function labelOf(node: TimepointLine): string {
  if (node.label) return node.label.text;
  if (node.time) return node.time.text;
  return `line ${node.line + 1}`;
}

function timeOf(node: TimepointLine, last: TimepointTime, isFirst: boolean): TimepointTime {
  const t = node.time;
  if (!t) return new TimeAt(null, null);
  if (t.kind === 'offset') {
    const base = last.minutes ?? (isFirst ? 0 : null);
    if (base === null || t.minutes === null) return new TimeAt(null, null);
    const minutes = base + t.minutes;
    return new TimeAt(compact(Math.floor(minutes / 1440) + 1), compact(minutes));
  }
  // A day without a time of day: the day is known, the minutes are not (never an invented midnight).
  if (t.kind === 'day') return new TimeAt(t.day, null);
  // clock
  if (t.minutes === null) return new TimeAt(null, null);
  let day = t.day ?? last.day ?? 1;
  if (t.day === null && last.minutes !== null && (day - 1) * 1440 + t.minutes < last.minutes) day += 1; // past midnight
  return new TimeAt(compact(day), compact((day - 1) * 1440 + t.minutes));
}

/** How bare numbers are read, and the held values (and the age) it was worked out from. */
interface ReadContextIn {
  readonly place: HeldMap;
  readonly gasUnit: Held | null;
  readonly read: ReadContext;
}

function readContext(state: CarryState, settings: Settings, ageYears: number | null): ReadContextIn {
  return { place: state.place, gasUnit: state.gasUnit, read: { gasUnit: gasUnitInForce(state, settings), barometricMmhg: barometricInForce(state.place, settings), ageYears } };
}

/**
 * The age (years) the lines of the block `lines[start, end)` are read with: the age in force where
 * they are stated, kept as the block's (`Timepoint.ageYears`, `Timeline.headerAgeYears`), which the
 * checks ask (PN302): the one reader of the age. In the header (block 0) the header's, in a
 * timepoint's block the timepoint's: the last age its patient lines state (every line of a header
 * or a timepoint describes one moment, so whichever line states the age, before or after a height,
 * gives the same reading), else the one carried to it. An age stated but not used (impossible, or
 * its unit in doubt) replaces the one before it all the same, and is no age. Null: none.
 */
function ageForReading(lines: readonly LineNode[], start: number, end: number, stateIn: CarryState): number | null {
  for (let i = end - 1; i >= start; i--) {
    const node = lines[i]!;
    if (node.kind !== 'section' || node.section !== 'patient') continue;
    const items = node.items;
    for (let k = items.length - 1; k >= 0; k--) {
      const item = items[k]!;
      if (item.field?.id !== 'age') continue;
      // Read as the line will be (an age's reading depends on no context); its issues are reported then.
      const age = readItem(item, node.section, node.line, AGE_CONTEXT, AGE_ISSUES, items, node.text);
      AGE_ISSUES.length = 0;
      if (age !== null) return age.usable ? age.value : null;
    }
  }
  const held = stateIn.patient.get('age')?.stated;
  return held !== undefined && held.usable ? held.value : null;
}

/** What `ageForReading` reads an age with (nothing of it changes how an age is read), and its scratch list of issues. */
const AGE_CONTEXT: ReadContext = Object.freeze({ gasUnit: 'mmHg', barometricMmhg: null, ageYears: null });
const AGE_ISSUES: ReadIssue[] = [];

/** The gas unit in force at the end of the header: its last `units gas`, else the setting. */
function headerGasUnit(header: readonly StatedValue[], settings: Settings): 'mmHg' | 'kPa' {
  for (let i = header.length - 1; i >= 0; i--) {
    const s = header[i]!;
    if (s.fieldId === 'gas_unit' && s.word !== null) return s.word as 'mmHg' | 'kPa';
  }
  return settings.gasUnit;
}

/** The gas unit bare numbers are read in: the last `units gas` held, else the setting. */
function gasUnitInForce(state: CarryState, settings: Settings): 'mmHg' | 'kPa' {
  return (state.gasUnit?.stated.word as 'mmHg' | 'kPa' | undefined) ?? settings.gasUnit;
}

/** Reads the items of a line into `into` from `at` on; returns where the values read end. */
function readLine(node: SectionLine, context: ReadContext, issues: ReadIssue[], into: (StatedValue | undefined)[], at: number): number {
  const items = node.items;
  for (let k = 0; k < items.length; k++) {
    const stated = readItem(items[k]!, node.section, node.line, context, issues, items, node.text);
    if (stated) into[at++] = stated;
  }
  return at;
}

export function barometricInForce(place: ReadonlyMap<string, { stated: StatedValue }>, settings: Settings): number | null {
  const pb = place.get('barometric')?.stated;
  if (pb?.usable && pb.value !== null) return pb.value;
  const alt = place.get('altitude')?.stated;
  if (alt?.usable && alt.value !== null) return barometricFromAltitude(alt.value, settings.barometricModel);
  return null;
}

/**
 * The first value of each section and field among the values read so far in a block, searched
 * in place: the list holds at most one value per section and field (65 pairs in the registry), so
 * a search is short however many values a block repeats.
 */
class FirstSeen {
  private readonly values: (StatedValue | undefined)[] = [];
  private count = 0;

  /** The first value of the same section and field as `s`, or null (and `s` is now the first). */
  earlier(s: StatedValue): StatedValue | null {
    const fieldId = s.fieldId;
    const values = this.values;
    for (let i = 0; i < this.count; i++) {
      const v = values[i]!;
      if (v.fieldId === fieldId && v.section === s.section) return v;
    }
    values[this.count++] = s;
    return null;
  }

  /** Makes `s` the first value of its section and field (seen already: `earlier` found one). */
  replace(s: StatedValue): void {
    const values = this.values;
    for (let i = 0; i < this.count; i++) {
      const v = values[i]!;
      if (v.fieldId === s.fieldId && v.section === s.section) values[i] = s;
    }
  }

  /** Forgets the values seen (and lets go of them): one of each kind serves every block. */
  reset(): this {
    for (let i = 0; i < this.count; i++) this.values[i] = undefined;
    this.count = 0;
    return this;
  }
}

const SEEN_IN_HEADER = new FirstSeen();
const SEEN_AT_TIMEPOINT = new FirstSeen();

/**
 * The same field twice in one section at one timepoint (or in the header): the later value wins,
 * the first is named. The FiO2 read from the number after a device (`venturi 28`, `hfnc 60 %`) and
 * a `fio2` written are compared instead (`deviceFio2Conflict`): on one line, and on two oxygen lines
 * of the timepoint (`pairsAcrossLines`). Returns the `fio2` written where the second of two such
 * lines is `stated[from, to)` and the two were compared (they state one therapy: `holdPaired`).
 */
function duplicates(stated: readonly (StatedValue | undefined)[], from: number, to: number, seen: FirstSeen, inHeader: boolean, issues: ReadIssue[], lines: readonly LineNode[], heldOxygen: HeldMap, updated: string | null): StatedValue | null {
  let paired: StatedValue | null = null;
  for (let k = from; k < to; k++) {
    const s = stated[k]!;
    const earlier = seen.earlier(s);
    if (!earlier) continue;
    if (s.fieldId === 'device' && s.section === 'oxygen') {
      // The device in force named again at its timepoint: the line continues that therapy (`updatedDevice`).
      if (updated !== null) continue;
      const replaced = replacedDevice(s, earlier, stated, from, to, heldOxygen, lines);
      if (replaced !== null) {
        issues.push(replaced);
        continue;
      }
    }
    if (s.fieldId === 'fio2' && s.section === 'oxygen') {
      // `oxygen venturi 28, fio2 0.28`, or the two on lines of their own: the FiO2 read from the
      // number after the device, and a `fio2` written. Later `fio2`s are compared with the one
      // written; one written above the device's line is compared where it is the one in force:
      // the first, or a later one written on an oxygen line of this timepoint after it (the
      // oxygen held then is this timepoint's: the line of `earlier` replaced what came before).
      const inForce = earlier.item.implied === null && s.item.implied === 'device-flow' ? heldOxygen.get('fio2')?.stated : undefined;
      const device = earlier.item.implied === 'device-flow' && s.item.implied === null ? earlier
        : inForce !== undefined && inForce.item.implied === null && inForce.section === 'oxygen' ? s
        : null;
      const written = device === earlier ? s : device === s ? inForce! : earlier;
      if (device !== null && (device.line === written.line || pairsAcrossLines(lines[device.line]!, lines[written.line]!))) {
        if (device === earlier) seen.replace(s);
        const conflict = deviceFio2Conflict(device, written, lines);
        if (conflict !== 'unread' && device.line !== written.line) paired = written;
        if (conflict === 'agree') continue;
        if (conflict !== 'unread') {
          issues.push(conflict);
          continue;
        }
      }
    }
    issues.push({
      check: 'duplicate-key',
      line: s.line,
      span: s.item.key?.span ?? s.item.span,
      // A later value that is not used itself (`ph 6.29`, impossible) still replaces the first: neither is used.
      message: `${s.field.label} is stated twice ${inHeader ? 'in the header' : 'at this timepoint'}; ${s.usable ? 'the later value is used' : 'the later value replaces the first, but is not used itself (see its finding)'}.`,
      fixes: NONE,
      related: [{ line: earlier.line, span: earlier.item.span, message: 'first stated here' }],
    });
  }
  return paired;
}

/**
 * The oxygen device stated twice at one timepoint where the later line replaces the oxygen held
 * (another device, or one it does not update: `updatedDevice`), and some setting held of the
 * oxygen above it is not restated by the line (`stated[from, to)`, the device `s`; `earlier`, the
 * device first stated): the finding says which settings are no longer in force, and of which line
 * (`oxygen niv ipap 14, epap 6` then `oxygen hfnc 50 L/min`: the IPAP and EPAP of line 2), names
 * each where it was written, and may offer to write the first device on the line (`oneTherapyFix`). Null where
 * nothing held is lost: the plain duplicate.
 */
function replacedDevice(s: StatedValue, earlier: StatedValue, stated: readonly (StatedValue | undefined)[], from: number, to: number, heldOxygen: HeldMap, lines: readonly LineNode[]): ReadIssue | null {
  const lost: StatedValue[] = [];
  heldOxygen.forEach((held, id) => {
    if (id === 'device') return;
    for (let k = from; k < to; k++) if (stated[k]!.fieldId === id) return;
    lost.push(held.stated);
  });
  if (lost.length === 0) return null;
  lost.sort((a, b) => a.line - b.line || a.item.span.start - b.item.span.start);
  const groups: string[] = [];
  for (let i = 0; i < lost.length;) {
    const line = lost[i]!.line;
    const labels: string[] = [];
    for (; i < lost.length && lost[i]!.line === line; i++) labels.push(settingName(lost[i]!.field));
    groups.push(`the ${wordList(labels)} of line ${line + 1}`);
  }
  const line = s.line;
  const first = earlier.line;
  const related = [{ line: first, span: earlier.item.span, message: 'first stated here' }];
  for (const v of lost) related.push({ line: v.line, span: v.item.span, message: `no longer in force: replaced by line ${line + 1}` });
  return {
    check: 'duplicate-key',
    line,
    span: s.item.key?.span ?? s.item.span,
    message: `${s.field.label} is stated twice at this timepoint; ${s.usable ? 'the later value is used' : 'the later value replaces the first, but is not used itself (see its finding)'}. This line replaces the oxygen above it: ${wordList(groups)} ${lost.length === 1 ? 'is' : 'are'} no longer in force.`,
    // The device in force (the last named above), else the first.
    fixes: oneTherapyFix(s, heldOxygen.get('device')?.stated ?? earlier, stated, from, to, lines),
    related,
  };
}

/**
 * Where every other value of the line that names the device `s` is a setting of the device above
 * it (`earlier`, `deviceSets`), a fix that writes that device, as written there, in place of
 * `s`: the line then names the device in force again and updates it (`updatedDevice`), so the
 * settings above stay and every value written is kept (`oxygen niv ipap 14, epap 6` then `oxygen
 * hfnc 50 L/min` → `oxygen niv 50 L/min`). Not preferred: the line may say that the therapy
 * changed. Else none: removing a line would lose what it says.
 */
function oneTherapyFix(s: StatedValue, earlier: StatedValue, stated: readonly (StatedValue | undefined)[], from: number, to: number, lines: readonly LineNode[]): readonly LineFix[] {
  const device = earlier.word;
  const written = earlier.item.value?.text;
  const node = lines[s.line];
  if (device === null || !earlier.usable || written === undefined || node === undefined) return NONE;
  for (let k = from; k < to; k++) {
    const v = stated[k]!;
    if (v.fieldId !== 'device' && !deviceSets(device, v.fieldId)) return NONE;
  }
  const span = s.item.value?.span ?? s.item.span;
  return [{ title: `Write \`${written}\` here, as on line ${earlier.line + 1} (one therapy: the settings above stay in force)`, edits: renameKeepingColumns(node.text, span, written) }];
}

/** A setting named inside a sentence: its label, in lower case where it is words (`oxygen flow`), as written where it is a short name (`IPAP`, `FiO2`). */
function settingName(field: FieldDef): string {
  const label = field.label;
  return /^[A-Z][a-z]+(?: |$)/.test(label) ? label.charAt(0).toLowerCase() + label.slice(1) : label;
}

/**
 * Whether the FiO2 read after the device of one oxygen line and a `fio2` on another oxygen line of
 * its timepoint state one FiO2 twice (`oxygen venturi 28`, then `oxygen fio2 0.28`, or the other way
 * round): where the line of the `fio2` names no device of its own (with one, it states another
 * therapy, and replaces the first as any oxygen line does), and the device's line writes no `fio2`
 * of its own (it is compared with that one). A `fio2` on a vent line is the ventilator's (PN311
 * reports the overlap).
 */
export function pairsAcrossLines(deviceLine: LineNode, writtenLine: LineNode): boolean {
  return deviceLine.kind === 'section' && writtenLine.kind === 'section' && deviceLine.section === 'oxygen' && writtenLine.section === 'oxygen' &&
    !namesDevice(writtenLine.items) && !writesFio2(deviceLine.items);
}

/** Whether the items of an oxygen line name a device (`oxygen mask …`). */
function namesDevice(items: readonly ItemNode[]): boolean {
  for (let k = 0; k < items.length; k++) if (items[k]!.implied === 'device') return true;
  return false;
}

/** Whether the items of a line write a `fio2` with its key. */
export function writesFio2(items: readonly ItemNode[]): boolean {
  for (let k = 0; k < items.length; k++) if (items[k]!.implied === null && items[k]!.field?.id === 'fio2') return true;
  return false;
}

/**
 * The oxygen held after the second of two oxygen lines of a timepoint that state one FiO2, the
 * device's and a `fio2` written (`pairsAcrossLines`): both lines, as one (what the first held at
 * this timepoint, then `stated[from, to)`), the `fio2` written in force whichever line is first
 * (the FiO2 read after the device is not held).
 */
function holdPaired(base: HeldMap, stated: readonly (StatedValue | undefined)[], from: number, to: number, tp: number, label: string, time: TimepointTime): HeldMap {
  const next = new Map<string, Held>();
  base.forEach(copyHereInto, new HereInto(next, tp));
  for (let k = from; k < to; k++) {
    const s = stated[k]!;
    if (s.hereOnly || (s.fieldId === 'fio2' && s.item.implied === 'device-flow')) continue;
    next.set(s.fieldId, new HeldValue(s, tp, label, time));
  }
  return next;
}

/** Where `copyHereInto` copies to, and the timepoint whose values it copies. */
class HereInto {
  constructor(readonly map: Map<string, Held>, readonly tp: number) {}
}

function copyHereInto(this: HereInto, held: Held, id: string): void {
  if (held.timepoint === this.tp) this.map.set(id, held);
}

/**
 * An FiO2 read from the number after the device (`device`: the Venturi setting `venturi 28`, or a
 * percentage after `hfnc`) and a `fio2` written (`written`), on the same line or on two oxygen lines
 * of one timepoint (`pairsAcrossLines`). 'agree' where the two agree: the same fraction at the
 * precision of the less precise of the two as written (`venturi 28, fio2 0.28`, and `fio2 0.3`, 28 %
 * to one decimal; not `fio2 0.29`); that states the FiO2 once, and the `fio2` written is the one
 * used. Else the duplicate, naming both values, where each comes from (their lines, where they are
 * two) and which is used (the `fio2` written: on one line the later, as for any value stated twice,
 * and on two lines whichever comes first), with a fix that keeps each; 'unread' where a value is
 * missing (a unit not allowed), for the plain duplicate.
 */
function deviceFio2Conflict(device: StatedValue, written: StatedValue, lines: readonly LineNode[]): ReadIssue | 'agree' | 'unread' {
  const a = device.value;
  const b = written.value;
  if (a === null || b === null) return 'unread';
  const stepA = writtenStep(device);
  const stepB = writtenStep(written);
  if (Math.abs(a - b) < Math.max(stepA, stepB) / 2 - 1e-9) return 'agree';
  const deviceLine = lines[device.line] as SectionLine;
  const items = deviceLine.items;
  const at = items.indexOf(device.item);
  let w = at - 1;
  while (w >= 0 && items[w]!.implied !== 'device') w--;
  const word = w >= 0 ? items[w]! : null;
  const venturi = word !== null && word.implied === 'device' && word.value?.kind === 'word' && word.field !== null && canonicalWord(word.field, word.value.text) === 'venturi';
  const deviceText = itemText(device.item);
  const writtenText = itemText(written.item);
  const named = venturi ? `the Venturi setting \`${deviceText}\`` : `\`${deviceText}\` after \`${word?.value?.text ?? 'the device'}\``;
  const used = written.usable
    ? `The \`${written.item.key?.text ?? 'fio2'}\` written (${formatNumber(b, decimalsOf(stepB))}) is used`
    : `The \`${written.item.key?.text ?? 'fio2'}\` written replaces ${venturi ? 'the setting' : 'the percentage'}, but is not used itself (see its finding)`;
  const kept = venturi ? `the Venturi setting \`${deviceText}\`` : `\`${deviceText}\``;
  const related = [{ line: device.line, span: device.item.span, message: venturi ? 'the Venturi setting, read as the FiO2' : 'the percentage after the device, read as the FiO2' }];
  // Keeping the device's number writes it with its key where it was said to be read as the FiO2
  // (PN321, PN323), on one line as on two, so nothing is left to say: `fio2` before it, ` %` after
  // a bare setting, and `flow` before a flow that follows it without a key (`hfnc 60 % 40 L/min`).
  const said = deviceLine.issues.some((i) => (i.check === 'venturi-setting' || i.check === 'high-flow-percent') && i.span.start === device.item.span.start);
  const asKey = `fio2 ${deviceText}${device.item.unit === null ? ' %' : ''}`;
  const keepTitle = said ? `Keep ${kept} as \`${asKey}\` (remove \`${writtenText}\`)` : `Keep ${kept} (remove \`${writtenText}\`)`;
  const keepDevice = said ? keyedDeviceEdits(device, items[at + 1], device.line) : [];
  if (device.line === written.line) {
    const before = items[items.indexOf(written.item) - 1];
    const removed = { start: before !== undefined ? before.span.end : written.item.span.start, end: written.item.span.end };
    // A removal that starts where a bare setting ends takes its ` %` (two edits at one place).
    const joined = keepDevice.find((e) => e.span.start === removed.start && e.span.end === removed.start);
    const keepEdits: LineEdit[] = keepDevice.filter((e) => e !== joined).map((e) => ({ span: e.span, newText: e.newText }));
    keepEdits.push({ span: removed, newText: joined !== undefined ? joined.newText : '' });
    return {
      check: 'duplicate-key',
      line: written.line,
      span: written.item.key?.span ?? written.item.span,
      message: `FiO2 is stated twice on this line, and the two disagree: ${named} gives ${formatNumber(a, decimalsOf(stepA))}, and \`${writtenText}\` gives ${formatNumber(b, decimalsOf(stepB))}. ${used}; keep the one that was given.`,
      fixes: [
        { title: `Keep \`${writtenText}\` (remove ${kept})`, edits: [{ span: { start: at > 0 ? items[at - 1]!.span.end : device.item.span.start, end: device.item.span.end }, newText: '' }] },
        { title: keepTitle, edits: keepEdits },
      ],
      related,
    };
  }
  // On two lines: each fix leaves one line that states the FiO2 once. Keeping the `fio2` writes it
  // where the device's number was (`oxygen venturi fio2 0.35`); keeping the device's number writes
  // it with its key where it was said to be read as the FiO2 (PN321, PN323), so nothing is left to say.
  const removal = removalOf(written, lines);
  return {
    check: 'duplicate-key',
    line: written.line,
    span: written.item.key?.span ?? written.item.span,
    message: `FiO2 is stated twice at this timepoint, and the two disagree: ${named} (line ${device.line + 1}) gives ${formatNumber(a, decimalsOf(stepA))}, and \`${writtenText}\` (line ${written.line + 1}) gives ${formatNumber(b, decimalsOf(stepB))}. ${used}; keep the one that was given.`,
    fixes: [
      { title: `Keep \`${writtenText}\` (remove ${kept})`, edits: ordered(removal, [{ span: device.item.span, newText: writtenText, line: device.line }]) },
      { title: keepTitle, edits: ordered(removal, keepDevice) },
    ],
    related,
  };
}

/**
 * The edits that write the FiO2 read after the device with its key (`venturi 28` → `venturi fio2
 * 28 %`, `hfnc 60 %` → `hfnc fio2 60 %`), in the order of the text; where a flow follows it without a
 * key (`hfnc 60 % 40 L/min`), that flow is given its key too, since after a key no number is read
 * as the device's.
 */
function keyedDeviceEdits(device: StatedValue, next: ItemNode | undefined, line: number): LineEdit[] {
  const span = device.item.span;
  const edits: LineEdit[] = [{ span: { start: span.start, end: span.start }, newText: 'fio2 ', line }];
  if (device.item.unit === null) edits.push({ span: { start: span.end, end: span.end }, newText: ' %', line });
  if (next !== undefined && next.implied === 'device-flow') edits.push({ span: { start: next.span.start, end: next.span.start }, newText: 'flow ', line });
  return edits;
}

/** The removal of the `fio2` written and the edits of the device's line, in the order of the text. */
function ordered(removal: LineEdit, others: LineEdit[]): LineEdit[] {
  const other = others[0];
  return other === undefined || removal.line! < other.line! ? [removal, ...others] : [...others, removal];
}

/**
 * The edit that removes a `fio2` written on a line of its own: the whole line where it says nothing
 * else (a comment is something), else the item with the separator before it (or after it, where it
 * is the first item), or with the blanks after the section word.
 */
function removalOf(written: StatedValue, lines: readonly LineNode[]): LineEdit {
  const node = lines[written.line] as SectionLine;
  const items = node.items;
  const k = items.indexOf(written.item);
  const item = written.item;
  const line = written.line;
  if (items.length === 1 && node.text.slice(item.span.end).trim() === '') return { span: { start: 0, end: 0 }, newText: '', line, endLine: line + 1 };
  if (items.length > 1) return { span: itemsRemovalSpan(items, k), newText: '', line };
  return { span: { start: node.sectionToken.span.end, end: item.span.end }, newText: '', line };
}

/** An item as written, from its key (if any) to its unit (if any). */
function itemText(item: ItemNode): string {
  const value = item.value;
  const unit = item.unit;
  const key = item.key;
  let text = value?.text ?? '';
  if (unit !== null) text += `${value !== null && unit.span.start === value.span.end ? '' : ' '}${unit.text}`;
  return key === null ? text : `${key.text} ${text}`;
}

/** The step of a number as written, in the value's canonical unit: 0.01 for `28` read as 28 % (0.28), 0.1 for `0.3`. */
function writtenStep(s: StatedValue): number {
  const n = s.item.number;
  const v = s.value;
  if (n === null || v === null || n === 0) return 0;
  return Math.abs(v / n) * 10 ** -writtenDecimals(s.item.value?.text ?? '');
}

/** Decimals that show a number of this step (at least 2, as FiO2 is shown). */
function decimalsOf(step: number): number {
  return step > 0 ? Math.max(2, Math.min(6, Math.round(-Math.log10(step)))) : 2;
}

type MutableState = { -readonly [K in keyof CarryState]: CarryState[K] };

/**
 * `base` with the settings of `stated` held. A line of readings only (`vent plateau 24`) holds
 * nothing: the held map stays the same object, so the reuse of later timepoints sees no change.
 */
function hold(base: HeldMap, stated: readonly (StatedValue | undefined)[], from: number, to: number, tp: number, label: string, time: TimepointTime): HeldMap {
  let next: Map<string, Held> | null = null;
  for (let k = from; k < to; k++) {
    const s = stated[k]!;
    if (s.hereOnly) continue;
    if (next === null) {
      // Copied with forEach: `new Map(base)` goes through an iterator, an object per entry.
      next = new Map();
      base.forEach(copyInto, next);
    }
    next.set(s.fieldId, new HeldValue(s, tp, label, time));
  }
  return next ?? base;
}

function copyInto(this: Map<string, Held>, held: Held, id: string): void {
  this.set(id, held);
}

/**
 * Holds the settings among `stated[from, to)`, the values of one `section` line; `updated`, for an
 * oxygen line, the device of the therapy in force it updates (`updatedDevice`), else null.
 */
function apply(section: SectionId, stated: (StatedValue | undefined)[], from: number, to: number, tp: number, label: string, time: TimepointTime, state: MutableState, updated: string | null): void {
  switch (section) {
    case 'patient': state.patient = hold(state.patient, stated, from, to, tp, label, time); break;
    case 'place': if (to > from) state.place = hold(EMPTY, stated, from, to, tp, label, time); break;
    case 'units': { const g = firstOf(stated, from, to, 'gas_unit'); if (g?.word) state.gasUnit = new HeldValue(g, tp, label, time); break; }
    case 'oxygen': {
      // A later line that restates settings of the device in force (or of NIV or CPAP by its pressures) updates it; any other replaces it.
      state.oxygen = updated === null ? hold(EMPTY, stated, from, to, tp, label, time) : holdUpdate(state.oxygen, updated, stated, from, to, tp, label, time);
      state.vent = EMPTY;
      break;
    }
    case 'vent': {
      perKgVolumes(stated, from, to, state.patient);
      const mode = firstOf(stated, from, to, 'mode');
      const before = state.vent.get('mode')?.stated.word;
      // Under the mode in force each value is a setting or a measurement as its field's row says for
      // the mode's family (fields/modes.ts): a tidal volume under PS is measured, of its timepoint
      // only; the mean airway pressure in HFOV is set, held like a setting.
      // With no mode, under NIV or CPAP of the oxygen line in force, a line that states only what
      // those breaths measure (`vent vt 480, peak 16`) is read under them; any other line ends them.
      const modeAfter = mode?.word ?? before ?? null;
      readByMode(stated, from, to, ventFamily(stated, from, to, modeAfter, state.oxygen));
      // A line of readings only (`vent peak 15, ve 8`) starts no ventilation: the support in force stays.
      if (!statesVentSetting(stated, from, to)) break;
      state.oxygen = EMPTY;
      // A new mode starts a new set of settings; PEEP and FiO2 carry across it. Modes are words of
      // any case: one outside the registry's (`ASV`, then `asv`) is the same mode restated. A mode
      // written where none was held keeps what was held but what it measures (`vent vt 450` then
      // `vent mode PS, ps 10`: the volume is no setting under PS).
      let base = state.vent;
      if (mode?.word && mode.word.toLowerCase() !== before?.toLowerCase()) {
        const modeWord = mode.word;
        const kept = !before ? null : isOscillation(modeWord) || isOscillation(before) ? KEPT_ACROSS_OSCILLATION : KEPT_ACROSS_MODES;
        // Settings stated at this timepoint on an earlier vent line stay: every line of a timepoint
        // describes the same moment (`vent vt 400, rate 20` then `vent mode PS, ps 10`); for that
        // reason a value there that the new mode measures (that `vt 400`) is its measurement, read
        // again as of this timepoint only.
        const keeps = ([id, held]: [string, Held]): boolean => !isMeasuredUnder(held.stated.field, modeWord) && (held.timepoint === tp || kept === null || kept.includes(id));
        if (kept !== null || [...base].some((e) => !keeps(e))) {
          for (const e of base) if (e[1].timepoint === tp && !keeps(e)) measuredAbove(stated, from, e[1].stated);
          base = new Map([...base].filter(keeps));
        }
      }
      state.vent = hold(base, stated, from, to, tp, label, time);
      break;
    }
    default: break;
  }
}

/**
 * The device of the oxygen line in force (`oxygen`, held) that the oxygen line `stated[from, to)`
 * (its `items`) updates rather than replaces; null where it replaces it. With no
 * device named, NIV or CPAP written by its pressures alone (`oxygen ipap 14, epap 6`: the one rule,
 * `noninvasiveSupport`) counts as that device, and its name is returned (`niv`, `cpap`, as
 * `deviceSets` names them) though the held map keeps no device (none was written). It updates it
 * at a later timepoint and at the one where the device was written alike (lines of one timepoint
 * describe one moment: `oxygen hfnc 50 L/min` then `oxygen fio2 0.6` is one therapy; a setting
 * written twice there is PN206, as any value is; a `fio2` beside a device that gives one is paired
 * before this is asked: `pairsAcrossLines`) where the device is read (a word known), and the line names no
 * device, reads every item it writes (a word it does not read may be a device misspelt), and writes
 * at least one value, each a setting of that device (`deviceSets`: `oxygen flow 4` after `oxygen
 * cannula 2`, `oxygen fio2 0.4` after high flow, `oxygen ipap 16` after NIV, named or by its
 * pressures). An FiO2 after a cannula or a simple or reservoir mask is no setting of theirs, so such
 * a line replaces, as does a pressure of a support the device does not give (`oxygen ipap 14, epap
 * 6` after a cannula: NIV by its pressures; `oxygen level 8` after NIV by its pressures: CPAP), any
 * line after room air (it takes no setting), and any line where no device or support is in force
 * (under ventilation, after a line of only a flow or an FiO2, or nothing).
 *
 * At the timepoint `tp` where an oxygen line in force was written (some value held of it is of
 * `tp`), a line that names that device again (the same word; `niv` or `cpap` where the pressures
 * made the support) updates it too, whatever else it writes: the lines of one timepoint describe
 * one moment, and one device named twice there is one therapy written on two lines (`oxygen niv
 * ipap 14, epap 6` then `oxygen niv fio2 0.4` holds both pressures and the FiO2). At a later
 * timepoint, and where it names another device, such a line replaces (PN206 names what is lost).
 */
function updatedDevice(oxygen: HeldMap, stated: readonly (StatedValue | undefined)[], from: number, to: number, items: readonly ItemNode[], tp: number): string | null {
  if (to === from || oxygen.size === 0) return null;
  const held = oxygen.get('device');
  const device = held !== undefined ? (held.stated.usable ? held.stated.word : null) : noninvasiveSupport(null, oxygen);
  if (device === null) return null;
  let named = false;
  let unread = false;
  for (let k = 0; k < items.length; k++) {
    const item = items[k]!;
    if (item.field === null) unread = true;
    else if (item.implied === 'device') named = true;
  }
  // A line that names the device again updates it whatever else it writes, a word it does not read
  // included (the device is named, so that word is no device misspelt).
  if (named) return namesDeviceAgain(oxygen, device, stated, from, to, tp) ? device : null;
  if (unread) return null;
  for (let k = from; k < to; k++) if (!deviceSets(device, stated[k]!.fieldId)) return null;
  return device;
}

/**
 * Whether the oxygen line `stated[from, to)`, which names a device, names `device` (the device of the
 * therapy in force, `oxygen`) again at the timepoint `tp` where that therapy was written: every
 * device it names reads as `device`, and some value held of it is of `tp`.
 */
function namesDeviceAgain(oxygen: HeldMap, device: string, stated: readonly (StatedValue | undefined)[], from: number, to: number, tp: number): boolean {
  let named = false;
  for (let k = from; k < to; k++) {
    const s = stated[k]!;
    if (s.fieldId !== 'device') continue;
    if (!s.usable || s.word !== device) return false;
    named = true;
  }
  if (!named) return false;
  let here = false;
  oxygen.forEach((h) => { if (h.timepoint === tp) here = true; });
  return here;
}

/**
 * The oxygen held after a line that updates the therapy in force (`updatedDevice`): the device (where
 * one was written; NIV or CPAP by its pressures holds none) and the settings of it held before, each as it was held (its origin the line that stated it), then
 * `stated[from, to)`, which replace theirs. What the line before held beside the device that is no
 * setting of it (an FiO2 beside a cannula, a pressure beside a mask, PN318) does not carry: it was
 * said of the therapy as it was then.
 */
function holdUpdate(base: HeldMap, device: string, stated: readonly (StatedValue | undefined)[], from: number, to: number, tp: number, label: string, time: TimepointTime): HeldMap {
  const next = new Map<string, Held>();
  base.forEach(copySettingsOf, new SettingsOf(next, device));
  for (let k = from; k < to; k++) {
    const s = stated[k]!;
    if (!s.hereOnly) next.set(s.fieldId, new HeldValue(s, tp, label, time));
  }
  return next;
}

/** Where `copySettingsOf` copies to, and the device whose settings it copies. */
class SettingsOf {
  constructor(readonly map: Map<string, Held>, readonly device: string) {}
}

function copySettingsOf(this: SettingsOf, held: Held, id: string): void {
  if (id === 'device' || deviceSets(this.device, id)) this.map.set(id, held);
}

/**
 * Whether the vent line `stated[from, to)`, read under the breaths in force (`readByMode`), states a
 * ventilator setting, and so ends the oxygen line in force and updates the ventilator's settings. A
 * line of readings only (peak, plateau, measured minute volume, end-tidal CO2; what the breaths in
 * force measure, a tidal volume under PS or under NIV) does neither.
 */
function statesVentSetting(stated: readonly (StatedValue | undefined)[], from: number, to: number): boolean {
  for (let k = from; k < to; k++) if (!stated[k]!.hereOnly) return true;
  return false;
}

/**
 * The family of the breaths a vent line's values are read under (`familyInForce`): the mode in force
 * after it (`mode`); with none, the NIV or CPAP of the oxygen line held, if every value on the line is
 * one those breaths measure (`isMeasuredIn`: the line is one of readings and the support stays),
 * else none (the line states a setting, which ends the support and starts ventilation with no mode).
 */
function ventFamily(stated: readonly (StatedValue | undefined)[], from: number, to: number, mode: string | null, oxygen: HeldMap): ModeFamily | null {
  if (mode !== null || oxygen.size === 0) return modeFamily(mode);
  const family = familyInForce(null, noninvasiveSupport(oxygen.get('device')?.stated.word ?? null, oxygen));
  if (family === null) return null;
  for (let k = from; k < to; k++) if (!isMeasuredIn(stated[k]!.field, family)) return null;
  return family;
}

/** Reads `held`, stated on a line above `stated[from]` at this timepoint and held as a setting, as a measurement of its timepoint (`ReadAs`). */
function measuredAbove(stated: (StatedValue | undefined)[], from: number, held: StatedValue): void {
  for (let k = 0; k < from; k++) if (stated[k] === held) stated[k] = new ReadAs(held, true);
}

/**
 * Reads each value among `stated[from, to)`, a vent line's, as a setting or a measurement under
 * breaths of `family` (`isMeasuredIn`: the field's row for the family). Under no family (no mode and
 * no NIV or CPAP, or a mode the registry does not list), each stays as its field says.
 */
function readByMode(stated: (StatedValue | undefined)[], from: number, to: number, family: ModeFamily | null): void {
  if (family === null) return;
  for (let k = from; k < to; k++) {
    const s = stated[k]!;
    const hereOnly = isMeasuredIn(s.field, family);
    if (hereOnly !== s.hereOnly) stated[k] = new ReadAs(s, hereOnly);
  }
}

/**
 * A value read as a reading of its timepoint though its field is a setting (`hereOnly`: a tidal
 * volume written under a mode that sets a pressure, or on a vent line of readings under NIV or
 * CPAP, see `readByMode`), in force where it is stated and never carried; or
 * as a setting though its field is a reading (the mean airway pressure set on an oscillator, see
 * `readByMode`), held and carried.
 */
class ReadAs extends ValueAsRead {
  constructor(read: StatedValue, readonly hereOnly: boolean) { super(read); }
  get line(): number { return this.read.line; }
}

/**
 * A tidal volume written per kg of predicted body weight (`vt 6 mL/kg`) among `stated[from, to)`,
 * read in mL where the patient values in force give a PBW (height and sex, an adult: ARDS Network
 * 2000): `PerKgVolume`. Elsewhere it stays as read, not used.
 */
function perKgVolumes(stated: (StatedValue | undefined)[], from: number, to: number, patient: HeldMap): void {
  for (let k = from; k < to; k++) {
    const s = stated[k]!;
    if (s.readUnit !== PER_KG_PBW) continue;
    const perKg = s.item.number;
    if (perKg === null || !(perKg > 0) || perKg > VT_PER_KG_HARD_MAX) continue;
    const pbw = pbwInForce(patient);
    if (pbw !== null) stated[k] = new PerKgVolume(s, perKg, pbw);
  }
}

/** The predicted body weight (kg) the patient values in force give (`pbwFrom`). */
function pbwInForce(patient: HeldMap): number | null {
  const height = patient.get('height')?.stated;
  const age = patient.get('age')?.stated;
  return pbwFrom(height && height.usable ? height.value : null, patient.get('sex')?.stated.word ?? null, age && age.usable ? age.value : null);
}

/** A tidal volume written in mL/kg of PBW, read in mL: `perKg` × `pbwKg`. */
export class PerKgVolume extends ValueAsRead {
  private readonly ml: number;
  constructor(read: StatedValue, readonly perKg: number, readonly pbwKg: number) {
    super(read);
    this.ml = perKg * pbwKg;
  }
  get line(): number { return this.read.line; }
  get hereOnly(): boolean { return this.read.hereOnly; }
  override get value(): number { return this.ml; }
  override get usable(): boolean { return true; }
}

/** The settings a change of mode keeps: PEEP and FiO2 (our convention, common practice, no source). */
const KEPT_ACROSS_MODES: readonly string[] = ['peep', 'fio2'];
/**
 * The settings a change to or from HFOV keeps: FiO2 alone. An oscillator sets a mean airway
 * pressure and no PEEP, so a conventional mode's PEEP is not in force under HFOV, nor is a PEEP
 * written under HFOV the PEEP of the mode that follows (common practice, no source).
 */
const KEPT_ACROSS_OSCILLATION: readonly string[] = ['fio2'];

/** Whether a mode word names high-frequency oscillation, in any case. */
function isOscillation(mode: string): boolean {
  return mode.toUpperCase() === OSCILLATION_MODE;
}

/** The first value of field `id` among `stated[from, to)`. */
function firstOf(stated: readonly (StatedValue | undefined)[], from: number, to: number, id: string): StatedValue | undefined {
  for (let k = from; k < to; k++) if (stated[k]!.fieldId === id) return stated[k];
  return undefined;
}

/** The state of `processBlock` (never nested), kept empty between blocks. */
const WORKING: MutableState = { patient: EMPTY, place: EMPTY, oxygen: EMPTY, vent: EMPTY, gasUnit: null, target: null };

/**
 * The state a block hands on, from the working `state`: `stateIn` itself when the block held
 * nothing new, else a state of its own, which keeps the previous run's held values (and maps)
 * where the recomputed ones are equal.
 */
function reuseEqual(state: MutableState, stateIn: CarryState, previous: CarryState | null): CarryState {
  if (!previous) {
    if (state.patient === stateIn.patient && state.place === stateIn.place && state.oxygen === stateIn.oxygen && state.vent === stateIn.vent && state.gasUnit === stateIn.gasUnit && state.target === stateIn.target) return stateIn;
    return new State(state.patient, state.place, state.oxygen, state.vent, state.gasUnit, state.target);
  }
  const reuseMap = (now: HeldMap, before: HeldMap): HeldMap => {
    let same = now.size === before.size;
    const order = before.keys();
    const next = new Map<string, Held>();
    for (const [k, v] of now) {
      const b = before.get(k);
      const keep = b && sameHeld(v, b) ? b : v;
      if (keep !== b || order.next().value !== k) same = false;
      next.set(k, keep);
    }
    return same ? before : next;
  };
  const gasUnit = state.gasUnit && previous.gasUnit && sameHeld(state.gasUnit, previous.gasUnit) ? previous.gasUnit : state.gasUnit;
  const target = state.target && previous.target && sameHeld(state.target, previous.target) ? previous.target : state.target;
  return new State(reuseMap(state.patient, previous.patient), reuseMap(state.place, previous.place), reuseMap(state.oxygen, previous.oxygen), reuseMap(state.vent, previous.vent), gasUnit, target);
}

/**
 * Whether a held value reads as the one held before: the same item on the same line, read the same
 * way. The unit it was read in counts too: an unchanged line under another `units gas` can give the
 * same number read in another unit (`place barometric 0`).
 */
function sameHeld(a: Held, b: Held): boolean {
  if (a === b) return true;
  const s = a.stated;
  const t = b.stated;
  return a.timepoint === b.timepoint && a.label === b.label && a.time.day === b.time.day && a.time.minutes === b.time.minutes && s.item === t.item && s.line === t.line && s.fieldId === t.fieldId &&
    s.value === t.value && s.word === t.word && s.unit === t.unit && s.usable === t.usable && s.unitDoubt === t.unitDoubt &&
    s.readUnit === t.readUnit && s.unitImplied === t.unitImplied && s.hereOnly === t.hereOnly && sameParts(s.parts, t.parts);
}

function sameParts(a: readonly number[] | null, b: readonly number[] | null): boolean {
  if (a === b) return true;
  if (a === null || b === null || a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/**
 * The values in force at one timepoint, read from what the timeline keeps anyway: the values
 * stated at this timepoint (its measurements and device readings, the last of a field winning)
 * and the settings held at its end (stated here, carried in, or from the header). Nothing is
 * stored per value: a read builds the value and its origin when asked, so a big note keeps no
 * map and no origin per timepoint. Iterating builds the full map once (in the order below).
 */
class ValuesAt implements ValuesInForce {
  private full: Map<string, InputValue> | null = null;
  /**
   * The fields measured here as bits (see FIELD_SLOT), made on the first read; -1 until then.
   * The derivation and the checks ask a timepoint for a field some twenty times, and half the
   * fields asked are not measured there: the bits answer those without a walk of the stated values.
   */
  private measuredLow = -1;
  private measuredHigh = 0;

  constructor(
    private readonly index: number,
    private readonly time: TimepointTime,
    private readonly state: CarryState,
    private readonly stated: readonly StatedValue[],
  ) {}

  // Each read looks up the field's slot once (FIELD_SLOT), for both places a value can be in.
  get(id: string): InputValue | undefined {
    const slot = FIELD_SLOT.get(id);
    const s = this.measuredHere(id, slot);
    if (s) return { stated: s, origin: { kind: 'here', line: s.line, span: s.item.span } };
    const held = this.heldFor(id, slot);
    return held ? { stated: held.stated, origin: originOf(held, this.index, this.time) } : undefined;
  }

  has(id: string): boolean {
    const slot = FIELD_SLOT.get(id);
    return this.measuredHere(id, slot) !== undefined || this.heldFor(id, slot) !== undefined;
  }

  heldSetting(id: string): InputValue | undefined {
    const held = this.heldFor(id, FIELD_SLOT.get(id));
    return held ? { stated: held.stated, origin: originOf(held, this.index, this.time) } : undefined;
  }

  numberOf(id: string): number | null {
    const slot = FIELD_SLOT.get(id);
    const s = this.measuredHere(id, slot) ?? this.heldFor(id, slot)?.stated;
    return s !== undefined && s.usable ? s.value : null;
  }

  wordOf(id: string): string | null {
    const slot = FIELD_SLOT.get(id);
    return (this.measuredHere(id, slot) ?? this.heldFor(id, slot)?.stated)?.word ?? null;
  }

  originOf(id: string): Origin['kind'] | null {
    const slot = FIELD_SLOT.get(id);
    if (this.measuredHere(id, slot)) return 'here';
    const held = this.heldFor(id, slot);
    if (!held) return null;
    return held.timepoint === this.index ? 'here' : held.timepoint < 0 ? 'header' : 'carried';
  }

  /** The measurement or reading of a field stated here (the last of them wins); `slot` is the field's FIELD_SLOT. */
  private measuredHere(id: string, slot: number | undefined): StatedValue | undefined {
    // A stated value's field is always one of the registry's.
    if (slot === undefined) return undefined;
    if (this.measuredLow < 0) this.markMeasured();
    const index = slot >> HELD_BITS;
    const bits = index < MASK_BITS ? this.measuredLow : this.measuredHigh;
    if ((bits & (1 << (index % MASK_BITS))) === 0) return undefined;
    const stated = this.stated;
    for (let i = stated.length - 1; i >= 0; i--) {
      const s = stated[i]!;
      if (s.fieldId === id && s.hereOnly) return s;
    }
    return undefined;
  }

  private markMeasured(): void {
    let low = 0;
    let high = 0;
    for (const s of this.stated) {
      if (!s.hereOnly) continue;
      const index = FIELD_SLOT.get(s.fieldId)! >> HELD_BITS;
      if (index < MASK_BITS) low |= 1 << index;
      else high |= 1 << (index - MASK_BITS);
    }
    this.measuredLow = low;
    this.measuredHigh = high;
  }

  /**
   * A field is held in one map only (an oxygen line empties the ventilator's and back), and only in
   * the maps of its sections (FIELD_SLOT): a measurement (`pao2`) is looked up in none of them.
   */
  private heldFor(id: string, slot: number | undefined): Held | undefined {
    if (slot === undefined) return undefined;
    const state = this.state;
    if ((slot & HELD_AS_TARGET) !== 0) return state.target ?? undefined;
    return ((slot & HELD_IN_VENT) !== 0 ? state.vent.get(id) : undefined) ??
      ((slot & HELD_IN_OXYGEN) !== 0 ? state.oxygen.get(id) : undefined) ??
      ((slot & HELD_IN_PLACE) !== 0 ? state.place.get(id) : undefined) ??
      ((slot & HELD_IN_PATIENT) !== 0 ? state.patient.get(id) : undefined);
  }

  /** Settings (patient, place, oxygen, ventilator) in the order they are held, then what was measured here. */
  private all(): Map<string, InputValue> {
    if (this.full) return this.full;
    const full = new Map<string, InputValue>();
    for (const map of [this.state.patient, this.state.place, this.state.oxygen, this.state.vent]) {
      for (const held of map.values()) full.set(held.stated.fieldId, this.get(held.stated.fieldId)!);
    }
    if (this.state.target !== null) full.set(TARGET, this.get(TARGET)!);
    for (const s of this.stated) if (s.hereOnly) full.set(s.fieldId, this.get(s.fieldId)!);
    this.full = full;
    return full;
  }

  get size(): number { return this.all().size; }
  entries(): MapIterator<[string, InputValue]> { return this.all().entries(); }
  keys(): MapIterator<string> { return this.all().keys(); }
  values(): MapIterator<InputValue> { return this.all().values(); }
  [Symbol.iterator](): MapIterator<[string, InputValue]> { return this.all().entries(); }
  forEach(callback: (value: InputValue, key: string, map: ReadonlyMap<string, InputValue>) => void, thisArg?: unknown): void {
    for (const [k, v] of this.all()) callback.call(thisArg, v, k, this);
  }
}

/**
 * Each field's slot, found with one lookup per read of a value in force: its bit in a timepoint's
 * bits of fields measured here (two words of 30 bits, small integers for V8), shifted left by
 * HELD_BITS, and below it which held maps may hold it. A setting is held in the map of the section
 * whose line states it (`apply`), and a line's items are the fields of its section, so a field
 * that no settings section has is never held, and one of the ventilator only is looked for there.
 */
const HELD_IN_VENT = 1;
const HELD_IN_OXYGEN = 2;
const HELD_IN_PLACE = 4;
const HELD_IN_PATIENT = 8;
/** The SpO2 target, held in a place of its own (`CarryState.target`). */
const HELD_AS_TARGET = 16;
const HELD_BITS = 5;
const FIELD_SLOT: ReadonlyMap<string, number> = new Map(FIELDS.map((f, i) => [f.id, (i << HELD_BITS) | (f.id === TARGET ? HELD_AS_TARGET :
  (f.sections.includes('vent') ? HELD_IN_VENT : 0) | (f.sections.includes('oxygen') ? HELD_IN_OXYGEN : 0) |
  (f.sections.includes('place') ? HELD_IN_PLACE : 0) | (f.sections.includes('patient') ? HELD_IN_PATIENT : 0))]));
const MASK_BITS = 30;
if (FIELDS.length > 2 * MASK_BITS) throw new Error('timeline: too many fields for the bits of fields measured at a timepoint');

function freeze(index: number, line: number | null, label: string, startLine: number, time: TimepointTime, stated: readonly StatedValue[], endLine: number, state: CarryState, settings: Settings, ageYears: number | null): Timepoint {
  const values = new ValuesAt(index, time, state, stated);
  const gasUnit = gasUnitInForce(state, settings);
  return new TimepointAt(index, line, label, startLine, endLine, time, stated, values, barometricAt(state.place, settings), gasUnit, gasUnitWritten(stated) ?? gasUnit, ageYears);
}

/**
 * `barometricInForce` of the place held and the settings it was last asked for, kept with them: the
 * place held changes at few timepoints, and one from an altitude is a formula with powers.
 */
const LAST_PLACE: { place: HeldMap | null; settings: Settings | null; mmhg: number | null } = { place: null, settings: null, mmhg: null };

function barometricAt(place: HeldMap, settings: Settings): number | null {
  if (LAST_PLACE.place !== place || LAST_PLACE.settings !== settings) {
    LAST_PLACE.mmhg = barometricInForce(place, settings);
    LAST_PLACE.place = place;
    LAST_PLACE.settings = settings;
  }
  return LAST_PLACE.mmhg;
}

/** Fields whose values are gas pressures, in mmHg or kPa (the place's barometric pressure is a setting, not a gas). */
const GAS_PRESSURE_FIELDS: ReadonlySet<string> = new Set(FIELDS.filter((f) => f.id !== 'barometric' && f.units?.includes('kPa')).map((f) => f.id));

/** The unit the usable gas pressures among `stated` were read in, when there are some and they agree; else null. */
function gasUnitWritten(stated: readonly StatedValue[]): 'mmHg' | 'kPa' | null {
  let unit: 'mmHg' | 'kPa' | null = null;
  for (const s of stated) {
    if (!s.usable || (s.readUnit !== 'kPa' && s.readUnit !== 'mmHg') || !GAS_PRESSURE_FIELDS.has(s.fieldId)) continue;
    if (unit === null) unit = s.readUnit;
    else if (unit !== s.readUnit) return null;
  }
  return unit;
}

function originOf(held: Held, tp: number, at: TimepointTime): Origin {
  const { line } = held.stated;
  const span = held.stated.item.span;
  if (held.timepoint === tp) return { kind: 'here', line, span };
  if (held.timepoint < 0) return { kind: 'header', line, span };
  return { kind: 'carried', line, span, timepoint: held.timepoint, timepointLabel: held.label, fromTime: held.time, atTime: at };
}
