/**
 * Appends every item of `items` to `target`. `target.push(...items)` passes each item as an
 * argument, and a long enough list (one line of a note can hold tens of thousands of items)
 * overflows the call stack; this does not.
 */
export function pushAll<T>(target: T[], items: readonly T[]): void {
  for (const item of items) target.push(item);
}

/**
 * The empty list, shared: most lines have no issues, most findings no fixes, most texts no
 * identifier, and a big note keeps tens of thousands of such lists. Frozen, so sharing is safe.
 */
export const NONE: readonly never[] = Object.freeze([]);
