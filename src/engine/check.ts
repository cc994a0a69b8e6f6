/**
 * A whole Cutline check, as one pure function: the take-up jump, each
 * outcome's jump and complier effect at a common bandwidth, and the checks of
 * the design that exist. Faces (command line, task pane, worksheet functions)
 * call this and only present what it returns.
 *
 * Choices (README "Methods"):
 * - listwise per calculation: the take-up jump uses rows complete in score,
 *   treated (and cluster); each outcome uses rows complete in score, treated,
 *   that outcome (and cluster); `rows` reports the first outcome's rows;
 * - one bandwidth for all estimates: the rule applied to the complier effect of
 *   the first outcome (a typed bandwidth wins), so that effect = jump/take-up
 *   holds in every row of the summary;
 * - eligibility: above unless the take-up jump (above − below) is negative,
 *   then below, every jump reported as eligible side − other side, with a warning.
 */
import { BandwidthRule, chooseBandwidth } from './bandwidth';
import { CutlineError } from './errors';
import { Estimate } from './estimate';
import { estimatesAtCutoff } from './estimatesAtCutoff';
import { KernelName } from './kernels';
import { compact, completeRows } from './listwise';
import { VarianceName } from './residuals';
import { applyWeights, boundaryWindow } from './boundaryWindow';

export interface DataColumn {
  name: string;
  values: Float64Array;
  missing?: Uint8Array;
}

export interface CodeColumn {
  name: string;
  codes: Int32Array;
  labels: string[];
  missing?: Uint8Array;
}

export interface CheckInput {
  score: DataColumn;
  treated: DataColumn;
  outcomes: DataColumn[];
  covariates?: DataColumn[];
  cluster?: CodeColumn;
}

export interface CheckOptions {
  cutoff: number;
  bandwidth?: number;
  rule?: BandwidthRule;
  kernel?: KernelName;
  variance?: VarianceName;
  level?: number;
}

export interface EstimateSummary {
  estimate: number;
  se: number;
  ci: [number, number];
  ci_robust: [number, number];
  pvalue: number;
  estimate_robust: number;
  se_robust: number;
  pvalue_conventional: number;
}

export interface OutcomeResult {
  name: string;
  rows: { used: number; dropped: number };
  window: { below: number; above: number };
  takeup: EstimateSummary;
  jump: EstimateSummary;
  effect: EstimateSummary;
  warnings: string[];
}

export interface CheckResult {
  cutoff: number;
  eligible: 'above' | 'below';
  rows: { read: number; used: number; dropped: number };
  bandwidth: { value: number; rule: BandwidthRule | 'typed'; kernel: KernelName; variance: VarianceName; window: { below: number; above: number } };
  takeup: EstimateSummary;
  outcomes: OutcomeResult[];
  warnings: string[];
}

function summary(e: Estimate): EstimateSummary {
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

export interface Prepared {
  rows: Int32Array;
  dropped: number;
  score: Float64Array;
  treated: Float64Array;
  outcome?: Float64Array;
  clusters?: Int32Array;
}

/** Listwise rows for score, treated, an optional outcome and the cluster. */
export function prepare(input: CheckInput, outcome?: DataColumn): Prepared {
  const n = input.score.values.length;
  const { rows, dropped } = completeRows(n, [input.score.missing, input.treated.missing, outcome?.missing, input.cluster?.missing]);
  if (rows.length === 0) throw new CutlineError('no row has every column the check needs; nothing to estimate');
  return {
    rows,
    dropped,
    score: keep(input.score.values, rows, dropped),
    treated: keep(input.treated.values, rows, dropped),
    outcome: outcome ? keep(outcome.values, rows, dropped) : undefined,
    clusters: input.cluster ? keep(input.cluster.codes, rows, dropped) : undefined,
  };
}

/** The column itself when no row is dropped (the engine never writes to it), else a compact copy. */
function keep<T extends Float64Array | Int32Array>(values: T, rows: Int32Array, dropped: number): T {
  return dropped === 0 ? values : compact(values, rows);
}

function checkSides(score: Float64Array, cutoff: number): void {
  let same = true;
  for (let i = 1; i < score.length && same; i++) same = score[i] === score[0];
  if (same) throw new CutlineError(`--score: the score is constant (every used row is ${score[0]}); there is no discontinuity to study`);
  let below = 0;
  for (let i = 0; i < score.length; i++) if (score[i] < cutoff) below++;
  if (below === 0) throw new CutlineError(`--cutoff: no unit has a score below the cutoff ${cutoff}`);
  if (below === score.length) throw new CutlineError(`--cutoff: no unit has a score at or above the cutoff ${cutoff}`);
}

export function runCheck(input: CheckInput, options: CheckOptions): CheckResult {
  const kernel = options.kernel ?? 'triangular';
  const variance = options.variance ?? 'nn';
  const { cutoff } = options;
  if (!Number.isFinite(cutoff)) throw new CutlineError('--cutoff must be a number');
  if (input.outcomes.length === 0) throw new CutlineError('--outcome: at least one outcome column is needed');
  if (variance === 'cluster' && !input.cluster) throw new CutlineError('--variance cluster needs --cluster COL');
  const n = input.score.values.length;
  const first = prepare(input, input.outcomes[0]);
  checkSides(first.score, cutoff);
  const bw = chooseBandwidth(first.score, first.outcome!, cutoff, {
    rule: options.rule,
    kernel,
    typed: options.bandwidth,
    treated: first.treated,
  });
  const h = bw.value;
  const warnings: string[] = [];

  // Take-up on its own rows; its sign decides the eligible side.
  const tk = prepare(input);
  checkSides(tk.score, cutoff);
  const tkWin = boundaryWindow(tk.score, cutoff, h, kernel);
  // Windows depend on the rows alone: outcomes with the take-up's rows share its window.
  const sameRows = (a: Int32Array): boolean => a.length === tk.rows.length && a.every((v, i) => v === tk.rows[i]);
  const rawTakeup =
    applyWeights(tkWin.above.coef1[0], tkWin.above.index, tk.treated) - applyWeights(tkWin.below.coef1[0], tkWin.below.index, tk.treated);
  const sign: 1 | -1 = rawTakeup < 0 ? -1 : 1;
  if (sign < 0) {
    warnings.push(
      'take-up falls at the cutoff: eligibility is taken to be below the cutoff, and every jump is reported as below minus above',
    );
  }
  const opts = { bandwidth: h, kernel, variance, sign, level: options.level };
  const takeupEst = estimatesAtCutoff(tk.score, tk.treated, tk.treated, cutoff, { ...opts, clusters: tk.clusters, window: tkWin });
  for (const w of takeupEst.warnings) if (!warnings.includes(w)) warnings.push(w);

  const outcomes = input.outcomes.map((col, j) => {
    const p = j === 0 ? first : prepare(input, col);
    const shared = sameRows(p.rows);
    const est = estimatesAtCutoff(p.score, p.treated, p.outcome!, cutoff, {
      ...opts,
      clusters: p.clusters,
      window: shared ? tkWin : undefined,
      takeup: shared ? takeupEst.smoothedTakeup : undefined,
    });
    return {
      name: col.name,
      rows: { used: p.rows.length, dropped: p.dropped },
      window: est.counts,
      takeup: summary(est.takeup),
      jump: summary(est.jump),
      effect: summary(est.effect),
      warnings: est.warnings.filter((w) => !warnings.includes(w)),
    };
  });

  return {
    cutoff,
    eligible: sign > 0 ? 'above' : 'below',
    rows: { read: n, used: first.rows.length, dropped: first.dropped },
    bandwidth: { value: h, rule: bw.rule, kernel, variance, window: takeupEst.counts },
    takeup: summary(takeupEst.takeup),
    outcomes,
    warnings,
  };
}
