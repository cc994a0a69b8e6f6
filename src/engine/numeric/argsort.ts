/**
 * Stable argsort of positions by their values, in near-linear time: a
 * counting pass into equal-width buckets (one per four values: a smaller
 * table keeps the counting and scattering closer to the cache), then each
 * bucket sorted by (value, position) — by insertion when small, by the engine's
 * stable comparison sort when large (mass points, heavy clusters). A
 * comparison sort of a million positions costs about half a second in V8;
 * this costs a few tens of milliseconds on smooth data.
 *
 * @example argsortBy(Float64Array.of(3, 1, 2), Int32Array.of(0, 1, 2)) // Int32Array [1, 2, 0]
 */

/** The positions `idx` reordered so that values[idx] ascend; ties keep the order of `idx`. */
export function argsortBy(values: ArrayLike<number>, idx: Int32Array): Int32Array {
  return argsortWithValues(values, idx).order;
}

/**
 * argsortBy, with the values in that order as well (values[order[t]] at t):
 * they are carried along with the positions, so the sort within buckets reads
 * them sequentially, and a caller who wants the sorted column has it.
 */
export function argsortWithValues(values: ArrayLike<number>, idx: Int32Array): { order: Int32Array; sorted: Float64Array } {
  const n = idx.length;
  const gather = (order: Int32Array): Float64Array => {
    const out = new Float64Array(order.length);
    for (let t = 0; t < order.length; t++) out[t] = values[order[t]];
    return out;
  };
  if (n < 2) {
    const order = idx.slice();
    return { order, sorted: gather(order) };
  }
  // The values in idx's order: the column itself when idx is 0, 1, …, n − 1 (a whole column's sort), else a copy.
  let whole = n === values.length;
  for (let t = 0; t < n && whole; t++) whole = idx[t] === t;
  const v: ArrayLike<number> = whole ? values : gather(idx);
  let lo = Infinity;
  let hi = -Infinity;
  for (let t = 0; t < n; t++) {
    const x = v[t];
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  if (!(hi > lo)) return { order: idx.slice(), sorted: whole ? Float64Array.from(v) : (v as Float64Array) };
  const B = Math.max(1, n >> 2);
  const scale = (B - 1) / (hi - lo);
  const start = new Int32Array(B + 1);
  for (let t = 0; t < n; t++) start[Math.floor((v[t] - lo) * scale) + 1]++;
  for (let b = 0; b < B; b++) start[b + 1] += start[b];
  const fill = start.slice(0, B);
  const out = new Int32Array(n);
  const sv = new Float64Array(n);
  // Each value's bucket is computed again rather than stored: arithmetic is cheaper than a 4-byte-per-unit array.
  for (let t = 0; t < n; t++) {
    const x = v[t];
    const at = fill[Math.floor((x - lo) * scale)]++;
    out[at] = idx[t];
    sv[at] = x;
  }
  for (let b = 0; b < B; b++) {
    const s = start[b];
    const e = start[b + 1];
    if (e - s < 2) continue;
    if (e - s <= 64) {
      for (let i = s + 1; i < e; i++) {
        const p = out[i];
        const x = sv[i];
        let j = i - 1;
        // Strictly greater only: equal values stay in arrival order (stable).
        while (j >= s && sv[j] > x) {
          out[j + 1] = out[j];
          sv[j + 1] = sv[j];
          j--;
        }
        out[j + 1] = p;
        sv[j + 1] = x;
      }
    } else {
      const part = Array.from(out.subarray(s, e));
      part.sort((a, c) => (values[a] as number) - (values[c] as number));
      out.set(part, s);
      for (let t = s; t < e; t++) sv[t] = values[out[t]];
    }
  }
  return { order: out, sorted: sv };
}
