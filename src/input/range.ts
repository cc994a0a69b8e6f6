/**
 * Worksheet ranges, as Excel hands them to a custom function, turned into
 * checked columns: the one adapter between a range and the engine.
 *
 * A range arrives as rows of cells: numbers, text, booleans, empty cells
 * (`""` or `null`) and error values. The rules of cells.ts decide each cell
 * (blank and NA-like markers are missing, TRUE/FALSE are 1/0, other text is an
 * error); beyond them:
 * - a range is one column or one row; anything wider is refused;
 * - a text cell at the top of a range that is not a value (a column title left
 *   in the range) is a header: it is skipped and its text kept as the name;
 * - blank cells at the end of a range (a whole column such as B:B) are not
 *   data: the columns of one call are as long as the longest of them without
 *   its trailing blanks, and a range shorter than that is an error naming
 *   both lengths;
 * - an error value in a cell is refused by name and cell, except `#N/A`,
 *   which is missing (the same rule as the text "#N/A" in a file);
 * - missing cells become a mask: the engine drops those rows listwise, per
 *   calculation, and counts them.
 *
 * @example
 *   const [score, treated] = rangeColumns([
 *     { argument: 'score', cells: [['energy_burden'], [57.5], [60], ['']] },
 *     { argument: 'treated', cells: [['retrofit'], [0], [true], [null]] , binary: true },
 *   ]);
 *   score.values; // Float64Array [57.5, 60, 0]; score.missing: [0, 0, 1]
 */
import { CutlineError } from '../engine';
import { CellPrint, FALSE_HI, HI, slotCell, tagged, TRUE_HI } from './cellPrint';
import { cellNumber, showCell, trimBlank } from './cells';
import { Cell } from './table';

/** What a range argument holds. */
export interface RangeArgument {
  /** The argument's name as the user sees it (the function's parameter). */
  argument: string;
  cells: unknown[][];
  /** The range's address when the runtime gives it ("Sheet1!B2:B6001"). */
  address?: string;
  /** 0/1 values only (treated). */
  binary?: boolean;
  /** The cells' print (cellPrint.ts), when the caller made one: the values are then read from it, not from the rows. */
  print?: CellPrint;
}

export interface RangeColumn {
  argument: string;
  /** The header text when the range starts with one. */
  name?: string;
  values: Float64Array;
  /** 1 where the cell is missing. */
  missing: Uint8Array;
  /** Cells missing among the data cells. */
  missingCount: number;
}

/** An input problem, with the Excel error it becomes. */
export class RangeInputError extends CutlineError {
  constructor(
    message: string,
    readonly argument: string,
    readonly kind: 'value' | 'shape' = 'value',
  ) {
    super(message);
  }
}

/** An Excel error value as it arrives in a range: an object with an error code ("#DIV/0!"). */
export function errorCode(cell: unknown): string | undefined {
  if (cell === null || typeof cell !== 'object') return undefined;
  const c = cell as { code?: unknown; errorCode?: unknown; type?: unknown };
  const code = typeof c.code === 'string' ? c.code : typeof c.errorCode === 'string' ? c.errorCode : undefined;
  if (code !== undefined) return code;
  return c.type === 'Error' || cell instanceof Error ? '#VALUE!' : undefined;
}

const isBlank = (cell: unknown): boolean => cell === null || cell === undefined || (typeof cell === 'string' && trimBlank(cell) === '');

/** A one-column or one-row range read cell by cell, without copying it (ranges can be 10⁶ cells). */
interface CellView {
  length: number;
  at(i: number): unknown;
}

function view(a: RangeArgument): CellView {
  const rows = a.cells;
  if (!Array.isArray(rows) || rows.length === 0 || !Array.isArray(rows[0]) || !Array.isArray(rows[rows.length - 1])) {
    throw new RangeInputError(`${a.argument} must be a range of cells`, a.argument, 'shape');
  }
  const width = rows[0].length;
  if (rows.length === 1) return { length: width, at: (i) => rows[0][i] };
  if (width === 1) return { length: rows.length, at: (i) => rows[i][0] };
  throw new RangeInputError(`${a.argument} must be a single column (or row) of cells; it has ${rows.length} rows and ${width} columns`, a.argument, 'shape');
}

/** A header: text at the top that is not a value by the cell rules. */
function isHeader(cell: unknown): boolean {
  return typeof cell === 'string' && !isBlank(cell) && cellNumber(cell as Cell) === undefined;
}

/** 1 when the range starts with a header (its title), else 0: the cells before the data. */
function titleRows(cells: CellView): number {
  return cells.length > 0 && isHeader(cells.at(0)) ? 1 : 0;
}

/** Column letters of a 1-based column number. */
function letters(col: number): string {
  let s = '';
  for (let c = col; c > 0; c = Math.floor((c - 1) / 26)) s = String.fromCharCode(65 + ((c - 1) % 26)) + s;
  return s;
}

/** The address of the cell `down` rows and `right` columns from the top-left of a range ("Data!B7"), or undefined. */
export function offsetAddress(address: string | undefined, down: number, right: number): string | undefined {
  const m = address ? /^(?:(.*)!)?\$?([A-Za-z]{1,3})\$?(\d+)(?::\$?([A-Za-z]{1,3})\$?(\d+))?$/.exec(trimBlank(address)) : null;
  if (!m) return undefined;
  const col = m[2].toUpperCase().split('').reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
  return `${m[1] ? `${m[1]}!` : ''}${letters(col + right)}${Number(m[3]) + down}`;
}

/**
 * Where the k-th cell (0-based, header included) of a one-column or one-row
 * range is, for a message: its address when the range's address is known
 * ("cell B7", "cell Data!B7"), else its position in the range ("row 6 of the range").
 */
export function cellPlace(a: RangeArgument, k: number): string {
  const vertical = a.cells.length !== 1;
  const at = offsetAddress(a.address, vertical ? k : 0, vertical ? 0 : k);
  return at ? `cell ${at}` : `${vertical ? 'row' : 'column'} ${k + 1} of the range`;
}

/**
 * Where the `index`-th data value (0-based, after a title) of a range is, for
 * a message: how the engine's 0-based position in a column becomes a cell.
 */
export function dataCellPlace(a: RangeArgument, index: number): string {
  return cellPlace(a, titleRows(view(a)) + index);
}

/**
 * The columns of one call, checked and of one length. Errors name the
 * argument and the first bad cell; a range of the wrong length names both lengths.
 * `reuse` (optional) is asked for each column with its index, the common
 * length and the reading: a caller that remembers columns can return one
 * read before from the same cells instead of reading them again.
 */
export function rangeColumns(
  args: RangeArgument[],
  reuse: (k: number, n: number, read: () => RangeColumn) => RangeColumn = (_k, _n, read) => read(),
): RangeColumn[] {
  const flat = args.map((a) => {
    const cells = view(a);
    const header = titleRows(cells);
    let end = cells.length;
    while (end > header && isBlank(cells.at(end - 1))) end--;
    return { a, cells, header, end };
  });
  const n = Math.max(...flat.map((f) => f.end - f.header));
  if (n <= 0) throw new RangeInputError(`${args[0].argument} holds no values`, args[0].argument, 'shape');
  for (const f of flat) {
    const have = f.cells.length - f.header;
    if (have < n) {
      const longest = flat.find((g) => g.end - g.header === n)!;
      throw new RangeInputError(
        `${f.a.argument} has ${have} cells of data but ${longest.a.argument} has ${n}; the ranges must cover the same rows`,
        f.a.argument,
        'shape',
      );
    }
  }
  return flat.map(({ a, cells, header }, k) => reuse(k, n, () => readColumn(a, cells, header, n)));
}

function readColumn(a: RangeArgument, cells: CellView, header: number, n: number): RangeColumn {
  const p = a.print;
  // A print of these very cells: read its slots (one flat array) instead of the rows.
  if (p !== undefined && p.length === cells.length) return readPrinted(a, p, cells, header, n);
  const values = new Float64Array(n);
  const missing = new Uint8Array(n);
  let missingCount = 0;
  for (let i = 0; i < n; i++) {
    const k = header + i;
    const cell = cells.at(k);
    // Plain numbers are by far the commonest cells: decide them first.
    if (typeof cell === 'number' && cell === cell && cell !== Infinity && cell !== -Infinity) {
      if (a.binary && cell !== 0 && cell !== 1) throw bad(a, k, cell);
      values[i] = cell;
      continue;
    }
    missingCount += readCell(a, cell, i, k, values, missing);
  }
  const name = header ? trimBlank(String(cells.at(0))) : undefined;
  return { argument: a.argument, name, values, missing, missingCount };
}

/**
 * readColumn from a print: its numbers copied at once (one block), then only
 * the slots that need a decision looked at: tagged cells (TRUE and FALSE
 * directly), infinities, and for a binary column anything but 0 and 1.
 */
function readPrinted(a: RangeArgument, p: CellPrint, cells: CellView, header: number, n: number): RangeColumn {
  const values = p.values.slice(header, header + n);
  const missing = new Uint8Array(n);
  let missingCount = 0;
  const words = p.words;
  const binary = a.binary === true;
  for (let i = 0; i < n; i++) {
    const k = header + i;
    const hi = words[2 * k + HI];
    if (!tagged(hi)) {
      const x = values[i];
      if (x !== Infinity && x !== -Infinity && (!binary || x === 0 || x === 1)) continue;
    } else if (hi === TRUE_HI || hi === FALSE_HI) {
      values[i] = hi === TRUE_HI ? 1 : 0;
      continue;
    }
    const cell = slotCell(p, k);
    values[i] = 0;
    missingCount += readCell(a, cell, i, k, values, missing);
  }
  const name = header ? trimBlank(String(cells.at(0))) : undefined;
  return { argument: a.argument, name, values, missing, missingCount };
}

/** One cell by the cell rules into values[i] or missing[i] (1 returned when missing); a bad cell throws naming it (k: its place in the range). */
function readCell(a: RangeArgument, cell: unknown, i: number, k: number, values: Float64Array, missing: Uint8Array): number {
  if (typeof cell === 'number' && cell === cell && cell !== Infinity && cell !== -Infinity) {
    if (a.binary && cell !== 0 && cell !== 1) throw bad(a, k, cell);
    values[i] = cell;
    return 0;
  }
  if (typeof cell === 'boolean') {
    values[i] = cell ? 1 : 0;
    return 0;
  }
  const code = errorCode(cell);
  if (code !== undefined) {
    if (code === '#N/A') {
      missing[i] = 1;
      return 1;
    }
    throw new RangeInputError(`${a.argument}: ${cellPlace(a, k)} holds the error ${code}; correct it or leave the cell empty`, a.argument);
  }
  const v = cellNumber(cell as Cell);
  if (v === null) {
    missing[i] = 1;
    return 1;
  }
  if (v === undefined || (a.binary && v !== 0 && v !== 1)) throw bad(a, k, cell);
  values[i] = v;
  return 0;
}

function bad(a: RangeArgument, k: number, cell: unknown): RangeInputError {
  const what = a.binary ? 'must be 0, 1, TRUE or FALSE' : 'is not a number';
  const shown = typeof cell === 'number' ? String(cell) : showCell(cell as Cell);
  return new RangeInputError(`${a.argument}: ${cellPlace(a, k)} ${what}; it holds ${shown}`, a.argument);
}

/** A list of numbers from a range (the `at` values of a complier curve), blanks skipped. */
export function rangeNumbers(a: RangeArgument): number[] {
  const cells = view(a);
  const out: number[] = [];
  for (let k = titleRows(cells); k < cells.length; k++) {
    const cell = cells.at(k);
    if (isBlank(cell)) continue;
    const code = errorCode(cell);
    if (code !== undefined) throw new RangeInputError(`${a.argument}: ${cellPlace(a, k)} holds the error ${code}`, a.argument);
    const v = cellNumber(cell as Cell);
    if (typeof v !== 'number' || !Number.isFinite(v)) throw bad(a, k, cell);
    out.push(v);
  }
  if (out.length === 0) throw new RangeInputError(`${a.argument} holds no numbers`, a.argument, 'shape');
  return out;
}
