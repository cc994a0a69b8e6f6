/**
 * Exactness of the validity test's moments (METHODS.md §4): the prefix-sum
 * engine against the dense units × intervals implementation of
 * test/validityDense.ts (a second implementation written from the definitions),
 * on continuous, discrete, binary and heavily tied outcomes, both signs.
 */
import { boundaryWindow } from '../../../src/engine/fit/boundaryWindow';
import { intervalClass } from '../../../src/engine/validity/intervalClass';
import { validityMoments } from '../../../src/engine/validity/validityMoments';
import { ranTest } from '../../helpers/validityRan';
import { denseValidity, simulate } from '../../helpers/validityDense';

const close = (a: number, b: number, tol = 1e-9): boolean => Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));

describe.each([
  ['continuous', 'triangular', 30, 1],
  ['discrete', 'epanechnikov', 30, 1],
  ['binary', 'uniform', 30, 1],
  ['ties', 'triangular', 30, 1],
  ['continuous', 'triangular', 7, -1],
] as const)('%s outcome, %s kernel, grid %d, sign %d', (kind, kernel, grid, sign) => {
  const d = simulate(1500, 11, kind);
  const h = 0.45;
  const dense = denseValidity(d.score, d.treated, d.outcome, 0, h, kernel, grid, 0.1, sign);
  const win = boundaryWindow(d.score, 0, h, kernel, { quadratic: false });
  const ys = [...win.above.index, ...win.below.index].map((i) => d.outcome[i]);
  const cls = intervalClass(ys, grid);
  const m = validityMoments(win, cls, d.treated, d.outcome, 0.1, sign);

  test('same interval class and order', () => {
    expect(m.count).toBe(dense.moments.length);
    dense.moments.forEach((dm, l) => {
      expect([m.arm[l], m.first[l], m.last[l]]).toEqual([dm.arm, dm.first, dm.last]);
    });
    if (kind === 'ties') expect(cls.bins).toBeLessThan(30); // ties dropped empty bins
    if (kind === 'binary') expect(cls.bins).toBe(2);
  });

  test('every estimate, se and t agree to 1e-9', () => {
    let bad = 0;
    dense.moments.forEach((dm, l) => {
      if (!close(m.estimate[l], dm.estimate) || !close(m.se[l], dm.se) || !close(m.t[l], dm.t)) bad++;
    });
    expect(bad).toBe(0);
    expect(m.floor).toBeCloseTo(dense.floor, 12);
  });

  test('the statistic agrees', () => {
    const r = ranTest(d.score, d.treated, d.outcome, 0, { bandwidth: h, kernel, grid, sign, draws: 19 });
    expect(close(r.statistic, dense.T)).toBe(true);
    expect(r.intervals).toBe(dense.moments.length);
    expect(r.counts.above + r.counts.below).toBe(dense.rows.length);
  });
});

test('worst interval is reported by its smallest and largest window outcomes, earliest on ties', () => {
  // Binary outcome, one value per bin: the worst interval's ends are 0 or 1.
  const d = simulate(800, 3, 'binary');
  const r = ranTest(d.score, d.treated, d.outcome, 0, { bandwidth: 0.5, kernel: 'triangular', draws: 9 });
  const dense = denseValidity(d.score, d.treated, d.outcome, 0, 0.5, 'triangular', 30, 0.1);
  const l = dense.moments.findIndex((m) => m.t === Math.max(...dense.moments.map((x) => x.t)));
  const dm = dense.moments[l];
  expect(r.worst.arm).toBe(dm.arm);
  expect([r.worst.from, r.worst.to]).toEqual([dm.first, dm.last]); // bins {0}, {1}
});
