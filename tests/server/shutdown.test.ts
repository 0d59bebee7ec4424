// After a shutdown request, the Language Server Protocol (3.17, "Shutdown Request") has requests
// fail with InvalidRequest (-32600) and notifications other than exit ignored. Every request of the
// server is asked here, over a real stdio connection.
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CONVERT_UNITS_REQUEST, SUMMARY_REQUEST, TRENDS_REQUEST } from '../../server/src/protocol';
import { errorCode, INVALID_REQUEST, startClient } from './lsp-client';


describe('after shutdown', () => {
  it('refuses every request with InvalidRequest, ignores notifications, and exits with status 0 on exit', async () => {
    const client = await startClient();
    const text = '@ 08:00\nvitals spo2 104\nabg 7.30/50/60/24\n';
    const uri = client.open(join(process.cwd(), 'after-shutdown.pneu'), text, 1);
    await client.diagnostics(uri);
    const c = client.connection;
    const document = { textDocument: { uri } };
    const position = { ...document, position: { line: 1, character: 8 } };
    const range = { start: { line: 0, character: 0 }, end: { line: 3, character: 0 } };
    // Before: answered.
    expect(await errorCode(c.sendRequest('textDocument/hover', position))).toBeNull();

    // The answer to the shutdown request comes before the errors of the requests sent after it.
    const order: string[] = [];
    const shutdown = c.sendRequest('shutdown').then(() => order.push('shutdown'));
    const hover = errorCode(c.sendRequest('textDocument/hover', position)).then((code) => { order.push('hover'); return code; });
    // A notification after shutdown is not read: the note keeps its diagnostics of version 1.
    c.sendNotification('textDocument/didChange', { textDocument: { uri, version: 2 }, contentChanges: [{ text: '@ 08:00\nvitals hr 400\n' }] });
    client.open(join(process.cwd(), 'opened-after-shutdown.pneu'), '@ 08:00\nvitals spo2 104\n', 1);
    const requests: [string, unknown][] = [
      ['textDocument/completion', position],
      ['textDocument/codeAction', { ...document, range, context: { diagnostics: [] } }],
      ['textDocument/documentSymbol', document],
      ['textDocument/foldingRange', document],
      ['textDocument/formatting', { ...document, options: { tabSize: 2, insertSpaces: true } }],
      ['textDocument/rangeFormatting', { ...document, range, options: { tabSize: 2, insertSpaces: true } }],
      ['textDocument/inlayHint', { ...document, range }],
      ['inlayHint/resolve', { position: { line: 2, character: 0 }, label: 'x', data: { uri, line: 2 } }],
      [TRENDS_REQUEST, { uri }],
      [SUMMARY_REQUEST, { uri, line: 2 }],
      [CONVERT_UNITS_REQUEST, { uri, range }],
      ['shutdown', null],
      ['pneumark/noSuchRequest', {}],
    ];
    for (const [method, params] of requests) {
      expect(await errorCode(params === null ? c.sendRequest(method) : c.sendRequest(method, params)), method).toBe(INVALID_REQUEST);
    }
    expect(await hover).toBe(INVALID_REQUEST);
    await shutdown;
    expect(order).toEqual(['shutdown', 'hover']);
    expect(client.published.filter((p) => p.version === 2 || p.uri.endsWith('opened-after-shutdown.pneu'))).toEqual([]);

    const exited = new Promise<number | null>((resolve) => client.process.once('exit', (code) => resolve(code)));
    await c.sendNotification('exit');
    expect(await exited).toBe(0);
    c.dispose();
  });
});
