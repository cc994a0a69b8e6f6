import fx from '../../fixtures/balance/balance_fixtures.json';
import { binnedMeans, imseEvenBinCount } from '../../../src/engine/plots/binnedMeans';
import { CutlineError } from '../../../src/engine/errors';
import { fitLine } from '../../../src/engine/plots/fitLine';
import { Random } from '../../../src/engine/numeric/random';

describe('binnedMeans', () => {
  it('given counts: bins, means and counts equal NumPy digitize group means (test/fixtures/balance, NumPy)', () => {
    const b = fx.bins;
    const res = binnedMeans(b.score, b.values, b.cutoff, { binsBelow: b.binsBelow, binsAbove: b.binsAbove });
    expect(res.rule).toBe('given');
    expect(res.bins.length).toBe(b.bins.length);
    res.bins.forEach((bin, k) => {
      const ref = b.bins[k];
      expect(bin.side).toBe(ref.side);
      expect(bin.from).toBeCloseTo(ref.from, 10);
      expect(bin.to).toBeCloseTo(ref.to, 10);
      expect(bin.midpoint).toBeCloseTo((ref.from + ref.to) / 2, 10);
      expect(bin.mean).toBeCloseTo(ref.mean, 12);
      expect(bin.count).toBe(ref.count);
    });
  });

  it('data-driven counts: group means equal plain filtering by bin edges; counts add up', () => {
    const rng = new Random(8);
    const n = 3000;
    const r = Array.from({ length: n }, () => rng.uniform() * 2 - 1);
    const y = r.map((v) => Math.sin(3 * v) + (v >= 0 ? 1 : 0) + 0.3 * rng.normal());
    const res = binnedMeans(r, y, 0);
    expect(res.rule).toBe('imse_evenly_spaced');
    expect(res.binsBelow).toBeGreaterThan(3);
    let total = 0;
    for (const bin of res.bins) {
      const last = bin.side === 'above' && bin === res.bins[res.bins.length - 1];
      const inBin = r.map((v, i) => [v, y[i]]).filter(([v]) => v >= bin.from && (last ? v <= bin.to : v < bin.to));
      expect(bin.count).toBe(inBin.length);
      expect(bin.mean).toBeCloseTo(inBin.reduce((s, [, v]) => s + v, 0) / inBin.length, 12);
      total += bin.count;
    }
    expect(total).toBe(n);
  });

  it('IMSE count grows like n^(1/3) and with curvature', () => {
    const rng = new Random(9);
    const make = (n: number, amp: number) => {
      const x = Float64Array.from({ length: n }, () => rng.uniform());
      const y = x.map((v) => amp * v * v + rng.normal());
      return imseEvenBinCount(x, y, 1);
    };
    const j1 = make(8000, 4);
    const j8 = make(64000, 4);
    expect(j8 / j1).toBeGreaterThan(1.6);
    expect(j8 / j1).toBeLessThan(2.4);
    expect(make(8000, 8)).toBeGreaterThan(j1);
  });

  it('bad inputs: a side with no units, bad counts, non-finite values; a constant side gives one bin', () => {

    expect(() => binnedMeans([1, 2, 3], [1, 2, 3], 0)).toThrow(/no units below the cutoff/);
    expect(() => binnedMeans([-1, 2, 3], [1, 2, 3], 0, { binsAbove: 0 })).toThrow(CutlineError);
    expect(() => binnedMeans([-1, 2, 3], [1, NaN, 3], 0)).toThrow(/row 2/);
    const res = binnedMeans([-1, -1, 0, 0], [1, 3, 5, 7], 0);
    expect(res.bins).toEqual([
      // Two units below: the fallback count ⌈2^(1/3)⌉ = 2 bins, the second empty and left out.
      { side: 'below', from: -1, to: -0.5, midpoint: -0.75, mean: 2, count: 2 },
      { side: 'above', from: 0, to: 0, midpoint: 0, mean: 6, count: 2 },
    ]);
  });
});

describe('fitLine', () => {
  it('recovers the lines of noiseless linear data on each side', () => {
    const r = Array.from({ length: 200 }, (_, i) => -1 + i / 100 + 0.003);
    const y = r.map((v) => (v >= 0 ? 2 + 0.5 * v : -1 + 3 * v));
    const f = fitLine(r, y, 0, 0.6);
    expect(f.above.intercept).toBeCloseTo(2, 12);
    expect(f.above.slope).toBeCloseTo(0.5, 12);
    expect(f.below.intercept).toBeCloseTo(-1, 12);
    expect(f.below.slope).toBeCloseTo(3, 12);
    expect([f.below.from, f.below.to, f.above.from, f.above.to]).toEqual([-0.6, 0, 0, 0.6]);
  });
});
