/**
 * One cell to a number, by the rules of docs/methods.md §1: an empty cell or a
 * missing marker (NA, N/A, #N/A, a lone dot; any case) is missing; TRUE/FALSE
 * (booleans or text) are 1/0; a decimal number is itself; anything else —
 * other text, a non-finite number, hexadecimal — is an error.
 */
import { Cell } from './table';

export const MISSING_MARKERS = ['NA', 'N/A', '#N/A', '.'];

/**
 * Blank-looking characters: every Unicode white space (JavaScript's \s: spaces
 * of every width, the non-breaking ones, tabs, line breaks, the byte-order
 * mark) plus NEL (U+0085) and the zero-width space (U+200B), which show
 * nothing either. A cell holding only these is blank, hence missing.
 */
const EDGE_BLANKS = /^[\s\u0085\u200b]+|[\s\u0085\u200b]+$/g;

/** The text without blank-looking characters at either end (cells.ts's one trim). */
export function trimBlank(s: string): string {
  return s.replace(EDGE_BLANKS, '');
}

/**
 * A number typed in a field or a list (a command-line option, a task-pane
 * field, a sensitivity multiple) rather than held in a cell: decimal text by
 * the cell rules (blank-looking ends trimmed; no hexadecimal, no Infinity),
 * where a word (TRUE, NA) is not a number. `undefined` when it is not one.
 *
 * @example typedNumber(' 60 ') // 60; typedNumber('0x10') // undefined; typedNumber('TRUE') // undefined
 */
export function typedNumber(text: string): number | undefined {
  const t = trimBlank(text);
  if (t === '' || /^[a-z]/i.test(t)) return undefined;
  const v = cellNumber(t);
  return typeof v === 'number' ? v : undefined;
}

/** A number, `null` for missing, or `undefined` for a value that is not a number. */
export function cellNumber(cell: Cell): number | null | undefined {
  if (cell === null || cell === undefined) return null;
  if (typeof cell === 'number') return Number.isFinite(cell) ? cell : undefined;
  if (typeof cell === 'boolean') return cell ? 1 : 0;
  const s = cell;
  if (s.length === 0) return null;
  const c0 = s.charCodeAt(0);
  const cl = s.charCodeAt(s.length - 1);
  // Fast path: a text that starts with a digit, sign or point and ends with a
  // digit or point. Number() itself trims and reads '' (or a lone space) as 0,
  // so a text with anything else at its ends is trimmed first, then read.
  if (!(isNumberStart(c0) && ((cl >= 48 && cl <= 57) || cl === 46))) {
    const t = trimBlank(s);
    if (t === '') return null;
    if (t.length !== s.length) return cellNumber(t);
    const u = t.toUpperCase();
    if (MISSING_MARKERS.includes(u)) return null;
    if (u === 'TRUE') return 1;
    if (u === 'FALSE') return 0;
    return undefined;
  }
  const v = +s;
  const c1 = s.length > 1 ? s.charCodeAt(1) | 32 : 0;
  // Reject '0x…', '0b…', '0o…' (Number accepts them); a sign before them makes Number refuse.
  if (v !== v || !Number.isFinite(v) || (c0 === 48 && (c1 === 120 || c1 === 98 || c1 === 111))) {
    return MISSING_MARKERS.includes(s) ? null : undefined;
  }
  return v;
}

function isNumberStart(c: number): boolean {
  return (c >= 48 && c <= 57) || c === 45 || c === 43 || c === 46;
}

/**
 * A hint for a text that is not a number but looks like one written with a
 * decimal comma ("3,5", "-1.234,5"), or `''`.
 */
export function decimalCommaHint(cell: Cell): string {
  if (typeof cell !== 'string') return '';
  const t = trimBlank(cell);
  if (!/^[+-]?(\d{1,3}(\.\d{3})+|\d+)?,\d+$/.test(t)) return '';
  const fixed = t.replace(/\./g, '').replace(',', '.');
  return `; it looks like a number written with a decimal comma: Cutline reads a point as the decimal mark (${fixed}), so save the file with points (in a spreadsheet, set the decimal separator to a point before exporting)`;
}

/** The cell as text for a message, shortened. */
export function showCell(cell: Cell): string {
  const s = String(cell);
  return JSON.stringify(s.length > 40 ? s.slice(0, 37) + '…' : s);
}

/** A label cell (cluster id, cell of a covariate): trimmed text, `null` for missing. */
export function cellLabel(cell: Cell): string | null {
  if (cell === null || cell === undefined) return null;
  if (typeof cell === 'number') return Number.isFinite(cell) ? String(cell) : null;
  if (typeof cell === 'boolean') return cell ? 'TRUE' : 'FALSE';
  const t = trimBlank(cell);
  if (t === '' || MISSING_MARKERS.includes(t.toUpperCase())) return null;
  return t;
}
