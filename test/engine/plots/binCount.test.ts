/**
 * The binned plot's automatic bin count (IMSE-optimal evenly spaced bins of
 * Calonico, Cattaneo & Titiunik 2015, as binnedMeans.ts writes it down) against
 * direct computations. Source: test/fixtures/rules/make_rules.py — for a design
 * with uniform scores, known mean functions and sd 0.5, SciPy computes the exact
 * integrated MSE of evenly spaced bin means (bias by quadrature over each bin)
 * and its minimising integer J, and the asymptotic rule with E[μ'²] by
 * quadrature. The engine estimates μ' and σ² from the data (global quartic;
 * the design's means are polynomials of degree ≤ 3, so unbiased), so on large
 * samples its J must be the rule's J up to estimation noise, and within 1 of
 * the exact minimiser (the rule rounds up a continuous optimum and drops
 * higher-order bias terms). Checked on the median of 5 seeded samples.
 */
import { readFileSync } from 'fs';
import { join } from 'path';
import { binnedMeans } from '../../../src/engine/plots/binnedMeans';
import { Random } from '../../../src/engine/numeric/random';

const fx = JSON.parse(readFileSync(join(__dirname, '../../fixtures/rules/rules.json'), 'utf8')).bins;

test.each([2000, 50000])('n_s = %d units a side: bin counts vs the SciPy exact IMSE minimiser and the rule', (ns) => {
  const rng = new Random(2015 + ns);
  const below: number[] = [];
  const above: number[] = [];
  for (let r = 0; r < 5; r++) {
    const score = new Float64Array(2 * ns);
    const y = new Float64Array(2 * ns);
    for (let i = 0; i < 2 * ns; i++) {
      const x = i < ns ? -rng.uniform() : 1.5 * rng.uniform();
      score[i] = x;
      y[i] = (x < 0 ? 1 + 2 * x + x * x : 0.5 - x + 3 * x * x - x ** 3) + fx.sigma * rng.normal();
    }
    const b = binnedMeans(score, y, 0);
    below.push(b.binsBelow);
    above.push(b.binsAbove);
  }
  const med = (a: number[]): number => a.sort((u, v) => u - v)[2];
  console.log(`n_s = ${ns}: bins below ${below.join(",")}, above ${above.join(",")}`);
  for (const [side, got] of [['below', med(below)], ['above', med(above)]] as const) {
    const ref = fx.sides[side].by_n[String(ns)];
    expect(Math.abs(got - ref.exact_argmin)).toBeLessThanOrEqual(ns >= 50000 ? 1 : 2);
    expect(Math.abs(got - ref.rule)).toBeLessThanOrEqual(ns >= 50000 ? 1 : 2);
  }
});
