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

/** The value kept in `store` under `key`, computed and kept on first use. */
export function keptIn<K, T>(store: Map<K, T>, key: K, compute: () => T): T {
  if (store.has(key)) return store.get(key) as T;
  const value = compute();
  store.set(key, value);
  return value;
}
