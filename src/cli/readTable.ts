/**
 * Reads the input FILE (CSV or XLSX) into a Table. The file is only read,
 * never written. XLSX is recognised by its zip signature or its extension.
 * The bytes and the kind come back with the table: the report writers need
 * them too, and the file is read, and its kind decided, once.
 */
import * as fs from 'fs';
import * as path from 'path';
import { CutlineError } from '../engine';
import { columnIndex } from '../input/columns';
import { looksLikeUtf16, parseCsv } from '../input/csv';
import { Table } from '../input/table';
import { parseXlsx } from '../input/xlsx';

/** `numeric`: names of the columns to be read as numbers (a CSV text reads them as it is scanned). */
export async function readTable(file: string, sheet?: string, numeric: string[] = []): Promise<{ table: Table; bytes: Buffer; isXlsx: boolean }> {
  let bytes: Buffer;
  try {
    const st = fs.statSync(file);
    if (st.isDirectory()) throw new CutlineError(`${file} is a folder, not a CSV or XLSX file`);
    bytes = fs.readFileSync(file);
  } catch (e) {
    if (e instanceof CutlineError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') throw new CutlineError(`${file}: no such file`);
    if (code === 'EACCES') throw new CutlineError(`${file}: permission denied`);
    throw new CutlineError(`${file}: cannot be read (${code ?? 'unknown error'})`);
  }
  const ext = path.extname(file).toLowerCase();
  const zip = bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 3 && bytes[3] === 4;
  if (!zip && (ext === '.xlsx' || ext === '.xlsm') && !bytes.includes(0) && bytes.length > 0) {
    throw new CutlineError(`${file} is named as an .xlsx workbook but holds plain text; if it is a CSV file, give it a .csv name`);
  }
  if (zip || ext === '.xlsx' || ext === '.xlsm') return { table: await parseXlsx(bytes, sheet, file), bytes, isXlsx: true };
  if (sheet !== undefined) throw new CutlineError(`--sheet applies to XLSX workbooks; ${file} is read as CSV`);
  // UTF-16 text holds zero bytes too: parseCsv refuses it with a hint to save it as UTF-8.
  if (bytes.includes(0) && !looksLikeUtf16(bytes)) throw new CutlineError(`${file} is neither a CSV text nor an XLSX workbook (it holds binary data): save the data as CSV UTF-8 or .xlsx`);
  const wanted = (header: string[]) => numeric.map((name) => columnIndex(header, name));
  // The Buffer itself (a Uint8Array): its indexOf, which looks for a quote character, runs at memchr speed.
  return { table: parseCsv(bytes, file, undefined, wanted), bytes, isXlsx: false };
}
