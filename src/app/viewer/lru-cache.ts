/**
 * A small least-recently-used map: reading or writing a key makes it the newest; past `capacity`
 * the oldest entries leave (and `onEvict` hears about each, so a caller can drop what it drew).
 * Pure; the viewer keeps its decoded tiles in one.
 */
export class LruCache<K, V> {
  private readonly entries = new Map<K, V>();

  constructor(
    readonly capacity: number,
    private readonly onEvict: (key: K, value: V) => void = () => undefined,
  ) {
    if (!(capacity >= 1)) throw new RangeError(`A cache holds at least one entry; got ${capacity}.`);
  }

  get size(): number {
    return this.entries.size;
  }

  has(key: K): boolean {
    return this.entries.has(key);
  }

  /** The value, now marked as the most recently used; undefined when absent. */
  get(key: K): V | undefined {
    if (!this.entries.has(key)) return undefined;
    const value = this.entries.get(key) as V;
    this.entries.delete(key);
    this.entries.set(key, value);
    return value;
  }

  /** Reads without changing the order (for drawing what is already there). */
  peek(key: K): V | undefined {
    return this.entries.get(key);
  }

  set(key: K, value: V): void {
    this.entries.delete(key);
    this.entries.set(key, value);
    while (this.entries.size > this.capacity) {
      const [oldKey, oldValue] = this.entries.entries().next().value as [K, V];
      this.entries.delete(oldKey);
      this.onEvict(oldKey, oldValue);
    }
  }

  delete(key: K): boolean {
    return this.entries.delete(key);
  }

  /** Keys from the oldest to the newest. */
  keys(): K[] {
    return [...this.entries.keys()];
  }

  clear(): void {
    for (const [key, value] of this.entries) this.onEvict(key, value);
    this.entries.clear();
  }
}
