/**
 * The implied distribution of compliers' outcomes at given outcome values
 * (Imbens & Rubin 1997 at the cutoff; docs/methods.md §5): the CDF of treated
 * (arm 1) or untreated (arm 0) compliers, or its kernel density, at the
 * check's bandwidth and eligible side, on the outcome's own rows.
 *
 * @example complierCdfAt(score, treated, bill, 60, [1400, 1500], 1).cdf
 */
import { settle } from '../check';
import { complierCdf, complierDensity } from '../compliers';
import { checkColumns, Column } from '../data';
import { CutlineError } from '../errors';
import { columnsInput, EstimateOptions, ResultBase, windowCounts } from './common';

export interface ComplierCurveResult extends ResultBase {
  at: number[];
  arm: 0 | 1;
  /** The CDF (complierCdfAt) or the density (complierDensityAt) at each point of `at`. */
  values: number[];
  /** Stretches where the CDF falls, or the density is negative: the picture of a violation (or of noise). */
  violations: Array<{ from: number; to: number }>;
  /** The density's own bandwidth in outcome units (complierDensityAt only). */
  density_bandwidth?: number;
}

function curve(
  which: 'cdf' | 'density',
  score: Column,
  treated: Column,
  outcome: Column,
  cutoff: number,
  at: Column,
  arm: 0 | 1,
  opts: EstimateOptions,
): ComplierCurveResult {
  if (arm !== 0 && arm !== 1) throw new CutlineError(`arm must be 1 (treated compliers) or 0 (untreated), got ${String(arm)}`, { code: 'option', argument: 'arm' });
  const points = Array.from(checkColumns({ at: { values: at } }).at);
  const s = settle(columnsInput({ score, treated, outcome }, opts), { ...opts, cutoff });
  const p = s.prepared[0];
  const o = { bandwidth: s.bandwidth.value, kernel: s.kernel, sign: s.sign };
  const base = {
    at: points,
    arm,
    bandwidth: o.bandwidth,
    counts: windowCounts(p.score, s.cutoff, o.bandwidth),
    rows: { used: p.rows.length, dropped: p.dropped },
    warnings: s.warnings,
  };
  if (which === 'cdf') {
    const c = complierCdf(p.score, p.treated, p.outcome!, s.cutoff, points, arm, o);
    return { ...base, values: c.cdf, violations: c.decreasing };
  }
  const d = complierDensity(p.score, p.treated, p.outcome!, s.cutoff, points, arm, o);
  return { ...base, values: d.density, violations: d.negative, density_bandwidth: d.densityBandwidth };
}

export function complierCdfAt(score: Column, treated: Column, outcome: Column, cutoff: number, at: Column, arm: 0 | 1, opts: EstimateOptions = {}): ComplierCurveResult {
  return curve('cdf', score, treated, outcome, cutoff, at, arm, opts);
}

export function complierDensityAt(score: Column, treated: Column, outcome: Column, cutoff: number, at: Column, arm: 0 | 1, opts: EstimateOptions = {}): ComplierCurveResult {
  return curve('density', score, treated, outcome, cutoff, at, arm, opts);
}
