import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { keptFor, SmallStore, type Kept } from '../../server/src/core/util/small-store';

describe('SmallStore', () => {
  it('behaves like a Map for any sequence of sets, reads and clears', () => {
    const op = fc.oneof(
      fc.record({ kind: fc.constant('set' as const), key: fc.integer({ min: 0, max: 12 }), value: fc.oneof(fc.integer(), fc.constant(null)) }),
      fc.record({ kind: fc.constant('clear' as const) }),
    );
    fc.assert(fc.property(fc.array(op, { maxLength: 60 }), (ops) => {
      const store = new SmallStore<number, number | null>();
      const map = new Map<number, number | null>();
      for (const o of ops) {
        if (o.kind === 'set') { store.set(o.key, o.value); map.set(o.key, o.value); }
        else { store.clear(); map.clear(); }
        expect(store.size).toBe(map.size);
        for (let k = 0; k <= 12; k++) {
          expect(store.has(k)).toBe(map.has(k));
          expect(store.get(k)).toBe(map.get(k));
        }
      }
    }));
  });

  it('keeps a computed value per definition, null included, and computes it once', () => {
    let calls = 0;
    const nothing: Kept<null, string> = { name: 'nothing', compute: () => { calls++; return null; } };
    const length: Kept<number, string> = { name: 'length', compute: (scope) => { calls++; return scope.length; } };
    const store = new SmallStore<Kept<unknown, string>, unknown>();
    expect(keptFor(store, nothing, 'abc')).toBeNull();
    expect(keptFor(store, nothing, 'abc')).toBeNull();
    expect(keptFor(store, length, 'abcd')).toBe(4);
    expect(keptFor(store, length, 'other scope, same store')).toBe(4);
    expect(calls).toBe(2);
    store.clear();
    expect(keptFor(store, length, 'xy')).toBe(2);
    expect(calls).toBe(3);
  });
});
