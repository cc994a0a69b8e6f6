// src/input/cellPrint.ts: a print holds every cell exactly (each slot decodes
// back to its cell; text and error codes kept), and samePrint is true for the
// same cells in new arrays and false for any one changed cell, its kind, or
// the shape. Expectations are the cell kinds themselves (no outside values).
import { cellPrint, samePrint, slotCell } from '../../src/input/cellPrint';

const col = (...cells: unknown[]): unknown[][] => cells.map((c) => [c]);
const cells: unknown[] = ['title', 1, -0, 0, 2.5, '', null, undefined, true, false, 'NA', ' 3 ', NaN, Infinity, { code: '#N/A' }, { code: '#DIV/0!' }, 7];

test('each slot decodes back to its cell (objects to the object itself)', () => {
  const p = cellPrint(col(...cells))!;
  expect(p.length).toBe(cells.length);
  cells.forEach((c, k) => expect(Object.is(slotCell(p, k), c)).toBe(true));
  const row = cellPrint([cells])!;
  expect(row.row).toBe(true);
  cells.forEach((c, k) => expect(Object.is(slotCell(row, k), c)).toBe(true));
});

test('the same cells in new arrays match; any one changed cell, in any place, does not', () => {
  const p = cellPrint(col(...cells))!;
  expect(samePrint(col(...cells.map((c) => (typeof c === 'object' && c !== null ? { ...c } : c))), p)).toBe(true);
  const other: unknown[] = [0, 1, -0, '', null, undefined, true, false, '0', 'na', { code: '#VALUE!' }, NaN, 2.5000000000000004];
  for (let k = 0; k < cells.length; k++) {
    for (const o of other) {
      if (Object.is(o, cells[k])) continue;
      const changed = cells.map((c, j) => (j === k ? o : c));
      expect([k, o, samePrint(col(...changed), p)]).toEqual([k, o, false]);
    }
  }
  expect(samePrint(col(...cells, ''), p)).toBe(false); // one more (blank) cell
  expect(samePrint(col(...cells.slice(0, -1)), p)).toBe(false);
  expect(samePrint([cells], p)).toBe(false); // a row, not a column
});

test('shapes other than one column or one row get no print', () => {
  expect(cellPrint([[1, 2], [3, 4]])).toBeUndefined();
  expect(cellPrint([] as unknown[][])).toBeUndefined();
});
