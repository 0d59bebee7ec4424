// Where the time of a full analysis goes, stage by stage, on the generated 10,000-line note of
// `npm run bench`: parse, timeline (values read and carried), checks (which derive what they
// need). Prints medians and minimums of 21 runs; asserts nothing. `npm run bench:stages`.
// The gap between a stage's median and its minimum is mostly garbage collection.
// Then reference floors on the same text, for scale: what this machine takes to split the note
// into words and keep them (as strings, or as one small object per word — a syntax tree keeps
// at least that), and to JSON.parse the same words written as JSON. Before the floors, what drives
// the garbage collector: objects made per analysis and young-generation collections per analysis.
import { build } from 'esbuild';
import { Session } from 'node:inspector/promises';
import { constants, PerformanceObserver } from 'node:perf_hooks';
import { rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { generateNote } from './generate.mjs';

const outfile = join(tmpdir(), `pneumark-stages-${process.pid}.mjs`);
await build({ entryPoints: [new URL('./stages-entry.ts', import.meta.url).pathname], bundle: true, platform: 'node', format: 'esm', outfile, logLevel: 'error' });
const m = await import(pathToFileURL(outfile).href);
rmSync(outfile, { force: true });

const text = generateNote(Number(process.env.BENCH_TIMEPOINTS ?? 2000));
const settings = m.withDefaults({});
const times = { parse: [], timeline: [], checks: [], total: [] };
for (let i = 0; i < 21; i++) {
  const t0 = performance.now();
  const tree = m.parseNote(text);
  const t1 = performance.now();
  const timeline = m.buildTimeline(tree, settings);
  const t2 = performance.now();
  m.runChecks({ tree, timeline, derivation: m.deriverFor(timeline, settings) }, settings);
  const t3 = performance.now();
  times.parse.push(t1 - t0);
  times.timeline.push(t2 - t1);
  times.checks.push(t3 - t2);
  times.total.push(t3 - t0);
}
const sorted = (a) => [...a].sort((x, y) => x - y);
console.log(`Pneumark analysis stages: ${text.split('\n').length} lines, Node ${process.version}`);
console.log(`${'stage'.padEnd(10)} ${'median'.padStart(10)} ${'min'.padStart(10)}`);
for (const [stage, xs] of Object.entries(times)) console.log(`${stage.padEnd(10)} ${`${sorted(xs)[10].toFixed(1)} ms`.padStart(10)} ${`${sorted(xs)[0].toFixed(1)} ms`.padStart(10)}`);

// What drives the collector: the objects an analysis makes (sampled by V8's heap profiler, those
// collected since included) and the young-generation collections it runs into, with their time.
{
  const analyse = () => {
    const tree = m.parseNote(text);
    const timeline = m.buildTimeline(tree, settings);
    return m.runChecks({ tree, timeline, derivation: m.deriverFor(timeline, settings) }, settings);
  };
  const N = 10;
  const session = new Session();
  session.connect();
  await session.post('HeapProfiler.startSampling', { samplingInterval: 4096, includeObjectsCollectedByMajorGC: true, includeObjectsCollectedByMinorGC: true });
  let kept = null;
  for (let i = 0; i < N; i++) kept = analyse();
  const { profile } = await session.post('HeapProfiler.stopSampling');
  session.disconnect();
  const sum = (node) => node.selfSize + node.children.reduce((t, c) => t + sum(c), 0);
  const made = sum(profile.head) / N;
  const minor = [];
  const observer = new PerformanceObserver((list) => { for (const e of list.getEntries()) if (e.detail?.kind === constants.NODE_PERFORMANCE_GC_MINOR) minor.push(e.duration); });
  observer.observe({ entryTypes: ['gc'] });
  for (let i = 0; i < N; i++) kept = analyse();
  await new Promise((resolve) => setTimeout(resolve, 50)); // gc entries arrive asynchronously
  observer.disconnect();
  console.log(`objects made per analysis       ${(made / 1e6).toFixed(1)} MB (sampled; ${kept.findings.length} findings kept)`);
  console.log(`young-generation collections    ${(minor.length / N).toFixed(1)} per analysis, ${(minor.reduce((a, b) => a + b, 0) / N).toFixed(1)} ms per analysis`);
}

// Reference floors: no analysis at all, only the cost of keeping the note's words.
const words = (line) => line.split(/[ ,]+/);
const floors = {
  'words as strings': () => text.split('\n').map(words),
  'one object per word': () => text.split('\n').map((l) => words(l).map((w, i) => ({ text: w, start: i, end: i + w.length }))),
  'JSON.parse of the words': ((json) => () => JSON.parse(json))(JSON.stringify(text.split('\n').map(words))),
};
console.log(`reference floors (the same text, nothing analysed; ${text.split(/[\n ,]+/).length} words)`);
for (const [name, f] of Object.entries(floors)) {
  const xs = [];
  let kept = [];
  for (let i = 0; i < 21; i++) {
    const t = performance.now();
    kept.push(f());
    xs.push(performance.now() - t);
    if (kept.length > 2) kept = kept.slice(-2); // results stay alive a while, as an analysis does
  }
  console.log(`${name.padEnd(24)} ${`${sorted(xs)[10].toFixed(1)} ms`.padStart(10)} ${`${sorted(xs)[0].toFixed(1)} ms`.padStart(10)}`);
}
