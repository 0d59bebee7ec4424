// Whole-note requests about a big note (about 50,000 lines) over a real stdio connection to the
// bundled server: they run in slices with turns of the event loop between them (server.ts
// `inSlices`), so (a) a cheap request sent while one runs is answered before it, whatever the
// machine's speed (no timing is asserted: only the order of the answers); (b) a request the
// client cancels, while it runs or while it waits for its note to be read, is answered with
// RequestCancelled (-32800) and no result; (c) the answers are those of the one-shot functions
// of the core.
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CancellationTokenSource, type DocumentSymbol, type Hover, LSPErrorCodes } from 'vscode-languageserver-protocol';
import { checkNote } from '../../server/src/core/check-note';
import { convertNoteUnits, documentSymbols, inlayHints } from '../../server/src/core/service';
import { trendPoints } from '../../server/src/core/trends';
import { DEFAULT_CLIENT_SETTINGS, effectiveSettings } from '../../server/src/server/settings';
import { toDocumentSymbol, toInlayHint } from '../../server/src/server/translate';
import { CONVERT_UNITS_REQUEST, TRENDS_REQUEST } from '../../server/src/protocol';
import { generateNote } from '../bench/generate.mjs';
import { errorCode, startClient, type LspClient } from './lsp-client';

let client: LspClient;
const path = (name: string) => join(process.cwd(), name);
const text = generateNote(10000);
const lineCount = text.split('\n').length;
let uri = '';
let version = 1;
let current = text;

beforeAll(async () => {
  client = await startClient();
  uri = client.open(path('slices-big.pneu'), text);
  await client.diagnostics(uri, undefined, 120_000);
}, 180_000);
afterAll(async () => {
  await client?.close();
});

/** A new version of the note (its first timepoint's label changed), read before this resolves: nothing computed for the last one applies. */
async function newVersion(): Promise<void> {
  version++;
  current = current.replace(/^@ day 1 00:00 {2}hour 1.*$/m, `@ day 1 00:00  hour 1 (v${version})`);
  client.change(uri, current, version);
  await client.diagnostics(uri, (p) => p.version === version, 120_000);
}

const hover = () => client.connection.sendRequest<Hover | null>('textDocument/hover', { textDocument: { uri }, position: { line: 1, character: 12 } });
const whole = { start: { line: 0, character: 0 }, end: { line: lineCount, character: 0 } };

const WHOLE_NOTE = [
  { name: 'the outline', method: 'textDocument/documentSymbol', params: () => ({ textDocument: { uri } }) },
  { name: 'every inlay hint', method: 'textDocument/inlayHint', params: () => ({ textDocument: { uri }, range: whole }) },
  { name: 'the trend view\'s points', method: TRENDS_REQUEST, params: () => ({ uri }) },
  { name: 'the conversion of every gas pressure', method: CONVERT_UNITS_REQUEST, params: () => ({ uri, to: 'kPa' }) },
];

describe('whole-note requests about a big note', () => {
  for (const { name, method, params } of WHOLE_NOTE) {
    it(`answer a cheap request sent after them first: ${name}`, async () => {
      await newVersion();
      const order: string[] = [];
      const big = client.connection.sendRequest(method, params()).then(() => order.push('whole note'));
      const cheap = hover().then(() => order.push('hover'));
      await Promise.all([big, cheap]);
      expect(order).toEqual(['hover', 'whole note']);
    }, 120_000);
  }

  it('answer a cancelled request with RequestCancelled and no result, once it has started', async () => {
    await newVersion();
    const source = new CancellationTokenSource();
    const outline = errorCode(client.connection.sendRequest<DocumentSymbol[]>('textDocument/documentSymbol', { textDocument: { uri } }, source.token));
    // The server takes requests in the order they come: the outline has started when the hover is
    // answered. The cancel goes out with the hover, not once its answer is back: a client slowed
    // by a loaded machine could otherwise send it after the last slice, and get the outline.
    const answered = hover();
    source.cancel();
    await answered;
    expect(await outline).toBe(LSPErrorCodes.RequestCancelled);
  }, 120_000);

  it('answer a request cancelled while it waits for its note to be read at once, before the note is read', async () => {
    const other = client.open(path('slices-unread.pneu'), generateNote(10000));
    const source = new CancellationTokenSource();
    const order: string[] = [];
    const waiting = errorCode(client.connection.sendRequest<Hover | null>('textDocument/hover', { textDocument: { uri: other }, position: { line: 1, character: 12 } }, source.token))
      .then((code) => { order.push('cancelled'); return code; });
    const read = client.diagnostics(other, undefined, 120_000).then(() => order.push('read'));
    // The hover is in: the server answers requests in the order they come. The cancel goes out
    // with it, not once its answer is back, so that a slowed client does not send it too late.
    const answered = hover();
    source.cancel();
    await answered;
    expect(await waiting).toBe(LSPErrorCodes.RequestCancelled);
    await read;
    expect(order).toEqual(['cancelled', 'read']);
    await client.connection.sendNotification('textDocument/didClose', { textDocument: { uri: other } });
  }, 180_000);

  /** The answer, as JSON, beside what the core gives (as JSON, as it goes over the wire); compared as text: a long list's diff would take minutes to print. */
  async function sameAsCore(method: string, params: object, expected: unknown): Promise<void> {
    const got = JSON.stringify(await client.connection.sendRequest(method, params));
    const want = JSON.stringify(expected);
    // Where they differ, if they do (-1: nowhere), with what follows there.
    let at = 0;
    while (at < got.length && got.charCodeAt(at) === want.charCodeAt(at)) at++;
    expect(got === want ? null : { at, got: got.slice(at, at + 200), want: want.slice(at, at + 200) }).toBeNull();
  }

  it('give what the core gives in one go', async () => {
    await newVersion();
    const result = checkNote(current);
    const symbols = documentSymbols(result).map(toDocumentSymbol);
    await sameAsCore('textDocument/documentSymbol', { textDocument: { uri } }, symbols);
    // Asked again for the same version: the kept answer, the same.
    await sameAsCore('textDocument/documentSymbol', { textDocument: { uri } }, symbols);
    await sameAsCore(TRENDS_REQUEST, { uri }, { uri, version, points: trendPoints(result) });
    await sameAsCore(TRENDS_REQUEST, { uri }, { uri, version, points: trendPoints(result) });
    await sameAsCore(CONVERT_UNITS_REQUEST, { uri, to: 'kPa' }, convertNoteUnits(result, 'kPa'));
    const { hints: categories } = effectiveSettings(DEFAULT_CLIENT_SETTINGS, null);
    const hints = inlayHints(result, { start: 0, end: lineCount }, { categories })
      .map((h) => toInlayHint(h, { uri, version, line: h.position.line, category: h.category }));
    await sameAsCore('textDocument/inlayHint', { textDocument: { uri }, range: whole }, hints);
  }, 180_000);
});
