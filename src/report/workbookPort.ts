/**
 * The narrow port between the task pane and a workbook: read a block of
 * cells with its header row, list the sheet names, write a planned sheet
 * (sheetPlan.ts) reporting progress, and read values back. Two
 * implementations: the Excel API (excelWorkbook.ts) and, for the browser
 * test, an in-page workbook that evaluates the formulas with a real
 * spreadsheet engine (test/browser/inPageWorkbook.ts).
 *
 * @example
 *   const data = await port.readData({ kind: 'used' });
 *   data.header; // ['id', 'neighbourhood', 'energy_burden', …]
 */
import type { CellFormat } from './summaryTypes';

/** Where the data are: the selected cells, a named table, or the used range of the active sheet. */
export type DataSource = { kind: 'selection' } | { kind: 'table'; name: string } | { kind: 'used' };

/** A cell as a workbook hands it over. */
export type PortCell = string | number | boolean | null;

/** A block of data with its header row. */
export interface DataBlock {
  sheet: string;
  /** The header texts, left to right. */
  header: string[];
  /** The data rows under the header (as many cells as the header). */
  rows: PortCell[][];
  /** Sheet row (1-based) of the first data row. */
  firstRow: number;
  /** Sheet column (0-based) of the first column. */
  firstCol: number;
}

/** A cell of a planned sheet: a value or a formula, with how to show it. */
export interface PlanCell {
  /** A1 address on the new sheet, without `$` (e.g. `B6`). */
  address: string;
  value?: string | number;
  /** Formula with its leading `=`. */
  formula?: string;
  format?: CellFormat;
  style?: 'title' | 'heading' | 'header' | 'note' | 'setting' | 'verdict';
  /** The formula spills: the area (rows × columns, this cell at its top left) the sheet keeps free for it. */
  spill?: { rows: number; cols: number };
}

/** A chart drawn from ranges of the new sheet. */
export interface PlanChart {
  id: string;
  title: string;
  kind: 'scatter' | 'line' | 'column';
  xTitle: string;
  yTitle: string;
  /** Series: x and y ranges (A1 on the new sheet), a linear fit line when `fit`. */
  series: Array<{ name: string; x: string; y: string; fit?: boolean }>;
  /** Top-left cell of the chart. */
  anchor: string;
  /** Text alternative. */
  alt: string;
}

export interface SheetPlan {
  sheet: string;
  cells: PlanCell[];
  /** Sheet-scoped names of the settings cells (`cutoff` → `B6`). */
  names: Array<{ name: string; address: string; comment: string }>;
  charts: PlanChart[];
  /** Widths of the first columns, in characters. */
  columnWidths: number[];
}

/** Progress of a long step: `done` of `total` units, with what is being done. */
export type Progress = (done: number, total: number, what: string) => void;

/** Thrown by a writer when the user cancelled; whatever was written has been removed. */
export class CancelledError extends Error {
  constructor() {
    super('cancelled');
    this.name = 'CancelledError';
  }
}

/** A cancel, whichever copy of the class threw it (a test's workbook is bundled apart from the pane). */
export const isCancel = (e: unknown): boolean => e instanceof Error && e.name === 'CancelledError';

export interface WorkbookPort {
  /** The data block, or an error (PortError) saying what is missing. */
  readData(source: DataSource): Promise<DataBlock>;
  /** Names of the workbook's tables (for the data step). */
  tableNames(): Promise<string[]>;
  sheetNames(): Promise<string[]>;
  /**
   * Adds the planned sheet (the name must be new) and writes it in chunks,
   * reporting progress; when `cancelled()` turns true between chunks the
   * new sheet is deleted and CancelledError thrown.
   */
  writeSheet(plan: SheetPlan, progress: Progress, cancelled: () => boolean): Promise<void>;
  /** Values of a range of a sheet (after recalculation). */
  readValues(sheet: string, address: string): Promise<PortCell[][]>;
  /** Waits until the workbook has finished calculating (asynchronous functions included), or until `cancelled()`. */
  settle(progress?: Progress, cancelled?: () => boolean): Promise<void>;
  /** Removes a sheet this port wrote (a cancel after the writing began). */
  deleteSheet(name: string): Promise<void>;
}

/** A problem of the workbook the user can fix (no selection, no header, …), for the message beside the data field. */
export class PortError extends Error {}
