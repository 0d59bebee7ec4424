/**
 * Deterministic ids for exported resources: the same text always gives the same id, on every
 * machine and run, with no randomness. Not a cryptographic hash: it only has to keep the ids of
 * one export apart (128 bits from four differently seeded 32-bit hashes).
 */

/** FNV-1a over UTF-16 code units from a given seed, then MurmurHash3's 32-bit finaliser to spread the bits. */
function hash32(text: string, seed: number): number {
  let h = seed >>> 0;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

const SEEDS = [0x811c9dc5, 0x9e3779b9, 0x3c6ef372, 0xdaa66d2b] as const;

/** 32 lower-case hex digits that depend only on `text`. */
export function stableHex128(text: string): string {
  return SEEDS.map((seed) => hash32(text, seed).toString(16).padStart(8, '0')).join('');
}

/**
 * A UUID-shaped id derived from `text`: RFC 9562 layout with version 8 ("custom") and the
 * RFC variant bits, so UUID parsers accept it and nobody mistakes it for a random one.
 */
export function stableUuid(text: string): string {
  const hex = stableHex128(text).split('');
  hex[12] = '8';
  hex[16] = ((parseInt(hex[16] ?? '0', 16) & 0x3) | 0x8).toString(16);
  const h = hex.join('');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20, 32)}`;
}
