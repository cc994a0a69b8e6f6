/**
 * The engine's one binary search: the first position t in [from, to) at which
 * `at(t)` is ≥ v (or > v when `strict`), for values ascending in t; `to` when
 * there is none. Callers pass how to read the t-th value (a sorted array, or a
 * column through a sorted order).
 *
 * @example firstAtLeast((t) => [1, 2, 2, 5][t], 0, 4, 2, false) // 1
 */
export function firstAtLeast(at: (t: number) => number, from: number, to: number, v: number, strict: boolean): number {
  let lo = from;
  let hi = to;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    const s = at(mid);
    if (strict ? s <= v : s < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * The same search on an ascending array read directly (no accessor call per
 * step, for hot loops): the first t with sorted[t] ≥ v (> v when `strict`).
 *
 * @example searchSorted(Float64Array.of(1, 2, 2, 5), 2, false) // 1
 */
export function searchSorted(sorted: ArrayLike<number>, v: number, strict: boolean): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    const s = sorted[mid];
    if (strict ? s <= v : s < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
