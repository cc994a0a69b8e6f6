/**
 * Several order statistics of an array at once, without sorting it: a
 * quickselect that recurses only into the parts holding a wanted rank
 * (three-way partition around a median-of-three pivot, so ties cost nothing).
 * O(n log k) for k ranks. Reorders `values` (pass a copy you own).
 *
 * @example orderStatistics(Float64Array.of(5, 1, 4, 2, 3), [0, 4]) // [1, 5]
 */
export function orderStatistics(values: Float64Array, ranks: number[]): number[] {
  const out = new Array<number>(ranks.length);
  const wanted = ranks.map((k, j) => ({ k, j })).sort((a, b) => a.k - b.k);
  for (const w of wanted) {
    if (!(w.k >= 0 && w.k < values.length) || !Number.isInteger(w.k)) throw new RangeError(`rank ${w.k} outside 0…${values.length - 1}`);
  }
  // Explicit stack of [lo, hi, first wanted, last wanted + 1].
  const stack: number[][] = [[0, values.length - 1, 0, wanted.length]];
  while (stack.length > 0) {
    const [lo, hi, a, b] = stack.pop()!;
    if (a >= b) continue;
    if (hi - lo < 16) {
      const part = values.subarray(lo, hi + 1).sort();
      for (let q = a; q < b; q++) out[wanted[q].j] = part[wanted[q].k - lo];
      continue;
    }
    const m = (lo + hi) >> 1;
    const x = values[lo];
    const y = values[m];
    const z = values[hi];
    const pivot = x < y ? (y < z ? y : x < z ? z : x) : x < z ? x : y < z ? z : y;
    // values[lo..lt-1] < pivot, values[lt..gt] = pivot, values[gt+1..hi] > pivot.
    let lt = lo;
    let gt = hi;
    let i = lo;
    while (i <= gt) {
      const v = values[i];
      if (v < pivot) {
        values[i++] = values[lt];
        values[lt++] = v;
      } else if (v > pivot) {
        values[i] = values[gt];
        values[gt--] = v;
      } else i++;
    }
    let q = a;
    while (q < b && wanted[q].k < lt) q++;
    let r = q;
    while (r < b && wanted[r].k <= gt) out[wanted[r++].j] = pivot;
    stack.push([lo, lt - 1, a, q], [gt + 1, hi, r, b]);
  }
  return out;
}
