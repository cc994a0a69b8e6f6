/**
 * The trend guard's outcomes (docs/methods.md §4.8): properties that follow from the
 * definition (no outside source needed) — a quadratic trend per side is removed
 * exactly, the removed function is 0 at the cutoff, only the rows used enter
 * the fit, and sides with too few distinct scores fall back to a lower degree.
 */
import { trendRemoved } from '../../../src/engine/validity/trendRemoved';

test('a quadratic per side is removed exactly, leaving each side\'s level at the cutoff', () => {
  const score = Array.from({ length: 41 }, (_, i) => 40 + i); // 40..80, cutoff 60
  const y = score.map((s) => (s >= 60 ? 500 + 4 * (s - 60) - 0.1 * (s - 60) ** 2 : 480 - 2 * (s - 60) + 0.3 * (s - 60) ** 2));
  const t = trendRemoved(score, y, 60);
  score.forEach((s, i) => expect(t.values[i]).toBeCloseTo(s >= 60 ? 500 : 480, 8));
  expect(t.above.slope).toBeCloseTo(4, 10);
  expect(t.above.curvature).toBeCloseTo(-0.1, 10);
  expect(t.below.slope).toBeCloseTo(-2, 10);
  expect(t.below.curvature).toBeCloseTo(0.3, 10);
  expect([t.below.units, t.above.units]).toEqual([20, 21]);
});

test('units at the cutoff keep their outcome (the removed function is 0 there), and the input is not written to', () => {
  const score = Float64Array.of(-3, -2, -1, -0.5, 0, 0, 1, 2, 3, 4);
  const y = Float64Array.of(5, 1, 7, 2, 9, 4, 8, 3, 6, 0);
  const copy = Float64Array.from(y);
  const t = trendRemoved(score, y, 0);
  expect(t.values[4]).toBe(9);
  expect(t.values[5]).toBe(4);
  expect(y).toEqual(copy);
});

test('only the rows used enter the fit; other rows keep their outcome', () => {
  const score = [-2, -1.5, -1, -0.5, 0.5, 1, 1.5, 2, -0.1, 0.1];
  const y = [4, 2.25, 1, 0.25, 0.25, 1, 2.25, 4, 100, -100]; // x² except two outliers near the cutoff
  const rows = Int32Array.of(0, 1, 2, 3, 4, 5, 6, 7); // a donut leaves the last two out
  const t = trendRemoved(score, y, 0, rows);
  for (let i = 0; i < 8; i++) expect(t.values[i]).toBeCloseTo(0, 10);
  expect([t.values[8], t.values[9]]).toEqual([100, -100]);
});

test('sides with 2 or 1 distinct scores fit a line or nothing, and say so in degree', () => {
  const t = trendRemoved([-2, -2, -1, -1, 1, 1, 1], [3, 5, 1, 3, 7, 8, 9], 0);
  expect(t.below.degree).toBe(1);
  expect(t.below.slope).toBeCloseTo(-2, 12); // means 4 at −2 and 2 at −1
  expect(t.above.degree).toBe(0);
  expect([...t.values.slice(4)]).toEqual([7, 8, 9]);
});

test('scores far from zero and in large units do not spoil the fit (scaled QR)', () => {
  const score = Array.from({ length: 200 }, (_, i) => 1e6 + 1000 * (i - 100) + 0.37 * i);
  const y = score.map((s) => 2e-3 * (s - 1e6) + 1e-9 * (s - 1e6) ** 2 + (s >= 1e6 ? 7 : 3));
  const t = trendRemoved(score, y, 1e6);
  score.forEach((s, i) => expect(t.values[i]).toBeCloseTo(s >= 1e6 ? 7 : 3, 6));
});
