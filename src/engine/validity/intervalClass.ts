/**
 * The outcome bins of the validity test's interval class (docs/methods.md §4.3;
 * Arai, Hsu, Kitagawa, Mourifié & Wan 2022, Quantitative Economics 13(1)).
 *
 * From the N outcomes of the window W, with m distinct values v₁ < … < v_m and
 * grid size G:
 * - m ≤ G: one bin per distinct value;
 * - else cut points z_k = Y_(⌈kN/G⌉), k = 1..G−1 (order statistics counted
 *   from 1), bins B₁ = {y ≤ z₁}, B_k = {z_{k−1} < y ≤ z_k}, B_G = {y > z_{G−1}};
 *   bins left empty by ties are dropped.
 * The intervals are the unions of consecutive bins (validityMoments.ts).
 *
 * Cost: one numeric sort of the window outcomes; a unit's bin is then a
 * binary search among at most G − 1 cut points.
 *
 * @example
 *   const cls = intervalClass(Float64Array.of(3, 1, 2, 2), 30);
 *   cls.bins; // 3, single values 1, 2, 3
 *   binOf(cls, 2); // 1
 */
export interface IntervalClass {
  /** Number of non-empty bins G′. */
  bins: number;
  /** True when every bin is a single outcome value (m ≤ G). */
  singleValues: boolean;
  /** Upper bounds of bins 0..G′−2 (bin b holds upper[b−1] < y ≤ upper[b]; the last bin holds the rest). */
  upper: Float64Array;
  /** Smallest and largest window outcome in each bin. */
  binMin: Float64Array;
  binMax: Float64Array;
  /** N and m of the window. */
  count: number;
  distinct: number;
}

/** The bins from the window's outcomes (any order) and the grid size G ≥ 2. */
export function intervalClass(outcomes: ArrayLike<number>, grid: number): IntervalClass {
  const sorted = Float64Array.from(outcomes).sort();
  const N = sorted.length;
  let m = 0;
  for (let t = 0; t < N; t++) if (t === 0 || sorted[t] !== sorted[t - 1]) m++;
  const cuts: number[] = [];
  const singleValues = m <= grid;
  if (singleValues) {
    for (let t = 0; t < N; t++) if (t === 0 || sorted[t] !== sorted[t - 1]) cuts.push(sorted[t]);
  } else {
    for (let k = 1; k < grid; k++) {
      // ⌈kN/G⌉ in exact integer arithmetic (k·N + G − 1 < 2⁵³).
      const r = Math.floor((k * N + grid - 1) / grid);
      const z = sorted[r - 1];
      if (cuts.length === 0 || z !== cuts[cuts.length - 1]) cuts.push(z);
    }
  }
  // Bins (−∞, c₁], (c₁, c₂], …, (c_last, ∞); the last is empty when c_last is the maximum.
  const bins = N === 0 ? 0 : cuts.length + (sorted[N - 1] > cuts[cuts.length - 1] ? 1 : 0);
  const upper = Float64Array.from(cuts.slice(0, Math.max(0, bins - 1)));
  const binMin = new Float64Array(bins).fill(Infinity);
  const binMax = new Float64Array(bins).fill(-Infinity);
  let b = 0;
  for (let t = 0; t < N; t++) {
    const y = sorted[t];
    while (b < bins - 1 && y > upper[b]) b++;
    if (y < binMin[b]) binMin[b] = y;
    if (y > binMax[b]) binMax[b] = y;
  }
  return { bins, singleValues, upper, binMin, binMax, count: N, distinct: m };
}

/** The bin of outcome y: the number of upper bounds below y. */
export function binOf(cls: IntervalClass, y: number): number {
  const u = cls.upper;
  let lo = 0;
  let hi = u.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (u[mid] < y) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
