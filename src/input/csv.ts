/**
 * CSV text (a string, or UTF-8 bytes as read from a file) to a Table
 * (RFC 4180). A text with a quote character anywhere is parsed by Papa Parse,
 * a well-kept CSV parser. A text with no quote character cannot hold a quoted
 * field, so RFC 4180 reduces to lines split at CR LF or LF and fields split at
 * the delimiter: Cutline scans such texts itself, on the bytes, recording
 * row starts and the numbers of the wanted columns (plainCsv.ts), because
 * Papa Parse needs about 1.5 s for a million rows here and the whole check
 * has a 1 s budget. test/input/csv.test.ts checks the
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
import { checkWidth, scanPlain } from './plainCsv';
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
 * by default a text with a quote character goes to Papa Parse. `numeric`
 * names (by index in the header) the columns the caller will read as
 * numbers: the byte scanner reads them during its pass (plainCsv.ts).
 */
export function parseCsv(input: string | Uint8Array, source = 'the CSV file', reader?: CsvReader, numeric?: (header: string[]) => number[]): Table {
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
  const table = use === 'quoted' ? parseWithPapa(decoder.decode(bytes), delim, source) : scanPlain(bytes, delim, source, numeric);
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
