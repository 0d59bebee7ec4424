/**
 * Shared helpers for the physiology tests: an arbitrary of awkward doubles, a recursive check
 * that a result holds no NaN or ±Infinity, and a guard that every exported function of a module
 * has a null-safety property.
 */
import fc from 'fast-check';
import { expect } from 'vitest';

/** Any double, weighted towards the values that break formulas (NaN, ±Infinity, 0, −0, negatives, extremes). */
export const awkwardDouble: fc.Arbitrary<number> = fc.oneof(
  fc.double(),
  fc.constantFrom(
    Number.NaN,
    Number.POSITIVE_INFINITY,
    Number.NEGATIVE_INFINITY,
    0,
    -0,
    1,
    -1,
    0.5,
    100,
    1e-300,
    -1e-300,
    Number.MIN_VALUE,
    Number.MAX_VALUE,
    -Number.MAX_VALUE,
    Number.EPSILON,
  ),
  fc.double({ min: -1000, max: 1000, noNaN: true }),
);

/** Throws (via expect) if `value` holds a non-finite number anywhere inside it. */
export function expectNoNonFinite(value: unknown, path = 'result'): void {
  if (typeof value === 'number') {
    expect(Number.isFinite(value), `${path} = ${String(value)}`).toBe(true);
    return;
  }
  if (Array.isArray(value)) {
    value.forEach((item, i) => expectNoNonFinite(item, `${path}[${i}]`));
    return;
  }
  if (value !== null && typeof value === 'object') {
    for (const [key, item] of Object.entries(value)) expectNoNonFinite(item, `${path}.${key}`);
  }
}

/** A property per exported function: an arbitrary of argument tuples and the call. */
export type TotalityCase = {
  readonly args: fc.Arbitrary<readonly unknown[]>;
  readonly call: (args: readonly unknown[]) => unknown;
};

/** A type-checked totality case: `args` must produce the argument tuple that `fn` takes. */
export function totality<A extends readonly unknown[]>(args: fc.Arbitrary<A>, fn: (...a: A) => unknown): TotalityCase {
  return { args, call: (a) => fn(...(a as A)) };
}

/** Names of the functions a module exports. */
export function exportedFunctionNames(moduleNamespace: Record<string, unknown>): string[] {
  return Object.entries(moduleNamespace)
    .filter(([, value]) => typeof value === 'function')
    .map(([name]) => name)
    .sort();
}

/** Runs each case with fast-check: never throws, never a non-finite number anywhere in the result. */
export function assertTotal(cases: Readonly<Record<string, TotalityCase>>, numRuns = 400): void {
  for (const [name, c] of Object.entries(cases)) {
    fc.assert(
      fc.property(c.args, (args) => {
        let result: unknown;
        expect(() => {
          result = c.call(args);
        }, name).not.toThrow();
        expectNoNonFinite(result, name);
      }),
      { numRuns },
    );
  }
}
