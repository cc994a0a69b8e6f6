/**
 * Local linear intercepts, slopes and hc0 / hc1 / cluster standard errors
 * (METHODS.md §2) against R. Source of every reference value:
 * test/fixtures/estimates/make_fixtures.R — stats::lm(v ~ x, weights = k) per
 * side, sandwich::vcovHC(type = "HC0"/"HC1") for the intercept variance
 * (sandwich's HC1 n/(n−k) with k = 2 is METHODS' n_s/(n_s − 2)), and
 * sandwich::vcovCL(type = "HC0", cadjust = TRUE) on the joint fit with side
 * interactions for the cluster variance (factor G/(G−1) only; R also checks it
 * against the explicit formula G/(G−1)·Σ_g(Σ ±ω_i ε̂_i)²).
 */
import { applyWeights, boundaryWindow, SideFit } from '../../../src/engine/fit/boundaryWindow';
import { clusterCount } from '../../../src/engine/fit/influence';
import { jumpAt, windowClusters } from '../../../src/engine/fit/jumpAt';
import { KernelName } from '../../../src/engine/fit/kernels';
import { sideResiduals } from '../../../src/engine/fit/residuals';
import { readCsv, readJson, rel } from '../../fixtures/estimates/readFixture';

interface SideRef {
  n: number;
  intercept: number;
  slope: number;
  var_hc0: number;
  var_hc1: number;
  robust: number;
  var_robust_hc0: number;
}
interface Case {
  name: string;
  data: string;
  cutoff: number;
  bandwidth: number;
  kernel: KernelName;
  column: string;
  above: SideRef;
  below: SideRef;
  jump: number;
  se_hc0: number;
  se_hc1: number;
  jump_robust: number;
  se_robust_hc0: number;
  cluster?: Record<string, { se: number; cross_cov: number; clusters: number; spanning: number }>;
}

const cases = readJson<Case[]>('local_linear.json');
const TOL = 1e-8;

function sideVar(side: SideFit, v: Float64Array, variance: 'hc0' | 'hc1'): number {
  const e = sideResiduals(side, v, variance, 1);
  const w = side.coef1[0];
  let s = 0;
  for (let t = 0; t < w.length; t++) s += (w[t] * e[t]) ** 2;
  return s;
}

let worst = 0;
function expectRel(actual: number, reference: number): void {
  const r = rel(actual, reference);
  worst = Math.max(worst, r);
  expect(r).toBeLessThanOrEqual(TOL);
}

describe.each(cases.map((c) => [c.name, c] as const))('local linear vs R lm/sandwich: %s', (_name, c) => {
  const data = readCsv(c.data);
  const v = data[c.column];
  const win = boundaryWindow(data.score, c.cutoff, c.bandwidth, c.kernel);

  test.each([['above'], ['below']] as const)('%s: window count, intercept, slope (R lm weights=k)', (s) => {
    const side = win[s];
    const ref = c[s];
    expect(side.index.length).toBe(ref.n);
    expectRel(applyWeights(side.coef1[0], side.index, v), ref.intercept);
    expectRel(applyWeights(side.coef1[1], side.index, v), ref.slope);
  });

  test.each([['above'], ['below']] as const)('%s: intercept variance hc0/hc1 (sandwich::vcovHC HC0/HC1)', (s) => {
    expectRel(sideVar(win[s], v, 'hc0'), c[s].var_hc0);
    expectRel(sideVar(win[s], v, 'hc1'), c[s].var_hc1);
  });

  test('jump and se = sqrt(Var+ + Var−), hc0 and hc1 (R lm + sandwich::vcovHC)', () => {
    const e0 = jumpAt(win, v, { variance: 'hc0' });
    const e1 = jumpAt(win, v, { variance: 'hc1' });
    expectRel(e0.estimate, c.jump);
    expectRel(e1.estimate, c.jump);
    expectRel(e0.se, c.se_hc0);
    expectRel(e1.se, c.se_hc1);
  });

  test('bias-corrected jump and its hc0 se (direct matrix computation in R: ω − (Σωx²)q₂, lm quadratic residuals)', () => {
    const e0 = jumpAt(win, v, { variance: 'hc0' });
    // The robust jump can be near 0; compare on the scale of its se.
    expect(Math.abs(e0.estimate_robust - c.jump_robust)).toBeLessThanOrEqual(TOL * c.se_robust_hc0);
    expectRel(e0.se_robust, c.se_robust_hc0);
  });

  if (c.cluster) {
    test.each(Object.entries(c.cluster))('cluster se, %s (sandwich::vcovCL HC0, cadjust = TRUE, joint fit)', (col, ref) => {
      const clusters = Int32Array.from(data[col]);
      const est = jumpAt(win, v, { variance: 'cluster', clusters });
      expectRel(est.se, ref.se);
      // Clusters spanning the cutoff: R's cross-side covariance Cov(â₊, â₋) is not 0, so the
      // match above includes the cross term (−2·Cov) of the jump's variance.
      expect(ref.spanning).toBeGreaterThanOrEqual(1);
      expect(Math.abs(2 * ref.cross_cov)).toBeGreaterThan(1e-4 * ref.se ** 2);
      expect(clusterCount(windowClusters(win, clusters)!)).toBe(ref.clusters); // G of the G/(G−1) factor
    });
  }
});

test('the unit exactly at the cutoff counts as above (METHODS §1), as in R', () => {
  const data = readCsv('data_a.csv');
  expect(data.score[0]).toBe(0.125);
  const win = boundaryWindow(data.score, 0.125, 0.5, 'triangular');
  expect(Array.from(win.above.index)).toContain(0);
  expect(Array.from(win.below.index)).not.toContain(0);
});

afterAll(() => {
  // Reported in the run log: the largest relative difference seen against R.
  console.log(`localLinear: worst relative difference vs R = ${worst.toExponential(2)}`);
});
