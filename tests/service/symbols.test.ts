// The outline (timepoints, a header, section lines) and folding ranges.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { documentSymbols, foldingRanges, OUTLINE_SECTION_LINES, type SymbolInfo } from '../../server/src/core/service';
import { note } from './cursor';

const text = note(
  '# an invented note',                                   // 0
  'patient   age 58 y, sex female',                       // 1
  'place     altitude 1650 m',                            // 2
  '',                                                     // 3
  '@ day 1 22:15  admitted 😀',                           // 4
  'vent      mode VC, peep 8',                            // 5
  'abg       7.29/49/74/23',                              // 6
  '',                                                     // 7
  '',                                                     // 8
  '@ +3h45  PEEP raised',                                 // 9
  'vent      peep 12',                                    // 10
  'note      better',                                     // 11
  '@ 09:00',                                              // 12
  '',                                                     // 13
);

const shape = (s: SymbolInfo): unknown => ({ name: s.name, detail: s.detail, kind: s.kind, lines: [s.range.start.line, s.range.end.line], children: s.children.map((c) => c.name) });

describe('documentSymbols', () => {
  const symbols = documentSymbols(checkNote(text));

  it('outlines the header and the timepoints, with section lines as children', () => {
    expect(symbols.map(shape)).toEqual([
      { name: 'header', detail: 'patient, place', kind: 'header', lines: [1, 2], children: ['patient', 'place'] },
      { name: 'admitted 😀', detail: 'day 1 22:15', kind: 'timepoint', lines: [4, 6], children: ['vent', 'abg'] },
      { name: 'PEEP raised', detail: '+3h45 (day 2, 02:00)', kind: 'timepoint', lines: [9, 11], children: ['vent', 'note'] },
      { name: '09:00', detail: '09:00 (day 2)', kind: 'timepoint', lines: [12, 12], children: [] },
    ]);
  });

  it('names the day of a clock time written alone once the note is past its first day', () => {
    const days = documentSymbols(checkNote(note('@ day 1 23:30  night', 'vitals hr 90', '@ 00:30  after midnight', 'vitals hr 80', '@ 06:00', '@ day 3', '@ 08:00')));
    expect(days.map((s) => s.detail)).toEqual(['day 1 23:30', '00:30 (day 2)', '06:00 (day 2)', 'day 3', '08:00 (day 3)']);
    // A time that could not be read is named as written.
    expect(documentSymbols(checkNote(note('@ 08:00', '@ 25:10  bad', '@'))).map((s) => [s.name, s.detail])).toEqual([['08:00', '08:00'], ['bad', '25:10 (not read)'], ['line 3', 'time unknown']]);
    // On the first day a clock time says it all.
    expect(documentSymbols(checkNote(note('@ 08:00', '@ 09:30'))).map((s) => s.detail)).toEqual(['08:00', '09:30']);
    // Part of a time that could not be read is named too, as its hover names it (`@ day 1 25:10`
    // reads as day 1 with no time of day, which the outline alone would hide).
    expect(documentSymbols(checkNote(note('@ day 1 25:10  handover', '@ day 2 0800  round'))).map((s) => s.detail)).toEqual(['day 1 (25:10 not read)', 'day 2 (0800 not read)']);
    // A time that names its day says it once (`day 2 02:00`, not `day 2 02:00 (day 2)`).
    expect(documentSymbols(checkNote(note('@ day 1 22:15', '@ day 2 02:00', '@ 08:00', '@ Day 3 09:30'))).map((s) => s.detail)).toEqual(['day 1 22:15', 'day 2 02:00', '08:00 (day 2)', 'Day 3 09:30']);
  });

  it('selects the `@` line, spans whole lines in UTF-16 and keeps children inside their parent', () => {
    const admitted = symbols[1]!;
    expect(admitted.selectionRange).toEqual({ start: { line: 4, character: 0 }, end: { line: 4, character: '@ day 1 22:15  admitted 😀'.length } });
    expect(admitted.range.end).toEqual({ line: 6, character: 'abg       7.29/49/74/23'.length });
    expect(admitted.children[0]?.detail).toBe('mode VC, peep 8');
    for (const s of symbols) {
      for (const c of s.children) {
        expect(c.range.start.line).toBeGreaterThanOrEqual(s.range.start.line);
        expect(c.range.end.line).toBeLessThanOrEqual(s.range.end.line);
        expect(c.selectionRange.start.character).toBeGreaterThanOrEqual(c.range.start.character);
        expect(c.selectionRange.end.character).toBeLessThanOrEqual(c.range.end.character);
      }
    }
  });

  it('outlines values before any `@` as an implicit first timepoint after the header', () => {
    const implicit = documentSymbols(checkNote(note('patient age 60 y', 'vitals hr 80', 'abg po2 71', '@ 08:00', 'vitals hr 90')));
    expect(implicit.map(shape)).toEqual([
      { name: 'header', detail: 'patient', kind: 'header', lines: [0, 0], children: ['patient'] },
      { name: 'start', detail: 'values before the first timepoint', kind: 'timepoint', lines: [1, 2], children: ['vitals', 'abg'] },
      { name: '08:00', detail: '08:00', kind: 'timepoint', lines: [3, 4], children: ['vitals'] },
    ]);
  });

  it('works on CRLF notes and returns nothing for an empty note', () => {
    expect(documentSymbols(checkNote(text.replace(/\n/g, '\r\n'))).map(shape)).toEqual(symbols.map(shape));
    expect(documentSymbols(checkNote(''))).toEqual([]);
    expect(documentSymbols(checkNote('# only a comment\n\n'))).toEqual([]);
  });
});

describe('the outline of a very long note', () => {
  /** A note of `timepoints` timepoints of `perTimepoint` section lines each, after a header line. */
  const long = (timepoints: number, perTimepoint: number): string => {
    const lines = ['patient   age 61 y'];
    for (let i = 0; i < timepoints; i++) {
      lines.push(`@ +${i}h  hour ${i + 1}`);
      for (let j = 0; j < perTimepoint; j++) lines.push(j % 2 === 0 ? `vitals    hr ${70 + (i % 20)}` : 'note      settled');
    }
    return lines.join('\n');
  };

  it('lists the section lines while the note has at most OUTLINE_SECTION_LINES of them', () => {
    // The header's line counts: without the last line, the note holds exactly the limit.
    const text = long(OUTLINE_SECTION_LINES / 5, 5);
    const symbols = documentSymbols(checkNote(text.slice(0, text.lastIndexOf('\n'))));
    expect(symbols.reduce((n, s) => n + s.children.length, 0)).toBe(OUTLINE_SECTION_LINES);
  });

  it('lists only the timepoints (and the header) past that, each spanning the same lines', () => {
    const text = long(OUTLINE_SECTION_LINES / 5, 5);
    const symbols = documentSymbols(checkNote(text));
    expect(symbols).toHaveLength(1 + OUTLINE_SECTION_LINES / 5);
    expect(symbols.every((s) => s.children.length === 0)).toBe(true);
    expect(symbols.slice(0, 3).map((s) => [s.name, s.detail, s.range.start.line, s.range.end.line])).toEqual([
      ['header', 'patient', 0, 0], ['hour 1', '+0h (day 1, 00:00)', 1, 6], ['hour 2', '+1h (day 1, 01:00)', 7, 12],
    ]);
  });
});

describe('foldingRanges', () => {
  it('folds each timepoint of more than one line, without trailing blank lines', () => {
    expect(foldingRanges(checkNote(text))).toEqual([{ startLine: 1, endLine: 2 }, { startLine: 4, endLine: 6 }, { startLine: 9, endLine: 11 }]);
  });

  it('folds the header from its first line to its last header line, when that is more than one line', () => {
    const header = note('patient   age 58 y', '# recorded at the hut', 'place     altitude 1650 m', '# end of header', '', '@ 08:00', 'vitals hr 80');
    expect(foldingRanges(checkNote(header))[0]).toEqual({ startLine: 0, endLine: 2 });
    expect(foldingRanges(checkNote(note('patient age 58 y', '@ 08:00', 'vitals hr 80')))).toEqual([{ startLine: 1, endLine: 2 }]);
  });

  it('folds an implicit first timepoint from its first value line', () => {
    expect(foldingRanges(checkNote(note('patient age 60 y', 'vitals hr 80', 'abg po2 71', '@ 08:00')))).toEqual([{ startLine: 1, endLine: 2 }]);
  });
});

describe('folding regions', () => {
  it('folds `# region` … `# endregion` comment pairs, nested, with kind region, beside the timepoints', () => {
    const regions = note(
      '# region header',          // 0
      'patient   age 58 y',       // 1
      '# endregion',              // 2
      '@ 08:00  first',           // 3
      '  #region gases',          // 4
      'abg       7.29/49/74/23',  // 5
      '# region inner',           // 6
      'vbg       ph 7.28',        // 7
      '#endregion inner',         // 8
      '# endregion gases',        // 9
      '@ 09:00',                  // 10
    );
    expect(foldingRanges(checkNote(regions))).toEqual([
      { startLine: 0, endLine: 2, kind: 'region' },
      { startLine: 3, endLine: 9 },
      { startLine: 4, endLine: 9, kind: 'region' },
      { startLine: 6, endLine: 8, kind: 'region' },
    ]);
  });

  it("ends a timepoint's fold before a region it does not hold, so that no two folds cross", () => {
    // Regions written around timepoints: the markers between two timepoints belong to the regions.
    const text = note(
      '# region day 1',           // 0
      '@ day 1 08:00  a',         // 1
      'vitals    hr 80',          // 2
      '# endregion',              // 3
      '',                         // 4
      '# region day 2',           // 5
      '@ day 2 08:00  b',         // 6
      'vitals    hr 90',          // 7
      '# endregion',              // 8
      '# note after the regions', // 9
    );
    const ranges = foldingRanges(checkNote(text));
    expect(ranges).toEqual([
      { startLine: 0, endLine: 3, kind: 'region' },
      { startLine: 1, endLine: 2 },
      { startLine: 5, endLine: 8, kind: 'region' },
      { startLine: 6, endLine: 7 },
    ]);
    // Every two folds are apart or one holds the other (an editor drops folds that cross).
    for (const a of ranges) for (const b of ranges) expect(a.endLine < b.startLine || b.endLine < a.startLine || (a.startLine <= b.startLine && b.endLine <= a.endLine) || (b.startLine <= a.startLine && a.endLine <= b.endLine)).toBe(true);
  });

  it('ignores unmatched markers, markers after content, and words that only start like them', () => {
    const text = note(
      '# endregion',              // 0: nothing open
      '# region never closed',    // 1
      '# regional note',          // 2: not a marker
      '# region a',               // 3
      'vitals    hr 80  # region', // 4: a trailing comment is not a marker
      '# endregion a',            // 5
    );
    expect(foldingRanges(checkNote(text)).filter((r) => r.kind === 'region')).toEqual([{ startLine: 3, endLine: 5, kind: 'region' }]);
  });
});
