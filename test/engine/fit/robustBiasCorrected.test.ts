/**
 * Robust bias-corrected results (docs/methods.md §2.5; Calonico, Cattaneo & Titiunik
 * 2014) — estimate, se, interval and p-value of the jump, the take-up jump and
 * the complier effect — under hc0, hc1 and cluster, against R.
 * Source: test/fixtures/robust/make_robust.R (stats::lm + sandwich). R reaches
 * the corrected estimate by another route than the engine: with pilot b = h
 * it is the intercept of the local quadratic fit on the same window, so R fits
 * lm(v ~ x + I(x²), weights = k) per side and takes its intercept variance from
 * sandwich::vcovHC HC0 / HC1 (HC1 = n_s/(n_s − 3), k = 3 parameters), and the
 * cluster variance from vcovCL(type = "HC0", cadjust = TRUE) (G/(G − 1)) on the
 * joint fit. The effect's robust delta-method variance uses the Y–D covariance
 * of the stacked fit (vcovCL on the unit id, or on the cluster id).
 */
import { boundaryWindow } from '../../../src/engine/fit/boundaryWindow';
import { Estimate } from '../../../src/engine/fit/estimate';
import { estimatesAtCutoff } from '../../../src/engine/fit/estimatesAtCutoff';
import { KernelName } from '../../../src/engine/fit/kernels';
import { VarianceName } from '../../../src/engine/fit/residuals';
import { readCsv, rel } from '../../fixtures/estimates/readFixture';
import { readFileSync } from 'fs';
import { join } from 'path';

interface Summ {
  estimate: number;
  se: number;
  ci: [number, number];
  pvalue: number;
}
interface Delta {
  jump: Summ;
  takeup: Summ;
  cov_yd: number;
  effect: Summ;
  clusters?: number;
}
interface Case {
  name: string;
  column: string;
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

const cases = JSON.parse(readFileSync(join(__dirname, '../../fixtures/robust/robust.json'), 'utf8')) as Case[];
const data = readCsv('data_a.csv');
const TOL = 1e-9;
let worst = 0;
function expectRel(a: number, b: number): void {
  // p-values near 1 and estimates near 0: compare on the scale of 1 as well.
  const r = Math.min(rel(a, b), Math.abs(a - b));
  worst = Math.max(worst, r);
  expect(r).toBeLessThanOrEqual(TOL);
}
function expectRobust(got: Estimate, ref: Summ, sign: 1 | -1): void {
  expectRel(got.estimate_robust, sign * ref.estimate);
  expectRel(got.se_robust, ref.se);
  const ci = sign === 1 ? ref.ci : ([-ref.ci[1], -ref.ci[0]] as const);
  expectRel(got.ci_robust[0], ci[0]);
  expectRel(got.ci_robust[1], ci[1]);
  expectRel(got.pvalue, ref.pvalue);
}

const variants: [keyof Case & string, VarianceName, Float64Array | undefined][] = [
  ['hc0', 'hc0', undefined],
  ['hc1', 'hc1', undefined],
  ['cluster_random', 'cluster', data.cluster_random],
  ['cluster_block', 'cluster', data.cluster_block],
];

describe.each(cases.map((c) => [c.name, c] as const))('robust bias-corrected vs R lm (local quadratic) + sandwich: %s', (_n, c) => {
  const win = boundaryWindow(data.score, c.cutoff, c.bandwidth, c.kernel);
  test('window counts', () => {
    expect(win.above.index.length).toBe(c.n_above);
    expect(win.below.index.length).toBe(c.n_below);
  });
  test.each(variants)('%s: jump, take-up jump and effect (sandwich vcovHC / vcovCL, delta method)', (key, variance, cl) => {
    const ref = c[key] as Delta;
    const clusters = cl ? Int32Array.from(cl) : undefined;
    for (const sign of [1, -1] as const) {
      // sign −1: eligibility below the cutoff, every jump reported as below − above.
      const est = estimatesAtCutoff(data.score, data.treated, data[c.column], c.cutoff, {
        bandwidth: c.bandwidth,
        kernel: c.kernel,
        variance,
        clusters,
        sign,
        window: win,
      });
      expectRobust(est.jump, ref.jump, sign);
      expectRobust(est.takeup, ref.takeup, sign);
      // the ratio does not change sign with the side of eligibility
      expectRel(est.effect.estimate_robust, ref.effect.estimate);
      expectRel(est.effect.se_robust, ref.effect.se);
      expectRel(est.effect.ci_robust[0], ref.effect.ci[0]);
      expectRel(est.effect.ci_robust[1], ref.effect.ci[1]);
      expectRel(est.effect.pvalue, ref.effect.pvalue);
    }
  });
});

test('the checks can fail: hc1 differs from hc0, and the Y–D covariance moves the effect se', () => {
  const c = cases[0];
  expect(rel(c.hc1.jump.se, c.hc0.jump.se)).toBeGreaterThan(1e-3);
  const moved = cases.map(({ hc0: r }) => {
    const noCov = Math.sqrt((r.jump.se ** 2 + r.effect.estimate ** 2 * r.takeup.se ** 2) / r.takeup.estimate ** 2);
    return rel(noCov, r.effect.se);
  });
  expect(Math.max(...moved)).toBeGreaterThan(1e-3);
});

afterAll(() => console.log(`robustBiasCorrected: worst difference vs R = ${worst.toExponential(2)}`));
