/**
 * A point estimate with its conventional and robust bias-corrected
 * inference, as every face reports it.
 */
import { normalQuantile, twoSidedPvalue } from '../numeric';

export interface Estimate {
  estimate: number;
  se: number;
  /** Conventional interval estimate ± z·se. */
  ci: [number, number];
  /** Bias-corrected estimate (CCT 2014), the centre of ci_robust. */
  estimate_robust: number;
  se_robust: number;
  /** Robust bias-corrected interval. */
  ci_robust: [number, number];
  /** Two-sided p-value of "no jump" from the robust bias-corrected statistic. */
  pvalue: number;
  /** Two-sided p-value from the conventional statistic. */
  pvalue_conventional: number;
}

export function makeEstimate(estimate: number, se: number, estimateRobust: number, seRobust: number, level = 0.95): Estimate {
  const z = normalQuantile(0.5 + level / 2);
  return {
    estimate,
    se,
    ci: [estimate - z * se, estimate + z * se],
    estimate_robust: estimateRobust,
    se_robust: seRobust,
    ci_robust: [estimateRobust - z * seRobust, estimateRobust + z * seRobust],
    pvalue: seRobust > 0 ? twoSidedPvalue(estimateRobust / seRobust) : estimateRobust === 0 ? 1 : 0,
    pvalue_conventional: se > 0 ? twoSidedPvalue(estimate / se) : estimate === 0 ? 1 : 0,
  };
}
