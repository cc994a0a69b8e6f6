/**
 * CUTLINE.VALIDITY: the p-value of the outcome–treatment test of a fuzzy
 * design (Arai, Hsu, Kitagawa, Mourifié & Wan 2022, multiplier bootstrap),
 * by the engine's `validity`, at the test bandwidth `cutline check` uses;
 * with one outcome and the same settings, the p-value it prints.
 *
 * The bootstrap takes a noticeable fraction of a second on large data, so
 * the function returns a promise: the work is scheduled after the cells
 * that are already due, and skipped when Excel cancels the call first (the
 * runtime's CancelableInvocation). A remembered result returns at once.
 *
 * @example =CUTLINE.VALIDITY(C2:C6001, D2:D6001, E2:E6001, 60)
 */
import { validity as validityTest } from '../engine/index';
import { cellOf, guarded, InvocationLike, isRemembered, Matrix, remembered, single } from './call';
import { excelError, toExcelError } from './excelError';
import { commonRows, Row, table } from './detail';
import { PreparedCall, prepareCall, ranges } from './prepare';

function present(c: PreparedCall): Matrix {
  const r = remembered(c.key, () => validityTest(c.cols[0].values, c.cols[1].values, c.cols[2].values, c.cutoff, c.opts));
  if (!c.detail) return single('VALIDITY', r.pvalue);
  const arm = r.worst.arm === 1 ? 'treated' : 'untreated';
  return table([
    ['p-value', cellOf(r.pvalue)],
    ['verdict at 5%', r.pvalue <= 0.05 ? 'the data contradict the design' : 'the data do not contradict the design'],
    ['statistic', cellOf(r.statistic)],
    ['5% critical value', cellOf(r.critical_value)],
    ['intervals', r.intervals],
    ['draws', r.draws],
    ['seed', r.seed],
    ['worst interval: arm', arm],
    ['worst interval: from', cellOf(r.worst.from)],
    ['worst interval: to', cellOf(r.worst.to)],
    ['worst interval: t', cellOf(r.worst.t)],
    ...r.by_bandwidth
      .filter((b) => b.multiple !== 1)
      .map((b): Row => [`p-value at ${b.multiple} × bandwidth`, b.pvalue === undefined ? (b.error ?? '') : cellOf(b.pvalue)]),
    ['eligible side', r.eligible],
    ...commonRows(r),
  ]);
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
