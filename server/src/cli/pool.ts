/**
 * Runs a task over many notes, in parallel when it pays off: worker threads each take the next
 * note, and results land in the slot of their note, so the output order is the input order
 * whatever the parallelism. Standard input is always read in the main thread. A big note is
 * analysed in a worker of its own (analyse-alone.ts), from here and from the pool alike.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import type { Settings } from '../core/settings';
import type { Io } from './args';
import { aloneLimits, analyseAlone, type AloneLimits } from './analyse-alone';
import { progressBar } from './progress';
import { unpackReport, type FileReport, type NoteWorker, type PackedReport, type Task } from './work';

/**
 * Below this many notes a single thread is faster than starting workers. Each worker loads the
 * bundle and warms up V8's compilers on its own (some 0.6 s of work in all on the 2-core VM, where
 * the compilers' threads then share the cores with the workers), which takes thousands of notes to
 * win back. Measured there on notes of the bench corpus (3.2 KB on average; `npm run bench:cli`),
 * one thread against two workers: `export --format csv` gains from about 1,500 notes, `check
 * --quiet` from about 3,000 (600 ms against 860 at 200 notes, 1.5 s against 1.8 at 2,000, 3.6 s
 * against 2.9 at 10,000); a machine with more cores gains sooner.
 */
export const PARALLEL_FROM = 2000;

/** Batches each worker has been sent and not yet answered. */
const IN_FLIGHT = 2;

/** A note sent to a worker (its path and its place in the output, from 0), and what comes back. */
export interface WorkItem {
  readonly f: string;
  readonly i: number;
  /** The note's bytes, when the main thread has read them (standard input, a big note sent to a worker of its own). */
  readonly bytes?: Uint8Array;
}
export interface WorkDone {
  readonly i: number;
  /** Null: the note is too big for a pool worker, and goes to a worker of its own. */
  readonly report: PackedReport | null;
}
/** A worker's answer to a batch: the reports, and the time the batch took it. */
export interface BatchDone {
  readonly done: readonly WorkDone[];
  readonly millis: number;
}

/**
 * The most notes per message to a worker. One note per message leaves a worker idle for a round
 * trip per note (as long as checking a small note); big batches leave one worker with the last
 * long ones. About eight batches per worker, from 1 to 64 notes.
 */
export function batchSize(notes: number, workers: number): number {
  return Math.max(1, Math.min(64, Math.floor(notes / (Math.max(1, workers) * 8))));
}

/**
 * Notes done but held back behind an earlier one still being read, when reports go out in order:
 * past this many, workers get no more notes until the output catches up (a slow note at the start
 * must not leave the rest of a big export waiting in memory).
 */
const AHEAD = 256;

/** Notes in the first batches, before a worker has said how long a note takes. */
const FIRST_BATCH = 4;
/** Work per batch aimed at, in milliseconds: long enough to hide a round trip, short enough that what a batch sends back (the JSON of a note's timepoints can be a megabyte) stays small. */
const BATCH_MS = 25;

/** Notes for the next batch, from the time a note took so far (`perNote`, NaN when unknown) and the most allowed. */
export function nextBatchSize(perNote: number, most: number): number {
  if (Number.isNaN(perNote)) return Math.min(FIRST_BATCH, most);
  return Math.max(1, Math.min(most, Math.round(BATCH_MS / Math.max(perNote, 1e-3))));
}

export interface PoolOptions {
  readonly cwd: string;
  readonly overrides: Partial<Settings>;
  /** Worker count; 0 or 1 runs in this thread. */
  readonly workers: number;
  readonly onDone?: (done: number, total: number) => void;
  /**
   * Called with each report in the order of the notes, as soon as it and every earlier one are in
   * (so output can be written while later notes are still read); what it returns is kept in the
   * report's place. A command that writes a big output per note keeps only what it needs after.
   * `index`: the note's place in the run, from 0.
   */
  readonly inOrder?: (report: FileReport, index: number) => FileReport;
  /**
   * Resolves when the output can take more (see `Output`): no further note is read, here or in a
   * worker, before it does, so a slow reader of the output holds the run up instead of the output
   * piling up in memory.
   */
  readonly ready?: () => Promise<void>;
  /** Where big notes are analysed alone, and with how much heap; null: every note is analysed where it is read. */
  readonly alone?: AloneLimits | null;
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

/**
 * Where reports land: in the slot of their note, handed over in the order of the notes when
 * `inOrder` is given. `mayRead` holds back the reading of more notes while the output is full, or
 * while more than `ahead` notes are done but waiting behind an earlier one still being read.
 */
export function handover(total: number, options: Pick<PoolOptions, 'inOrder' | 'ready' | 'onDone'>, ahead = AHEAD): {
  readonly reports: FileReport[];
  finish(i: number, report: FileReport): void;
  mayRead(): Promise<void>;
} {
  const reports: FileReport[] = new Array<FileReport>(total);
  const ready = options.ready ?? (() => Promise.resolve());
  let done = 0;
  let passed = 0;
  /** Readers waiting for the notes handed over in order to catch up. */
  let waiting: (() => void)[] = [];
  return {
    reports,
    finish(i: number, report: FileReport): void {
      reports[i] = report;
      done++;
      options.onDone?.(done, total);
      const inOrder = options.inOrder;
      if (!inOrder) return;
      for (let next = reports[passed]; passed < total && next !== undefined; next = reports[passed]) {
        reports[passed] = inOrder(next, passed);
        passed++;
      }
      if (waiting.length > 0 && done - passed <= ahead) {
        const wake = waiting;
        waiting = [];
        for (const w of wake) w();
      }
    },
    async mayRead(): Promise<void> {
      while (options.inOrder && done - passed > ahead) await new Promise<void>((resolve) => waiting.push(resolve));
      await ready();
    },
  };
}

export async function runAll(files: readonly string[], task: Task, local: NoteWorker, stdin: () => Buffer, options: PoolOptions): Promise<FileReport[]> {
  const { reports, finish, mayRead } = handover(files.length, options);
  const alone = canUseWorkers() ? options.alone ?? null : null;
  const parallel = options.workers > 1 && canUseWorkers();
  const aloneOptions = { cwd: options.cwd, overrides: options.overrides, heapMb: alone?.heapMb ?? 0, stdinName: local.stdinName };
  /** A note read and analysed in this thread, or, when it is big, read here and analysed alone. */
  const here = async (f: string, i: number): Promise<FileReport> => {
    const read = local.read(f, stdin);
    if (alone !== null && read.bytes !== null && read.bytes.length > alone.fromBytes) return analyseAlone(f, i, read.bytes, task, aloneOptions);
    return local.analyse(f, read, task, i + 1);
  };

  if (!parallel) {
    for (let i = 0; i < files.length; i++) {
      await mayRead();
      finish(i, await here(files[i]!, i));
      if (i % 64 === 63) await new Promise((r) => setImmediate(r)); // let a progress bar draw
    }
    return reports;
  }
  const queue: WorkItem[] = [];
  for (let i = 0; i < files.length; i++) {
    if (files[i] === '-') finish(i, await here('-', i));
    else queue.push({ f: files[i]!, i });
  }
  /** Big notes a pool worker handed back, analysed alone one at a time (each may take a third of the heap). */
  let aloneDone: Promise<void> = Promise.resolve();
  const sendAlone = (item: WorkItem): void => {
    aloneDone = aloneDone.then(async () => finish(item.i, await analyseAlone(item.f, item.i, null, task, aloneOptions)));
  };
  const workers = Math.min(options.workers, queue.length);
  const most = batchSize(queue.length, workers);
  /** Milliseconds a worker spends per note, from the batches answered so far (NaN: none yet). */
  let perNote = Number.NaN;
  let next = 0;
  /** Notes sent to a worker that died before it started them, for the next batches. */
  const again: WorkItem[] = [];
  const more = (): boolean => again.length > 0 || next < queue.length;
  /**
   * A pool worker, fed batches until the queue is empty. One that dies (of memory: each inherits
   * this thread's heap limit) has the notes of the batch it was working on analysed alone, where
   * the one that killed it gets its problem, and those of the batch after it sent again; a new
   * worker takes its place. One that dies with nothing sent (it could not start) fails the run.
   */
  const startWorker = (): Promise<void> => new Promise<void>((resolve, reject) => {
    const worker = new Worker(__filename, { workerData: { pneumarkWorker: true, cwd: options.cwd, overrides: options.overrides, task, aloneFrom: alone?.fromBytes ?? null, stdinName: local.stdinName } });
    /** Batches sent and not answered yet, in the order sent (the worker answers them in that order). */
    const unanswered: WorkItem[][] = [];
    let closing = false;
    /** Sends the next batch when there is one, else lets the worker go once it has answered all. */
    const feed = (): void => {
      if (closing) return;
      if (more()) {
        const size = nextBatchSize(perNote, most);
        let batch: WorkItem[];
        if (again.length > 0) batch = again.splice(0, size);
        else {
          batch = queue.slice(next, next + size);
          next += batch.length;
        }
        unanswered.push(batch);
        worker.postMessage(batch);
      } else if (unanswered.length === 0) {
        closing = true;
        void worker.terminate().then(() => resolve());
      }
    };
    worker.on('message', (answer: BatchDone) => {
      unanswered.shift();
      const count = answer.done.length;
      if (count > 0) perNote = Number.isNaN(perNote) ? answer.millis / count : (perNote + answer.millis / count) / 2;
      for (const d of answer.done) {
        if (d.report !== null) finish(d.i, unpackReport(d.report));
        else sendAlone({ f: files[d.i]!, i: d.i });
      }
      mayRead().then(feed, reject);
    });
    const died = (error: Error | null): void => {
      if (closing) return;
      closing = true;
      const [working, ...waiting] = unanswered;
      if (working === undefined) {
        reject(error ?? new Error('a worker thread stopped before it was sent a note'));
        return;
      }
      for (const item of working) sendAlone(item);
      for (const batch of waiting) again.push(...batch);
      void worker.terminate();
      if (more()) startWorker().then(resolve, reject);
      else resolve();
    };
    worker.on('error', died);
    worker.on('exit', () => died(null));
    worker.on('online', () => {
      // Two batches in flight: the worker starts the second while the first goes back and the
      // next one comes, so it never waits for a round trip through this thread.
      for (let k = 0; k < IN_FLIGHT; k++) feed();
    });
  });
  await Promise.all(Array.from({ length: workers }, startWorker));
  await aloneDone;
  return reports;
}

/** Reads notes for a command with a progress bar, in parallel when there are many. */
export async function gather(files: readonly string[], task: Task, io: Io, worker: NoteWorker, showProgress: boolean, label: string, jobs?: number, streaming?: Pick<PoolOptions, 'inOrder' | 'ready'>): Promise<FileReport[]> {
  const alone = aloneLimits(io.env);
  const bar = progressBar(io.stderr, files.length, label, showProgress);
  try {
    return await runAll(files, task, worker, io.stdin, { cwd: io.cwd, overrides: {}, workers: workerCount(files.length, io.env, jobs), onDone: (d, t) => bar.update(d, t), alone, ...streaming });
  } finally {
    bar.stop();
  }
}

