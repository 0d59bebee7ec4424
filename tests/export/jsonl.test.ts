// JSON Lines: one object per timepoint with the column keys (nulls kept) and its findings.
import { describe, expect, it } from 'vitest';
import { exportColumns, jsonlRecords, timepointRows, toJsonl } from '../../server/src/core/export';
import { CHECKS } from '../../server/src/core/checks/registry';
import { checked, samples } from './helpers';

const plain = { redactProse: false, shiftDays: 0 } as const;

describe('JSON Lines', () => {
  it.each(samples().map((s) => [s.name, s] as const))('%s: one object per line, the row values plus findings', (_name, s) => {
    const text = toJsonl(s.path, s.result, plain);
    expect(text.endsWith('\n')).toBe(true);
    const objects = text.trimEnd().split('\n').map((line) => JSON.parse(line) as Record<string, unknown>);
    const rows = timepointRows(s.path, s.result, plain);
    expect(objects).toHaveLength(rows.length);
    objects.forEach((o, i) => {
      expect(Object.keys(o)).toEqual([...exportColumns().map((c) => c.name), 'findings']);
      const { findings, ...cells } = o;
      expect(cells).toEqual(rows[i]);
      expect(Array.isArray(findings)).toBe(true);
    });
  });

  it('writes each record as JSON.stringify writes it (quotes, escapes, other scripts, redaction)', () => {
    const note = '@ day 1 08:00  "quoted", back\\slash, tab\there, é中 😀\nvitals hr 90, spo2 91 %\nabg 7.31/52/61/26\n@ +2h\nvitals hr 85 bpm\n';
    const cases = [...samples().map((s) => [s.path, s.result] as const), ['dir "x"/é.pneu', checked(note)] as const];
    for (const [path, result] of cases) {
      for (const options of [plain, { redactProse: true, shiftDays: -3 }]) {
        expect(toJsonl(path, result, options)).toBe(jsonlRecords(path, result, options).map((r) => `${JSON.stringify(r)}\n`).join(''));
      }
    }
  });

  it('lists the findings of each timepoint with 1-based line and UTF-16 column', () => {
    const s = samples().find((x) => x.name === 'icu-ventilated-lung-injury')!;
    const [first] = jsonlRecords(s.path, s.result, plain);
    expect(first?.findings[0]).toEqual({
      code: 'PN405',
      severity: 'warning',
      line: 7,
      column: 58,
      message: 'Driving pressure is 19 cmH2O (plateau − PEEP), above 15 cmH2O.',
    });
    const broken = samples().find((x) => x.name === 'broken-note')!;
    const all = jsonlRecords(broken.path, broken.result, plain).flatMap((r) => r.findings.map((f) => f.code));
    // PN101 is on a header line (before the first timepoint) and belongs to no row.
    expect(all).not.toContain('PN101');
    expect(all).toContain('PN308');
  });

  it('counts columns in UTF-16 code units, as the core does', () => {
    const result = checked('@ day 1 08:00  😀\nvitals hr 100, rrr 5');
    const [record] = jsonlRecords('a.pneu', result, plain);
    expect(record?.findings.map((f) => [f.code, f.line, f.column])).toEqual([['PN201', 2, 16]]);
  });

  it('with redactProse: no label, and check titles instead of messages that may quote the note', () => {
    const result = checked('@ day 1 08:00  Mrs Example\nvitals hr 100 Smithson\n@ day 0 07:00  Example again');
    const text = toJsonl('a.pneu', result, { redactProse: true, shiftDays: 0 });
    expect(text).not.toContain('Example');
    expect(text).not.toContain('Smithson');
    const records = jsonlRecords('a.pneu', result, { redactProse: true, shiftDays: 0 });
    const titles = new Map(CHECKS.map((c) => [c.code, c.title]));
    for (const f of records.flatMap((r) => r.findings)) expect(f.message).toBe(titles.get(f.code));
    expect(records.map((r) => r.label)).toEqual([null, null]);
    const open = toJsonl('a.pneu', result, plain);
    expect(open).toContain('Smithson');
  });

  it('is empty for a note without timepoints', () => {
    expect(toJsonl('a.pneu', checked('# nothing yet\n'), plain)).toBe('');
  });
});
