// dot and sum: plain sums in index order; the cases are exact in IEEE doubles (worked by hand), and the last ones show the order.
import { dot, sum } from '../../../src/engine/numeric/dot';

test('dot and sum add in index order (exact small cases; the order shows in floating point)', () => {
  expect(dot(Float64Array.of(0.5, 0.25), Float64Array.of(2, 4))).toBe(2);
  expect(dot([], [])).toBe(0);
  expect(sum(Float64Array.of(1, 0, 1, 1))).toBe(3);
  // (1e16 + 1) + (−1e16) is 0 in doubles; another order would give 1: the sums go in index order.
  expect(sum([1e16, 1, -1e16])).toBe(0);
  expect(dot([1e16, 1, -1e16], [1, 1, 1])).toBe(0);
  expect(sum([1, 1e16, -1e16])).toBe(0);
  expect(sum([1e16, -1e16, 1])).toBe(1);
});
