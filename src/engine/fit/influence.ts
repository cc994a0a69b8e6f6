/**
 * Variances from influence terms. A jump estimate Σ_above w_i V_i −
 * Σ_below w_i V_i has influence terms ψ_i = ±w_i e_i (residuals e of
 * residuals.ts); then (docs/methods.md §2.3)
 *
 * - hc0 / hc1 / neighbours: Var = Σ ψ_i², Cov(A, B) = Σ ψ^A_i ψ^B_i (sides independent);
 * - cluster: Var = G/(G−1) Σ_g (Σ_{i∈g} ψ_i)², G the clusters in the window; a
 *   cluster spanning the cutoff adds its cross-side term automatically.
 *
 * The delta method of the fuzzy ratio is exact in this form: ψ_τ = (ψ_Y − τ ψ_D)/τ_D.
 */

/** Σ ψ_a ψ_b, or the clustered version when cluster ids (aligned with ψ) are given. */
export function covarianceOf(a: Float64Array, b: Float64Array, clusters?: Int32Array | null): number {
  if (!clusters) {
    let s = 0;
    for (let i = 0; i < a.length; i++) s += a[i] * b[i];
    return s;
  }
  const sa = new Map<number, number>();
  const sb = new Map<number, number>();
  for (let i = 0; i < a.length; i++) {
    const g = clusters[i];
    sa.set(g, (sa.get(g) ?? 0) + a[i]);
    sb.set(g, (sb.get(g) ?? 0) + b[i]);
  }
  const G = sa.size;
  let s = 0;
  for (const [g, v] of sa) s += v * (sb.get(g) as number);
  return G > 1 ? (G / (G - 1)) * s : s;
}

export function varianceOf(a: Float64Array, clusters?: Int32Array | null): number {
  return covarianceOf(a, a, clusters);
}

/** Number of distinct clusters among the ids. */
export function clusterCount(clusters: Int32Array): number {
  return new Set(clusters).size;
}
