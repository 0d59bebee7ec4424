/**
 * Deterministic ids for exported resources: the same text always gives the same id, on every
 * machine and run, with no randomness. Not a cryptographic hash: it only has to keep the ids of
 * one export apart (128 bits from four differently seeded 32-bit hashes).
 *
 * FNV-1a reads the text from its start, so the state after a prefix can be kept and carried on
 * with the rest (`StableIds`): the ids of a note's Observations share the note's name as their
 * prefix, and a note has hundreds of them.
 */

const SEEDS = [0x811c9dc5, 0x9e3779b9, 0x3c6ef372, 0xdaa66d2b] as const;

/** The four FNV-1a states over the UTF-16 code units of a text (each from its seed), then more text. */
class Fnv4 {
  constructor(
    readonly a: number = SEEDS[0] >>> 0,
    readonly b: number = SEEDS[1] >>> 0,
    readonly c: number = SEEDS[2] >>> 0,
    readonly d: number = SEEDS[3] >>> 0,
  ) {}

  /** The states after `text` as well. */
  then(text: string): Fnv4 {
    let a = this.a;
    let b = this.b;
    let c = this.c;
    let d = this.d;
    for (let i = 0; i < text.length; i++) {
      const unit = text.charCodeAt(i);
      a = Math.imul(a ^ unit, 0x01000193);
      b = Math.imul(b ^ unit, 0x01000193);
      c = Math.imul(c ^ unit, 0x01000193);
      d = Math.imul(d ^ unit, 0x01000193);
    }
    return new Fnv4(a, b, c, d);
  }

  /** 32 lower-case hex digits: each state through MurmurHash3's 32-bit finaliser, in seed order. */
  hex(): string {
    return hex8(finalised(this.a)) + hex8(finalised(this.b)) + hex8(finalised(this.c)) + hex8(finalised(this.d));
  }
}

/** MurmurHash3's 32-bit finaliser, to spread the bits. */
function finalised(state: number): number {
  let h = state;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

/** The two lower-case hex digits of each byte. */
const HEX_BYTE: readonly string[] = Array.from({ length: 256 }, (_, b) => b.toString(16).padStart(2, '0'));

/** The 8 hex digits of a 32-bit number, from a table: `toString(16)` is a slow generic conversion in V8. */
function hex8(n: number): string {
  return HEX_BYTE[n >>> 24]! + HEX_BYTE[(n >>> 16) & 0xff]! + HEX_BYTE[(n >>> 8) & 0xff]! + HEX_BYTE[n & 0xff]!;
}

const START = new Fnv4();

/** 32 lower-case hex digits that depend only on `text`. */
export function stableHex128(text: string): string {
  return START.then(text).hex();
}

/**
 * A UUID-shaped id derived from `text`: RFC 9562 layout with version 8 ("custom") and the
 * RFC variant bits, so UUID parsers accept it and nobody mistakes it for a random one.
 */
export function stableUuid(text: string): string {
  return uuidOf(START.then(text).hex());
}

/** The UUID of 32 hex digits: the version digit set to 8, the variant bits to 10. */
function uuidOf(h: string): string {
  const variant = ((parseInt(h[16]!, 16) & 0x3) | 0x8).toString(16);
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-8${h.slice(13, 16)}-${variant}${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

/** `stableUuid` of texts that all start with one prefix, which is read once. */
export class StableIds {
  private readonly start: Fnv4;

  constructor(prefix: string) {
    this.start = START.then(prefix);
  }

  /** The same as `stableUuid(prefix + rest)`. */
  uuid(rest: string): string {
    return uuidOf(this.start.then(rest).hex());
  }
}
