/**
 * The validity test's inference — κ_n, B_n, moment selection, trimming floor,
 * statistic, critical value, p-value, worst interval — against an independent
 * dense NumPy reference written from the method's description (Arai, Hsu,
 * Kitagawa, Mourifié & Wan 2022; Andrews & Shi 2013): source
 * test/fixtures/validity_reference/make_reference.py (numpy.linalg.lstsq per
 * indicator and side, unit-level influence matrix Ψ, draws ν* = Ψ′U with the
 * multipliers built from the same random numbers as the engine's, whose
 * generator the script re-implements from Blackman & Vigna 2018).
 * The statistic agrees to 1e-12; p-values and critical values with the same
 * draws agree exactly (the script records how far the nearest draw lies from
 * T, so an exact tie cannot hide behind rounding).
 */
import { readFileSync } from 'fs';
import { join } from 'path';
import { Random } from '../../../src/engine/numeric/random';
import { ranTest } from '../../helpers/validityRan';
import { MultiplierName } from '../../../src/engine/validity/validityBootstrap';

interface Case {
  name: string;
  score: number[];
  treated: number[];
  outcome: number[];
  bandwidth: number;
  grid: number;
  trim: number;
  sign: 1 | -1;
  draws: number;
  seed: number;
  multiplier: MultiplierName;
  n: number;
  intervals: number;
  kappa: number;
  statistic: number;
  worst: { arm: 0 | 1; from: number; to: number };
  pvalue: number;
  critical_value: number;
  draw_margin: number;
  pvalue_no_selection: number;
  pvalue_Bn_infinite: number;
}
const fx = JSON.parse(readFileSync(join(__dirname, '../../fixtures/validity_reference/reference.json'), 'utf8')) as {
  stream: { seed: number; uint32: number[]; normal: number[] };
  cases: Case[];
};

test('the p-value checks pin κ_n and B_n: with the same draws, no selection or B_n = ∞ would change some p-values', () => {
  expect(fx.cases.filter((c) => c.pvalue_no_selection !== c.pvalue).length).toBeGreaterThanOrEqual(4);
  expect(fx.cases.filter((c) => c.pvalue_Bn_infinite !== c.pvalue).length).toBeGreaterThanOrEqual(3);
});

test('the engine random stream equals the reference re-implementation (xoshiro128**, splitmix32, Box–Muller)', () => {
  const a = new Random(fx.stream.seed);
  expect(fx.stream.uint32.map(() => a.nextUint32())).toEqual(fx.stream.uint32);
  const b = new Random(fx.stream.seed);
  fx.stream.normal.forEach((v) => expect(Math.abs(b.normal() - v)).toBeLessThanOrEqual(1e-15 * Math.max(1, Math.abs(v))));
});

describe.each(fx.cases.map((c) => [c.name, c] as const))('validity test vs dense NumPy reference: %s', (_n, c) => {
  const got = ranTest(c.score, c.treated, c.outcome, 0, {
    bandwidth: c.bandwidth,
    kernel: 'triangular',
    grid: c.grid,
    trim: c.trim,
    sign: c.sign,
    draws: c.draws,
    seed: c.seed,
    multiplier: c.multiplier,
  });
  test('κ_n, interval count, statistic and worst interval', () => {
    expect(Math.abs(got.kappa - c.kappa)).toBeLessThanOrEqual(1e-15);
    expect(got.intervals).toBe(c.intervals);
    expect(Math.abs(got.statistic - c.statistic)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(c.statistic)));
    expect(got.worst.arm).toBe(c.worst.arm);
    expect(got.worst.from).toBe(c.worst.from);
    expect(got.worst.to).toBe(c.worst.to);
  });
  test('p-value and 5% critical value with the same draws (exact)', () => {
    expect(c.draw_margin).toBeGreaterThan(1e-9); // no draw within rounding of T: the count is exact
    expect(got.pvalue).toBe(c.pvalue);
    expect(Math.abs(got.critical_value - c.critical_value)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(c.critical_value)));
  });
});
