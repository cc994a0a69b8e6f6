// src/functions/cache.ts: the bounded cache drops the least recently used
// entry; the content hash is equal for equal contents and differs when any
// cell, its type or the shape changes.
import { BoundedCache, hashCells } from '../../src/functions/cache';

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

test('hash: same contents in new arrays give the same key; any change gives another', () => {
  const base = [[1], [2.5], [''], [null], ['NA'], [true], [{ code: '#N/A' }]];
  const key = hashCells(base);
  expect(hashCells(base.map((r) => [...r]))).toBe(key);
  const variants: unknown[][][] = [
    [[1], [2.5000000000000004], [''], [null], ['NA'], [true], [{ code: '#N/A' }]],
    [[1], [2.5], [null], [null], ['NA'], [true], [{ code: '#N/A' }]],
    [[1], [2.5], [''], [null], ['NB'], [true], [{ code: '#N/A' }]],
    [[1], [2.5], [''], [null], ['NA'], [1], [{ code: '#N/A' }]],
    [[1], [2.5], [''], [null], ['NA'], [false], [{ code: '#N/A' }]],
    [[1], [2.5], [''], [null], ['NA'], [true], [{ code: '#DIV/0!' }]],
    [[1, 2.5, '', null, 'NA', true, { code: '#N/A' }]],
    [[-0], [2.5], [''], [null], ['NA'], [true], [{ code: '#N/A' }]],
  ];
  const keys = variants.map(hashCells);
  expect(new Set([key, ...keys]).size).toBe(variants.length + 1);
  expect(hashCells([[0]])).not.toBe(hashCells([[-0]]));
});

test('hash: 100,000 distinct columns of one changed cell give 100,000 keys', () => {
  const cells = Array.from({ length: 50 }, (_, i) => [i * 0.1]);
  const seen = new Set<string>();
  for (let k = 0; k < 100000; k++) {
    cells[k % 50][0] = k;
    seen.add(hashCells(cells));
    cells[k % 50][0] = (k % 50) * 0.1;
  }
  expect(seen.size).toBe(100000);
});
