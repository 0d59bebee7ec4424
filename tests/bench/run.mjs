// Benchmarks of the language service on a generated 10,000-line note (about 2,000 timepoints).
// Prints a table of figures; asserts nothing. Run with `npm run bench` (builds first).
//   full analysis        checkNote on the whole note, fresh each time (dist/core.js): the first
//                        run alone, runs 2–10 (still being optimised by V8), then the median of
//                        31, each followed by a JSON.parse of the note's words as a reference for
//                        the machine's speed at that moment
//   incremental update   NoteSession.update after a one-line edit (in process); and after a blank
//                        line inserted mid-note (Enter), which moves every later timepoint down
//   edit → diagnostics   a one-line didChange to the publishDiagnostics answering it, over a real
//                        stdio connection to dist/server.js, with the debounce set to 0: 60 edits
//                        back to back after 10 that warm up the edit path; and the part of it the
//                        server reports for its analysis and publish (pneumark/analysed)
//   inlay hints          textDocument/inlayHint for a 60-line visible range (tooltips resolved on
//                        hover, as VS Code declares)
//   server memory        resident set size of the server process right after the edits, and
//                        settled (after 1.5 s idle, when the server has collected the garbage)
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { generateNote } from './generate.mjs';

const require = createRequire(import.meta.url);
const core = require('../../dist/core.js');
const { createProtocolConnection, StreamMessageReader, StreamMessageWriter } = require('vscode-languageserver-protocol/node');


const TIMEPOINTS = Number(process.env.BENCH_TIMEPOINTS ?? 2000);
const text = generateNote(TIMEPOINTS);
const lines = text.split('\n');
const median = (xs) => { const s = [...xs].sort((a, b) => a - b); return s[Math.floor(s.length / 2)]; };
const p90 = (xs) => { const s = [...xs].sort((a, b) => a - b); return s[Math.min(s.length - 1, Math.floor(s.length * 0.9))]; };
const rows = [];
const row = (what, samples, target, unit = 'ms') => rows.push({ what, median: median(samples), p90: p90(samples), n: samples.length, target, unit });

// Full analysis, in process.
// The first run compiles the code (reported alone). V8 goes on optimising (and now and then
// deoptimising and optimising again) for some ten runs more: runs 2–10 are reported on their own
// row, then 31 measured. Each measured run is followed by a JSON.parse of the note's words, as a
// reference for this machine's speed at that moment: on this VM the speed of memory-bound code
// changes by up to 1.7× for seconds at a time, for JSON.parse as for the analysis.
const full = [];
const warming = [];
const reference = [];
const wordsJson = JSON.stringify(lines.map((l) => l.split(/[ ,]+/)));
let t1 = performance.now();
core.checkNote(text);
row('full analysis, first run (cold code)', [performance.now() - t1], '—');
for (let i = 0; i < 9; i++) { const t = performance.now(); core.checkNote(text); warming.push(performance.now() - t); }
row('  runs 2–10 (code still being optimised)', warming, '—');
for (let i = 0; i < 31; i++) {
  let t = performance.now();
  core.checkNote(text);
  full.push(performance.now() - t);
  t = performance.now();
  JSON.parse(wordsJson);
  reference.push(performance.now() - t);
}
row('full analysis (checkNote)', full, '≤ 30 ms');
row('  reference: JSON.parse of its words', reference, '—');

// Incremental update, in process.
const session = new core.NoteSession();
session.update(text);
const edited = [...lines];
const inc = [];
/** A vitals line in the middle of the note (the i-th of 40 spread over it). */
const vitalsLines = lines.map((l, i) => (l.startsWith('vitals') ? i : -1)).filter((i) => i >= 0);
const editLine = (i) => vitalsLines[Math.floor(vitalsLines.length / 4) + (i % 40) * Math.floor(vitalsLines.length / 80)];
for (let i = 0; i < 40; i++) {
  const k = editLine(i);
  edited[k] = edited[k].replace(/hr (\d+)/, (_m, n) => `hr ${Number(n) + 1}`);
  const next = edited.join('\n');
  const t = performance.now();
  session.update(next);
  inc.push(performance.now() - t);
}
row('incremental update (NoteSession)', inc, '—');

// A line inserted in the middle (Enter) and removed again: every later timepoint moves down a line.
const enter = [];
for (let i = 0; i < 20; i++) {
  const k = editLine(i);
  edited.splice(k + 1, 0, '');
  const t = performance.now();
  session.update(edited.join('\n'));
  enter.push(performance.now() - t);
  edited.splice(k + 1, 1);
  session.update(edited.join('\n'));
}
row('  a line inserted mid-note (Enter)', enter, '—');

// Over stdio to the bundled server.
const serverFlags = (process.env.BENCH_SERVER_FLAGS ?? '').split(' ').filter(Boolean);
const child = spawn(process.execPath, [...serverFlags, 'dist/server.js', '--stdio'], { stdio: 'pipe' });
const connection = createProtocolConnection(new StreamMessageReader(child.stdout), new StreamMessageWriter(child.stdin));
const waiting = new Map();
connection.onNotification('textDocument/publishDiagnostics', (p) => {
  const w = waiting.get(p.version);
  if (w) { waiting.delete(p.version); w(performance.now()); }
});
connection.onNotification('window/logMessage', () => undefined);
let onAnalysed = () => undefined;
connection.onNotification('pneumark/analysed', (p) => onAnalysed(p));
connection.onRequest('workspace/configuration', (params) => params.items.map(() => ({ debounceMs: 0 })));
connection.onRequest('client/registerCapability', () => null);
connection.listen();
await connection.sendRequest('initialize', { processId: process.pid, rootUri: null, capabilities: { workspace: { configuration: true }, textDocument: { inlayHint: { resolveSupport: { properties: ['tooltip'] } } } } });
await connection.sendNotification('initialized', {});
const uri = 'file:///bench/generated.pneu';
const published = (version) => new Promise((resolve) => waiting.set(version, resolve));
let t0 = performance.now();
let done = published(1);
const opened = new Promise((resolve) => { onAnalysed = (p) => { if (p.version === 1) resolve(p); }; });
await connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'pneumark', version: 1, text } });
const openMs = (await done) - t0;
row('open → first diagnostics (server)', [openMs], '—');
// The first analysis is read in steps (NoteSession.steps): the server is never busy longer than one.
const { steps, longestStepMillis } = await opened;
row(`  longest step of it (${steps} steps)`, [longestStepMillis], '—');

const server = [...lines];
const editMs = [];
// The server's own account of each measured edit: from the start of its analysis to the
// diagnostics handed to the connection (pneumark/analysed); the rest is the trip both ways.
const serverMs = new Map();
onAnalysed = (p) => { serverMs.set(p.version, p.millis); };
// Edits 2–11 warm up the edit path (not counted); edits 12–71 are measured, back to back.
const WARM_UP_EDITS = 10;
for (let v = 2; v < 2 + WARM_UP_EDITS + 60; v++) {
  const k = editLine(v);
  const before = server[k];
  server[k] = before.replace(/hr (\d+)/, (_m, n) => `hr ${Number(n) + 1}`);
  done = published(v);
  t0 = performance.now();
  await connection.sendNotification('textDocument/didChange', {
    textDocument: { uri, version: v },
    contentChanges: [{ range: { start: { line: k, character: 0 }, end: { line: k, character: before.length } }, text: server[k] }],
  });
  const ms = (await done) - t0;
  if (v >= 2 + WARM_UP_EDITS) editMs.push(ms);
}
row('edit → diagnostics over stdio (debounce 0)', editMs, '≤ 15 ms');
row('  of which analysis and publish in the server', [...serverMs].filter(([v]) => v >= 2 + WARM_UP_EDITS).map(([, ms]) => ms), '—');

const hintMs = [];
for (let i = 0; i < 30; i++) {
  const start = 3000 + i * 97;
  t0 = performance.now();
  await connection.sendRequest('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: start, character: 0 }, end: { line: start + 60, character: 0 } } });
  hintMs.push(performance.now() - t0);
}
row('inlay hints, 60 visible lines', hintMs, '≤ 5 ms');

const rssMb = () => Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${child.pid}/status`, 'utf8'))?.[1] ?? NaN) / 1024;
row('server resident memory, right after the edits', [rssMb()], '—', 'MB');
// Settled: the server collects an analysis's garbage once idle for a moment (server/src/server/memory.ts).
await new Promise((resolve) => setTimeout(resolve, 1500));
row('server resident memory, settled (idle 1.5 s)', [rssMb()], '≤ 120 MB', 'MB');

await connection.sendRequest('shutdown');
await connection.sendNotification('exit');
connection.dispose();

console.log(`Pneumark language-service benchmark: ${lines.length} lines, ${TIMEPOINTS} timepoints, ${(text.length / 1024).toFixed(0)} KB, Node ${process.version}`);
console.log(`${'measure'.padEnd(44)} ${'median'.padStart(10)} ${'p90'.padStart(10)} ${'runs'.padStart(5)}   target`);
for (const r of rows) {
  const f = (x) => `${x.toFixed(1)} ${r.unit}`.padStart(10);
  console.log(`${r.what.padEnd(44)} ${f(r.median)} ${f(r.p90)} ${String(r.n).padStart(5)}   ${r.target}`);
}
