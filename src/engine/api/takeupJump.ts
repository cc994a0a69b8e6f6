/**
 * The take-up jump (first stage) at the cutoff: the local linear jump in the
 * share treated, eligible side minus the other, with robust bias-corrected
 * inference (docs/methods.md §2.4). The bandwidth is the typed one, else the rule
 * applied to the take-up jump itself; pass a check's bandwidth to get the
 * check's take-up to the last digit.
 *
 * @example takeupJump(score, treated, 60, { bandwidth: 11.99 }).estimate // 0.4888 on the demo
 */
import { settle } from '../check';
import { Column } from '../data';
import { Estimate, estimatesAtCutoff } from '../fit';
import { BandwidthRule } from '../bandwidth';
import { columnsInput, EstimateOptions, merged, ResultBase } from './common';

export interface EstimateResult extends Estimate, ResultBase {
  rule: BandwidthRule | 'typed';
  eligible: 'above' | 'below';
}

export function takeupJump(score: Column, treated: Column, cutoff: number, opts: EstimateOptions = {}): EstimateResult {
  const input = columnsInput({ score, treated }, opts);
  const s = settle(input, { ...opts, cutoff });
  const tk = s.takeupRows;
  const est = estimatesAtCutoff(tk.score, tk.treated, tk.treated, s.cutoff, {
    bandwidth: s.bandwidth.value,
    kernel: s.kernel,
    variance: s.variance,
    sign: s.sign,
    level: opts.level,
    clusters: tk.clusters,
    window: s.takeupWindow,
  });
  return {
    ...est.takeup,
    bandwidth: s.bandwidth.value,
    rule: s.bandwidth.rule,
    eligible: s.eligible,
    counts: est.counts,
    rows: { used: tk.rows.length, dropped: tk.dropped },
    warnings: merged(s.warnings, est.warnings),
  };
}
