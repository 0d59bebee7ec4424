// Benchmark of the command line on a generated corpus of 10,000 invented notes (5 to 35
// timepoints each). Prints figures; asserts nothing. `npm run bench:cli` (builds first).
//   analysis in process   checkNote over every note (parse + timeline + derived values + checks)
//   parse alone           parseNote over every note: the syntax tree, nothing derived or checked
//   JSON.parse floor      the same notes expressed as JSON (timepoints with their values), parsed;
//                         and a fuller JSON that also holds the header, the units written and the
//                         free text, shown beside it (the target is judged on the first)
//   scan floors           no analysis at all: one pass over every character of the notes, and
//                         one small object per word; what any reader of the text written in
//                         JavaScript pays before it has read a single value
//   check / export csv    the built command over the corpus folder, wall time (check also in one
//                         thread, `--jobs 0`: what the workers gain over it)
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { generateNote } from './generate.mjs';

const require = createRequire(import.meta.url);
const core = require('../../dist/core.js');
const NOTES = Number(process.env.BENCH_NOTES ?? 10000);

const texts = [];
for (let i = 0; i < NOTES; i++) texts.push(generateNote(5 + (i % 31), i + 1));
const noteBytes = texts.reduce((n, t) => n + Buffer.byteLength(t), 0);

const time = (f) => { const t = performance.now(); f(); return (performance.now() - t) / 1000; };
// The first pass over the corpus, in a process that has analysed nothing yet: the code is not yet
// compiled by the optimising compiler, as in a command-line run (and in each of its workers).
const cold = time(() => { for (const t of texts) core.checkNote(t); });

// The same content as JSON: per note, its timepoints with label, time and stated values.
const jsons = texts.map((t) => JSON.stringify(core.checkNote(t).analysis.timeline.timepoints.map((tp) => ({
  label: tp.label, day: tp.time.day, minutes: tp.time.minutes,
  values: Object.fromEntries(tp.stated.map((s) => [s.fieldId, s.word ?? s.parts ?? s.value])),
}))));
const jsonBytes = jsons.reduce((n, t) => n + Buffer.byteLength(t), 0);
// The same notes as JSON with everything the text says: the header's values, each value with the
// unit written beside it, and each timepoint's free-text lines. The floor above leaves those out;
// this one is the fuller reading of "the same corpus expressed as JSON", shown beside it.
const valueOf = (s) => {
  const v = s.word ?? s.parts ?? s.value;
  return s.unitImplied || s.readUnit === null ? v : { value: v, unit: s.readUnit };
};
const freeTexts = (text) => {
  const byTimepoint = [];
  for (const line of text.split('\n')) {
    if (line.startsWith('@')) byTimepoint.push([]);
    else if (line.startsWith('note') && byTimepoint.length > 0) byTimepoint[byTimepoint.length - 1].push(line.slice(4).trim());
  }
  return byTimepoint;
};
const jsonsFull = texts.map((t) => {
  const timeline = core.checkNote(t).analysis.timeline;
  const notes = freeTexts(t);
  return JSON.stringify({
    header: Object.fromEntries(timeline.header.map((s) => [s.fieldId, valueOf(s)])),
    timepoints: timeline.timepoints.map((tp, i) => ({
      label: tp.label, day: tp.time.day, minutes: tp.time.minutes,
      values: Object.fromEntries(tp.stated.map((s) => [s.fieldId, valueOf(s)])),
      notes: notes[i] ?? [],
    })),
  });
});
const jsonFullBytes = jsonsFull.reduce((n, t) => n + Buffer.byteLength(t), 0);

// Floors of reading the text in JavaScript, nothing analysed: each character looked at once (words
// counted), and each word kept as one small object with its place (what a syntax tree keeps at least).
let sink = 0;
const scanCharacters = () => {
  for (const t of texts) {
    let words = 0;
    let inWord = false;
    for (let i = 0; i < t.length; i++) {
      const c = t.charCodeAt(i);
      const blank = c === 0x20 || c === 0x0a || c === 0x2c;
      if (!blank && !inWord) words++;
      inWord = !blank;
    }
    sink += words;
  }
};
const objectPerWord = () => {
  for (const t of texts) {
    const words = [];
    let start = 0;
    for (let i = 0; i <= t.length; i++) {
      const c = i < t.length ? t.charCodeAt(i) : 0x20;
      if (c === 0x20 || c === 0x0a) {
        if (i > start) words.push({ start, end: i, text: t.slice(start, i) });
        start = i + 1;
      }
    }
    sink += words.length;
  }
};

let ours = Infinity;
let parsed = Infinity;
let floor = Infinity;
let floorFull = Infinity;
let scan = Infinity;
let objects = Infinity;
for (let r = 0; r < 3; r++) {
  ours = Math.min(ours, time(() => { for (const t of texts) core.checkNote(t); }));
  parsed = Math.min(parsed, time(() => { for (const t of texts) sink += core.parseNote(t).lines.length; }));
  floor = Math.min(floor, time(() => { for (const j of jsons) JSON.parse(j); }));
  floorFull = Math.min(floorFull, time(() => { for (const j of jsonsFull) JSON.parse(j); }));
  scan = Math.min(scan, time(scanCharacters));
  objects = Math.min(objects, time(objectPerWord));
}
if (sink < 0) console.log(sink); // keeps the floors' work from being optimised away

const dir = mkdtempSync(join(tmpdir(), 'pneumark-bench-'));
texts.forEach((t, i) => {
  const folder = join(dir, `ward-${String(i % 20).padStart(2, '0')}`);
  mkdirSync(folder, { recursive: true });
  writeFileSync(join(folder, `note-${String(i).padStart(5, '0')}.pneu`), t);
});
const cli = join(process.cwd(), 'dist/cli.js');
const wall = (args) => {
  const t = performance.now();
  const r = spawnSync(process.execPath, [cli, ...args], { cwd: dir, encoding: 'utf8', maxBuffer: 1 << 30, env: { ...process.env, NO_COLOR: '1' } });
  const s = (performance.now() - t) / 1000;
  if (r.status === 2) throw new Error(`${args.join(' ')} failed: ${r.stderr.slice(0, 500)}`);
  return { s, out: r.stdout.length };
};
const check = wall(['check', '--quiet', '.']);
const checkOneThread = wall(['check', '--quiet', '--jobs', '0', '.']);
const exportCsv = wall(['export', '--format', 'csv', '.']);
rmSync(dir, { recursive: true, force: true });

const mb = (b) => b / 1048576;
console.log(`Pneumark command-line benchmark: ${NOTES} notes, ${mb(noteBytes).toFixed(1)} MB of notes (${mb(jsonBytes).toFixed(1)} MB as JSON), Node ${process.version}, ${availableParallelism()} cores`);
console.log(`${'measure'.padEnd(40)} ${'seconds'.padStart(8)} ${'notes/s'.padStart(10)} ${'MB/s'.padStart(8)}`);
const line = (what, s, bytes) => console.log(`${what.padEnd(40)} ${s.toFixed(2).padStart(8)} ${(NOTES / s).toFixed(0).padStart(10)} ${mb(bytes / s).toFixed(2).padStart(8)}`);
line('analysis in process (checkNote)', ours, noteBytes);
line('  its first pass (cold, as a run is)', cold, noteBytes);
line('  parse alone (parseNote, no analysis)', parsed, noteBytes);
line('JSON.parse of the same corpus (floor)', floor, jsonBytes);
line('  with header, units and free text', floorFull, jsonFullBytes);
line('  each character looked at once (JS)', scan, noteBytes);
line('  one object per word (JS)', objects, noteBytes);
line('pneumark check (whole corpus, wall)', check.s, noteBytes);
line('pneumark check --jobs 0 (one thread)', checkOneThread.s, noteBytes);
line('pneumark export --format csv (wall)', exportCsv.s, noteBytes);
console.log(`analysis / JSON.parse time ratio: ${(ours / floor).toFixed(1)}× (target ≤ 3×); check of the corpus: ${check.s.toFixed(1)} s (target < 10 s)`);
console.log(`against the fuller JSON (${mb(jsonFullBytes).toFixed(1)} MB: header, units as written, free text): analysis ${(ours / floorFull).toFixed(1)}×, parse alone ${(parsed / floorFull).toFixed(1)}×`);
console.log(`parse alone / JSON.parse: ${(parsed / floor).toFixed(1)}× (the syntax tree with its ranges, nothing derived or checked)`);
console.log(`floors / JSON.parse, nothing analysed: one look at each character ${(scan / floor).toFixed(2)}×, one object per word ${(objects / floor).toFixed(2)}×`);
