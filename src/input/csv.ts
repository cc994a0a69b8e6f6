/**
 * CSV text (a string, or UTF-8 bytes as read from a file) to a Table
 * (RFC 4180). A text with a quote character anywhere is parsed by Papa Parse,
 * a well-kept CSV parser. A text with no quote character cannot hold a quoted
 * field, so RFC 4180 reduces to lines split at CR LF or LF and fields split at
 * the delimiter: Cutline scans such texts itself, on the bytes, recording
 * field offsets only (ASCII delimiters and digits never occur inside a UTF-8
 * multibyte character), because Papa Parse needs about 1.5 s for a million
 * rows here and the whole check has a 1 s budget. test/input/csv.test.ts checks the
 * two paths agree on random texts.
 *
 * Line endings: LF, CR LF, or a lone CR (classic Mac OS files), in any mix.
 * The delimiter is a comma, or a semicolon or tab when the header line holds
 * one of those and no comma, counting only characters outside quoted names
 * (a semicolon file may quote a header "cost, in €"). A byte-order mark is
 * dropped; UTF-16 text is refused with a hint to save it as UTF-8. A blank
 * line (nothing, or only blank-looking characters such as spaces and
 * non-breaking spaces) in the middle is a row of empty cells (dropped later
 * as missing, and counted); blank lines at the end are ignored.
 */
import Papa from 'papaparse';
import { CutlineError } from '../engine';
import { trimBlank } from './cells';
import { decimalOrNaN, fastNumber, isBlank } from './fastNumber';
import { Table } from './table';

/** The delimiter from the header line, counting only characters outside quoted names. */
function detectDelimiter(headerLine: string): string {
  const bare = headerLine.replace(/"[^"]*("|$)/g, '');
  if (bare.includes(',')) return ',';
  if (bare.includes(';')) return ';';
  if (bare.includes('\t')) return '\t';
  return ',';
}

/**
 * True for text that looks like UTF-16 (a UTF-16 byte-order mark, or a zero
 * byte in every other position as ASCII text in UTF-16 has), which a CSV
 * reader for UTF-8 would see as noise.
 */
export function looksLikeUtf16(bytes: Uint8Array): boolean {
  if (bytes.length >= 2 && ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff))) return true;
  const m = Math.min(bytes.length, 4096) & ~1;
  if (m < 4) return false;
  let even = 0;
  let odd = 0;
  let text = 0;
  const printable = (b: number): boolean => b === 9 || b === 10 || b === 13 || b >= 32;
  for (let i = 0; i < m; i += 2) {
    if (bytes[i] === 0) even++;
    if (bytes[i + 1] === 0) odd++;
    // The other byte of each pair: the text's characters (mostly printable when it is text).
    if (printable(bytes[i]) || printable(bytes[i + 1])) text++;
  }
  const half = m / 2;
  return Math.max(even, odd) >= 0.4 * half && Math.min(even, odd) <= 0.05 * half && text >= 0.9 * half;
}

/** Which of the two readers parses a text: Papa Parse when it holds a quote, else the byte scanner. */
export type CsvReader = 'quoted' | 'plain';

/**
 * `reader` forces one of the two readers (the property test compares them);
 * by default a text with a quote character goes to Papa Parse.
 */
export function parseCsv(input: string | Uint8Array, source = 'the CSV file', reader?: CsvReader): Table {
  let bytes = typeof input === 'string' ? new TextEncoder().encode(input) : input;
  if (looksLikeUtf16(bytes)) {
    throw new CutlineError(
      `${source} is UTF-16 text, and Cutline reads CSV files as UTF-8: save it again as UTF-8 (in Excel: Save As, "CSV UTF-8 (Comma delimited)")`,
    );
  }
  if (bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) bytes = bytes.subarray(3);
  let nonBlank = false;
  for (let i = 0; i < bytes.length && !nonBlank; i++) nonBlank = !(bytes[i] === 32 || (bytes[i] >= 9 && bytes[i] <= 13));
  if (!nonBlank) throw new CutlineError(`${source} is empty (it holds no characters but blanks): give a file whose first line names the columns and whose next lines hold the data`);
  // The header line ends at the first line break: LF, CR LF, or a lone CR (classic Mac files).
  let firstEol = 0;
  while (firstEol < bytes.length && bytes[firstEol] !== 10 && bytes[firstEol] !== 13) firstEol++;
  const headerLine = decoder.decode(bytes.subarray(0, firstEol));
  const delim = detectDelimiter(headerLine);
  const use = reader ?? (bytes.indexOf(34) >= 0 ? 'quoted' : 'plain');
  const table = use === 'quoted' ? parseWithPapa(decoder.decode(bytes), delim, source) : scanPlain(bytes, delim, source);
  if (table.header.every((h) => h === '')) throw new CutlineError(`${source} has no header line: its first line must name the columns (score, treated, outcomes …)`);
  if (table.rowCount === 0) throw new CutlineError(`${source} has a header but no data rows: add the data below the header line`);
  return table;
}

const decoder = new TextDecoder('utf-8');

/** A line holding one field of blank-looking characters only (spaces, tabs, non-breaking spaces…): a blank line. */
const blankLine = (r: string[]): boolean => r.length === 1 && trimBlank(r[0]) === '';

function parseWithPapa(text: string, delim: string, source: string): Table {
  // Every line ending (LF, CR LF, lone CR, mixed) becomes LF, as the plain scanner reads them.
  const res = Papa.parse<string[]>(text.replace(/\r\n?/g, '\n'), { delimiter: delim, newline: '\n', skipEmptyLines: false });
  const rows = res.data;
  while (rows.length > 1 && rows[rows.length - 1].every((c) => trimBlank(c) === '')) rows.pop();
  const bad = res.errors.find((e) => e.type === 'Quotes');
  if (bad) throw new CutlineError(`${source}: unbalanced quotes near row ${(bad.row ?? 0) + 1}: a field that opens with a quote must close with one (write a quote inside a field as two quotes)`);
  const header = (rows[0] ?? []).map((h) => trimBlank(h));
  const body = rows.slice(1);
  body.forEach((r, i) => checkWidth(r.length, header.length, i + 2, source, blankLine(r), delim));
  return {
    header,
    rowCount: body.length,
    firstRow: 2,
    get: (r, c) => (blankLine(body[r]) && header.length > 1 ? '' : body[r][c]),
  };
}

function checkWidth(width: number, expected: number, row: number, source: string, blank: boolean, delim: string): void {
  if (width !== expected && !blank) {
    // Extra commas are often decimal commas of a file written for a comma-decimal locale.
    const hint =
      width > expected && delim === ','
        ? '; if the file writes numbers with a decimal comma (3,5), save it with semicolons between fields, or with decimal points'
        : '';
    throw new CutlineError(`${source}, row ${row}: ${width} field${width === 1 ? '' : 's'} where the header has ${expected}${hint}`);
  }
}

/** Offsets making every field of the row at `base` empty. */
function blankRow(offsets: Int32Array, base: number, w: number, i: number): void {
  for (let f = 0; f < w; f++) offsets[base + f] = i;
  offsets[base + w] = i + 1;
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

/** True when bytes [a, b) hold only blank-looking characters (ASCII blanks, or Unicode ones such as NBSP). */
function blankBytes(text: Uint8Array, a: number, b: number): boolean {
  if (isBlank(text, a, b)) return true;
  for (let i = a; i < b; i++) if (text[i] >= 0x80) return trimBlank(decoder.decode(text.subarray(a, b))) === '';
  return false;
}

function scanPlain(text: Uint8Array, delim: string, source: string): Table {
  let end = text.length;
  // Ignore trailing blank lines.
  while (end > 0 && (text[end - 1] === 10 || text[end - 1] === 13)) end--;
  const d = delim.charCodeAt(0);
  let pos = 0;
  while (pos < end && text[pos] !== 10 && text[pos] !== 13) pos++;
  const header = decoder.decode(text.subarray(0, pos)).split(delim).map(trimBlank);
  const w = header.length;
  // offsets[r*(w+1)+c] = start of field c in row r; entry w = end of the row + 1.
  let cap = 1 << 16;
  let offsets = new Int32Array(cap * (w + 1));
  let rows = 0;
  let i = pos + (text[pos] === 13 && text[pos + 1] === 10 ? 2 : 1);
  // The first row of the wrong width that holds only delimiters and blanks (an error unless only blank rows follow).
  let pending = -1;
  let pendingWidth = 0;
  const rowBlank = (base: number): boolean => {
    for (let f = 0; f < w; f++) if (!blankBytes(text, offsets[base + f], offsets[base + f + 1] - 1)) return false;
    return true;
  };
  // One pass over the bytes: a line ends at LF, CR LF or a lone CR; fields at the delimiter.
  while (i <= end && pos < end) {
    if (rows === cap) {
      cap *= 2;
      const grown = new Int32Array(cap * (w + 1));
      grown.set(offsets);
      offsets = grown;
    }
    const base = rows * (w + 1);
    offsets[base] = i;
    let c = 0;
    let j = i;
    for (; j < end; j++) {
      const b = text[j];
      if (b === 10 || b === 13) break;
      if (b === d) {
        c++;
        if (c < w) offsets[base + c] = j + 1;
      }
    }
    if (c === 0 && w > 1 && blankBytes(text, i, j)) {
      // A blank line (nothing, or only blank-looking characters): every field empty.
      blankRow(offsets, base, w, i);
    } else if (c + 1 !== w) {
      // A row of the wrong width is an error, unless it is blank (delimiters and blanks only) and
      // only blank rows follow it: blank rows at the end are ignored, as in parseWithPapa.
      if (!delimitedBlank(text, i, j, d)) checkWidth(pending >= 0 ? pendingWidth : c + 1, w, (pending >= 0 ? pending : rows) + 2, source, false, delim);
      if (pending < 0) {
        pending = rows;
        pendingWidth = c + 1;
      }
      blankRow(offsets, base, w, i);
    } else {
      offsets[base + w] = j + 1;
      if (pending >= 0 && !rowBlank(base)) checkWidth(pendingWidth, w, pending + 2, source, false, delim);
    }
    rows++;
    i = j + (text[j] === 13 && text[j + 1] === 10 ? 2 : 1);
  }
  // Blank rows at the end are ignored, as Papa Parse's rows are (parseWithPapa).
  while (rows > 0 && rowBlank((rows - 1) * (w + 1))) rows--;
  if (pending >= 0 && pending < rows) checkWidth(pendingWidth, w, pending + 2, source, false, delim);
  return {
    header,
    rowCount: rows,
    firstRow: 2,
    get: (r, c) => {
      const base = r * (w + 1);
      return decoder.decode(text.subarray(offsets[base + c], offsets[base + c + 1] - 1));
    },
    fastNumber: (r, c) => {
      const base = r * (w + 1);
      return fastNumber(text, offsets[base + c], offsets[base + c + 1] - 1);
    },
    fastColumn: (c) => {
      const values = new Float64Array(rows);
      const missing = new Uint8Array(rows);
      const slow: number[] = [];
      for (let r = 0, base = c; r < rows; r++, base += w + 1) {
        const a = offsets[base];
        const b = offsets[base + 1] - 1;
        const f = decimalOrNaN(text, a, b);
        if (f === f) values[r] = f;
        else if (isBlank(text, a, b)) missing[r] = 1;
        else slow.push(r);
      }
      return { values, missing, slow: Int32Array.from(slow) };
    },
  };
}
