// Range formatting reads only the lines it formats: the rest of the note is neither parsed
// nor cut into lines. The parser is wrapped to count what it is asked to parse.
import { describe, expect, it, vi } from 'vitest';

const parsed = vi.hoisted(() => ({ notes: 0, lines: [] as number[] }));

vi.mock('../../server/src/core/syntax/parser', async (importOriginal) => {
  const actual = await importOriginal<typeof import('../../server/src/core/syntax/parser')>();
  return {
    ...actual,
    parseNote: (text: string) => { parsed.notes++; return actual.parseNote(text); },
    parseLine: (text: string, line: number) => { parsed.lines.push(line); return actual.parseLine(text, line); },
  };
});

const { formatEdits } = await import('../../server/src/core/service/format');

describe('range formatting', () => {
  it('parses only the requested lines of a long note', () => {
    const text = 'vitals hr 80, rr 16, spo2 97 %\n'.repeat(20000);
    parsed.notes = 0;
    parsed.lines = [];
    const edits = formatEdits(text, { start: 100, end: 109 });
    expect(edits.map((e) => e.range.start.line)).toEqual([100, 101, 102, 103, 104, 105, 106, 107, 108, 109]);
    expect(parsed.notes).toBe(0);
    expect(parsed.lines.every((l) => l >= 100 && l <= 109)).toBe(true);
    expect(new Set(parsed.lines).size).toBe(10);
  });
});
