/**
 * Editor-neutral result types shared by the core, the language server and the CLI.
 * Positions count lines from 0 and characters in UTF-16 code units, as LSP does.
 */

export interface Position {
  readonly line: number;
  readonly character: number;
}

export interface Range {
  readonly start: Position;
  readonly end: Position;
}

export type Severity = 'error' | 'warning' | 'information' | 'hint';

export const SEVERITY_RANK: Readonly<Record<Severity, number>> = {
  error: 3,
  warning: 2,
  information: 1,
  hint: 0,
};

/** One text replacement. Several edits in one fix never overlap. */
export interface TextEdit {
  readonly range: Range;
  readonly newText: string;
}

export interface Fix {
  readonly title: string;
  readonly edits: readonly TextEdit[];
  /** Safe to apply without looking (used by "fix all of this kind"). */
  readonly preferred?: boolean;
}

export interface Finding {
  /** Stable code from the check registry, e.g. `PN301`. */
  readonly code: string;
  readonly severity: Severity;
  readonly message: string;
  readonly range: Range;
  readonly fixes: readonly Fix[];
  /** Where the check's documentation lives (anchor in docs/checks.md). */
  readonly docAnchor: string;
  /** Other places that explain the finding (e.g. where a carried value was stated). */
  readonly related?: readonly { readonly range: Range; readonly message: string }[];
}

export function rangeOnLine(line: number, start: number, end: number): Range {
  return { start: { line, character: start }, end: { line, character: end } };
}

export function comparePositions(a: Position, b: Position): number {
  return a.line - b.line || a.character - b.character;
}
