/**
 * What the task pane uses of the engine, through its public index: the whole
 * check, and the take-up jump, whose sign tells which side of the cutoff is
 * eligible (the engine's own detection, the same the check makes).
 *
 * @example detectEligible(score, treated, [scoreMissing, treatedMissing], 60) // 'above'
 */
import { takeupJump } from '../engine';

export { runCheck, CutlineError, limitProblem } from '../engine';
export type { CheckInput, CheckOptions, CheckResult } from '../engine';

/** The side of the cutoff where take-up is higher (the eligible side), from the rows with both values. */
export function detectEligible(score: Float64Array, treated: Float64Array, missing: Uint8Array[], cutoff: number): 'above' | 'below' {
  return takeupJump(score, treated, cutoff, { missing: { score: missing[0], treated: missing[1] } }).eligible;
}
