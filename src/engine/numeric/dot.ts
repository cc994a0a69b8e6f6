/**
 * Σ a_i·b_i, summed in index order: a local fit's intercept from its weights
 * and a gathered column (the eligible side, the complier take-up jump). One
 * function for every such sum, so that V8 compiles its loop once.
 *
 * @example dot(Float64Array.of(0.5, 0.25), Float64Array.of(2, 4)) // 2
 */
export function dot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

/**
 * Σ a_i in index order (treated units counted from a 0/1 column).
 *
 * @example sum(Float64Array.of(1, 0, 1)) // 2
 */
export function sum(a: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i];
  return s;
}
