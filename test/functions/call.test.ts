// src/functions/call.ts: the shared reading of a call. Equal cells in new
// arrays (as Excel passes them at each recalculation) give the same key and
// the very same columns; any changed cell gives another key and a fresh
// reading; results are remembered by key; arguments are checked by name.
import { bandwidthArgument, cacheSizes, flagArgument, forgetAll, numberArgument, rangesKey, readRanges, remembered } from '../../src/functions/call';
import { CutlineError } from '../../src/engine';
import { prepareCall } from '../../src/functions/prepare';
import { rangeColumns, RangeInputError } from '../../src/input/range';

const col = (...cells: unknown[]): unknown[][] => cells.map((c) => [c]);
const specs = (score: unknown[][], treated: unknown[][]) => [
  { argument: 'score', cells: score, position: 0 },
  { argument: 'treated', cells: treated, position: 1, binary: true },
];

beforeEach(() => forgetAll());

test('a range read once is not read again: equal cells in new arrays, and the same range in another call', () => {
  const read = (s: ReturnType<typeof specs>) => readRanges(s, rangesKey(s));
  const a = read(specs(col('score', 1, 2, 3, ''), col(0, 1, 1, null)));
  expect(Array.from(a[0].values)).toEqual([1, 2, 3]);
  expect(Array.from(a[1].values)).toEqual([0, 1, 1]);
  // Equal cells in new arrays: the same key, the same columns.
  const again = specs(col('score', 1, 2, 3, ''), col(0, 1, 1, null));
  expect(rangesKey(again).key).toBe(rangesKey(specs(col('score', 1, 2, 3, ''), col(0, 1, 1, null))).key);
  expect(read(again)[0]).toBe(a[0]);
  expect(read(again)[1]).toBe(a[1]);
  // Cells that mean the same but differ (TRUE for 1, no title) are other cells: another key.
  expect(rangesKey(specs(col(1, 2, 3), col(false, true, 'TRUE', ''))).key).not.toBe(rangesKey(again).key);
  // One range changed: the other's column is reused, the changed one read.
  const c = read(specs(col('score', 1, 2, 4, ''), col(0, 1, 1, null)));
  expect(Array.from(c[0].values)).toEqual([1, 2, 4]);
  expect(c[1]).toBe(a[1]);
  expect(cacheSizes()).toEqual({ ranges: 5, columns: 3, results: 0 }); // the five ranges keyed above; three columns read
});

test('one changed cell, anywhere, is another key and is read afresh: 0 and −0, blank and 0, TRUE and 1 told apart', () => {
  const base = col('score', 0, 2.5, '', true, 0);
  const key = rangesKey([{ argument: 'score', cells: base, position: 0 }]).key;
  const variants: unknown[][][] = [
    col('score', -0, 2.5, '', true, 0),
    col('score', 0, 2.5, '', true, -0),
    col('score', 0, 2.5, 0, true, 0),
    col('score', 0, 2.5, null, true, 0),
    col('score', 0, 2.5, '', 1, 0),
    col('score', 0, 2.5000000000000004, '', true, 0),
    col('score', 0, 2.5, '', true, ''),
    col('score', 0, 2.5, '', true, 0, ''),
    col('Score', 0, 2.5, '', true, 0),
    [['score', 0, 2.5, '', true, 0]],
  ];
  for (const v of variants) {
    const s = [{ argument: 'score', cells: v, position: 0 }];
    const k = rangesKey(s);
    expect(k.key).not.toBe(key);
    const [fresh] = rangeColumns([{ argument: 'score', cells: v }]);
    const [cached] = readRanges(s, k);
    expect(Array.from(cached.values).map((x) => Object.is(x, -0))).toEqual(Array.from(fresh.values).map((x) => Object.is(x, -0)));
    expect(Array.from(cached.values)).toEqual(Array.from(fresh.values));
    expect(Array.from(cached.missing)).toEqual(Array.from(fresh.missing));
    expect(cached.name).toBe(fresh.name);
  }
  // And back: the base is still its own key.
  expect(rangesKey([{ argument: 'score', cells: col('score', 0, 2.5, '', true, 0), position: 0 }]).key).toBe(key);
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

// The one blank rule of cells.ts (trimBlank): a zero-width space or NBSP around a typed TRUE is blank.
test('flagArgument: TRUE/FALSE framed by zero-width spaces or NBSP', () => {
  expect(flagArgument('\u200bTRUE\u00a0')).toBe(true);
  expect(flagArgument('false\u200b')).toBe(false);
  expect(() => flagArgument('\u200byes')).toThrow(/detail must be TRUE or FALSE/);
});

// A text argument is read exactly as a cell of a range is (src/input/cells.ts, docs/methods.md §1).
test('numberArgument reads a text as a cell would be read: no hexadecimal, Infinity or blank-as-0', () => {
  const cellRead = (v: string | number | boolean): number | undefined => {
    const [c] = rangeColumns([{ argument: 'score', cells: [[v], [1]] }]);
    return c.missing[0] ? undefined : c.values[0];
  };
  for (const v of ['60', ' 60 ', '\u200b60\u00a0', '+.5', '1e3', '1e3 ', '-2.5E-1', 'TRUE', false, 7]) {
    expect(numberArgument('cutoff', v)).toBe(cellRead(v));
  }
  expect(numberArgument('cutoff', '1e3 ')).toBe(1000);
  for (const v of ['0x10', '0b1', '0o7', 'Infinity', '-Infinity', '1e999', 'sixty', '3,5']) {
    expect(() => numberArgument('cutoff', v)).toThrow(new RangeInputError(`cutoff must be a number; it is ${JSON.stringify(v)}`, 'cutoff'));
    expect(() => rangeColumns([{ argument: 'score', cells: [[1], [v]] }])).toThrow(/is not a number/);
  }
  // Blank and NA are missing in a range; a missing cutoff is an error (never 0).
  for (const v of ['', ' ', '\u00a0', '\u200b', 'NA']) expect(() => numberArgument('cutoff', v)).toThrow(/^cutoff must be a number; it is /);
  expect(() => numberArgument('cutoff', '')).toThrow('cutoff must be a number; it is empty');
  expect(bandwidthArgument('\u200b')).toBeUndefined();
  expect(() => bandwidthArgument('0x10')).toThrow('bandwidth must be a number; it is "0x10"');
});
