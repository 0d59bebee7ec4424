// No feature of the language service throws, or returns NaN, Infinity or "undefined" text,
// or a range outside the text, whatever the note and wherever the cursor.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { splitLines } from '../../server/src/core/syntax/parser';
import {
  codeActions,
  completionsAt,
  convertNoteUnits,
  documentSymbols,
  foldingRanges,
  formatEdits,
  HINT_CATEGORIES,
  hoverAt,
  inlayHints,
  type HintCategory,
} from '../../server/src/core/service';
import type { Position } from '../../server/src/core/types';
import { anyText } from '../helpers/arbitraries';
import { messyNote } from './note-arbitraries';

export const ROBUSTNESS_RUNS = 300;

/**
 * Objects of the current note already checked: answers share them (the fix-all actions of one
 * analysis, with their edits and the findings they resolve, come with every position on the
 * note), and checking each once keeps the run's time in what the features do.
 */
let checked = new WeakSet<object>();

/** Every number finite, every string free of NaN / Infinity / undefined, every position inside the text. */
function checkOutput(value: unknown, lines: readonly string[], path = 'result'): void {
  if (typeof value === 'number') {
    expect(Number.isFinite(value), path).toBe(true);
    return;
  }
  if (typeof value === 'string') {
    expect(value, path).not.toMatch(/NaN|Infinity|undefined/);
    return;
  }
  if (value === undefined) throw new Error(`${path} is undefined`);
  if (value === null || typeof value !== 'object') return;
  if (checked.has(value)) return;
  checked.add(value);
  if (Array.isArray(value)) {
    value.forEach((v, i) => checkOutput(v, lines, `${path}[${i}]`));
    return;
  }
  const record = value as Record<string, unknown>;
  if (typeof record.line === 'number' && typeof record.character === 'number') {
    const p = record as unknown as Position;
    expect(p.line >= 0 && p.line < lines.length, `${path} line ${p.line} of ${lines.length}`).toBe(true);
    expect(p.character >= 0 && p.character <= (lines[p.line]?.length ?? 0), `${path} character ${p.character}`).toBe(true);
  }
  for (const [k, v] of Object.entries(record)) if (v !== undefined) checkOutput(v, lines, `${path}.${k}`);
}

const notes = fc.oneof({ weight: 1, arbitrary: anyText }, { weight: 2, arbitrary: messyNote });
const ALL = { categories: new Set<HintCategory>(HINT_CATEGORIES) };

describe('language service robustness', () => {
  it(`no feature throws or returns NaN, Infinity, "undefined" or a range outside the text (${ROBUSTNESS_RUNS} generated notes)`, () => {
    fc.assert(fc.property(notes, fc.nat(), (text, seed) => {
      fc.pre(!/NaN|Infinity|undefined/.test(text));
      checked = new WeakSet<object>();
      const result = checkNote(text);
      const lines = splitLines(text).lines.map((l) => l.text);
      const positions: Position[] = [{ line: lines.length, character: 0 }, { line: lines.length + 5, character: 3 }];
      lines.forEach((l, line) => {
        for (const character of [0, l.length, l.length + 1, (seed + line) % (l.length + 1), Math.floor(l.length / 2)]) positions.push({ line, character });
      });
      for (const p of positions) {
        const h = hoverAt(result, p);
        if (h) checkOutput(h, lines, `hover ${JSON.stringify(p)}`);
        checkOutput(completionsAt(result, p), lines, `completions ${JSON.stringify(p)}`);
        const inside = p.line < lines.length && p.character <= (lines[p.line]?.length ?? 0);
        if (inside) checkOutput(codeActions(result, { start: p, end: p }), lines, `actions ${JSON.stringify(p)}`);
      }
      checkOutput(codeActions(result, { start: { line: 0, character: 0 }, end: { line: Math.max(0, lines.length - 1), character: lines[lines.length - 1]?.length ?? 0 } }), lines, 'actions (whole note)');
      checkOutput(inlayHints(result, { start: 0, end: lines.length + 10 }, ALL), lines, 'hints');
      checkOutput(documentSymbols(result), lines, 'symbols');
      const folds = foldingRanges(result);
      for (const f of folds) expect(f.startLine < f.endLine && f.endLine < lines.length).toBe(true);
      checkOutput(formatEdits(text), lines, 'format');
      checkOutput(convertNoteUnits(result, 'kPa'), lines, 'convert kPa');
      checkOutput(convertNoteUnits(result, 'mmHg'), lines, 'convert mmHg');
    }), { numRuns: ROBUSTNESS_RUNS });
  }, 60_000);
});
