/**
 * CSV text (a string, or UTF-8 bytes as read from a file) to a Table
 * (RFC 4180). A text with a quote character anywhere is parsed by Papa Parse,
 * a well-kept CSV parser. A text with no quote character cannot hold a quoted
 * field, so RFC 4180 reduces to lines split at CR LF or LF and fields split at
 * the delimiter: Cutline scans such texts itself, on the bytes, recording
 * field offsets only (ASCII delimiters and digits never occur inside a UTF-8
 * multibyte character), because Papa Parse needs about 1.5 s for a million
 * rows here and the whole check has a 1 s budget. test/csv.test.ts checks the
 * two paths agree on random texts.
 *
 * The delimiter is a comma, or a semicolon or tab when the header line holds
 * one of those and no comma. A byte-order mark is dropped. A blank line in
 * the middle is a row of empty cells (dropped later as missing, and counted);
 * blank lines at the end are ignored.
 */
import Papa from 'papaparse';
import { CutlineError } from '../engine';
import { decimalOrNaN, fastNumber, isBlank } from './fastNumber';
import { Table } from './table';

function detectDelimiter(headerLine: string): string {
  if (headerLine.includes(',')) return ',';
  if (headerLine.includes(';')) return ';';
  if (headerLine.includes('\t')) return '\t';
  return ',';
}

export function parseCsv(input: string | Uint8Array, source = 'the CSV file'): Table {
  let bytes = typeof input === 'string' ? new TextEncoder().encode(input) : input;
  if (bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) bytes = bytes.subarray(3);
  let nonBlank = false;
  for (let i = 0; i < bytes.length && !nonBlank; i++) nonBlank = !(bytes[i] === 32 || bytes[i] === 9 || bytes[i] === 10 || bytes[i] === 13);
  if (!nonBlank) throw new CutlineError(`${source} is empty`);
  let firstEol = bytes.indexOf(10);
  if (firstEol < 0) firstEol = bytes.length;
  const headerLine = decoder.decode(bytes.subarray(0, firstEol)).replace(/\r$/, '');
  const delim = detectDelimiter(headerLine);
  const table = bytes.indexOf(34) >= 0 ? parseWithPapa(decoder.decode(bytes), delim, source) : scanPlain(bytes, delim, source);
  if (table.header.every((h) => h === '')) throw new CutlineError(`${source} has no header line`);
  if (table.rowCount === 0) throw new CutlineError(`${source} has a header but no data rows`);
  return table;
}

const decoder = new TextDecoder('utf-8');

function parseWithPapa(text: string, delim: string, source: string): Table {
  const res = Papa.parse<string[]>(text, { delimiter: delim, skipEmptyLines: false });
  const rows = res.data;
  while (rows.length > 0 && rows[rows.length - 1].every((c) => c.trim() === '')) rows.pop();
  const bad = res.errors.find((e) => e.type === 'Quotes');
  if (bad) throw new CutlineError(`${source}: unbalanced quotes near row ${(bad.row ?? 0) + 1}`);
  const header = (rows[0] ?? []).map((h) => h.trim());
  const body = rows.slice(1);
  body.forEach((r, i) => checkWidth(r.length, header.length, i + 2, source, r.length === 1 && r[0].trim() === ''));
  return {
    header,
    rowCount: body.length,
    firstRow: 2,
    get: (r, c) => (body[r].length === 1 && header.length > 1 ? '' : body[r][c]),
  };
}

function checkWidth(width: number, expected: number, row: number, source: string, blank: boolean): void {
  if (width !== expected && !blank) {
    throw new CutlineError(`${source}, row ${row}: ${width} field${width === 1 ? '' : 's'} where the header has ${expected}`);
  }
}

function scanPlain(text: Uint8Array, delim: string, source: string): Table {
  let end = text.length;
  // Ignore trailing blank lines.
  while (end > 0 && (text[end - 1] === 10 || text[end - 1] === 13)) end--;
  const d = delim.charCodeAt(0);
  let pos = text.indexOf(10);
  if (pos < 0 || pos >= end) pos = end;
  const header = decoder.decode(text.subarray(0, pos)).replace(/\r$/, '').split(delim).map((h) => h.trim());
  const w = header.length;
  // offsets[r*(w+1)+c] = start of field c in row r; entry w = end of the row + 1.
  let cap = 1 << 16;
  let offsets = new Int32Array(cap * (w + 1));
  let rows = 0;
  let i = pos + 1;
  // One pass over the bytes: a line ends at LF (a CR before it is dropped), fields at the delimiter.
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
      if (b === 10) break;
      if (b === d) {
        c++;
        if (c < w) offsets[base + c] = j + 1;
      }
    }
    let lineEnd = j;
    if (lineEnd > i && text[lineEnd - 1] === 13) lineEnd--;
    if (lineEnd === i) {
      // blank line: every field empty
      for (let f = 0; f <= w; f++) offsets[base + f] = i;
      offsets[base + w] = i + 1;
    } else {
      if (c + 1 !== w) checkWidth(c + 1, w, rows + 2, source, false);
      // A CR before the LF belongs to no field.
      if (c + 1 === w) offsets[base + w] = lineEnd + 1;
    }
    rows++;
    i = j + 1;
  }
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
