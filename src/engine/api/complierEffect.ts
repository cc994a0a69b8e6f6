/**
 * The effect for compliers (fuzzy discontinuity): the outcome's jump divided by
 * the take-up jump on the same rows, with delta-method and robust
 * bias-corrected inference (docs/methods.md §2.4). Bandwidth, eligible side and
 * rows are settled exactly as in a check (check/setting.ts), so with one
 * outcome this gives `runCheck`'s numbers to the last digit; the take-up and
 * the jump it divides are returned beside it (effect = jump / takeup).
 *
 * @example complierEffect(score, treated, bill, 60).effect.estimate // −160.7 on the demo
 */
import { outcomeEstimates, settle } from '../check';
import { Column } from '../data';
import { Estimate } from '../fit';
import { BandwidthRule } from '../bandwidth';
import { columnsInput, EstimateOptions, merged, ResultBase } from './common';

export interface EffectResult extends ResultBase {
  effect: Estimate;
  /** The take-up jump on the outcome's own rows. */
  takeup: Estimate;
  /** The outcome's jump. */
  jump: Estimate;
  rule: BandwidthRule | 'typed';
  eligible: 'above' | 'below';
}

export function complierEffect(score: Column, treated: Column, outcome: Column, cutoff: number, opts: EstimateOptions = {}): EffectResult {
  const s = settle(columnsInput({ score, treated, outcome }, opts), { ...opts, cutoff });
  const p = s.prepared[0];
  const est = outcomeEstimates(s, p, undefined, opts.level);
  return {
    effect: est.effect,
    takeup: est.takeup,
    jump: est.jump,
    bandwidth: s.bandwidth.value,
    rule: s.bandwidth.rule,
    eligible: s.eligible,
    counts: est.counts,
    rows: { used: p.rows.length, dropped: p.dropped },
    warnings: merged(s.warnings, est.warnings),
  };
}
