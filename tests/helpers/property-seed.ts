/**
 * The seed of the property tests (fast-check). Unset, each run draws its own, so that local runs
 * keep finding new cases (a failure prints the seed and the path that reproduce it). Set
 * (`PNEUMARK_PROPERTY_SEED=N`), every property generates the same cases run after run: CI sets one,
 * so that what passed on a commit passes again on a clean clone of it, and a case found locally
 * becomes a fixed example beside its property.
 */
import fc from 'fast-check';

const seed = process.env.PNEUMARK_PROPERTY_SEED;
if (seed !== undefined && seed !== '') {
  if (!/^-?\d+$/.test(seed)) throw new Error(`PNEUMARK_PROPERTY_SEED must be a whole number, not ${JSON.stringify(seed)}`);
  fc.configureGlobal({ seed: Number(seed) });
}
