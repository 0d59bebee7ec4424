/**
 * Finding things at a position: the line node, the item and the part of it (key, value,
 * unit) under the cursor, the stated value read from an item, and the timepoint a line is in.
 * Shared by hovers, completions and code actions.
 */
import type { NoteResult } from '../check-note';
import type { StatedValue, Timepoint } from '../analysis/model';
import { headerShowsKpa, showsKpa } from '../present';
import { isBlank } from '../syntax/lexer';
import { contentEnd } from '../syntax/layout';
import type { ItemNode, LineNode, SectionLine, Span } from '../syntax/tree';
import type { Position, Range } from '../types';

/** A position the service can answer for: whole, non-negative numbers. */
export function isValidPosition(p: Position): boolean {
  return Number.isInteger(p.line) && Number.isInteger(p.character) && p.line >= 0 && p.character >= 0;
}

export function lineAt(result: NoteResult, line: number): LineNode | null {
  if (!Number.isInteger(line) || line < 0) return null;
  return result.analysis.tree.lines[line] ?? null;
}

export { contentEnd };

/** Offset where the line's content starts (after leading blanks). */
export function contentStart(node: LineNode): number {
  let i = 0;
  while (i < node.text.length && isBlank(node.text.charCodeAt(i))) i++;
  return i;
}

export type ItemPart = 'key' | 'value' | 'unit';

export interface ItemHit {
  readonly item: ItemNode;
  readonly part: ItemPart;
  readonly span: Span;
}

function contains(span: Span, ch: number, inclusiveEnd: boolean): boolean {
  return ch >= span.start && (inclusiveEnd ? ch <= span.end : ch < span.end);
}

/**
 * The key, value or unit under a character: a character inside a token wins; else the token
 * that ends right before the cursor (a cursor just after `po2`).
 */
export function itemAt(node: SectionLine, character: number): ItemHit | null {
  for (const inclusive of [false, true]) {
    for (const item of node.items) {
      const parts: [ItemPart, Span | undefined][] = [['key', item.key?.span], ['value', item.value?.span], ['unit', item.unit?.span]];
      for (const [part, span] of parts) if (span && contains(span, character, inclusive)) return { item, part, span };
    }
  }
  return null;
}

export function spanContains(span: Span, character: number, inclusiveEnd = true): boolean {
  return contains(span, character, inclusiveEnd);
}

/** Every stated value of the note, header first, in reading order. */
export function allStated(result: NoteResult): StatedValue[] {
  const t = result.analysis.timeline;
  return [...t.header, ...t.timepoints.flatMap((tp) => tp.stated)];
}

const NO_STATED: readonly StatedValue[] = Object.freeze([]);

/** The header's stated values by line, kept per analysis (features ask for one line's values many times). */
const HEADER_BY_LINE = new WeakMap<NoteResult, Map<number, StatedValue[]>>();

/**
 * A timepoint's stated values by line, kept per timepoint object (an edit keeps the timepoints it
 * does not touch): grouped a timepoint at a time as lines are asked about, since grouping every
 * value of a big note took a first hover after each edit some 200 ms.
 */
const TIMEPOINT_BY_LINE = new WeakMap<Timepoint, Map<number, StatedValue[]>>();

function byLine(values: readonly StatedValue[]): Map<number, StatedValue[]> {
  const map = new Map<number, StatedValue[]>();
  for (const s of values) {
    const list = map.get(s.line);
    if (list) list.push(s);
    else map.set(s.line, [s]);
  }
  return map;
}

/** The last timepoint that starts at or before `line` (timepoints are in the order of their lines). */
function timepointFrom(timepoints: readonly Timepoint[], line: number): Timepoint | null {
  let low = 0;
  let high = timepoints.length - 1;
  let found: Timepoint | null = null;
  while (low <= high) {
    const mid = (low + high) >> 1;
    const tp = timepoints[mid]!;
    if (tp.startLine <= line) { found = tp; low = mid + 1; } else high = mid - 1;
  }
  return found;
}

/** The stated values read from one line, in reading order (the header's, then its timepoint's). */
export function statedOnLine(result: NoteResult, line: number): readonly StatedValue[] {
  const t = result.analysis.timeline;
  let header = HEADER_BY_LINE.get(result);
  if (!header) HEADER_BY_LINE.set(result, (header = byLine(t.header)));
  const fromHeader = header.get(line);
  const tp = timepointFrom(t.timepoints, line);
  if (!tp || line > tp.endLine) return fromHeader ?? NO_STATED;
  let ofTimepoint = TIMEPOINT_BY_LINE.get(tp);
  if (!ofTimepoint) TIMEPOINT_BY_LINE.set(tp, (ofTimepoint = byLine(tp.stated)));
  const fromTimepoint = ofTimepoint.get(line);
  if (!fromHeader) return fromTimepoint ?? NO_STATED;
  return fromTimepoint ? [...fromHeader, ...fromTimepoint] : fromHeader;
}

/**
 * The stated value read from an item (null when the item could not be read). Not by identity
 * alone: in an open note, a line read again though its text is unchanged (next to an edit, or
 * between two edits made at once) is a new node, while its timepoint, kept, holds the values read
 * from the node before; the same item is then the one at the same place with the same key.
 */
export function statedOf(result: NoteResult, line: number, item: ItemNode): StatedValue | null {
  for (const s of statedOnLine(result, line)) if (s.item === item || (s.item.span.start === item.span.start && s.item.keyName === item.keyName)) return s;
  return null;
}

/** Whether a line states header values (values before the first timepoint); a header line that states none is not one. */
export function statesHeaderValues(result: NoteResult, line: number): boolean {
  return result.analysis.timeline.header.some((s) => s.line === line);
}

/** The timepoint whose lines include `line` (null for header lines and lines before any timepoint). */
export function timepointOfLine(result: NoteResult, line: number): Timepoint | null {
  const t = result.analysis.timeline;
  if (statesHeaderValues(result, line)) return null;
  for (let i = t.timepoints.length - 1; i >= 0; i--) {
    const tp = t.timepoints[i]!;
    if (line >= tp.startLine && line <= tp.endLine) return tp;
  }
  return null;
}

/** Whether gas pressures on a line are shown in kPa first: by its timepoint's gas unit, or on a header line the header's. */
export function showsKpaOnLine(result: NoteResult, line: number): boolean {
  const tp = timepointOfLine(result, line);
  return tp ? showsKpa(tp) : headerShowsKpa(result.analysis.timeline);
}

export function lineRange(line: number, start: number, end: number): Range {
  return { start: { line, character: start }, end: { line, character: end } };
}
