/**
 * The functions' memory: a bounded cache (least recently used entry leaves
 * first) and a hash of a range's contents. Excel hands a function new arrays
 * at every recalculation, so entries are keyed by what the cells hold, not by
 * the arrays: the ten formulas of a summary sheet, given the same ranges,
 * share one preparation of each column (the same Float64Array, so the
 * engine's own per-array memories also hit), and an unchanged formula
 * returns its remembered result.
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

const bits = new Float64Array(1);
const words = new Uint32Array(bits.buffer);

/** Mixes a string into a pair of 32-bit hash states. */
function mixText(h: [number, number], s: string): void {
  let a = h[0];
  let b = h[1];
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    a = Math.imul(a ^ c, 0x01000193);
    b = Math.imul(b ^ c, 0x5bd1e995);
  }
  h[0] = a;
  h[1] = b;
}

/**
 * A 64-bit hash of a range's cells (two 32-bit multiply-xor lanes over each
 * number's IEEE bits and each text's characters, with a tag per cell type),
 * with the range's shape: equal contents give equal keys, and two different
 * ranges share a key with a chance of about 2⁻⁶⁴.
 */
export function hashCells(cells: unknown[][]): string {
  let a = 0x811c9dc5;
  let b = 0x9747b28c;
  const h: [number, number] = [0, 0];
  for (let r = 0; r < cells.length; r++) {
    const row = cells[r];
    for (let c = 0; c < row.length; c++) {
      const v = row[c];
      if (typeof v === 'number') {
        bits[0] = v;
        a = Math.imul(a ^ words[0], 0x01000193);
        a = Math.imul(a ^ words[1], 0x01000193);
        b = Math.imul(b ^ words[1], 0x5bd1e995);
        b = Math.imul(b ^ words[0], 0x5bd1e995);
        continue;
      }
      // Other cells: a tag, then the text.
      const tag = v === null || v === undefined ? 1 : typeof v === 'string' ? 2 : typeof v === 'boolean' ? (v ? 3 : 4) : 5;
      a = Math.imul(a ^ (tag * 0x9e3779b1), 0x01000193);
      b = Math.imul(b ^ (tag * 0x85ebca6b), 0x5bd1e995);
      if (tag === 2 || tag === 5) {
        h[0] = a;
        h[1] = b;
        mixText(h, tag === 2 ? (v as string) : JSON.stringify(v));
        a = h[0];
        b = h[1];
      }
    }
  }
  return `${cells.length}x${cells[0]?.length ?? 0}:${(a >>> 0).toString(36)}:${(b >>> 0).toString(36)}`;
}
