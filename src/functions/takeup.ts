/**
 * CUTLINE.TAKEUP: the jump in the share treated at the cutoff (the first
 * stage of a fuzzy design), by the engine's `takeupJump`.
 *
 * @example =CUTLINE.TAKEUP(C2:C6001, D2:D6001, 60)
 */
import { takeupJump } from '../engine';
import { guarded, Matrix, single } from './call';
import { commonRows, estimateRows, table } from './detail';
import { prepareCall, ranges } from './prepare';

/**
 * Jump in the share treated at the cutoff (first stage), eligible side minus the other side.
 * @customfunction TAKEUP
 * @param score Scores (running variable): one column; a title cell at the top is skipped.
 * @param treated Treated or not (1/0 or TRUE/FALSE), the same rows as score.
 * @param cutoff Cutoff of the score: units at or above it are on the upper side.
 * @param [bandwidth] Bandwidth around the cutoff; leave empty for the data-driven rule.
 * @param [settings] Two-column range of settings (name, value), e.g. kernel, variance, rule, eligible, level, donut.
 * @param [detail] TRUE spills a labelled table: estimate, standard error, intervals, p-value, bandwidth, counts, rows, warnings.
 * @param invocation Invocation (supplied by Excel).
 * @returns The take-up jump; with detail, a two-column table.
 * @requiresParameterAddresses
 */
export function takeup(
  score: any[][],
  treated: any[][],
  cutoff: number,
  bandwidth?: number,
  settings?: any[][],
  detail?: boolean,
  invocation?: CustomFunctions.Invocation,
): any[][] {
  return guarded('TAKEUP', (): Matrix => {
    const c = prepareCall(
      'TAKEUP',
      { ranges: ranges(['score', score], ['treated', treated, true]), cutoff, bandwidth, settings, settingsPosition: 4, detail },
      invocation,
    );
    const r = c.result(() => takeupJump(c.cols[0].values, c.cols[1].values, c.cutoff, c.opts));
    if (!c.detail) return single('TAKEUP', r.estimate);
    return table([...estimateRows(r), ['eligible', r.eligible], ...commonRows(r)]);
  });
}
