/**
 * The `detail` tables: two columns, a label and a value, in the words of
 * Cutline's summary (estimate, standard error, both intervals, p-value,
 * bandwidth, window counts, rows used and dropped, one row per warning).
 */
import { Estimate } from '../engine';
import { Cell, cellOf, Matrix } from './call';

export type Row = [string, Cell];

const pct = (level = 0.95): string => `${Number((level * 100).toPrecision(4))}%`;

/** The rows of one estimate with its two intervals. */
export function estimateRows(what: string, e: Estimate, level?: number): Row[] {
  return [
    [what, cellOf(e.estimate)],
    ['standard error', cellOf(e.se)],
    [`${pct(level)} interval, low`, cellOf(e.ci[0])],
    [`${pct(level)} interval, high`, cellOf(e.ci[1])],
    [`robust ${pct(level)} interval, low`, cellOf(e.ci_robust[0])],
    [`robust ${pct(level)} interval, high`, cellOf(e.ci_robust[1])],
    ['p-value (robust)', cellOf(e.pvalue)],
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
  out.push(
    ['units in the window below the cutoff', r.counts.below],
    ['units in the window above the cutoff', r.counts.above],
    ['rows used', r.rows.used],
    ['rows dropped (a value missing)', r.rows.dropped],
  );
  for (const w of r.warnings) out.push(['warning', w]);
  if (r.warnings.length === 0) out.push(['warnings', 'none']);
  return out;
}

/** Rows as a matrix `width` wide (blank cells pad the right). */
export function table(rows: Cell[][], width = 2): Matrix {
  return rows.map((r) => (r.length >= width ? r : [...r, ...Array<Cell>(width - r.length).fill('')]));
}
