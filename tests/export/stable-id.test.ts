import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { stableHex128, StableIds, stableUuid } from '../../server/src/core/export/stable-id';

/** The ids as first written: four FNV-1a passes over the text, one per seed (the ids must never change). */
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
const referenceHex = (text: string): string => [0x811c9dc5, 0x9e3779b9, 0x3c6ef372, 0xdaa66d2b].map((seed) => hash32(text, seed).toString(16).padStart(8, '0')).join('');
function referenceUuid(text: string): string {
  const hex = referenceHex(text).split('');
  hex[12] = '8';
  hex[16] = ((parseInt(hex[16] ?? '0', 16) & 0x3) | 0x8).toString(16);
  const h = hex.join('');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20, 32)}`;
}

describe('stable ids', () => {
  it('keep the values of earlier exports', () => {
    expect(stableHex128('')).toBe(referenceHex(''));
    expect(stableUuid('ward-01/note-00002.pneu\u00003\u0000pao2')).toBe(referenceUuid('ward-01/note-00002.pneu\u00003\u0000pao2'));
    expect(stableUuid('x')).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-8[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
  });

  it('are those of the first algorithm for any text, and StableIds gives those of its prefix and the rest', () => {
    fc.assert(fc.property(fc.string({ unit: 'binary' }), fc.string({ unit: 'binary' }), (prefix, rest) => {
      expect(stableHex128(prefix + rest)).toBe(referenceHex(prefix + rest));
      expect(stableUuid(prefix + rest)).toBe(referenceUuid(prefix + rest));
      expect(new StableIds(prefix).uuid(rest)).toBe(referenceUuid(prefix + rest));
    }), { numRuns: 500 });
  });
});
