// How long the language server takes to answer each kind of request about a big note (about
// 50,000 lines, `generateNote(10000)`), and how long it holds its event loop meanwhile: while a
// request runs, a cheap one (a hover on the note's second line) is sent every 20 ms, and the
// longest wait for one of them is the longest stall the request caused, seen from the editor.
// Drives the bundled server (dist/server.js) over stdio. Prints figures, asserts nothing.
//
//   npm run build && node tests/bench/server.mjs [timepoints] [rounds] [--server FILE] [--only NAME]
//
// `--server FILE` drives another bundle of the server (one built from an older commit, to compare
// the two); `--only NAME` asks only the requests whose name starts with NAME (`--only documentSymbol`).
//
// Each request is asked `rounds` times (3 by default); "first" is an answer computed afresh
// (the note is edited before it, so nothing is cached), "again" the same request once more for
// the same version.
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { generateNote } from './generate.mjs';

const option = (name) => {
  const at = process.argv.indexOf(name);
  return at < 0 ? undefined : process.argv[at + 1];
};
const positional = process.argv.slice(2).filter((a, i, all) => !a.startsWith('--') && !all[i - 1]?.startsWith('--'));
const timepoints = Number(positional[0] ?? 10000);
const rounds = Number(positional[1] ?? 3);
const serverFile = option('--server') ?? 'dist/server.js';
const only = option('--only');
const PROBE_EVERY_MS = 20;

// A bare JSON-RPC client: a big answer (the outline of the note is about 10 MB of JSON) is not
// parsed, only its id read, so that this process's own work does not delay the answers to the
// probes and count as the server's stall.
const child = spawn(process.execPath, [serverFile, '--stdio'], { stdio: 'pipe' });
child.stderr.on('data', () => undefined);
let nextId = 1;
const pending = new Map();
const notified = [];
function send(message) {
  const body = Buffer.from(JSON.stringify({ jsonrpc: '2.0', ...message }), 'utf8');
  child.stdin.write(`Content-Length: ${body.length}\r\n\r\n`);
  child.stdin.write(body);
}
const connection = {
  sendRequest(method, params) {
    const id = nextId++;
    send({ id, method, params });
    return new Promise((resolve, reject) => pending.set(id, { resolve, reject }));
  },
  async sendNotification(method, params) { send({ method, params }); },
};
let buffered = Buffer.alloc(0);
/** Chunks of a long message not joined yet (joining at every chunk would copy a 10 MB answer a hundred times), and their length. */
let waiting = [];
let waitingLength = 0;
let needed = 0;
child.stdout.on('data', (chunk) => {
  if (waitingLength + buffered.length + chunk.length < needed) {
    waiting.push(chunk);
    waitingLength += chunk.length;
    return;
  }
  buffered = Buffer.concat([buffered, ...waiting, chunk]);
  waiting = [];
  waitingLength = 0;
  needed = 0;
  for (;;) {
    const headerEnd = buffered.indexOf('\r\n\r\n');
    if (headerEnd < 0) return;
    const length = Number(/Content-Length: (\d+)/i.exec(buffered.subarray(0, headerEnd).toString('latin1'))[1]);
    if (buffered.length < headerEnd + 4 + length) { needed = headerEnd + 4 + length; return; }
    const body = buffered.subarray(headerEnd + 4, headerEnd + 4 + length);
    buffered = buffered.subarray(headerEnd + 4 + length);
    if (length > 65536) {
      const head = body.subarray(0, 400).toString('latin1');
      if (head.includes('"method":')) {
        // Big diagnostics: which note and version only.
        notified.push({ method: /"method":"([^"]*)"/.exec(head)[1], params: { uri: /"uri":"([^"]*)"/.exec(head)?.[1], version: Number(/"version":(\d+)/.exec(head)?.[1]) } });
        continue;
      }
      // A big answer: its id only (the encoder writes `jsonrpc`, then `id`), and its size.
      const id = Number(/"id":(\d+)/.exec(body.subarray(0, 64).toString('latin1'))[1]);
      pending.get(id)?.resolve({ bytes: length });
      pending.delete(id);
      continue;
    }
    const msg = JSON.parse(body.toString('utf8'));
    if (msg.method !== undefined && msg.id !== undefined) {
      // The server's requests: settings (none), registrations.
      send({ id: msg.id, result: msg.method === 'workspace/configuration' ? msg.params.items.map(() => ({})) : null });
    } else if (msg.method !== undefined) {
      notified.push(msg);
    } else {
      const waiting = pending.get(msg.id);
      pending.delete(msg.id);
      if (msg.error) waiting?.reject(msg.error);
      else waiting?.resolve(msg.result === null ? null : { bytes: length });
    }
  }
});
const published = { some: (accept) => notified.some((n) => n.method === 'textDocument/publishDiagnostics' && accept(n.params)) };
await connection.sendRequest('initialize', {
  processId: process.pid,
  rootUri: null,
  capabilities: { workspace: { configuration: true }, textDocument: { inlayHint: { resolveSupport: { properties: ['tooltip'] } } } },
});
await connection.sendNotification('initialized', {});

const text = generateNote(timepoints);
const lineCount = text.split('\n').length;
const uri = pathToFileURL(join(process.cwd(), 'bench-server.pneu')).toString();
let version = 1;
const diagnosed = (v) => new Promise((resolve) => {
  const look = () => (published.some((p) => p.uri === uri && p.version === v) ? resolve() : setTimeout(look, 5));
  look();
});
await connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'pneumark', version, text } });
await diagnosed(version);

/** A change of the first timepoint's label, so that nothing computed for the last version applies. */
let label = text.split('\n')[4];
async function touch() {
  version++;
  const next = `@ day 1 00:00  hour 1 (v${version})`;
  const edit = { range: { start: { line: 4, character: 0 }, end: { line: 4, character: label.length } }, text: next };
  label = next;
  await connection.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: [edit] });
  await diagnosed(version);
  // One cheap request so that nothing of the analysis is left to do, then past the collection of
  // garbage the server runs once idle after an analysis (IDLE_COLLECT_MS, 1 s), which is not the request's.
  await connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 1, character: 12 } });
  await new Promise((r) => setTimeout(r, 1500));
}

const doc = { textDocument: { uri } };
const whole = { start: { line: 0, character: 0 }, end: { line: lineCount, character: 0 } };
const firstPage = { start: { line: 0, character: 0 }, end: { line: 60, character: 0 } };
const REQUESTS = [
  ['documentSymbol', 'textDocument/documentSymbol', doc],
  ['foldingRange', 'textDocument/foldingRange', doc],
  ['codeAction (line 5)', 'textDocument/codeAction', { ...doc, range: { start: { line: 5, character: 12 }, end: { line: 5, character: 12 } }, context: { diagnostics: [] } }],
  ['codeAction (gas line)', 'textDocument/codeAction', { ...doc, range: { start: { line: 8, character: 12 }, end: { line: 8, character: 12 } }, context: { diagnostics: [] } }],
  ['hover', 'textDocument/hover', { ...doc, position: { line: 8, character: 12 } }],
  ['completion', 'textDocument/completion', { ...doc, position: { line: 6, character: 10 } }],
  ['inlayHint (60 lines)', 'textDocument/inlayHint', { ...doc, range: firstPage }],
  ['inlayHint (whole note)', 'textDocument/inlayHint', { ...doc, range: whole }],
  ['formatting', 'textDocument/formatting', { ...doc, options: { tabSize: 2, insertSpaces: true } }],
  ['pneumark/trends', 'pneumark/trends', { uri }],
  ['pneumark/timepointSummary', 'pneumark/timepointSummary', { uri, line: lineCount - 4 }],
  ['pneumark/convertUnits (kPa)', 'pneumark/convertUnits', { uri, to: 'kPa' }],
];

/** Sends the request with a probe every PROBE_EVERY_MS; its latency and the longest probe's. */
async function measure(method, params) {
  const probes = [];
  let done = false;
  const started = performance.now();
  const answer = connection.sendRequest(method, params).then((r) => { done = true; return r; }, (e) => { done = true; return e; });
  const probe = async () => {
    while (!done) {
      const sent = performance.now();
      await connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 1, character: 12 } });
      probes.push(performance.now() - sent);
      await new Promise((r) => setTimeout(r, PROBE_EVERY_MS));
    }
  };
  const probing = probe();
  const result = await answer;
  const took = performance.now() - started;
  await probing;
  return { took, stall: Math.max(0, ...probes), size: result?.bytes ?? 0 };
}

const rows = [];
for (const [name, method, params] of REQUESTS.filter(([name]) => only === undefined || name.startsWith(only))) {
  const first = [];
  const again = [];
  let size = 0;
  for (let r = 0; r < rounds; r++) {
    await touch();
    const a = await measure(method, params);
    const b = await measure(method, params);
    first.push(a);
    again.push(b);
    size = a.size;
  }
  const median = (xs) => [...xs].sort((x, y) => x - y)[Math.floor(xs.length / 2)];
  rows.push({
    request: name,
    'first ms': Math.round(median(first.map((m) => m.took))),
    'first stall ms': Math.round(median(first.map((m) => m.stall))),
    'again ms': Math.round(median(again.map((m) => m.took))),
    'again stall ms': Math.round(median(again.map((m) => m.stall))),
    'answer KB': Math.round(size / 1024),
  });
}
console.log(`${lineCount} lines, ${timepoints} timepoints; medians of ${rounds} rounds; stall: longest wait for a hover sent every ${PROBE_EVERY_MS} ms meanwhile`);
console.table(rows);
await connection.sendRequest('shutdown');
await connection.sendNotification('exit');
