// docs/checks.md is generated from the check registry; it must match what the generator writes.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { renderCheckDocs } from '../server/src/core/checks/docs';
import { CHECKS, docAnchor } from '../server/src/core/checks/registry';
import { FIELD_TABLE_START, renderFieldTable, replaceBetween, withGeneratedTables } from '../server/src/core/fields/docs';
import { FIELDS } from '../server/src/core/fields/registry';
import { SECTIONS } from '../server/src/core/fields/sections';
import { HB_MMOL_PER_L, UNITS } from '../server/src/core/fields/units';
import { checkNote } from '../server/src/core/check-note';
import { formatNote } from '../server/src/core/service';
import { COLUMNS_END, COLUMNS_START, renderColumnTable } from '../server/src/core/export/docs';

describe('check documentation', () => {
  it('is up to date with the registry (run `npm run docs` after changing a check)', () => {
    expect(readFileSync('docs/checks.md', 'utf8')).toBe(renderCheckDocs());
  });

  it('grammar/README.md carries the current tables of blanks, of keys and units, and of derived values', () => {
    const doc = readFileSync('grammar/README.md', 'utf8');
    expect(doc).toContain(FIELD_TABLE_START);
    expect(doc).toContain('<!-- blanks:start');
    expect(doc).toContain('<!-- derived:start');
    expect(withGeneratedTables(doc)).toBe(doc);
  });

  it('grammar/README.md lists every spelling a note may write: units and the words of word fields', () => {
    const table = renderFieldTable().toLowerCase();
    for (const u of UNITS) for (const spelling of [u.id, ...u.aliases]) {
      if (u.id === '%sat') continue; // written as `%`, listed with the fraction's percentage
      if (u.id === HB_MMOL_PER_L && spelling === u.id) continue; // internal: haemoglobin's mmol/L is written `mmol/L`, listed
      expect(table, spelling).toContain(`\`${spelling.toLowerCase()}\``);
    }
    for (const f of FIELDS) for (const word of Object.keys(f.words ?? {})) expect(table, word).toMatch(new RegExp(`(?:[:,]|\\(or) ${word}[,) |]`));
  });

  it('the example note of grammar/README.md reads without a syntax, key or unit finding, and is in the formatter\'s layout', () => {
    const doc = readFileSync('grammar/README.md', 'utf8');
    const example = /```pneu\n([\s\S]*?)```/.exec(doc)?.[1];
    expect(example).toBeDefined();
    const findings = checkNote(example!).findings;
    expect(findings.filter((f) => f.code < 'PN300' || f.severity === 'error').map((f) => `${f.code} ${f.message}`)).toEqual([]);
    expect(formatNote(example!)).toBe(example);
  });

  it('README.md carries the current list of export columns', () => {
    const doc = readFileSync('README.md', 'utf8');
    expect(doc).toContain(COLUMNS_START);
    expect(replaceBetween(doc, COLUMNS_START, COLUMNS_END, renderColumnTable())).toBe(doc);
  });

  it('has a section per check at its anchor', () => {
    const text = renderCheckDocs();
    for (const c of CHECKS) expect(text).toContain(`<a id="${docAnchor(c)}"></a>`);
  });
});

describe('what the documents show a note write gives what they say', () => {
  it('the documented example of every check raises that check (PN900, an internal error, has none to show)', () => {
    const silent = CHECKS.filter((c) => c.code !== 'PN900' && !checkNote(c.doc.example).findings.some((f) => f.code === c.code)).map((c) => `${c.code}: ${c.doc.example}`);
    expect(silent).toEqual([]);
  });

  it('the EBNF of grammar/README.md names the sections, the words of a note line and the devices the registries know', () => {
    const doc = readFileSync('grammar/README.md', 'utf8');
    const ebnf = /```ebnf\n([\s\S]*?)```/.exec(doc)?.[1] ?? '';
    const quoted = (rule: string): string[] => {
      const body = new RegExp(`^${rule}\\s+=([\\s\\S]*?);`, 'm').exec(ebnf)?.[1] ?? '';
      return [...body.replace(/\(\*[\s\S]*?\*\)/g, '').matchAll(/"([^"]+)"/g)].map((m) => m[1]!);
    };
    const note = SECTIONS.find((s) => s.kind === 'prose')!;
    expect(quoted('note-word')).toEqual([note.id, ...note.aliases]);
    expect(quoted('section')).toEqual(SECTIONS.filter((s) => s.kind !== 'prose').map((s) => s.id));
    const devices = Object.keys(FIELDS.find((f) => f.id === 'device')!.words ?? {});
    const listed = quoted('device');
    expect(listed.length).toBeGreaterThan(5);
    expect(listed.filter((d) => !devices.includes(d))).toEqual([]);
    const spellings = UNITS.flatMap((u) => [u.id, ...u.aliases]);
    const units = quoted('unit');
    expect(units.length).toBeGreaterThan(5);
    expect(units.filter((u) => !spellings.includes(u))).toEqual([]);
  });
});
