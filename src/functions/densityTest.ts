/**
 * CUTLINE.DENSITYTEST: the p-value for a jump in the density of the score at
 * the cutoff — the local polynomial test (Cattaneo, Jansson & Ma 2020) as the
 * headline, McCrary's (2008) beside it — by the engine's `densityTest`; the
 * p-value `cutline check` prints. Sorting unrelated to outcomes leaves the
 * estimand intact, and a smooth density is no proof of validity.
 *
 * @example =CUTLINE.DENSITYTEST(C2:C6001, 60)
 */
import { densityTest } from '../engine';
import { cellOf, guarded, Matrix, single } from './call';
import { commonRows, table } from './detail';
import { excelError } from './excelError';
import { prepareCall, ranges } from './prepare';

/**
 * P-value for a jump in the density of the score at the cutoff (small: units may have sorted across it).
 * @customfunction DENSITYTEST
 * @param score Scores (running variable): one column; a title cell at the top is skipped.
 * @param cutoff Cutoff of the score.
 * @param [settings] Two-column range of settings (name, value), e.g. density bin, density bandwidth, donut, eligible.
 * @param [detail] TRUE spills a labelled table: p-value, log ratio of the densities, its standard error, both tests, bandwidth, counts, rows, warnings.
 * @param invocation Invocation (supplied by Excel).
 * @returns The p-value; with detail, a two-column table.
 * @requiresParameterAddresses
 */
export function densitytest(score: any[][], cutoff: number, settings?: any[][], detail?: boolean, invocation?: CustomFunctions.Invocation): any[][] {
  return guarded('DENSITYTEST', (): Matrix => {
    const c = prepareCall('DENSITYTEST', { ranges: ranges(['score', score]), cutoff, settings, settingsPosition: 2, detail }, invocation);
    const r = c.result(() =>
      densityTest(c.cols[0].values, c.cutoff, {
        eligible: c.settings.eligible,
        bin: c.settings.densityBin,
        bandwidth: c.settings.densityBandwidth,
        donut: c.settings.donut,
        missing: { score: c.cols[0].missing },
      }),
    );
    // Mass points can leave no density test reliable: then there is no p-value to give.
    if (r.method === 'none' || r.pvalue === undefined) {
      throw excelError('#N/A', `CUTLINE.DENSITYTEST: ${r.unreliable ?? 'no density test is reliable on these scores'}`);
    }
    if (!c.detail) return single('DENSITYTEST', r.pvalue);
    return table([
      ['pvalue', cellOf(r.pvalue)],
      ['method', r.method],
      ['log_ratio', cellOf(r.log_ratio)],
      ['se', cellOf(r.se)],
      ['pvalue_local_polynomial', r.local_polynomial ? cellOf(r.local_polynomial.pvalue) : 'not computed'],
      ['pvalue_mccrary', r.mccrary ? cellOf(r.mccrary.pvalue) : 'not computed'],
      ...commonRows(r),
    ]);
  });
}
