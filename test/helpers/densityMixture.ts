import { Random } from '../../src/engine/numeric/random';

/**
 * Scores from a closed-form mixture with a jump at 0: with probability pb,
 * R = −Y, else R = Y, Y ~ Beta(1, 3) (Y = 1 − U^(1/3)). Density 3·pb·(1 + r)²
 * below 0 and 3·(1 − pb)·(1 − r)² above, so f₋(0) = 3pb, f₊(0) = 3(1 − pb) and
 * the true log ratio is ln((1 − pb)/pb).
 */
export function betaMixture(n: number, pb: number, seed: number): Float64Array {
  const rng = new Random(seed);
  const r = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const y = 1 - Math.cbrt(rng.uniform());
    r[i] = rng.uniform() < pb ? -y : y;
  }
  return r;
}
