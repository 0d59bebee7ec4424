/**
 * Editor-neutral types of the language service: plain data that the LSP server translates
 * into protocol objects (Hover, InlayHint, CompletionItem, CodeAction, DocumentSymbol,
 * FoldingRange). Positions are LSP-style: 0-based lines, UTF-16 code units.
 */
import type { DerivedCategory } from '../derive/model';
import type { Finding, Position, Range, TextEdit } from '../types';

/** The one short caution every hover with clinical content ends with. */
export const CAUTION = 'Decision support only — defer to local protocols and licensed practice.';

export interface HoverInfo {
  /** The text the hover is about (a key, a value, a section word, a timepoint line). */
  readonly range: Range;
  readonly markdown: string;
}

/** Inlay-hint categories; the same as the derived-value categories. */
export type HintCategory = DerivedCategory;

export const HINT_CATEGORIES: readonly HintCategory[] = ['oxygenation', 'acid-base', 'mechanics', 'atmosphere', 'transport'];

/** The categories whose hints are off unless a setting turns them on (the others are on). */
export const HINTS_OFF_BY_DEFAULT: ReadonlySet<HintCategory> = new Set<HintCategory>(['transport']);

/** A line range, both ends inclusive. */
export interface LineSpan {
  readonly start: number;
  readonly end: number;
}

export interface InlayHintInfo {
  /** End of the line's content, before a trailing comment. */
  readonly position: Position;
  /** Compact text, e.g. `P/F 178 · A–a 24 (≤ 20)`; a trailing `*` marks a carried-forward input. */
  readonly label: string;
  readonly tooltipMarkdown: string;
  readonly category: HintCategory;
  /** Derived-value ids shown (an acid–base reading adds `interpretation:acid-base`). */
  readonly derivedIds: string[];
  /** True for the first hint at a position (the editor puts a space before it). */
  readonly paddingLeft?: boolean;
}

export interface CompletionInfo {
  readonly label: string;
  readonly kind: 'section' | 'key' | 'unit' | 'word' | 'snippet';
  readonly detail?: string;
  readonly documentation?: string;
  readonly insertText: string;
  readonly isSnippet?: boolean;
  /** The text the completion replaces (the whole word the cursor is in); absent: insert at the cursor. */
  readonly replace?: Range;
}

export type ActionKind = 'quickfix' | 'refactor.rewrite' | 'source.fixAll';

export interface ActionInfo {
  readonly title: string;
  readonly kind: ActionKind;
  /** Non-overlapping edits, applied together. */
  readonly edits: TextEdit[];
  /** Codes of the findings the action resolves. */
  readonly findingCodes?: string[];
  /** The findings the action resolves (a quick fix one, a fix-all those whose fixes it makes). */
  readonly resolves?: readonly Finding[];
  readonly preferred?: boolean;
}

export type SymbolKindName = 'header' | 'timepoint' | 'section';

export interface SymbolInfo {
  readonly name: string;
  readonly detail: string;
  readonly kind: SymbolKindName;
  /** Every line of the symbol (trailing blank lines excluded). */
  readonly range: Range;
  /** The line that names the symbol (the `@` line of a timepoint). */
  readonly selectionRange: Range;
  readonly children: SymbolInfo[];
}

export interface FoldingRangeInfo {
  readonly startLine: number;
  readonly endLine: number;
}
