/**
 * The implied complier distributions converge to their closed-form truth.
 * Source of the truth: test/fixtures/compliers/make_truth.py (scipy.stats.norm
 * CDFs and densities of the design's compliers; the design is described there
 * and simulated here). One seeded sample at each n, bandwidth 0.8·(n/1000)^(−1/5),
 * triangular kernel. With the types' shares constant in the score and a
 * linear common trend the local linear fits are unbiased, so the error is
 * noise of order (n·h)^(−1/2): the largest error over the grid must fall as n
 * grows and, at n = 200,000 (about 55,000 units in the window), be below 0.03
 * for the CDFs and means, and below 0.06 for the densities (their noise is of
 * the larger order (n·h·b)^(−1/2), b ≈ 0.14 the Silverman bandwidth there; the
 * smoothing bias is under 0.01).
 */
import truth from '../../fixtures/compliers/truth.json';
import { complierCdf, complierDensity, complierMeans } from '../../../src/engine/compliers/complierDistributions';
import { Random } from '../../../src/engine/numeric/random';

function sample(n: number, seed: number) {
  const rng = new Random(seed);
  const score = new Float64Array(n), treated = new Float64Array(n), outcome = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = 2 * rng.uniform() - 1;
    const u = rng.uniform();
    const type = u < 0.2 ? 'a' : u < 0.5 ? 'n' : 'c';
    const d = type === 'a' ? 1 : type === 'n' ? 0 : r >= 0 ? 1 : 0;
    const y = type === 'a' ? 2 + rng.normal() : type === 'n' ? -1 + 1.2 * rng.normal() : d ? 1 + rng.normal() : 0.8 * rng.normal();
    score[i] = r;
    treated[i] = d;
    outcome[i] = y + 0.5 * r;
  }
  return { score, treated, outcome };
}

const supErr = (a: number[], b: number[]): number => Math.max(...a.map((v, i) => Math.abs(v - b[i])));

const errors = [2000, 20000, 200000].map((n) => {
  const s = sample(n, 97 + n);
  const o = { bandwidth: 0.8 * Math.pow(n / 1000, -0.2), kernel: 'triangular' as const };
  const F1 = complierCdf(s.score, s.treated, s.outcome, 0, truth.at, 1, o).cdf;
  const F0 = complierCdf(s.score, s.treated, s.outcome, 0, truth.at, 0, o).cdf;
  const f1 = complierDensity(s.score, s.treated, s.outcome, 0, truth.at, 1, o).density;
  const f0 = complierDensity(s.score, s.treated, s.outcome, 0, truth.at, 0, o).density;
  const m = complierMeans(s.score, s.treated, s.outcome, 0, o);
  return {
    n,
    cdf: Math.max(supErr(F1, truth.F1), supErr(F0, truth.F0)),
    density: Math.max(supErr(f1, truth.f1), supErr(f0, truth.f0)),
    mean: Math.max(Math.abs(m.mean_treated - truth.mean1), Math.abs(m.mean_untreated - truth.mean0)),
  };
});

test('largest errors fall as n grows (2000 → 200,000)', () => {
  const [first, , last] = errors;
  expect(last.cdf).toBeLessThan(first.cdf / 2);
  expect(last.density).toBeLessThan(first.density / 2);
  expect(last.mean).toBeLessThan(first.mean / 2);
});
test('at n = 200,000: CDFs and means within 0.03, densities within 0.06 of the SciPy truth', () => {
  const last = errors[2];
  expect(last.cdf).toBeLessThanOrEqual(0.03);
  expect(last.mean).toBeLessThanOrEqual(0.03);
  expect(last.density).toBeLessThanOrEqual(0.06);
});
afterAll(() => console.log(errors.map((e) => `n=${e.n}: sup|F̂−F| ${e.cdf.toFixed(4)}, sup|f̂−f| ${e.density.toFixed(4)}, |mean err| ${e.mean.toFixed(4)}`).join('\n')));
