// What the server sends for the core's results: text that quotes the note (messages, related
// information, code action titles) with invisible and reordering characters written as escapes.
import { describe, expect, it } from 'vitest';
import type { Finding } from '../../server/src/core/types';
import { toCodeAction, toDiagnostic } from '../../server/src/server/translate';

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
