/**
 * A table of cells as the faces hand it over: a header of column names and
 * rows of cells (numbers, strings, booleans, empty cells). The same Table
 * comes from a CSV text, an exceljs worksheet or a worksheet range, so that
 * validation (columns.ts) and its messages are the same in every face.
 */
import { trimBlank } from './cells';

export type Cell = string | number | boolean | null | undefined;

export interface Table {
  header: string[];
  rowCount: number;
  /** Row number a user sees for data row 0 (2 when the header is row 1). */
  firstRow: number;
  /** The cell at data row r (0-based) and column c. */
  get(r: number, c: number): Cell;
  /**
   * Optional fast read of a whole column: values, a missing mask, and the rows
   * (ascending) that the general rules must decide.
   */
  fastColumn?(c: number): { values: Float64Array; missing: Uint8Array; slow: Int32Array };
}

/** A table over arrays of arrays; the first row is the header unless `header` is given. */
export function tableFromRows(rows: Cell[][], options: { header?: string[]; firstRow?: number } = {}): Table {
  const header = options.header ?? (rows[0] ?? []).map((h) => (h === null || h === undefined ? '' : trimBlank(String(h))));
  const body = options.header ? rows : rows.slice(1);
  return {
    header,
    rowCount: body.length,
    firstRow: options.firstRow ?? (options.header ? 1 : 2),
    get: (r, c) => body[r][c],
  };
}
