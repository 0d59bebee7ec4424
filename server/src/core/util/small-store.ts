/**
 * A handful of values by key, kept in one flat array (`key, value, key, value, …`). The stores
 * of one timepoint (its inputs read, its terms, the values its checks share) hold a few entries
 * each and a big note makes thousands of them: building a Map costs more than searching a few
 * entries, and a Map grows through several tables on the way. Keys compare with `===`.
 */
export class SmallStore<K, V> {
  private readonly entries: (K | V | undefined)[] = [];
  /** Entries in use, as a count of slots (`key, value` pairs take two): see `clear`. */
  private used = 0;

  get(key: K): V | undefined {
    const e = this.entries;
    for (let i = 0; i < this.used; i += 2) if (e[i] === key) return e[i + 1] as V;
    return undefined;
  }

  has(key: K): boolean {
    const e = this.entries;
    for (let i = 0; i < this.used; i += 2) if (e[i] === key) return true;
    return false;
  }

  set(key: K, value: V): void {
    const e = this.entries;
    const used = this.used;
    for (let i = 0; i < used; i += 2) {
      if (e[i] === key) {
        e[i + 1] = value;
        return;
      }
    }
    if (used < e.length) {
      e[used] = key;
      e[used + 1] = value;
    } else e.push(key, value);
    this.used = used + 2;
  }

  get size(): number {
    return this.used / 2;
  }

  clear(): void {
    // The array keeps its room: a store cleared at every timepoint (the values its checks share)
    // would otherwise make a new backing store at each. The entries are let go of, not kept alive.
    const e = this.entries;
    for (let i = 0; i < this.used; i++) e[i] = undefined;
    this.used = 0;
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
