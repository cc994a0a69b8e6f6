// src/functions/cache.ts: the bounded cache drops the least recently used
// entry; the column hash is equal for equal columns and differs when any
// value, missing mark or the length changes.
import { BoundedCache, hashColumn } from '../../src/functions/cache';

test('bounded: the least recently used entry leaves first', () => {
  const c = new BoundedCache<string, number>(2);
  let made = 0;
  const make = (v: number) => () => (made++, v);
  c.get('a', make(1));
  c.get('b', make(2));
  expect(c.get('a', make(9))).toBe(1); // a is now the most recent
  c.get('c', make(3)); // b leaves
  expect(c.size).toBe(2);
  expect(c.peek('b')).toBeUndefined();
  expect(c.peek('a')).toBe(1);
  expect(made).toBe(3);
});

test('hash: equal columns in new arrays give the same key; any change of a value, a missing mark or the length another', () => {
  const v = Float64Array.from([1, 2.5, 0, 0, 7]);
  const m = Uint8Array.from([0, 0, 1, 1, 0]);
  const key = hashColumn(v, m);
  expect(hashColumn(v.slice(), m.slice())).toBe(key);
  const variants: Array<[number[], number[]]> = [
    [[1, 2.5000000000000004, 0, 0, 7], [0, 0, 1, 1, 0]],
    [[1, 2.5, 0, 0, 7], [0, 1, 0, 1, 0]],
    [[1, 2.5, 0, 0, 7], [0, 0, 1, 0, 0]],
    [[-0, 2.5, 0, 0, 7], [0, 0, 1, 1, 0]],
    [[1, 2.5, 0, 0], [0, 0, 1, 1]],
    [[2.5, 1, 0, 0, 7], [0, 0, 1, 1, 0]],
  ];
  const keys = variants.map(([a, b]) => hashColumn(Float64Array.from(a), Uint8Array.from(b)));
  expect(new Set([key, ...keys]).size).toBe(variants.length + 1);
  // A view into a larger buffer hashes its own values only.
  const big = Float64Array.from([9, 1, 2.5, 0, 0, 7, 9]);
  expect(hashColumn(big.subarray(1, 6), m)).toBe(key);
});

test('hash: 100,000 columns that differ in one value give 100,000 keys', () => {
  const v = Float64Array.from({ length: 50 }, (_, i) => i * 0.1);
  const m = new Uint8Array(50);
  const seen = new Set<string>();
  for (let k = 0; k < 100000; k++) {
    const j = k % 50;
    const old = v[j];
    v[j] = 1000 + k;
    seen.add(hashColumn(v, m));
    v[j] = old;
  }
  expect(seen.size).toBe(100000);
});
