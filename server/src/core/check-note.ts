/**
 * The runner: analyses a note and runs every enabled check over it. Findings come back sorted
 * by position, each with its stable code and documentation anchor.
 */
import { analyseText, analyseTree, type NoteAnalysis } from './analysis/analyse';
import type { CheckContext, CheckDef, Report, TimepointContext } from './checks/check';
import type { Timepoint } from './analysis/model';
import { internalError } from './checks/internal';
import { CHECKS, docAnchor } from './checks/registry';
import { withDefaults, type Settings } from './settings';
import type { NoteTree } from './syntax/tree';
import { comparePositions, type Finding } from './types';
import { ownString } from './util/strings';
import { NONE } from './util/lists';
import { keptFor, SmallStore, type Kept } from './util/small-store';
import { derivationOf } from './derive/registry';

export interface NoteResult {
  readonly analysis: NoteAnalysis;
  readonly findings: readonly Finding[];
  /** The settings the note was analysed with. */
  readonly settings: Settings;
}

export function checkNote(text: string, settings: Partial<Settings> = {}): NoteResult {
  const full = withDefaults(settings);
  return runChecks(analyseText(text, full), full);
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

export function runChecks(analysis: NoteAnalysis, settings: Settings, checks: readonly CheckDef[] = CHECKS, cache?: TimepointFindingsCache): NoteResult {
  const findings: Finding[] = [];
  const disabled = new Set(settings.disabledChecks.map((d) => d.toLowerCase()));
  const enabled = checks.filter((c) => !disabled.has(c.code.toLowerCase()) && !disabled.has(c.alias));
  const failed = (check: CheckDef, error: unknown): Finding => toFinding(internalError, {
    range: { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } },
    message: `Check ${check.code} (${check.alias}) failed on this note: ${error instanceof Error ? error.message : String(error)}. Other checks still ran.`,
  });
  const noteShared = new SmallStore<Kept<unknown, CheckContext>, unknown>();
  for (const check of enabled) {
    const run = check.run;
    if (!run) continue;
    const ctx: CheckContext = {
      analysis,
      settings,
      report: (r: Report) => findings.push(toFinding(check, r)),
      shared<T>(value: Kept<T, CheckContext>): T { return keptFor(noteShared, value, this); },
    };
    try {
      run(ctx);
    } catch (error) {
      findings.push(failed(check, error));
    }
  }
  const perTimepoint = enabled.filter((c) => c.runTimepoint);
  // One context serves every timepoint check: the runner moves it from check to check and from
  // timepoint to timepoint (a big note has thousands of timepoints and dozens of checks).
  let current: CheckDef | null = null;
  let own: Finding[] = [];
  // Values shared by the checks of one timepoint: one store, emptied for each timepoint.
  const timepointShared = new SmallStore<Kept<unknown, TimepointContext>, unknown>();
  const ctx: { -readonly [K in keyof TimepointContext]: TimepointContext[K] } = {
    analysis,
    settings,
    timepoint: analysis.timeline.timepoints[0]!,
    derivation: derivationOf(0),
    report: (r: Report) => own.push(toFinding(current!, r)),
    shared<T>(value: Kept<T, TimepointContext>): T { return keptFor(timepointShared, value, ctx); },
  };
  const timepoints = analysis.timeline.timepoints;
  for (let i = 0; i < timepoints.length; i++) {
    const timepoint = timepoints[i]!;
    const known = cache?.get(timepoint);
    if (known) {
      for (const f of known) findings.push(f);
      continue;
    }
    ctx.timepoint = timepoint;
    ctx.derivation = analysis.derivation(i);
    timepointShared.clear();
    own = [];
    for (const check of perTimepoint) {
      current = check;
      try {
        check.runTimepoint!(ctx);
      } catch (error) {
        own.push(failed(check, error));
      }
    }
    cache?.set(timepoint, own);
    for (const f of own) findings.push(f);
  }
  // Codes are ASCII (`PN410`): compared by code unit, the same order on every machine and locale.
  findings.sort((a, b) => comparePositions(a.range.start, b.range.start) || (a.code < b.code ? -1 : a.code > b.code ? 1 : 0));
  return { analysis, findings, settings };
}

function toFinding(check: CheckDef, r: Report): Finding {
  return {
    code: check.code,
    severity: r.severity ?? check.severity,
    // Kept as long as the note: in one piece, not the tree of parts it was built from.
    message: ownString(r.message),
    range: r.range,
    fixes: r.fixes ?? NONE,
    docAnchor: docAnchor(check),
    ...(r.related ? { related: r.related } : {}),
  };
}
