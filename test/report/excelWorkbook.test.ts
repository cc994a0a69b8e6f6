/**
 * The Excel API port (src/report/excelWorkbook.ts) against office-addin-mock
 * objects: every Office API call it makes to read the data, write a planned
 * sheet (values, formulas, formats, names, charts), cancel, read back and wait
 * for the workbook's calculation.
 */
import { OfficeMockObject } from 'office-addin-mock';
import { ExcelWorkbook, NUMBER_FORMAT } from '../../src/report/excelWorkbook';
import { PortError, SheetPlan } from '../../src/report/workbookPort';
import { demoSummary } from '../helpers/demoSummary';

type Rec = Record<string, unknown>;

/** A worksheet as writing needs it: ranges, names and charts recorded in plain objects. */
function newSheet(name: string, log: string[]) {
  const ranges = new Map<string, Rec>();
  const charts: Rec[] = [];
  const names: Array<[string, unknown, string]> = [];
  const sheet = {
    name,
    ranges,
    charts: {
      items: charts,
      add(type: string, source: Rec, by: string) {
        const series: Rec[] = [];
        const makeSeries = (n: string): Rec => {
          const s: Rec = { name: n, trendlines: [] as string[] };
          s.setValues = (r: Rec) => (s.values = r.address);
          s.setXAxisValues = (r: Rec) => (s.x = r.address);
          (s.trendlines as unknown as { add: (t: string) => void }).add = (t: string) => (s.trendlines as string[]).push(t);
          series.push(s);
          return s;
        };
        const chart: Rec = {
          type,
          source: source.address,
          by,
          title: {},
          axes: { categoryAxis: { title: {} }, valueAxis: { title: {} } },
          series: { items: series, getItemAt: (i: number) => series[i] ?? makeSeries(''), add: (n: string) => makeSeries(n) },
          setPosition: (at: string) => (chart.position = at),
        };
        charts.push(chart);
        log.push(`chart ${type}`);
        return chart;
      },
    },
    names: { items: names, add: (n: string, r: Rec, c: string) => names.push([n, r.address, c]) },
    getRange(address: string) {
      let r = ranges.get(address);
      if (!r) {
        r = { address, format: { font: {}, fill: {}, borders: { getItem: () => ({}) } } };
        ranges.set(address, r);
      }
      return r;
    },
    delete: () => log.push(`delete ${name}`),
    activate: () => log.push(`activate ${name}`),
  };
  return sheet;
}

function excelMock(opts: { selection?: unknown[][]; used?: unknown[][]; sheets?: string[]; busy?: number[] } = {}) {
  const log: string[] = [];
  const added: ReturnType<typeof newSheet>[] = [];
  const range = (values: unknown[][], address: string) => ({
    values,
    address,
    rowIndex: 0,
    columnIndex: 0,
    rowCount: values.length,
    columnCount: values[0]?.length ?? 0,
    worksheet: { name: 'Data' },
  });
  let busyCalls = 0;
  const data = {
    context: {
      workbook: {
        selection: range(opts.selection ?? [['x']], 'Data!B3'),
        active: { used: range(opts.used ?? [['a']], 'Data!A1:A1'), getUsedRange() { return this.used; } },
        worksheets: {
          items: (opts.sheets ?? ['Data']).map((name) => ({ name })),
          getActiveWorksheet(): unknown {
            return (this as unknown as { parent: { active: unknown } }).parent.active;
          },
          add(name: string) {
            log.push(`add ${name}`);
            const s = newSheet(name, log);
            added.push(s);
            return s;
          },
          getItem(name: string) {
            return {
              getUsedRange: () => {
                const busy = opts.busy?.[busyCalls++] ?? 0;
                return { values: [[1, busy > 0 ? '#BUSY!' : 2], ...Array.from({ length: Math.max(0, busy - 1) }, () => ['#BUSY!'])], load: () => undefined };
              },
              getRange: (address: string) => ({ address, values: [[0.4888]], load: () => undefined }),
              name,
            };
          },
        },
        tables: { items: [{ name: 'Retrofit' }] },
        getSelectedRange() {
          return this.selection;
        },
      },
    },
    run: async function (callback: (context: unknown) => Promise<unknown>) {
      return callback(this.context);
    },
  };
  const mock = new OfficeMockObject(data) as unknown as { context: { workbook: { worksheets: Rec; active: Rec } } };
  // The active sheet's lookup from inside the worksheets collection.
  (mock.context.workbook.worksheets as Rec).parent = mock.context.workbook;
  (global as unknown as { Excel: unknown }).Excel = mock;
  return { log, added };
}

const CSV_TOP = [
  ['id', 'energy_burden', 'retrofit'],
  [1, 57.5, 0],
  [2, 60, 1],
];

describe('ExcelWorkbook (office-addin-mock)', () => {
  const { plan } = demoSummary(60, ['Data']);
  test('reads the used range with its header; rows below it as data, blanks as null', async () => {
    excelMock({ used: [...CSV_TOP, [3, '', 1]] });
    const b = await new ExcelWorkbook().readData({ kind: 'used' });
    expect(b).toEqual({ sheet: 'Data', header: ['id', 'energy_burden', 'retrofit'], rows: [[1, 57.5, 0], [2, 60, 1], [3, null, 1]], firstRow: 2, firstCol: 0 });
  });

  test('a single selected cell is no data: a message that says what to select', async () => {
    excelMock({ selection: [['x']] });
    await expect(new ExcelWorkbook().readData({ kind: 'selection' })).rejects.toThrow(new PortError('The selection (Data!B3) is 1 × 1 cells: select the data with their header row (at least two columns and a row of data).'));
  });

  test('a first row without headers is refused, naming the cell', async () => {
    excelMock({ selection: [[1, 57.5], [2, 60]] });
    await expect(new ExcelWorkbook().readData({ kind: 'selection' })).rejects.toThrow(/its cell 1 holds 1, not a header/);
  });

  test('lists the sheets and the tables (loading the collections’ items)', async () => {
    excelMock({ sheets: ['Data', 'Cutline summary'] });
    const wb = new ExcelWorkbook();
    expect(await wb.sheetNames()).toEqual(['Data', 'Cutline summary']);
    expect(await wb.tableNames()).toEqual(['Retrofit']);
  });

  test('writes every planned cell (formula or value, number format), names the settings, draws the charts, reports progress', async () => {
    const { log, added } = excelMock();
    const steps: number[] = [];
    await new ExcelWorkbook().writeSheet(plan, (done, total) => steps.push(done / total), () => false);
    expect(log[0]).toBe('add Cutline summary');
    expect(log[log.length - 1]).toBe('activate Cutline summary');
    const s = added[0];
    for (const c of plan.cells) {
      const r = s.ranges.get(c.address)!;
      if (c.formula !== undefined) expect(r.formulas).toEqual([[c.formula]]);
      else expect(r.values).toEqual([[c.value]]);
      if (c.format && c.format !== 'text') expect(r.numberFormat).toEqual([[NUMBER_FORMAT[c.format]]]);
    }
    expect(s.names.items).toEqual(plan.names.map((n) => [n.name, n.address, n.comment]));
    expect(s.charts.items.length).toBe(plan.charts.length);
    const bins = s.charts.items.find((c) => (c.title as Rec).text === 'Take-up against the score')!;
    const planned = plan.charts.find((c) => c.title === 'Take-up against the score')!;
    expect(bins.type).toBe('XYScatter');
    expect((bins.series as { items: Rec[] }).items.map((x) => [x.name, x.x, x.values, [...(x.trendlines as string[])]])).toEqual(planned.series.map((x) => [x.name, x.x, x.y, ['Linear']]));
    expect(bins.position).toBe(planned.anchor);
    expect(steps[steps.length - 1]).toBe(1);
    expect(steps.every((v, i) => i === 0 || v >= steps[i - 1])).toBe(true);
  });

  test('a cancel while writing deletes the new sheet', async () => {
    const { log } = excelMock();
    let chunks = 0;
    const small: SheetPlan = { ...plan };
    await expect(new ExcelWorkbook().writeSheet(small, () => chunks++, () => chunks >= 2)).rejects.toThrow('cancelled');
    expect(log).toEqual(['add Cutline summary', 'delete Cutline summary']);
  });

  test('waits while cells show #BUSY!, reading them again until none does', async () => {
    excelMock({ busy: [3, 1, 0] });
    const wb = new ExcelWorkbook();
    await wb.writeSheet({ ...plan, cells: plan.cells.slice(0, 3), charts: [], names: [] }, () => undefined, () => false);
    const seen: Array<[number, number]> = [];
    await wb.settle((d, t) => seen.push([d, t]));
    expect(seen).toEqual([[0, 3], [2, 3], [3, 3]]);
    expect(await wb.readValues('Cutline summary', 'B23')).toEqual([[0.4888]]);
  });
});
