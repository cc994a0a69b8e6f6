/**
 * The `detail` tables: two columns, a label and a value. The labels are the
 * field names of the JSON document of `cutline check` (estimate, se, ci_low,
 * ci_high, ci_robust_low, ci_robust_high, pvalue, bandwidth, window_below,
 * window_above, rows_used, rows_dropped, one `warning` row per warning): they
 * do not change with the settings, so a formula can read one field with
 * VLOOKUP (the summary sheet does).
 */
import { Estimate } from '../engine';
import { Cell, cellOf, Matrix } from './call';

export type Row = [string, Cell];

/** The rows of one estimate with its two intervals (at the `level` setting) and its robust p-value. */
export function estimateRows(e: Estimate): Row[] {
  return [
    ['estimate', cellOf(e.estimate)],
    ['se', cellOf(e.se)],
    ['ci_low', cellOf(e.ci[0])],
    ['ci_high', cellOf(e.ci[1])],
    ['ci_robust_low', cellOf(e.ci_robust[0])],
    ['ci_robust_high', cellOf(e.ci_robust[1])],
    ['pvalue', cellOf(e.pvalue)],
    ['pvalue_conventional', cellOf(e.pvalue_conventional)],
  ];
}

/** Bandwidth, window counts, rows used and dropped, warnings. */
export function commonRows(r: {
  bandwidth?: number;
  counts: { below: number; above: number };
  rows: { used: number; dropped: number };
  warnings: string[];
}): Row[] {
  const out: Row[] = [];
  if (r.bandwidth !== undefined) out.push(['bandwidth', cellOf(r.bandwidth)]);
  out.push(['window_below', r.counts.below], ['window_above', r.counts.above], ['rows_used', r.rows.used], ['rows_dropped', r.rows.dropped]);
  for (const w of r.warnings) out.push(['warning', w]);
  return out;
}

/** Rows as a matrix `width` wide (blank cells pad the right). */
export function table(rows: Cell[][], width = 2): Matrix {
  return rows.map((r) => (r.length >= width ? r : [...r, ...Array<Cell>(width - r.length).fill('')]));
}
