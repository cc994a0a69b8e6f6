import fixtures from '../../fixtures/density/density_fixtures.json';
import { densityKernelConstants, localPolynomialDensityTest } from '../../../src/engine/density/densityLocalPolynomial';
import { CutlineError } from '../../../src/engine/errors';
import { betaMixture } from '../../helpers/densityMixture';

describe('localPolynomialDensityTest', () => {
  it('slopes equal numpy.polyfit of the ECDF on each side (test/fixtures/density, NumPy)', () => {
    const ref = fixtures.local_polynomial;
    const m = localPolynomialDensityTest(fixtures.score, fixtures.cutoff, { bandwidth: ref.bandwidth });
    expect(m.density_above).toBeCloseTo(ref.density_above, 9);
    expect(m.density_below).toBeCloseTo(ref.density_below, 9);
    expect(m.log_ratio).toBeCloseTo(Math.log(ref.density_above / ref.density_below), 9);
    // The robust intervals are centred at the cubic fits' slopes.
    expect((m.ci_above[0] + m.ci_above[1]) / 2).toBeCloseTo(ref.cubic_above, 9);
    expect((m.ci_below[0] + m.ci_below[1]) / 2).toBeCloseTo(ref.cubic_below, 9);
  });

  it('kernel constants of the bandwidth rule equal scipy.integrate.quad quadrature (test/fixtures/density)', () => {
    const { B, V } = densityKernelConstants(2);
    expect(B).toBeCloseTo(fixtures.kernel_constants.B, 9);
    expect(V).toBeCloseTo(fixtures.kernel_constants.V, 8);
  });

  it('log ratio converges to the true ln(1.5) of a closed-form mixture as n grows', () => {
    const truth = Math.log(0.6 / 0.4);
    const res = [1e4, 1e5, 1e6].map((n) => localPolynomialDensityTest(betaMixture(n, 0.4, 11), 0));
    for (const m of res) expect(Math.abs(m.log_ratio - truth)).toBeLessThan(3 * m.se);
    const last = res[2];
    expect(Math.abs(last.log_ratio - truth)).toBeLessThan(0.02);
    expect(last.se).toBeLessThan(res[0].se / 4);
    expect(last.ci_above[0]).toBeLessThan(1.8);
    expect(last.ci_above[1]).toBeGreaterThan(1.8);
    expect(last.ci_below[0]).toBeLessThan(1.2);
    expect(last.ci_below[1]).toBeGreaterThan(1.2);
    expect(last.pvalue).toBeLessThan(1e-10);
  });

  it('eligibility below flips the log ratio and the statistic, keeps p', () => {
    const r = betaMixture(5000, 0.4, 3);
    const a = localPolynomialDensityTest(r, 0);
    const b = localPolynomialDensityTest(r, 0, { sign: -1 });
    expect(b.log_ratio).toBeCloseTo(-a.log_ratio, 14);
    expect(b.statistic).toBeCloseTo(-a.statistic, 14);
    expect(b.pvalue).toBe(a.pvalue);
  });

  it('bad inputs: a side with no units, too few distinct scores, constant score; heaped score warns', () => {
    const r = betaMixture(2000, 0.5, 5);
    expect(() => localPolynomialDensityTest(r, -2)).toThrow(/at least 1 unit below the cutoff; the data hold 0/);
    expect(() => localPolynomialDensityTest(r, 0, { bandwidth: 0.0005 })).toThrow(/at least 5 distinct scores/);
    expect(() => localPolynomialDensityTest(new Float64Array(9).fill(1), 1)).toThrow(CutlineError);
    const heaped = betaMixture(20000, 0.5, 6).map((v) => Math.round(v * 40) / 40);
    const m = localPolynomialDensityTest(heaped, 0, { bandwidth: 0.3 });
    expect(m.warnings.join(' ')).toMatch(/few distinct values near the cutoff/);
  });
});
