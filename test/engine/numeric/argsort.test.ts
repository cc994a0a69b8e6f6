// The bucket argsort against its definition: positions ordered by (value, position), as a
// stable comparison sort gives them, on random arrays with many ties, a heavy mass point (a
// bucket sorted by comparison), a constant column and subsets of positions.
import fc from 'fast-check';
import { argsortBy, argsortWithValues } from '../../../src/engine/numeric/argsort';

const byDefinition = (values: ArrayLike<number>, idx: Int32Array): number[] =>
  Array.from(idx).sort((a, b) => values[a] - values[b] || Array.from(idx).indexOf(a) - Array.from(idx).indexOf(b));

test('argsortBy orders positions by value, ties in the order given; argsortWithValues carries the values', () => {
  fc.assert(
    fc.property(fc.array(fc.integer({ min: -30, max: 30 }), { minLength: 0, maxLength: 300 }), fc.boolean(), (xs, reversed) => {
      const values = Float64Array.from(xs, (x) => x / 7);
      const idx = Int32Array.from(xs.map((_, i) => i));
      if (reversed) idx.reverse();
      const want = byDefinition(values, idx);
      expect(Array.from(argsortBy(values, idx))).toEqual(want);
      const { order, sorted } = argsortWithValues(values, idx);
      expect(Array.from(order)).toEqual(want);
      expect(Array.from(sorted)).toEqual(want.map((i) => values[i]));
    }),
  );
});

test('a mass point holding most units, a constant column and a single unit', () => {
  const values = Float64Array.from({ length: 2000 }, (_, i) => (i % 10 === 0 ? i / 100 : 5));
  const idx = Int32Array.from({ length: 2000 }, (_, i) => i);
  expect(Array.from(argsortBy(values, idx))).toEqual(byDefinition(values, idx));
  expect(Array.from(argsortBy(Float64Array.of(2, 2, 2), Int32Array.of(2, 0, 1)))).toEqual([2, 0, 1]);
  expect(Array.from(argsortWithValues(Float64Array.of(4), Int32Array.of(0)).sorted)).toEqual([4]);
});
