// src/functions/call.ts: the shared reading of a call. Equal cells in new
// arrays (as Excel passes them at each recalculation) give the very same
// column arrays, so the engine's per-array memories hit; results are
// remembered by key; arguments are checked by name.
import { bandwidthArgument, cacheSizes, flagArgument, forgetAll, numberArgument, readRanges, remembered } from '../../src/functions/call';
import { RangeInputError } from '../../src/input/range';

const col = (...cells: unknown[]): unknown[][] => cells.map((c) => [c]);
const specs = (score: unknown[][], treated: unknown[][]) => [
  { argument: 'score', cells: score, position: 0 },
  { argument: 'treated', cells: treated, position: 1, binary: true },
];

beforeEach(() => forgetAll());

test('equal contents share one prepared column; cells that mean the same too', () => {
  const a = readRanges(specs(col('score', 1, 2, 3, ''), col(0, 1, 1, null)));
  const b = readRanges(specs(col(1, 2, 3), col(false, true, 'TRUE', '')));
  expect(b.cols[0].values).toBe(a.cols[0].values);
  expect(b.cols[1].values).toBe(a.cols[1].values);
  expect(b.key).toBe(a.key);
  expect(cacheSizes().columns).toBe(2);
  const c = readRanges(specs(col(1, 2, 4), col(0, 1, 1)));
  expect(c.cols[0].values).not.toBe(a.cols[0].values);
  expect(c.key).not.toBe(a.key);
});

test('a result is computed once per key', () => {
  let n = 0;
  expect(remembered('k', () => ++n)).toBe(1);
  expect(remembered('k', () => ++n)).toBe(1);
  expect(remembered('other', () => ++n)).toBe(2);
});

test('number, bandwidth and flag arguments', () => {
  expect(numberArgument('cutoff', 60)).toBe(60);
  expect(numberArgument('cutoff', ' 60 ')).toBe(60);
  expect(() => numberArgument('cutoff', null)).toThrow(new RangeInputError('cutoff must be a number; it is empty', 'cutoff'));
  expect(bandwidthArgument(null)).toBeUndefined();
  expect(bandwidthArgument(8)).toBe(8);
  expect(() => bandwidthArgument(0)).toThrow(/bandwidth must be a positive number; it is 0/);
  expect([flagArgument(null), flagArgument(true), flagArgument(0), flagArgument('true')]).toEqual([false, true, false, true]);
  expect(() => flagArgument('yes')).toThrow('detail must be TRUE or FALSE; it is "yes"');
});
