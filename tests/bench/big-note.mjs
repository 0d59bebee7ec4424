// Benchmark of the command line on one big note: a generated note of 3,000 timepoints (about
// 15,000 lines, 480 KB; BENCH_BIG_TIMEPOINTS sets another size), checked and exported by the built
// command, read from a file and from standard input. Prints figures (wall time and CPU time of the
// process, best of BENCH_ROUNDS runs, 5 by default; its peak memory); asserts nothing.
// `npm run bench:big-note` (builds first).
//
//   node tests/bench/big-note.mjs [--old OLD/dist/cli.js]
//
// With --old, each run of this tree's dist/cli.js alternates with one of the other build (a
// worktree of an older commit, built), and their outputs are compared byte for byte: on a shared
// VM only alternating runs compare two builds fairly.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { generateNote } from './generate.mjs';

const TIMEPOINTS = Number(process.env.BENCH_BIG_TIMEPOINTS ?? 3000);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 5);
const at = process.argv.indexOf('--old');
const old = at >= 0 ? resolve(process.argv[at + 1] ?? '') : null;
const ours = join(process.cwd(), 'dist/cli.js');

const dir = mkdtempSync(join(tmpdir(), 'pneumark-big-note-'));
const text = generateNote(TIMEPOINTS, 7);
const note = join(dir, 'big.pneu');
writeFileSync(note, text);

/** One run: wall seconds, CPU seconds (user + system, of the child), peak memory in MB, and the output. */
function once(cli, args, input) {
  const t = performance.now();
  const r = spawnSync('/usr/bin/time', ['-f', '%U %S %M', process.execPath, cli, ...args], {
    cwd: dir, encoding: 'utf8', maxBuffer: 1 << 30, env: { ...process.env, NO_COLOR: '1' }, ...(input ? { input } : {}),
  });
  const wall = (performance.now() - t) / 1000;
  if (r.status === 2) throw new Error(`${args.join(' ')} failed: ${r.stderr.slice(0, 500)}`);
  const [user, system, kb] = r.stderr.trim().split('\n').at(-1).split(' ').map(Number);
  return { wall, cpu: user + system, mb: kb / 1024, out: r.stdout };
}

const CASES = [
  ['check', 'big.pneu'], ['check', '--format', 'json', 'big.pneu'], ['check', '--format', 'sarif', 'big.pneu'],
  ['export', '--format', 'csv', 'big.pneu'], ['export', '--format', 'jsonl', 'big.pneu'], ['export', '--format', 'fhir', 'big.pneu'],
  ['check', '-'], ['export', '--format', 'fhir', '-'],
];

console.log(`Pneumark command line on one note of ${TIMEPOINTS} timepoints (${text.split('\n').length} lines, ${(Buffer.byteLength(text) / 1024).toFixed(0)} KB), Node ${process.version}, ${availableParallelism()} cores, best of ${ROUNDS}`);
console.log(`${'command'.padEnd(34)} ${'wall s'.padStart(7)} ${'CPU s'.padStart(7)} ${'MB'.padStart(6)} ${'output MB'.padStart(10)}${old ? `   ${'old wall'.padStart(8)} ${'old CPU'.padStart(8)} ${'old MB'.padStart(7)}  same` : ''}`);
for (const args of CASES) {
  const input = args.includes('-') ? text : undefined;
  const best = { wall: Infinity, cpu: Infinity, mb: 0, out: '' };
  const bestOld = { wall: Infinity, cpu: Infinity, mb: 0, out: '' };
  let same = true;
  for (let r = 0; r < ROUNDS; r++) {
    const runs = old && r % 2 === 1 ? [[old, bestOld], [ours, best]] : [[ours, best], ...(old ? [[old, bestOld]] : [])];
    for (const [cli, into] of runs) {
      const run = once(cli, args, input);
      into.wall = Math.min(into.wall, run.wall);
      into.cpu = Math.min(into.cpu, run.cpu);
      into.mb = Math.max(into.mb, run.mb);
      if (into.out === '') into.out = run.out;
      else if (into.out !== run.out) same = false;
    }
  }
  if (old && best.out !== bestOld.out) same = false;
  const shown = `pneumark ${args.join(' ')}`;
  console.log(`${shown.padEnd(34)} ${best.wall.toFixed(2).padStart(7)} ${best.cpu.toFixed(2).padStart(7)} ${best.mb.toFixed(0).padStart(6)} ${(Buffer.byteLength(best.out) / 1048576).toFixed(1).padStart(10)}${old ? `   ${bestOld.wall.toFixed(2).padStart(8)} ${bestOld.cpu.toFixed(2).padStart(8)} ${bestOld.mb.toFixed(0).padStart(7)}  ${same ? 'yes' : 'NO'}` : ''}`);
}
rmSync(dir, { recursive: true, force: true });
