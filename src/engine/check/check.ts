/**
 * A whole Cutline check, as one pure function: the take-up jump, each
 * outcome's jump and complier effect at a common bandwidth, and the checks of
 * the design that exist. Faces call this and only present what it returns.
 * It is a short composition of the steps the entry points also use
 * (setting.ts, steps.ts, outcomeSections.ts), so that a worksheet function and
 * `cutline check` give the same number to the last digit.
 *
 * Choices (docs/methods.md §1 and §2.6):
 * - listwise per calculation: the take-up jump uses rows complete in score,
 *   treated (and cluster); each outcome uses rows complete in score, treated,
 *   that outcome (and cluster), and reports its own take-up jump on those rows;
 *   `rows` reports the first outcome's rows;
 * - one bandwidth for all estimates: the rule applied to the complier effect of
 *   the first outcome (a typed bandwidth wins);
 * - eligibility: above unless the take-up jump (above − below) is negative,
 *   then below, every jump reported as eligible side − other side, with a warning.
 */
import { BandwidthRule } from '../bandwidth';
import { addNew } from '../addNew';
import { CutlineError } from '../errors';
import { completeRows } from '../data';
import { Estimate, estimatesAtCutoff, KernelName, VarianceName } from '../fit';
import { holmAdjust } from '../numeric';
import { MultiplierName, ValidityReportOutcome } from '../validity';
import { balanceSection, BalanceRow, binnedSeries, BinnedSeries, densitySection, DensitySection } from './designChecks';
import { complierSummary, outcomeEstimates, outcomeValidity } from './outcomeSections';
import { CheckInput, keep, settle, SettingOptions } from './setting';
import { checkMultiples, sensitivityMultiples, testBandwidth } from './steps';

export type { CheckInput, CodeColumn, DataColumn } from './setting';

export interface CheckOptions extends SettingOptions {
  level?: number;
  draws?: number;
  seed?: number;
  grid?: number;
  trim?: number;
  multiplier?: MultiplierName;
  /** The validity test's trend guard (default true); false reports the published test alone. */
  trendGuard?: boolean;
  /** Multiples of the test bandwidth for the sensitivity table; [] for the test bandwidth alone. */
  sensitivity?: number[];
  /** McCrary's bin width and bandwidth (rules of thumb when absent). */
  densityBin?: number;
  densityBandwidth?: number;
  /** Binned means for plots (take-up, each outcome, each covariate). */
  bins?: boolean;
}

/**
 * The validity report (validity/validityReport.ts) as the check gives it:
 * `pvalue_holm` adjusts the headline p-values across the outcomes whose test
 * applies; `within` names the covariate whose cells the test ran within.
 */
export type ValiditySummary = ValidityReportOutcome & { pvalue_holm?: number; within?: string };

export interface ComplierSummary {
  mean_treated: number;
  mean_untreated: number;
  /** Outcome values where the implied distributions are shown (complierGrid.ts). */
  at: number[];
  cdf_treated: number[];
  cdf_untreated: number[];
  /** Stretches where an implied CDF falls: the picture of a violation. */
  decreasing_treated: Array<{ from: number; to: number }>;
  decreasing_untreated: Array<{ from: number; to: number }>;
  /** Kernel densities (only when the plot data are asked for). */
  density_treated?: number[];
  density_untreated?: number[];
  negative_treated?: Array<{ from: number; to: number }>;
  negative_untreated?: Array<{ from: number; to: number }>;
  density_bandwidth?: number;
}

/** Every estimate of a check carries the fields of estimate.ts. */
export type EstimateSummary = Estimate;

export interface OutcomeResult {
  name: string;
  rows: { used: number; dropped: number };
  window: { below: number; above: number };
  /** The take-up jump on this outcome's own rows: effect = jump / takeup exactly. */
  takeup: EstimateSummary;
  jump: EstimateSummary;
  effect: EstimateSummary;
  validity: ValiditySummary;
  compliers?: ComplierSummary;
  warnings: string[];
}

export interface CheckResult {
  cutoff: number;
  eligible: 'above' | 'below';
  rows: { read: number; used: number; dropped: number };
  bandwidth: { value: number; rule: BandwidthRule | 'typed'; kernel: KernelName; variance: VarianceName; window: { below: number; above: number } };
  takeup: EstimateSummary;
  /** The take-up jump's rows: complete in score and treated (and the cluster), outside the donut. */
  takeup_rows: { used: number; dropped: number };
  /** The bandwidth of the validity test: mse of take-up × n^(−1/20), or the typed one. */
  test_bandwidth: { value: number; rule: 'undersmoothed mse' | 'typed' };
  outcomes: OutcomeResult[];
  density?: DensitySection;
  balance?: BalanceRow[];
  bins?: BinnedSeries[];
  donut?: { radius: number; excluded: number };
  warnings: string[];
}


export function runCheck(input: CheckInput, options: CheckOptions): CheckResult {
  if (input.outcomes.length === 0) throw new CutlineError('at least one outcome column is needed', { code: 'too-few', argument: 'outcome' });
  const s = settle(input, options);
  const { cutoff, kernel, variance, sign, n, donut } = s;
  const h = s.bandwidth.value;
  const warnings = s.warnings;
  const tk = s.takeupRows;
  const opts = { bandwidth: h, kernel, variance, sign, level: options.level };
  const takeupEst = estimatesAtCutoff(tk.score, tk.treated, tk.treated, cutoff, { ...opts, clusters: tk.clusters, window: s.takeupWindow });
  addNew(warnings, takeupEst.warnings);

  const testH = testBandwidth(tk.score, tk.treated, cutoff, kernel, h, options.bandwidth);
  warnings.push(...testH.warnings);
  if (options.sensitivity) checkMultiples(sensitivityMultiples(options.sensitivity), testH.value, tk.score);
  if (variance === 'cluster') {
    warnings.push('the outcome–treatment test treats units as independent (it ignores the clusters); the cluster variance applies to the estimates only');
  }

  const outcomes = input.outcomes.map((col, j): OutcomeResult => {
    const p = s.prepared[j];
    const est = outcomeEstimates(s, p, takeupEst);
    const own = est.warnings.filter((w) => !warnings.includes(w));
    const v = outcomeValidity(s, input, col, p, testH.value, options);
    addNew(own, v.warnings.filter((w) => !warnings.includes(w)));
    let compliers: OutcomeResult['compliers'];
    if (est.takeup.estimate > 0) {
      const c = complierSummary(p, cutoff, { bandwidth: h, kernel, sign }, options.bins === true);
      compliers = c.summary;
      own.push(...c.warnings);
    }
    return {
      name: col.name,
      rows: { used: p.rows.length, dropped: p.dropped },
      window: est.counts,
      takeup: est.takeup,
      jump: est.jump,
      effect: est.effect,
      validity: v.summary,
      compliers,
      warnings: own,
    };
  });
  // Holm across the outcomes whose test applies (a sharp design has no p-value).
  const tested = outcomes.filter((o) => o.validity.applicable);
  const holm = holmAdjust(tested.map((o) => (o.validity.applicable ? o.validity.pvalue : NaN)));
  tested.forEach((o, j) => {
    o.validity.pvalue_holm = holm[j];
  });

  // The score's density, on every row with a score (outside the donut).
  const sc = completeRows(n, [input.score.missing, donut?.mask]);
  const density = densitySection(s.handle(keep(input.score.values, sc.rows, sc.dropped)), cutoff, {
    sign,
    bin: options.densityBin,
    bandwidth: options.densityBandwidth,
  });
  if (!density) warnings.push('neither density test could be computed on these data');
  const covs = (input.covariates ?? []).map((c) => {
    const cr = completeRows(n, [input.score.missing, c.missing, variance === 'cluster' ? input.cluster?.missing : undefined, donut?.mask]);
    return {
      name: c.name,
      score: s.handle(keep(input.score.values, cr.rows, cr.dropped)),
      values: keep(c.values, cr.rows, cr.dropped),
      clusters: variance === 'cluster' && input.cluster ? keep(input.cluster.codes, cr.rows, cr.dropped) : undefined,
      dropped: cr.dropped,
    };
  });
  const balance = covs.length > 0 ? balanceSection(covs, cutoff, { rule: options.rule, typed: options.bandwidth, kernel, variance, sign, seed: options.seed }) : undefined;
  let bins: BinnedSeries[] | undefined;
  if (options.bins) {
    bins = [binnedSeries(input.treated.name, tk.score, tk.treated, cutoff, h, kernel)];
    input.outcomes.forEach((col, j) => bins!.push(binnedSeries(col.name, s.prepared[j].score, s.prepared[j].outcome!, cutoff, h, kernel)));
    for (const c of covs) bins.push(binnedSeries(c.name, c.score, c.values, cutoff, h, kernel));
  }

  const first = s.prepared[0];
  return {
    cutoff,
    eligible: s.eligible,
    rows: {
      read: n,
      used: first.rows.length,
      // Missing values only; units inside a donut are counted in `donut.excluded`.
      dropped: donut ? completeRows(n, [input.score.missing, input.treated.missing, input.outcomes[0].missing, input.cluster?.missing]).dropped : first.dropped,
    },
    bandwidth: { value: h, rule: s.bandwidth.rule, kernel, variance, window: takeupEst.counts },
    takeup: takeupEst.takeup,
    takeup_rows: { used: tk.rows.length, dropped: tk.dropped },
    test_bandwidth: { value: testH.value, rule: testH.rule },
    outcomes,
    density,
    balance,
    bins,
    donut: donut && { radius: donut.radius, excluded: donut.excluded },
    warnings,
  };
}
