/** Compiled models each cache of the engine keeps (generated code and tapes: a few kilobytes each). */
export const MODEL_CACHE_CAPACITY = 200;

/**
 * A bounded least-recently-used cache (a Map kept in order of use: a hit moves its entry to the
 * end, an insertion beyond the capacity drops the entry used longest ago). The fitting engine keeps
 * its compiled models in these, keyed by the model expression with its parameter and covariate
 * names, so a server that fits many different expressions holds at most `capacity` of them.
 */
export class LruCache<V> {
  private readonly entries = new Map<string, V>();
  /** the key used last (already at the end of the order) */
  private newest: string | null = null;

  /**
   * @param capacity - most entries kept, integer ≥ 1
   * @throws RangeError for a capacity that is not a positive integer
   * @example new LruCache<number>(2)
   */
  constructor(readonly capacity: number) {
    if (!Number.isInteger(capacity) || capacity < 1) throw new RangeError(`LruCache: capacity must be a positive integer, got ${capacity}`);
  }

  /** Entries held now. */
  get size(): number {
    return this.entries.size;
  }

  /**
   * The value under `key`, computing and keeping it on a miss (`make` may return null or any
   * value; it is kept as it is).
   * @example cache.get('a*exp(-k*x)', () => compileModel('a*exp(-k*x)'))
   */
  get(key: string, make: () => V): V {
    if (this.entries.has(key)) {
      const hit = this.entries.get(key) as V;
      if (key !== this.newest) {
        this.entries.delete(key);
        this.entries.set(key, hit);
        this.newest = key;
      }
      return hit;
    }
    const value = make();
    this.entries.set(key, value);
    this.newest = key;
    if (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value as string);
    return value;
  }

  /** Drops the entry under `key`, if any. */
  delete(key: string): void {
    this.entries.delete(key);
    if (this.newest === key) this.newest = null;
  }

  /** Whether `key` is held (does not count as a use). */
  has(key: string): boolean {
    return this.entries.has(key);
  }
}
