/**
 * The grammar knows every spelling of the registries: section names, keys per section, unit
 * spellings, device words, ventilator modes, sex words and gas units, in any case.
 */
import { describe, expect, it } from 'vitest';
import { unitSpellings } from '../../grammar/build-grammar.mjs';
import { FIELDS, SECTIONS, UNITS } from '../../server/src/core/index';
import { keysInSection } from '../../server/src/core/fields/registry';
import { scopesOf, tokenizeLine } from './tokenize';

const S = (name: string) => `${name}.pneumark`;
const variants = (word: string) => [...new Set([word, word.toUpperCase(), word.charAt(0).toUpperCase() + word.slice(1)])];

/** Collects `word → what went wrong` instead of stopping at the first, for a readable failure. */
async function misses(cases: readonly { line: string; word: string; from?: number; scope: string }[]): Promise<string[]> {
  const out: string[] = [];
  for (const c of cases) {
    const tokens = await tokenizeLine(c.line);
    const scopes = scopesOf(c.line, tokens, c.word, c.from ?? 0);
    if (!scopes.includes(c.scope)) out.push(`${c.line}  →  \`${c.word}\`: ${scopes.join(' ')}`);
  }
  return out;
}

describe('the grammar knows the registries', () => {
  it('every section name and alias, in any case', async () => {
    const cases = SECTIONS.flatMap((s) => [s.id, ...s.aliases].flatMap((name) => variants(name).map((w) => ({ line: `${w} x`, word: w, scope: S('keyword.other.section') }))));
    expect(await misses(cases)).toEqual([]);
  });

  it('every key alias of each section, and no key of another section', async () => {
    const cases = SECTIONS.filter((s) => s.kind !== 'prose').flatMap((s) => {
      const own = keysInSection(s.id);
      const others = FIELDS.flatMap((f) => f.aliases).filter((k) => !own.includes(k));
      return [
        ...own.flatMap((k) => variants(k).map((w) => ({ line: `${s.id} 1, ${w} 2`, word: w, from: s.id.length + 3, scope: S('variable.other.key') }))),
        ...others.map((k) => ({ line: `${s.id} 1, ${k} 2`, word: k, from: s.id.length + 3, scope: S('variable.other.key.unknown') })),
      ];
    });
    expect(await misses(cases)).toEqual([]);
  });

  it('every unit spelling, after a blank and glued to the number', async () => {
    const cases = unitSpellings(UNITS).flatMap((u) => variants(u).flatMap((w) => [
      { line: `vitals hr 1 ${w}`, word: w, from: 10, scope: S('keyword.other.unit') },
      { line: `vitals hr 1${w}`, word: w, from: 10, scope: S('keyword.other.unit') },
    ]));
    expect(await misses(cases)).toEqual([]);
  });

  it('every unit spelling of two words, after a blank (`mm Hg`) or glued to the number (`1mm Hg`), as the parser reads it', async () => {
    const twoWords = unitSpellings(UNITS, true).filter((u) => /\s/.test(u));
    expect(twoWords.length).toBeGreaterThan(0);
    const cases = twoWords.flatMap((u) => variants(u).flatMap((w) => [
      { line: `abg po2 1 ${w}, pco2 2`, word: w.split(' ')[1]!, from: 10, scope: S('keyword.other.unit') },
      { line: `vent peep 1 ${w}`, word: w.split(' ')[1]!, from: 11, scope: S('keyword.other.unit') },
      { line: `abg po2 1${w}, pco2 2`, word: w.split(' ')[1]!, from: 9, scope: S('keyword.other.unit') },
      { line: `vent peep 1${w}`, word: w.split(' ')[1]!, from: 10, scope: S('keyword.other.unit') },
    ]));
    expect(await misses(cases)).toEqual([]);
  });

  it('every word value: devices (lead and keyed), modes, sex words, gas units', async () => {
    const words = (id: string) => Object.keys(FIELDS.find((f) => f.id === id)?.words ?? {});
    const oxygenKeys = keysInSection('oxygen');
    const cases = [
      ...words('device').filter((w) => !oxygenKeys.includes(w)).flatMap((w) => variants(w).flatMap((v) => [
        { line: `oxygen ${v} 2`, word: v, scope: S('constant.language') },
        { line: `oxygen device ${v}, fio2 0.4`, word: v, scope: S('constant.language') },
      ])),
      ...words('mode').flatMap((w) => variants(w).map((v) => ({ line: `vent mode ${v}, peep 5`, word: v, scope: S('constant.language') }))),
      ...words('sex').flatMap((w) => variants(w).map((v) => ({ line: `patient age 40, sex ${v}`, word: v, from: 19, scope: S('constant.language') }))),
      ...words('gas_unit').flatMap((w) => variants(w).map((v) => ({ line: `units gas ${v}`, word: v, from: 9, scope: S('constant.language') }))),
    ];
    expect(cases.length).toBeGreaterThan(40);
    expect(await misses(cases)).toEqual([]);
  });
});

describe('grammar/README.md names the scopes of the grammar', () => {
  it('every scope the grammar gives, and none it does not', async () => {
    const { readFileSync } = await import('node:fs');
    const grammar = readFileSync('grammar/pneumark.tmLanguage.json', 'utf8');
    const spec = readFileSync('grammar/README.md', 'utf8');
    const given = new Set([...grammar.matchAll(/"name": *"([^"]+)"/g)].flatMap((m) => m[1]!.split(' ')).filter((n) => n.endsWith('.pneumark')).map((n) => n.slice(0, -'.pneumark'.length)));
    const lineScopes = SECTIONS.map((s) => `meta.line.${s.id}`);
    for (const l of lineScopes) expect(given, l).toContain(l);
    const named = new Set([...spec.matchAll(/`((?:meta|keyword|variable|constant|entity|string|comment|punctuation|invalid)\.[a-z0-9.<>-]+)`/g)].map((m) => m[1]!));
    expect([...given].filter((n) => !lineScopes.includes(n) && !named.has(n)), 'given and not named').toEqual([]);
    expect(named).toContain('meta.line.<section>');
    expect([...named].filter((n) => n !== 'meta.line.<section>' && !given.has(n)), 'named and not given').toEqual([]);
  });
});
