/**
 * The functions' memory: a bounded cache (least recently used entry leaves
 * first) and a hash of a checked column. Excel hands a function new arrays at
 * every recalculation, so entries are keyed by what the cells hold, not by
 * the arrays: the ten formulas of a summary sheet, given the same ranges,
 * share one prepared column (the same Float64Array, so the engine's own
 * per-array memories also hit), and an unchanged formula returns its
 * remembered result.
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

/**
 * A 64-bit hash of a checked column (two 32-bit multiply–xor lanes over the
 * IEEE bits of each value, then the missing mask): equal columns give equal
 * keys, and two different columns share a key with a chance of about 2⁻⁶⁴.
 * Hashing the checked column, not the cells, costs a sequential pass over a
 * typed array, and cells that mean the same (TRUE and 1, "" and null) share it.
 */
export function hashColumn(values: Float64Array, missing: Uint8Array): string {
  const w = new Uint32Array(values.buffer, values.byteOffset, values.length * 2);
  let a = 0x811c9dc5;
  let b = 0x9747b28c;
  for (let i = 0; i < w.length; i += 2) {
    a = Math.imul(a ^ w[i], 0x01000193);
    a = Math.imul(a ^ w[i + 1], 0x01000193);
    b = Math.imul(b ^ w[i + 1], 0x5bd1e995);
    b = Math.imul(b ^ w[i], 0x5bd1e995);
  }
  for (let i = 0; i < missing.length; i++) {
    if (missing[i]) {
      a = Math.imul(a ^ (i + 0x9e3779b1), 0x01000193);
      b = Math.imul(b ^ (i + 0x85ebca6b), 0x5bd1e995);
    }
  }
  return `${values.length}:${(a >>> 0).toString(36)}:${(b >>> 0).toString(36)}`;
}
