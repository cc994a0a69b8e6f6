/**
 * The `ik` bandwidth (Imbens & Kalyanaraman 2012; METHODS.md §3, fuzzy reading
 * as in bandwidthIk.ts's doc comment) against an independent step-by-step
 * implementation in R: test/fixtures/estimates/make_fixtures.R, function `ik`
 * (stats::sd/var/cov/median, stats::lm for the step cubic, the side quadratics
 * and the pilot local linear fuzzy ratio; the kernel constant C_K by
 * stats::integrate). Every intermediate is compared to 1e-8 relative.
 */
import { bandwidthIk, IkCurvature, IkSide } from '../../../src/engine/bandwidth/bandwidthIk';
import { chooseBandwidth } from '../../../src/engine/bandwidth/bandwidth';
import { KernelName } from '../../../src/engine/fit/kernels';
import { readCsv, readJson, rel } from '../../fixtures/estimates/readFixture';

interface Case {
  name: string;
  kernel: KernelName;
  fuzzy: boolean;
  h1: number;
  density: number;
  outcome: IkCurvature;
  treated?: IkCurvature & { covBelow: number; covAbove: number; tau: number };
  bandwidth: number;
}

const TOL = 1e-8;
const data = readCsv('data_a.csv');
const CUTOFF = 0.125;
const cases = readJson<Case[]>('bandwidth_ik.json');
let worst = 0;
function expectRel(a: number, b: number): void {
  worst = Math.max(worst, rel(a, b));
  expect(rel(a, b)).toBeLessThanOrEqual(TOL);
}

function expectCurvature(got: IkCurvature, ref: IkCurvature): void {
  expectRel(got.m3, ref.m3);
  for (const s of ['below', 'above'] as const) {
    const g: IkSide = got[s];
    const r: IkSide = ref[s];
    expectRel(g.sigma2, r.sigma2);
    expectRel(g.h2, r.h2);
    expect(g.n2).toBe(r.n2);
    expectRel(g.m2, r.m2);
    expectRel(g.r, r.r);
  }
}

describe.each(cases.map((c) => [c.name, c] as const))('ik bandwidth vs step-by-step R: %s', (_n, c) => {
  const outcome = c.name.includes('binary') ? data.binary : data.outcome;
  const got = bandwidthIk(data.score, outcome, CUTOFF, c.kernel, c.fuzzy ? data.treated : undefined);
  test('pilot h₁ and density f̂', () => {
    expectRel(got.h1, c.h1);
    expectRel(got.density, c.density);
  });
  test('outcome: m̂₃, σ̂²±, h₂±, N₂±, m̂″±, r̂±', () => expectCurvature(got.outcome, c.outcome));
  if (c.fuzzy) {
    test('take-up: m̂₃, σ̂²±, h₂±, N₂±, m̂″±, r̂±; Y–D covariances; pilot ratio τ̃', () => {
      const t = got.treated!;
      const r = c.treated!;
      expectCurvature(t, r);
      expectRel(t.covBelow, r.covBelow);
      expectRel(t.covAbove, r.covAbove);
      expectRel(t.tau, r.tau);
    });
  }
  test('h', () => {
    expectRel(got.bandwidth, c.bandwidth);
    const chosen = chooseBandwidth(data.score, outcome, CUTOFF, {
      rule: 'ik',
      kernel: c.kernel,
      treated: c.fuzzy ? data.treated : undefined,
    });
    expectRel(chosen.value, c.bandwidth);
  });
});

test('ik h scales with the score (score × a, cutoff × a ⇒ h × a) and ignores a shift of the outcome', () => {
  // Derived from the formulas: f̂ ~ 1/a, m̂₃ ~ a⁻³, h₂ ~ a, m̂″ ~ a⁻², r̂ ~ a⁻⁴ ⇒ h ~ a.
  const base = bandwidthIk(data.score, data.outcome, CUTOFF, 'triangular', data.treated).bandwidth;
  for (const a of [0.25, 3, 1000]) {
    const s = data.score.map((v) => v * a);
    expect(rel(bandwidthIk(s, data.outcome, CUTOFF * a, 'triangular', data.treated).bandwidth, a * base)).toBeLessThan(1e-9);
  }
  const y = data.outcome.map((v) => v + 17);
  expect(rel(bandwidthIk(data.score, y, CUTOFF, 'triangular', data.treated).bandwidth, base)).toBeLessThan(1e-9);
});

afterAll(() => console.log(`bandwidthIk: worst relative difference vs R = ${worst.toExponential(2)}`));
