/**
 * The byte scanner for CSV texts without a quote character (csv.ts): lines
 * split at LF, CR LF or a lone CR, fields at the delimiter (ASCII delimiters
 * and digits never occur inside a UTF-8 multibyte character).
 *
 * One pass over the bytes finds the rows and, for the columns the caller
 * names as `numeric`, reads each field's number on the way (a sign, digits,
 * a point, digits: with at most 15 digits the mantissa and 10^k are exact
 * doubles, so m/10^k is the correctly rounded value Number() gives — Clinger
 * 1990, as in fastNumber.ts). Any other field (blanks, exponents, words,
 * markers, more digits) is left to decimalOrNaN and then to the general cell
 * rules, so the fast read never changes a value. Only each row's start is
 * kept: a field's text is found by walking its row, which the cell rules
 * need for a few cells only. Reading the numbers during the scan, instead of
 * recording every field's offsets and parsing them in a second pass, halves
 * the time to read a million rows (README "Speed").
 */
import { CutlineError } from '../engine';
import { trimBlank } from './cells';
import { decimalOrNaN, isBlank } from './fastNumber';
import { Table } from './table';

const decoder = new TextDecoder('utf-8');
const POW10 = Float64Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

export function checkWidth(width: number, expected: number, row: number, source: string, blank: boolean, delim: string): void {
  if (width !== expected && !blank) {
    // Extra commas are often decimal commas of a file written for a comma-decimal locale.
    const hint =
      width > expected && delim === ','
        ? '; if the file writes numbers with a decimal comma (3,5), save it with semicolons between fields, or with decimal points'
        : '';
    throw new CutlineError(`${source}, row ${row}: ${width} field${width === 1 ? '' : 's'} where the header has ${expected}${hint}`);
  }
}

/** True when bytes [a, b) hold only blank-looking characters (ASCII blanks, or Unicode ones such as NBSP). */
function blankBytes(text: Uint8Array, a: number, b: number): boolean {
  if (isBlank(text, a, b)) return true;
  for (let i = a; i < b; i++) if (text[i] >= 0x80) return trimBlank(decoder.decode(text.subarray(a, b))) === '';
  return false;
}

/** True when the line [a, b) holds only delimiters and blank-looking characters. */
function delimitedBlank(text: Uint8Array, a: number, b: number, d: number): boolean {
  let s = a;
  for (let i = a; i <= b; i++) {
    if (i === b || text[i] === d) {
      if (!blankBytes(text, s, i)) return false;
      s = i + 1;
    }
  }
  return true;
}

/**
 * Scans the line starting at `i` (ending at LF, CR or `end`): writes the
 * number of each wanted field (want[c] = its slot, −1 when not wanted) to
 * cols[slot][r] — NaN when the field is not a plain short decimal — and its
 * field count to fields[0]; returns the position of the line's end.
 */
function scanLine(text: Uint8Array, i: number, end: number, d: number, want: Int32Array, cols: Float64Array[], r: number, fields: Int32Array): number {
  const w = want.length;
  let c = 0;
  let j = i;
  for (;;) {
    const k = c < w ? want[c] : -1;
    let b = j < end ? text[j] : 10;
    if (k >= 0) {
      let neg = false;
      if (b === 45 || b === 43) {
        neg = b === 45;
        j++;
        b = j < end ? text[j] : 10;
      }
      let m = 0;
      let digits = 0;
      let scale = 0;
      while (b >= 48 && b <= 57) {
        m = m * 10 + (b - 48);
        digits++;
        j++;
        b = j < end ? text[j] : 10;
      }
      if (b === 46) {
        j++;
        b = j < end ? text[j] : 10;
        while (b >= 48 && b <= 57) {
          m = m * 10 + (b - 48);
          digits++;
          scale++;
          j++;
          b = j < end ? text[j] : 10;
        }
      }
      let v = NaN;
      if ((b === d || b === 10 || b === 13) && digits > 0 && digits <= 15) {
        v = m / POW10[scale];
        if (neg) v = -v;
      } else {
        while (!(b === d || b === 10 || b === 13)) {
          j++;
          b = j < end ? text[j] : 10;
        }
      }
      cols[k][r] = v;
    } else {
      while (!(b === d || b === 10 || b === 13)) {
        j++;
        b = j < end ? text[j] : 10;
      }
    }
    if (b !== d) {
      fields[0] = c + 1;
      return j;
    }
    c++;
    j++;
  }
}

/**
 * The plain text as a Table; `numeric` picks the columns (by index in the
 * header) whose numbers are read during the scan. A blank line (nothing, or
 * only blank-looking characters) is a row of empty cells; a row of the wrong
 * width is an error naming it, unless it holds only delimiters and blanks and
 * only blank rows follow it; blank rows at the end are dropped.
 */
export function scanPlain(text: Uint8Array, delim: string, source: string, numeric?: (header: string[]) => number[]): Table {
  let end = text.length;
  // Ignore trailing blank lines.
  while (end > 0 && (text[end - 1] === 10 || text[end - 1] === 13)) end--;
  const d = delim.charCodeAt(0);
  let pos = 0;
  while (pos < end && text[pos] !== 10 && text[pos] !== 13) pos++;
  const header = decoder.decode(text.subarray(0, pos)).split(delim).map(trimBlank);
  const w = header.length;
  const want = new Int32Array(w).fill(-1);
  const wanted: number[] = [];
  for (const c of numeric ? numeric(header) : []) {
    if (c >= 0 && c < w && want[c] < 0) want[c] = wanted.push(c) - 1;
  }
  let i = pos + (text[pos] === 13 && text[pos + 1] === 10 ? 2 : 1);
  // Room for the rows the first 64 KiB foretell (grown by doubling if they lie).
  const sample = Math.min(end, i + 65536);
  let lines = 1;
  // A line ends at LF, or at a CR not followed by LF (CR LF counts once).
  for (let t = i; t < sample; t++) if (text[t] === 10 || (text[t] === 13 && text[t + 1] !== 10)) lines++;
  let cap = Math.max(1024, Math.ceil((lines * 1.05 * Math.max(0, end - i)) / Math.max(1, sample - i)));
  let starts = new Int32Array(cap);
  let blank = new Uint8Array(cap);
  let cols = wanted.map(() => new Float64Array(cap));
  const fields = new Int32Array(1);
  let rows = 0;
  // The first row of the wrong width that holds only delimiters and blanks (an error unless only blank rows follow).
  let pending = -1;
  let pendingWidth = 0;
  /** Start and end of field c of row r (an empty span for a blank row). */
  const span = (r: number, c: number): [number, number] => {
    let a = starts[r];
    if (blank[r]) return [a, a];
    for (let f = 0; f < c; f++) {
      while (text[a] !== d) a++;
      a++;
    }
    let b = a;
    while (b < end && text[b] !== d && text[b] !== 10 && text[b] !== 13) b++;
    return [a, b];
  };
  const rowBlank = (r: number): boolean => {
    for (let c = 0; c < w; c++) {
      const [a, b] = span(r, c);
      if (!blankBytes(text, a, b)) return false;
    }
    return true;
  };
  while (i <= end && pos < end) {
    if (rows === cap) {
      cap *= 2;
      const grow = <T extends Int32Array | Uint8Array | Float64Array>(a: T, make: (n: number) => T): T => {
        const g = make(cap);
        g.set(a);
        return g;
      };
      starts = grow(starts, (n) => new Int32Array(n));
      blank = grow(blank, (n) => new Uint8Array(n));
      cols = cols.map((a) => grow(a, (n) => new Float64Array(n)));
    }
    starts[rows] = i;
    const j = scanLine(text, i, end, d, want, cols, rows, fields);
    const width = fields[0];
    if (width === 1 && w > 1 && blankBytes(text, i, j)) {
      // A blank line (nothing, or only blank-looking characters): every field empty.
      blank[rows] = 1;
    } else if (width !== w) {
      // A row of the wrong width is an error, unless it is blank (delimiters and blanks only) and
      // only blank rows follow it: blank rows at the end are ignored, as in the quoted reader.
      if (!delimitedBlank(text, i, j, d)) checkWidth(pending >= 0 ? pendingWidth : width, w, (pending >= 0 ? pending : rows) + 2, source, false, delim);
      if (pending < 0) {
        pending = rows;
        pendingWidth = width;
      }
      blank[rows] = 1;
    } else if (pending >= 0 && !rowBlank(rows)) {
      checkWidth(pendingWidth, w, pending + 2, source, false, delim);
    }
    if (blank[rows]) for (const col of cols) col[rows] = NaN;
    rows++;
    i = j + (text[j] === 13 && text[j + 1] === 10 ? 2 : 1);
  }
  // Blank rows at the end are ignored, as the quoted reader's are.
  while (rows > 0 && rowBlank(rows - 1)) rows--;
  if (pending >= 0 && pending < rows) checkWidth(pendingWidth, w, pending + 2, source, false, delim);
  const n = rows;
  /** A column's values, missing mask and the rows the general cell rules must decide; `read` holds the scan's numbers. */
  const column = (c: number, read?: Float64Array) => {
    const values = read ? read.subarray(0, n) : new Float64Array(n);
    const missing = new Uint8Array(n);
    const slow: number[] = [];
    for (let r = 0; r < n; r++) {
      if (read && values[r] === values[r]) continue;
      const [a, b] = span(r, c);
      const f = decimalOrNaN(text, a, b);
      if (f === f) values[r] = f;
      else {
        values[r] = 0;
        if (isBlank(text, a, b)) missing[r] = 1;
        else slow.push(r);
      }
    }
    return { values, missing, slow: Int32Array.from(slow) };
  };
  return {
    header,
    rowCount: n,
    firstRow: 2,
    get: (r, c) => {
      const [a, b] = span(r, c);
      return decoder.decode(text.subarray(a, b));
    },
    fastColumn: (c) => {
      const slot = c >= 0 && c < w ? want[c] : -1;
      if (slot < 0) return column(c);
      // Handed over once: the caller owns the values (a second read of the column parses again).
      const read = cols[slot];
      want[c] = -1;
      return column(c, read);
    },
  };
}
