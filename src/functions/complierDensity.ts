/**
 * CUTLINE.COMPLIERDENSITY: the implied density of compliers' outcomes in one
 * arm at the values `at` (a kernel smooth of the implied distribution), by
 * the engine's `complierDensityAt`. It spills one value per `at`; a negative
 * density is the picture of a violation of the design (or noise).
 *
 * @example =CUTLINE.COMPLIERDENSITY(C2:C6001, D2:D6001, E2:E6001, 60, J2:J26, 0)
 */
import { complierDensityAt } from '../engine';
import { complierCurveCall } from './complierCurve';

/**
 * Implied density of compliers' outcomes at the cutoff, at the given outcome values (spills).
 * @customfunction COMPLIERDENSITY
 * @param score Scores (running variable): one column; a title cell at the top is skipped.
 * @param treated Treated or not (1/0 or TRUE/FALSE), the same rows as score.
 * @param outcome Outcome values, the same rows as score.
 * @param cutoff Cutoff of the score: units at or above it are on the upper side.
 * @param at Outcome values where the density is wanted (a column or a row).
 * @param arm 1 for treated compliers, 0 for untreated compliers.
 * @param [bandwidth] Bandwidth around the cutoff; leave empty for the data-driven rule.
 * @param [settings] Two-column range of settings (name, value), e.g. kernel, rule, eligible, donut.
 * @param [detail] TRUE spills a table of outcome values and densities, then bandwidth, counts, rows, warnings.
 * @param invocation Invocation (supplied by Excel).
 * @returns One density per value of at, in its shape; with detail, a two-column table.
 * @requiresParameterAddresses
 */
export function complierdensity(
  score: any[][],
  treated: any[][],
  outcome: any[][],
  cutoff: number,
  at: any[][],
  arm: any,
  bandwidth?: number,
  settings?: any[][],
  detail?: boolean,
  invocation?: CustomFunctions.Invocation,
): any[][] {
  return complierCurveCall('COMPLIERDENSITY', complierDensityAt, 'density', { score, treated, outcome, cutoff, at, arm, bandwidth, settings, detail }, invocation);
}
