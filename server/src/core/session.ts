/**
 * A note that changes over time (an open editor document). `update` returns what `checkNote`
 * returns on the new text, reusing what did not change:
 * - lines: a line whose text is unchanged keeps its parsed items (found by matching the
 *   unchanged lines at the start and at the end of the note);
 * - timepoints: a timepoint whose lines and incoming carried values are unchanged keeps its
 *   values and derived values (see `buildTimelineIncremental`).
 * - findings: timepoint-scoped checks keep their findings for a reused timepoint; the few
 *   note-scoped checks run over the whole note each time.
 * - lines added or removed (Enter, a line deleted, a line pasted): the lines after the changed
 *   stretch keep their parsed items in copies of their nodes with the new line numbers, and the
 *   parse hands the timeline the `LineShift` from the old line numbers to the new. A later
 *   timepoint whose lines and carried inputs are the same once moved is relocated by the
 *   timeline (a copy with its line numbers moved), and its findings are moved with it
 *   (`relocateFindings`) instead of being checked again. Lines before the change keep their
 *   nodes and their timepoints keep their objects, as for an edit within a line.
 */
import { relocateFindings, runChecks, type NoteResult, type TimepointFindingsCache } from './check-note';
import { buildTimelineIncremental, type TimelineCache } from './analysis/timeline';
import { deriverFor } from './analysis/analyse';
import type { LineShift } from './analysis/model';
import { withDefaults, type Settings } from './settings';
import { firstEol, movedLine, parseLine, splitLines } from './syntax/parser';
import type { LineNode, NoteTree } from './syntax/tree';
import { ownString } from './util/strings';

export interface SessionStats {
  /** Lines parsed anew by the last update. */
  readonly parsedLines: number;
  /** Timepoints kept as they were (their values, derived values and findings reused). */
  readonly reusedTimepoints: number;
  /**
   * Timepoints moved with lines added or removed before them: copies of the last run's with their
   * line numbers moved, and their findings moved with them (neither read nor checked again). The
   * others (`timepoints - reusedTimepoints - relocatedTimepoints`) were checked again.
   */
  readonly relocatedTimepoints: number;
  readonly timepoints: number;
}

export class NoteSession {
  private settings: Settings;
  private last: NoteResult | null = null;
  private lastText: string | null = null;
  /** Start offset of each line of `lastText`. */
  private starts: number[] = [];
  private timelineCache: TimelineCache | null = null;
  private findings: TimepointFindingsCache = new WeakMap();
  /** The last answer of `changed`. */
  private lastChange: { readonly old: string; readonly text: string; readonly prefix: number; readonly suffix: number } | null = null;
  /** The last update was a step of `steps` short of the whole note. */
  private partial = false;
  private statsValue: SessionStats = { parsedLines: 0, reusedTimepoints: 0, relocatedTimepoints: 0, timepoints: 0 };

  constructor(settings: Partial<Settings> = {}) {
    this.settings = ownSettings(settings);
  }

  setSettings(settings: Partial<Settings>): void {
    this.settings = ownSettings(settings);
    this.forget();
  }

  /**
   * Drops what the next update would reuse, so it reads the note afresh: after a change of
   * settings, and after an update that failed part-way (its line starts may already describe a
   * text whose analysis never finished).
   */
  private forget(): void {
    this.lastText = null;
    this.lastChange = null;
    this.starts = [];
    this.timelineCache = null;
    this.findings = new WeakMap();
    this.partial = false;
  }

  get result(): NoteResult | null {
    return this.last;
  }

  /** The length of the text the session has read (all of the last update's, or what steps have read of it so far). */
  get readLength(): number {
    return this.lastText?.length ?? 0;
  }

  get stats(): SessionStats {
    return this.statsValue;
  }

  update(text: string): NoteResult {
    this.partial = false;
    if (this.last && text === this.lastText) return this.last;
    try {
      const { tree, parsed, shift } = this.parse(text);
      this.lastChange = null; // it holds the old text
      const { timeline, cache, moved } = buildTimelineIncremental(tree, this.settings, this.timelineCache, shift);
      this.timelineCache = cache;
      // A timepoint the timeline reused is the object of the last run, whose findings are kept
      // (counted here by timepoint: the lines before the first `@` are a block, not one). A timepoint
      // it relocated takes the findings of the one it was copied from, moved the same way, unless
      // they cannot be moved safely (they are then made again by the checks).
      const timepoints = timeline.timepoints;
      let reused = 0;
      let relocated = 0;
      for (let i = 0; i < timepoints.length; i++) {
        const tp = timepoints[i]!;
        if (this.findings.has(tp)) {
          reused++;
          continue;
        }
        const from = shift ? moved.get(tp) : undefined;
        const known = from ? this.findings.get(from) : undefined;
        const findings = known && shift ? relocateFindings(known, shift) : null;
        if (findings) {
          this.findings.set(tp, findings);
          relocated++;
        }
      }
      // Derived values are computed for the timepoints whose findings are not kept from the last
      // run, and then dropped (see NoteAnalysis.derivation).
      this.last = runChecks({ tree, timeline, derivation: deriverFor(timeline, this.settings) }, this.settings, undefined, this.findings);
      this.lastText = text;
      this.statsValue = { parsedLines: parsed, reusedTimepoints: reused, relocatedTimepoints: relocated, timepoints: timepoints.length };
      return this.last;
    } catch (error) {
      // The parse may have moved the line starts to `text` already: the next update must not read
      // its text against them (a caller such as the server logs the error and goes on).
      this.forget();
      throw error;
    }
  }

  /**
   * `update(text)` in steps, when much is to be read: a note the session has not read yet (the
   * first analysis of an open note, or the first after a change of settings), or a change of
   * more than `linesPerStep` lines (a pasted note, a whole note converted to other units). Each
   * step reads about `linesPerStep` more lines of the new text (up to the start of a timepoint,
   * so no timepoint is read twice) through `update`, which reuses what was read before. A caller
   * yields between steps so a big note never holds up anything else; the generator's return
   * value is `update(text)`, and `next(lines)` sets the size of the steps that follow. It stops
   * early when something else brought the session to `text` in between (a request that needed
   * the result). A small edit is one step.
   */
  *steps(text: string, linesPerStep = 1500): Generator<void, NoteResult, number | undefined> {
    let at = this.stepsFrom(text, linesPerStep);
    if (at !== null) {
      let lines = linesPerStep;
      for (;;) {
        at = nextCut(text, at, lines);
        if (at >= text.length) break;
        this.update(text.slice(0, at));
        this.partial = true;
        // The caller may size the next step (`next(lines)`), e.g. to fit a time budget.
        const asked = yield;
        if (asked !== undefined && asked >= 1) lines = Math.floor(asked);
        if (this.lastText === text) return this.last!;
      }
    }
    return this.update(text);
  }

  /** Whether `steps(text, linesPerStep)` would read in more than one step. */
  wouldStep(text: string, linesPerStep = 1500): boolean {
    const from = this.stepsFrom(text, linesPerStep);
    return from !== null && nextCut(text, from, linesPerStep) < text.length;
  }

  /** Where reading in steps starts (the start of the change), or null for one step. */
  private stepsFrom(text: string, linesPerStep: number): number | null {
    const old = this.lastText;
    if (old === null) return 0;
    if (old === text) return null;
    const { prefix, suffix } = this.changed(old, text);
    // Steps left unfinished (the note changed meanwhile) go on from what they had read.
    if (this.partial) return prefix;
    return linesBetween(text, prefix, text.length - suffix, linesPerStep) > linesPerStep ? prefix : null;
  }

  /**
   * The lengths of the common start and end of two texts (the changed stretch lies between). The
   * last answer is kept: a server asks about the same two texts before and while updating.
   */
  private changed(old: string, text: string): { readonly prefix: number; readonly suffix: number } {
    const known = this.lastChange;
    if (known && known.old === old && known.text === text) return known;
    const prefix = commonPrefix(old, text);
    const suffix = commonSuffix(old, text, Math.min(old.length, text.length) - prefix);
    this.lastChange = { old, text, prefix, suffix };
    return this.lastChange;
  }

  /**
   * The new tree: the lines before and after the changed stretch of text keep their nodes (a
   * line after it moves when lines were added or removed); only the lines in between are split
   * and parsed. The changed stretch is found by comparing the texts from both ends, so an edit
   * costs a few block comparisons of the text plus the changed lines, not a split of the note.
   * When lines were added or removed, `shift` maps the old line numbers to the new ones.
   */
  private parse(text: string): { tree: NoteTree; parsed: number; shift: LineShift | null } {
    const before = this.last?.analysis.tree.lines;
    const old = this.lastText;
    if (!before || old === null || this.starts.length !== before.length) {
      const { lines, eol } = splitLines(text);
      const nodes = new Array<LineNode>(lines.length);
      const starts = new Array<number>(lines.length);
      for (let i = 0; i < lines.length; i++) {
        nodes[i] = parseLine(lines[i]!.text, i);
        starts[i] = lines[i]!.offset;
      }
      this.starts = starts;
      return { tree: { lines: nodes, eol }, parsed: lines.length, shift: null };
    }
    const m = before.length;
    const oldStarts = this.starts;
    const { prefix, suffix } = this.changed(old, text);
    // A leading line is unchanged when its text, its terminator and the first character after
    // it lie in the common prefix (so a lone `\r` cannot have become `\r\n`).
    let head = 0;
    while (head < m - 1 && oldStarts[head + 1]! < prefix) head++;
    // A trailing line is unchanged when the character before it (the end of the terminator
    // before it) lies in the common suffix: it then starts right after that character in both.
    const suffixStart = old.length - suffix;
    let tail = 0;
    while (tail < m - head && oldStarts[m - 1 - tail]! - 1 >= suffixStart && m - 1 - tail > head) tail++;
    const delta = text.length - old.length;
    const midStart = oldStarts[head]!;
    const midEnd = tail > 0 ? oldStarts[m - tail]! + delta : text.length;
    const split = splitLines(ownString(text.slice(midStart, midEnd)));
    // With lines after the stretch, the stretch ends with a terminator: its empty last piece is not a line.
    const middle = tail > 0 ? split.lines.slice(0, -1) : split.lines;
    const n = head + middle.length + tail;
    const nodes = new Array<LineNode>(n);
    // The line starts are the session's own: with as many lines as before (an edit within lines)
    // they are updated in place. A big note's list is a large object, and a new one per edit costs
    // page faults on a small machine.
    const starts = n === m ? oldStarts : new Array<number>(n);
    for (let i = 0; i < head; i++) {
      nodes[i] = before[i]!;
      if (starts !== oldStarts) starts[i] = oldStarts[i]!;
    }
    for (let k = 0; k < middle.length; k++) {
      const i = head + k;
      nodes[i] = parseLine(middle[k]!.text, i);
      starts[i] = midStart + middle[k]!.offset;
    }
    for (let k = 0; k < tail; k++) {
      const i = n - tail + k;
      const node = before[m - tail + k]!;
      nodes[i] = node.line === i ? node : movedLine(node, i);
      // In place (n === m) the index is the same on both sides: each start is read before it is written.
      starts[i] = oldStarts[m - tail + k]! + delta;
    }
    this.starts = starts;
    // Old lines before `head` keep their numbers, old lines from `m - tail` on move by `n - m`.
    const shift = n === m ? null : { head, end: m - tail, delta: n - m };
    return { tree: { lines: nodes, eol: firstEol(text) }, parsed: middle.length, shift };
  }
}

/**
 * The settings a session keeps: its own frozen copy, so a caller that changes the object it passed
 * (a `disabledChecks` list pushed onto) cannot leave findings kept under the old settings beside
 * findings made under the new ones. Settings change through `setSettings`.
 */
function ownSettings(partial: Partial<Settings>): Settings {
  const full = withDefaults(partial);
  return Object.freeze({ ...full, disabledChecks: Object.freeze([...full.disabledChecks]) as string[] });
}

/** Line ends in `text[from, to)`, counted up to just over `limit`. */
function linesBetween(text: string, from: number, to: number, limit: number): number {
  let count = 0;
  for (let i = from; i < to && count <= limit; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x0a || (c === 0x0d && text.charCodeAt(i + 1) !== 0x0a)) count++;
  }
  return count;
}

/**
 * Where a step of `steps` ends: the start of the first timepoint line (`@` first on its line)
 * after `lines` more lines from `from`, or of any line after twice as many; the text's length
 * when it ends before. Line terminators are `\n`, `\r\n` and `\r`, as for the parser.
 */
export function nextCut(text: string, from: number, lines: number): number {
  let count = 0;
  for (let i = from; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c !== 0x0a && c !== 0x0d) continue;
    if (c === 0x0d && text.charCodeAt(i + 1) === 0x0a) i++;
    count++;
    const start = i + 1;
    if (start >= text.length) return text.length;
    if (count >= 2 * lines || (count >= lines && text.charCodeAt(start) === 0x40 /* @ */)) return start;
  }
  return text.length;
}

/** Characters compared at once when looking for the changed stretch (string equality is a block compare). */
const BLOCK = 1024;

function commonPrefix(a: string, b: string): number {
  const limit = Math.min(a.length, b.length);
  let i = 0;
  while (i + BLOCK <= limit && a.substring(i, i + BLOCK) === b.substring(i, i + BLOCK)) i += BLOCK;
  while (i < limit && a.charCodeAt(i) === b.charCodeAt(i)) i++;
  return i;
}

/** Length of the common end of `a` and `b`, at most `limit`. */
function commonSuffix(a: string, b: string, limit: number): number {
  let k = 0;
  while (k + BLOCK <= limit && a.substring(a.length - k - BLOCK, a.length - k) === b.substring(b.length - k - BLOCK, b.length - k)) k += BLOCK;
  while (k < limit && a.charCodeAt(a.length - 1 - k) === b.charCodeAt(b.length - 1 - k)) k++;
  return k;
}
