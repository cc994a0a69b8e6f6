/**
 * The outcome–treatment validity test of one outcome (Arai, Hsu, Kitagawa,
 * Mourifié & Wan 2022; docs/methods.md §4) at the check's test bandwidth, with
 * its by-bandwidth table — the same steps as `runCheck`, so the same numbers
 * to the last digit. `cells` (whole-number codes) runs it within the cells of
 * a discrete covariate.
 *
 * @example validity(score, treated, bill, 60).pvalue // the headline p-value
 */
import { outcomeValidity, settle, testBandwidth, ValiditySummary } from '../check';
import { checkColumns, Column } from '../data';
import { MultiplierName } from '../validity';
import { columnsInput, EstimateOptions, merged, ResultBase } from './common';

export interface ValidityOptions extends EstimateOptions {
  draws?: number;
  seed?: number;
  grid?: number;
  trim?: number;
  multiplier?: MultiplierName;
  /** The trend guard (docs/methods.md §4.8; default true). */
  trendGuard?: boolean;
  /** Multiples of the test bandwidth for the by-bandwidth table (default 0.5, 0.75, 1, 1.5, 2); [] for none. */
  sensitivity?: number[];
  /** A discrete covariate's code for every row: the test is run within its cells. */
  cells?: Column;
  /** The cells' names, by code (for the worst interval's cell), and the covariate's name. */
  cellLabels?: string[];
  cellsName?: string;
}

/** The check's validity block for this outcome (both versions, by-bandwidth table) with the fields every result carries. */
export type ValidityEntryReport = ValiditySummary & ResultBase & { test_bandwidth_rule: 'undersmoothed mse' | 'typed' };

export function validity(score: Column, treated: Column, outcome: Column, cutoff: number, opts: ValidityOptions = {}): ValidityEntryReport {
  const input = columnsInput({ score, treated, outcome }, opts);
  if (opts.cells !== undefined) {
    const codes = checkColumns({ score: { values: input.score.values }, cells: { values: opts.cells, kind: 'code' } }).cells;
    let n = 0;
    for (let i = 0; i < codes.length; i++) if (codes[i] + 1 > n) n = codes[i] + 1;
    input.within = { name: opts.cellsName ?? 'cells', codes: Int32Array.from(codes), labels: opts.cellLabels ?? Array.from({ length: n }, (_, k) => String(k)) };
  }
  const s = settle(input, { ...opts, cutoff });
  const tk = s.takeupRows;
  const t = testBandwidth(tk.score, tk.treated, s.cutoff, s.kernel, s.bandwidth.value, opts.bandwidth);
  const v = outcomeValidity(s, input, input.outcomes[0], s.prepared[0], t.value, opts);
  const p = s.prepared[0];
  return {
    ...v.summary,
    test_bandwidth_rule: t.rule,
    bandwidth: t.value,
    counts: v.summary.applicable ? v.summary.observed.counts : v.summary.counts,
    rows: { used: p.rows.length, dropped: p.dropped },
    warnings: merged(s.warnings, t.warnings, v.warnings),
  };
}
