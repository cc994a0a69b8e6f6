/**
 * Small numbers checked against base R (source: test/fixtures/numeric/make_numeric.R):
 * - Holm adjustment vs stats::p.adjust(method = "holm");
 * - Silverman's rule (complier densities) vs stats::bw.nrd0;
 * - the validity test's cut points z_k = Y_(⌈kN/G⌉) vs stats::quantile(type = 1),
 *   and the bins they cut vs findInterval(left.open = TRUE) in R.
 */
import { readFileSync } from 'fs';
import { join } from 'path';
import { silvermanBandwidth } from '../../../src/engine/compliers/complierDistributions';
import { holmAdjust } from '../../../src/engine/numeric/holm';
import { binOf, intervalClass } from '../../../src/engine/validity/intervalClass';

interface Fx {
  holm: { p: number[]; adjusted: number[] }[];
  silverman: { x: number[]; bw: number }[];
  quantile: { y: number[]; grid: number; distinct: number; cuts: number[]; bin_min: number[]; bin_max: number[] }[];
}
const fx = JSON.parse(readFileSync(join(__dirname, '../../fixtures/numeric/numeric.json'), 'utf8')) as Fx;

test.each(fx.holm.map((c, i) => [i, c] as const))('Holm, family %d, vs R p.adjust(method = "holm")', (_i, c) => {
  const got = holmAdjust(c.p);
  got.forEach((v, i) => expect(Math.abs(v - c.adjusted[i])).toBeLessThanOrEqual(1e-15));
});

test.each(fx.silverman.map((c, i) => [i, c.x.length, c] as const))('Silverman, sample %d (n = %d), vs R bw.nrd0', (_i, _n, c) => {
  const got = silvermanBandwidth(c.x);
  expect(Math.abs(got - c.bw) / c.bw).toBeLessThanOrEqual(1e-13);
});

test.each(fx.quantile.map((c, i) => [i, c.y.length, c.grid, c] as const))(
  'interval class %d (N = %d, G = %d): cut points vs R quantile(type = 1), bins vs findInterval',
  (_i, _n, G, c) => {
    expect(c.distinct).toBeGreaterThan(G); // the quantile branch of docs/methods.md §4.3
    const cls = intervalClass(Float64Array.from(c.y), G);
    expect(cls.distinct).toBe(c.distinct);
    expect(cls.bins).toBe(c.bin_min.length);
    // every upper bound of the engine is one of R's type-1 quantiles, in order, without repeats
    const rCuts = [...new Set(c.cuts)];
    expect(Array.from(cls.upper)).toEqual(rCuts.slice(0, cls.bins - 1));
    expect(Array.from(cls.binMin)).toEqual(c.bin_min);
    expect(Array.from(cls.binMax)).toEqual(c.bin_max);
    // each outcome's bin: the engine's binOf vs R's bin of that value (ranked among the non-empty bins)
    c.y.forEach((y) => {
      const b = binOf(cls, y);
      expect(y).toBeGreaterThanOrEqual(c.bin_min[b]);
      expect(y).toBeLessThanOrEqual(c.bin_max[b]);
    });
  },
);
