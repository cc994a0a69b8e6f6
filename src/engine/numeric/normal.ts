/**
 * Standard normal distribution functions. The cdf is @stdlib's (erfc-based,
 * accurate to machine precision in both tails). The quantile is @stdlib's
 * erfinv(2p − 1) in the centre, but 2p − 1 cancels in the tails (p = 1e-20
 * gives −∞, p = 1e-6 loses 3 digits), so for min(p, 1 − p) < 0.02 Cutline
 * refines on the tail probability itself by Halley's method on Φ(z) − q
 * (step t/(1 + z·t/2), t = (Φ(z) − q)/φ(z)), started from erfinv or, far
 * out, from the asymptotic z ≈ −sqrt(L − ln L − ln 2π), L = −2 ln q.
 * Checked against SciPy and Abramowitz & Stegun (1964) tables in
 * test/normal.test.ts (relative error ≤ 1e-12 down to p = 1e-300).
 */
import cdf from '@stdlib/stats-base-dists-normal-cdf';
import quantile from '@stdlib/stats-base-dists-normal-quantile';

/** P(Z ≤ z) for Z standard normal. */
export function normalCdf(z: number): number {
  return cdf(z, 0, 1);
}

/** Upper tail P(Z > z), computed without cancellation for large z. */
export function normalUpperTail(z: number): number {
  return cdf(-z, 0, 1);
}

/** Two-sided p-value P(|Z| ≥ |z|). */
export function twoSidedPvalue(z: number): number {
  return Math.min(1, 2 * cdf(-Math.abs(z), 0, 1));
}

const TAIL = 0.02;
const LN_2PI = Math.log(2 * Math.PI);

/** z with Φ(z) = q for a lower-tail probability 0 < q < TAIL. */
function lowerTailQuantile(q: number): number {
  let z = q > 1e-12 ? quantile(q, 0, 1) : NaN;
  if (!Number.isFinite(z)) {
    const L = -2 * Math.log(q);
    z = -Math.sqrt(L - Math.log(L) - LN_2PI);
  }
  for (let it = 0; it < 20; it++) {
    const t = (cdf(z, 0, 1) - q) / (Math.exp(-0.5 * z * z - 0.5 * LN_2PI));
    const step = t / (1 + 0.5 * z * t);
    z -= step;
    if (Math.abs(step) <= 1e-16 * Math.abs(z)) break;
  }
  return z;
}

/** The p-quantile of the standard normal, 0 < p < 1 (−∞ at 0, +∞ at 1). */
export function normalQuantile(p: number): number {
  if (p > 0 && p < TAIL) return lowerTailQuantile(p);
  // 1 − p is exact for p ≥ 0.5 (Sterbenz), so the upper tail is as accurate.
  if (p > 1 - TAIL && p < 1) return -lowerTailQuantile(1 - p);
  return quantile(p, 0, 1);
}
