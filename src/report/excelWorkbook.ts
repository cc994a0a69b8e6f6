/**
 * The workbook port (workbookPort.ts) over the Excel JavaScript API: reads
 * the selection, a table or the used range with its header row; writes a
 * planned sheet in chunks (values, formulas, number formats, styles, the
 * sheet-scoped names of the settings cells, charts from the spilled tables);
 * reads values back; waits while Excel computes asynchronous formulas
 * (#BUSY!). Requirement sets: ExcelApi 1.7 (charts' series and trendlines)
 * and 1.4 (names).
 *
 * @example
 *   const port = new ExcelWorkbook();
 *   const data = await port.readData({ kind: 'used' });
 */
import { columnLetters } from './formulas';
import { trimBlank } from '../input/cells';
import { CellFormat } from './summaryTypes';
import { CancelledError, DataBlock, DataSource, PlanCell, PortCell, PortError, Progress, SheetPlan, WorkbookPort } from './workbookPort';

/** Cells written per round trip to Excel. */
const CHUNK = 150;

/** Excel number formats of the plan's formats (fixed, since the values change when a setting does). */
export const NUMBER_FORMAT: Record<CellFormat, string> = {
  number: '0.0000',
  pvalue: '0.000',
  integer: '0',
  plain: 'General',
  text: '@',
};

const CHART_TYPE: Record<string, string> = { scatter: 'XYScatter', line: 'XYScatterLinesNoMarkers', column: 'ColumnClustered' };

/** The header row of a block, or a PortError naming the first cell that is not a header. */
export function headerOf(values: unknown[][], address: string): string[] {
  const first = values[0] ?? [];
  return first.map((h, k) => {
    const s = h === null || h === undefined ? '' : trimBlank(String(h));
    if (s === '' || typeof h !== 'string') {
      throw new PortError(
        `The first row of ${address} must hold the column headers; its cell ${k + 1} ${s === '' ? 'is empty' : `holds ${JSON.stringify(h)}, not a header`}. Select the data with their header row.`,
      );
    }
    return s;
  });
}

export class ExcelWorkbook implements WorkbookPort {
  private lastSheet?: string;

  async readData(source: DataSource): Promise<DataBlock> {
    return Excel.run(async (context) => {
      const wb = context.workbook;
      const range =
        source.kind === 'selection'
          ? wb.getSelectedRange()
          : source.kind === 'table'
            ? wb.tables.getItem(source.name).getRange()
            : wb.worksheets.getActiveWorksheet().getUsedRange(true);
      range.load(['values', 'address', 'rowIndex', 'columnIndex', 'rowCount', 'columnCount']);
      range.worksheet.load('name');
      await context.sync();
      const what = source.kind === 'selection' ? 'The selection' : source.kind === 'table' ? `The table ${source.name}` : 'The used range';
      if (range.rowCount < 2 || range.columnCount < 2) {
        throw new PortError(
          `${what} (${range.address}) is ${range.rowCount} × ${range.columnCount} cells: select the data with their header row (at least two columns and a row of data).`,
        );
      }
      const header = headerOf(range.values, range.address);
      return {
        sheet: range.worksheet.name,
        header,
        rows: range.values.slice(1).map((r) => r.map((v) => (v === '' ? null : (v as PortCell)))),
        firstRow: range.rowIndex + 2,
        firstCol: range.columnIndex,
      };
    });
  }

  async tableNames(): Promise<string[]> {
    return Excel.run(async (context) => {
      const t = context.workbook.tables;
      t.load('items');
      await context.sync();
      return t.items.map((x) => x.name);
    });
  }

  async sheetNames(): Promise<string[]> {
    return Excel.run(async (context) => {
      const s = context.workbook.worksheets;
      s.load('items');
      await context.sync();
      return s.items.map((x) => x.name);
    });
  }

  async writeSheet(plan: SheetPlan, progress: Progress, cancelled: () => boolean): Promise<void> {
    const chunks: PlanCell[][] = [];
    for (let i = 0; i < plan.cells.length; i += CHUNK) chunks.push(plan.cells.slice(i, i + CHUNK));
    const total = chunks.length + 2;
    await Excel.run(async (context) => {
      const ws = context.workbook.worksheets.add(plan.sheet);
      await context.sync();
      const abandon = async (): Promise<never> => {
        ws.delete();
        await context.sync();
        throw new CancelledError();
      };
      plan.columnWidths.forEach((w, c) => {
        ws.getRange(`${columnLetters(c)}:${columnLetters(c)}`).format.columnWidth = w * 6;
      });
      for (let k = 0; k < chunks.length; k++) {
        if (cancelled()) await abandon();
        for (const c of chunks[k]) writeCell(ws, c);
        // One round trip per chunk, on purpose: the progress bar moves and Cancel is heard between chunks.
        // eslint-disable-next-line office-addins/no-context-sync-in-loop
        await context.sync();
        progress(k + 1, total, `Writing the sheet (${Math.min((k + 1) * CHUNK, plan.cells.length)} of ${plan.cells.length} cells)…`);
      }
      if (cancelled()) await abandon();
      for (const n of plan.names) ws.names.add(n.name, ws.getRange(n.address), n.comment);
      await context.sync();
      progress(chunks.length + 1, total, 'Naming the settings cells…');
      for (const ch of plan.charts) {
        const first = ch.series[0];
        const chart = ws.charts.add(CHART_TYPE[ch.kind] as Excel.ChartType, ws.getRange(first.y), 'Columns');
        chart.title.text = ch.title;
        chart.axes.categoryAxis.title.text = ch.xTitle;
        chart.axes.valueAxis.title.text = ch.yTitle;
        chart.setPosition(ch.anchor);
        chart.width = 480;
        chart.height = 300;
        ch.series.forEach((s, i) => {
          const series = i === 0 ? chart.series.getItemAt(0) : chart.series.add(s.name);
          series.name = s.name;
          series.setValues(ws.getRange(s.y));
          series.setXAxisValues(ws.getRange(s.x));
          if (s.fit) series.trendlines.add('Linear');
        });
      }
      ws.activate();
      await context.sync();
      progress(total, total, 'Drawing the charts…');
    });
    this.lastSheet = plan.sheet;
  }

  async deleteSheet(name: string): Promise<void> {
    await Excel.run(async (context) => {
      context.workbook.worksheets.getItem(name).delete();
      await context.sync();
    });
  }

  async readValues(sheet: string, address: string): Promise<PortCell[][]> {
    return Excel.run(async (context) => {
      const r = context.workbook.worksheets.getItem(sheet).getRange(address);
      r.load('values');
      await context.sync();
      return r.values as PortCell[][];
    });
  }

  /** Polls the last written sheet until no cell shows #BUSY! (Excel's mark of an asynchronous function still running), two minutes at most. */
  async settle(progress?: Progress, cancelled?: () => boolean): Promise<void> {
    if (!this.lastSheet) return;
    const sheet = this.lastSheet;
    let busyAtStart = 0;
    for (let attempt = 0; attempt < 240; attempt++) {
      if (cancelled?.()) return;
      const busy = await Excel.run(async (context) => {
        const r = context.workbook.worksheets.getItem(sheet).getUsedRange(true);
        r.load('values');
        // One look at the sheet per poll, on purpose (each poll is its own Excel.run).
        // eslint-disable-next-line office-addins/no-context-sync-in-loop
        await context.sync();
        return countBusy(r.values);
      });
      busyAtStart = Math.max(busyAtStart, busy);
      progress?.(busyAtStart - busy, Math.max(1, busyAtStart), `Recalculating (${busy} formulas still running)…`);
      if (busy === 0) return;
      await new Promise((resolve) => setTimeout(resolve, 500));
    }
  }
}

/** Cells showing #BUSY! (an asynchronous function still running). */
export function countBusy(values: unknown[][]): number {
  let n = 0;
  for (const row of values) for (const v of row) if (v === '#BUSY!') n++;
  return n;
}

function writeCell(ws: Excel.Worksheet, c: PlanCell): void {
  const r = ws.getRange(c.address);
  if (c.formula !== undefined) r.formulas = [[c.formula]];
  else if (c.value !== undefined) r.values = [[c.value]];
  if (c.format && c.format !== 'text') r.numberFormat = [[NUMBER_FORMAT[c.format]]];
  switch (c.style) {
    case 'title':
      r.format.font.bold = true;
      r.format.font.size = 14;
      break;
    case 'heading':
      r.format.font.bold = true;
      r.format.font.size = 12;
      break;
    case 'header':
      r.format.font.bold = true;
      r.format.borders.getItem('EdgeBottom').style = 'Continuous';
      break;
    case 'note':
      r.format.font.italic = true;
      r.format.font.color = '#555555';
      break;
    case 'setting':
      r.format.fill.color = '#FFF2CC';
      r.format.font.bold = true;
      break;
    case 'verdict':
      r.format.font.bold = true;
      break;
    default:
      break;
  }
  if (c.format !== undefined && c.formula === undefined && c.format !== 'text' && typeof c.value === 'number' && c.style === undefined) r.format.font.color = '#808080';
}
