/**
 * CUTLINE.VALIDITY: the p-value of the outcome–treatment test of a fuzzy
 * design (Arai, Hsu, Kitagawa, Mourifié & Wan 2022, multiplier bootstrap),
 * by the engine's `validity`, at the test bandwidth `cutline check` uses;
 * with one outcome and the same settings, the p-value it prints: the larger
 * of the test on the observed outcomes and on the trend-adjusted ones when
 * the trend guard applies. A sharp design (nothing to test) is #N/A.
 *
 * The bootstrap takes a noticeable fraction of a second on large data, so
 * the function returns a promise: the work is scheduled after the cells
 * that are already due, and skipped when Excel cancels the call first (the
 * runtime's CancelableInvocation). A remembered result returns at once.
 *
 * @example =CUTLINE.VALIDITY(C2:C6001, D2:D6001, E2:E6001, 60)
 */
import { validity as validityTest } from '../engine';
import { cellOf, guarded, InvocationLike, isRemembered, Matrix, single } from './call';
import { excelError, toExcelError } from './excelError';
import { commonRows, Row, table } from './detail';
import { PreparedCall, prepareCall, ranges } from './prepare';

function present(c: PreparedCall): Matrix {
  const r = c.result(() => validityTest(c.cols[0].values, c.cols[1].values, c.cols[2].values, c.cutoff, c.opts));
  // A sharp design: take-up does not vary on a side, so there is nothing to test.
  if (!r.applicable) throw excelError('#N/A', `CUTLINE.VALIDITY: the test does not apply: ${r.reason}`);
  if (!c.detail) return single('VALIDITY', r.pvalue);
  const o = r.observed;
  const rows: Row[] = [
    ['pvalue', cellOf(r.pvalue)],
    ['rejects', r.rejects],
    ['decided_by', r.decided_by],
    ['trend_guard', r.guard],
    ['pvalue_observed', cellOf(o.pvalue)],
    ['pvalue_trend_adjusted', r.trend_adjusted ? cellOf(r.trend_adjusted.pvalue) : 'not run'],
    ['statistic', cellOf(o.statistic)],
    ['critical_value', cellOf(o.critical_value)],
    ['intervals', o.intervals],
    ['draws', o.draws],
    ['seed', o.seed],
    ['worst_arm', o.worst.arm === 1 ? 'treated' : 'untreated'],
    ['worst_from', cellOf(o.worst.from)],
    ['worst_to', cellOf(o.worst.to)],
    ['worst_t', cellOf(o.worst.t)],
  ];
  for (const b of r.by_bandwidth) {
    if (b.multiple === 1) continue;
    rows.push([`pvalue_at_${b.multiple}`, b.pvalue !== undefined ? cellOf(b.pvalue) : (b.error ?? b.reason ?? 'not computed')]);
  }
  return table([...rows, ...commonRows(r)]);
}

/**
 * P-value of the outcome–treatment test of the design (small: the data contradict it).
 * @customfunction VALIDITY
 * @param score Scores (running variable): one column; a title cell at the top is skipped.
 * @param treated Treated or not (1/0 or TRUE/FALSE), the same rows as score.
 * @param outcome Outcome values, the same rows as score.
 * @param cutoff Cutoff of the score: units at or above it are on the upper side.
 * @param [bandwidth] Bandwidth of the test; leave empty for the test's own (undersmoothed) bandwidth.
 * @param [settings] Two-column range of settings (name, value), e.g. draws, seed, grid, trim, multiplier, sensitivity, kernel.
 * @param [detail] TRUE spills a labelled table: p-value, statistic, critical value, worst interval, bandwidth, counts, rows, warnings.
 * @param invocation Invocation (supplied by Excel; lets Excel cancel the test).
 * @returns The p-value; with detail, a two-column table.
 * @requiresParameterAddresses
 */
export function validity(
  score: any[][],
  treated: any[][],
  outcome: any[][],
  cutoff: number,
  bandwidth?: number,
  settings?: any[][],
  detail?: boolean,
  invocation?: CustomFunctions.CancelableInvocation,
): Promise<any[][]> {
  let c: PreparedCall;
  try {
    c = prepareCall(
      'VALIDITY',
      { ranges: ranges(['score', score], ['treated', treated, true], ['outcome', outcome]), cutoff, bandwidth, settings, settingsPosition: 5, detail },
      invocation as InvocationLike | undefined,
    );
  } catch (e) {
    return Promise.reject(toExcelError('VALIDITY', e));
  }
  if (isRemembered(c.key)) {
    try {
      return Promise.resolve(guarded('VALIDITY', () => present(c)));
    } catch (e) {
      return Promise.reject(e);
    }
  }
  return new Promise((resolve, reject) => {
    let canceled = false;
    if (invocation) invocation.onCanceled = () => (canceled = true);
    setTimeout(() => {
      if (canceled) {
        reject(excelError('#N/A', 'CUTLINE.VALIDITY: canceled by Excel before it ran'));
        return;
      }
      try {
        resolve(guarded('VALIDITY', () => present(c)));
      } catch (e) {
        reject(e);
      }
    }, 0);
  });
}
