/**
 * CUTLINE.EFFECT: the effect of the treatment for compliers at the cutoff,
 * the fuzzy local linear ratio of the outcome's jump to take-up's jump
 * (Hahn, Todd & van der Klaauw 2001), by the engine's `complierEffect`.
 * With one outcome and the same settings it is the effect `cutline check`
 * prints.
 *
 * @example =CUTLINE.EFFECT(C2:C6001, D2:D6001, E2:E6001, 60)
 */
import { complierEffect } from '../engine';
import { cellOf, guarded, Matrix, single } from './call';
import { commonRows, estimateRows, table } from './detail';
import { prepareCall, ranges } from './prepare';

/**
 * Effect of the treatment for compliers at the cutoff (jump in the outcome divided by the jump in take-up).
 * @customfunction EFFECT
 * @param score Scores (running variable): one column; a title cell at the top is skipped.
 * @param treated Treated or not (1/0 or TRUE/FALSE), the same rows as score.
 * @param outcome Outcome values, the same rows as score.
 * @param cutoff Cutoff of the score: units at or above it are on the upper side.
 * @param [bandwidth] Bandwidth around the cutoff; leave empty for the data-driven rule.
 * @param [settings] Two-column range of settings (name, value), e.g. kernel, variance, rule, eligible, level, donut.
 * @param [detail] TRUE spills a labelled table: estimate, standard error, intervals, p-value, bandwidth, counts, rows, warnings.
 * @param invocation Invocation (supplied by Excel).
 * @returns The effect for compliers; with detail, a two-column table.
 * @requiresParameterAddresses
 */
export function effect(
  score: any[][],
  treated: any[][],
  outcome: any[][],
  cutoff: number,
  bandwidth?: number,
  settings?: any[][],
  detail?: boolean,
  invocation?: CustomFunctions.Invocation,
): any[][] {
  return guarded('EFFECT', (): Matrix => {
    const c = prepareCall(
      'EFFECT',
      { ranges: ranges(['score', score], ['treated', treated, true], ['outcome', outcome]), cutoff, bandwidth, settings, settingsPosition: 5, detail },
      invocation,
    );
    const r = c.result(() => complierEffect(c.cols[0].values, c.cols[1].values, c.cols[2].values, c.cutoff, c.opts));
    if (!c.detail) return single('EFFECT', r.effect.estimate);
    return table([
      ...estimateRows(r.effect),
      ['takeup', cellOf(r.takeup.estimate)],
      ['jump', cellOf(r.jump.estimate)],
      ['eligible', r.eligible],
      ...commonRows(r),
    ]);
  });
}
