// Whole-note features made in steps (core/util/steps.ts), as the language server runs them a few
// milliseconds at a time: driven step by step, they give what the one-shot functions give.
// `inlayHintSteps` cuts the lines asked for into pieces, and is compared with one call over the
// whole range on every sample, fixture and a generated note; the others make their result one
// way only, and are compared anyway, with the number of steps they took (more than one on a big
// note, so the slicing is real).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { StatedValue } from '../../server/src/core/analysis/model';
import { checkNote } from '../../server/src/core/check-note';
import { codeActions, codeActionSteps, convertNoteUnits, convertNoteUnitSteps, documentSymbols, documentSymbolSteps, HINT_CATEGORIES, inlayHints, inlayHintSteps, type HintCategory } from '../../server/src/core/service';
import { allStated, statedOnLine } from '../../server/src/core/service/locate';
import { trendPoints, trendPointSteps } from '../../server/src/core/trends';
import { messyNote } from './note-arbitraries';
import type { Steps } from '../../server/src/core/util/steps';
import { generateNote } from '../bench/generate.mjs';

const ALL = { categories: new Set<HintCategory>(HINT_CATEGORIES) };

/** The result of steps run one at a time, and how many steps they took. */
function stepByStep<T>(steps: Steps<T>): { value: T; steps: number } {
  let count = 0;
  for (;;) {
    const next = steps.next();
    count++;
    if (next.done) return { value: next.value, steps: count };
  }
}

const notes = [
  ...['samples', 'tests/fixtures'].flatMap((dir) => readdirSync(dir).filter((f) => f.endsWith('.pneu')).map((f) => ({ name: `${dir}/${f}`, text: readFileSync(join(dir, f), 'utf8') }))),
  { name: 'a generated note of 600 timepoints', text: generateNote(600) },
];

describe('inlay hints in steps', () => {
  for (const { name, text } of notes) {
    it(`gives the hints of the whole range at once (${name})`, () => {
      const lineCount = text.split('\n').length;
      for (const range of [{ start: 0, end: lineCount }, { start: Math.floor(lineCount / 3), end: lineCount - 2 }]) {
        const result = checkNote(text);
        const once = inlayHints(result, range, ALL);
        expect(stepByStep(inlayHintSteps(checkNote(text), range, ALL)).value).toEqual(once);
      }
    });
  }
});

describe('whole-note features in steps', () => {
  const text = generateNote(600);
  const lines = text.split('\n');
  const gasLine = lines.findIndex((l) => l.startsWith('abg'));

  it('the outline', () => {
    const got = stepByStep(documentSymbolSteps(checkNote(text)));
    expect(got.steps).toBeGreaterThan(2);
    expect(got.value).toEqual(documentSymbols(checkNote(text)));
  });

  it('the trend view\'s points', () => {
    const got = stepByStep(trendPointSteps(checkNote(text)));
    expect(got.steps).toBeGreaterThan(2);
    expect(got.value).toEqual(trendPoints(checkNote(text)));
  });

  it('the conversion of every gas pressure, both ways', () => {
    for (const to of ['mmHg', 'kPa'] as const) {
      const got = stepByStep(convertNoteUnitSteps(checkNote(text), to));
      expect(got.value).toEqual(convertNoteUnits(checkNote(text), to));
    }
    expect(stepByStep(convertNoteUnitSteps(checkNote(text), 'kPa')).steps).toBeGreaterThan(2);
  });

  it('code actions, on a gas line (the conversion of the note) and on a line with fixable findings', () => {
    const fixable = `${text}@ day 99 08:00\nvitals    hr 80 bpm, spo2 97 %, temp 37.1 C\nvitals    spo2 97 %\n`;
    for (const t of [text, fixable]) {
      const lineCount = t.split('\n').length;
      for (const line of [gasLine, lineCount - 3, lineCount - 2]) {
        const range = { start: { line, character: 12 }, end: { line, character: 12 } };
        expect(stepByStep(codeActionSteps(checkNote(t), range)).value).toEqual(codeActions(checkNote(t), range));
      }
    }
  });
});

describe('the stated values of a line, grouped a timepoint at a time', () => {
  /** What `statedOnLine` gave when it grouped every value of the note at once: the header's, then each timepoint's, in order. */
  function groupedAtOnce(result: ReturnType<typeof checkNote>, line: number): StatedValue[] {
    return allStated(result).filter((s) => s.line === line);
  }
  const same = (text: string) => {
    const result = checkNote(text);
    const lineCount = result.analysis.tree.lines.length;
    for (let line = -1; line <= lineCount; line++) expect(statedOnLine(result, line)).toEqual(groupedAtOnce(result, line));
  };

  it('are those of the whole note grouped at once, on every sample and fixture', () => {
    for (const { text } of notes) same(text);
  });

  it('are those of the whole note grouped at once, on messy notes (300 cases)', () => {
    fc.assert(fc.property(messyNote, (text) => same(text)), { numRuns: 300 });
  });
});
