/**
 * Binned means of a column on each side of the cutoff, with the local linear
 * fit lines, for a plot (docs/methods.md §8): the bins of a check's plot data, at
 * the typed bandwidth or the rule's bandwidth for this column's sharp jump.
 *
 * @example binnedMeansAt(score, bill, 60).bins[0] // { from, to, mean, count, … }
 */
import { binnedSeries, BinnedSeries, donutMask, ruleBandwidth } from '../check';
import { checkCutoff, Column, compact, completeRows, indexScores } from '../data';
import { columnsInput, EstimateOptions, merged, ResultBase, windowCounts } from './common';

export type BinsReport = Omit<BinnedSeries, 'name'> & ResultBase;

export function binnedMeansAt(score: Column, values: Column, cutoff: number, opts: EstimateOptions = {}): BinsReport {
  checkCutoff(cutoff);
  const input = columnsInput({ score, outcome: values, outcomeArgument: 'values' }, opts);
  const kernel = opts.kernel ?? 'triangular';
  const y = input.outcomes[0];
  const donut = donutMask(input.score.values, cutoff, opts.donut, input.score.missing);
  const { rows, dropped } = completeRows(y.values.length, [input.score.missing, y.missing, donut?.mask]);
  const r = indexScores(compact(input.score.values, rows));
  const v = compact(y.values, rows);
  const bw = ruleBandwidth(r, v, cutoff, { rule: opts.rule, kernel, typed: opts.bandwidth });
  const series = binnedSeries('values', r, v, cutoff, bw.value, kernel);
  return { bins: series.bins, bins_below: series.bins_below, bins_above: series.bins_above, rule: series.rule, fit: series.fit, bandwidth: bw.value, counts: windowCounts(r, cutoff, bw.value), rows: { used: rows.length, dropped }, warnings: merged(bw.warnings) };
}
