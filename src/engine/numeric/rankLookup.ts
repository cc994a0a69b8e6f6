/**
 * The number of values of a short ascending array below v, for many v: a
 * table of equal-width buckets over [from, to] gives it directly for a value
 * whose bucket holds none of the array's values; a binary search
 * (searchSorted) is left only for the few buckets that hold one. The bucket
 * ⌊(v − from)·scale⌋ is monotone in v, so a value in bucket j lies above every
 * array value of an earlier bucket and at or below every one of a later
 * bucket: its rank is the count of array values in earlier buckets. The same
 * answer as searchSorted(sorted, v, false), without its unpredictable branches.
 *
 * @example rankOf(rankLookup(Float64Array.of(1, 2, 5), 0, 10), 3) // 2
 */
import { searchSorted } from './binarySearch';

/** A table small enough to stay in the first-level cache. */
const BUCKETS = 4096;

export interface RankLookup {
  sorted: Float64Array;
  from: number;
  to: number;
  scale: number;
  /** Rank for bucket j, or −1 when an array value falls in it. */
  table: Int32Array;
}

/** The lookup for `sorted` (ascending) over [from, to], from ≤ sorted[0] and to ≥ its last value. */
export function rankLookup(sorted: Float64Array, from: number, to: number): RankLookup {
  const scale = to > from && Number.isFinite(to - from) ? (BUCKETS - 1) / (to - from) : 0;
  const table = new Int32Array(BUCKETS).fill(-1);
  if (scale > 0) {
    let k = 0;
    for (let j = 0; j < BUCKETS; j++) {
      while (k < sorted.length && Math.floor((sorted[k] - from) * scale) < j) k++;
      table[j] = k < sorted.length && Math.floor((sorted[k] - from) * scale) === j ? -1 : k;
    }
  }
  return { sorted, from, to, scale, table };
}

/** The number of values of the lookup's array below v (searchSorted(sorted, v, false)). */
export function rankOf(l: RankLookup, v: number): number {
  if (v < l.from) return 0;
  if (v > l.to) return l.sorted.length;
  const j = Math.floor((v - l.from) * l.scale);
  if (j >= 0 && j < BUCKETS) {
    const r = l.table[j];
    if (r >= 0) return r;
  }
  return searchSorted(l.sorted, v, false);
}
