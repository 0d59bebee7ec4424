/**
 * Applying editor-neutral text edits to a text, as an editor would: every range refers to the
 * original text, edits may not overlap, and insertions at one position keep their order.
 * Lines end at `\n`, `\r\n` or `\r` (as LSP counts them); a character past the end of its line
 * means the end of the line, a line past the end of the text means the end of the text.
 */
import { keepCommentColumn, type LineEdit } from '../syntax/layout';
import { comparePositions, type Position, type TextEdit } from '../types';

/** Offsets (UTF-16) where each line starts and where its content ends (before its terminator). */
export interface LineTable {
  readonly starts: readonly number[];
  readonly ends: readonly number[];
}

export function lineTable(text: string): LineTable {
  const starts: number[] = [0];
  const ends: number[] = [];
  const n = text.length;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x0a || c === 0x0d) {
      ends.push(i);
      if (c === 0x0d && i + 1 < n && text.charCodeAt(i + 1) === 0x0a) i++;
      starts.push(i + 1);
    }
  }
  ends.push(n);
  return { starts, ends };
}

/** The offset of a position, clamped into the text. */
export function offsetAt(table: LineTable, position: Position): number {
  const last = table.starts.length - 1;
  if (position.line < 0) return 0;
  if (position.line > last) return table.ends[last] ?? 0;
  const start = table.starts[position.line] ?? 0;
  const end = table.ends[position.line] ?? start;
  return Math.min(end, start + Math.max(0, position.character));
}

export class OverlappingEditsError extends Error {
  constructor(readonly first: TextEdit, readonly second: TextEdit) {
    super(`Edits overlap: ${describe(first)} and ${describe(second)}.`);
    this.name = 'OverlappingEditsError';
  }
}

function describe(e: TextEdit): string {
  const p = (x: Position) => `${x.line + 1}:${x.character + 1}`;
  return `${p(e.range.start)}–${p(e.range.end)}`;
}

/**
 * Applies edits to a text. Throws `OverlappingEditsError` when two edits overlap (touching
 * edits are fine; two insertions at one position are applied in the order given).
 */
export function applyEdits(text: string, edits: readonly TextEdit[]): string {
  if (edits.length === 0) return text;
  const table = lineTable(text);
  const located = edits.map((edit, index) => {
    const a = offsetAt(table, edit.range.start);
    const b = offsetAt(table, edit.range.end);
    if (comparePositions(edit.range.start, edit.range.end) > 0 || b < a) throw new RangeError(`Edit ${describe(edit)} ends before it starts.`);
    return { edit, index, start: a, end: b };
  });
  located.sort((x, y) => x.start - y.start || x.end - y.end || x.index - y.index);
  let out = '';
  let at = 0;
  let previous: (typeof located)[number] | null = null;
  for (const e of located) {
    if (previous && e.start < previous.end) throw new OverlappingEditsError(previous.edit, e.edit);
    out += text.slice(at, e.start) + e.edit.newText;
    at = e.end;
    previous = e;
  }
  return out + text.slice(at);
}

/** Whether any two edits overlap (touching edits do not). */
export function editsOverlap(edits: readonly TextEdit[]): boolean {
  const sorted = [...edits].sort((a, b) => comparePositions(a.range.start, b.range.start) || comparePositions(a.range.end, b.range.end));
  for (let i = 1; i < sorted.length; i++) {
    const prev = sorted[i - 1]!;
    const cur = sorted[i]!;
    if (comparePositions(cur.range.start, prev.range.end) < 0) return true;
  }
  return false;
}

/**
 * `edits` with those that keep each changed line's trailing comment in its column
 * (`keepCommentColumn`, the one rule: where it was, or two spaces after content grown past it):
 * every action that changes the length of a line's content asks for it, so a note laid out with
 * its comments in one column stays so. `lineText` gives the text of a line of the note. A line that
 * an edit spans past its end (one joining lines) is left as it is; an insertion of whole lines (an
 * edit whose text ends lines, at a line's start) changes no column of the line it is put before.
 * The edits added come after those given (an insertion at the content's end stays before them).
 */
export function keepingCommentColumns(lineText: (line: number) => string | undefined, edits: readonly TextEdit[]): TextEdit[] {
  const byLine = new Map<number, LineEdit[]>();
  const spanned = new Set<number>();
  for (const e of edits) {
    const line = e.range.start.line;
    if (e.range.end.line !== line) {
      for (let l = line; l <= e.range.end.line; l++) spanned.add(l);
      continue;
    }
    if (/[\r\n]/.test(e.newText)) continue;
    const list = byLine.get(line);
    const edit = { span: { start: e.range.start.character, end: e.range.end.character }, newText: e.newText };
    if (list) list.push(edit);
    else byLine.set(line, [edit]);
  }
  if (byLine.size === 0) return [...edits];
  const out = [...edits];
  for (const [line, list] of byLine) {
    const text = spanned.has(line) ? undefined : lineText(line);
    const blanks = text === undefined ? null : keepCommentColumn(text, list);
    if (blanks) out.push({ range: { start: { line, character: blanks.span.start }, end: { line, character: blanks.span.end } }, newText: blanks.newText });
  }
  return out;
}

/**
 * `edits` without those that only move a line's trailing comment: an edit of plain spaces to plain
 * spaces between the end of the line's content and its comment, where the same `edits` change that
 * line elsewhere too (a rename's `keepCommentColumn` edit, `renameKeepingColumns`). Fix-all gathers
 * the fixes of many findings and asks `keepingCommentColumns` for one such edit per line, made for
 * all the line's changes together: two fixes that each kept the column on their own would take the
 * same blanks (their edits overlap, and one was left for the next run), or together too many.
 * `lineText` gives the text of a line of the note.
 */
export function withoutCommentColumnEdits(lineText: (line: number) => string | undefined, edits: readonly TextEdit[]): readonly TextEdit[] {
  let out: TextEdit[] | null = null;
  for (let i = 0; i < edits.length; i++) {
    const e = edits[i]!;
    const drop = movesCommentOnly(lineText, e) && edits.some((other) => other !== e && other.range.start.line === e.range.start.line && !movesCommentOnly(lineText, other));
    if (drop && out === null) out = edits.slice(0, i);
    else if (!drop && out !== null) out.push(e);
  }
  return out ?? edits;
}

/** Whether `e` replaces plain spaces with plain spaces between the end of its line's content and the line's trailing comment. */
function movesCommentOnly(lineText: (line: number) => string | undefined, e: TextEdit): boolean {
  const line = e.range.start.line;
  if (e.range.end.line !== line || !/^ *$/.test(e.newText)) return false;
  const text = lineText(line);
  if (text === undefined) return false;
  const comment = text.indexOf('#');
  if (comment < 0) return false;
  let contentEnd = comment;
  while (contentEnd > 0 && text.charCodeAt(contentEnd - 1) === 0x20) contentEnd--;
  return e.range.start.character >= contentEnd && e.range.end.character <= comment;
}
