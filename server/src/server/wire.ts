/**
 * How the server's messages are written on a stream transport (stdio, the transport VS Code and
 * other editors start it with). Two things make big notes cheap to publish:
 *
 * - The JSON is plain ASCII: characters beyond it (en dashes, `≤`, `÷` in messages) are written
 *   as `\uXXXX` escapes, which every JSON reader turns back into the same characters. Encoding
 *   and decoding pure ASCII takes the fast path on both sides of the pipe; text with a single
 *   such character otherwise goes through the slow UTF-8 path as a whole.
 * - `textDocument/publishDiagnostics` is assembled from each diagnostic's JSON, kept per
 *   diagnostic object: after an edit most diagnostics are the same objects as before (the core
 *   keeps the findings of unchanged timepoints and the server their translations), so only the
 *   new ones are serialised.
 * - A response whose result is a long list, or holds one (the outline, the trend view's points),
 *   is assembled from bytes made beforehand in steps (`prepareJson`), a piece per item, which the
 *   server makes between turns of its event loop instead of serialising the whole answer at once.
 *
 * The bytes decode to exactly the message `JSON.stringify` would give (tests/server/wire.test.ts).
 */
import type { ContentTypeEncoder, ContentTypeEncoderOptions, Message } from 'vscode-jsonrpc';

const NON_ASCII = /[\u007f-\uffff]/g;

function escapeChar(c: string): string {
  return `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`;
}

/** JSON text of a value, in ASCII only (other characters as `\uXXXX` escapes). */
export function asciiJson(value: unknown): string {
  const json = JSON.stringify(value);
  NON_ASCII.lastIndex = 0;
  return NON_ASCII.test(json) ? json.replace(NON_ASCII, escapeChar) : json;
}

/**
 * Bytes of ASCII JSON text. `latin1` copies each character's low byte, which for ASCII is the
 * character itself, and stays fast where the string is stored two bytes per character (as
 * `replace` leaves it when the original held a character beyond Latin-1).
 */
function asciiBytes(json: string): Buffer {
  return Buffer.from(json, 'latin1');
}

const pieces = new WeakMap<object, Buffer>();

function pieceOf(value: object): Buffer {
  const known = pieces.get(value);
  if (known !== undefined) return known;
  const piece = asciiBytes(asciiJson(value));
  pieces.set(value, piece);
  return piece;
}

const COMMA = Buffer.from(',');

const PUBLISH = 'textDocument/publishDiagnostics';

interface PublishMessage {
  readonly jsonrpc: string;
  readonly method: typeof PUBLISH;
  readonly params: { readonly uri: string; readonly version?: number; readonly diagnostics: readonly object[] };
}

function isPublish(msg: Message): msg is Message & PublishMessage {
  if ((msg as { method?: unknown }).method !== PUBLISH) return false;
  const params = (msg as { params?: unknown }).params;
  if (typeof params !== 'object' || params === null) return false;
  const p = params as Record<string, unknown>;
  // Only the shape the server sends is assembled by hand; anything else goes the plain way.
  const keys = Object.keys(p);
  return typeof p['uri'] === 'string' && Array.isArray(p['diagnostics']) &&
    (p['version'] === undefined || typeof p['version'] === 'number') &&
    keys.every((k) => k === 'uri' || k === 'version' || k === 'diagnostics') &&
    Object.keys(msg).every((k) => k === 'jsonrpc' || k === 'method' || k === 'params');
}

/** The JSON bytes of long lists made ready to be sent (`prepareJson`), by list. */
const prepared = new WeakMap<object, Buffer>();

/**
 * Makes the JSON of a long list that a response will carry, a piece per item (kept per item
 * object, like a diagnostic's), yielding after every `per` items: the language server runs these
 * steps between turns of its event loop, and the encoder then assembles the response from the
 * bytes made here instead of serialising the whole list at once. The list and its items must not
 * change afterwards (the answers kept per analysis do not).
 */
export function* prepareJson(list: readonly object[], per = 128): Generator<void, void, void> {
  if (prepared.has(list)) return;
  const parts: Buffer[] = [OPEN];
  let length = 1;
  for (let i = 0; i < list.length; i++) {
    if (i > 0) { parts.push(COMMA); length += 1; }
    const piece = pieceOf(list[i]!);
    parts.push(piece);
    length += piece.length;
    if (i % per === per - 1) yield;
  }
  parts.push(CLOSE);
  prepared.set(list, Buffer.concat(parts, length + 1));
}

const OPEN = Buffer.from('[');
const CLOSE = Buffer.from(']');

/** A response with a result, as vscode-jsonrpc makes it (`jsonrpc`, `id`, `result`, in that order). */
interface ResultMessage {
  readonly jsonrpc: string;
  readonly id: number | string | null;
  readonly result: unknown;
}

function isResult(msg: Message): msg is Message & ResultMessage {
  const keys = Object.keys(msg);
  return keys.length === 3 && keys[0] === 'jsonrpc' && keys[1] === 'id' && keys[2] === 'result';
}

/**
 * The bytes of a result that holds a prepared list: the list itself, or a plain object with one
 * among its members (the trend view's points); null when it holds none.
 */
function preparedResult(result: unknown): Buffer | null {
  if (typeof result !== 'object' || result === null) return null;
  const whole = prepared.get(result);
  if (whole !== undefined) return whole;
  if (Array.isArray(result) || Object.getPrototypeOf(result) !== Object.prototype) return null;
  const members = Object.entries(result as Record<string, unknown>);
  if (!members.some(([, v]) => typeof v === 'object' && v !== null && prepared.has(v))) return null;
  const parts: Buffer[] = [];
  for (const [key, value] of members) {
    // As JSON.stringify: members that have no JSON are left out.
    if (value === undefined || typeof value === 'function' || typeof value === 'symbol') continue;
    const bytes = (typeof value === 'object' && value !== null ? prepared.get(value) : undefined) ?? asciiBytes(asciiJson(value));
    parts.push(asciiBytes(`${parts.length === 0 ? '{' : ','}${asciiJson(key)}:`), bytes);
  }
  parts.push(asciiBytes(parts.length === 0 ? '{}' : '}'));
  return Buffer.concat(parts);
}

/** The JSON bytes of one message, ASCII only. */
export function encodeMessage(msg: Message): Buffer {
  if (isResult(msg)) {
    const result = preparedResult(msg.result);
    if (result !== null) return Buffer.concat([asciiBytes(`{"jsonrpc":${asciiJson(msg.jsonrpc)},"id":${asciiJson(msg.id)},"result":`), result, asciiBytes('}')]);
  }
  if (!isPublish(msg)) return asciiBytes(asciiJson(msg));
  const { uri, version, diagnostics } = msg.params;
  const versionPart = version === undefined ? '' : `,"version":${asciiJson(version)}`;
  const head = asciiBytes(`{"jsonrpc":${asciiJson(msg.jsonrpc)},"method":"${PUBLISH}","params":{"uri":${asciiJson(uri)}${versionPart},"diagnostics":[`);
  const parts: Buffer[] = [head];
  let length = head.length;
  for (let i = 0; i < diagnostics.length; i++) {
    if (i > 0) { parts.push(COMMA); length += 1; }
    const d = diagnostics[i];
    const piece = typeof d === 'object' && d !== null ? pieceOf(d) : asciiBytes(asciiJson(d));
    parts.push(piece);
    length += piece.length;
  }
  const tail = asciiBytes(']}}');
  parts.push(tail);
  return Buffer.concat(parts, length + tail.length);
}

export const asciiJsonEncoder: ContentTypeEncoder = {
  name: 'application/json',
  // ASCII text is the same bytes in every charset the protocol allows (utf-8, ascii).
  encode(msg: Message, _options: ContentTypeEncoderOptions): Promise<Uint8Array> {
    try {
      return Promise.resolve(encodeMessage(msg));
    } catch (error) {
      return Promise.reject(error instanceof Error ? error : new Error(String(error)));
    }
  },
};
