/**
 * The jump in an outcome's mean at the cutoff (eligible side minus the other),
 * local linear with robust bias-corrected inference (docs/methods.md §2.4). With
 * `treated` in the options it is the check's jump to the last digit (the
 * bandwidth of the complier effect, the eligible side from take-up, the rows
 * complete in both); without, the sharp jump at the typed bandwidth or the
 * rule's bandwidth for this jump, eligible above unless said otherwise.
 *
 * @example outcomeJump(score, bill, 60, { treated }).estimate // −78.42 on the demo
 */
import { outcomeEstimates, settle, donutMask, ruleBandwidth } from '../check';
import { checkCutoff, Column, completeRows, indexScores, compact } from '../data';
import { boundaryWindow, jumpAt, windowWarnings } from '../fit';
import { columnsInput, EstimateOptions, merged } from './common';
import { EstimateResult } from './takeupJump';

export function outcomeJump(score: Column, values: Column, cutoff: number, opts: EstimateOptions & { treated?: Column } = {}): EstimateResult {
  checkCutoff(cutoff);
  const input = columnsInput({ score, treated: opts.treated, outcome: values, outcomeArgument: 'values' }, opts);
  if (input.treatedGiven) {
    const s = settle(input, { ...opts, cutoff });
    const p = s.prepared[0];
    const est = outcomeEstimates(s, p, undefined, opts.level);
    return {
      ...est.jump,
      bandwidth: s.bandwidth.value,
      rule: s.bandwidth.rule,
      eligible: s.eligible,
      counts: est.counts,
      rows: { used: p.rows.length, dropped: p.dropped },
      warnings: merged(s.warnings, est.warnings),
    };
  }
  const kernel = opts.kernel ?? 'triangular';
  const variance = opts.variance ?? 'neighbours';
  const y = input.outcomes[0];
  const donut = donutMask(input.score.values, cutoff, opts.donut, input.score.missing);
  const { rows, dropped } = completeRows(y.values.length, [input.score.missing, y.missing, input.cluster?.missing, donut?.mask]);
  const r = indexScores(compact(input.score.values, rows));
  const v = compact(y.values, rows);
  const bw = ruleBandwidth(r, v, cutoff, { rule: opts.rule, kernel, typed: opts.bandwidth });
  const win = boundaryWindow(r, cutoff, bw.value, kernel);
  const eligible = opts.eligible ?? 'above';
  const est = jumpAt(win, v, { variance, clusters: input.cluster && compact(input.cluster.codes, rows), sign: eligible === 'above' ? 1 : -1, level: opts.level });
  return {
    ...est,
    bandwidth: bw.value,
    rule: bw.rule,
    eligible,
    counts: { below: win.below.index.length, above: win.above.index.length },
    rows: { used: rows.length, dropped },
    warnings: merged(bw.warnings, windowWarnings(win)),
  };
}
