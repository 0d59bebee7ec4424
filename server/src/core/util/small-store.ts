/**
 * A handful of values by key, kept in one flat array (`key, value, key, value, …`). The stores
 * of one timepoint (its inputs read, its terms, the values its checks share) hold a few entries
 * each and a big note makes thousands of them: building a Map costs more than searching a few
 * entries, and a Map grows through several tables on the way. Keys compare with `===`.
 */
export class SmallStore<K, V> {
  private readonly entries: (K | V)[] = [];

  get(key: K): V | undefined {
    const e = this.entries;
    for (let i = 0; i < e.length; i += 2) if (e[i] === key) return e[i + 1] as V;
    return undefined;
  }

  has(key: K): boolean {
    const e = this.entries;
    for (let i = 0; i < e.length; i += 2) if (e[i] === key) return true;
    return false;
  }

  set(key: K, value: V): void {
    const e = this.entries;
    for (let i = 0; i < e.length; i += 2) {
      if (e[i] === key) {
        e[i + 1] = value;
        return;
      }
    }
    e.push(key, value);
  }

  get size(): number {
    return this.entries.length / 2;
  }

  clear(): void {
    // Most stores are cleared while empty (a timepoint's shared values, where no check shared one).
    if (this.entries.length !== 0) this.entries.length = 0;
  }
}

/**
 * A value computed once per scope and read by several parts of it, defined once (at module
 * level) rather than as a closure at every read: `compute` receives the scope.
 */
export interface Kept<T, S> {
  /** For messages and debugging. */
  readonly name: string;
  compute(scope: S): T;
}

/** The value of `kept` in `store`, computed from `scope` on first use. */
export function keptFor<T, S>(store: SmallStore<Kept<unknown, S>, unknown>, kept: Kept<T, S>, scope: S): T {
  const e = store.get(kept);
  if (e !== undefined || store.has(kept)) return e as T;
  const value = kept.compute(scope);
  store.set(kept, value);
  return value;
}
