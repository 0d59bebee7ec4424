import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compact } from '../../server/src/core/util/numbers';

describe('compact', () => {
  it('gives back the same number for any double, -0 and NaN included', () => {
    fc.assert(fc.property(fc.double(), (n) => { expect(Object.is(compact(n), n)).toBe(true); }));
    for (const n of [0, -0, 1, -1, 2 ** 31 - 1, -(2 ** 31), 2 ** 31, 0.1, NaN, Infinity, -Infinity]) expect(Object.is(compact(n), n)).toBe(true);
  });
});
