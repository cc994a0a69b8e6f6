/**
 * CUTLINE.JUMP: the jump in the mean of any column at the cutoff (sharp
 * local linear estimate with robust bias-corrected inference, Calonico,
 * Cattaneo & Titiunik 2014), by the engine's `outcomeJump`.
 *
 * @example =CUTLINE.JUMP(C2:C6001, E2:E6001, 60)
 */
import { outcomeJump } from '../engine';
import { guarded, Matrix, single } from './call';
import { commonRows, estimateRows, table } from './detail';
import { prepareCall, ranges } from './prepare';

/**
 * Jump in the mean of a column at the cutoff (upper side minus lower side, or the reverse when eligibility is below).
 * @customfunction JUMP
 * @param score Scores (running variable): one column; a title cell at the top is skipped.
 * @param values Values whose mean may jump, the same rows as score.
 * @param cutoff Cutoff of the score: units at or above it are on the upper side.
 * @param [bandwidth] Bandwidth around the cutoff; leave empty for the data-driven rule.
 * @param [settings] Two-column range of settings (name, value), e.g. kernel, variance, rule, eligible, level, donut.
 * @param [detail] TRUE spills a labelled table: estimate, standard error, intervals, p-value, bandwidth, counts, rows, warnings.
 * @param invocation Invocation (supplied by Excel).
 * @returns The jump; with detail, a two-column table.
 * @requiresParameterAddresses
 */
export function jump(
  score: any[][],
  values: any[][],
  cutoff: number,
  bandwidth?: number,
  settings?: any[][],
  detail?: boolean,
  invocation?: CustomFunctions.Invocation,
): any[][] {
  return guarded('JUMP', (): Matrix => {
    const c = prepareCall('JUMP', { ranges: ranges(['score', score], ['values', values]), cutoff, bandwidth, settings, settingsPosition: 4, detail }, invocation);
    const r = c.result(() => outcomeJump(c.cols[0].values, c.cols[1].values, c.cutoff, c.opts));
    if (!c.detail) return single('JUMP', r.estimate);
    return table([...estimateRows(r), ['eligible', r.eligible], ...commonRows(r)]);
  });
}
