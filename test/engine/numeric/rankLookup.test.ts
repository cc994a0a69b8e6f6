// The bucket table against the binary search it replaces (the definition: the number of array
// values below v), on random sorted arrays with ties, values on and between the array's entries,
// outside its range, and a range that leaves every bucket to the search.
import fc from 'fast-check';
import { rankLookup, rankOf } from '../../../src/engine/numeric/rankLookup';
import { searchSorted } from '../../../src/engine/numeric/binarySearch';

test('rankOf gives searchSorted(sorted, v, false) for every v', () => {
  fc.assert(
    fc.property(
      fc.array(fc.double({ min: -50, max: 50, noNaN: true }), { minLength: 1, maxLength: 40 }),
      fc.array(fc.double({ min: -60, max: 60, noNaN: true }), { minLength: 1, maxLength: 200 }),
      (xs, vs) => {
        const sorted = Float64Array.from(xs).sort();
        const l = rankLookup(sorted, sorted[0], sorted[sorted.length - 1]);
        for (const v of [...vs, ...xs, ...xs.map((x) => x + 1e-12), ...xs.map((x) => x - 1e-12)]) {
          expect(rankOf(l, v)).toBe(searchSorted(sorted, v, false));
        }
      },
    ),
  );
});

test('a wider range than the array, a single value and a many-valued range give the same ranks', () => {
  const sorted = Float64Array.of(-1, 0, 0, 0.25, 3);
  const wide = rankLookup(sorted, -10, 10);
  const flat = rankLookup(Float64Array.of(2), 2, 2);
  for (const v of [-11, -1, -0.5, 0, 1e-300, 0.25, 2.9, 3, 3.1, 10, 11]) {
    expect(rankOf(wide, v)).toBe(searchSorted(sorted, v, false));
    expect(rankOf(flat, v)).toBe(searchSorted(Float64Array.of(2), v, false));
  }
  expect(rankOf(wide, 0.1)).toBe(3);
});
