/**
 * Tokenizes lines with the committed TextMate grammar, using the same engine as VS Code
 * (vscode-textmate with the Oniguruma WebAssembly build). Both come with vscode-tmgrammar-test,
 * so they are resolved from there rather than listed as dependencies of their own.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';

export const GRAMMAR_FILE = 'grammar/pneumark.tmLanguage.json';

export interface ScopedToken {
  readonly text: string;
  readonly start: number;
  readonly end: number;
  /** Scopes from the outermost (`source.pneumark`) inwards. */
  readonly scopes: readonly string[];
}

interface RawToken {
  readonly startIndex: number;
  readonly endIndex: number;
  readonly scopes: string[];
}
interface TextMateGrammar {
  tokenizeLine(line: string, state: unknown): { tokens: RawToken[]; ruleStack: unknown };
}
interface TextMateModule {
  readonly INITIAL: unknown;
  Registry: new (options: unknown) => { loadGrammar(scope: string): Promise<TextMateGrammar | null> };
  parseRawGrammar(content: string, path: string): unknown;
}
interface OnigurumaModule {
  loadWASM(data: ArrayBuffer): Promise<void>;
  OnigScanner: new (patterns: string[]) => unknown;
  OnigString: new (text: string) => unknown;
}

const local = createRequire(import.meta.url);
const fromTester = createRequire(local.resolve('vscode-tmgrammar-test/package.json'));

let loaded: Promise<{ grammar: TextMateGrammar; initial: unknown }> | null = null;

function load(): Promise<{ grammar: TextMateGrammar; initial: unknown }> {
  loaded ??= (async () => {
    const tm = fromTester('vscode-textmate') as TextMateModule;
    const onig = fromTester('vscode-oniguruma') as OnigurumaModule;
    const wasm = readFileSync(fromTester.resolve('vscode-oniguruma/release/onig.wasm'));
    await onig.loadWASM(wasm.buffer.slice(wasm.byteOffset, wasm.byteOffset + wasm.byteLength) as ArrayBuffer);
    const registry = new tm.Registry({
      onigLib: Promise.resolve({
        createOnigScanner: (patterns: string[]) => new onig.OnigScanner(patterns),
        createOnigString: (text: string) => new onig.OnigString(text),
      }),
      loadGrammar: async () => tm.parseRawGrammar(readFileSync(GRAMMAR_FILE, 'utf8'), GRAMMAR_FILE),
    });
    const grammar = await registry.loadGrammar('source.pneumark');
    if (!grammar) throw new Error(`could not load ${GRAMMAR_FILE}`);
    return { grammar, initial: tm.INITIAL };
  })();
  return loaded;
}

/** Tokenizes consecutive lines (the state carries from line to line, as in the editor). */
export async function tokenizeLines(lines: readonly string[]): Promise<ScopedToken[][]> {
  const { grammar, initial } = await load();
  let state = initial;
  return lines.map((line) => {
    const result = grammar.tokenizeLine(line, state);
    state = result.ruleStack;
    return result.tokens.map((t) => ({ text: line.slice(t.startIndex, t.endIndex), start: t.startIndex, end: Math.min(t.endIndex, line.length), scopes: t.scopes }));
  });
}

export async function tokenizeLine(line: string): Promise<ScopedToken[]> {
  return (await tokenizeLines([line]))[0]!;
}

/** Scopes of the character at `index` of a tokenized line. */
export function scopesAt(tokens: readonly ScopedToken[], index: number): readonly string[] {
  return tokens.find((t) => t.start <= index && index < t.end)?.scopes ?? [];
}

/** Scopes of the first occurrence of `text` in the line (of its first character). */
export function scopesOf(line: string, tokens: readonly ScopedToken[], text: string, from = 0): readonly string[] {
  const at = line.indexOf(text, from);
  if (at < 0) throw new Error(`\`${text}\` is not in \`${line}\``);
  return scopesAt(tokens, at);
}
