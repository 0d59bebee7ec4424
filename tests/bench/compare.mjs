// Times two builds of the core against each other in one process, alternately (ABAB…), on the
// corpus of `npm run bench:cli`: checkNote and parseNote over every note, and JSON.parse of the
// same content as a reference measured in the same rounds (CPU seconds). On a shared VM single runs vary by
// ±30 % from minute to minute; alternating rounds see the same phases. Prints min and median per
// build and the ratios new/old; asserts nothing.
//
//   node tests/bench/compare.mjs [old-core.js] [--new new-core.js] [--notes N] [--rounds N] [--parse-only]
//
// `--parse-only` times parseNote alone (and JSON.parse), not checkNote. Wall times of the same runs
// are printed after the CPU times.
//
// The old bundle: see tests/bench/same-results.mjs. The new one is built from this tree.
import { rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { generateNote } from './generate.mjs';
import { args, buildCore, oldPath, option } from './two-builds.mjs';

const require = createRequire(import.meta.url);
const NOTES = option('--notes', 10000);
const ROUNDS = option('--rounds', 5);
const PARSE_ONLY = args.includes('--parse-only');

// `--new path`: a bundle made already (the same bundle as both, copied, shows what the order of rounds alone does).
const newIndex = args.indexOf('--new');
let newPath = newIndex >= 0 ? args[newIndex + 1] : null;
if (newPath === null) {
  newPath = join(tmpdir(), `pneumark-compare-${process.pid}.cjs`);
  await buildCore(newPath);
}
const builds = { old: require(oldPath), new: require(newPath) };
if (newIndex < 0) rmSync(newPath, { force: true });

const texts = [];
for (let i = 0; i < NOTES; i++) texts.push(generateNote(5 + (i % 31), i + 1));
const jsons = texts.map((t) => JSON.stringify(builds.old.checkNote(t).analysis.timeline.timepoints.map((tp) => ({
  label: tp.label, day: tp.time.day, minutes: tp.time.minutes,
  values: Object.fromEntries(tp.stated.map((s) => [s.fieldId, s.word ?? s.parts ?? s.value])),
}))));

let sink = 0;
// CPU time of this process (user + system), not wall time: on a VM shared with other work, time
// spent waiting for a core is not the code's.
// The wall time of each run is kept beside it (`walls`), for a look at what waiting for a core cost.
const walls = {};
const time = (f, name) => {
  const w = performance.now();
  const t = process.cpuUsage();
  f();
  const d = process.cpuUsage(t);
  (walls[name] ??= []).push((performance.now() - w) / 1e3);
  return (d.user + d.system) / 1e6;
};
const runs = PARSE_ONLY
  ? { 'parseNote old': [], 'parseNote new': [], 'JSON.parse': [] }
  : { 'checkNote old': [], 'checkNote new': [], 'parseNote old': [], 'parseNote new': [], 'JSON.parse': [] };
// A first pass of each, so both are optimised before timing.
for (const core of Object.values(builds)) for (const t of texts) sink += core.checkNote(t).findings.length;
for (let r = 0; r < ROUNDS; r++) {
  // The order within a round alternates too, so neither build always runs right after the other's garbage.
  const order = r % 2 === 0 ? ['old', 'new'] : ['new', 'old'];
  if (!PARSE_ONLY) for (const name of order) runs[`checkNote ${name}`].push(time(() => { for (const t of texts) sink += builds[name].checkNote(t).findings.length; }, `checkNote ${name}`));
  for (const name of order) runs[`parseNote ${name}`].push(time(() => { for (const t of texts) sink += builds[name].parseNote(t).lines.length; }, `parseNote ${name}`));
  runs['JSON.parse'].push(time(() => { for (const j of jsons) sink += JSON.parse(j).length; }, 'JSON.parse'));
}
if (sink < 0) console.log(sink);

const sorted = (xs) => [...xs].sort((a, b) => a - b);
const min = (xs) => sorted(xs)[0];
const median = (xs) => sorted(xs)[Math.floor(xs.length / 2)];
console.log(`${NOTES} notes, ${ROUNDS} alternating rounds, Node ${process.version}`);
for (const [name, xs] of Object.entries(runs)) console.log(`${name.padEnd(16)} min ${min(xs).toFixed(3)} s  median ${median(xs).toFixed(3)} s  (${xs.map((x) => x.toFixed(2)).join(' ')})`);
console.log('wall time of the same runs:');
for (const [name, xs] of Object.entries(walls)) console.log(`${name.padEnd(16)} min ${min(xs).toFixed(3)} s  median ${median(xs).toFixed(3)} s`);
for (const what of PARSE_ONLY ? ['parseNote'] : ['checkNote', 'parseNote']) {
  const o = runs[`${what} old`];
  const n = runs[`${what} new`];
  console.log(`${what} new/old: min ${(min(n) / min(o)).toFixed(3)}, median ${(median(n) / median(o)).toFixed(3)}; per round ${n.map((x, i) => (x / o[i]).toFixed(3)).join(' ')}; new / JSON.parse (min) ${(min(n) / min(runs['JSON.parse'])).toFixed(1)}×, old ${(min(o) / min(runs['JSON.parse'])).toFixed(1)}×`);
}
