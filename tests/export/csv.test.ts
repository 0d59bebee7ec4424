// CSV: RFC 4180 with LF line ends. Every file is read back with csv-parse and compared with the
// rows value by value (numbers to full precision); labels with commas, quotes, line breaks and
// non-ASCII text, and then any string at all, survive the round trip.
import { parse } from 'csv-parse/sync';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvCells, csvField, csvHeader, csvRecord, exportColumns, spreadsheetText, timepointCells, timepointRows, toCsv, type ColumnDef, type Row } from '../../server/src/core/export';
import { checked, samples } from './helpers';

const plain = { redactProse: false, shiftDays: 0 } as const;

/** Reads a CSV text back as csv-parse does by default, with the header as keys. */
function readBack(text: string): Record<string, string>[] {
  return parse(text, { columns: true, bom: true }) as Record<string, string>[];
}

/** Every cell as it must read back: '' for null, the number to full precision, the text as it is. */
function expectSameRows(columns: readonly ColumnDef[], rows: readonly Row[], text: string): void {
  const back = readBack(text);
  expect(back).toHaveLength(rows.length);
  rows.forEach((row, i) => {
    const read = back[i]!;
    expect(Object.keys(read)).toEqual(columns.map((c) => c.name));
    for (const c of columns) {
      const value = row[c.name] ?? null;
      const cell = read[c.name];
      if (value === null) expect(cell, c.name).toBe('');
      else if (typeof value === 'number') expect(Number(cell), c.name).toBe(value);
      else expect(cell, c.name).toBe(value);
    }
  });
}

describe('CSV text', () => {
  it('has a header, one record per timepoint, LF line ends and a final line break', () => {
    const s = samples().find((x) => x.name === 'icu-ventilated-lung-injury')!;
    const text = toCsv(exportColumns(), timepointRows(s.path, s.result, plain));
    const lines = text.split('\n');
    expect(lines[0]).toBe(exportColumns().map((c) => c.name).join(','));
    expect(text.endsWith('\n')).toBe(true);
    expect(text).not.toContain('\r');
    expect(lines).toHaveLength(1 + 4 + 1); // header, four timepoints, '' after the last LF
  });

  it('is the header followed by the records (so the CLI can stream many notes)', () => {
    const all = samples();
    const columns = exportColumns();
    const rows = all.flatMap((s) => timepointRows(s.path, s.result, plain));
    expect(toCsv(columns, rows)).toBe(csvHeader(columns) + rows.map((r) => csvRecord(columns, r)).join(''));
    expectSameRows(columns, rows, toCsv(columns, rows));
  });

  it('writes the same records from cells in column order as from keyed rows (what the CLI streams)', () => {
    const columns = exportColumns();
    for (const s of samples()) {
      const cells = timepointCells(s.path, s.result, plain);
      const rows = timepointRows(s.path, s.result, plain);
      expect(cells.map((c) => csvCells(c))).toEqual(rows.map((r) => csvRecord(columns, r)));
      expect(cells.every((c) => c.length === columns.length)).toBe(true);
    }
  });

  it.each(samples().map((s) => [s.name, s] as const))('%s reads back value by value', (_name, s) => {
    const rows = timepointRows(s.path, s.result, plain);
    expectSameRows(exportColumns(), rows, toCsv(exportColumns(), rows));
  });

  it('keeps numbers at full precision, in plain JavaScript notation', () => {
    expect(csvField(9.6 * (1000 / 133.322387415))).toBe('72.005911281183');
    expect(csvField(1 / 3)).toBe('0.3333333333333333');
    expect(csvField(-4)).toBe('-4');
    expect(csvField(0.1 + 0.2)).toBe('0.30000000000000004');
    expect(csvField(1e21)).toBe('1e+21');
    expect(csvField(Number.NaN)).toBe('');
    expect(csvField(Number.POSITIVE_INFINITY)).toBe('');
    expect(csvField(null)).toBe('');
  });

  it('quotes exactly the fields that need it, doubling quotes', () => {
    expect(csvField('plain text')).toBe('plain text');
    expect(csvField('a, b')).toBe('"a, b"');
    expect(csvField('say "ah"')).toBe('"say ""ah"""');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
    expect(csvField('cr\ronly')).toBe('"cr\ronly"');
    expect(csvField(' spaced ')).toBe(' spaced ');
    expect(csvField('')).toBe('');
  });
});

describe('labels', () => {
  it('from a note, with commas, quotes and non-ASCII text, read back unchanged', () => {
    const label = 'arrivée, "très" essoufflé — Δ 😮‍💨 ü';
    const result = checked(`@ day 1 08:00  ${label}\nvitals hr 100, spo2 91 %\n@ +30m  naïve 'quote'\nvitals hr 96`);
    const rows = timepointRows('dir with space/é.pneu', result, plain);
    expect(rows[0]?.label).toBe(label);
    expectSameRows(exportColumns(), rows, toCsv(exportColumns(), rows));
  });

  it('with line breaks (not possible in a note, but in data passed in) read back unchanged', () => {
    const result = checked('@ day 1 08:00  x\nvitals hr 100');
    const row = timepointRows('a.pneu', result, plain)[0];
    if (!row) throw new Error('no row');
    const rows = ['one\ntwo', 'three\r\nfour', 'five\rsix', '"\n"', ',\n,'].map((label) => ({ ...row, label }));
    expectSameRows(exportColumns(), rows, toCsv(exportColumns(), rows));
  });

  it('of any string survive the round trip (property)', () => {
    const result = checked('@ day 1 08:00  x\noxygen venturi, fio2 40 %\nvitals hr 100, rr 20\nabg 7.31/47/71/23');
    const row = timepointRows('a.pneu', result, plain)[0];
    if (!row) throw new Error('no row');
    expect(row.pf_ratio).toBeCloseTo(177.5, 9);
    const columns = exportColumns();
    const tricky = fc.constantFrom(',', '"', '\r', '\n', '\r\n', ' ', '\t', 'é', '😀', '\u2028', '\ufeff', '=', 'a');
    const label = fc.oneof(fc.string({ unit: 'binary' }), fc.string({ unit: tricky }), fc.string({ unit: 'grapheme' }));
    fc.assert(
      fc.property(fc.array(label, { minLength: 1, maxLength: 4 }), (labels) => {
        const rows = labels.map((l): Row => ({ ...row, label: l, file: l }));
        const back = readBack(toCsv(columns, rows));
        expect(back.map((r) => r.label)).toEqual(labels);
        expect(back.map((r) => r.file)).toEqual(labels);
        expect(back.map((r) => Number(r.pf_ratio))).toEqual(rows.map((r) => r.pf_ratio));
      }),
      { numRuns: 300 },
    );
  });
});

describe('redactProse', () => {
  it('leaves the label column empty', () => {
    const result = checked('@ day 1 08:00  Mr Example, room 12\nvitals hr 100');
    const text = toCsv(exportColumns(), timepointRows('a.pneu', result, { redactProse: true, shiftDays: 0 }));
    expect(text).not.toContain('Example');
    expect(readBack(text)[0]?.label).toBe('');
  });
});

describe('text that starts like a spreadsheet formula', () => {
  const note = '@ day 1 08:00  =HYPERLINK("http://example.invalid","a, b")\nvitals hr 90\n@ +1h  +1\nabg be -4\n@ +1h  -2+3\n@ +1h  @cmd\n@ +1h  \'quoted\n@ +1h  plain = fine';
  const safe = { spreadsheetSafe: true } as const;

  it('is kept exactly by default (pipelines need the text as written)', () => {
    const rows = timepointRows('=x.pneu', checked(note), plain);
    const back = readBack(toCsv(exportColumns(), rows));
    expect(back.map((r) => r.label)).toEqual(['=HYPERLINK("http://example.invalid","a, b")', '+1', '-2+3', '@cmd', "'quoted", 'plain = fine']);
    expect(back[0]?.file).toBe('=x.pneu');
  });

  it('with spreadsheetSafe gets one apostrophe in front of text only, and removing it gives the text back', () => {
    const rows = timepointRows('=x.pneu', checked(note), plain);
    const back = readBack(toCsv(exportColumns(), rows, safe));
    expect(back.map((r) => r.label)).toEqual(['\'=HYPERLINK("http://example.invalid","a, b")', "'+1", "'-2+3", "'@cmd", "''quoted", 'plain = fine']);
    expect(back.map((r) => r.file)).toEqual(Array(6).fill("'=x.pneu"));
    expect(back[1]?.base_excess_mmol_L).toBe('-4'); // a number, never changed
    const undo = (cell: string) => (cell.startsWith("'") ? cell.slice(1) : cell);
    expect(back.map((r) => undo(r.label!))).toEqual(rows.map((r) => r.label ?? ''));
  });

  it('starts the file with a byte-order mark (so spreadsheet programs read UTF-8), only then', () => {
    const rows = timepointRows('a.pneu', checked('@ day 1 08:00  arrivée\nvitals hr 90'), plain);
    const text = toCsv(exportColumns(), rows, safe);
    expect(text.startsWith('\ufefffile,')).toBe(true);
    expect(toCsv(exportColumns(), rows).startsWith('file,')).toBe(true);
    expect((parse(text, { columns: true, bom: true }) as Record<string, string>[])[0]?.label).toBe('arrivée');
  });

  it('guards tab, carriage return and line feed at the start too, and nothing else', () => {
    // OWASP, "CSV Injection" (OWASP/www-community, pages/attacks/CSV_Injection.md at 0e5e8f00, August 2025): no cell
    // may begin with =, +, -, @, tab (0x09), carriage return (0x0D) or line feed (0x0A).
    expect(['=1', '+1', '-1', '@a', '\tx', '\rx', '\nx', "'x"].map(spreadsheetText)).toEqual(["'=1", "'+1", "'-1", "'@a", "'\tx", "'\rx", "'\nx", "''x"]);
    expect(csvField('\n=1+2', safe)).toBe('"\'\n=1+2"');
    expect(['a=1', ' =1', '1', '', 'ü'].map(spreadsheetText)).toEqual(['a=1', ' =1', '1', '', 'ü']);
    expect(csvField(-4, safe)).toBe('-4');
    expect(csvField('=a,b', safe)).toBe('"\'=a,b"');
  });

  it('reads back exactly after removing one leading apostrophe, for any text (property)', () => {
    const result = checked('@ day 1 08:00  x\nvitals hr 100');
    const row = timepointRows('a.pneu', result, plain)[0]!;
    const start = fc.constantFrom('=', '+', '-', '@', '\t', '\r', "'", 'a', ',', '"', '\n');
    fc.assert(
      fc.property(fc.array(fc.string({ unit: start }), { minLength: 1, maxLength: 4 }), (labels) => {
        const back = readBack(toCsv(exportColumns(), labels.map((l): Row => ({ ...row, label: l })), safe));
        expect(back.map((r) => (r.label!.startsWith("'") ? r.label!.slice(1) : r.label))).toEqual(labels);
        for (const r of back) expect(r.label).not.toMatch(/^[=+\-@\t\r]/);
      }),
      { numRuns: 300 },
    );
  });
});
