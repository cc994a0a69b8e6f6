/**
 * The fuzzy ratio τ(Y)/τ(D) and its delta-method standard error (METHODS.md §2)
 * against R. Source: test/fixtures/estimates/make_fixtures.R, which stacks the
 * Y and D rows of the window, fits the four side lines in one stats::lm with
 * weights k, takes the covariance of the four intercepts from
 * sandwich::vcovCL(type = "HC0") — clustered on the unit id without cadjust for
 * hc0 (so each unit's Y–D cross product enters), hc0 scaled per side by
 * n_s/(n_s − 2) for hc1, and clustered on the real cluster id with cadjust
 * (G/(G−1)) for `cluster` — and applies
 * Var = [Var τY − 2τ̂ Cov(τY, τD) + τ̂² Var τD]/τD² in R.
 */
import { boundaryWindow } from '../../../src/engine/fit/boundaryWindow';
import { effectAt, jumpAt } from '../../../src/engine/fit/jumpAt';
import { KernelName } from '../../../src/engine/fit/kernels';
import { VarianceName } from '../../../src/engine/fit/residuals';
import { readCsv, readJson, rel } from '../../fixtures/estimates/readFixture';

interface Delta {
  tau_y: number;
  tau_d: number;
  effect: number;
  var_y: number;
  var_d: number;
  cov_yd: number;
  se: number;
}
interface Case {
  name: string;
  cutoff: number;
  bandwidth: number;
  kernel: KernelName;
  n_above: number;
  n_below: number;
  hc0: Delta;
  hc1: Delta;
  cluster_random: Delta;
  cluster_block: Delta;
}

const TOL = 1e-8;
const data = readCsv('data_a.csv');
const cases = readJson<Case[]>('fuzzy_delta.json');
let worst = 0;
function expectRel(a: number, b: number): void {
  worst = Math.max(worst, rel(a, b));
  expect(rel(a, b)).toBeLessThanOrEqual(TOL);
}

const variants: [keyof Case & string, VarianceName, Float64Array | undefined][] = [
  ['hc0', 'hc0', undefined],
  ['hc1', 'hc1', undefined],
  ['cluster_random', 'cluster', data.cluster_random],
  ['cluster_block', 'cluster', data.cluster_block],
];

describe.each(cases.map((c) => [c.name, c] as const))('fuzzy effect vs R stacked lm + sandwich: %s', (_n, c) => {
  const win = boundaryWindow(data.score, c.cutoff, c.bandwidth, c.kernel);
  test('window counts', () => {
    expect(win.above.index.length).toBe(c.n_above);
    expect(win.below.index.length).toBe(c.n_below);
  });
  test.each(variants)('%s: ratio and delta-method se (R: METHODS §2 formula on vcovCL covariances)', (key, variance, cl) => {
    const ref = c[key] as Delta;
    const opts = { variance, clusters: cl ? Int32Array.from(cl) : undefined };
    const eff = effectAt(win, data.outcome, data.treated, opts);
    const y = jumpAt(win, data.outcome, opts);
    const d = jumpAt(win, data.treated, opts);
    expectRel(y.estimate, ref.tau_y);
    expectRel(d.estimate, ref.tau_d);
    expectRel(eff.estimate, ref.effect);
    expectRel(y.se ** 2, ref.var_y);
    expectRel(d.se ** 2, ref.var_d);
    expectRel(eff.se, ref.se);
  });
});

test('the Y–D covariance matters: dropping it changes the se (so the check above is not vacuous)', () => {
  const c = cases[0];
  const r = c.hc0;
  const noCov = Math.sqrt((r.var_y + r.effect ** 2 * r.var_d) / r.tau_d ** 2);
  expect(rel(noCov, r.se)).toBeGreaterThan(1e-3);
});

afterAll(() => console.log(`fuzzyDelta: worst relative difference vs R = ${worst.toExponential(2)}`));
