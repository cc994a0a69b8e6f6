/**
 * An .xlsx workbook (as bytes) to a Table, through exceljs. The first
 * worksheet unless `sheet` names one; the first row is the header. Formula
 * cells give their cached result; rich text gives its plain text; dates give
 * their serial-free ISO text (and so are rejected as numbers, by name).
 * Merged cells: only the top-left cell of a merged range holds the value;
 * the other cells of the range are blank, as Excel treats them.
 */
import type ExcelJS from 'exceljs';
import { CutlineError } from '../engine';
import { Cell, Table, tableFromRows } from './table';

function plain(v: ExcelJS.CellValue): Cell {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean') return v;
  if (v instanceof Date) return v.toISOString();
  if (typeof v === 'object') {
    if ('result' in v) return plain((v as ExcelJS.CellFormulaValue).result as ExcelJS.CellValue);
    // A formula the writing program never calculated: say so rather than "[object Object]".
    if ('formula' in v || 'sharedFormula' in v) return `a formula with no saved value (=${(v as ExcelJS.CellFormulaValue).formula ?? '…'})`;
    if ('richText' in v) return (v as ExcelJS.CellRichTextValue).richText.map((t) => t.text).join('');
    if ('text' in v) return String((v as ExcelJS.CellHyperlinkValue).text);
    if ('error' in v) return String((v as ExcelJS.CellErrorValue).error);
  }
  return String(v);
}

export async function parseXlsx(bytes: ArrayBuffer | Uint8Array, sheet?: string, source = 'the workbook'): Promise<Table> {
  // Loaded on demand: exceljs takes about 170 ms to load, which a CSV check need not pay.
  const mod = (await import('exceljs')) as unknown as { Workbook?: typeof ExcelJS.Workbook; default?: { Workbook: typeof ExcelJS.Workbook } };
  const Workbook = mod.Workbook ?? mod.default!.Workbook;
  const wb = new Workbook();
  try {
    await wb.xlsx.load(bytes as ArrayBuffer);
  } catch {
    throw new CutlineError(`${source} cannot be read as an .xlsx workbook: open it in a spreadsheet and save it again as .xlsx (or as CSV UTF-8)`);
  }
  const ws = sheet === undefined ? wb.worksheets[0] : wb.getWorksheet(sheet);
  if (!ws) {
    const names = wb.worksheets.map((w) => JSON.stringify(w.name)).join(', ');
    throw new CutlineError(
      sheet === undefined ? `${source} has no worksheet` : `--sheet: no worksheet named ${JSON.stringify(sheet)}; the workbook has ${names}`,
    );
  }
  const rows: Cell[][] = [];
  const width = ws.columnCount;
  ws.eachRow({ includeEmpty: true }, (row, rowNumber) => {
    const cells: Cell[] = new Array(width).fill(null);
    row.eachCell({ includeEmpty: false }, (cell, col) => {
      // A merged range keeps its value in the top-left cell; exceljs repeats it in
      // the hidden cells, which Excel itself treats as blank.
      if (cell.isMerged && cell.master !== cell && cell.master.address !== cell.address) return;
      if (col <= width) cells[col - 1] = plain(cell.value);
    });
    rows[rowNumber - 1] = cells;
  });
  for (let r = 0; r < rows.length; r++) if (!rows[r]) rows[r] = new Array(width).fill(null);
  while (rows.length > 1 && rows[rows.length - 1].every((c) => c === null || c === '')) rows.pop();
  if (rows.length === 0 || rows.every((r) => r.every((c) => c === null || c === ''))) {
    const others = sheet === undefined && wb.worksheets.length > 1 ? `; choose a worksheet with --sheet (the workbook has ${wb.worksheets.map((w) => JSON.stringify(w.name)).join(', ')})` : '';
    throw new CutlineError(`${source}: the worksheet ${JSON.stringify(ws.name)} is empty${others}`);
  }
  const table = tableFromRows(rows);
  if (table.rowCount === 0) throw new CutlineError(`${source}: the worksheet ${JSON.stringify(ws.name)} has a header but no data rows: the data must start on row 2, below the column names`);
  return table;
}
