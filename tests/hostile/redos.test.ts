// No regular expression in the project can backtrack catastrophically. Every regex literal and
// every `new RegExp("...")` with a literal pattern in the sources (TypeScript stripped of types
// by esbuild, then parsed with acorn) is analysed with redos-detector, a ReDoS analyser from the
// npm registry. The TextMate grammar's patterns are checked in tests/grammar/regex-safety.test.ts.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'acorn';
import { simple } from 'acorn-walk';
import { transformSync } from 'esbuild';
import { isSafe } from 'redos-detector';
import { describe, expect, it } from 'vitest';

const ROOTS = ['server/src', 'client/src', 'client/webview', 'grammar/build-grammar.mjs', 'esbuild.mjs'];

function files(path: string): string[] {
  if (statSync(path).isFile()) return [path];
  return readdirSync(path).flatMap((name) => files(join(path, name))).filter((f) => /\.(ts|mjs|js)$/.test(f));
}

interface Found {
  readonly file: string;
  readonly source: string;
  readonly flags: string;
}

function regexesOf(file: string): Found[] {
  const code = file.endsWith('.ts') ? transformSync(readFileSync(file, 'utf8'), { loader: 'ts', format: 'esm' }).code : readFileSync(file, 'utf8');
  const ast = parse(code, { ecmaVersion: 'latest', sourceType: 'module' });
  const found: Found[] = [];
  simple(ast, {
    Literal(node) {
      const regex = (node as unknown as { regex?: { pattern: string; flags: string } }).regex;
      if (regex) found.push({ file, source: regex.pattern, flags: regex.flags });
    },
    NewExpression(node) {
      const callee = node.callee as { type: string; name?: string };
      const first = node.arguments[0] as { type: string; value?: unknown } | undefined;
      if (callee.type === 'Identifier' && callee.name === 'RegExp' && first?.type === 'Literal' && typeof first.value === 'string') {
        const second = node.arguments[1] as { type: string; value?: unknown } | undefined;
        found.push({ file, source: first.value, flags: second?.type === 'Literal' && typeof second.value === 'string' ? second.value : '' });
      }
    },
  });
  return found;
}

const all = ROOTS.flatMap(files).flatMap(regexesOf);

describe('regular expressions', () => {
  it('are found in the sources (the scan works)', () => {
    expect(all.length).toBeGreaterThan(10);
  });

  it.each(all.map((r) => [`${r.file}: /${r.source}/${r.flags}`, r] as const))('%s is safe from catastrophic backtracking', (_name, r) => {
    const result = isSafe(new RegExp(r.source, r.flags.replace(/[gy]/g, '')), { timeout: 5000 });
    expect(result.safe, `${r.file}: /${r.source}/ — ${result.error ?? 'unsafe'}`).toBe(true);
  });
});
