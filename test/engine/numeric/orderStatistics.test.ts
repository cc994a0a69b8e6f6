// The multi-rank quickselect and the binary searches against the plain definition (a full sort,
// a linear scan) on random arrays with many ties: not an outside library, the definition itself.
import fc from 'fast-check';
import { orderStatistics } from '../../../src/engine/numeric/orderStatistics';
import { firstAtLeast, searchSorted } from '../../../src/engine/numeric/binarySearch';

test('orderStatistics gives the sorted array at every asked rank', () => {
  fc.assert(
    fc.property(fc.array(fc.integer({ min: -20, max: 20 }), { minLength: 1, maxLength: 400 }), fc.array(fc.nat(), { minLength: 1, maxLength: 30 }), (xs, rs) => {
      const sorted = Float64Array.from(xs).sort();
      const ranks = rs.map((r) => r % xs.length);
      expect(orderStatistics(Float64Array.from(xs), ranks)).toEqual(ranks.map((k) => sorted[k]));
    }),
  );
  expect(orderStatistics(Float64Array.of(5, 1, 4, 2, 3), [4, 0])).toEqual([5, 1]);
  expect(() => orderStatistics(Float64Array.of(1, 2), [2])).toThrow(RangeError);
});

test('searchSorted and firstAtLeast find the first position at or above (or above) a value', () => {
  fc.assert(
    fc.property(fc.array(fc.integer({ min: -5, max: 5 })), fc.integer({ min: -6, max: 6 }), fc.boolean(), (xs, v, strict) => {
      const a = Float64Array.from(xs).sort();
      let want = a.findIndex((s) => (strict ? s > v : s >= v));
      if (want < 0) want = a.length;
      expect(searchSorted(a, v, strict)).toBe(want);
      expect(firstAtLeast((t) => a[t], 0, a.length, v, strict)).toBe(want);
    }),
  );
});
