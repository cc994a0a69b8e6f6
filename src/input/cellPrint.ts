/**
 * A range's cells written once into one flat typed array (a "print"), so that
 * an unchanged range in new arrays (Excel hands a function new arrays at every
 * recalculation) is recognised by an exact cell-by-cell comparison, and a
 * changed one is read from the print rather than from the rows again.
 *
 * Each cell is one 64-bit slot: a number (not NaN) is its own IEEE double; any
 * other cell is a tag in the slot's high word (a NaN pattern no stored number
 * has, since NaN numbers are tagged too) with, for text and other values, an
 * index into `others` in the low word. Text is kept as it is; any other value
 * (an Excel error object) as its error code and JSON, which is all the input
 * adapter reads of it.
 *
 * Only one-column and one-row ranges get a print (the only shapes the adapter
 * accepts); `cellPrint` returns undefined for any other shape.
 *
 * @example
 *   const p = cellPrint([['score'], [57.5], [true], ['']])!;
 *   samePrint([['score'], [57.5], [true], ['']], p); // true (new arrays, same cells)
 *   samePrint([['score'], [57.5], [1], ['']], p);    // false (TRUE is not 1 here)
 */
import { errorCode } from './range';

export interface CellPrint {
  /** One row of cells (true) or one column (false). */
  row: boolean;
  length: number;
  /** The cells: numbers as themselves, other cells tagged (see `slotTag`). */
  values: Float64Array;
  /** The same memory as 32-bit words. */
  words: Int32Array;
  /** Text cells and other values (as `code|json`), indexed from the low word of their slot. */
  others: unknown[];
  /** The original objects of `others` that are not text (for reading their error code), else undefined. */
  objects: unknown[];
}

/** The high word of a tagged slot is TAG + kind; a stored number's high word is never in this range (those are NaNs). */
const TAG = 0x7ff40000;
const KIND_NULL = 1;
const KIND_UNDEFINED = 2;
const KIND_TRUE = 3;
const KIND_FALSE = 4;
const KIND_TEXT = 5;
const KIND_OTHER = 6;
const KIND_NAN = 7;

/** The high words of TRUE and FALSE. */
export const TRUE_HI = TAG + KIND_TRUE;
export const FALSE_HI = TAG + KIND_FALSE;

/** Index of a slot's high word among the 32-bit words (the platform's byte order). */
export const HI = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0;
const LO = 1 - HI;

/** Whether a slot's high word is a tag (else the slot holds a number). */
export function tagged(hi: number): boolean {
  return hi > TAG && hi <= TAG + KIND_NAN;
}

/** The kind of a slot (0 for a number). */
function slotKind(words: Int32Array, k: number): number {
  const hi = words[2 * k + HI];
  return tagged(hi) ? hi - TAG : 0;
}

/** The cell of a tagged slot, as the adapter reads it (an object is returned as the original object of the print). */
export function slotCell(p: CellPrint, k: number): unknown {
  switch (slotKind(p.words, k)) {
    case KIND_NULL:
      return null;
    case KIND_UNDEFINED:
      return undefined;
    case KIND_TRUE:
      return true;
    case KIND_FALSE:
      return false;
    case KIND_TEXT:
      return p.others[p.words[2 * k + LO]];
    case KIND_OTHER:
      return p.objects[p.words[2 * k + LO]];
    case KIND_NAN:
      return NaN;
    default:
      return p.values[k];
  }
}

/** What identifies a non-text, non-number cell: its error code and its JSON. */
function otherKey(v: unknown): string {
  let json: string | undefined;
  try {
    json = JSON.stringify(v);
  } catch {
    json = String(v);
  }
  return `${errorCode(v) ?? ''}|${typeof v}|${json}`;
}

/** The kind of a cell that is not a (non-NaN) number. */
function kindOf(v: unknown): number {
  return v === null ? KIND_NULL : v === undefined ? KIND_UNDEFINED : v === true ? KIND_TRUE : v === false ? KIND_FALSE : typeof v === 'string' ? KIND_TEXT : typeof v === 'number' ? KIND_NAN : KIND_OTHER;
}

/** The shape of a range that gets a print: one row, or one column; undefined otherwise. */
function shape(cells: unknown[][]): { row: boolean; length: number } | undefined {
  if (!Array.isArray(cells) || cells.length === 0 || !Array.isArray(cells[0]) || !Array.isArray(cells[cells.length - 1])) return undefined;
  if (cells.length === 1) return { row: true, length: cells[0].length };
  return cells[0].length === 1 ? { row: false, length: cells.length } : undefined;
}

/** The print of a one-column or one-row range (one pass over the cells), or undefined for another shape. */
export function cellPrint(cells: unknown[][]): CellPrint | undefined {
  const s = shape(cells);
  if (!s) return undefined;
  const n = s.length;
  const values = new Float64Array(n);
  const words = new Int32Array(values.buffer);
  const others: unknown[] = [];
  const objects: unknown[] = [];
  const p: CellPrint = { row: s.row, length: n, values, words, others, objects };
  if (s.row) {
    const line = cells[0];
    for (let k = 0; k < n; k++) {
      const v = line[k];
      if (typeof v === 'number' && v === v) values[k] = v;
      else tag(p, k, v);
    }
    return p;
  }
  for (let k = 0; k < n; k++) {
    const v = cells[k][0];
    if (typeof v === 'number' && v === v) values[k] = v;
    else tag(p, k, v);
  }
  return p;
}

/** Writes the tag of a cell that is not a (non-NaN) number into slot k. */
function tag(p: CellPrint, k: number, v: unknown): void {
  const kind = kindOf(v);
  p.words[2 * k + HI] = TAG + kind;
  if (kind === KIND_TEXT || kind === KIND_OTHER) {
    p.words[2 * k + LO] = p.others.length;
    p.others.push(kind === KIND_TEXT ? v : otherKey(v));
    p.objects.push(kind === KIND_TEXT ? undefined : v);
  }
}

/**
 * Whether the cells are exactly those of the print: the same shape, every
 * number the same double (0 and −0 told apart), every other cell of the same
 * kind with the same text or error. Stops at the first difference.
 */
export function samePrint(cells: unknown[][], p: CellPrint): boolean {
  const s = shape(cells);
  if (!s || s.row !== p.row || s.length !== p.length || p.length === 0) return false;
  const values = p.values;
  const n = p.length;
  const line = cells[0];
  // The ends first: a typical edit is a new last row.
  if (!sameCell(s.row ? line[n - 1] : cells[n - 1][0], p, n - 1)) return false;
  if (s.row) {
    for (let k = 0; k < n; k++) if (!sameCell(line[k], p, k)) return false;
    return true;
  }
  for (let k = 0; k < n; k++) {
    const v = cells[k][0];
    if (typeof v === 'number' && v === v) {
      // A tagged slot reads as NaN, never equal to a number; 0 and −0 are equal as doubles, so compare their signs.
      if (values[k] !== v || (v === 0 && 1 / v !== 1 / values[k])) return false;
    } else if (!sameCell(v, p, k)) return false;
  }
  return true;
}

function sameCell(v: unknown, p: CellPrint, k: number): boolean {
  if (typeof v === 'number' && v === v) return p.values[k] === v && (v !== 0 || 1 / v === 1 / p.values[k]);
  const kind = kindOf(v);
  if (p.words[2 * k + HI] !== TAG + kind) return false;
  if (kind === KIND_TEXT) return p.others[p.words[2 * k + LO]] === v;
  if (kind === KIND_OTHER) return p.others[p.words[2 * k + LO]] === otherKey(v);
  return true;
}
