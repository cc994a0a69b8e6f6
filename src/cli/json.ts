/**
 * The `--json` document of DESIGN.md: the engine's result with the keys of
 * the contract (later checks add their keys when they exist).
 */
import { CheckResult } from '../engine';

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
      validity: {
        statistic: o.validity.statistic,
        pvalue: o.validity.pvalue,
        pvalue_holm: o.validity.pvalue_holm,
        rejects: o.validity.rejects,
        critical_value: o.validity.critical_value,
        intervals: o.validity.intervals,
        draws: o.validity.draws,
        seed: o.validity.seed,
        bandwidth: o.validity.bandwidth,
        window: o.validity.window,
        worst: o.validity.worst,
        by_bandwidth: o.validity.by_bandwidth.map((b) =>
          b.error !== undefined
            ? { multiple: b.multiple, bandwidth: b.bandwidth, error: b.error }
            : { multiple: b.multiple, bandwidth: b.bandwidth, statistic: b.statistic, pvalue: b.pvalue, critical_value: b.critical_value, rejects: b.rejects },
        ),
        ...(o.validity.within !== undefined ? { within: o.validity.within } : {}),
      },
      ...(o.compliers ? { compliers: o.compliers } : {}),
      warnings: o.warnings,
    })),
    ...(r.density
      ? {
          density: {
            method: r.density.method,
            log_ratio: r.density.log_ratio,
            se: r.density.se,
            pvalue: r.density.pvalue,
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
