/**
 * The density tests' standard errors against the Monte Carlo spread of their
 * estimates on a closed-form density (R = ±Y, Y ~ Beta(1, 3), equal weights:
 * f₊(0) = f₋(0) = 1.5), n = 5000, fixed bandwidths, 300 seeded replications.
 * The reference is the simulation itself (the law of θ̂ is known only through
 * it): McCrary's formula se = sqrt((1/(nh))·(24/5)·(1/f̂₊ + 1/f̂₋)) (McCrary
 * 2008, recalled from memory) and the local polynomial test's jackknife-type se
 * must match sd(θ̂) over the replications, and the robust z must have sd 1.
 * Tolerance ±0.15 on the ratio: its Monte Carlo s.e. with 300 replications is
 * about 0.045, so this is about 3 s.e.; a se formula off by a constant factor
 * (a wrong 24/5, a missing 1/n) fails. The full study (two densities,
 * n = 1000 to 20,000, fixed and automatic bandwidths, 2000 replications) is
 * bench/densitySpread.ts.
 */
import { localPolynomialDensityTest } from '../../../src/engine/density/densityLocalPolynomial';
import { mccraryTest } from '../../../src/engine/density/densityMcCrary';
import { Random } from '../../../src/engine/numeric/random';

const REPS = 300;
const n = 5000;
const sd = (a: number[]): number => {
  const m = a.reduce((s, v) => s + v, 0) / a.length;
  return Math.sqrt(a.reduce((s, v) => s + (v - m) ** 2, 0) / (a.length - 1));
};
const mean = (a: number[]): number => a.reduce((s, v) => s + v, 0) / a.length;

const rng = new Random(2026);
const mc = { theta: [] as number[], se: [] as number[] };
const lp = { theta: [] as number[], se: [] as number[], z: [] as number[] };
for (let r = 0; r < REPS; r++) {
  const x = Float64Array.from({ length: n }, () => {
    const y = 1 - Math.cbrt(rng.uniform());
    return rng.uniform() < 0.5 ? -y : y;
  });
  const a = mccraryTest(x, 0, { bandwidth: 0.6 * Math.pow(n / 1000, -0.2) });
  mc.theta.push(a.log_ratio);
  mc.se.push(a.se);
  const b = localPolynomialDensityTest(x, 0, { bandwidth: 0.5 * Math.pow(n / 1000, -1 / 7) });
  lp.theta.push(b.log_ratio);
  lp.se.push(b.se);
  lp.z.push(b.statistic);
}

test('McCrary: mean se / sd(θ̂) within 0.15 of 1', () => {
  expect(Math.abs(mean(mc.se) / sd(mc.theta) - 1)).toBeLessThanOrEqual(0.15);
});
test('local polynomial: mean se of the log ratio / sd(θ̂) within 0.15 of 1, sd of the robust z within 0.15 of 1', () => {
  expect(Math.abs(mean(lp.se) / sd(lp.theta) - 1)).toBeLessThanOrEqual(0.15);
  expect(Math.abs(sd(lp.z) - 1)).toBeLessThanOrEqual(0.15);
});
test('the check can fail: a se off by sqrt(2) would be outside the band', () => {
  expect(Math.abs((Math.SQRT2 * mean(mc.se)) / sd(mc.theta) - 1)).toBeGreaterThan(0.15);
});
afterAll(() =>
  console.log(
    `density se vs spread (n = ${n}, ${REPS} reps): McCrary ${(mean(mc.se) / sd(mc.theta)).toFixed(3)}, ` +
      `local poly ${(mean(lp.se) / sd(lp.theta)).toFixed(3)}, sd(z) ${sd(lp.z).toFixed(3)}`,
  ),
);
