import fixtures from '../../fixtures/density/density_fixtures.json';
import { mccraryTest } from '../../../src/engine/density/densityMcCrary';
import { CutlineError } from '../../../src/engine/errors';
import { betaMixture } from '../../helpers/densityMixture';

describe('mccraryTest', () => {
  it('matches numpy.polyfit applied to the same bins and heights (test/fixtures/density, NumPy)', () => {
    const m = mccraryTest(fixtures.score, fixtures.cutoff);
    const ref = fixtures.mccrary;
    expect(m.bin).toBeCloseTo(ref.bin, 12);
    expect(m.bandwidth).toBeCloseTo(ref.bandwidth, 8);
    expect(m.density_above).toBeCloseTo(ref.density_above, 9);
    expect(m.density_below).toBeCloseTo(ref.density_below, 9);
    expect(m.log_ratio).toBeCloseTo(ref.log_ratio, 9);
    expect(m.se).toBeCloseTo(ref.se, 9);
  });

  it('log ratio converges to the true ln(1.5) of a closed-form mixture as n grows', () => {
    const truth = Math.log(0.6 / 0.4);
    const res = [1e4, 1e5, 1e6].map((n) => mccraryTest(betaMixture(n, 0.4, 11), 0));
    for (const m of res) expect(Math.abs(m.log_ratio - truth)).toBeLessThan(3 * m.se);
    const last = res[2];
    expect(Math.abs(last.log_ratio - truth)).toBeLessThan(0.02);
    expect(last.density_above).toBeCloseTo(1.8, 1);
    expect(last.density_below).toBeCloseTo(1.2, 1);
    expect(last.se).toBeLessThan(res[0].se / 5);
    expect(last.pvalue).toBeLessThan(1e-10);
  });

  it('eligibility below flips the log ratio and keeps p', () => {
    const r = betaMixture(5000, 0.4, 3);
    const a = mccraryTest(r, 0);
    const b = mccraryTest(r, 0, { sign: -1 });
    expect(b.log_ratio).toBeCloseTo(-a.log_ratio, 14);
    expect(b.pvalue).toBe(a.pvalue);
  });

  it('uses a given bin and bandwidth', () => {
    const m = mccraryTest(betaMixture(5000, 0.5, 4), 0, { bin: 0.01, bandwidth: 0.3 });
    expect(m.bin).toBe(0.01);
    expect(m.bandwidth).toBe(0.3);
    expect(m.bins_above).toBe(30);
  });

  it('bad inputs: bin wider than the score range, a side with no units, constant score, tiny bandwidth', () => {
    const r = betaMixture(2000, 0.5, 5);
    expect(() => mccraryTest(r, 0, { bin: 5 })).toThrow(/bin width 5 is larger than the range of the score/);
    expect(() => mccraryTest(r, 0, { bin: 5 })).toThrow(CutlineError);
    expect(() => mccraryTest(r, 2)).toThrow(/at least 1 unit above the cutoff; the data hold 0/);
    expect(() => mccraryTest(new Float64Array(50).fill(3), 3)).toThrow(CutlineError);
    expect(() => mccraryTest(r, 0, { bandwidth: 0.01 })).toThrow(/holds \d bins? (below|above) the cutoff; at least 3/);
    expect(() => mccraryTest(r, 0, { bandwidth: -1 })).toThrow(/positive number/);
    expect(() => mccraryTest([0.1, NaN, -0.2], 0)).toThrow(/row 2/);
  });

  it('warns about a heaped (rounded) score', () => {
    const r = betaMixture(20000, 0.5, 6).map((v) => Math.round(v * 20) / 20);
    const m = mccraryTest(r, 0, { bin: 0.05, bandwidth: 0.4 });
    expect(m.warnings.join(' ')).toMatch(/few distinct values near the cutoff/);
  });
});
