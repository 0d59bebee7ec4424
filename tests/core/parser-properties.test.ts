// Properties of the parser and checker on generated input: they never throw, every line of
// the text has a node, and every range lies inside the text.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { leadingNumber } from '../../server/src/core/syntax/lexer';
import { parseLine, parseNote, splitLines } from '../../server/src/core/syntax/parser';
import type { Range } from '../../server/src/core/types';
import type { LineNode, ValueNode } from '../../server/src/core/syntax/tree';
import { anyText, nearlyValidNote } from '../helpers/arbitraries';

export const PROPERTY_RUNS = 600;

function inside(range: Range, lines: readonly string[]): boolean {
  const within = (p: Range['start']) => p.line >= 0 && p.line < lines.length && p.character >= 0 && p.character <= (lines[p.line]?.length ?? -1);
  return within(range.start) && within(range.end) && (range.start.line < range.end.line || (range.start.line === range.end.line && range.start.character <= range.end.character));
}

describe('parser properties', () => {
  it(`never throws and gives every line a node (${PROPERTY_RUNS} generated notes)`, () => {
    fc.assert(
      fc.property(anyText, (text) => {
        const tree = parseNote(text);
        expect(tree.lines.length).toBe(splitLines(text).lines.length);
        tree.lines.forEach((node, i) => expect(node.line).toBe(i));
      }),
      { numRuns: PROPERTY_RUNS },
    );
  });

  it(`gives the same value and unit through an item's flat accessors as through its nodes (${PROPERTY_RUNS} generated notes)`, () => {
    fc.assert(
      fc.property(fc.oneof(anyText, nearlyValidNote), (text) => {
        for (const node of parseNote(text).lines) {
          if (node.kind !== 'section') continue;
          for (const item of node.items) {
            const value = item.value;
            expect(item.valueKind).toBe(value?.kind ?? null);
            expect(item.number).toBe(value?.kind === 'number' ? value.value : null);
            expect(item.unitText).toBe(item.unit?.text ?? null);
            if (value) expect(node.text.slice(value.span.start, value.span.end)).toBe(value.text);
            if (item.unit) expect(node.text.slice(item.unit.span.start, item.unit.span.end)).toBe(item.unit.text);
          }
        }
      }),
      { numRuns: PROPERTY_RUNS },
    );
  });

  it(`keeps every finding, fix and related range inside the text (${PROPERTY_RUNS} generated notes)`, () => {
    fc.assert(
      fc.property(anyText, (text) => {
        const lines = splitLines(text).lines.map((l) => l.text);
        const { findings } = checkNote(text);
        for (const f of findings) {
          expect(inside(f.range, lines), `${f.code} ${JSON.stringify(f.range)}`).toBe(true);
          for (const fix of f.fixes) for (const e of fix.edits) expect(inside(e.range, lines)).toBe(true);
          for (const r of f.related ?? []) expect(inside(r.range, lines)).toBe(true);
          // A message quotes what the note says: only a NaN the note did not write is a fault.
          if (!/NaN|Infinity|undefined/.test(text)) expect(f.message).not.toMatch(/NaN|Infinity|undefined/);
        }
      }),
      { numRuns: PROPERTY_RUNS },
    );
  });

  it('spans of keys, values and units cover exactly their text', () => {
    fc.assert(
      fc.property(anyText, (text) => {
        for (const node of parseNote(text).lines) {
          if (node.kind !== 'section') continue;
          for (const item of node.items) {
            if (item.key) expect(node.text.slice(item.key.span.start, item.key.span.end)).toBe(item.key.text);
            if (item.value) expect(node.text.slice(item.value.span.start, item.value.span.end)).toBe(item.value.text);
            if (item.unit) expect(node.text.slice(item.unit.span.start, item.unit.span.end)).toBe(item.unit.text);
          }
        }
      }),
      { numRuns: PROPERTY_RUNS },
    );
  });

  it('parses in time linear in the size of the note', () => {
    // Not a timing assertion: the parser's work per character is bounded, shown by the
    // tree of a 200,000-character line and 20,000 lines coming back complete.
    const longLine = `vitals ${'hr 80, '.repeat(28000)}`;
    expect(parseNote(longLine).lines[0]?.kind).toBe('section');
    const many = 'vitals hr 80\n'.repeat(20000);
    expect(parseNote(many).lines.length).toBe(20001);
  });
});

describe('number reading', () => {
  it('reads every number as Number() reads the same text (decimal comma as a point; 1000 cases)', () => {
    const digits = fc.string({ unit: fc.constantFrom('0', '1', '2', '3', '4', '5', '6', '7', '8', '9'), minLength: 0, maxLength: 20 });
    fc.assert(
      fc.property(fc.constantFrom('', '-', '+', '−'), digits, fc.constantFrom('', '.', ','), digits, (sign, whole, point, fraction) => {
        const text = `${sign}${whole}${point}${fraction}`;
        const read = leadingNumber(text);
        const reference = Number(text.replace(',', '.').replace('−', '-'));
        const complete = (whole.length > 0 || (point !== '' && fraction.length > 0)) && (point === '' || fraction.length > 0);
        if (!complete) return;
        expect(read.length).toBe(text.length);
        expect(Object.is(read.value, reference), `${text}: ${read.value} vs ${reference}`).toBe(true);
      }),
      { numRuns: 1000 },
    );
    for (const [text, value] of [['7.28', 7.28], ['0.1', 0.1], ['-0.35', -0.35], ['37,8', 37.8], ['123456789012345678', 123456789012345678], ['.5', 0.5], ['−3', -3]] as const) {
      expect(leadingNumber(text).value).toBe(value);
    }
  });
});

/** Everything a line node says, read through its getters (spans, texts, values, issues). */
function snapshotOf(node: LineNode): unknown {
  const span = (s: { start: number; end: number } | undefined) => (s ? [s.start, s.end] : null);
  const tok = (t: { text: string; span: { start: number; end: number } } | null | undefined) => (t ? [t.text, span(t.span)] : null);
  const value = (v: ValueNode | null) => v && [v.kind, v.text, span(v.span), v.kind === 'number' ? [v.value, v.decimalComma] : v.kind === 'pair' ? v.parts.map((p) => [p.value, p.text, span(p.span)]) : null];
  const base = [node.kind, node.line, node.text, tok(node.comment), node.issues.map((i) => [i.check, span(i.span), i.message, i.fixes.map((f) => [f.title, f.edits.map((e) => [span(e.span), e.newText])])])];
  switch (node.kind) {
    case 'blank': return base;
    case 'timepoint': return [...base, tok(node.marker), node.time && [node.time.kind, node.time.day, node.time.minutes, node.time.text, span(node.time.span)], tok(node.label)];
    case 'unknown': return [...base, tok(node.first), tok(node.rest)];
    case 'section': return [...base, node.section, tok(node.sectionToken), tok(node.prose), node.items.map((i) => [i.keyName, i.implied, tok(i.key), value(i.value), tok(i.unit), span(i.span), i.field?.id ?? null])];
  }
}

describe('parser: lines read in their note', () => {
  // parseNote reads each line's words by offsets in the note; parseLine reads a line of its own.
  const sameAsAlone = (text: string) => {
    const alone = splitLines(text).lines.map((l, i) => snapshotOf(parseLine(l.text, i)));
    expect(parseNote(text).lines.map(snapshotOf)).toEqual(alone);
  };

  it('reads a line of a note as it reads the line alone, its words, numbers and ends next to comments and line ends', () => {
    for (const text of [
      'vitals hr 80 # 7,5\nabg 7.28/56/71/26 kPa#x\r\nvitals bp 120/80(93)\rnote ok. 12\n@ day 2 08:00 label\n',
      'vitals temp 38,4\n,5 hr 80\r\n-,5\nvent peep 5, vt 400 mL.\n\noxygen hfnc 40 L/min 60 %#c\nvitals hr 1234567890123456789',
      'vitals hr -#\n5\nabg 7.3 / 40 /\n90\nvitals bp 120/\n80',
    ]) sameAsAlone(text);
  });

  it(`reads every line of a generated note as it reads the line alone (${PROPERTY_RUNS} generated notes)`, () => {
    fc.assert(fc.property(fc.oneof(anyText, nearlyValidNote), sameAsAlone), { numRuns: PROPERTY_RUNS });
  });
});

describe('parser: trees stay as parsed', () => {
  it(`keeps a tree unchanged while other notes are parsed after it (the lexer reuses its words) (${PROPERTY_RUNS} generated pairs)`, () => {
    fc.assert(
      fc.property(fc.oneof(anyText, nearlyValidNote), fc.oneof(anyText, nearlyValidNote), (a, b) => {
        const tree = parseNote(a);
        const before = tree.lines.map(snapshotOf);
        parseNote(b);
        parseNote(a.split('').reverse().join(''));
        expect(tree.lines.map(snapshotOf)).toEqual(before);
        expect(before).toEqual(parseNote(a).lines.map(snapshotOf));
      }),
      { numRuns: PROPERTY_RUNS },
    );
  });
});
