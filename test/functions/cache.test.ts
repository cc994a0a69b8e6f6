// src/functions/cache.ts: the bounded cache drops the least recently used
// entry.
import { BoundedCache } from '../../src/functions/cache';

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
