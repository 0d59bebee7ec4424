/**
 * The runner: analyses a note and runs every enabled check over it. Findings come back sorted
 * by position, each with its stable code and documentation anchor.
 */
import { analyseText, analyseTree, type NoteAnalysis } from './analysis/analyse';
import type { CheckContext, CheckDef, Report } from './checks/check';
import { internalError } from './checks/internal';
import { CHECKS, docAnchor } from './checks/registry';
import { withDefaults, type Settings } from './settings';
import type { NoteTree } from './syntax/tree';
import { comparePositions, type Finding } from './types';

export interface NoteResult {
  readonly analysis: NoteAnalysis;
  readonly findings: readonly Finding[];
}

export function checkNote(text: string, settings: Partial<Settings> = {}): NoteResult {
  const full = withDefaults(settings);
  return runChecks(analyseText(text, full), full);
}

export function checkTree(tree: NoteTree, settings: Partial<Settings> = {}): NoteResult {
  const full = withDefaults(settings);
  return runChecks(analyseTree(tree, full), full);
}

export function runChecks(analysis: NoteAnalysis, settings: Settings, checks: readonly CheckDef[] = CHECKS): NoteResult {
  const findings: Finding[] = [];
  const disabled = new Set(settings.disabledChecks.map((d) => d.toLowerCase()));
  for (const check of checks) {
    if (disabled.has(check.code.toLowerCase()) || disabled.has(check.alias)) continue;
    const ctx: CheckContext = {
      analysis,
      settings,
      report: (r: Report) => findings.push(toFinding(check, r)),
    };
    try {
      check.run(ctx);
    } catch (error) {
      findings.push(toFinding(internalError, {
        range: { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } },
        message: `Check ${check.code} (${check.alias}) failed on this note: ${error instanceof Error ? error.message : String(error)}. Other checks still ran.`,
      }));
    }
  }
  findings.sort((a, b) => comparePositions(a.range.start, b.range.start) || a.code.localeCompare(b.code));
  return { analysis, findings };
}

function toFinding(check: CheckDef, r: Report): Finding {
  return {
    code: check.code,
    severity: r.severity ?? check.severity,
    message: r.message,
    range: r.range,
    fixes: r.fixes ?? [],
    docAnchor: docAnchor(check),
    ...(r.related ? { related: r.related } : {}),
  };
}
