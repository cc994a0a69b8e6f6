// src/input/cellValue.ts: a cell as a workbook stores it. Expectations are the
// cell rules of docs/methods.md §1 (cells.ts) and its blank rule (trimBlank).
import { cellValueOf } from '../../src/input/cellValue';

test('plain decimal numbers become numbers; TRUE/FALSE, markers and labels stay text', () => {
  expect(cellValueOf('60.5')).toBe(60.5);
  expect(cellValueOf(' -3 ')).toBe(-3);
  expect(cellValueOf('NA')).toBe('NA');
  expect(cellValueOf('TRUE')).toBe('TRUE');
  expect(cellValueOf('north')).toBe('north');
  expect(cellValueOf('')).toBeNull();
  expect(cellValueOf(7)).toBe(7);
});

test('TRUE/FALSE framed by NBSP or zero-width spaces stay text, as without them', () => {
  expect(cellValueOf('\u200bTRUE')).toBe('\u200bTRUE');
  expect(cellValueOf('false\u00a0')).toBe('false\u00a0');
  expect(cellValueOf('\u200b12\u00a0')).toBe(12);
});
