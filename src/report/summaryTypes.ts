/**
 * The summary of a check as data (DESIGN.md "src/report"): a settings block
 * of named cells, tables of labelled cells each holding a value and, where a
 * worksheet can make it live, the CUTLINE.* formula that computes it; binned
 * tables for the plots; chart specifications; verdicts, warnings and cautions
 * in plain words. Writers (the .xlsx file, the HTML page, the task pane) only
 * lay this out; none of them computes a number.
 */

/** How a value is shown: `pvalue` three decimals (<0.001), `integer`, `plain` as it is, `number` four significant digits. */
export type CellFormat = 'number' | 'pvalue' | 'integer' | 'plain' | 'text';

export interface SummaryCell {
  value: number | string | null;
  /** The CUTLINE.* formula (without '=') that would compute the value live. */
  formula?: string;
  /** The formula spills over the whole table from this cell (CUTLINE.BINS, CUTLINE.COMPLIERCDF). */
  spills?: boolean;
  format?: CellFormat;
}

export interface SummaryTable {
  id: string;
  title: string;
  columns: string[];
  rows: SummaryCell[][];
  /** A line under the table saying how to read it. */
  note?: string;
  /** First sheet row of the table's column header (its title is the row above); 1-based. */
  row: number;
}

export interface SettingRow {
  /** The name a settings range uses (`kernel`, `draws`, …). */
  key: string;
  label: string;
  value: number | string;
  formula?: string;
  format?: CellFormat;
  /** Absolute address on the summary sheet (e.g. `$B$6`). */
  address: string;
}

export interface ChartPoint {
  x: number;
  y: number;
}

/** A chart as data: the SVG writer draws it, the workbook embeds that drawing. */
export interface ChartSpec {
  id: string;
  title: string;
  xLabel: string;
  yLabel: string;
  /** Text alternative: what the chart shows, in words. */
  alt: string;
  /** Binned means (dots), one per non-empty bin. */
  points?: Array<ChartPoint & { count: number }>;
  /** Lines: fit lines, CDFs (steps), p-value curves. */
  lines?: Array<{ label: string; points: ChartPoint[]; dashed?: boolean; step?: boolean }>;
  /** Histogram bars [x0, x1) with height y. */
  bars?: Array<{ x0: number; x1: number; y: number; count: number }>;
  /** Vertical reference lines (the cutoff). */
  verticals?: Array<{ x: number; label: string }>;
  /** Horizontal reference lines (the 5% level). */
  horizontals?: Array<{ y: number; label: string }>;
  /** Stretches of x shaded and labelled (a falling complier CDF). */
  stretches?: Array<{ x0: number; x1: number; label: string }>;
  yDomain?: [number, number];
  /** The table (by id) holding the chart's numbers. */
  table?: string;
  /** Where a sheet places the chart's picture: top-left cell (1-based row, 0-based column). */
  anchor?: { row: number; col: number };
}

/** A finding in plain words; `concern` when it speaks against the design (a rejection, a jump). */
export interface Verdict {
  text: string;
  concern: boolean;
}

/** Lines of text under a heading (verdicts, warnings, cautions), one a row from `row`. */
export interface TextBlock {
  id: 'verdicts' | 'warnings' | 'cautions';
  title: string;
  lines: string[];
  row: number;
}

export interface SummaryModel {
  title: string;
  source: string;
  /** The columns in their roles and the rows used, in words. */
  dataLine: string;
  /** The summary sheet's name, never one the workbook already has. */
  sheetName: string;
  /** Says that values are computed and the formulas beside them are text. */
  note: string;
  settings: SettingRow[];
  /** The two-column name/value range passed as `settings` to every formula. */
  settingsRange: string;
  verdicts: Verdict[];
  tables: SummaryTable[];
  /** Verdicts, warnings and cautions as placed on the sheet (below the result tables). */
  textBlocks: TextBlock[];
  /** Binned tables and complier curves behind the charts. */
  plotTables: SummaryTable[];
  charts: ChartSpec[];
  warnings: string[];
  cautions: string[];
  /** Headline numbers for an index of many files. */
  headline: Headline;
}

export interface Headline {
  cutoff: number;
  eligible: string;
  rows_used: number;
  bandwidth: number;
  takeup: number;
  takeup_pvalue: number;
  /** `validity_pvalue` and `rejects` are absent when the test does not apply (a sharp design). */
  outcomes: Array<{ name: string; effect: number; ci_robust: [number, number]; effect_pvalue: number; validity_pvalue?: number; rejects?: boolean }>;
  density_pvalue?: number;
  balance_min_holm?: number;
}
