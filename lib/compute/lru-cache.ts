import 'server-only';
/**
 * Bounded least-recently-used cache on a Map (insertion order = recency). The lru-cache package
 * would do; it is not among the project's declared dependencies.
 */
export class LruCache<V> {
  private readonly entries = new Map<string, V>();

  constructor(readonly capacity: number) {
    if (!(capacity >= 1)) throw new RangeError('LruCache capacity must be at least 1');
  }

  get size(): number {
    return this.entries.size;
  }

  get(key: string): V | undefined {
    const value = this.entries.get(key);
    if (value === undefined) return undefined;
    this.entries.delete(key);
    this.entries.set(key, value);
    return value;
  }

  set(key: string, value: V): void {
    this.entries.delete(key);
    this.entries.set(key, value);
    while (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value as string);
  }

  clear(): void {
    this.entries.clear();
  }
}
