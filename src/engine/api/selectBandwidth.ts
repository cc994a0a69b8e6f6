/**
 * A bandwidth as a check chooses it (docs/methods.md §3 and §4.9): `purpose: 'estimate'`
 * the estimates' bandwidth (the rule on the complier effect of `values` when
 * `treated` is given, else on the sharp jump of `values`; a typed bandwidth
 * wins); `purpose: 'test'` the validity test's default (the mse bandwidth of
 * the take-up jump × n^(−1/20)), which needs `treated`.
 *
 * @example selectBandwidth(score, bill, 60, { treated, purpose: 'test' }).bandwidth // 9.801 on the demo
 */
import { BandwidthRule } from '../bandwidth';
import { ruleBandwidth, settle, testBandwidth } from '../check';
import { Column, compact, completeRows, indexScores } from '../data';
import { CutlineError } from '../errors';
import { columnsInput, EstimateOptions, merged, ResultBase, windowCounts } from './common';

export interface BandwidthResult extends ResultBase {
  rule: BandwidthRule | 'typed' | 'undersmoothed mse';
}

export function selectBandwidth(
  score: Column,
  values: Column,
  cutoff: number,
  opts: EstimateOptions & { treated?: Column; purpose?: 'estimate' | 'test' } = {},
): BandwidthResult {
  const purpose = opts.purpose ?? 'estimate';
  if (purpose !== 'estimate' && purpose !== 'test') {
    throw new CutlineError(`the purpose must be "estimate" or "test", got ${JSON.stringify(purpose)}`, { code: 'option', argument: 'purpose' });
  }
  const input = columnsInput({ score, treated: opts.treated, outcome: values, outcomeArgument: 'values' }, opts);
  if (!input.treatedGiven) {
    if (purpose === 'test') throw new CutlineError("the validity test's bandwidth needs the treated column", { code: 'option', argument: 'treated' });
    const y = input.outcomes[0];
    const { rows, dropped } = completeRows(y.values.length, [input.score.missing, y.missing]);
    const r = indexScores(compact(input.score.values, rows));
    const bw = ruleBandwidth(r, compact(y.values, rows), cutoff, { rule: opts.rule, kernel: opts.kernel ?? 'triangular', typed: opts.bandwidth });
    return { bandwidth: bw.value, rule: bw.rule, counts: windowCounts(r, cutoff, bw.value), rows: { used: rows.length, dropped }, warnings: bw.warnings };
  }
  const s = settle(input, { ...opts, cutoff });
  if (purpose === 'estimate') {
    const p = s.prepared[0];
    const h = s.bandwidth.value;
    return { bandwidth: h, rule: s.bandwidth.rule, counts: windowCounts(p.score, cutoff, h), rows: { used: p.rows.length, dropped: p.dropped }, warnings: s.bandwidth.warnings };
  }
  const tk = s.takeupRows;
  const t = testBandwidth(tk.score, tk.treated, s.cutoff, s.kernel, s.bandwidth.value, opts.bandwidth);
  return { bandwidth: t.value, rule: t.rule, counts: windowCounts(tk.score, cutoff, t.value), rows: { used: tk.rows.length, dropped: tk.dropped }, warnings: merged(t.warnings) };
}
