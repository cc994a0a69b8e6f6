/**
 * The summary model written into an exceljs workbook: a new sheet (named by
 * the model, never one the workbook has) holding the settings block, every
 * result table with its values, the CUTLINE.* formulas beside the values as
 * text (outside Excel the worksheet functions cannot run; the sheet's note
 * says so), the verdicts, warnings and cautions, the charts as pictures
 * (PNG rendered from the same SVG as the HTML page) and the tables behind
 * them. The workbook's own sheets are left as they are.
 *
 * @example
 *   const wb = await loadWorkbook(bytes);            // or dataWorkbook(table) for a CSV file
 *   addSummarySheet(wb, model, svgPng);
 *   fs.writeFileSync('report.xlsx', await workbookBytes(wb));
 */
import type ExcelJS from 'exceljs';
import { cellValueOf } from '../input/cellValue';
import { Table } from '../input/table';
import { CHART_HEIGHT, CHART_WIDTH, chartSvg } from './chartSvg';
import { columnLetters, rowOf } from './formulas';
import { SummaryCell, SummaryModel, SummaryTable } from './summaryTypes';

type Workbook = ExcelJS.Workbook;
/** Values and pictures fill columns A to M (what is printed); the formula text starts at column N. */
const PRINTED_COLUMNS = 13;
const FORMULA_COLUMN = 13;
type Worksheet = ExcelJS.Worksheet;

async function exceljs(): Promise<typeof ExcelJS.Workbook> {
  const mod = (await import('exceljs')) as unknown as { Workbook?: typeof ExcelJS.Workbook; default?: { Workbook: typeof ExcelJS.Workbook } };
  return mod.Workbook ?? mod.default!.Workbook;
}

/** An .xlsx file's bytes as a workbook, every sheet as it is. */
export async function loadWorkbook(bytes: Uint8Array): Promise<Workbook> {
  const W = await exceljs();
  const wb = new W();
  await wb.xlsx.load(bytes as unknown as ArrayBuffer);
  return wb;
}

/** A workbook with one sheet holding a table (a CSV file's header and cells; numbers as numbers). */
export async function dataWorkbook(table: Table, sheetName = 'Data'): Promise<Workbook> {
  const W = await exceljs();
  const wb = new W();
  wb.creator = 'Cutline';
  const ws = wb.addWorksheet(sheetName);
  ws.addRow(table.header);
  for (let r = 0; r < table.rowCount; r++) {
    const row: Array<string | number | boolean | null> = [];
    for (let c = 0; c < table.header.length; c++) row.push(cellValueOf(table.get(r, c)));
    ws.addRow(row);
  }
  ws.getRow(1).font = { bold: true };
  ws.views = [{ state: 'frozen', ySplit: 1 }];
  return wb;
}


function put(ws: Worksheet, row: number, col: number, c: SummaryCell): void {
  const x = ws.getCell(row, col + 1);
  x.value = c.value;
  if (typeof c.value === 'string' && col > 0) x.alignment = { horizontal: 'left', indent: 1 };
  if (typeof c.value === 'number') {
    const a = Math.abs(c.value);
    x.numFmt =
      c.format === 'integer' ? '0' : c.format === 'plain' ? 'General' : c.format === 'pvalue' ? '0.000' : a !== 0 && (a >= 1e6 || a < 1e-3) ? '0.000E+00' : a >= 100 ? '0.0' : '0.0000';
  }
}

function heading(ws: Worksheet, row: number, col: number, text: string, size = 12): void {
  const x = ws.getCell(row, col + 1);
  x.value = text;
  x.font = { bold: true, size };
}

/** A table's values from column A, and its formulas as text in a block of the same shape to the right. */
function writeTable(ws: Worksheet, t: SummaryTable): void {
  heading(ws, t.row - 1, 0, t.title);
  t.columns.forEach((c, i) => {
    const x = ws.getCell(t.row, i + 1);
    x.value = c;
    x.font = { bold: true };
    x.border = { bottom: { style: 'thin' } };
  });
  t.rows.forEach((r, j) => r.forEach((c, i) => put(ws, t.row + 1 + j, i, c)));
  const withFormula = t.columns.map((_, i) => t.rows.some((r) => r[i]?.formula !== undefined));
  if (withFormula.some(Boolean)) {
    const start = FORMULA_COLUMN;
    heading(ws, t.row - 1, start, 'Formulas that compute these values live (text; see the note in row 2)', 10);
    let k = 0;
    t.columns.forEach((c, i) => {
      if (!withFormula[i]) return;
      const x = ws.getCell(t.row, start + k + 1);
      x.value = `formula: ${c || t.rows[0]?.[0]?.value || ''}`;
      x.font = { bold: true, italic: true, color: { argb: 'FF555555' } };
      t.rows.forEach((r, j) => {
        const f = r[i]?.formula;
        if (f === undefined) return;
        const y = ws.getCell(t.row + 1 + j, start + k + 1);
        y.value = r[i].spills ? `${f}   (spills over the table)` : f;
        y.font = { color: { argb: 'FF555555' }, size: 9 };
      });
      k++;
    });
  }
  if (t.note) wrapped(ws, t.row + t.rows.length + 1, t.note, { italic: true, size: 9 });
}

/** A line of text across the printed columns, wrapped (LibreOffice and Excel fit the row's height). */
function wrapped(ws: Worksheet, row: number, text: string, font: Partial<ExcelJS.Font> = {}): void {
  ws.mergeCells(row, 1, row, PRINTED_COLUMNS);
  const x = ws.getCell(row, 1);
  x.value = text;
  x.font = font;
  x.alignment = { wrapText: true, vertical: 'top' };
}

/**
 * Adds the summary sheet to `wb`. `png` renders a chart's SVG (svgPng.ts);
 * without it the charts are left out (the tables behind them stay).
 */
export function addSummarySheet(wb: Workbook, m: SummaryModel, png?: (svg: string) => Uint8Array): Worksheet {
  const ws = wb.addWorksheet(m.sheetName, { properties: { tabColor: { argb: 'FF1F4E9C' } } });
  ws.getColumn(1).width = 44;
  for (let c = 2; c <= 10; c++) ws.getColumn(c).width = 16;
  heading(ws, 1, 0, m.title, 14);
  wrapped(ws, 2, m.note, { italic: true, color: { argb: 'FF9C1F1F' } });
  wrapped(ws, 3, `Data: ${m.source} — ${m.dataLine}`);
  const first = m.settings[0];
  const settingsRow = rowOf(first.address) - 1;
  ['name', 'value', 'meaning'].forEach((h, i) => {
    const x = ws.getCell(settingsRow, i + 1);
    x.value = h;
    x.font = { bold: true };
    x.border = { bottom: { style: 'thin' } };
  });
  heading(ws, settingsRow - 1, 0, `Settings (the options passed to every formula are ${m.settingsRange})`);
  for (const s of m.settings) {
    const row = rowOf(s.address);
    ws.getCell(row, 1).value = s.key;
    put(ws, row, 1, { value: s.value, format: s.format });
    ws.getCell(row, 3).value = s.label;
    if (s.formula) {
      ws.getCell(row, FORMULA_COLUMN + 1).value = s.formula;
      ws.getCell(row, FORMULA_COLUMN + 1).font = { color: { argb: 'FF555555' }, size: 9 };
    }
  }
  const f = ws.getCell(settingsRow, FORMULA_COLUMN + 1);
  f.value = 'formula (text) of a computed setting';
  f.font = { bold: true, italic: true, color: { argb: 'FF555555' } };
  for (const t of m.tables) writeTable(ws, t);
  for (const b of m.textBlocks) {
    heading(ws, b.row, 0, b.title);
    b.lines.forEach((l, i) => wrapped(ws, b.row + 1 + i, l, b.id === 'verdicts' ? { bold: true } : {}));
  }
  if (png) {
    m.charts.forEach((c, i) => {
      if (!c.anchor) return;
      heading(ws, c.anchor.row - 1, c.anchor.col, `Figure ${i + 1}. ${c.title}`, 11);
      const id = wb.addImage({ buffer: Buffer.from(png(chartSvg(c))) as unknown as ExcelJS.Buffer, extension: 'png' });
      ws.addImage(id, { tl: { col: c.anchor.col, row: c.anchor.row - 1 }, ext: { width: CHART_WIDTH, height: CHART_HEIGHT }, editAs: 'oneCell' });
    });
  }
  for (const t of m.plotTables) writeTable(ws, t);
  // Printed: the values and the pictures (columns A to M), landscape, one page wide; the formula text
  // further right is for copying, not for reading on paper. exceljs writes '$' before the column
  // itself, so the rows carry theirs here: the name becomes $A$1:$M$n, which LibreOffice also reads.
  const last = columnLetters(PRINTED_COLUMNS - 1);
  ws.pageSetup = { ...ws.pageSetup, orientation: 'landscape', fitToPage: true, fitToWidth: 1, fitToHeight: 0, printArea: `A$1:${last}$${ws.rowCount}` };
  return ws;
}

export async function workbookBytes(wb: Workbook): Promise<Buffer> {
  return Buffer.from(await wb.xlsx.writeBuffer());
}
