/**
 * CUTLINE.BINS: binned means of a column on each side of the cutoff, for a
 * plot (evenly spaced bins, their number chosen by an IMSE rule),
 * by the engine's `binnedMeansAt`. It spills a table with a title row: bin
 * midpoint, mean, units, side; with detail, the numbers of bins, the
 * bandwidth of the fit lines, the rows used and the warnings below it.
 *
 * @example =CUTLINE.BINS(C2:C6001, E2:E6001, 60)
 */
import { binnedMeansAt } from '../engine';
import { Cell, cellOf, guarded, Matrix } from './call';
import { commonRows, table } from './detail';
import { prepareCall, ranges } from './prepare';

/**
 * Binned means of a column on each side of the cutoff, for a plot (spills: midpoint, mean, units, side).
 * @customfunction BINS
 * @param score Scores (running variable): one column; a title cell at the top is skipped.
 * @param values Values to average in each bin, the same rows as score.
 * @param cutoff Cutoff of the score: units at or above it are on the upper side.
 * @param [bandwidth] Bandwidth of the fit lines drawn over the bins; leave empty for the data-driven rule.
 * @param [settings] Two-column range of settings (name, value), e.g. rule, kernel, donut.
 * @param [detail] TRUE adds rows used and dropped, the numbers of bins and warnings below the table.
 * @param invocation Invocation (supplied by Excel).
 * @returns A table of bins: midpoint, mean, units, side.
 * @requiresParameterAddresses
 */
export function bins(
  score: any[][],
  values: any[][],
  cutoff: number,
  bandwidth?: number,
  settings?: any[][],
  detail?: boolean,
  invocation?: CustomFunctions.Invocation,
): any[][] {
  return guarded('BINS', (): Matrix => {
    const c = prepareCall('BINS', { ranges: ranges(['score', score], ['values', values]), cutoff, bandwidth, settings, settingsPosition: 4, detail }, invocation);
    const r = c.result(() => binnedMeansAt(c.cols[0].values, c.cols[1].values, c.cutoff, c.opts));
    const rows: Cell[][] = [['midpoint', 'mean', 'count', 'side'], ...r.bins.map((b): Cell[] => [cellOf(b.midpoint), cellOf(b.mean), b.count, b.side])];
    if (!c.detail) return rows;
    return table([...rows, ['bins_below', r.bins_below], ['bins_above', r.bins_above], ...commonRows(r)], 4);
  });
}
