// Types of grammar/build-grammar.mjs, for the TypeScript tests that import its pure functions.

export interface GrammarRegistries {
  readonly SECTIONS: readonly { readonly id: string; readonly aliases: readonly string[]; readonly kind: string }[];
  readonly FIELDS: readonly {
    readonly id: string;
    readonly sections: readonly string[];
    readonly aliases: readonly string[];
    readonly kind: string;
    readonly words?: Readonly<Record<string, string>>;
    readonly openWords?: boolean;
  }[];
  readonly UNITS: readonly { readonly id: string; readonly aliases: readonly string[] }[];
  /** The blanks of the format (blanks.ts): `\s` in the grammar's patterns is written as these. */
  readonly BLANKS: readonly { readonly code: number; readonly name: string }[];
}

export interface GrammarRule {
  readonly comment?: string;
  readonly name?: string;
  readonly match?: string;
  readonly begin?: string;
  readonly end?: string;
  readonly include?: string;
  readonly captures?: Readonly<Record<string, GrammarRule>>;
  readonly beginCaptures?: Readonly<Record<string, GrammarRule>>;
  readonly endCaptures?: Readonly<Record<string, GrammarRule>>;
  readonly patterns?: readonly GrammarRule[];
}

export interface Grammar {
  readonly name: string;
  readonly scopeName: string;
  readonly fileTypes: readonly string[];
  readonly patterns: readonly GrammarRule[];
  readonly repository: Readonly<Record<string, GrammarRule>>;
}

export interface Snippet {
  readonly prefix: string | readonly string[];
  readonly body: readonly string[];
  readonly description: string;
}

export function ci(word: string): string;
/** The inside of a character class of the blanks, with `\n` and `\r` (`\u0009-\u000D\u0020…`). */
export function blankClassBody(blanks: GrammarRegistries['BLANKS']): string;
/** A pattern with each `\s` written as the class of the blanks (`body` from `blankClassBody`). */
export function withBlanks(source: string, body: string): string;
/** Unit spellings a note can write; those of two words (`mm hg`) only with `twoWords`. */
export function unitSpellings(units: GrammarRegistries['UNITS'], twoWords?: boolean): string[];
export function buildGrammar(registries: GrammarRegistries): Grammar;
export function buildSnippets(registries: Pick<GrammarRegistries, 'FIELDS'>): Record<string, Snippet>;
export function toJsonText(value: unknown): string;
export const GRAMMAR_PATH: string;
export const SNIPPETS_PATH: string;
export function generatedFiles(registries: GrammarRegistries): { path: string; text: string }[];
