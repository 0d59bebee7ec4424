// The language server under hostile input: malformed JSON-RPC, requests of the wrong shape,
// generated notes with requests at random positions, edits fired without waiting. It must keep
// answering, never publish NaN, Infinity or undefined, and end on the newest text.
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { anyText } from '../helpers/arbitraries';
import { serverForTests } from '../server/lsp-client';

export const LSP_PROPERTY_RUNS = 150;
const client = serverForTests();

const BAD = /NaN|Infinity|undefined/;

describe('malformed messages', () => {
  it('survives a body that is not JSON and a header without a body, and keeps answering', async () => {
    client.process.stdin.write('Content-Length: 12\r\n\r\n{not json!!}');
    client.process.stdin.write('Content-Length: 5\r\n\r\n[1,2]');
    const uri = client.open(join(process.cwd(), 'after-garbage.pneu'), '@ 08:00\nvitals spo2 104\n');
    const p = await client.diagnostics(uri);
    expect(p.diagnostics.map((d) => d.code)).toEqual(['PN306']);
    expect(client.process.exitCode).toBeNull();
  });

  it('answers requests with parameters of the wrong shape with an error or nothing, and goes on', async () => {
    const attempts: [string, unknown][] = [
      ['textDocument/hover', { textDocument: { uri: 42 }, position: 'here' }],
      ['textDocument/completion', {}],
      ['textDocument/inlayHint', { textDocument: { uri: 'file:///x.pneu' } }],
      ['textDocument/codeAction', { textDocument: { uri: 'file:///x.pneu' }, range: null, context: null }],
      ['pneumark/trends', { uri: null }],
      ['pneumark/convertUnits', { uri: 'file:///x.pneu', to: 'bar' }],
    ];
    for (const [method, params] of attempts) {
      await client.connection.sendRequest(method, params).catch(() => 'error response');
    }
    const uri = client.open(join(process.cwd(), 'still-alive.pneu'), '@ 08:00\nvitals hr 80\n');
    expect((await client.diagnostics(uri)).diagnostics).toEqual([]);
  });
});

describe('edits fired without waiting', () => {
  it('ends with the diagnostics of the newest version', async () => {
    const uri = client.open(join(process.cwd(), 'burst.pneu'), '@ 08:00\nvitals hr 80\n');
    await client.diagnostics(uri, (p) => p.version === 1);
    for (let v = 2; v <= 40; v++) client.change(uri, `@ 08:00\nvitals hr 80, spo2 ${61 + v}\n`, v);
    const last = await client.diagnostics(uri, (p) => p.version === 40);
    expect(last.diagnostics.map((d) => d.code)).toEqual(['PN306']);
    const versions = client.published.filter((p) => p.uri === uri).map((p) => p.version ?? 0);
    expect([...versions].sort((a, b) => a - b)).toEqual(versions);
  });
});

describe(`every request on generated notes (${LSP_PROPERTY_RUNS} notes)`, () => {
  it('never fails and never answers NaN, Infinity or undefined', async () => {
    let version = 1;
    const uri = client.open(join(process.cwd(), 'generated.pneu'), '', version);
    await fc.assert(
      fc.asyncProperty(anyText, fc.nat({ max: 40 }), fc.nat({ max: 120 }), async (text, line, character) => {
        version++;
        client.change(uri, text, version);
        const position = { line, character };
        const range = { start: { line: 0, character: 0 }, end: { line: line + 5, character } };
        const answers = await Promise.all([
          client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position }),
          client.connection.sendRequest('textDocument/completion', { textDocument: { uri }, position }),
          client.connection.sendRequest('textDocument/inlayHint', { textDocument: { uri }, range }),
          client.connection.sendRequest('textDocument/codeAction', { textDocument: { uri }, range, context: { diagnostics: [] } }),
          client.connection.sendRequest('textDocument/documentSymbol', { textDocument: { uri } }),
          client.connection.sendRequest('textDocument/foldingRange', { textDocument: { uri } }),
          client.connection.sendRequest('textDocument/formatting', { textDocument: { uri }, options: { tabSize: 2, insertSpaces: true } }),
          client.connection.sendRequest('pneumark/trends', { uri }),
          client.connection.sendRequest('pneumark/timepointSummary', { uri, line }),
        ]);
        for (const a of answers) expect(JSON.stringify(a) ?? 'null').not.toMatch(BAD);
      }),
      { numRuns: LSP_PROPERTY_RUNS },
    );
    const last = await client.diagnostics(uri, (p) => p.version === version, 30000);
    expect(JSON.stringify(last.diagnostics)).not.toMatch(BAD);
    expect(client.process.exitCode).toBeNull();
  }, 120000);
});
