/**
 * The functions' memory: a bounded cache (least recently used entry leaves
 * first), a hash of a range's cells and a hash of a checked column. Excel
 * hands a function new arrays at every recalculation, so entries are keyed by
 * what the cells hold, not by the arrays: an unchanged formula finds its
 * result from the hash of its cells alone (one quick pass, no checking), and
 * the formulas of a summary sheet share one prepared column per content (the
 * same Float64Array, read and checked once).
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
// Per-kind constants mixed in for a cell that is not a number (blank, text, TRUE, FALSE, other), int32 so that the mixing stays in integers.
const KIND_A = [0, 0x1b873593, 0x2c1b3c6d, 0x297a2d39, 0x6b43a9b5, 0x5f356495];
const KIND_B = [0, 0x68e31da4, 0x3c6ef372, 0x14a1b7c5, 0x7f4a7c15, 0x0bb67ae8];

export function hashCells(cells: unknown[][]): string {
  let a = 0x811c9dc5;
  let b = 0x9747b28c;
  const h: [number, number] = [0, 0];
  const width = cells[0]?.length ?? 0;
  for (let r = 0; r < cells.length; r++) {
    const row = cells[r];
    const w = width === 1 ? 1 : row.length;
    for (let c = 0; c < w; c++) {
      const v = row[c];
      if (typeof v === 'number') {
        bits[0] = v;
        const lo = words[0];
        const hi = words[1];
        a = Math.imul(Math.imul(a ^ lo, 0x01000193) ^ hi, 0x01000193);
        b = Math.imul(Math.imul(b ^ hi, 0x5bd1e995) ^ lo, 0x5bd1e995);
        continue;
      }
      // Other cells: their kind, then the text.
      const kind = v === null || v === undefined ? 1 : typeof v === 'string' ? 2 : v === true ? 3 : v === false ? 4 : 5;
      a = Math.imul(a ^ KIND_A[kind], 0x01000193);
      b = Math.imul(b ^ KIND_B[kind], 0x5bd1e995);
      if (kind === 2 || kind === 5) {
        h[0] = a;
        h[1] = b;
        mixText(h, kind === 2 ? (v as string) : JSON.stringify(v));
        a = h[0];
        b = h[1];
      }
    }
  }
  return `${cells.length}x${width}:${(a >>> 0).toString(36)}:${(b >>> 0).toString(36)}`;
}
