/**
 * Several order statistics of an array at once, without sorting it: one pass
 * for the range, one counting the values into equal-width buckets (the bucket
 * of a value is monotone in the value, so ranks fall into known buckets), one
 * gathering the values of the buckets that hold a wanted rank, and a sort of
 * those buckets alone. About three linear passes on spread-out data; a full
 * sort at worst (every value in one bucket).
 *
 * @example orderStatistics(Float64Array.of(5, 1, 4, 2, 3), [0, 4]) // [1, 5]
 */
export function orderStatistics(values: ArrayLike<number>, ranks: number[]): number[] {
  const n = values.length;
  for (const k of ranks) if (!(k >= 0 && k < n) || !Number.isInteger(k)) throw new RangeError(`rank ${k} outside 0…${n - 1}`);
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!(hi > lo)) return ranks.map(() => lo);
  const B = Math.max(1, Math.min(n, 1 << 16));
  const scale = (B - 1) / (hi - lo);
  const start = new Int32Array(B + 1);
  for (let i = 0; i < n; i++) start[Math.floor((values[i] - lo) * scale) + 1]++;
  for (let b = 0; b < B; b++) start[b + 1] += start[b];
  // The bucket of each wanted rank: the last b with start[b] ≤ k.
  const bucketOf = ranks.map((k) => {
    let a = 0;
    let z = B - 1;
    while (a < z) {
      const m = (a + z + 1) >> 1;
      if (start[m] <= k) a = m;
      else z = m - 1;
    }
    return a;
  });
  // slot[b]: which gathered part bucket b goes to (−1: not wanted).
  const slot = new Int32Array(B).fill(-1);
  const parts: Float64Array[] = [];
  for (const b of bucketOf) if (slot[b] < 0) slot[b] = parts.push(new Float64Array(start[b + 1] - start[b])) - 1;
  const fill = new Int32Array(parts.length);
  for (let i = 0; i < n; i++) {
    const q = slot[Math.floor((values[i] - lo) * scale)];
    if (q >= 0) parts[q][fill[q]++] = values[i];
  }
  for (const part of parts) part.sort();
  return ranks.map((k, j) => parts[slot[bucketOf[j]]][k - start[bucketOf[j]]]);
}
