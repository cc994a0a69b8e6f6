/**
 * Stable argsort of positions by their values, in near-linear time: a
 * counting pass into as many equal-width buckets as values, then each bucket
 * sorted by (value, position) — by insertion when small, by the engine's
 * stable comparison sort when large (mass points, heavy clusters). A
 * comparison sort of a million positions costs about half a second in V8;
 * this costs a few tens of milliseconds on smooth data.
 *
 * @example argsortBy(Float64Array.of(3, 1, 2), Int32Array.of(0, 1, 2)) // Int32Array [1, 2, 0]
 */

/** The positions `idx` reordered so that values[idx] ascend; ties keep the order of `idx`. */
export function argsortBy(values: ArrayLike<number>, idx: Int32Array): Int32Array {
  const n = idx.length;
  if (n < 2) return idx.slice();
  let lo = Infinity;
  let hi = -Infinity;
  for (let t = 0; t < n; t++) {
    const v = values[idx[t]];
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!(hi > lo)) return idx.slice();
  const B = n;
  const scale = (B - 1) / (hi - lo);
  const bucketOf = new Int32Array(n);
  const start = new Int32Array(B + 1);
  for (let t = 0; t < n; t++) {
    const b = Math.floor((values[idx[t]] - lo) * scale);
    bucketOf[t] = b;
    start[b + 1]++;
  }
  for (let b = 0; b < B; b++) start[b + 1] += start[b];
  const fill = start.slice(0, B);
  const out = new Int32Array(n);
  for (let t = 0; t < n; t++) out[fill[bucketOf[t]]++] = idx[t];
  for (let b = 0; b < B; b++) {
    const s = start[b];
    const e = start[b + 1];
    if (e - s < 2) continue;
    if (e - s <= 32) {
      for (let i = s + 1; i < e; i++) {
        const p = out[i];
        const v = values[p];
        let j = i - 1;
        // Strictly greater only: equal values stay in arrival order (stable).
        while (j >= s && values[out[j]] > v) {
          out[j + 1] = out[j];
          j--;
        }
        out[j + 1] = p;
      }
    } else {
      const part = Array.from(out.subarray(s, e));
      part.sort((a, b) => values[a] - values[b]);
      out.set(part, s);
    }
  }
  return out;
}
