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
 * Cost: a few linear passes (distinct values counted up to G + 1, the cut
 * points by selection, not a sort of the window); a unit's bin is then read
 * from a table of equal-width buckets over the window's range
 * (numeric/rankLookup.ts; a binary search only in the few buckets that hold a
 * cut point).
 *
 * @example
 *   const cls = intervalClass(Float64Array.of(3, 1, 2, 2), 30);
 *   cls.bins; // 3, single values 1, 2, 3
 *   binOf(cls, 2); // 1
 */
import { orderStatistics, rankLookup, RankLookup, rankOf, searchSorted } from '../numeric';

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
  /** N and m of the window (m counted on demand when it exceeds G). */
  count: number;
  distinct: number;
  /** The bins read from a table over the window's range (numeric/rankLookup.ts). */
  lookup?: RankLookup;
}

/**
 * The bins from the window's outcomes (any order) and the grid size G ≥ 2;
 * `binsOut`, when given, receives the bin of each outcome (the moments' sums
 * read them instead of looking each unit up again).
 */
export function intervalClass(outcomes: ArrayLike<number>, grid: number, binsOut?: Int32Array): IntervalClass {
  const N = outcomes.length;
  // Distinct values counted up to G + 1: a continuous outcome answers after G + 1 units.
  const seen = new Set<number>();
  for (let t = 0; t < N && seen.size <= grid; t++) seen.add(outcomes[t]);
  const singleValues = seen.size <= grid;
  let cuts: number[];
  let min = Infinity;
  let max = -Infinity;
  if (singleValues) {
    cuts = [...seen].sort((a, b) => a - b);
    if (N > 0) {
      min = cuts[0];
      max = cuts[cuts.length - 1];
    }
  } else {
    // Cut points z_k = Y_(⌈kN/G⌉) by selection (numeric/orderStatistics.ts): the values a sort gives, in a few linear passes.
    const ranks = [0];
    // ⌈kN/G⌉ in exact integer arithmetic (k·N + G − 1 < 2⁵³).
    for (let k = 1; k < grid; k++) ranks.push(Math.floor((k * N + grid - 1) / grid) - 1);
    ranks.push(N - 1);
    const z = orderStatistics(outcomes, ranks);
    min = z[0];
    max = z[grid];
    cuts = [];
    for (let k = 1; k < grid; k++) if (cuts.length === 0 || z[k] !== cuts[cuts.length - 1]) cuts.push(z[k]);
  }
  // Bins (−∞, c₁], (c₁, c₂], …, (c_last, ∞); the last is empty when c_last is the maximum.
  const bins = N === 0 ? 0 : cuts.length + (max > cuts[cuts.length - 1] ? 1 : 0);
  const upper = Float64Array.from(cuts.slice(0, Math.max(0, bins - 1)));
  const binMin = new Float64Array(bins).fill(Infinity);
  const binMax = new Float64Array(bins).fill(-Infinity);
  const cls: IntervalClass = { bins, singleValues, upper, binMin, binMax, count: N, distinct: singleValues ? seen.size : 0 };
  if (N > 0) cls.lookup = rankLookup(upper, min, max);
  if (cls.lookup) binRanges(outcomes, cls.lookup, binMin, binMax, binsOut ?? new Int32Array(N));
  if (!singleValues) {
    // m itself only matters beyond G to a caller who asks (tests): counted then, by a sort.
    let m: number | undefined;
    Object.defineProperty(cls, 'distinct', {
      enumerable: true,
      get: (): number => (m ??= countDistinct(outcomes)),
    });
  }
  return cls;
}

/**
 * Each outcome's bin (into `bins`) and each bin's smallest and largest value,
 * in one pass of its own (a long loop over arrays only, compiled alone); of −0
 * and 0 the −0 is kept (a sort puts it first).
 */
function binRanges(outcomes: ArrayLike<number>, lookup: RankLookup, binMin: Float64Array, binMax: Float64Array, bins: Int32Array): void {
  for (let t = 0; t < outcomes.length; t++) {
    const y = outcomes[t];
    const b = rankOf(lookup, y);
    bins[t] = b;
    if (y < binMin[b] || (y === binMin[b] && 1 / y < 0)) binMin[b] = y;
    if (y > binMax[b] || (y === binMax[b] && 1 / y < 0)) binMax[b] = y;
  }
}

/** The number of distinct values (sorted copy). */
function countDistinct(outcomes: ArrayLike<number>): number {
  const sorted = Float64Array.from(outcomes).sort();
  let m = 0;
  for (let t = 0; t < sorted.length; t++) if (t === 0 || sorted[t] !== sorted[t - 1]) m++;
  return m;
}

/** The bin of outcome y: the number of upper bounds below y (read from the lookup table when there is one). */
export function binOf(cls: IntervalClass, y: number): number {
  return cls.lookup ? rankOf(cls.lookup, y) : searchSorted(cls.upper, y, false);
}
