/**
 * Boundary kernel constants (bandwidthConstants.ts, Fan & Gijbels 1996 §3.2.4).
 * Sources: Imbens & Kalyanaraman (2012) C_K = 3.4375 for the triangular kernel,
 * ν = 0, p = 1, as given in METHODS.md §3; IK's pilot constant 3.56 for the
 * second derivative by a uniform-kernel local quadratic (recalled from memory);
 * and every (kernel, p, ν) against stats::integrate in R
 * (test/fixtures/estimates/make_fixtures.R, kernel_constants.json).
 */
import { boundaryConstants } from '../../../src/engine/bandwidth/bandwidthConstants';
import { KernelName, kernelMoment } from '../../../src/engine/fit/kernels';
import { readJson, rel } from '../../fixtures/estimates/readFixture';

test('triangular, ν = 0, p = 1: C_K = 3.4375 (Imbens & Kalyanaraman 2012, via METHODS.md §3), to the digits given', () => {
  const c = boundaryConstants('triangular', 1, 0);
  expect(Math.abs(c.constant - 3.4375)).toBeLessThan(0.5e-4);
  // In closed form (hand derivation): B = −1/10, V = 24/5, C = 480^(1/5) = 3.43754…
  expect(c.bias).toBeCloseTo(-0.1, 14);
  expect(c.variance).toBeCloseTo(4.8, 12);
  expect(rel(c.constant, Math.pow(480, 0.2))).toBeLessThan(1e-14);
});

test('uniform, local quadratic, second derivative (ν = 2, p = 2): ≈ 3.56, IK\'s h₂ constant (recalled from memory)', () => {
  const c = boundaryConstants('uniform', 2, 2);
  expect(Math.abs(c.constant - 3.56)).toBeLessThan(0.5e-2);
});

interface Ref {
  kernel: KernelName;
  p: number;
  nu: number;
  bias: number;
  variance: number;
  constant: number;
}
const refs = readJson<Ref[]>('kernel_constants.json');

describe('bias, variance and constant vs R (moments by stats::integrate, rel.tol 1e-13)', () => {
  test.each(refs.map((r) => [r.kernel, r.p, r.nu, r] as const))('%s, p = %d, ν = %d', (k, p, nu, r) => {
    const c = boundaryConstants(k, p, nu);
    expect(rel(c.bias, r.bias)).toBeLessThan(1e-9);
    expect(rel(c.variance, r.variance)).toBeLessThan(1e-9);
    expect(rel(c.constant, r.constant)).toBeLessThan(1e-9);
  });
});

test('closed-form kernel moments match a midpoint-rule integral (kernels.ts)', () => {
  const M = 200000;
  for (const k of ['triangular', 'epanechnikov', 'uniform'] as KernelName[]) {
    const K = (u: number): number => (k === 'uniform' ? 0.5 : k === 'triangular' ? 1 - u : 0.75 * (1 - u * u));
    for (let j = 0; j <= 6; j++) {
      let a = 0;
      let b = 0;
      for (let i = 0; i < M; i++) {
        const u = (i + 0.5) / M;
        a += K(u) * u ** j;
        b += K(u) ** 2 * u ** j;
      }
      expect(rel(kernelMoment(k, j), a / M)).toBeLessThan(1e-8);
      expect(rel(kernelMoment(k, j, true), b / M)).toBeLessThan(1e-8);
    }
  }
});
