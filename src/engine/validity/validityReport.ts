/**
 * The validity test as Cutline reports it (docs/methods.md §4, §4.8): the published test
 * of Arai, Hsu, Kitagawa, Mourifié & Wan (2022, Quantitative Economics 13(1))
 * on the observed outcomes, the same test on the trend guard's outcomes Ỹ
 * (trendRemoved.ts), the headline p-value, and both at every bandwidth of the
 * sensitivity table.
 *
 * The trend guard (Cutline's addition, on unless `trendGuard: false`): when
 * the window holds more than G distinct outcome values, the whole test —
 * interval class from Ỹ's window values, same bandwidth, kernel, floor, κ_n,
 * B_n, draws and seed — is run on (R, D, Ỹ) as well, and the headline is
 * p = max(p_observed, p_trend_adjusted): the design is rejected only when both
 * versions reject. That p-value is valid whenever either version is: a steep
 * trend common to every compliance type biases the observed version, and
 * compliance types on very different trends can bias the adjusted one. With at
 * most G distinct window outcomes (binary, discrete) the guard does not apply
 * and the headline is the observed version; with the guard off, it is too.
 *
 * Choices Cutline states:
 * - "more than G distinct values" is counted on the pooled window of the
 *   bandwidth at hand (all cells together), so at each bandwidth of the
 *   sensitivity table the guard applies or not on its own count;
 * - one Ỹ (one fit per side on every unit used) serves every bandwidth and
 *   every covariate cell;
 * - `decided_by` names the version whose p-value is the headline: the larger
 *   one, or `both` when they are equal;
 * - a sharp design at the test bandwidth (arms that test nothing,
 *   validityTest.ts) gives `{ applicable: false, reason }` and no table.
 *
 * @example
 *   const v = validityReport(score, treated, bill, 60, { bandwidth: 8, kernel: 'triangular', multiples: [0.5, 2] });
 *   if (v.applicable) v.pvalue; // max of v.observed.pvalue and v.trend_adjusted?.pvalue
 */
import { addNew } from '../addNew';
import { CutlineError } from '../errors';
import { formatNumber } from '../numeric';
import { SideTrend, trendRemoved } from './trendRemoved';
import { checkTestInput, resolveValidityOptions, ValidityNotApplicable, ValidityOptions, ValidityOutcome, ValidityResult, validityTestChecked } from './validityTest';

export interface ValidityReportOptions extends ValidityOptions {
  /** Multiples of `bandwidth` for the sensitivity table besides 1 (default none). */
  multiples?: number[];
  /** Run the test on the trend-removed outcomes too (default true); false gives the published test alone. */
  trendGuard?: boolean;
}

/** Why the trend-adjusted version is (not) there. */
export type GuardState = 'applied' | 'off' | 'few outcome values';

export interface ValidityAtBandwidth {
  multiple: number;
  bandwidth: number;
  /** false: a sharp design at this bandwidth (see `reason`). */
  applicable?: boolean;
  reason?: string;
  /** The headline: max of the two versions when the guard applies, else the observed one. */
  pvalue?: number;
  pvalue_observed?: number;
  pvalue_trend_adjusted?: number;
  /** Statistic and 5% critical value of the observed version. */
  statistic?: number;
  critical_value?: number;
  rejects?: boolean;
  /** Why the test could not run at this bandwidth. */
  error?: string;
}

export interface ValidityReport {
  applicable: true;
  /** Headline p-value and verdict at 5%. */
  pvalue: number;
  rejects: boolean;
  decided_by: 'observed' | 'trend_adjusted' | 'both';
  guard: GuardState;
  /** The published test on the observed outcomes. */
  observed: ValidityResult;
  /** The same test on the trend-removed outcomes (worst interval in Ỹ units: outcome units at the cutoff). */
  trend_adjusted?: ValidityResult;
  /** The removed trends (present when the guard is on). */
  trend?: { below: SideTrend; above: SideTrend };
  by_bandwidth: ValidityAtBandwidth[];
  warnings: string[];
}

export type ValidityReportOutcome = ValidityReport | (ValidityNotApplicable & { by_bandwidth?: undefined });

/**
 * Distinct outcome values among the rows with |R − c| < h (the window of every
 * kernel), counted up to `limit` + 1: the guard only asks whether there are
 * more than G, and a continuous outcome answers after G + 1 values.
 */
export function windowDistinctOutcomes(
  score: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  bandwidth: number,
  rows?: Int32Array,
  limit = Infinity,
): number {
  const seen = new Set<number>();
  const total = rows ? rows.length : score.length;
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    if (Math.abs(score[i] - cutoff) < bandwidth) {
      seen.add(outcome[i]);
      if (seen.size > limit) break;
    }
  }
  return seen.size;
}

interface AtOne {
  observed: ValidityOutcome;
  adjusted?: ValidityResult;
  guard: GuardState;
}

function headline(a: AtOne): { pvalue: number; decided_by: ValidityReport['decided_by'] } {
  const o = a.observed as ValidityResult;
  if (!a.adjusted) return { pvalue: o.pvalue, decided_by: 'observed' };
  const p = a.adjusted.pvalue;
  return { pvalue: Math.max(o.pvalue, p), decided_by: p > o.pvalue ? 'trend_adjusted' : p < o.pvalue ? 'observed' : 'both' };
}

/** The validity report: both versions at the bandwidth given and at each multiple of it. */
export function validityReport(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  options: ValidityReportOptions,
): ValidityReportOutcome {
  const r = resolveValidityOptions(options);
  const multiples = options.multiples ?? [];
  for (const k of multiples)
    if (!(k > 0) || !Number.isFinite(k)) throw new CutlineError(`bandwidth multiples must be positive numbers, got ${k}`);
  const guardOn = options.trendGuard ?? true;
  if (typeof guardOn !== 'boolean') throw new CutlineError(`trendGuard must be true or false, got ${String(guardOn)}`);
  // The single-version test takes every option but these two.
  const testOptions: ValidityOptions = { ...options };
  delete (testOptions as ValidityReportOptions).multiples;
  delete (testOptions as ValidityReportOptions).trendGuard;

  // The columns are checked once, before the fit reads them; every run below uses them as checked
  // (the trend guard's Ỹ is computed from them: finite, on the same rows).
  const n = checkTestInput(score, treated, outcome, cutoff, options.rows);
  const test = (y: ArrayLike<number>, bandwidth: number): ValidityOutcome => {
    const o = { ...testOptions, bandwidth };
    return validityTestChecked(score, treated, y, cutoff, o, resolveValidityOptions(o), n);
  };
  const observed = test(outcome, options.bandwidth);
  if (!observed.applicable) return observed;
  const trend = guardOn ? trendRemoved(score, outcome, cutoff, options.rows) : undefined;

  const run = (bandwidth: number, obs?: ValidityOutcome): AtOne => {
    const o = obs ?? test(outcome, bandwidth);
    if (!trend) return { observed: o, guard: 'off' };
    if (!o.applicable || windowDistinctOutcomes(score, outcome, cutoff, bandwidth, options.rows, r.grid) <= r.grid)
      return { observed: o, guard: 'few outcome values' };
    const adjusted = test(trend.values, bandwidth) as ValidityResult;
    return { observed: o, adjusted, guard: 'applied' };
  };

  const main = run(options.bandwidth, observed);
  const entry = (multiple: number, bandwidth: number, a: AtOne): ValidityAtBandwidth => {
    if (!a.observed.applicable) return { multiple, bandwidth, applicable: false, reason: a.observed.reason };
    const h = headline(a);
    return {
      multiple,
      bandwidth,
      applicable: true,
      pvalue: h.pvalue,
      pvalue_observed: a.observed.pvalue,
      ...(a.adjusted ? { pvalue_trend_adjusted: a.adjusted.pvalue } : {}),
      statistic: a.observed.statistic,
      critical_value: a.observed.critical_value,
      rejects: h.pvalue <= 0.05,
    };
  };
  const byBandwidth = [entry(1, options.bandwidth, main)];
  for (const multiple of multiples) {
    if (multiple === 1) continue;
    const bandwidth = options.bandwidth * multiple;
    try {
      byBandwidth.push(entry(multiple, bandwidth, run(bandwidth)));
    } catch (e) {
      if (!(e instanceof CutlineError)) throw e;
      byBandwidth.push({ multiple, bandwidth, error: e.message });
    }
  }
  byBandwidth.sort((a, b) => a.multiple - b.multiple);

  const h = headline(main);
  const warnings = [...observed.warnings];
  addNew(warnings, main.adjusted?.warnings ?? []);
  if (trend)
    for (const [side, f] of [['below', trend.below], ['above', trend.above]] as const)
      if (f.degree < 2 && main.guard === 'applied')
        warnings.push(
          `the trend guard fitted a ${f.degree === 1 ? 'line' : 'constant'} ${side} the cutoff, not a quadratic: the side has only ${f.degree + 1} distinct score value${f.degree ? 's' : ''}`,
        );
  addNew(warnings, verdictWarnings(byBandwidth));
  return {
    applicable: true,
    pvalue: h.pvalue,
    rejects: h.pvalue <= 0.05,
    decided_by: h.decided_by,
    guard: main.guard,
    observed,
    ...(main.adjusted ? { trend_adjusted: main.adjusted } : {}),
    ...(trend ? { trend: { below: trend.below, above: trend.above } } : {}),
    by_bandwidth: byBandwidth,
    warnings,
  };
}

/** Plain-words warnings about the by-bandwidth verdicts (headline p-values). */
export function verdictWarnings(byBandwidth: ValidityAtBandwidth[]): string[] {
  const ok = byBandwidth.filter((b) => b.error === undefined && b.applicable !== false);
  const out: string[] = [];
  const rej = ok.filter((b) => b.rejects).map((b) => formatNumber(b.bandwidth));
  const acc = ok.filter((b) => !b.rejects).map((b) => formatNumber(b.bandwidth));
  if (rej.length > 0 && acc.length > 0)
    out.push(
      `the validity verdict at 5% changes with the bandwidth: rejected at ${rej.join(', ')}, not rejected at ${acc.join(', ')}; ` +
        `a verdict that turns with the bandwidth is a finding in itself`,
    );
  const sharp = byBandwidth.filter((b) => b.applicable === false);
  if (sharp.length > 0) out.push(`the validity test is not applicable at bandwidth ${sharp.map((b) => formatNumber(b.bandwidth)).join(', ')}: ${sharp[0].reason}`);
  const bad = byBandwidth.filter((b) => b.error !== undefined);
  if (bad.length > 0) out.push(`the validity test could not run at bandwidth ${bad.map((b) => formatNumber(b.bandwidth)).join(', ')}: ${bad[0].error}`);
  return out;
}
