/** Translations from the core's editor-neutral results to LSP types. Nothing is computed here. */
import {
  CodeActionKind,
  CompletionItemKind,
  DiagnosticSeverity,
  InsertTextFormat,
  MarkupKind,
  SymbolKind,
  type CodeAction,
  type CompletionItem,
  type Diagnostic,
  type DocumentSymbol,
  type InlayHint,
  type InsertReplaceEdit,
  type Position,
  type TextEdit,
} from 'vscode-languageserver/node';
import type { ActionInfo, CompletionInfo, InlayHintInfo, SymbolInfo } from '../core/service/types';
import type { Finding, Range, Severity } from '../core/types';
import { shownEscaped } from '../core/util/format';

const SEVERITY: Readonly<Record<Severity, DiagnosticSeverity>> = {
  error: DiagnosticSeverity.Error,
  warning: DiagnosticSeverity.Warning,
  information: DiagnosticSeverity.Information,
  hint: DiagnosticSeverity.Hint,
};

/**
 * A finding as a diagnostic. Its message, which may quote the note, has the characters that would
 * make it read as something the note does not hold written as escapes (`shownEscaped`: controls,
 * bidirectional controls, invisible characters, a joiner between Latin letters), as the command
 * line shows it: `h\u{200D}r` is not a key, where the editor's list of problems would show `hr`.
 */
export function toDiagnostic(f: Finding, uri: string, docsUri: string): Diagnostic {
  return {
    range: f.range,
    severity: SEVERITY[f.severity],
    code: f.code,
    codeDescription: { href: `${docsUri}#${f.docAnchor}` },
    source: 'pneumark',
    message: shownEscaped(f.message),
    ...(f.related && f.related.length > 0 ? { relatedInformation: f.related.map((r) => ({ location: { uri, range: r.range }, message: shownEscaped(r.message) })) } : {}),
  };
}

/**
 * The most diagnostics published for one note. A note of thousands of timepoints has a few
 * thousand findings; a pathological one (a line of 100,000 repeated keys) can have hundreds of
 * thousands, which take seconds to send and to show and help no one. Above the limit the errors
 * come first, then warnings, information and hints, each kind in note order, and one more
 * diagnostic says how many were left out (`tooManyFindings`).
 */
export const MAX_PUBLISHED_DIAGNOSTICS = 10_000;

const SEVERITY_RANK: Readonly<Record<Severity, number>> = { error: 0, warning: 1, information: 2, hint: 3 };

/** The findings to publish: all of them up to `limit`, else the most severe `limit`, in note order. */
export function findingsToPublish<F extends { readonly severity: Severity }>(findings: readonly F[], limit = MAX_PUBLISHED_DIAGNOSTICS): readonly F[] {
  if (findings.length <= limit) return findings;
  // Counted, not sorted: a hostile note has millions of findings, and a wrapper for each and a
  // sort of them took seconds on every publish. The severities above `cut` are kept whole, and of
  // the `cut` severity the first `room` in note order.
  const counts = [0, 0, 0, 0];
  for (let i = 0; i < findings.length; i++) counts[SEVERITY_RANK[findings[i]!.severity]]!++;
  let cut = 0;
  let room = limit;
  while (cut < 3 && counts[cut]! <= room) room -= counts[cut++]!;
  const kept: F[] = [];
  for (let i = 0; i < findings.length && kept.length < limit; i++) {
    const f = findings[i]!;
    const rank = SEVERITY_RANK[f.severity];
    if (rank < cut) kept.push(f);
    else if (rank === cut && room > 0) {
      kept.push(f);
      room--;
    }
  }
  return kept;
}

/** The diagnostic that says some findings were left out (`findingsToPublish`), at the note's first line. */
export function tooManyFindings(total: number, shown: number): Diagnostic {
  return {
    range: { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } },
    severity: DiagnosticSeverity.Information,
    source: 'pneumark',
    code: 'too-many-findings',
    message: `Pneumark shows ${shown.toLocaleString('en-GB')} of this note's ${total.toLocaleString('en-GB')} findings, the most severe first; \`pneumark check\` on the note lists them all.`,
  };
}

/** What a hint sent without its tooltip carries, to find it again on `inlayHint/resolve`. */
export interface HintRef {
  readonly uri: string;
  readonly version: number;
  readonly line: number;
  readonly category: string;
}

/**
 * A hint with its tooltip, or (`ref` given, for clients that resolve tooltips when one is
 * hovered) without it: the tooltips are most of a hint's size and few are ever read.
 */
export function toInlayHint(h: InlayHintInfo, ref: HintRef | null = null): InlayHint {
  if (ref) return { position: h.position, label: h.label, paddingLeft: h.paddingLeft ?? true, data: ref };
  return {
    position: h.position,
    label: h.label,
    tooltip: { kind: MarkupKind.Markdown, value: h.tooltipMarkdown },
    paddingLeft: h.paddingLeft ?? true,
  };
}

export function isHintRef(data: unknown): data is HintRef {
  if (typeof data !== 'object' || data === null) return false;
  const d = data as Record<string, unknown>;
  return typeof d['uri'] === 'string' && typeof d['version'] === 'number' && Number.isInteger(d['line']) && typeof d['category'] === 'string';
}

const COMPLETION_KIND: Readonly<Record<CompletionInfo['kind'], CompletionItemKind>> = {
  section: CompletionItemKind.Module,
  key: CompletionItemKind.Property,
  unit: CompletionItemKind.Unit,
  word: CompletionItemKind.EnumMember,
  snippet: CompletionItemKind.Snippet,
};

/**
 * A completion item. `c.replace` covers the whole word under the cursor; a client that supports
 * `insertReplaceSupport` gets both ranges (insert: up to the cursor; replace: the whole word) and
 * picks one by its own setting, any other client gets the whole word replaced.
 */
export function toCompletionItem(c: CompletionInfo, index: number, cursor: Position | null = null, insertReplace = false): CompletionItem {
  return {
    label: c.label,
    kind: COMPLETION_KIND[c.kind],
    ...(c.detail ? { detail: c.detail } : {}),
    ...(c.documentation ? { documentation: { kind: MarkupKind.Markdown, value: c.documentation } } : {}),
    insertTextFormat: c.isSnippet ? InsertTextFormat.Snippet : InsertTextFormat.PlainText,
    ...(c.replace ? { textEdit: completionEdit(c.replace, c.insertText, cursor, insertReplace) } : { insertText: c.insertText }),
    sortText: String(index).padStart(4, '0'),
  };
}

function completionEdit(replace: Range, newText: string, cursor: Position | null, insertReplace: boolean): TextEdit | InsertReplaceEdit {
  const inside = cursor !== null && cursor.line === replace.start.line && cursor.line === replace.end.line
    && cursor.character >= replace.start.character && cursor.character < replace.end.character;
  if (!insertReplace || !inside) return { range: replace, newText };
  return { newText, insert: { start: replace.start, end: cursor }, replace };
}

const ACTION_KIND: Readonly<Record<ActionInfo['kind'], string>> = {
  quickfix: CodeActionKind.QuickFix,
  'refactor.rewrite': CodeActionKind.RefactorRewrite,
  'source.fixAll': CodeActionKind.SourceFixAll,
};

/**
 * A code action, with the diagnostics it resolves: those of the findings the core says it fixes
 * (`resolves`), matched by code and range. Another finding of the same code is not claimed.
 */
export function toCodeAction(a: ActionInfo, uri: string, diagnostics: readonly Diagnostic[]): CodeAction {
  const keys = new Set((a.resolves ?? []).map((f) => diagnosticKey(f.code, f.range)));
  const related = keys.size > 0 ? diagnostics.filter((d) => typeof d.code === 'string' && keys.has(diagnosticKey(d.code, d.range))) : [];
  return {
    // A title may quote the note (`Replace \`…\` with [name]`): shown as diagnostics' messages are.
    title: shownEscaped(a.title),
    kind: ACTION_KIND[a.kind],
    edit: { changes: { [uri]: a.edits } },
    ...(related.length > 0 ? { diagnostics: related } : {}),
    ...(a.preferred ? { isPreferred: true } : {}),
  };
}

function diagnosticKey(code: string, r: Range): string {
  return `${code}@${r.start.line}:${r.start.character}-${r.end.line}:${r.end.character}`;
}

const SYMBOL_KIND: Readonly<Record<SymbolInfo['kind'], SymbolKind>> = {
  header: SymbolKind.Namespace,
  timepoint: SymbolKind.Event,
  section: SymbolKind.Field,
};

/**
 * A symbol of the outline. `children` (optional in the protocol) is left out when there are none:
 * a section line has none, and in the outline of a big note neither has a timepoint, so it would be
 * `"children":[]` thousands of times over.
 */
export function toDocumentSymbol(s: SymbolInfo): DocumentSymbol {
  const symbol: DocumentSymbol = {
    name: s.name || ' ',
    detail: s.detail,
    kind: SYMBOL_KIND[s.kind],
    range: s.range,
    selectionRange: s.selectionRange,
  };
  if (s.children.length > 0) symbol.children = s.children.map(toDocumentSymbol);
  return symbol;
}

export function rangesOverlap(a: Range, b: Range): boolean {
  const before = (p: Range['start'], q: Range['start']) => p.line < q.line || (p.line === q.line && p.character < q.character);
  return !before(a.end, b.start) && !before(b.end, a.start);
}
