/**
 * Runs a task over many notes, in parallel when it pays off: worker threads each take the next
 * note, and results land in the slot of their note, so the output order is the input order
 * whatever the parallelism. Standard input is always read in the main thread.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import type { Settings } from '../core/settings';
import type { Io } from './args';
import { progressBar } from './progress';
import { unpackReport, type FileReport, type NoteWorker, type PackedReport, type Task } from './work';

/** Below this many notes a single thread is faster than starting workers. */
export const PARALLEL_FROM = 200;

/** Batches each worker has been sent and not yet answered. */
const IN_FLIGHT = 2;

/** A note sent to a worker (its path and its place in the output), and what comes back. */
export interface WorkItem {
  readonly f: string;
  readonly i: number;
}
export interface WorkDone {
  readonly i: number;
  readonly report: PackedReport;
}

/**
 * Notes per message to a worker. One note per message leaves a worker idle for a round trip per
 * note (as long as checking a small note); big batches leave one worker with the last long ones.
 * About eight batches per worker, from 1 to 64 notes.
 */
export function batchSize(notes: number, workers: number): number {
  return Math.max(1, Math.min(64, Math.floor(notes / (Math.max(1, workers) * 8))));
}

export interface PoolOptions {
  readonly cwd: string;
  readonly overrides: Partial<Settings>;
  /** Worker count; 0 or 1 runs in this thread. */
  readonly workers: number;
  readonly onDone?: (done: number, total: number) => void;
}

/**
 * Worker threads for a run over `files` notes: `--jobs` when given, else the environment variable
 * PNEUMARK_WORKERS, else one per core (up to 4) from PARALLEL_FROM notes on. 0 or 1: this thread only.
 */
export function workerCount(files: number, env: NodeJS.ProcessEnv, jobs?: number): number {
  if (jobs !== undefined) return jobs;
  const forced = env.PNEUMARK_WORKERS;
  if (forced !== undefined && /^\d+$/.test(forced)) return Number(forced);
  if (files < PARALLEL_FROM) return 0;
  return Math.max(0, Math.min(4, availableParallelism()));
}

/** Workers need the bundled script (dist/cli.js); from sources (tests) everything runs here. */
export function canUseWorkers(): boolean {
  return typeof __filename === 'string' && __filename.endsWith('.js');
}

export async function runAll(files: readonly string[], task: Task, local: NoteWorker, stdin: () => Buffer, options: PoolOptions): Promise<FileReport[]> {
  const reports: FileReport[] = new Array<FileReport>(files.length);
  const total = files.length;
  let done = 0;
  const finish = (i: number, report: FileReport) => {
    reports[i] = report;
    done++;
    options.onDone?.(done, total);
  };
  const parallel = options.workers > 1 && canUseWorkers();
  if (!parallel) {
    for (let i = 0; i < files.length; i++) {
      finish(i, local.run(files[i]!, task, stdin));
      if (i % 64 === 63) await new Promise((r) => setImmediate(r)); // let a progress bar draw
    }
    return reports;
  }
  const queue = files.map((f, i) => ({ f, i })).filter(({ f, i }) => {
    if (f !== '-') return true;
    finish(i, local.run(f, task, stdin));
    return false;
  });
  const workers = Math.min(options.workers, queue.length);
  const size = batchSize(queue.length, workers);
  let next = 0;
  await Promise.all(Array.from({ length: workers }, () => new Promise<void>((resolve, reject) => {
    const worker = new Worker(__filename, { workerData: { pneumarkWorker: true, cwd: options.cwd, overrides: options.overrides, task } });
    let inFlight = 0;
    /** Sends the next batch; true when there was one. */
    const feed = (): boolean => {
      if (next >= queue.length) return false;
      const batch: WorkItem[] = queue.slice(next, next + size);
      next += batch.length;
      inFlight++;
      worker.postMessage(batch);
      return true;
    };
    worker.on('message', (done: WorkDone[]) => {
      inFlight--;
      for (const d of done) finish(d.i, unpackReport(d.report));
      if (!feed() && inFlight === 0) void worker.terminate().then(() => resolve());
    });
    worker.on('error', reject);
    worker.on('online', () => {
      // Two batches in flight: the worker starts the second while the first goes back and the
      // next one comes, so it never waits for a round trip through this thread.
      for (let k = 0; k < IN_FLIGHT; k++) feed();
      if (inFlight === 0) void worker.terminate().then(() => resolve());
    });
  })));
  return reports;
}

/** Reads notes for a command with a progress bar, in parallel when there are many. */
export async function gather(files: readonly string[], task: Task, io: Io, worker: NoteWorker, showProgress: boolean, label: string, jobs?: number): Promise<FileReport[]> {
  const bar = progressBar(io.stderr, files.length, label, showProgress);
  try {
    return await runAll(files, task, worker, io.stdin, { cwd: io.cwd, overrides: {}, workers: workerCount(files.length, io.env, jobs), onDone: (d, t) => bar.update(d, t) });
  } finally {
    bar.stop();
  }
}

