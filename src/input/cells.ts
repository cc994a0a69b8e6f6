/**
 * One cell to a number, by the rules of docs/methods.md §1: an empty cell or a
 * missing marker (NA, N/A, #N/A, a lone dot; any case) is missing; TRUE/FALSE
 * (booleans or text) are 1/0; a decimal number is itself; anything else —
 * other text, a non-finite number, hexadecimal — is an error.
 */
import { Cell } from './table';

export const MISSING_MARKERS = ['NA', 'N/A', '#N/A', '.'];

/** A number, `null` for missing, or `undefined` for a value that is not a number. */
export function cellNumber(cell: Cell): number | null | undefined {
  if (cell === null || cell === undefined) return null;
  if (typeof cell === 'number') return Number.isFinite(cell) ? cell : undefined;
  if (typeof cell === 'boolean') return cell ? 1 : 0;
  const s = cell;
  // Fast path: plain decimal numbers.
  const v = +s;
  if (v === v && s.length > 0) {
    const c0 = s.charCodeAt(0);
    const c1 = s.length > 1 ? s.charCodeAt(1) | 32 : 0;
    // Reject '0x…', '0b…', '0o…' (Number accepts them) and 'Infinity'; accept an
    // all-blank string only as missing.
    if (Number.isFinite(v) && !(c0 === 48 && (c1 === 120 || c1 === 98 || c1 === 111))) {
      if (c0 === 32 || c0 === 9) return s.trim() === '' ? null : cellNumber(s.trim());
      return v;
    }
  }
  const t = s.trim();
  if (t === '') return null;
  const u = t.toUpperCase();
  if (MISSING_MARKERS.includes(u)) return null;
  if (u === 'TRUE') return 1;
  if (u === 'FALSE') return 0;
  return undefined;
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
  const t = cell.trim();
  if (t === '' || MISSING_MARKERS.includes(t.toUpperCase())) return null;
  return t;
}
