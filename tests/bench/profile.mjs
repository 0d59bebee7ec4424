// Where the CPU time of the analysis goes, on the corpus of `npm run bench:cli` (generated notes of
// 5 to 35 timepoints): a sampling CPU profile of parse + timeline + checks over every note, each
// analysis dropped as soon as it is made (as `checkNote` is used), printed as self time by source
// module of the core, by function, and by check (a check's time with what it calls, such as the
// derived values it is the first to ask for). Asserts nothing.
//
//   node tests/bench/profile.mjs [--notes N] [--rounds N] [--top N] [--kept]
//
// `--kept` profiles only the checks, over analyses made beforehand and kept meanwhile, as a
// per-check loop over prebuilt analyses does: that shows the checks' reads of values built long
// before (memory far from the processor) and collections of a large heap, which the usual run
// does not pay; compare the two before trusting a per-check figure.
import { build } from 'esbuild';
import { Session } from 'node:inspector/promises';
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { generateNote } from './generate.mjs';

const args = process.argv.slice(2);
const option = (name, fallback) => { const i = args.indexOf(name); return i >= 0 ? Number(args[i + 1]) : fallback; };
const NOTES = option('--notes', 2000);
const ROUNDS = option('--rounds', 4);
const TOP = option('--top', 25);
const KEPT = args.includes('--kept');

const root = new URL('../../', import.meta.url).pathname;
const entry = join(tmpdir(), `pneumark-profile-${process.pid}.ts`);
const outfile = join(tmpdir(), `pneumark-profile-${process.pid}.mjs`);
writeFileSync(entry, `export * from '${join(root, 'tests/bench/stages-entry')}';\n`);
await build({ entryPoints: [entry], bundle: true, platform: 'node', format: 'esm', outfile, logLevel: 'error' });
const m = await import(pathToFileURL(outfile).href);
// The module each line of the bundle comes from (esbuild heads each with `// server/src/core/...`).
const moduleAt = [];
let current = '(bench)';
for (const line of readFileSync(outfile, 'utf8').split('\n')) {
  if (/^\/\/ (server|tests|node_modules)\//.test(line)) current = line.slice(3).replace('server/src/core/', '');
  moduleAt.push(current);
}
const bundleName = outfile.split('/').pop();
rmSync(outfile, { force: true });
rmSync(entry, { force: true });

const texts = [];
for (let i = 0; i < NOTES; i++) texts.push(generateNote(5 + (i % 31), i + 1));
const settings = m.withDefaults({});
const kept = KEPT ? texts.map((t) => { const tree = m.parseNote(t); return { tree, timeline: m.buildTimeline(tree, settings) }; }) : [];
let sink = 0;
const pass = KEPT
  ? () => { for (const a of kept) sink += m.runChecks({ ...a, derivation: m.deriverFor(a.timeline, settings) }, settings).findings.length; }
  : () => {
    for (const t of texts) {
      const tree = m.parseNote(t);
      const timeline = m.buildTimeline(tree, settings);
      sink += m.runChecks({ tree, timeline, derivation: m.deriverFor(timeline, settings) }, settings).findings.length;
    }
  };
for (let r = 0; r < 2; r++) pass();

const session = new Session();
session.connect();
await session.post('Profiler.enable');
await session.post('Profiler.setSamplingInterval', { interval: 100 });
await session.post('Profiler.start');
const cpu = process.cpuUsage();
for (let r = 0; r < ROUNDS; r++) pass();
const used = process.cpuUsage(cpu);
const { profile } = await session.post('Profiler.stop');
session.disconnect();
if (sink < 0) console.log(sink);

const ours = (node) => node.callFrame.url.endsWith(bundleName);
const byId = new Map(profile.nodes.map((n) => [n.id, n]));
const parent = new Map();
for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
const sampled = new Map();
profile.samples.forEach((id, i) => sampled.set(id, (sampled.get(id) ?? 0) + (profile.timeDeltas[i] ?? 0)));
const byModule = new Map();
const byFunction = new Map();
const byCheck = new Map();
let total = 0;
const add = (map, key, t) => map.set(key, (map.get(key) ?? 0) + t);
for (const n of profile.nodes) {
  const t = sampled.get(n.id) ?? 0;
  if (t === 0) continue;
  total += t;
  // Outside the bundle: the garbage collector, V8's builtins, and this script's loop (with what V8 inlined into it).
  const module = ours(n) ? moduleAt[n.callFrame.lineNumber] : `(${n.callFrame.functionName || 'native'})`;
  add(byModule, module, t);
  add(byFunction, `${n.callFrame.functionName || '(anonymous)'} ${ours(n) ? `${module}:${n.callFrame.lineNumber + 1}` : ''}`, t);
  // The outermost check module on the way up to the runner: the check that asked.
  let check = null;
  for (let id = n.id; id !== undefined; id = parent.get(id)) {
    const f = byId.get(id);
    if (!ours(f)) continue;
    const file = moduleAt[f.callFrame.lineNumber];
    if (file.startsWith('checks/') && file !== 'checks/check.ts') check = file;
    if (f.callFrame.functionName === 'runChecks') break;
  }
  add(byCheck, check ?? '(parse, timeline, runner)', t);
}
const show = (title, map) => {
  console.log(`\n${title}`);
  for (const [k, t] of [...map].sort((a, b) => b[1] - a[1]).slice(0, TOP)) console.log(`${(100 * t / total).toFixed(1).padStart(6)} %  ${k}`);
};
console.log(`Pneumark CPU profile: ${NOTES} notes × ${ROUNDS} rounds${KEPT ? ', checks over kept analyses' : ''}, ${((used.user + used.system) / 1e3 / ROUNDS).toFixed(0)} ms of CPU a round, Node ${process.version}`);
show('self time by module', byModule);
show('self time by function', byFunction);
show('time by check (with what it asks for first)', byCheck);
