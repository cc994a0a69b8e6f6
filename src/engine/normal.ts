/**
 * Standard normal distribution functions, from @stdlib (accurate to machine
 * precision; simple-statistics' 4-digit table is not good enough for p-values).
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

/** The p-quantile of the standard normal, 0 < p < 1. */
export function normalQuantile(p: number): number {
  return quantile(p, 0, 1);
}
