// Lines with tens of thousands of items or words (one line of a pasted export, say): every part
// of the core reads them without running out of call stack. A list handed to a call as spread
// arguments (`push(...items)`) overflows the stack somewhere past 100,000 items on Node 20.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { codeActions } from '../../server/src/core/service/actions';
import { formatEdits } from '../../server/src/core/service/format';
import { hoverAt } from '../../server/src/core/service/hover';
import { inlayHints } from '../../server/src/core/service/hints';
import { documentSymbols } from '../../server/src/core/service/symbols';
import { convertNoteUnits } from '../../server/src/core/service/unit-conversion';
import { HINT_CATEGORIES } from '../../server/src/core/service/types';
import { parseLine } from '../../server/src/core/syntax/parser';

/** One vitals line of about `chars` characters: `hr 80, rr 16, spo2 97 %, ` again and again. */
const vitalsLine = (chars: number) => `vitals ${'hr 80, rr 16, spo2 97 %, '.repeat(Math.ceil(chars / 24))}`;

describe('a line with 200,000 items', () => {
  const line = vitalsLine(1_600_000); // 1.6 MB: under the editor's default limit of 2 MB
  const text = `@ 08:00\n${line}\nabg 7,31/48/62/24\n`;
  const result = checkNote(text);

  it('is read, every item of it', () => {
    const node = result.analysis.tree.lines[1];
    expect(node?.kind === 'section' && node.items.length).toBeGreaterThan(199_000);
    expect(result.analysis.timeline.timepoints[0]?.stated.length).toBeGreaterThan(199_000);
    // A repeated key is named (the later value is used), once per repeat.
    expect(result.findings.filter((f) => f.code === 'PN206').length).toBeGreaterThan(190_000);
  });

  it('serves the editor features over it', () => {
    const whole = { start: { line: 0, character: 0 }, end: { line: 3, character: 0 } };
    expect(codeActions(result, whole).length).toBeGreaterThan(0);
    expect(inlayHints(result, { start: 0, end: 3 }, { categories: new Set(HINT_CATEGORIES) }).length).toBeGreaterThan(0);
    expect(hoverAt(result, { line: 1, character: 8 })).not.toBeNull();
    expect(documentSymbols(result)).toHaveLength(1);
    expect(convertNoteUnits(result, 'kPa').length).toBeGreaterThan(0);
    expect(formatEdits(text).length).toBeGreaterThan(0);
  });
});

describe('a timepoint line with a 300,000-word label', () => {
  it('is read as a timepoint with its label', () => {
    const label = 'word '.repeat(300_000).trimEnd();
    const node = parseLine(`@ 08:00 ${label}`, 0);
    expect(node.kind).toBe('timepoint');
    expect(node.kind === 'timepoint' && node.label?.text.length).toBe(label.length);
  });
});
