/**
 * Big notes are analysed in a worker thread of their own, with a heap limit of its own, so a note
 * that needs more memory than there is (a hostile 20 MB note of bare `@` lines needs gigabytes)
 * gets a one-line problem and the run goes on with the other notes, where it would otherwise stop
 * the whole process with V8's fatal out-of-memory error. The worker is the pool's (`workerMain` in
 * main.ts, sent one note), so the report is the same as from any other worker.
 */
import { getHeapStatistics } from 'node:v8';
import { Worker } from 'node:worker_threads';
import { z } from 'zod';
import type { Settings } from '../core/settings';
import { UsageError, wholeNumberOption } from './args';
import { MAX_NOTE_BYTES, shownPath } from './inputs';
import type { BatchDone, WorkItem } from './pool';
import { unpackReport, type FileReport, type Task } from './work';

/**
 * Notes over this many bytes are analysed alone (unless the heap is small: see `aloneLimits`).
 * The analysis keeps up to about 850 bytes of heap per byte of a hostile note (900 in the core and
 * 800 in the CLI per bare `@` line of two bytes), about 33 for an ordinary one: 2 MB stays below
 * 1.8 GB in the worst case, and an ordinary note of 2 MB is analysed in half a second, against the
 * few tenths of a second a worker takes to start.
 */
export const ALONE_FROM_BYTES = 2 * 1024 * 1024;

/** The most heap a note analysed alone is given, in MB. */
export const MOST_NOTE_HEAP_MB = 1536;

/** Where big notes go, and how much heap each one gets. */
export interface AloneLimits {
  /** Notes of more bytes than this are analysed alone. */
  readonly fromBytes: number;
  /** The heap of the worker of one such note, in MB (its old generation). */
  readonly heapMb: number;
}

/** Overrides for tests and constrained machines, validated: a value that is not a whole number in range is a usage error. */
const aloneEnv = z.object({
  PNEUMARK_NOTE_HEAP_MB: wholeNumberOption(8, 1_048_576, 'expected a whole number of megabytes from 8 to 1048576').optional(),
  PNEUMARK_BIG_NOTE_KB: wholeNumberOption(0, MAX_NOTE_BYTES / 1024, `expected a whole number of kilobytes from 0 to ${MAX_NOTE_BYTES / 1024}`).optional(),
});

/**
 * The limits for a run from this thread's heap limit (`heapLimitBytes`, V8's `heap_size_limit`):
 * a note analysed alone gets a third of it (at most MOST_NOTE_HEAP_MB), so that what it sends
 * back (its findings, its output) still fits here beside the rest; notes from ALONE_FROM_BYTES,
 * or from a 2048th of the heap when that is less, so a note analysed here stays within half of it
 * even in the worst case (`node --max-old-space-size=256` sends notes from 128 KB). The
 * environment variables PNEUMARK_NOTE_HEAP_MB and PNEUMARK_BIG_NOTE_KB set them instead.
 */
export function aloneLimits(env: NodeJS.ProcessEnv, heapLimitBytes: number = getHeapStatistics().heap_size_limit): AloneLimits {
  const parsed = aloneEnv.safeParse({ PNEUMARK_NOTE_HEAP_MB: env.PNEUMARK_NOTE_HEAP_MB, PNEUMARK_BIG_NOTE_KB: env.PNEUMARK_BIG_NOTE_KB });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const name = String(issue?.path[0] ?? 'PNEUMARK_NOTE_HEAP_MB');
    throw new UsageError(`environment variable ${name}: ${issue?.message ?? 'not valid'} (got ${JSON.stringify(env[name] ?? '')})`);
  }
  const heapMb = parsed.data.PNEUMARK_NOTE_HEAP_MB ?? Math.max(8, Math.min(MOST_NOTE_HEAP_MB, Math.floor(heapLimitBytes / 3 / 1048576)));
  const kb = parsed.data.PNEUMARK_BIG_NOTE_KB;
  const fromBytes = kb !== undefined ? kb * 1024 : Math.min(ALONE_FROM_BYTES, Math.floor(heapLimitBytes / 2048));
  return { fromBytes, heapMb };
}

/** The problem of a note whose analysis ran out of the memory it was given. */
export function outOfMemoryProblem(heapMb: number): string {
  return `could not be analysed: it needs more memory than one note is given (${heapMb} MB); split it into smaller notes`;
}

/**
 * A note's bytes as a view of an ArrayBuffer of its own, to be moved to the worker rather than
 * copied: a small Buffer is a view of a pool shared with others, which must not be moved.
 */
function ownBytes(bytes: Uint8Array): Uint8Array {
  return bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength && bytes.buffer instanceof ArrayBuffer ? bytes : new Uint8Array(bytes);
}

export interface AloneOptions {
  readonly cwd: string;
  readonly overrides: Partial<Settings>;
  readonly heapMb: number;
  /** The `--stdin-name` path of the note read from standard input (null: none given). */
  readonly stdinName: string | null;
}

/**
 * The report of one note analysed in a worker of its own with `heapMb` of heap; `bytes` are the
 * note's when this thread has read them already (always for standard input), else the worker
 * reads the note at `path`; `index` is the note's place in the run, from 0 (a redacted export names
 * the note by it). Never rejects: a worker that runs out of memory, fails or stops
 * without an answer gives the note a problem.
 */
export function analyseAlone(path: string, index: number, bytes: Uint8Array | null, task: Task, options: AloneOptions): Promise<FileReport> {
  const shown = shownPath(path, options.stdinName);
  const failed = (problem: string): FileReport => ({ path: shown, problem, findings: [] });
  return new Promise<FileReport>((resolve) => {
    let worker: Worker;
    try {
      worker = new Worker(__filename, {
        workerData: { pneumarkWorker: true, cwd: options.cwd, overrides: options.overrides, task, aloneFrom: null, stdinName: options.stdinName },
        resourceLimits: { maxOldGenerationSizeMb: options.heapMb },
      });
    } catch (error) {
      resolve(failed(`could not be analysed (${error instanceof Error ? error.message : String(error)})`));
      return;
    }
    let settled = false;
    const settle = (report: FileReport): void => {
      if (settled) return;
      settled = true;
      void worker.terminate();
      resolve(report);
    };
    worker.on('message', (answer: BatchDone) => {
      const done = answer.done[0];
      settle(done !== undefined && done.report !== null ? unpackReport(done.report) : failed('could not be analysed: its worker thread gave no report'));
    });
    worker.on('error', (error: Error & { code?: unknown }) => {
      settle(failed(error.code === 'ERR_WORKER_OUT_OF_MEMORY' ? outOfMemoryProblem(options.heapMb) : `could not be analysed (${error.message})`));
    });
    worker.on('exit', () => settle(failed('could not be analysed: its worker thread stopped without an answer')));
    const note = bytes === null ? null : ownBytes(bytes);
    const item: WorkItem = note === null ? { f: path, i: index } : { f: path, i: index, bytes: note };
    worker.postMessage([item], note === null ? [] : [note.buffer as ArrayBuffer]);
  });
}
