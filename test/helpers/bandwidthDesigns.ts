/**
 * The closed-form designs whose population MSE-optimal bandwidths are computed
 * by test/fixtures/bandwidth_population/make_population.py (same numbering,
 * same formulas): simulated samples for bench/bandwidthConvergence.ts and
 * test/engine/bandwidth/bandwidthPopulation.test.ts. Cutoff 0.
 */
import { Random } from '../../src/engine/numeric/random';

export interface Sample {
  score: Float64Array;
  outcome: Float64Array;
  treated?: Float64Array;
}

/** Design index 0..3 as in population.json; design 3 is design 2's data (its outcome's sharp jump). */
export function simulateDesign(design: number, n: number, rng: Random): Sample {
  const score = new Float64Array(n);
  const outcome = new Float64Array(n);
  const fuzzy = design >= 2;
  const treated = fuzzy ? new Float64Array(n) : undefined;
  for (let i = 0; i < n; i++) {
    let x: number;
    if (design === 1) {
      // Beta(2, 2) is the law of the median of three uniforms
      const u = [rng.uniform(), rng.uniform(), rng.uniform()].sort((a, b) => a - b);
      x = 2 * u[1] - 1;
    } else x = 2 * rng.uniform() - 1;
    score[i] = x;
    const above = x >= 0;
    if (design === 0) outcome[i] = (above ? 1 + 0.5 * x + 1.5 * x * x : 0.5 * x - x * x) + 0.5 * rng.normal();
    else if (design === 1)
      outcome[i] = above
        ? 0.6 + 0.4 * x - 0.7 * x * x + 0.5 * x ** 3 + 0.6 * rng.normal()
        : 0.2 + x + 0.8 * x * x - 0.5 * x ** 3 + 0.3 * rng.normal();
    else {
      const p = above ? 0.7 + 0.1 * x - 0.3 * x * x : 0.2 + 0.1 * x + 0.2 * x * x;
      const d = rng.uniform() < p ? 1 : 0;
      treated![i] = d;
      outcome[i] = (above ? 0.5 * x + 1.5 * x * x : 0.5 * x - x * x) + 2 * d + 0.5 * rng.normal();
    }
  }
  return { score, outcome, treated: design === 2 ? treated : undefined };
}
