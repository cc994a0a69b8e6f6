/**
 * The `--json` document of DESIGN.md: the engine's result with the keys of
 * the contract (later checks add their keys when they exist).
 */
import { CheckResult, ValidityResult, ValiditySummary } from '../engine';

/** One version of the test: its statistic, p-value, critical value, intervals and worst interval. */
function versionJson(v: ValidityResult): Record<string, unknown> {
  return { statistic: v.statistic, pvalue: v.pvalue, critical_value: v.critical_value, intervals: v.intervals, worst: v.worst };
}

/**
 * The validity keys of DESIGN.md: `pvalue` is the headline; `statistic`,
 * `pvalue_observed`, `critical_value`, `intervals` and `worst` are the
 * published test on the observed outcomes; `trend_adjusted` is the trend
 * guard's version (absent when the guard does not apply); a sharp design gives
 * `{ applicable: false, reason }` and no numbers.
 */
function validityJson(v: ValiditySummary): Record<string, unknown> {
  const within = v.within !== undefined ? { within: v.within } : {};
  if (!v.applicable) return { applicable: false, reason: v.reason, ...within };
  const o = v.observed;
  return {
    applicable: true,
    pvalue: v.pvalue,
    pvalue_holm: v.pvalue_holm,
    rejects: v.rejects,
    decided_by: v.decided_by,
    trend_guard: v.guard,
    statistic: o.statistic,
    pvalue_observed: o.pvalue,
    critical_value: o.critical_value,
    intervals: o.intervals,
    draws: o.draws,
    seed: o.seed,
    bandwidth: o.bandwidth,
    window: o.counts,
    worst: o.worst,
    ...(v.trend_adjusted ? { trend_adjusted: versionJson(v.trend_adjusted) } : {}),
    ...(o.left_out.length > 0 ? { left_out: o.left_out } : {}),
    by_bandwidth: v.by_bandwidth.map((b) =>
      b.error !== undefined
        ? { multiple: b.multiple, bandwidth: b.bandwidth, error: b.error }
        : b.applicable === false
          ? { multiple: b.multiple, bandwidth: b.bandwidth, applicable: false, reason: b.reason }
          : {
              multiple: b.multiple,
              bandwidth: b.bandwidth,
              pvalue: b.pvalue,
              pvalue_observed: b.pvalue_observed,
              ...(b.pvalue_trend_adjusted !== undefined ? { pvalue_trend_adjusted: b.pvalue_trend_adjusted } : {}),
              statistic: b.statistic,
              critical_value: b.critical_value,
              rejects: b.rejects,
            },
    ),
    ...within,
  };
}

export function toJson(r: CheckResult): Record<string, unknown> {
  return {
    cutoff: r.cutoff,
    eligible: r.eligible,
    rows: r.rows,
    bandwidth: { value: r.bandwidth.value, rule: r.bandwidth.rule, kernel: r.bandwidth.kernel, variance: r.bandwidth.variance, window: r.bandwidth.window },
    takeup: r.takeup,
    takeup_rows: r.takeup_rows,
    test_bandwidth: r.test_bandwidth,
    outcomes: r.outcomes.map((o) => ({
      name: o.name,
      rows: o.rows,
      window: o.window,
      // The take-up jump on this outcome's own rows: effect = jump / takeup exactly.
      takeup: o.takeup,
      jump: o.jump,
      effect: o.effect,
      validity: validityJson(o.validity),
      ...(o.compliers ? { compliers: o.compliers } : {}),
      warnings: o.warnings,
    })),
    ...(r.density
      ? {
          density: {
            method: r.density.method,
            ...(r.density.method === 'none'
              ? { reliable: false, reason: r.density.unreliable }
              : { log_ratio: r.density.log_ratio, se: r.density.se, pvalue: r.density.pvalue }),
            ...(r.density.mccrary ? { mccrary: r.density.mccrary } : {}),
            ...(r.density.local_polynomial ? { local_polynomial: r.density.local_polynomial } : {}),
            caution: r.density.caution,
            warnings: r.density.warnings,
          },
        }
      : {}),
    ...(r.balance ? { balance: r.balance } : {}),
    ...(r.bins ? { bins: r.bins } : {}),
    ...(r.donut ? { donut: r.donut } : {}),
    warnings: r.warnings,
  };
}
