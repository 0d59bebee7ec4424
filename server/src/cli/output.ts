/**
 * A command's standard output when it is written a note at a time. A pipe whose reader is slower
 * than the notes are read would otherwise queue everything written in memory (gigabytes for the
 * JSON of a big folder); `ready` tells the run to wait until the stream has drained.
 */
import type { Io } from './args';

interface Drains {
  once(event: 'drain', listener: () => void): unknown;
}

function drains(out: unknown): out is Drains {
  return typeof out === 'object' && out !== null && typeof (out as { once?: unknown }).once === 'function';
}

export class Output {
  private waiting: Promise<void> | null = null;

  constructor(private readonly out: Io['stdout']) {}

  write(text: string): void {
    const out = this.out;
    if (out.write(text) !== false || this.waiting !== null || !drains(out)) return;
    this.waiting = new Promise((resolve) => {
      out.once('drain', () => {
        this.waiting = null;
        resolve();
      });
    });
  }

  /** Resolves once the output can take more (at once when nothing is queued). */
  ready(): Promise<void> {
    return this.waiting ?? Promise.resolve();
  }
}
