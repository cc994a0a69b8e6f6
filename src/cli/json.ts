/**
 * The `--json` document of DESIGN.md: the engine's result with the keys of
 * the contract (later checks add their keys when they exist).
 */
import { CheckResult, EstimateSummary } from '../engine/check';

function estimate(e: EstimateSummary): Record<string, unknown> {
  return {
    estimate: e.estimate,
    se: e.se,
    ci: e.ci,
    ci_robust: e.ci_robust,
    pvalue: e.pvalue,
    estimate_robust: e.estimate_robust,
    se_robust: e.se_robust,
    pvalue_conventional: e.pvalue_conventional,
  };
}

export function toJson(r: CheckResult): Record<string, unknown> {
  return {
    cutoff: r.cutoff,
    eligible: r.eligible,
    rows: r.rows,
    bandwidth: { value: r.bandwidth.value, rule: r.bandwidth.rule, kernel: r.bandwidth.kernel, variance: r.bandwidth.variance, window: r.bandwidth.window },
    takeup: estimate(r.takeup),
    outcomes: r.outcomes.map((o) => ({
      name: o.name,
      rows: o.rows,
      window: o.window,
      jump: estimate(o.jump),
      effect: estimate(o.effect),
      warnings: o.warnings,
    })),
    warnings: r.warnings,
  };
}
