/**
 * Work done in steps: a generator that yields between slices of its work and returns its result.
 * The language server runs such steps a few milliseconds at a time, with a turn of its event loop
 * between them (so it answers other requests meanwhile, and drops work that was cancelled); every
 * other caller runs them at once with `runSteps`, and gets the same result, since the steps are
 * the one way the result is made.
 */
export type Steps<T> = Generator<void, T, void>;

/** Runs steps to their end at once: the result they give. */
export function runSteps<T>(steps: Steps<T>): T {
  for (;;) {
    const next = steps.next();
    if (next.done) return next.value;
  }
}

/** How many items (timepoints, findings, stated values) a step of whole-note work goes over before it yields. */
export const ITEMS_PER_STEP = 128;
