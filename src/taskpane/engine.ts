/**
 * What the task pane uses of the engine, in one place: the whole check, and
 * the take-up jump's sign that tells which side of the cutoff is eligible.
 *
 * TEMPORARY until the engine's public index (src/engine/index.ts) lands on
 * main: the eligible side is read as the engine's check reads it (the sign
 * of take-up's local linear jump at the rule's bandwidth); afterwards this
 * file re-exports `runCheck` and calls `takeupJump(…).eligible`.
 */
import { chooseBandwidth } from '../engine/bandwidth/bandwidth';
import { runCheck } from '../engine/check/check';
import { compact, completeRows } from '../engine/data/listwise';
import { applyWeights, boundaryWindow } from '../engine/fit/boundaryWindow';

export { runCheck };
export type { CheckInput, CheckOptions, CheckResult } from '../engine/check/check';
export { CutlineError } from '../engine/errors';

/** The side of the cutoff where take-up is higher (the eligible side), from the rows with both values. */
export function detectEligible(score: Float64Array, treated: Float64Array, missing: Uint8Array[], cutoff: number): 'above' | 'below' {
  const keep = completeRows(score.length, missing).rows;
  const s = compact(score, keep);
  const t = compact(treated, keep);
  const h = chooseBandwidth(s, t, cutoff, { kernel: 'triangular' }).value;
  const w = boundaryWindow(s, cutoff, h, 'triangular');
  const jump = applyWeights(w.above.coef1[0], w.above.index, t) - applyWeights(w.below.coef1[0], w.below.index, t);
  return jump < 0 ? 'below' : 'above';
}
