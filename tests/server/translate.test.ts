// What the server sends for the core's results: text that quotes the note (messages, related
// information, code action titles) with invisible and reordering characters written as escapes.
import { describe, expect, it } from 'vitest';
import { SymbolKind } from 'vscode-languageserver-protocol';
import type { SymbolInfo } from '../../server/src/core/service/types';
import type { Finding } from '../../server/src/core/types';
import { findingsToPublish, toCodeAction, toDiagnostic, toDocumentSymbol } from '../../server/src/server/translate';

const range = { start: { line: 1, character: 7 }, end: { line: 1, character: 10 } };

describe('text quoted from the note', () => {
  it('is escaped in a diagnostic’s message and related information, and in a code action’s title', () => {
    const finding = {
      code: 'PN201', severity: 'error', range, message: '`h\u200dr` is not a key of vitals lines. Did you mean `hr`?', docAnchor: 'pn201-unknown-key',
      related: [{ range, message: 'first `s\u00adpo2` here' }],
    } as unknown as Finding;
    const d = toDiagnostic(finding, 'file:///n.pneu', 'file:///docs/checks.md');
    expect(d.message).toBe('`h\\u{200D}r` is not a key of vitals lines. Did you mean `hr`?');
    expect(d.relatedInformation?.[0]?.message).toBe('first `s\\u{00AD}po2` here');
    const action = toCodeAction({ title: 'Replace `Jo\u200dhn` with [name]', kind: 'quickfix', edits: [] }, 'file:///n.pneu', [d]);
    expect(action.title).toBe('Replace `Jo\\u{200D}hn` with [name]');
  });

  it('keeps letters of every script and emoji as they are', () => {
    const finding = { code: 'PN501', severity: 'warning', range, message: '`می\u200cخواهم` and 👩\u200d⚕️ · סימן', docAnchor: 'pn501' } as unknown as Finding;
    expect(toDiagnostic(finding, 'file:///n.pneu', 'file:///docs').message).toBe('`می\u200cخواهم` and 👩\u200d⚕️ · סימן');
  });
});

describe('findingsToPublish', () => {
  const severities = ['hint', 'error', 'information', 'warning', 'warning', 'error', 'hint', 'information', 'error', 'warning'] as const;
  const findings = severities.map((severity, at) => ({ severity, at }));

  it('keeps every finding up to the limit, in note order', () => {
    expect(findingsToPublish(findings, 10)).toBe(findings);
  });

  it('keeps the most severe above it, ties in note order, all of them in note order', () => {
    const ats = (limit: number) => findingsToPublish(findings, limit).map((f) => f.at);
    expect(ats(3)).toEqual([1, 5, 8]);
    expect(ats(4)).toEqual([1, 3, 5, 8]);
    expect(ats(6)).toEqual([1, 3, 4, 5, 8, 9]);
    expect(ats(7)).toEqual([1, 2, 3, 4, 5, 8, 9]);
    expect(ats(9)).toEqual([0, 1, 2, 3, 4, 5, 7, 8, 9]);
    expect(ats(0)).toEqual([]);
  });

  it('picks as a sort by severity then note order would, on generated findings', () => {
    const order = { error: 0, warning: 1, information: 2, hint: 3 } as const;
    for (let seed = 1; seed <= 50; seed++) {
      let x = seed;
      const next = () => (x = (x * 1103515245 + 12345) % 2147483648);
      const many = Array.from({ length: 200 + (next() % 300) }, (_, at) => ({ severity: (['error', 'warning', 'information', 'hint'] as const)[next() % 4]!, at }));
      const limit = next() % many.length;
      const expected = [...many].sort((a, b) => order[a.severity] - order[b.severity] || a.at - b.at).slice(0, limit).sort((a, b) => a.at - b.at);
      expect(findingsToPublish(many, limit)).toEqual(expected);
    }
  });
});

describe('toDocumentSymbol', () => {
  const line = (n: number, end: number) => ({ start: { line: n, character: 0 }, end: { line: n, character: end } });
  it('sends no `children` for a symbol that has none (a section line, a timepoint outlined alone), saving their bytes in a big outline', () => {
    const section: SymbolInfo = { name: 'abg', detail: '7.40/40/90/24', kind: 'section', range: line(2, 23), selectionRange: line(2, 3), children: [] };
    expect(toDocumentSymbol(section)).toEqual({ name: 'abg', detail: '7.40/40/90/24', kind: SymbolKind.Field, range: line(2, 23), selectionRange: line(2, 3) });
    expect('children' in toDocumentSymbol(section)).toBe(false);
    const timepoint: SymbolInfo = { name: 'round', detail: '08:00', kind: 'timepoint', range: { start: line(1, 0).start, end: line(2, 23).end }, selectionRange: line(1, 14), children: [section] };
    expect(toDocumentSymbol(timepoint).children).toEqual([toDocumentSymbol(section)]);
  });
});
