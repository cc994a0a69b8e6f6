/**
 * Implied complier distributions (METHODS.md §5): the built-in consistency
 * check against the fuzzy effect of src/engine/fit/jumpAt.ts, convergence to the
 * known complier distributions of a simulated design, and reporting of
 * decreasing / negative stretches.
 */
import { boundaryWindow } from '../../../src/engine/fit/boundaryWindow';
import { complierCdf, complierCdfArms, complierDensity, complierMeans } from '../../../src/engine/compliers/complierDistributions';
import { CutlineError } from '../../../src/engine/errors';
import { effectAt } from '../../../src/engine/fit/jumpAt';
import { normalCdf } from '../../../src/engine/numeric/normal';
import { Random } from '../../../src/engine/numeric/random';
import { simulate } from '../../helpers/validityDense';

/** Always-takers 0.2, never-takers 0.3, compliers 0.5 at every score; complier Y(1) ~ N(2,1), Y(0) ~ N(0,1) at c = 0. */
function design(n: number, seed: number) {
  const rng = new Random(seed);
  const score: number[] = [], treated: number[] = [], outcome: number[] = [];
  for (let i = 0; i < n; i++) {
    const r = 2 * rng.uniform() - 1;
    const u = rng.uniform();
    const type = u < 0.2 ? 'a' : u < 0.5 ? 'n' : 'c';
    const d = type === 'a' ? 1 : type === 'n' ? 0 : r >= 0 ? 1 : 0;
    const mu = type === 'a' ? 1 : type === 'n' ? -1 : d === 1 ? 2 : 0;
    score.push(r);
    treated.push(d);
    outcome.push(mu + 0.5 * r + rng.normal());
  }
  return { score, treated, outcome };
}

describe.each([
  ['triangular', 1],
  ['epanechnikov', -1],
  ['uniform', 1],
] as const)('%s kernel, sign %d', (kernel, sign) => {
  test('mean_treated − mean_untreated equals the fuzzy effect τ(Y)/τ(D) of jumpAt.ts effectAt (to 1e-10)', () => {
    const d = simulate(2000, 17, 'continuous');
    // With sign −1 flip take-up so that it falls at the cutoff.
    const t = sign === 1 ? d.treated : d.treated.map((v) => 1 - v);
    const h = 0.4;
    const m = complierMeans(d.score, t, d.outcome, 0, { bandwidth: h, kernel, sign });
    const e = effectAt(boundaryWindow(d.score, 0, h, kernel), d.outcome, t, { variance: 'hc0', sign });
    expect(Math.abs(m.mean_treated - m.mean_untreated - e.estimate)).toBeLessThan(1e-10);
  });
});

test('implied complier CDFs approach the true N(2,1) and N(0,1) as n grows', () => {
  const at = Array.from({ length: 41 }, (_, j) => -3 + (j * 8) / 40);
  const supErr = (n: number): number => {
    let total = 0;
    const reps = 4;
    for (let rep = 0; rep < reps; rep++) {
      const d = design(n, 100 + rep);
      const h = 0.5 * Math.pow(n / 2000, -0.2);
      const f1 = complierCdf(d.score, d.treated, d.outcome, 0, at, 1, { bandwidth: h, kernel: 'triangular' }).cdf;
      const f0 = complierCdf(d.score, d.treated, d.outcome, 0, at, 0, { bandwidth: h, kernel: 'triangular' }).cdf;
      let e = 0;
      at.forEach((y, j) => (e = Math.max(e, Math.abs(f1[j] - normalCdf(y - 2)), Math.abs(f0[j] - normalCdf(y)))));
      total += e;
    }
    return total / reps;
  };
  const small = supErr(2000);
  const large = supErr(60000);
  expect(large).toBeLessThan(small / 2);
  expect(large).toBeLessThan(0.1);
});

test('the implied density integrates to 1 and is near the true complier density for large n', () => {
  const d = design(40000, 7);
  const at = Array.from({ length: 141 }, (_, j) => -6 + j / 10);
  const r = complierDensity(d.score, d.treated, d.outcome, 0, at, 1, { bandwidth: 0.3, kernel: 'triangular' });
  let integral = 0;
  for (let j = 1; j < at.length; j++) integral += ((r.density[j] + r.density[j - 1]) / 2) * (at[j] - at[j - 1]);
  expect(integral).toBeCloseTo(1, 3);
  const j2 = at.findIndex((y) => Math.abs(y - 2) < 1e-9);
  expect(Math.abs(r.density[j2] - 1 / Math.sqrt(2 * Math.PI))).toBeLessThan(0.06);
  expect(r.densityBandwidth).toBeGreaterThan(0);
});

test('defiers show as a decreasing stretch of F₀ and a negative density, reported not clipped', () => {
  // Deterministic toy data, patterns repeating every 20 units so each side's intercept is close to its share:
  // take-up 0.2 below, 0.6 above; untreated mass at y = 5 only above (defiers' Y(0)), so F₀ falls across 5.
  const score: number[] = [], treated: number[] = [], outcome: number[] = [];
  for (let i = 0; i < 80; i++) {
    const above = i >= 40;
    const r = above ? (i - 40 + 0.5) / 40 : -(i + 0.5) / 40;
    const k = i % 40;
    const d = above ? (k % 5 < 3 ? 1 : 0) : k % 5 === 0 ? 1 : 0;
    const y = d === 0 && above && k % 5 === 4 ? 5 : k % 4;
    score.push(r);
    treated.push(d);
    outcome.push(y);
  }
  const at = [0, 1, 2, 3, 4, 4.5, 5, 6];
  const c = complierCdf(score, treated, outcome, 0, at, 0, { bandwidth: 1, kernel: 'uniform' });
  expect(c.decreasing.some((s) => s.from <= 4.5 && s.to >= 5)).toBe(true);
  const dn = complierDensity(score, treated, outcome, 0, [4.8, 5, 5.2], 0, { bandwidth: 1, kernel: 'uniform', densityBandwidth: 0.2 });
  expect(dn.negative).toEqual([{ from: 4.8, to: 5.2 }]);
  expect(dn.density.every((v) => v < 0)).toBe(true);
});

test('results keep the order of `at`; bad input is a CutlineError', () => {
  const d = simulate(800, 2, 'continuous');
  const o = { bandwidth: 0.5, kernel: 'triangular' as const };
  const a = complierCdf(d.score, d.treated, d.outcome, 0, [2, -1, 0.5], 1, o);
  const b = complierCdf(d.score, d.treated, d.outcome, 0, [-1, 0.5, 2], 1, o);
  expect(a.cdf).toEqual([b.cdf[2], b.cdf[0], b.cdf[1]]);
  expect(() => complierCdf(d.score, d.treated, d.outcome, 0, [NaN], 1, o)).toThrow('at must hold finite numbers; value 1 is NaN');
  expect(() => complierCdf(d.score, d.treated, d.outcome, 0, [1], 2 as 0, o)).toThrow(CutlineError);
  const flat = d.treated.map(() => 1);
  expect(() => complierMeans(d.score, flat, d.outcome, 0, o)).toThrow(/take-up does not rise/);
  expect(() => complierDensity(d.score, d.treated, d.outcome, 0, [1], 1, { ...o, densityBandwidth: -1 })).toThrow(
    'densityBandwidth must be a positive number, got -1',
  );
});

test('both arms in one pass equal each arm alone, to the last digit', () => {
  // The check computes F₁ and F₀ together (complierCdfArms); a worksheet asks for one arm (complierCdf).
  for (const kind of ['continuous', 'ties', 'binary'] as const) {
    const d = simulate(1500, 5, kind);
    const at = [-1, -0.3, 0, 0.2, 0.5, 1, 2];
    const o = { bandwidth: 0.6, kernel: 'triangular' as const };
    const [one, zero] = complierCdfArms(d.score, d.treated, d.outcome, 0, at, [1, 0], o);
    expect(one).toEqual(complierCdf(d.score, d.treated, d.outcome, 0, at, 1, o));
    expect(zero).toEqual(complierCdf(d.score, d.treated, d.outcome, 0, at, 0, o));
    expect(one.cdf).not.toEqual(zero.cdf);
  }
});
