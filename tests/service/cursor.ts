/**
 * Test helper: note text with a `|` cursor marker (or two markers for a range), so that hover,
 * completion and action tests read like specs:
 *
 *   const { result, position } = noteAt('abg po|2 71');
 *
 * Positions are LSP-style: 0-based line, UTF-16 character; lines end at \n, \r\n or \r.
 */
import { checkNote, type NoteResult } from '../../server/src/core/check-note';
import type { Settings } from '../../server/src/core/settings';
import type { Position, Range } from '../../server/src/core/types';

export const CURSOR = '|';

/** The position of a UTF-16 offset in a text. */
export function positionOf(text: string, offset: number): Position {
  let line = 0;
  let lineStart = 0;
  for (let i = 0; i < offset && i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x0a || c === 0x0d) {
      if (c === 0x0d && text.charCodeAt(i + 1) === 0x0a) {
        if (i + 1 >= offset) break;
        i++;
      }
      line++;
      lineStart = i + 1;
    }
  }
  return { line, character: offset - lineStart };
}

export interface MarkedNote {
  /** The text without the markers. */
  readonly text: string;
  /** The first marker. */
  readonly position: Position;
  /** From the first marker to the second (or an empty range at the only marker). */
  readonly range: Range;
  readonly result: NoteResult;
}

/** Reads a note with one `|` (a cursor) or two (a range), and checks it. */
export function noteAt(marked: string, settings: Partial<Settings> = {}): MarkedNote {
  const first = marked.indexOf(CURSOR);
  if (first < 0) throw new Error('noteAt: the text has no | cursor marker');
  const second = marked.indexOf(CURSOR, first + 1);
  if (second >= 0 && marked.indexOf(CURSOR, second + 1) >= 0) throw new Error('noteAt: more than two | markers');
  const text = second < 0 ? marked.slice(0, first) + marked.slice(first + 1) : marked.slice(0, first) + marked.slice(first + 1, second) + marked.slice(second + 1);
  const start = positionOf(text, first);
  const end = second < 0 ? start : positionOf(text, second - 1);
  return { text, position: start, range: { start, end }, result: checkNote(text, settings) };
}

/** Lines of a note joined with LF (tests read better as arrays of lines). */
export function note(...lines: string[]): string {
  return lines.join('\n');
}
