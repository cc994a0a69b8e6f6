// src/input/range.ts: worksheet ranges to checked columns. Expectations are
// the cell rules of METHODS.md §1 (blank and NA-like markers missing, TRUE/
// FALSE as 1/0, other text an error) and the range rules in the module's
// comment; cell addresses follow Excel's A1 notation.
import { cellPlace, errorCode, offsetAddress, rangeColumns, rangeNumbers, RangeInputError } from '../../src/input/range';

const col = (...cells: unknown[]): unknown[][] => cells.map((c) => [c]);
const arr = (a: Float64Array | Uint8Array): number[] => Array.from(a);
const message = (f: () => unknown): string => {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(RangeInputError);
    return (e as Error).message;
  }
  throw new Error('no error');
};

test('numbers, numeric text, booleans; blanks ("", null, spaces) and NA markers are missing', () => {
  const [c] = rangeColumns([{ argument: 'score', cells: col(1.5, '2.25', true, false, '', null, '  ', 'NA', '#N/A', '.', -3) }]);
  expect(arr(c.values)).toEqual([1.5, 2.25, 1, 0, 0, 0, 0, 0, 0, 0, -3]);
  expect(arr(c.missing)).toEqual([0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 0]);
  expect(c.missingCount).toBe(6);
  expect(c.name).toBeUndefined();
});

test('a title at the top is skipped and kept as the name; "TRUE" at the top is a value', () => {
  const [a] = rangeColumns([{ argument: 'score', cells: col('energy burden', 1, 2) }]);
  expect(a.name).toBe('energy burden');
  expect(arr(a.values)).toEqual([1, 2]);
  const [b] = rangeColumns([{ argument: 'treated', cells: col('TRUE', 0, 1), binary: true }]);
  expect(b.name).toBeUndefined();
  expect(arr(b.values)).toEqual([1, 0, 1]);
});

test('trailing blanks (whole columns) are not data; the longest column sets the length', () => {
  const [s, y] = rangeColumns([
    { argument: 'score', cells: col('score', 1, 2, 3, '', null, '') },
    { argument: 'outcome', cells: col(5, '', '', '', null, '') },
  ]);
  expect(arr(s.values)).toEqual([1, 2, 3]);
  // The outcome's own trailing blanks within the score's rows are missing values.
  expect(arr(y.missing)).toEqual([0, 1, 1]);
});

test('a range shorter than the data names both lengths', () => {
  expect(message(() => rangeColumns([{ argument: 'score', cells: col(1, 2, 3) }, { argument: 'treated', cells: col(0, 1), binary: true }]))).toBe(
    'treated has 2 cells of data but score has 3; the ranges must cover the same rows',
  );
});

test('rows are accepted as well as columns; wider ranges are refused', () => {
  expect(arr(rangeColumns([{ argument: 'at', cells: [[1, 2, 3]] }])[0].values)).toEqual([1, 2, 3]);
  expect(message(() => rangeColumns([{ argument: 'score', cells: [[1, 2], [3, 4]] }]))).toBe(
    'score must be a single column (or row) of cells; it has 2 rows and 2 columns',
  );
});

test('the first bad cell is named: by address when given, else by row in the range', () => {
  const cells = col('score', 1, 'x', 'y');
  expect(message(() => rangeColumns([{ argument: 'score', cells, address: 'Sheet 1!$B$4:$B$7' }]))).toBe(
    'score: cell Sheet 1!B6 is not a number; it holds "x"',
  );
  expect(message(() => rangeColumns([{ argument: 'score', cells }]))).toBe('score: row 3 of the range is not a number; it holds "x"');
  expect(message(() => rangeColumns([{ argument: 'treated', cells: col(0, 1, 0.5), binary: true }]))).toBe(
    'treated: row 3 of the range must be 0, 1, TRUE or FALSE; it holds 0.5',
  );
});

test('error values: #N/A is missing, others are refused by name', () => {
  const [c] = rangeColumns([{ argument: 'outcome', cells: col(1, { code: '#N/A' }, 3) }]);
  expect(arr(c.missing)).toEqual([0, 1, 0]);
  expect(message(() => rangeColumns([{ argument: 'outcome', cells: col(1, { code: '#REF!' }), address: 'E2:E3' }]))).toBe(
    'outcome: cell E3 holds the error #REF!; correct it or leave the cell empty',
  );
  expect(errorCode({ errorCode: '#DIV/0!' })).toBe('#DIV/0!');
  expect(errorCode(new Error('x'))).toBe('#VALUE!');
  expect(errorCode('#DIV/0!')).toBeUndefined();
});

test('non-finite numbers are refused; the input arrays are not changed', () => {
  const cells = col(1, Infinity);
  const copy = JSON.stringify(cells);
  expect(message(() => rangeColumns([{ argument: 'score', cells }]))).toBe('score: row 2 of the range is not a number; it holds Infinity');
  expect(JSON.stringify(cells)).toBe(copy);
  expect(message(() => rangeColumns([{ argument: 'score', cells: col('', null) }]))).toBe('score holds no values');
});

test('addresses: offsets across columns past Z, sheets with quotes, single cells', () => {
  expect(offsetAddress('Y10', 2, 3)).toBe('AB12');
  expect(offsetAddress("'My data'!AZ1:AZ9", 0, 1)).toBe("'My data'!BA1");
  expect(offsetAddress('not an address', 0, 0)).toBeUndefined();
  expect(cellPlace({ argument: 'at', cells: [[1, 2, 3]], address: 'C5:E5' }, 2)).toBe('cell E5');
});

test('rangeNumbers: the `at` values, blanks and a title skipped', () => {
  expect(rangeNumbers({ argument: 'at', cells: col('bill', 100, '', 200, null) })).toEqual([100, 200]);
  expect(message(() => rangeNumbers({ argument: 'at', cells: col(1, 'abc') }))).toBe('at: row 2 of the range is not a number; it holds "abc"');
});

// The one blank rule of cells.ts (trimBlank): NBSP (U+00A0), the zero-width
// space (U+200B) and NEL (U+0085) are blank like a space, here as in a file.
test('cells of NBSP, zero-width spaces or line breaks are blank: missing, and not data at the end', () => {
  const [s, t] = rangeColumns([
    { argument: 'score', cells: col('\u200benergy burden\u00a0', 1, '\u00a0', 3, '\u200b', '\u0085', '\r\n') },
    { argument: 'treated', cells: col(0, 1, 1), binary: true },
  ]);
  expect(s.name).toBe('energy burden');
  expect(arr(s.values)).toEqual([1, 0, 3]);
  expect(arr(s.missing)).toEqual([0, 1, 0]);
  expect(arr(t.values)).toEqual([0, 1, 1]);
  expect(rangeNumbers({ argument: 'at', cells: col('\u200b', 2, '\u00a0') })).toEqual([2]);
  expect(offsetAddress('\u200bData!B2:B9\u00a0', 1, 0)).toBe('Data!B3');
});
