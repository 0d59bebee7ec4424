// Applying editor-neutral edits: positions as LSP counts them, overlap rejected.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { applyEdits, editsOverlap, OverlappingEditsError } from '../../server/src/core/service';
import { keepingCommentColumns } from '../../server/src/core/service/text-edits';
import type { TextEdit } from '../../server/src/core/types';

const edit = (line: number, from: number, to: number, newText: string, toLine = line): TextEdit => ({ range: { start: { line, character: from }, end: { line: toLine, character: to } }, newText });

describe('applyEdits', () => {
  it('applies edits given in any order, against the original text', () => {
    expect(applyEdits('vitals hr 80\nabg po2 71', [edit(1, 8, 10, '9.5'), edit(0, 10, 12, '90'), edit(1, 10, 10, ' kPa')])).toBe('vitals hr 90\nabg po2 9.5 kPa');
  });

  it('counts lines at LF, CRLF and CR, and characters in UTF-16', () => {
    expect(applyEdits('a\r\nb\rc\nd', [edit(1, 0, 1, 'B'), edit(2, 0, 1, 'C'), edit(3, 0, 1, 'D')])).toBe('a\r\nB\rC\nD');
    expect(applyEdits('😀 x', [edit(0, 3, 4, 'y')])).toBe('😀 y');
  });

  it('edits across lines, and clamps past the end of a line or of the text', () => {
    expect(applyEdits('ab\r\ncd', [edit(0, 1, 1, '-', 1)])).toBe('a-d');
    expect(applyEdits('ab\ncd', [edit(0, 99, 99, '!')])).toBe('ab!\ncd');
    expect(applyEdits('ab\ncd', [edit(7, 0, 0, '!')])).toBe('ab\ncd!');
  });

  it('keeps the order of insertions at one position; touching edits are fine', () => {
    expect(applyEdits('ab', [edit(0, 1, 1, 'x'), edit(0, 1, 1, 'y')])).toBe('axyb');
    expect(applyEdits('abcd', [edit(0, 0, 2, 'X'), edit(0, 2, 4, 'Y')])).toBe('XY');
    expect(editsOverlap([edit(0, 0, 2, 'X'), edit(0, 2, 4, 'Y')])).toBe(false);
  });

  it('rejects overlapping edits', () => {
    expect(() => applyEdits('abcd', [edit(0, 0, 3, 'X'), edit(0, 2, 4, 'Y')])).toThrow(OverlappingEditsError);
    expect(() => applyEdits('abcd', [edit(0, 0, 3, 'X'), edit(0, 1, 1, 'Y')])).toThrow(OverlappingEditsError);
    expect(editsOverlap([edit(0, 0, 3, 'X'), edit(0, 2, 4, 'Y')])).toBe(true);
    expect(() => applyEdits('abcd', [edit(0, 3, 1, 'X')])).toThrow(RangeError);
  });

  it('never throws on non-overlapping edits anywhere (300 generated cases)', () => {
    fc.assert(fc.property(fc.string({ maxLength: 60 }), fc.array(fc.tuple(fc.nat(8), fc.nat(20), fc.string({ maxLength: 4 })), { maxLength: 6 }), (text, raw) => {
      const edits = raw.map(([line, ch, t]) => edit(line, ch, ch, t));
      expect(typeof applyEdits(text, edits)).toBe('string');
    }), { numRuns: 300 });
  });
});

describe('keepingCommentColumns', () => {
  const lines = ['abg po2 71    # a', 'vitals hr 80  # b'];
  const text = lines.join('\n');
  const at = (line: number, start: number, end: number, newText: string) => ({ range: { start: { line, character: start }, end: { line, character: end } }, newText });

  it('keeps each changed line\'s comment in its column, or two spaces after content grown past it', () => {
    const edits = [at(0, 8, 10, '9.5 kPa'), at(1, 10, 12, '8')];
    expect(applyEdits(text, keepingCommentColumns((l) => lines[l], edits))).toBe('abg po2 9.5 kPa  # a\nvitals hr 8   # b');
  });

  it('leaves alone a line an edit spans past its end, and gives the edits unchanged where no comment is', () => {
    const joined = [{ range: { start: { line: 0, character: 8 }, end: { line: 1, character: 0 } }, newText: '' }];
    expect(keepingCommentColumns((l) => lines[l], joined)).toEqual(joined);
    const bare = [at(0, 4, 7, 'pao2')];
    expect(keepingCommentColumns(() => 'abg po2 71', bare)).toEqual(bare);
  });
});
