/**
 * The columns of the canonical layout (the formatter, service/format.ts, writes lines so), and
 * renames that keep them: a fix that puts the word meant in place of a misspelt one (a section
 * word, PN101; a key or a device, PN201) changes the blanks beside it too, so that what was laid
 * out in columns stays where it was.
 */
import type { TextEdit } from '../types';
import { isBlank } from './blanks';
import type { LineNode, NoteTree, Span } from './tree';

/** Column (0-based) where items start after a section word. */
export const ITEM_COLUMN = 10;
/** Least number of spaces between content and a trailing comment. */
export const COMMENT_GAP = 2;

const SPACE = 0x20;

/** A replacement within one line. */
export interface LineEdit {
  readonly span: Span;
  readonly newText: string;
}

/**
 * The edits that put `newText` in place of the word at `span` of the line `text` (the whole line,
 * with its comment), keeping the columns the line was laid out in, as the formatter keeps them:
 * - the first word of the line followed by spaces to where the formatter starts items (column 10,
 *   or one space after a longer word): the new word padded so that the items start where the
 *   formatter would start them after it;
 * - a trailing comment set at least two spaces after the content: kept in its column while the
 *   content still ends at least two columns before it, else two spaces after the content
 *   (`keepCommentColumn`, the one rule of it).
 * Nothing else: blanks other than plain spaces, and a line not so laid out, are left as they are.
 */
export function renameKeepingColumns(text: string, span: Span, newText: string): readonly LineEdit[] {
  let rename: LineEdit = { span, newText };
  let next = span.end;
  while (next < text.length && text.charCodeAt(next) === SPACE) next++;
  const first = text.slice(0, span.start).trim() === '';
  if (first && next > span.end && next < text.length && text.charAt(next) !== '#' && next === Math.max(ITEM_COLUMN, span.end + 1)) {
    const end = span.start + newText.length;
    rename = { span: { start: span.start, end: next }, newText: newText + ' '.repeat(Math.max(1, ITEM_COLUMN - end)) };
  }
  const blanks = keepCommentColumn(text, [rename]);
  return blanks ? [rename, blanks] : [rename];
}

/**
 * The edit of blanks that keeps the trailing comment of the line `text` in its column once `edits`
 * (replacements within that line, none of them from the comment on) are made: a comment set at
 * least two spaces after the content stays where it was while the content still ends at least two
 * columns before it, else comes two spaces after the content. The one rule of it: renames
 * (`renameKeepingColumns`) and every code action that changes a line's length
 * (`keepingCommentColumns` in service/text-edits.ts) ask it.
 * Null where nothing is to change: no such comment, or the edits leave it in its column.
 */
export function keepCommentColumn(text: string, edits: readonly LineEdit[]): LineEdit | null {
  const comment = text.indexOf('#');
  if (comment < 0 || edits.length === 0) return null;
  let lastEnd = 0;
  let change = 0;
  for (const e of edits) {
    if (e.span.end > comment || e.span.start > comment) return null;
    lastEnd = Math.max(lastEnd, e.span.end);
    change += e.newText.length - (e.span.end - e.span.start);
  }
  let contentEnd = comment;
  while (contentEnd > lastEnd && text.charCodeAt(contentEnd - 1) === SPACE) contentEnd--;
  const gap = comment - contentEnd;
  // A gap that is not all plain spaces (a tab before them) stops short of the content: left as it is.
  if (gap < COMMENT_GAP || (contentEnd > lastEnd && /\s/.test(text.charAt(contentEnd - 1)))) return null;
  const wanted = Math.max(COMMENT_GAP, gap - change);
  if (wanted === gap) return null;
  return wanted > gap
    ? { span: { start: contentEnd, end: contentEnd }, newText: ' '.repeat(wanted - gap) }
    : { span: { start: contentEnd, end: contentEnd + gap - wanted }, newText: '' };
}

/** Offset where the line's content ends: before a trailing comment and the blanks before it. */
export function contentEnd(node: LineNode): number {
  let end = node.comment ? node.comment.span.start : node.text.length;
  while (end > 0 && isBlank(node.text.charCodeAt(end - 1))) end--;
  return end;
}

/**
 * The edit that writes a line of `text` before line `at` of the note (after its last line where
 * `at` is past it), in the note's line ends, and the line it then takes. Where the note's line end
 * is a lone CR, before the next line that is not blank: a CR written before a blank line's LF would
 * join them into one CRLF, and that blank line would be lost. At the top of a note, after its
 * byte-order mark.
 */
export function lineInsertion(tree: NoteTree, at: number, text: string): { readonly edit: TextEdit; readonly line: number } {
  const lines = tree.lines;
  let line = at;
  if (tree.eol === '\r') while (line < lines.length && lines[line]!.text === '') line++;
  if (line >= lines.length) {
    const last = lines.length - 1;
    const end = lines[last]?.text.length ?? 0;
    return { edit: { range: { start: { line: last, character: end }, end: { line: last, character: end } }, newText: `${tree.eol}${text}` }, line };
  }
  const bom = line === 0 && lines[0]!.text.startsWith('\uFEFF') ? 1 : 0;
  return { edit: { range: { start: { line, character: bom }, end: { line, character: bom } }, newText: `${text}${tree.eol}` }, line };
}
