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

/** Text longer than this many characters is written in pieces of this length. */
const PIECE = 1 << 20;

export class Output {
  private waiting: Promise<void> | null = null;

  constructor(private readonly out: Io['stdout']) {}

  /**
   * Writes `text`; a long one (a note's FHIR bundle is tens of megabytes) in pieces of about a
   * megabyte, each encoded into bytes of its own: encoding one string of tens of megabytes at once
   * takes a block of memory as large, which costs more than the encoding (fresh pages of memory,
   * about a tenth of a second on the 2-core VM for 30 MB). A piece never ends between the two
   * halves of a surrogate pair, which encoded apart would each become U+FFFD.
   */
  write(text: string): void {
    if (text.length <= PIECE) {
      this.writePiece(text);
      return;
    }
    for (let at = 0; at < text.length;) {
      let end = Math.min(at + PIECE, text.length);
      const last = text.charCodeAt(end - 1);
      if (end < text.length && last >= 0xd800 && last <= 0xdbff) end++;
      this.writePiece(text.slice(at, end));
      at = end;
    }
  }

  private writePiece(text: string): void {
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
