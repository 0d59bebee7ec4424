import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { exportRenderer } from '../../server/src/cli/export-command';
import { checkNote } from '../../server/src/core/check-note';
import { toFhirBundle, type FhirBundle } from '../../server/src/core/export';
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

describe('FHIR ids of a re-exported note after one value is corrected', () => {
  // One typo fixed (hr 190 → 90): a store that joined on the other Observations' ids keeps them.
  const before = '@ day 1 08:00  admission\nvitals hr 190, rr 22, spo2 93 %\noxygen venturi, fio2 40 %\nabg 7.38/42/71/24\n@ day 1 12:00\nvitals hr 95, rr 20\n';
  const after = before.replace('hr 190', 'hr 90');
  const redacted = { kind: 'export' as const, format: 'fhir' as const, redactProse: true, shiftDays: 0, anchor: null, spreadsheetSafe: false };

  /** fullUrl by resource id, and the Bundle's id. */
  function idsOf(bundle: FhirBundle): { bundle: string; urls: Map<string, string> } {
    return { bundle: bundle.id, urls: new Map((bundle.entry ?? []).map((e) => [e.resource.id, e.fullUrl])) };
  }
  function redactedIds(text: string): { bundle: string; urls: Map<string, string> } {
    const out = exportRenderer('note-00001', checkNote(text), redacted);
    return idsOf(JSON.parse(typeof out === 'string' ? out : 'null') as FhirBundle);
  }
  function changed(a: Map<string, string>, b: Map<string, string>): string[] {
    expect([...b.keys()]).toEqual([...a.keys()]);
    return [...a.keys()].filter((id) => a.get(id) !== b.get(id));
  }

  it('without --redact: only the corrected Observation gets a new id; the Bundle keeps its id (made from the path)', () => {
    const a = idsOf(toFhirBundle('ward-01/bed-04.pneu', checkNote(before), { redactProse: false, shiftDays: 0 }));
    const b = idsOf(toFhirBundle('ward-01/bed-04.pneu', checkNote(after), { redactProse: false, shiftDays: 0 }));
    expect(a.urls.size).toBeGreaterThan(6);
    expect(changed(a.urls, b.urls)).toEqual(['obs-0-hr']);
    expect(b.bundle).toBe(a.bundle);
  });

  it('with --redact: only the corrected Observation gets a new id; the Bundle, made from what it holds, a new one, and so its Patient', () => {
    const a = redactedIds(before);
    const b = redactedIds(after);
    expect(changed(a.urls, b.urls)).toEqual(['obs-0-hr', 'patient']);
    expect(b.bundle).not.toBe(a.bundle);
    // The same note again: the same ids.
    expect(redactedIds(before)).toEqual(a);
  });

  it('a value a derived one rests on changes that one too (a PaO2 and its P/F), and nothing else', () => {
    const a = redactedIds(before);
    const b = redactedIds(before.replace('7.38/42/71/24', '7.38/42/77/24'));
    // The Patient's fullUrl is made from the Bundle's id, which a redacted export makes from what it holds.
    expect(changed(a.urls, b.urls).sort()).toEqual(['obs-0-pao2', 'obs-0-pf-ratio', 'patient']);
  });

  it('with --redact, an id holds no hash of anything the export does not write: a relabelled timepoint (labels are left out) keeps its ids', () => {
    expect(redactedIds(before.replace('admission', 'Dr Quillfeather'))).toEqual(redactedIds(before));
  });
});
