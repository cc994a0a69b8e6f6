/**
 * Holm (1979, Scandinavian Journal of Statistics 6(2)) step-down adjustment of
 * a family of p-values, docs/methods.md §4.10 (outcomes) and §7
 * (covariates). With p₍₁₎ ≤ … ≤ p₍m₎ the sorted p-values,
 *
 *     p̃₍i₎ = max_{j ≤ i} min(1, (m − j + 1)·p₍j₎),
 *
 * returned in the input order. Rejecting every p̃ ≤ α controls the
 * family-wise error rate at α under any dependence. Equal p-values keep their
 * input order (the result does not depend on how ties are broken).
 *
 * @example holmAdjust([0.01, 0.04, 0.03]) // [0.03, 0.06, 0.06]
 */
import { CutlineError } from '../errors';

export function holmAdjust(pvalues: readonly number[]): number[] {
  const m = pvalues.length;
  pvalues.forEach((p, i) => {
    if (!(p >= 0 && p <= 1)) {
      throw new CutlineError(`p-value ${i + 1} of the Holm adjustment must lie in [0, 1], got ${p}`);
    }
  });
  const order = pvalues.map((_, i) => i).sort((a, b) => pvalues[a] - pvalues[b] || a - b);
  const out = new Array<number>(m);
  let running = 0;
  order.forEach((idx, j) => {
    running = Math.max(running, Math.min(1, (m - j) * pvalues[idx]));
    out[idx] = running;
  });
  return out;
}
