/**
 * A cell as a workbook would store it: a number when the cell reads as a
 * plain decimal number (the rules of docs/methods.md §1, cells.ts), else its text as given
 * (missing markers and labels stay text), empty stays empty.
 *
 * @example cellValueOf('60.5') // 60.5; cellValueOf('NA') // 'NA'; cellValueOf('') // null
 */
import { cellNumber, trimBlank } from './cells';
import { Cell } from './table';

export function cellValueOf(c: Cell): string | number | boolean | null {
  if (c === null || c === undefined || c === '') return null;
  if (typeof c !== 'string') return c;
  const v = cellNumber(c);
  const t = trimBlank(c).toUpperCase();
  return typeof v === 'number' && t !== 'TRUE' && t !== 'FALSE' ? v : c;
}
