/**
 * The summary model (summaryModel.ts) laid out as a live sheet: every cell
 * with its value or formula, the settings cells named, the charts drawn from
 * the spilled tables. A pure function; the writers (excelWorkbook.ts, the
 * in-page workbook of the browser test) only apply it.
 *
 * What makes the sheet live (issue 11):
 * - the settings block holds the cutoff, the bandwidths and the options as
 *   cells (named `cutline_cutoff`, …), and every result formula refers to
 *   them, so typing a new cutoff recalculates the sheet;
 * - cells the model gives as values but which a worksheet can compute are
 *   written as formulas here: the verdict at 5% (`IF` on the p-value), the
 *   Holm-adjusted p-values across outcomes (Holm 1979, step-down: the
 *   adjusted p of outcome i is the largest (m − r_j + 1)·p_j over the p_j ≤ p_i,
 *   capped at 1, r_j the rank of p_j), and the values at which the complier
 *   distributions are drawn (an even grid over the outcome's range);
 * - the rest of the model's values (the descriptive columns the functions
 *   give no formula for) are written as values and set in grey, with a note.
 *
 * @example
 *   const plan = planSheet(model, { source: 'Data!A1:H6001' });
 *   plan.cells.find((c) => c.address === 'B6'); // { value: 60, style: 'setting', … }
 */
import { columnLetters, detailField, rowOf } from './formulas';
import { PlanCell, PlanChart, SheetPlan } from './workbookPort';
import { SummaryModel, SummaryTable } from './summaryTypes';

/** What a plan cell is for, beyond its look (the unit tests read this). */
export type CellRole = 'setting' | 'result' | 'input' | 'text' | 'static';

export interface RolePlanCell extends PlanCell {
  role: CellRole;
}

export interface LiveSheetPlan extends SheetPlan {
  cells: RolePlanCell[];
  /** Address of the cutoff cell (e.g. `B6`). */
  cutoffCell: string;
  /** The settings block, top-left to bottom-right (e.g. `A6:B18`). */
  settingsBlock: string;
  /**
   * The engine's value of every cell a formula computes (the formula's own
   * cell, and each cell a spilling formula fills), from the model: what the
   * sheet must show once calculated. The complier tables are left out (their
   * grid is the sheet's own, see complierGrids).
   */
  expected: Array<{ address: string; value: number | string }>;
  /** Where the spilled tables behind the charts sit. */
  plots: PlotPlace[];
}

/**
 * A spilled table behind a chart: the row of its formula (the spill starts
 * with the function's own header row), the rows kept free for it, and for a
 * complier table the rows of its grid.
 */
export interface PlotPlace {
  id: string;
  row: number;
  rows: number;
  /** Bins: how many the engine laid below the cutoff (the chart's first series). */
  below?: number;
  /** Bins at the time of writing. */
  bins?: number;
  /** Complier tables: grid points. */
  grid?: number;
}

/** A1 address without `$` (row 1-based, col 0-based). */
export const a1 = (row: number, col: number): string => `${columnLetters(col)}${row}`;

const strip = (address: string): string => address.replace(/\$/g, '');

/** The note under the title of a live sheet. */
export const LIVE_NOTE =
  'Every result below is a live CUTLINE formula over the data and the settings cells: type a new cutoff (or bandwidth, kernel, draws, …) in column B of the settings and the whole sheet recalculates. Grey numbers are descriptive values at the cutoff the sheet was written with.';

/** The name given to a setting's cell (sheet-scoped). */
export const settingName = (key: string): string => `cutline_${key.replace(/[^A-Za-z0-9]+/g, '_')}`;

export function planSheet(m: SummaryModel, opts: { source: string }): LiveSheetPlan {
  const cells: RolePlanCell[] = [];
  const put = (c: RolePlanCell): void => replace(cells, c);
  const text = (row: number, col: number, value: string, style?: PlanCell['style']): void =>
    put({ address: a1(row, col), value, format: 'text', style, role: 'text' });

  text(1, 0, m.title, 'title');
  text(2, 0, LIVE_NOTE, 'note');
  text(3, 0, `Data: ${opts.source} — ${m.dataLine}`);

  // Settings: key, value (or formula), meaning.
  const firstSettingRow = Math.min(...m.settings.map((s) => rowOf(s.address)));
  text(firstSettingRow - 2, 0, `Settings (type here; the options passed to every formula are ${strip(m.settingsRange)})`, 'heading');
  ['setting', 'value', 'meaning'].forEach((h, i) => text(firstSettingRow - 1, i, h, 'header'));
  const names: SheetPlan['names'] = [];
  let lastSettingRow = firstSettingRow;
  for (const s of m.settings) {
    const row = rowOf(s.address);
    lastSettingRow = Math.max(lastSettingRow, row);
    text(row, 0, s.key);
    const at = strip(s.address);
    if (s.formula) put({ address: at, formula: `=${s.formula}`, format: s.format, style: 'setting', role: 'result' });
    else put({ address: at, value: s.value, format: s.format, style: 'setting', role: 'setting' });
    text(row, 2, s.label);
    names.push({ name: settingName(s.key), address: at, comment: s.label });
  }
  const cutoff = m.settings.find((s) => s.key === 'cutoff');
  if (!cutoff) throw new Error('the summary model has no cutoff setting');

  const testBandwidth = m.settings.find((s) => s.key === 'test_bandwidth');
  for (const t of m.tables) planTable(t, put, text, testBandwidth ? strip(testBandwidth.address) : undefined);
  holmFormulas(m, cells);

  for (const b of m.textBlocks) {
    text(b.row, 0, b.id === 'verdicts' ? `${b.title} (at the cutoff ${cutoff.value}, when the sheet was written)` : b.title, 'heading');
    b.lines.forEach((l, i) => text(b.row + 1 + i, 0, l, b.id === 'verdicts' ? 'verdict' : undefined));
  }
  const plots = planPlotTables(m, put, text);
  const expected = liveExpectations(m, m, cells, plots);

  const charts = m.charts.flatMap((c, i): PlanChart[] => {
    if (!c.anchor) return [];
    text(c.anchor.row - 1, c.anchor.col, `Figure ${i + 1}. ${c.title}`, 'heading');
    const chart = chartOf(m, c.id, c.table, plots);
    return chart ? [{ ...chart, id: c.id, title: c.title, xTitle: c.xLabel, yTitle: c.yLabel, anchor: a1(c.anchor.row, c.anchor.col), alt: c.alt }] : [];
  });

  return {
    sheet: m.sheetName,
    cells,
    names,
    charts,
    columnWidths: [44, 16, 16, 16, 16, 16, 16, 16, 16, 16],
    cutoffCell: strip(cutoff.address),
    settingsBlock: `A${firstSettingRow}:B${lastSettingRow}`,
    expected,
    plots,
  };
}

/**
 * The values the cells of `layout`'s sheet must show when the engine's
 * results are `m` (the same check at other settings, e.g. a new cutoff):
 * each table of `m` is read at the place its namesake has in `layout`.
 */
export function liveExpectations(m: SummaryModel, layout: SummaryModel, cells: RolePlanCell[], plots: PlotPlace[]): LiveSheetPlan['expected'] {
  const computed = new Set(cells.filter((c) => c.formula !== undefined && c.role === 'result').map((c) => c.address));
  const out: LiveSheetPlan['expected'] = [];
  for (const s of m.settings) {
    const at = strip(layout.settings.find((x) => x.key === s.key)?.address ?? s.address);
    if (computed.has(at)) out.push({ address: at, value: s.value });
  }
  for (const t of m.plotTables) {
    const place = plots.find((p) => p.id === t.id);
    if (!place || !t.id.startsWith('bins:')) continue;
    // BINS spills its header, then midpoint, mean, count and side of each bin.
    t.rows.forEach((r, j) =>
      [r[3].value, r[4].value, r[5].value, r[0].value].forEach((v, i) => {
        if (v !== null) out.push({ address: a1(place.row + 1 + j, i), value: v });
      }),
    );
  }
  for (const t of m.tables) {
    const place = layout.tables.find((x) => x.id === t.id);
    if (!place) continue;
    t.rows.forEach((r, j) =>
      r.forEach((c, i) => {
        const at = a1(place.row + 1 + j, i);
        if (c.value === null || c.value === '') return;
        if (computed.has(at) || insideSpill(t, j, i)) out.push({ address: at, value: c.value });
      }),
    );
  }
  return out;
}

function planTable(
  t: SummaryTable,
  put: (c: RolePlanCell) => void,
  text: (r: number, c: number, v: string, s?: PlanCell['style']) => void,
  testBandwidth?: string,
): void {
  text(t.row - 1, 0, t.title, 'heading');
  t.columns.forEach((h, i) => text(t.row, i, h, 'header'));
  const live = t.columns.map((_, i) => t.rows.some((r) => r[i]?.formula !== undefined));
  t.rows.forEach((r, j) =>
    r.forEach((c, i) => {
      const at = a1(t.row + 1 + j, i);
      if (c.formula !== undefined) {
        put({
          address: at,
          formula: `=${c.formula}`,
          format: c.format,
          role: 'result',
          ...(c.spills ? { spill: spillArea(t, j, i) } : {}),
        });
      } else if (insideSpill(t, j, i)) {
        // Filled by a spilling formula: leave the cell empty.
      } else if (c.value !== null && c.value !== '') {
        const isText = c.format === 'text' || typeof c.value === 'string';
        put({ address: at, value: c.value, format: c.format, role: isText && !live[i] ? 'text' : 'static' });
      }
    }),
  );
  // Verdict columns become formulas on the p-value beside them.
  const p = t.columns.indexOf('p-value');
  const v = t.columns.indexOf('verdict at 5%');
  if (p >= 0 && v >= 0) {
    t.rows.forEach((r, j) => {
      if (r[p]?.formula === undefined) return;
      const row = t.row + 1 + j;
      put({ address: a1(row, v), formula: `=IF(${a1(row, p)}<=0.05,"contradicted","not contradicted")`, format: 'text', role: 'result' });
    });
  }
  // Columns the validity test's detail table gives, read from the formula of the row's p-value.
  if ((t.id === 'validity' || t.id === 'sensitivity') && p >= 0) {
    t.rows.forEach((r, j) => {
      const f = r[p]?.formula;
      if (f === undefined || !f.startsWith('CUTLINE.VALIDITY(')) return;
      for (const [column, key] of Object.entries(VALIDITY_DETAIL)) {
        const i = t.columns.indexOf(column);
        const formula = i >= 0 && typeof r[i]?.value === 'number' && r[i].formula === undefined ? detailField(f, key) : undefined;
        if (formula) put({ address: a1(t.row + 1 + j, i), formula: `=${formula}`, format: r[i].format, role: 'result' });
      }
    });
  }
  // The sensitivity table's bandwidths: multiples of the test bandwidth's cell.
  const m = t.columns.indexOf('multiple of the test bandwidth');
  const b = t.columns.indexOf('bandwidth');
  if (t.id === 'sensitivity' && testBandwidth && m >= 0 && b >= 0) {
    t.rows.forEach((r, j) => {
      const multiple = r[m]?.value;
      if (typeof multiple !== 'number') return;
      put({ address: a1(t.row + 1 + j, b), formula: `=${testBandwidth}*${multiple}`, format: 'number', role: 'result' });
    });
  }
  if (t.note) text(t.row + t.rows.length + 1, 0, t.note, 'note');
}

/** Columns of the validity tables and the names of the fields of VALIDITY's detail table that fill them. */
const VALIDITY_DETAIL: Record<string, string> = {
  'p observed': 'pvalue_observed',
  'p trend removed': 'pvalue_trend_adjusted',
  intervals: 'intervals',
  draws: 'draws',
  bandwidth: 'bandwidth',
};

/** The area a spilling formula at row j, column i of a table fills: to the table's end and its last column (or the next formula column). */
function spillArea(t: SummaryTable, j: number, i: number): { rows: number; cols: number } {
  let cols = 1;
  while (i + cols < t.columns.length && t.rows[j][i + cols]?.formula === undefined) cols++;
  return { rows: t.rows.length - j, cols };
}

function insideSpill(t: SummaryTable, j: number, i: number): boolean {
  for (let jj = 0; jj <= j; jj++) {
    for (let ii = 0; ii <= i; ii++) {
      const c = t.rows[jj]?.[ii];
      if (!c?.spills || (jj === j && ii === i)) continue;
      const a = spillArea(t, jj, ii);
      if (j < jj + a.rows && i < ii + a.cols) return true;
    }
  }
  return false;
}

/** Holm-adjusted p-values across the outcomes, live from the p-value cells of the validity table. */
function holmFormulas(m: SummaryModel, cells: RolePlanCell[]): void {
  const t = m.tables.find((x) => x.id === 'validity');
  if (!t) return;
  const p = t.columns.indexOf('p-value');
  const h = t.columns.indexOf('Holm-adjusted p');
  if (p < 0 || h < 0 || t.rows.some((r) => r[p]?.formula === undefined)) return;
  const ps = t.rows.map((_, j) => a1(t.row + 1 + j, p));
  const all = `${ps[0]}:${ps[ps.length - 1]}`;
  const n = ps.length;
  t.rows.forEach((_, j) => {
    const terms = ps.map((pj) => `IF(${pj}<=${ps[j]},(${n}-COUNTIF(${all},"<"&${pj}))*${pj},0)`);
    replace(cells, { address: a1(t.row + 1 + j, h), formula: `=MIN(1,MAX(${terms.join(',')}))`, format: 'pvalue', role: 'result' });
  });
}

/** Grid points of a complier table. */
const GRID = 30;

/**
 * The tables behind the charts, each a spilling formula with the area kept
 * free below it: BINS (its header, one row per bin: midpoint, mean, count,
 * side, then its notes), and for each outcome an even grid of its values
 * (formulas on the data) with COMPLIERCDF of the treated and the untreated
 * compliers at those values (each spills one value per grid point).
 */
function planPlotTables(
  m: SummaryModel,
  put: (c: RolePlanCell) => void,
  text: (r: number, c: number, v: string, s?: PlanCell['style']) => void,
): PlotPlace[] {
  const places: PlotPlace[] = [];
  let next = m.plotTables[0]?.row ?? 0;
  for (const t of m.plotTables) {
    const f = t.rows[0]?.find((c) => c.formula !== undefined)?.formula;
    if (!f) continue;
    if (t.id.startsWith('bins:')) {
      const bins = t.rows.length;
      // Room for more bins at another cutoff, and BINS' own lines under the bins (counts, rows, warnings).
      const rows = 1 + bins * 2 + 20;
      text(next - 1, 0, t.title, 'heading');
      put({ address: a1(next, 0), formula: `=${f}`, role: 'result', format: 'number', spill: { rows, cols: 4 } });
      places.push({ id: t.id, row: next, rows, bins, below: t.rows.filter((r) => r[0].value === 'below').length });
      if (t.note) text(next + rows, 0, t.note, 'note');
      next += rows + 3;
    } else if (t.id.startsWith('compliers:')) {
      const args = splitArgs(f);
      const outcome = args[2];
      const grid = `${a1(next + 1, 0)}:${a1(next + GRID, 0)}`;
      text(next - 1, 0, t.title, 'heading');
      text(next, 0, `${t.columns[0]} (grid over the data)`, 'header');
      text(next, 1, t.columns[1], 'header');
      text(next, 2, t.columns[2], 'header');
      for (let j = 0; j < GRID; j++) {
        put({ address: a1(next + 1 + j, 0), formula: `=MIN(${outcome})+(MAX(${outcome})-MIN(${outcome}))*${j}/${GRID - 1}`, format: 'number', role: 'input' });
      }
      // COMPLIERCDF spills one value per grid point, beside the grid.
      for (const [arm, col] of [[1, 1], [0, 2]] as const) {
        const call = `CUTLINE.COMPLIERCDF(${[...args.slice(0, 4), grid, String(arm), ...args.slice(6)].join(', ')})`;
        put({ address: a1(next + 1, col), formula: `=${call}`, format: 'number', role: 'result', spill: { rows: GRID, cols: 1 } });
      }
      places.push({ id: t.id, row: next, rows: GRID + 1, grid: GRID });
      next += GRID + 4;
    }
  }
  return places;
}

function replace(cells: RolePlanCell[], c: RolePlanCell): void {
  const k = cells.findIndex((x) => x.address === c.address);
  if (k >= 0) cells[k] = c;
  else cells.push(c);
}

/** The top-level arguments of `NAME(a, b, …)`. */
export function splitArgs(formula: string): string[] {
  const open = formula.indexOf('(');
  const out: string[] = [];
  let depth = 0;
  let quoted = false;
  let start = open + 1;
  for (let i = open + 1; i < formula.length; i++) {
    const ch = formula[i];
    if (ch === '"' || ch === "'") quoted = !quoted;
    if (quoted) continue;
    if (ch === '(') depth++;
    else if (ch === ')') {
      if (depth === 0) {
        out.push(formula.slice(start, i).trim());
        break;
      }
      depth--;
    } else if (ch === ',' && depth === 0) {
      out.push(formula.slice(start, i).trim());
      start = i + 1;
    }
  }
  return out;
}

/** A chart from the spilled table behind it. */
function chartOf(m: SummaryModel, id: string, tableId: string | undefined, plots: PlotPlace[]): Pick<PlanChart, 'kind' | 'series'> | undefined {
  const col = (row: number, i: number, from: number, to: number): string => `${a1(row + 1 + from, i)}:${a1(row + 1 + to, i)}`;
  const place = plots.find((p) => p.id === tableId);
  if (id === 'histogram') {
    if (!place?.bins) return undefined;
    return { kind: 'column', series: [{ name: 'units in the bin', x: col(place.row, 0, 0, place.bins - 1), y: col(place.row, 2, 0, place.bins - 1) }] };
  }
  if (id.startsWith('bins:')) {
    if (!place?.bins) return undefined;
    const below = place.below ?? 0;
    const series: PlanChart['series'] = [];
    if (below > 0) series.push({ name: 'below the cutoff', x: col(place.row, 0, 0, below - 1), y: col(place.row, 1, 0, below - 1), fit: true });
    if (below < place.bins) series.push({ name: 'above the cutoff', x: col(place.row, 0, below, place.bins - 1), y: col(place.row, 1, below, place.bins - 1), fit: true });
    return { kind: 'scatter', series };
  }
  if (id.startsWith('compliers:')) {
    if (!place?.grid) return undefined;
    const n = place.grid - 1;
    return {
      kind: 'line',
      series: [
        { name: 'treated compliers', x: col(place.row, 0, 0, n), y: col(place.row, 1, 0, n) },
        { name: 'untreated compliers', x: col(place.row, 0, 0, n), y: col(place.row, 2, 0, n) },
      ],
    };
  }
  if (id === 'sensitivity') {
    const t = m.tables.find((x) => x.id === 'sensitivity');
    if (!t || t.rows.length === 0) return undefined;
    const byOutcome = new Map<string, number[]>();
    t.rows.forEach((r, j) => byOutcome.set(String(r[0].value), [...(byOutcome.get(String(r[0].value)) ?? []), j]));
    return {
      kind: 'line',
      series: [...byOutcome].map(([name, js]) => ({ name, x: col(t.row, 2, js[0], js[js.length - 1]), y: col(t.row, 3, js[0], js[js.length - 1]) })),
    };
  }
  return undefined;
}

