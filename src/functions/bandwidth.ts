/**
 * CUTLINE.BANDWIDTH: the data-driven bandwidth by rule (METHODS: mse, ik,
 * cer), by the engine's `selectBandwidth`. With `treated`, the rule of the
 * complier effect (the bandwidth `cutline check` uses for every estimate);
 * without, the rule of the column's sharp jump. `purpose` "test" gives the
 * validity test's bandwidth instead (needs `treated`). The purpose is an
 * argument, not a setting, so that one settings block serves both.
 *
 * @example =CUTLINE.BANDWIDTH(C2:C6001, E2:E6001, 60, D2:D6001)
 */
import { selectBandwidth } from '../engine';
import { guarded, Matrix, single } from './call';
import { commonRows, table } from './detail';
import { RangeInputError } from '../input/range';
import { trimBlank } from '../input/cells';
import { prepareCall } from './prepare';

/** The purpose argument: "estimate" (or empty) or "test". */
function purposeOf(v: unknown): 'estimate' | 'test' {
  const s = v === null || v === undefined ? '' : trimBlank(String(v)).toLowerCase();
  if (s === '' || s === 'estimate') return 'estimate';
  if (s === 'test') return 'test';
  throw new RangeInputError(`purpose must be "estimate" or "test"; it is ${JSON.stringify(v)}`, 'purpose');
}

/**
 * Data-driven bandwidth around the cutoff, by rule (mse unless the settings say ik or cer).
 * @customfunction BANDWIDTH
 * @param score Scores (running variable): one column; a title cell at the top is skipped.
 * @param values Outcome (or any column) whose jump the bandwidth is for, the same rows as score.
 * @param cutoff Cutoff of the score: units at or above it are on the upper side.
 * @param [treated] Treated or not (1/0 or TRUE/FALSE): given, the bandwidth is that of the effect for compliers.
 * @param [purpose] "estimate" (default): the bandwidth of the estimates; "test": that of the validity test (needs treated).
 * @param [settings] Two-column range of settings (name, value), e.g. rule, kernel, donut.
 * @param [detail] TRUE spills a labelled table: bandwidth, rule, counts, rows, warnings.
 * @param invocation Invocation (supplied by Excel).
 * @returns The bandwidth; with detail, a two-column table.
 * @requiresParameterAddresses
 */
export function bandwidth(
  score: any[][],
  values: any[][],
  cutoff: number,
  treated?: any[][],
  purpose?: string,
  settings?: any[][],
  detail?: boolean,
  invocation?: CustomFunctions.Invocation,
): any[][] {
  return guarded('BANDWIDTH', (): Matrix => {
    const given = treated !== null && treated !== undefined && (treated as unknown) !== '';
    const rangeList = [
      { argument: 'score', cells: score, position: 0 },
      { argument: 'values', cells: values, position: 1 },
      ...(given ? [{ argument: 'treated', cells: treated!, position: 3, binary: true }] : []),
    ];
    const use = purposeOf(purpose);
    const c = prepareCall('BANDWIDTH', { ranges: rangeList, cutoff, settings, settingsPosition: 5, detail, extraKey: use }, invocation);
    const r = c.result(() =>
      selectBandwidth(c.cols[0].values, c.cols[1].values, c.cutoff, {
        ...c.opts,
        treated: given ? c.cols[2].values : undefined,
        purpose: use,
      }),
    );
    if (!c.detail) return single('BANDWIDTH', r.bandwidth);
    return table([['rule', r.rule], ...commonRows(r)]);
  });
}
