/**
 * The syntax tree of a note. Every line of the text has exactly one node, so the tree is
 * complete even when lines are broken. Ranges are line-relative character offsets (UTF-16)
 * plus the node's line number; `toRange` turns a span into an editor range.
 */
import type { Fix, Position, Range, Severity } from '../types';
import type { FieldDef } from '../fields/registry';
import type { SectionId } from '../fields/sections';
import { NONE } from '../util/lists';

/** A half-open span [start, end) of UTF-16 code units within one line. */
export interface Span {
  readonly start: number;
  readonly end: number;
}

export interface Token {
  readonly text: string;
  readonly span: Span;
}

export interface NumberValue {
  readonly kind: 'number';
  readonly text: string;
  /** The number as read; a decimal comma is read as a point. */
  readonly value: number;
  readonly span: Span;
  readonly decimalComma: boolean;
}

export interface PairValue {
  readonly kind: 'pair';
  readonly text: string;
  readonly parts: readonly NumberValue[];
  readonly span: Span;
}

export interface WordValue {
  readonly kind: 'word';
  readonly text: string;
  readonly span: Span;
}

export type ValueNode = NumberValue | PairValue | WordValue;

/**
 * One `key value [unit]` item. `key` is null when the key is implied by position
 * (a shorthand gas part, a device's flow, the device word itself, the mean in brackets after a
 * blood pressure: `bp 120/80 (93)`).
 */
export interface ItemNode {
  readonly key: Token | null;
  /** The key the item stands for, lower case (implied keys use the canonical key). */
  readonly keyName: string;
  readonly implied: 'shorthand' | 'device' | 'device-flow' | 'bracketed-mean' | null;
  /** The field the key names in the line's section; null for a key the section does not have. */
  readonly field: FieldDef | null;
  readonly value: ValueNode | null;
  readonly unit: Token | null;
  readonly span: Span;
  /** The kind of `value`, null for none (read without building the value). */
  readonly valueKind: ValueNode['kind'] | null;
  /** The number of a number value, null otherwise (read without building the value). */
  readonly number: number | null;
  /** The text of `unit`, null for none (read without building the token). */
  readonly unitText: string | null;
  /** Whether a number of the value was written with a decimal comma (asked without building the value). */
  hasDecimalComma(): boolean;
}

/** A problem the parser found, reported by the syntax checks under the check's alias. */
export interface SyntaxIssue {
  readonly check: SyntaxCheckAlias;
  readonly span: Span;
  readonly message: string;
  readonly fixes: readonly LineFix[];
  /** Set when the finding is lighter than its check's default (a full stop or a comma that separates nothing). */
  readonly severity?: Severity;
}

/** A fix confined to one line: spans are on the issue's own line. */
export interface LineFix {
  readonly title: string;
  readonly edits: readonly LineEdit[];
  readonly preferred?: boolean;
}

/**
 * An edit of a fix: on the line of its finding, or (`line`) on another line of the note, such as
 * the other line of a timepoint that states one value twice; to `span.end` on `endLine` where it
 * runs over lines (the removal of a whole line: from its start to the start of the next).
 */
export interface LineEdit {
  readonly span: Span;
  readonly newText: string;
  readonly line?: number;
  readonly endLine?: number;
}

export type SyntaxCheckAlias =
  | 'unknown-section'
  | 'missing-value'
  | 'decimal-comma'
  | 'bad-time'
  | 'stray-text'
  | 'bad-shorthand'
  | 'venturi-setting'
  | 'high-flow-percent';

export interface TimeSpec {
  readonly kind: 'clock' | 'offset' | 'day';
  /** Day number (1-based) when written. */
  readonly day: number | null;
  /** Minutes after midnight for 'clock', or the offset in minutes for 'offset'. */
  readonly minutes: number | null;
  readonly span: Span;
  readonly text: string;
}

interface LineBase {
  readonly line: number;
  readonly text: string;
  readonly comment: Token | null;
  readonly issues: readonly SyntaxIssue[];
}

export interface BlankLine extends LineBase {
  readonly kind: 'blank';
}

export interface TimepointLine extends LineBase {
  readonly kind: 'timepoint';
  readonly marker: Token;
  readonly time: TimeSpec | null;
  readonly label: Token | null;
}

export interface SectionLine extends LineBase {
  readonly kind: 'section';
  readonly section: SectionId;
  readonly sectionToken: Token;
  readonly items: readonly ItemNode[];
  /** Free prose (note lines). */
  readonly prose: Token | null;
}

export interface UnknownLine extends LineBase {
  readonly kind: 'unknown';
  readonly first: Token;
  /** The rest of the line after the first word, kept verbatim. */
  readonly rest: Token | null;
}

export type LineNode = BlankLine | TimepointLine | SectionLine | UnknownLine;

export interface NoteTree {
  readonly lines: readonly LineNode[];
  /** The line terminator used first in the text (for edits that add lines). */
  readonly eol: '\n' | '\r\n' | '\r';
}

/**
 * The span that takes the run of items `items[first..last]` out of their line: with the separator
 * before the run, or, where the run comes first, with the one after it; the run alone where it is
 * all the line holds.
 */
export function itemsRemovalSpan(items: readonly ItemNode[], first: number, last: number = first): Span {
  const before = items[first - 1];
  if (before) return { start: before.span.end, end: items[last]!.span.end };
  const after = items[last + 1];
  return { start: items[first]!.span.start, end: after ? after.span.start : items[last]!.span.end };
}

export function toRange(line: number, span: Span): Range {
  return rangeBetween(line, span.start, line, span.end);
}

/** A range from one position to another (a range moved with its lines). */
export function rangeBetween(startLine: number, startCharacter: number, endLine: number, endCharacter: number): Range {
  return new LineRange(new At(startLine, startCharacter), new At(endLine, endCharacter));
}

/** Ranges are made by constructors, not literals: see `PlainFinding` in check-note.ts. */
class At implements Position {
  constructor(readonly line: number, readonly character: number) {}
}

class LineRange implements Range {
  constructor(readonly start: Position, readonly end: Position) {}
}

/** The fixes of an issue found on `line`, in the note's positions; the shared `NONE` when it has none. */
export function lineFixesToFixes(line: number, fixes: readonly LineFix[]): readonly Fix[] {
  return fixes.length === 0 ? NONE : fixes.map((f) => lineFixToFix(line, f));
}

export function lineFixToFix(line: number, fix: LineFix): Fix {
  return {
    title: fix.title,
    edits: fix.edits.map((e) => ({ range: e.line === undefined && e.endLine === undefined ? toRange(line, e.span) : rangeBetween(e.line ?? line, e.span.start, e.endLine ?? e.line ?? line, e.span.end), newText: e.newText })),
    ...(fix.preferred ? { preferred: true } : {}),
  };
}
