/**
 * CUTLINE.BALANCE: the p-value for a jump in a pre-treatment covariate at
 * the cutoff (robust local linear jump at the covariate's own bandwidth),
 * with the Canay & Kamat (2018) permutation test beside it in the detail,
 * by the engine's `covariateBalance`.
 *
 * @example =CUTLINE.BALANCE(C2:C6001, G2:G6001, 60)
 */
import { covariateBalance } from '../engine';
import { cellOf, guarded, Matrix, single } from './call';
import { commonRows, table } from './detail';
import { excelError } from './excelError';
import { prepareCall, ranges } from './prepare';

/**
 * P-value for a jump in a covariate at the cutoff (small: the groups differ before treatment).
 * @customfunction BALANCE
 * @param score Scores (running variable): one column; a title cell at the top is skipped.
 * @param covariate A characteristic fixed before treatment, the same rows as score.
 * @param cutoff Cutoff of the score: units at or above it are on the upper side.
 * @param [bandwidth] Bandwidth around the cutoff; leave empty for the data-driven rule.
 * @param [settings] Two-column range of settings (name, value), e.g. kernel, variance, rule, seed, donut.
 * @param [detail] TRUE spills a labelled table: jump, standard error, p-value, permutation p-value, bandwidth, counts, rows, warnings.
 * @param invocation Invocation (supplied by Excel).
 * @returns The p-value of the jump; with detail, a two-column table.
 * @requiresParameterAddresses
 */
export function balance(
  score: any[][],
  covariate: any[][],
  cutoff: number,
  bandwidth?: number,
  settings?: any[][],
  detail?: boolean,
  invocation?: CustomFunctions.Invocation,
): any[][] {
  return guarded('BALANCE', (): Matrix => {
    const c = prepareCall('BALANCE', { ranges: ranges(['score', score], ['covariate', covariate]), cutoff, bandwidth, settings, settingsPosition: 4, detail }, invocation);
    const r = c.result(() => covariateBalance(c.cols[0].values, c.cols[1].values, c.cutoff, c.opts));
    if (r.pvalue === undefined) {
      throw excelError('#N/A', `CUTLINE.BALANCE: the jump in the covariate could not be computed${r.warnings.length ? `: ${r.warnings.join('; ')}` : ''}`);
    }
    if (!c.detail) return single('BALANCE', r.pvalue);
    return table([
      ['jump', cellOf(r.jump)],
      ['se', cellOf(r.se)],
      ['pvalue', cellOf(r.pvalue)],
      ['permutation_pvalue', r.permutation_pvalue === undefined ? 'not computed' : cellOf(r.permutation_pvalue)],
      ['q', r.q === undefined ? 'not computed' : r.q],
      ...commonRows(r),
    ]);
  });
}
