import type { LineFix, Span } from '../syntax/tree';

/** Aliases of the checks that report problems found while reading values. */
export type ReadCheckAlias =
  | 'unknown-key'
  | 'unknown-unit'
  | 'unit-not-allowed'
  | 'other-unit-likely'
  | 'unknown-word'
  | 'duplicate-key'
  | 'bad-time';

/** A problem met while reading a stated value; reported by the check with the same alias. */
export interface ReadIssue {
  readonly check: ReadCheckAlias;
  readonly line: number;
  readonly span: Span;
  readonly message: string;
  readonly fixes: readonly LineFix[];
  readonly related?: readonly { readonly line: number; readonly span: Span; readonly message: string }[];
}
