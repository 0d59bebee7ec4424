/**
 * The runner: analyses a note and runs every enabled check over it. Findings come back sorted
 * by position, each with its stable code and documentation anchor.
 *
 * Timepoint-scoped findings are a function of the timepoint (its lines, values in force and
 * derived values) and the settings, so a session keeps them per timepoint object
 * (`TimepointFindingsCache`). When lines are added or removed before a timepoint, the session
 * relocates it (see `buildTimelineIncremental`) and moves its findings with `relocateFindings`:
 * every range (the finding's, its related places', its fixes' edits) through the same
 * `LineShift`, and the lines their words name (`FiO2 carried from line 12`; messages write line
 * numbers as `line N`) through the same shift. Findings that cannot be moved so are made again:
 * one with a range on a changed line, or whose words name a changed line or quote note text that
 * looks like a line number (see `moveLineNames`).
 */
import { analyseText, analyseTree, type NoteAnalysis } from './analysis/analyse';
import type { CheckContext, CheckDef, Report, TimepointContext } from './checks/check';
import { moveLineNames, shiftedLine, type LineShift, type Timepoint } from './analysis/model';
import { internalError } from './checks/internal';
import { CHECKS, docAnchor } from './checks/registry';
import { withDefaults, type Settings } from './settings';
import { rangeBetween, type NoteTree } from './syntax/tree';
import { comparePositions, type Finding, type Fix, type Range } from './types';
import { ownString } from './util/strings';
import { NONE } from './util/lists';
import { keptFor, SmallStore, type Kept } from './util/small-store';
import { derivationOf } from './derive/registry';
import type { TimepointDerivation } from './derive/model';

export interface NoteResult {
  readonly analysis: NoteAnalysis;
  readonly findings: readonly Finding[];
  /** The settings the note was analysed with. */
  readonly settings: Settings;
}

export interface CheckOptions {
  /**
   * Keep the derivation of each timepoint the checks made (with the derived values they read)
   * in the result's `analysis.derivation`, for a caller that reads every timepoint's derived values
   * next (an export): it then finishes what the checks began instead of deriving every timepoint
   * again. Only for notes of up to `KEEP_DERIVATIONS_UP_TO` timepoints; a bigger one derives
   * on request as always, so that it does not hold all its derivations at once.
   */
  readonly keepDerivations?: boolean;
}

/**
 * The most timepoints of a note whose derivations `keepDerivations` keeps: far above a day's note
 * (the bench notes have 5 to 35), and few enough that the kept derivations stay some megabytes.
 */
export const KEEP_DERIVATIONS_UP_TO = 4096;

export function checkNote(text: string, settings: Partial<Settings> = {}, options?: CheckOptions): NoteResult {
  const full = withDefaults(settings);
  return runChecks(analyseText(text, full), full, CHECKS, undefined, options?.keepDerivations === true);
}

export function checkTree(tree: NoteTree, settings: Partial<Settings> = {}): NoteResult {
  const full = withDefaults(settings);
  return runChecks(analyseTree(tree, full), full);
}

/**
 * Findings of timepoint-scoped checks, kept per timepoint object: a session passes the same
 * cache to each run, and a timepoint reused from the previous run keeps its findings.
 */
export type TimepointFindingsCache = WeakMap<Timepoint, readonly Finding[]>;

export function runChecks(analysis: NoteAnalysis, settings: Settings, checks: readonly CheckDef[] = CHECKS, cache?: TimepointFindingsCache, keepDerivations = false): NoteResult {
  const findings: Finding[] = [];
  const enabled = enabledChecks(checks, settings.disabledChecks);
  // A session keeps findings across versions of the text (see `ownMessage`); a result of one run keeps its tree.
  const copyMessages = cache !== undefined;
  const failed = (check: CheckDef, error: unknown): Finding => toFinding(internalError, copyMessages, {
    range: { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } },
    message: `Check ${check.code} (${check.alias}) failed on this note: ${error instanceof Error ? error.message : String(error)}. Other checks still ran.`,
  });
  // One context serves every check of the note, and one every timepoint check: the runner moves
  // `current` from check to check (and the timepoint context from timepoint to timepoint). A
  // context per check (with its two functions) made most of what the runner allocated.
  let current: CheckDef | null = null;
  const noteShared = new SmallStore<Kept<unknown, CheckContext>, unknown>();
  const noteCtx: CheckContext = {
    analysis,
    settings,
    report: (r: Report) => findings.push(toFinding(current!, copyMessages, r)),
    shared<T>(value: Kept<T, CheckContext>): T { return keptFor(noteShared, value, noteCtx); },
  };
  for (let k = 0; k < enabled.length; k++) {
    const check = enabled[k]!;
    const run = check.run;
    if (!run) continue;
    current = check;
    try {
      run(noteCtx);
    } catch (error) {
      findings.push(failed(check, error));
    }
  }
  const perTimepoint = enabled.filter((c) => c.runTimepoint);
  let own: Finding[] = [];
  const gathered: Finding[] = [];
  // Values shared by the checks of one timepoint: one store, emptied for each timepoint.
  const timepointShared = new SmallStore<Kept<unknown, TimepointContext>, unknown>();
  const ctx: { -readonly [K in keyof TimepointContext]: TimepointContext[K] } = {
    analysis,
    settings,
    timepoint: analysis.timeline.timepoints[0]!,
    derivation: derivationOf(0),
    report: (r: Report) => own.push(toFinding(current!, copyMessages, r)),
    shared<T>(value: Kept<T, TimepointContext>): T { return keptFor(timepointShared, value, ctx); },
  };
  const timepoints = analysis.timeline.timepoints;
  const kept = keepDerivations && timepoints.length <= KEEP_DERIVATIONS_UP_TO ? new Array<TimepointDerivation | undefined>(timepoints.length) : null;
  for (let i = 0; i < timepoints.length; i++) {
    const timepoint = timepoints[i]!;
    const known = cache?.get(timepoint);
    if (known) {
      for (const f of known) findings.push(f);
      continue;
    }
    ctx.timepoint = timepoint;
    ctx.derivation = analysis.derivation(i);
    if (kept !== null) kept[i] = ctx.derivation;
    timepointShared.clear();
    // Without a cache the timepoint's findings go straight into the note's list (sorted below):
    // no list per timepoint to make and copy. With one they are gathered in `gathered`, and the
    // cache keeps a copy of their exact length (a list grown by `push` keeps room for 17), or the
    // shared empty list: a big note has thousands of timepoints, most with no finding.
    own = cache ? gathered : findings;
    for (let k = 0; k < perTimepoint.length; k++) {
      const check = perTimepoint[k]!;
      current = check;
      try {
        check.runTimepoint!(ctx);
      } catch (error) {
        own.push(failed(check, error));
      }
    }
    if (cache) {
      cache.set(timepoint, own.length === 0 ? NONE : own.slice());
      for (const f of own) findings.push(f);
      own.length = 0;
    }
  }
  // Codes are ASCII (`PN410`): compared by code unit, the same order on every machine and locale.
  findings.sort((a, b) => comparePositions(a.range.start, b.range.start) || (a.code < b.code ? -1 : a.code > b.code ? 1 : 0));
  return { analysis: kept === null ? analysis : withDerivations(analysis, kept), findings, settings };
}

/**
 * The checks not switched off by `disabled` (codes in any case, or aliases): all of them when none is
 * (the usual settings), without lower-casing every code for every note.
 */
function enabledChecks(checks: readonly CheckDef[], disabled: readonly string[]): readonly CheckDef[] {
  if (disabled.length === 0) return checks;
  const off = new Set(disabled.map((d) => d.toLowerCase()));
  return checks.filter((c) => !off.has(c.code.toLowerCase()) && !off.has(c.alias));
}

/** The analysis with the derivations the checks made (a timepoint with none is derived when asked, as always). */
function withDerivations(analysis: NoteAnalysis, kept: readonly (TimepointDerivation | undefined)[]): NoteAnalysis {
  const derive = analysis.derivation;
  return { tree: analysis.tree, timeline: analysis.timeline, derivation: (index) => kept[index] ?? derive(index) };
}

/**
 * The message of the last finding, as a string of its own (`ownString`), for a session: it keeps
 * a timepoint's findings across versions of the text, and a message that quotes the note (a slice
 * of a line, itself a slice of the whole text) would keep every version alive; a message made of
 * parts would keep them all. Runs of findings with the same message (a bare `@` on every line of a
 * note) share it rather than keep a copy each. The text it was made from is not kept.
 *
 * A single run (`checkNote`) keeps its messages as they were made: its result holds the note's
 * tree, whose lines are slices of the text anyway, and the copy (a new string per finding) was
 * 4 % of all that checkNote allocated on the bench corpus, for findings most callers read once
 * and drop.
 */
let LAST_MESSAGE = '';

function ownMessage(message: string): string {
  if (message !== LAST_MESSAGE) LAST_MESSAGE = ownString(message);
  return LAST_MESSAGE;
}

function toFinding(check: CheckDef, copyMessage: boolean, r: Report): Finding {
  const code = check.code;
  const severity = r.severity ?? check.severity;
  const message = copyMessage ? ownMessage(r.message) : r.message;
  const fixes = r.fixes ?? NONE;
  const anchor = docAnchor(check);
  // Two classes rather than a spread of `related`: no object made only to be spread, and each makes
  // its findings of one shape.
  return r.related
    ? new RelatedFinding(code, severity, message, r.range, fixes, anchor, r.related)
    : new PlainFinding(code, severity, message, r.range, fixes, anchor);
}

/**
 * Findings are made by constructors, not object literals: V8 would pretenure a literal whose
 * objects all survive, and old findings would keep the young parts of every earlier result alive
 * through young-generation collections (see the performance notes in DEVELOPERS.md).
 */
class PlainFinding implements Finding {
  constructor(readonly code: string, readonly severity: Finding['severity'], readonly message: string, readonly range: Range, readonly fixes: readonly Fix[], readonly docAnchor: string) {}
}

class RelatedFinding implements Finding {
  constructor(readonly code: string, readonly severity: Finding['severity'], readonly message: string, readonly range: Range, readonly fixes: readonly Fix[], readonly docAnchor: string, readonly related: NonNullable<Finding['related']>) {}
}

/**
 * The findings of a timepoint moved with its lines (see the module comment), or null when one of
 * them cannot be: it has a range on a changed line, or words `moveLineNames` cannot move.
 */
export function relocateFindings(findings: readonly Finding[], shift: LineShift): readonly Finding[] | null {
  if (findings.length === 0) return findings;
  const out: Finding[] = [];
  for (const f of findings) {
    const message = moveLineNames(shift, f.message);
    const range = moveRange(f.range, shift);
    if (message === null || !range) return null;
    let fixes: readonly Fix[] = f.fixes;
    if (fixes.length > 0) {
      const moved: Fix[] = [];
      for (const fix of fixes) {
        const title = moveLineNames(shift, fix.title);
        if (title === null) return null;
        const edits = [];
        for (const e of fix.edits) {
          const r = moveRange(e.range, shift);
          const newText = moveLineNames(shift, e.newText);
          if (!r || newText === null) return null;
          edits.push({ ...e, range: r, newText });
        }
        moved.push({ ...fix, title, edits });
      }
      fixes = moved;
    }
    let related: { readonly range: Range; readonly message: string }[] | undefined;
    if (f.related) {
      related = [];
      for (const r of f.related) {
        const at = moveRange(r.range, shift);
        const words = moveLineNames(shift, r.message);
        if (!at || words === null) return null;
        related.push({ ...r, range: at, message: words });
      }
    }
    out.push(related
      ? new RelatedFinding(f.code, f.severity, message, range, fixes, f.docAnchor, related)
      : new PlainFinding(f.code, f.severity, message, range, fixes, f.docAnchor));
  }
  return out;
}

/** A range moved through `shift`; null when it touches a changed line. */
function moveRange(range: Range, shift: LineShift): Range | null {
  const start = shiftedLine(shift, range.start.line);
  const end = shiftedLine(shift, range.end.line);
  if (start === null || end === null) return null;
  if (start === range.start.line && end === range.end.line) return range;
  return rangeBetween(start, range.start.character, end, range.end.character);
}
