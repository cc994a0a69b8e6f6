/**
 * One covariate's continuity at the cutoff (docs/methods.md §7): its local linear
 * jump at its own bandwidth (the estimates' rule on the covariate's sharp jump,
 * or the typed one) and the Canay & Kamat (2018) permutation test of the units
 * nearest the cutoff — a check's balance row for this covariate.
 *
 * @example covariateBalance(score, age, 60).pvalue // 0.145 on the demo
 */
import { balanceSection, BalanceRow, donutMask } from '../check';
import { checkCutoff, Column, compact, completeRows, indexScores } from '../data';
import { columnsInput, EstimateOptions, ResultBase, windowCounts } from './common';

export interface BalanceReport extends Omit<BalanceRow, 'bandwidth' | 'rows' | 'warnings'>, ResultBase {}

export function covariateBalance(score: Column, covariate: Column, cutoff: number, opts: EstimateOptions & { seed?: number } = {}): BalanceReport {
  checkCutoff(cutoff);
  const input = columnsInput({ score, outcome: covariate, outcomeArgument: 'covariate' }, opts);
  const kernel = opts.kernel ?? 'triangular';
  const variance = opts.variance ?? 'neighbours';
  const cov = input.outcomes[0];
  const donut = donutMask(input.score.values, cutoff, opts.donut, input.score.missing);
  const cluster = variance === 'cluster' ? input.cluster : undefined;
  const { rows, dropped } = completeRows(cov.values.length, [input.score.missing, cov.missing, cluster?.missing, donut?.mask]);
  const r = indexScores(compact(input.score.values, rows));
  const [row] = balanceSection(
    [{ name: 'covariate', score: r, values: compact(cov.values, rows), clusters: cluster && compact(cluster.codes, rows), dropped }],
    cutoff,
    { rule: opts.rule, typed: opts.bandwidth, kernel, variance, sign: opts.eligible === 'below' ? -1 : 1, seed: opts.seed },
  );
  const h = row.bandwidth ?? NaN;
  return { ...row, bandwidth: h, counts: Number.isFinite(h) ? windowCounts(r, cutoff, h) : { below: 0, above: 0 }, rows: row.rows, warnings: row.warnings };
}
