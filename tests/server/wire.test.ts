// The stdio message encoder: ASCII bytes that decode to exactly what JSON.stringify would give,
// for any message, and diagnostics serialised once per diagnostic object.
import fc from 'fast-check';
import type { Message } from 'vscode-jsonrpc';
import { describe, expect, it } from 'vitest';
import { asciiJson, asciiJsonEncoder, encodeMessage, prepareJson } from '../../server/src/server/wire';

const decoded = (bytes: Uint8Array): unknown => JSON.parse(Buffer.from(bytes).toString('utf8'));
const isAscii = (bytes: Uint8Array): boolean => bytes.every((b) => b < 0x80);
const viaStringify = (msg: unknown): unknown => JSON.parse(JSON.stringify(msg));

const diagnostic = (message: string, line = 3) => ({
  range: { start: { line, character: 0 }, end: { line, character: 12 } },
  severity: 3,
  code: 'PN410',
  codeDescription: { href: 'file:///opt/pneumark/docs/checks.md#pn410' },
  source: 'pneumark',
  message,
});

describe('stdio message encoder', () => {
  it('gives the same message as JSON.stringify, in ASCII only, for any JSON (500 cases)', () => {
    fc.assert(
      fc.property(fc.jsonValue(), fc.string({ unit: 'binary' }), (params, method) => {
        const msg = { jsonrpc: '2.0', method, params } as unknown as Message;
        const bytes = encodeMessage(msg);
        expect(isAscii(bytes)).toBe(true);
        expect(decoded(bytes)).toEqual(viaStringify(msg));
      }),
      { numRuns: 500 },
    );
  });

  it('assembles publishDiagnostics from each diagnostic, with any text in the messages (300 cases)', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ unit: 'binary' }), { maxLength: 8 }), fc.option(fc.nat(), { nil: undefined }), fc.string({ unit: 'binary' }), (messages, version, uri) => {
        const params = version === undefined
          ? { uri, diagnostics: messages.map((m, i) => diagnostic(m, i)) }
          : { uri, version, diagnostics: messages.map((m, i) => diagnostic(m, i)) };
        const msg = { jsonrpc: '2.0', method: 'textDocument/publishDiagnostics', params } as unknown as Message;
        const bytes = encodeMessage(msg);
        expect(isAscii(bytes)).toBe(true);
        expect(decoded(bytes)).toEqual(viaStringify(msg));
      }),
      { numRuns: 300 },
    );
  });

  it('keeps typography through the escapes (en dash, ≤, ÷, emoji, a lone surrogate)', () => {
    const texts = ['P/F 279: consistent with the 200–300 band — not a diagnosis', 'PaO2 ÷ FiO2 ≤ 100', 'emoji 🫁 here', 'lone \ud800 surrogate'];
    const msg = { jsonrpc: '2.0', method: 'textDocument/publishDiagnostics', params: { uri: 'file:///n.pneu', version: 7, diagnostics: texts.map((t) => diagnostic(t)) } } as unknown as Message;
    const back = decoded(encodeMessage(msg)) as { params: { diagnostics: { message: string }[] } };
    expect(back.params.diagnostics.map((d) => d.message)).toEqual(texts.map((t) => (JSON.parse(JSON.stringify(t)) as string)));
    expect(asciiJson('200–300')).toBe('"200\\u2013300"');
  });

  it('serialises a diagnostic object once: the same object gives the same bytes in the next message', () => {
    const shared = diagnostic('consistent with a reading – kept');
    const first = encodeMessage({ jsonrpc: '2.0', method: 'textDocument/publishDiagnostics', params: { uri: 'file:///a', version: 1, diagnostics: [shared] } } as unknown as Message);
    const second = encodeMessage({ jsonrpc: '2.0', method: 'textDocument/publishDiagnostics', params: { uri: 'file:///a', version: 2, diagnostics: [shared, diagnostic('new')] } } as unknown as Message);
    expect((decoded(second) as { params: { diagnostics: unknown[] } }).params.diagnostics).toEqual([viaStringify(shared), viaStringify(diagnostic('new'))]);
    expect(Buffer.from(first).toString().split('"diagnostics":')[1]?.startsWith(`[${JSON.stringify(shared).replace('–', '\\u2013')}`)).toBe(true);
  });

  it('writes other shapes of publishDiagnostics (extra fields, odd params) the plain way', () => {
    for (const params of [{ uri: 'u', diagnostics: [], extra: 1 }, { uri: 3, diagnostics: [] }, { uri: 'u', diagnostics: {} }, null, 'x']) {
      const msg = { jsonrpc: '2.0', method: 'textDocument/publishDiagnostics', params } as unknown as Message;
      expect(decoded(encodeMessage(msg))).toEqual(viaStringify(msg));
    }
  });

  it('is the content-type encoder the stdio transport uses', async () => {
    const msg = { jsonrpc: '2.0', id: 1, result: { contents: 'PaO2 – ≤' } } as unknown as Message;
    const bytes = await asciiJsonEncoder.encode(msg, { charset: 'utf-8' });
    expect(asciiJsonEncoder.name).toBe('application/json');
    expect(decoded(bytes)).toEqual(msg);
  });
});

describe('results with a list prepared in steps (prepareJson)', () => {
  it('give the bytes JSON.stringify would give, in ASCII only, the list alone or as a member of the result (300 cases)', () => {
    fc.assert(
      fc.property(fc.array(fc.dictionary(fc.string({ unit: 'binary' }), fc.jsonValue()), { maxLength: 12 }), fc.string({ unit: 'binary' }), fc.option(fc.nat(), { nil: undefined }), fc.nat({ max: 5 }), (list, uri, version, per) => {
        let steps = 0;
        for (const _ of prepareJson(list, per + 1)) steps++;
        expect(steps).toBe(Math.floor(list.length / (per + 1)));
        for (const result of [list, { uri, version, points: list }]) {
          const msg = { jsonrpc: '2.0', id: 7, result } as unknown as Message;
          const bytes = encodeMessage(msg);
          expect(isAscii(bytes)).toBe(true);
          expect(Buffer.from(bytes).toString('latin1')).toBe(asciiJson(msg));
        }
      }),
      { numRuns: 300 },
    );
  });

  it('are assembled from the bytes made in steps, not serialised again', () => {
    const list = [{ name: 'a' }, { name: 'b' }];
    for (const _ of prepareJson(list)) { /* steps */ }
    // A change after the steps (which the server never makes) shows which bytes are sent.
    list[0]!.name = 'changed';
    expect(JSON.parse(Buffer.from(encodeMessage({ jsonrpc: '2.0', id: 1, result: list } as unknown as Message)).toString('latin1'))).toEqual({ jsonrpc: '2.0', id: 1, result: [{ name: 'a' }, { name: 'b' }] });
  });
});
