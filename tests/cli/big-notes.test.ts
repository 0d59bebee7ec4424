// Big notes are analysed in a worker thread of their own (server/src/cli/analyse-alone.ts): one
// that needs more memory than a note is given gets a one-line problem and the run goes on, where
// it used to stop the whole process with V8's fatal out-of-memory error. These tests run the built
// command (dist/cli.js), as only the bundle starts workers, with a small heap so that a note of
// 200 KB runs out of memory in a second.
import { spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ALONE_FROM_BYTES, aloneLimits, MOST_NOTE_HEAP_MB, outOfMemoryProblem } from '../../server/src/cli/analyse-alone';
import { UsageError } from '../../server/src/cli/args';
import { generateNote } from '../bench/generate.mjs';

const CLI = join(process.cwd(), 'dist/cli.js');

/** 100,000 bare timepoints: some 170 MB of heap to analyse, far more than 32 MB. */
const HOSTILE = '@\n'.repeat(100_000);
const SMALL = '@ 08:00\nvitals hr 236\n';

/** A folder with the hostile note and a small one (a warning, PN302). */
function folder(): string {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-big-'));
  writeFileSync(join(dir, 'huge.pneu'), HOSTILE);
  writeFileSync(join(dir, 'small.pneu'), SMALL);
  return dir;
}

function cli(args: readonly string[], cwd: string, env: Record<string, string>, options: { input?: string; node?: readonly string[] } = {}): SpawnSyncReturns<string> {
  return spawnSync(process.execPath, [...(options.node ?? []), CLI, ...args], {
    cwd, encoding: 'utf8', maxBuffer: 1 << 26, env: { ...process.env, NO_COLOR: '1', ...env }, ...(options.input !== undefined ? { input: options.input } : {}),
  });
}

/** Notes over 64 KB are analysed alone, with 32 MB of heap. */
const LOW = { PNEUMARK_NOTE_HEAP_MB: '32', PNEUMARK_BIG_NOTE_KB: '64' };
const PROBLEM = outOfMemoryProblem(32);

/** Standard error is the one line of the note's problem: no fatal error, no stack trace. */
function expectOneProblem(r: SpawnSyncReturns<string>, shown: string): void {
  expect(r.stderr).toBe(`pneumark: ${shown}: ${PROBLEM}\n`);
  expect(r.status).toBe(2);
  expect(r.signal).toBeNull();
}

describe('a note that needs more memory than a note is given', () => {
  it('gets a one-line problem, exit code 2, and the other notes are still checked (built command)', () => {
    const dir = folder();
    const text = cli(['check', 'huge.pneu', 'small.pneu'], dir, LOW);
    expectOneProblem(text, 'huge.pneu');
    expect(text.stdout).toContain(`huge.pneu: cannot check: ${PROBLEM}`);
    expect(text.stdout).toMatch(/^small\.pneu:2:11 {2}warning {2}PN302 /m);
    const json = cli(['check', '--format', 'json', '.'], dir, LOW);
    expectOneProblem(json, 'huge.pneu');
    const files = (JSON.parse(json.stdout) as { files: { path: string; problem: string | null; findings: { code: string }[] }[] }).files;
    expect(files.map((f) => [f.path, f.problem, f.findings.map((x) => x.code)])).toEqual([['huge.pneu', PROBLEM, []], ['small.pneu', null, ['PN302']]]);
    const csv = cli(['export', '--format', 'csv', '.'], dir, LOW);
    expectOneProblem(csv, 'huge.pneu');
    expect(csv.stdout.split('\n').filter((l) => l.startsWith('small.pneu,'))).toHaveLength(1);
  });

  it('gets the same problem over standard input (built command)', () => {
    const dir = folder();
    const r = cli(['check', '-', 'small.pneu'], dir, LOW, { input: HOSTILE });
    expectOneProblem(r, '<stdin>');
    expect(r.stdout).toMatch(/^small\.pneu:2:11 {2}warning {2}PN302 /m);
  });

  it('does not stop a parallel run (--jobs 2) (built command)', () => {
    const dir = folder();
    for (let i = 0; i < 6; i++) writeFileSync(join(dir, `note-${i}.pneu`), `@ 08:00\nvitals spo2 ${90 + i}\nabg 7.40/40/${60 + i}/24.4\n`);
    for (const args of [['check', '.'], ['check', '--format', 'json', '.'], ['export', '--format', 'jsonl', '.']]) {
      const single = cli([...args, '--jobs', '0'], dir, LOW);
      const parallel = cli([...args, '--jobs', '2'], dir, LOW);
      expectOneProblem(parallel, 'huge.pneu');
      expect(parallel.stdout).toBe(single.stdout);
    }
  }, 60_000);

  it('does not stop a parallel run when it kills a pool worker (built command)', () => {
    // Every note to the pool (none is big enough to go alone), each worker with the heap of this
    // process (112 MB in all): the worker that reads the note dies of memory, the notes it had
    // been sent are analysed alone, and a new worker takes its place.
    const dir = folder();
    for (let i = 0; i < 6; i++) writeFileSync(join(dir, `note-${i}.pneu`), `@ 08:00\nvitals spo2 ${90 + i}\nabg 7.40/40/${60 + i}/24.4\n`);
    const node = ['--max-old-space-size=64'];
    const single = cli(['check', '--jobs', '0', '.'], dir, {}, { node });
    const parallel = cli(['check', '--jobs', '2', '.'], dir, { PNEUMARK_BIG_NOTE_KB: '20480' }, { node });
    expect(parallel.stderr).toMatch(/^pneumark: huge\.pneu: could not be analysed: it needs more memory than one note is given \(\d+ MB\); split it into smaller notes\n$/);
    expect(parallel.status).toBe(2);
    expect(parallel.stdout).toBe(single.stdout);
    expect(parallel.stdout).toMatch(/^7 notes checked, 1 could not be checked: 0 errors, 1 warning, 0 info\./m);
  }, 60_000);

  it('is found from the heap this process is given, with no setting (built command)', () => {
    // With 64 MB of old generation (112 MB of heap in all), notes from 56 KB are analysed alone
    // with a third of the heap: the note used to stop the process with a fatal error.
    const dir = folder();
    const r = cli(['check', 'huge.pneu', 'small.pneu'], dir, {}, { node: ['--max-old-space-size=64'] });
    expect(r.stderr).toMatch(/^pneumark: huge\.pneu: could not be analysed: it needs more memory than one note is given \(\d+ MB\); split it into smaller notes\n$/);
    expect(r.status).toBe(2);
    expect(r.stdout).toMatch(/^small\.pneu:2:11 {2}warning {2}PN302 /m);
  });
});

describe('a big note that fits', () => {
  it('gives the same output analysed alone as in the main thread, in every format (built command)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-alone-'));
    writeFileSync(join(dir, 'a.pneu'), generateNote(40, 3));
    writeFileSync(join(dir, 'b.pneu'), `${SMALL}abg 7.1/80/50/24\n`);
    const stdin = readFileSync(join(dir, 'a.pneu'), 'utf8');
    // Every note of more than 0 KB alone (the route the tests above show a note takes with this
    // setting), against none (20 MB is the most a note may have).
    const alone = { PNEUMARK_BIG_NOTE_KB: '0' };
    const here = { PNEUMARK_BIG_NOTE_KB: '20480' };
    const runs: (readonly string[])[] = [
      ['check', '.'], ['check', '--quiet', '.'], ['check', '--format', 'json', '.', '-'], ['check', '--format', 'sarif', '.'],
      ['export', '--format', 'csv', '.'], ['export', '--format', 'jsonl', '.', '-'], ['export', '--format', 'fhir', '.', '-'],
    ];
    for (const args of runs) {
      const a = cli(args, dir, alone, { input: stdin });
      const h = cli(args, dir, here, { input: stdin });
      expect(a.stderr).toBe('');
      expect(a.status, args.join(' ')).toBe(h.status);
      expect(a.stdout).toBe(h.stdout);
      expect(a.stdout).not.toBe('');
    }
  }, 60_000);
});

describe('aloneLimits', () => {
  const GB = 1024 ** 3;
  it('gives a note analysed alone a third of the heap, at most 1536 MB, and sends notes from 2 MB or a 2048th of the heap', () => {
    expect(aloneLimits({}, 4 * GB)).toEqual({ fromBytes: ALONE_FROM_BYTES, heapMb: 1365 });
    expect(aloneLimits({}, 16 * GB)).toEqual({ fromBytes: ALONE_FROM_BYTES, heapMb: MOST_NOTE_HEAP_MB });
    expect(aloneLimits({}, 256 * 1024 * 1024)).toEqual({ fromBytes: 128 * 1024, heapMb: 85 });
  });

  it('takes PNEUMARK_NOTE_HEAP_MB and PNEUMARK_BIG_NOTE_KB instead, and refuses what is not a whole number in range', () => {
    expect(aloneLimits({ PNEUMARK_NOTE_HEAP_MB: '32', PNEUMARK_BIG_NOTE_KB: '0' }, 4 * GB)).toEqual({ fromBytes: 0, heapMb: 32 });
    for (const env of [{ PNEUMARK_NOTE_HEAP_MB: '' }, { PNEUMARK_NOTE_HEAP_MB: '1e3' }, { PNEUMARK_NOTE_HEAP_MB: '4' }, { PNEUMARK_BIG_NOTE_KB: '-1' }, { PNEUMARK_BIG_NOTE_KB: '20481' }]) {
      expect(() => aloneLimits(env, 4 * GB)).toThrow(UsageError);
    }
    expect(() => aloneLimits({ PNEUMARK_BIG_NOTE_KB: 'x' }, 4 * GB)).toThrow('environment variable PNEUMARK_BIG_NOTE_KB: expected a whole number of kilobytes from 0 to 20480 (got "x")');
  });
});
