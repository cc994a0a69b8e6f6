/**
 * The report files of one checked file: the summary model (src/report) built
 * from the check's result and where its data sit, then the workbook
 * (`--out`, .xlsx) and the HTML page (`--html`). For an XLSX input the
 * workbook is a copy of the input with every sheet kept and the summary
 * added; for a CSV input it holds a data sheet and the summary.
 */
import * as path from 'path';
import { CheckOptions, CheckResult, CutlineError } from '../engine';
import { Table } from '../input/table';
import { htmlReport } from '../report/htmlReport';
import { buildSummary, DataRanges } from '../report/summaryModel';
import { SummaryModel } from '../report/summaryTypes';
import { svgPng } from '../report/svgPng';
import { addSummarySheet, dataWorkbook, loadWorkbook, workbookBytes } from '../report/xlsxReport';
import { writeAtomic } from './outputPaths';

/** Rows of an Excel worksheet (2^20). */
const MAX_SHEET_ROWS = 1048576;

export interface ReportRequest {
  xlsx?: string;
  html?: string;
}

export interface SourceFile {
  file: string;
  bytes: Uint8Array;
  /** XLSX: the sheet read (undefined: the first). */
  sheet?: string;
  isXlsx: boolean;
  table: Table;
}

function ranges(src: SourceFile, sheetName: string): DataRanges {
  const columns: Record<string, number> = {};
  src.table.header.forEach((h, k) => {
    if (!(h in columns)) columns[h] = k;
  });
  return { sheet: sheetName, firstRow: src.table.firstRow, lastRow: src.table.firstRow + src.table.rowCount - 1, columns };
}

/** Builds the model and writes the files asked for; returns the model (for an index of many files). */
export async function writeReports(
  src: SourceFile,
  result: CheckResult,
  options: CheckOptions,
  names: { score: string; treated: string },
  req: ReportRequest,
): Promise<SummaryModel> {
  if (req.xlsx && !src.isXlsx && src.table.rowCount + 1 > MAX_SHEET_ROWS) {
    throw new CutlineError(
      `--out: ${path.basename(src.file)} has ${src.table.rowCount} data rows, more than a worksheet holds (${MAX_SHEET_ROWS - 1} below its header); write the web page (--html) instead`,
    );
  }
  const wb = src.isXlsx ? await loadWorkbook(src.bytes) : await dataWorkbook(src.table, 'Data');
  const dataSheet = src.isXlsx ? (src.sheet ?? wb.worksheets[0].name) : 'Data';
  const model = buildSummary(result, {
    source: path.basename(src.file),
    data: ranges(src, dataSheet),
    options,
    takenSheetNames: wb.worksheets.map((w) => w.name),
    names,
  });
  if (req.xlsx) {
    addSummarySheet(wb, model, svgPng);
    writeAtomic('--out', req.xlsx, await workbookBytes(wb));
  }
  if (req.html) writeAtomic('--html', req.html, htmlReport(model));
  return model;
}
