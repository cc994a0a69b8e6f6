/**
 * The workbook port over HyperFormula (GPL-3.0, test-only): an in-page
 * workbook for the browser test, holding sheets of cells, evaluating the
 * written formulas with a real spreadsheet engine (the CUTLINE functions
 * registered from the add-in's own function table, functionTable.ts), and
 * drawing the sheet and its charts as HTML for the screenshots.
 */
import { DetailedCellError, HyperFormula } from 'hyperformula';
import { formulaRefs } from '../../src/report/formulaRefs';
import { CancelledError, DataBlock, DataSource, PlanChart, PortCell, PortError, Progress, SheetPlan, WorkbookPort } from '../../src/report/workbookPort';
import { settleAll, SpillHints } from './functionTable';

const CHUNK = 150;

export interface InPageOptions {
  /** Sheets and their cells (row 0 the header). */
  sheets: Record<string, PortCell[][]>;
  /** The sheet shown when the pane reads the used range. */
  active: string;
  /** The selected range of the active sheet (A1), if any. */
  selection?: string;
  hints: SpillHints;
}

export class InPageWorkbook implements WorkbookPort {
  readonly hf: HyperFormula;
  active: string;
  selection?: string;
  readonly charts = new Map<string, PlanChart[]>();
  /** Every write to a sheet the pane made (the tests check the data were never written). */
  readonly writes: string[] = [];

  constructor(private readonly opts: InPageOptions) {
    this.hf = HyperFormula.buildFromSheets(opts.sheets as never, { licenseKey: 'gpl-v3', useColumnIndex: true, smartRounding: false });
    // Excel reads TRUE and FALSE in a formula as the logical values; HyperFormula has them as functions.
    this.hf.addNamedExpression('TRUE', '=TRUE()');
    this.hf.addNamedExpression('FALSE', '=FALSE()');
    this.active = opts.active;
    this.selection = opts.selection;
  }

  private id(sheet: string): number {
    const id = this.hf.getSheetId(sheet);
    if (id === undefined) throw new PortError(`there is no sheet ${sheet}`);
    return id;
  }

  async readData(source: DataSource): Promise<DataBlock> {
    const sheet = this.active;
    const id = this.id(sheet);
    let top = 0;
    let left = 0;
    let rows: number;
    let cols: number;
    if (source.kind === 'selection') {
      if (!this.selection) throw new PortError('No cells are selected: select the data with their header row, or use the used range.');
      const b = formulaRefs(this.selection, sheet)[0];
      top = b.top - 1;
      left = b.left;
      rows = b.bottom - b.top + 1;
      cols = b.right - b.left + 1;
    } else if (source.kind === 'table') {
      throw new PortError(`There is no table named ${source.name} in this workbook.`);
    } else {
      const d = this.hf.getSheetDimensions(id);
      rows = d.height;
      cols = d.width;
    }
    const values = this.hf.getRangeValues({ start: { sheet: id, row: top, col: left }, end: { sheet: id, row: top + rows - 1, col: left + cols - 1 } }) as unknown[][];
    const what = source.kind === 'selection' ? `The selection (${this.selection})` : 'The used range';
    if (rows < 2 || cols < 2) throw new PortError(`${what} is ${rows} × ${cols} cells: select the data with their header row (at least two columns and a row of data).`);
    const header = values[0].map((h, k) => {
      const s = h === null || h === undefined ? '' : String(h).trim();
      if (s === '' || typeof h !== 'string') {
        throw new PortError(`The first row of ${what.toLowerCase()} must hold the column headers; its cell ${k + 1} ${s === '' ? 'is empty' : `holds ${JSON.stringify(h)}, not a header`}. Select the data with their header row.`);
      }
      return s;
    });
    return {
      sheet,
      header,
      rows: values.slice(1).map((r) => r.map((v) => (v === '' || v === undefined ? null : (v as PortCell)))),
      firstRow: top + 2,
      firstCol: left,
    };
  }

  async tableNames(): Promise<string[]> {
    return [];
  }

  async sheetNames(): Promise<string[]> {
    return this.hf.getSheetNames();
  }

  async writeSheet(plan: SheetPlan, progress: Progress, cancelled: () => boolean): Promise<void> {
    if (this.hf.getSheetId(plan.sheet) !== undefined) throw new Error(`the sheet ${plan.sheet} exists already`);
    this.hf.addSheet(plan.sheet);
    const id = this.id(plan.sheet);
    this.writes.push(plan.sheet);
    // Excel spills into free cells; here each spilling formula is given the area the plan keeps for it.
    for (const c of plan.cells) {
      if (!c.spill) continue;
      const b = formulaRefs(c.address, plan.sheet)[0];
      this.opts.hints.set(`${id}:${b.top - 1}:${b.left}`, c.spill);
    }
    const total = Math.ceil(plan.cells.length / CHUNK) + 1;
    this.hf.suspendEvaluation();
    try {
      for (let k = 0; k * CHUNK < plan.cells.length; k++) {
        if (cancelled()) {
          this.hf.resumeEvaluation();
          await this.deleteSheet(plan.sheet);
          throw new CancelledError();
        }
        for (const c of plan.cells.slice(k * CHUNK, (k + 1) * CHUNK)) {
          const b = formulaRefs(c.address, plan.sheet)[0];
          this.hf.setCellContents({ sheet: id, row: b.top - 1, col: b.left }, [[c.formula ?? c.value ?? null]] as never);
        }
        progress(k + 1, total, `Writing the sheet (${Math.min((k + 1) * CHUNK, plan.cells.length)} of ${plan.cells.length} cells)…`);
        await new Promise((r) => setTimeout(r, 0));
      }
      // Named while the evaluation waits: each name added later would recalculate the (volatile) functions.
      for (const n of plan.names) this.hf.addNamedExpression(n.name, `='${plan.sheet}'!$${n.address.replace(/(\d+)$/, '$$$1')}`, id);
    } finally {
      if (this.hf.isEvaluationSuspended()) this.hf.resumeEvaluation();
    }
    this.charts.set(plan.sheet, plan.charts);
    this.formats.set(plan.sheet, new Map(plan.cells.map((c) => [c.address, c])));
    progress(total, total, 'Drawing the charts…');
  }

  readonly formats = new Map<string, Map<string, SheetPlan['cells'][number]>>();

  async readValues(sheet: string, address: string): Promise<PortCell[][]> {
    const b = formulaRefs(address, sheet)[0];
    const id = this.id(sheet);
    const v = this.hf.getRangeValues({ start: { sheet: id, row: b.top - 1, col: b.left }, end: { sheet: id, row: b.bottom - 1, col: b.right } });
    return v.map((r) => r.map((x) => (x instanceof DetailedCellError ? `${x.value}${x.message ? ` ${x.message}` : ''}` : (x as PortCell))));
  }

  /** Types into a cell as a user would (a number or a text), and lets the workbook recalculate. */
  async type(sheet: string, address: string, content: string | number): Promise<void> {
    const b = formulaRefs(address, sheet)[0];
    this.hf.setCellContents({ sheet: this.id(sheet), row: b.top - 1, col: b.left }, [[content]]);
    await this.settle();
  }

  async deleteSheet(name: string): Promise<void> {
    const id = this.id(name);
    for (const k of [...this.opts.hints.keys()]) if (k.startsWith(`${id}:`)) this.opts.hints.delete(k);
    this.hf.removeSheet(id);
    this.writes.splice(this.writes.indexOf(name), 1);
  }

  async settle(progress?: Progress, cancelled?: () => boolean): Promise<void> {
    await settleAll(
      // A change anywhere recalculates the (volatile) CUTLINE formulas, which now find their settled results.
      () => this.hf.setCellContents({ sheet: this.id(this.opts.active), row: 0, col: 200 }, [[null]]),
      (done, total) => progress?.(done, total, `Recalculating (${total - done} formulas still running)…`),
      cancelled,
    );
  }
}
