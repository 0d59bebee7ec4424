/**
 * What a check is. Each check has a stable code (never reused), a readable alias, a default
 * severity, tags, its documentation (generated into docs/checks.md) and its source.
 * `run` reports findings through the context; a check that throws is caught by the runner
 * and becomes an internal finding, never a crash.
 */
import type { NoteAnalysis } from '../analysis/analyse';
import type { InputValue, Timepoint } from '../analysis/model';
import type { TimepointDerivation } from '../derive/model';
import type { Settings } from '../settings';
import type { LineNode } from '../syntax/tree';
import type { Fix, Range, Severity } from '../types';
import type { Kept } from '../util/small-store';
import { NONE } from '../util/lists';

export interface CheckDoc {
  /** What makes it fire, in a sentence or two. */
  readonly fires: string;
  /** A note excerpt on which it fires. */
  readonly example: string;
  /** How to make it go away (the right way). */
  readonly fix: string;
}

export interface Report {
  readonly range: Range;
  readonly message: string;
  readonly fixes?: readonly Fix[];
  readonly related?: readonly { readonly range: Range; readonly message: string }[];
  /** Overrides the check's default severity for this finding. */
  readonly severity?: Severity;
}

export interface CheckContext {
  readonly analysis: NoteAnalysis;
  readonly settings: Settings;
  report(finding: Report): void;
  /**
   * A value several checks need, computed by the first that asks and shared by the others: for
   * the whole run in `run`, for the timepoint in `runTimepoint`. Defined once, at module level.
   */
  shared<T>(value: Kept<T, CheckContext>): T;
}

/** What a timepoint-scoped check sees: one timepoint and its derived values. */
export interface TimepointContext extends CheckContext {
  readonly timepoint: Timepoint;
  readonly derivation: TimepointDerivation;
  /** A value the checks of this timepoint share (see `CheckContext.shared`). */
  shared<T>(value: Kept<T, TimepointContext>): T;
}

export type CheckTag = 'syntax' | 'units' | 'plausibility' | 'timeline' | 'physiology' | 'interpretation' | 'privacy' | 'internal';

export interface CheckDef {
  readonly code: string;
  readonly alias: string;
  readonly title: string;
  readonly severity: Severity;
  readonly tags: readonly CheckTag[];
  readonly doc: CheckDoc;
  /** Published source, "common practice, no source", or "format rule" for grammar checks. */
  readonly source: string;
  /** A check over the whole note. */
  readonly run?: (ctx: CheckContext) => void;
  /**
   * A check of one timepoint at a time: its findings depend only on that timepoint (its lines,
   * values in force and derived values), so a session reuses them while the timepoint is unchanged.
   */
  readonly runTimepoint?: (ctx: TimepointContext) => void;
}

/**
 * A check as an object of one shape (every property present, in one order): the runner reads
 * checks for every timepoint and every finding, and definitions of many shapes would slow each read.
 */
export function defineCheck(def: CheckDef): CheckDef {
  return {
    code: def.code, alias: def.alias, title: def.title, severity: def.severity, tags: def.tags, doc: def.doc, source: def.source,
    run: def.run, runTimepoint: def.runTimepoint,
  };
}

/**
 * The lines a check of single lines visits: `run` covers the note's header (the lines before
 * the first timepoint) and `runTimepoint` each timepoint's lines, so an editing session keeps
 * the findings of unchanged timepoints instead of visiting every line of the note again.
 */
export function headerLineCount(analysis: NoteAnalysis): number {
  const first = analysis.timeline.timepoints[0];
  return first ? first.startLine : analysis.tree.lines.length;
}

/**
 * Visits a timepoint's lines (by index: no copy of the list per check and timepoint). `visit`
 * receives the context, so a check defines it once rather than once per timepoint.
 */
export function forTimepointLines(ctx: TimepointContext, visit: (ctx: TimepointContext, node: LineNode) => void): void {
  const lines = ctx.analysis.tree.lines;
  const end = Math.min(ctx.timepoint.endLine + 1, lines.length);
  for (let i = ctx.timepoint.startLine; i < end; i++) visit(ctx, lines[i]!);
}

/**
 * Visits the lines of a timepoint that have syntax issues, in order: the checks that report the
 * parser's issues (eight of them) share one pass over the timepoint's lines, and most timepoints
 * have no such line.
 */
export function forTimepointIssueLines(ctx: TimepointContext, visit: (ctx: TimepointContext, node: LineNode) => void): void {
  const lines = ctx.shared(ISSUE_LINES);
  for (let i = 0; i < lines.length; i++) visit(ctx, lines[i]!);
}

const ISSUE_LINES: Kept<readonly LineNode[], TimepointContext> = {
  name: 'lines with syntax issues',
  compute(ctx) {
    const lines = ctx.analysis.tree.lines;
    const end = Math.min(ctx.timepoint.endLine + 1, lines.length);
    let found: LineNode[] | null = null;
    for (let i = ctx.timepoint.startLine; i < end; i++) if (lines[i]!.issues.length > 0) (found ??= []).push(lines[i]!);
    return found ?? NONE;
  },
};

/** Visits the note's header lines (those before the first timepoint). */
export function forHeaderLines(ctx: CheckContext, visit: (ctx: CheckContext, node: LineNode) => void): void {
  const lines = ctx.analysis.tree.lines;
  const end = headerLineCount(ctx.analysis);
  for (let i = 0; i < end; i++) visit(ctx, lines[i]!);
}

/** The value in force of `id` at a timepoint (stated there or carried), when it is usable and has a number; else null. */
export function usableNumber(tp: Timepoint, id: string): { input: InputValue; value: number } | null {
  const input = tp.values.get(id);
  if (!input?.stated.usable || input.stated.value === null) return null;
  return { input, value: input.stated.value };
}
