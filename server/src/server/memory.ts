/**
 * Memory of the language server. A big note is analysed in bursts that allocate a lot of
 * short-lived objects, and V8's defaults suit throughput-bound programs: the young generation
 * grows to 32 MB on the first burst and stays there, and the garbage of a burst waits in the old
 * generation for the next collection, which an idle editor may not trigger for minutes.
 *
 * - The young generation is kept at its starting size (the growth factor is a V8 flag read each
 *   time the heap would grow, so it can be set after start-up). The objects an analysis keeps
 *   are copied out of the young generation whatever its size; a small one costs more frequent
 *   but shorter pauses, not more time (see tests/bench: `npm run bench`).
 * - After an analysis, once the server has been idle for a moment, a full collection returns
 *   the burst's garbage to the system. The collector is V8's own `gc`, exposed through a flag.
 *
 * Both are skipped quietly where the runtime does not allow them.
 */
import { getHeapStatistics, setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

/** Idle time after the last analysis before the garbage of the analyses is collected. */
export const IDLE_COLLECT_MS = 1000;

export function keepYoungGenerationSmall(): void {
  try {
    setFlagsFromString('--semi-space-growth-factor=1');
  } catch {
    // Not a V8 that knows the flag: the defaults stay.
  }
}

function exposedCollector(): (() => void) | null {
  try {
    setFlagsFromString('--expose-gc');
    const gc: unknown = runInNewContext('gc');
    return typeof gc === 'function' ? () => { (gc as () => void)(); } : null;
  } catch {
    return null;
  }
}

/**
 * Collects garbage once the server has been idle for `idleMs` after the last `analysed()` call.
 * `collect` is V8's collector by default; tests pass their own.
 */
export class IdleCollector {
  private timer: NodeJS.Timeout | null = null;
  private collections = 0;

  constructor(
    private readonly collect: (() => void) | null = exposedCollector(),
    private readonly idleMs = IDLE_COLLECT_MS,
  ) {}

  /** Whether a collector is available at all. */
  get available(): boolean {
    return this.collect !== null;
  }

  get count(): number {
    return this.collections;
  }

  analysed(): void {
    if (!this.collect) return;
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => {
      this.timer = null;
      this.collections++;
      // Twice: V8 returns the pages a collection freed to the system at the next one.
      this.collect?.();
      this.collect?.();
    }, this.idleMs);
    // An idle collection never keeps the process alive.
    this.timer.unref();
  }

  /** Collects garbage now (twice, as when idle); false when no collector is available. */
  collectNow(): boolean {
    if (!this.collect) return false;
    this.collect();
    this.collect();
    return true;
  }

  dispose(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
  }
}

/**
 * The heap the server lets its analyses fill: half of V8's limit, at most 1.5 GB. A note's
 * analysis keeps from about 17 bytes of heap per byte of an ordinary note to about 470 per byte of
 * a hostile one (a bare `@` on every line: a timepoint and a finding per two bytes), so a 4 MB
 * note can need anything from 70 MB to 1.9 GB. The server reads a big note in steps and looks at
 * the heap after each one (`overHeapBudget`); an analysis that outgrows the budget is dropped, and
 * the note says why, rather than the server dying of V8's fatal out-of-memory error.
 */
export function heapBudgetBytes(limit = getHeapStatistics().heap_size_limit): number {
  return Math.min(limit / 2, 1536 * 1048576);
}

/**
 * Whether the heap in use is over `budget`. Garbage counts too until it is collected, so a heap
 * found over it is collected (when the collector can be called) and looked at again.
 */
export function overHeapBudget(collector: IdleCollector, budget = heapBudgetBytes()): boolean {
  if (getHeapStatistics().used_heap_size <= budget) return false;
  return !collector.collectNow() || getHeapStatistics().used_heap_size > budget;
}

/**
 * The longest note (in UTF-16 characters) held to the budget only when the heap nears V8's limit.
 * Even a hostile note this short keeps at most about 52 MB (`HEAP_PER_LINE_CHAR` bytes a
 * character), so when the heap is over the budget it is other notes that filled it: dropping this
 * one's analysis would free little and blame it for what it did not do.
 */
export const SMALL_NOTE_CHARS = 64 * 1024;

/**
 * The heap an analysis of a note of `chars` characters may leave in use: the budget for a big
 * note; for a small one (`SMALL_NOTE_CHARS`), the budget plus half of what is left above it,
 * which keeps the room of a small note's worst analysis below V8's limit even then.
 */
export function heapCeilingFor(chars: number, limit = getHeapStatistics().heap_size_limit): number {
  const budget = heapBudgetBytes(limit);
  return chars <= SMALL_NOTE_CHARS ? budget + (limit - budget) / 2 : budget;
}

/**
 * The heap one character of a line may cost its analysis at most, as measured: a line of `q q q …`
 * (a finding on every two characters, an unknown key each) keeps about 750 bytes per character.
 * A note is read in steps of whole lines, so the heap is looked at only after a line is read.
 */
const HEAP_PER_LINE_CHAR = 800;

/** The longest line the server reads: one whose analysis fits in the heap budget. */
export function maxLineChars(budget = heapBudgetBytes()): number {
  return Math.floor(budget / HEAP_PER_LINE_CHAR);
}

/**
 * The first line of `text` longer than `limit` characters (its index and length), or null. Only
 * a text longer than the limit is looked at.
 */
export function lineLongerThan(text: string, limit: number): { readonly line: number; readonly length: number } | null {
  if (text.length <= limit) return null;
  let line = 0;
  let start = 0;
  for (let i = 0; i <= text.length; i++) {
    const c = i < text.length ? text.charCodeAt(i) : 0x0a;
    if (c !== 0x0a && c !== 0x0d) continue;
    if (i - start > limit) return { line, length: i - start };
    if (c === 0x0d && text.charCodeAt(i + 1) === 0x0a) i++;
    line++;
    start = i + 1;
  }
  return null;
}
