/**
 * The functions' memory: a bounded cache (least recently used entry leaves
 * first). Excel hands a function new arrays at every recalculation, so the
 * functions key their entries by what the cells hold, not by the arrays (ids
 * of exact cell contents: src/functions/call.ts, src/input/cellPrint.ts).
 *
 * @example
 *   const c = new BoundedCache<string, number>(2);
 *   c.get('a', () => 1); c.get('a', () => 2); // 1, computed once
 */
export class BoundedCache<K, V> {
  private readonly map = new Map<K, V>();
  constructor(readonly limit: number) {}

  get size(): number {
    return this.map.size;
  }

  peek(key: K): V | undefined {
    const v = this.map.get(key);
    if (v !== undefined) {
      // Refresh: a Map iterates in insertion order, so the first key is the least recently used.
      this.map.delete(key);
      this.map.set(key, v);
    }
    return v;
  }

  set(key: K, value: V): void {
    this.map.delete(key);
    this.map.set(key, value);
    while (this.map.size > this.limit) this.map.delete(this.map.keys().next().value as K);
  }

  get(key: K, make: () => V): V {
    const hit = this.peek(key);
    if (hit !== undefined) return hit;
    const v = make();
    this.set(key, v);
    return v;
  }

  clear(): void {
    this.map.clear();
  }
}
