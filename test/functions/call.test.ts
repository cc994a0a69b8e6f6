// src/functions/call.ts: the shared reading of a call. Equal cells in new
// arrays (as Excel passes them at each recalculation) give the very same
// column arrays, so the engine's per-array memories hit; results are
// remembered by key; arguments are checked by name.
import { hashCells } from '../../src/functions/cache';
import { bandwidthArgument, cacheSizes, flagArgument, forgetAll, numberArgument, rangesKey, readRanges, remembered } from '../../src/functions/call';
import { CutlineError } from '../../src/engine';
import { prepareCall } from '../../src/functions/prepare';
import { RangeInputError } from '../../src/input/range';

const col = (...cells: unknown[]): unknown[][] => cells.map((c) => [c]);
const specs = (score: unknown[][], treated: unknown[][]) => [
  { argument: 'score', cells: score, position: 0 },
  { argument: 'treated', cells: treated, position: 1, binary: true },
];

beforeEach(() => forgetAll());

test('equal contents share one prepared column; cells that mean the same too', () => {
  const read = (s: ReturnType<typeof specs>) => readRanges(s, rangesKey(s));
  const a = read(specs(col('score', 1, 2, 3, ''), col(0, 1, 1, null)));
  const b = read(specs(col(1, 2, 3), col(false, true, 'TRUE', '')));
  // Different cells, so different call keys; the same contents, so the same arrays.
  expect(rangesKey(specs(col(1, 2, 3), col(false, true, 'TRUE', '')))).not.toBe(rangesKey(specs(col('score', 1, 2, 3, ''), col(0, 1, 1, null))));
  expect(b[0].values).toBe(a[0].values);
  expect(b[1].values).toBe(a[1].values);
  expect(cacheSizes()).toEqual({ calls: 2, columns: 2, results: 0 });
  // Equal cells in new arrays: the same call key, nothing read again.
  expect(read(specs(col(1, 2, 3), col(false, true, 'TRUE', '')))).toBe(b);
  const c = read(specs(col(1, 2, 4), col(0, 1, 1)));
  expect(c[0].values).not.toBe(a[0].values);
  expect(c[1].values).toBe(a[1].values);
});

test('the cells key changes with any cell, its kind, or the shape', () => {
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
  expect(new Set([key, ...variants.map(hashCells)]).size).toBe(variants.length + 1);
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

test('an engine error about a row of an argument names the cell (title rows counted)', () => {
  const c = prepareCall(
    'EFFECT',
    {
      ranges: [
        { argument: 'score', cells: col('score', 1, 2, 3), position: 0 },
        { argument: 'outcome', cells: col('bill', 5, 6, 7), position: 2 },
      ],
      cutoff: 2,
      settings: null,
      settingsPosition: 5,
      detail: null,
    },
    { parameterAddresses: ['C1:C4', 'D1:D4', 'E1:E4'] },
  );
  const engineError = Object.assign(new CutlineError('not a finite number'), { code: 'bad-value', argument: 'outcome', index: 2 });
  expect(() => c.result(() => { throw engineError; })).toThrow(new RangeInputError('outcome: cell E4: not a finite number', 'outcome'));
  const other = Object.assign(new CutlineError('no unit below the cutoff'), { code: 'empty-side', argument: 'cutoff' });
  expect(() => c.result(() => { throw other; })).toThrow(other);
});
