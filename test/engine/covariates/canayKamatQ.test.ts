/**
 * Canay & Kamat's rule-of-thumb q (2018, Review of Economic Studies 85(3),
 * §3.1; form recalled from memory, see covariatePermutation.ts) against direct
 * computations. Source: test/fixtures/rules/make_rules.py —
 * (a) on the committed ck_data.csv, f̂(c) by scipy.stats.gaussian_kde with
 *     Silverman's factor 1.06·n^(−1/5), ρ̂ by numpy.corrcoef: q must be equal;
 * (b) the population q = f(c)·σ_R·sqrt(1 − ρ²)·n^0.9/ln n of the normal design
 *     (f, σ, ρ in closed form): the median estimate over seeded samples at
 *     n = 20,000 is within 3% of it (the kernel density estimate's smoothing
 *     bias there is about −1%, its Monte Carlo spread well under 1%).
 */
import { readFileSync } from 'fs';
import { join } from 'path';
import { canayKamatQ, permutationBalanceTest } from '../../../src/engine/covariates/covariatePermutation';
import { scoreSummary } from '../../../src/engine/data/scoreSummary';
import { Random } from '../../../src/engine/numeric/random';

const dir = join(__dirname, '../../fixtures/rules');
const fx = JSON.parse(readFileSync(join(dir, 'rules.json'), 'utf8'));
const rows = readFileSync(join(dir, 'ck_data.csv'), 'utf8').trim().split('\n').slice(1).map((l) => l.split(',').map(Number));
const score = Float64Array.from(rows, (r) => r[0]);
const cov = Float64Array.from(rows, (r) => r[1]);

test('q on the committed data equals the SciPy gaussian_kde / numpy.corrcoef computation', () => {
  const e = fx.ck_exact;
  expect(score.length).toBe(e.n);
  const q = canayKamatQ(score, cov, e.cutoff, scoreSummary(score, e.cutoff));
  expect(q).toBe(e.q);
  // not on a rounding edge: the unrounded value sits well inside its integer step
  expect(Math.abs(e.raw - Math.round(e.raw))).toBeGreaterThan(0.01);
  // the test uses it (bounded by 10 and the smaller side)
  expect(permutationBalanceTest(score, cov, e.cutoff, { permutations: 9 }).q).toBe(Math.min(Math.max(10, e.q), e.below, e.above));
});

test('the estimated q approaches the population q (normal design, n = 20,000, median of 9 samples within 3%)', () => {
  const n = 20000;
  const target = fx.ck_population.q[String(n)] as number;
  const rng = new Random(85);
  const ratios: number[] = [];
  for (let r = 0; r < 9; r++) {
    const R = new Float64Array(n);
    const W = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      R[i] = 0.2 + rng.normal();
      W[i] = 1 + 0.5 * R[i] + rng.normal();
    }
    ratios.push(canayKamatQ(R, W, 0.5, scoreSummary(R, 0.5)) / target);
  }
  ratios.sort((a, b) => a - b);
  console.log(`q / population q at n = ${n}: ${ratios.map((v) => v.toFixed(4)).join(', ')}`);
  expect(Math.abs(ratios[4] - 1)).toBeLessThanOrEqual(0.03);
});
