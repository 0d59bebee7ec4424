/**
 * The barrel and the citation records: every module is re-exported, SOURCES keys are unique
 * across modules, and every source key a doc comment names exists in its module's SOURCES.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import * as acidBase from '../../server/src/core/physiology/acid-base';
import * as atmosphere from '../../server/src/core/physiology/atmosphere';
import * as gas from '../../server/src/core/physiology/gas-exchange';
import * as growth from '../../server/src/core/physiology/growth';
import * as physiology from '../../server/src/core/physiology/index';
import * as mechanics from '../../server/src/core/physiology/mechanics';
import * as transport from '../../server/src/core/physiology/oxygen-transport';
import * as units from '../../server/src/core/physiology/units';
import { exportedFunctionNames } from './helpers';

const modules = {
  'acid-base': acidBase,
  atmosphere,
  'gas-exchange': gas,
  growth,
  mechanics,
  'oxygen-transport': transport,
  units,
} as const;

describe('physiology index', () => {
  it('re-exports every function of every module', () => {
    const exported = new Set(exportedFunctionNames(physiology));
    for (const [name, mod] of Object.entries(modules)) {
      for (const fn of exportedFunctionNames(mod)) expect(exported.has(fn), `${name}.${fn}`).toBe(true);
    }
  });

  it('merges SOURCES without key collisions', () => {
    const total = Object.values(modules).reduce((n, mod) => n + Object.keys(mod.SOURCES).length, 0);
    expect(Object.keys(physiology.SOURCES)).toHaveLength(total);
    expect(physiology.SOURCES_BY_MODULE.atmosphere).toBe(atmosphere.SOURCES);
  });

  it('every citation is a non-empty string', () => {
    for (const [key, citation] of Object.entries(physiology.SOURCES)) {
      expect(typeof citation, key).toBe('string');
      expect(citation.length, key).toBeGreaterThan(20);
    }
  });

  it('every citation says how it is known: recalled (from memory), common practice with no source, or what of it was read', () => {
    // A reference recalled and not checked must say so (the hovers, `show` and the format spec quote it).
    const KNOWN = /from memory|common practice|no source|not read here|read in its/;
    const unmarked = Object.entries(physiology.SOURCES).filter(([, citation]) => !KNOWN.test(citation)).map(([key]) => key);
    expect(unmarked).toEqual([]);
  });

  const KEY = /`([a-z0-9]+(?:-[a-z0-9]+)+)`/g;

  function moduleText(name: string): string {
    return readFileSync(fileURLToPath(new URL(`../../server/src/core/physiology/${name}.ts`, import.meta.url)), 'utf8');
  }

  it.each(Object.keys(modules))('%s.ts: every cited `key` exists in its SOURCES and every SOURCES key is cited', (name) => {
    const text = moduleText(name);
    const sources = Object.keys(modules[name as keyof typeof modules].SOURCES);
    const cited = new Set([...text.matchAll(KEY)].map((m) => m[1] ?? ''));
    for (const key of cited) expect(sources, `${name}: ${key}`).toContain(key);
    for (const key of sources) expect(cited.has(key), `${name}: ${key} is never cited`).toBe(true);
  });

  it.each(Object.keys(modules))('%s.ts: every exported function has a doc comment naming a source key', (name) => {
    const text = moduleText(name);
    const documented = new Map<string, string>();
    for (const m of text.matchAll(/\/\*\*((?:(?!\*\/)[\s\S])*)\*\/\s*export function (\w+)/g)) {
      documented.set(m[2] ?? '', m[1] ?? '');
    }
    for (const fn of exportedFunctionNames(modules[name as keyof typeof modules])) {
      const doc = documented.get(fn);
      expect(doc, `${name}.${fn} has no doc comment`).toBeDefined();
      expect([...(doc ?? '').matchAll(KEY)].length, `${name}.${fn} names no source key`).toBeGreaterThan(0);
    }
  });
});
