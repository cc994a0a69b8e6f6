/**
 * A whole Cutline check, as one pure function: the take-up jump, each
 * outcome's jump and complier effect at a common bandwidth, and the checks of
 * the design that exist. Faces (command line, task pane, worksheet functions)
 * call this and only present what it returns.
 *
 * Choices (docs/methods.md §1 and §2.6):
 * - listwise per calculation: the take-up jump uses rows complete in score,
 *   treated (and cluster); each outcome uses rows complete in score, treated,
 *   that outcome (and cluster); `rows` reports the first outcome's rows;
 * - one bandwidth for all estimates: the rule applied to the complier effect of
 *   the first outcome (a typed bandwidth wins), so that effect = jump/take-up
 *   holds in every row of the summary;
 * - eligibility: above unless the take-up jump (above − below) is negative,
 *   then below, every jump reported as eligible side − other side, with a warning.
 */
import { BandwidthRule, chooseBandwidth } from '../bandwidth/bandwidth';
import { CutlineError } from '../errors';
import { Estimate } from '../fit/estimate';
import { estimatesAtCutoff } from '../fit/estimatesAtCutoff';
import { KernelName } from '../fit/kernels';
import { compact, completeRows } from '../data/listwise';
import { VarianceName } from '../fit/residuals';
import { applyWeights, boundaryWindow, sortedOrder } from '../fit/boundaryWindow';
import { clusterWarnings } from './designWarnings';
import { emptySideMessage, noRowMessage } from './emptySide';
import { balanceSection, BalanceRow, binnedSeries, BinnedSeries, densitySection, DensitySection } from './designChecks';
import { bandwidthMse } from '../bandwidth/bandwidthMse';
import { widenForTies } from '../bandwidth/bandwidthTies';
import { complierCdf, complierDensity, complierMeans } from '../compliers/complierDistributions';
import { complierGrid } from '../compliers/complierGrid';
import { holmAdjust } from '../numeric/holm';
import { MultiplierName } from '../validity/validityBootstrap';
import { validityReport, ValidityReportOutcome } from '../validity/validityReport';

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
  /** A discrete covariate: the validity test is run within its cells. */
  within?: CodeColumn;
}

export interface CheckOptions {
  cutoff: number;
  bandwidth?: number;
  rule?: BandwidthRule;
  kernel?: KernelName;
  variance?: VarianceName;
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
  /** Units with |score − cutoff| < donut are left out of every estimate and test. */
  donut?: number;
  /** Binned means for plots (take-up, each outcome, each covariate). */
  bins?: boolean;
}

export const DEFAULT_SENSITIVITY = [0.5, 0.75, 1, 1.5, 2];

/**
 * The validity report of validityReport.ts as the check gives it: `pvalue_holm`
 * adjusts the headline p-values across the outcomes whose test applies;
 * `within` names the covariate whose cells the test ran within.
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
  /** The bandwidth of the validity test: mse of take-up × n^(−1/20), or the typed one. */
  test_bandwidth: { value: number; rule: 'undersmoothed mse' | 'typed' };
  outcomes: OutcomeResult[];
  density?: DensitySection;
  balance?: BalanceRow[];
  bins?: BinnedSeries[];
  donut?: { radius: number; excluded: number };
  warnings: string[];
}


export interface Prepared {
  rows: Int32Array;
  dropped: number;
  score: Float64Array;
  treated: Float64Array;
  outcome?: Float64Array;
  clusters?: Int32Array;
}

/** Listwise rows for score, treated, an optional outcome, the cluster (and the within cells if asked). */
export function prepare(input: CheckInput, outcome?: DataColumn, withCells = false, donut?: Uint8Array): Prepared & { cells?: Int32Array } {
  const n = input.score.values.length;
  const masks = [input.score.missing, input.treated.missing, outcome?.missing, input.cluster?.missing, donut];
  if (withCells) masks.push(input.within?.missing);
  const { rows, dropped } = completeRows(n, masks);
  if (rows.length === 0) throw new CutlineError(noRowMessage(input, outcome, withCells, donut));
  return {
    rows,
    dropped,
    score: keep(input.score.values, rows, dropped),
    treated: keep(input.treated.values, rows, dropped),
    outcome: outcome ? keep(outcome.values, rows, dropped) : undefined,
    clusters: input.cluster ? keep(input.cluster.codes, rows, dropped) : undefined,
    cells: withCells && input.within ? keep(input.within.codes, rows, dropped) : undefined,
  };
}

/** The column itself when no row is dropped (the engine never writes to it), else a compact copy. */
function keep<T extends Float64Array | Int32Array>(values: T, rows: Int32Array, dropped: number): T {
  return dropped === 0 ? values : compact(values, rows);
}

const fmt = (v: number): string => Number(v.toPrecision(4)).toString();

/**
 * The validity test's bandwidth (docs/methods.md §4.9): the mse bandwidth of the take-up
 * jump times n^(−1/20). When take-up has no sampling variation near the cutoff
 * (a sharp design: treated is constant on each side) that rule is undefined;
 * Cutline then uses the estimates' bandwidth times n^(−1/20) and says so. A
 * value that leaves fewer than 2 distinct scores on a side is widened (bandwidthTies.ts).
 */
export function testBandwidth(score: Float64Array, treated: Float64Array, cutoff: number, kernel: KernelName, h: number, warnings: string[]): number {
  const shrink = Math.pow(score.length, -1 / 20);
  let value: number;
  try {
    value = bandwidthMse(score, treated, cutoff, kernel).bandwidth * shrink;
  } catch (e) {
    if (!(e instanceof CutlineError)) throw e;
    value = h * shrink;
    warnings.push(
      `the validity test's usual bandwidth (from the take-up jump) cannot be computed (${e.message}); it uses the estimates' bandwidth, shrunk slightly for the number of rows, ${fmt(value)}`,
    );
  }
  const w = widenForTies(score, cutoff, value, 2);
  if (w.widened) {
    warnings.push(`the validity test's bandwidth ${fmt(value)} holds a single score value on a side (mass points); it was widened to ${fmt(w.bandwidth)}`);
  }
  return w.bandwidth;
}

function complierSummary(
  p: Prepared,
  cutoff: number,
  o: { bandwidth: number; kernel: KernelName; sign: 1 | -1 },
  densities: boolean,
): ComplierSummary {
  const y = p.outcome!;
  const m = complierMeans(p.score, p.treated, y, cutoff, o);
  const at = complierGrid(p.score, y, cutoff, o.bandwidth, o.kernel);
  const c1 = complierCdf(p.score, p.treated, y, cutoff, at, 1, o);
  const c0 = complierCdf(p.score, p.treated, y, cutoff, at, 0, o);
  const out: ComplierSummary = {
    mean_treated: m.mean_treated,
    mean_untreated: m.mean_untreated,
    at,
    cdf_treated: c1.cdf,
    cdf_untreated: c0.cdf,
    decreasing_treated: c1.decreasing,
    decreasing_untreated: c0.decreasing,
  };
  if (densities) {
    const d1 = complierDensity(p.score, p.treated, y, cutoff, at, 1, o);
    const d0 = complierDensity(p.score, p.treated, y, cutoff, at, 0, o);
    out.density_treated = d1.density;
    out.density_untreated = d0.density;
    out.negative_treated = d1.negative;
    out.negative_untreated = d0.negative;
    out.density_bandwidth = d1.densityBandwidth;
  }
  return out;
}

function requireVaries(v: Float64Array, what: string, why: string): void {
  for (let i = 1; i < v.length; i++) if (v[i] !== v[0]) return;
  throw new CutlineError(`${what} is constant (every used row is ${v[0]}): ${why}`);
}

/** Read off the sorted order that every window uses anyway: its ends and where the cutoff falls. */
function checkSides(score: Float64Array, cutoff: number, explain?: (below: boolean) => string | undefined): void {
  const order = sortedOrder(score);
  const lo = score[order[0]];
  const hi = score[order[order.length - 1]];
  if (lo === hi) throw new CutlineError(`--score: the score is constant (every used row is ${lo}); there is no discontinuity to study`);
  // Missing values in other columns can empty a side the score itself fills: then they are at fault, not the cutoff.
  if (!(lo < cutoff)) throw new CutlineError(explain?.(true) ?? `--cutoff: no unit has a score below the cutoff ${cutoff}`);
  if (!(hi >= cutoff)) throw new CutlineError(explain?.(false) ?? `--cutoff: no unit has a score at or above the cutoff ${cutoff}`);
}

export function runCheck(input: CheckInput, options: CheckOptions): CheckResult {
  const kernel = options.kernel ?? 'triangular';
  const variance = options.variance ?? 'nn';
  const { cutoff } = options;
  if (!Number.isFinite(cutoff)) throw new CutlineError('--cutoff must be a number');
  if (input.outcomes.length === 0) throw new CutlineError('--outcome: at least one outcome column is needed');
  if (variance === 'cluster' && !input.cluster) throw new CutlineError('--variance cluster needs --cluster COL');
  const n = input.score.values.length;
  const donut = donutMask(input.score, cutoff, options.donut);
  // Each outcome's listwise rows, selected once for the checks, estimates and bins below.
  const prepared = input.outcomes.map((col) => prepare(input, col, false, donut?.mask));
  const first = prepared[0];
  checkSides(first.score, cutoff, (below) => emptySideMessage(input, input.outcomes[0], cutoff, below, donut?.mask));
  requireVaries(first.treated, `--treated: column ${JSON.stringify(input.treated.name)}`, 'take-up cannot jump');
  input.outcomes.forEach((col, j) => {
    requireVaries(prepared[j].outcome!, `--outcome: column ${JSON.stringify(col.name)}`, 'there is no jump to estimate or test');
  });
  const bwOptions = { rule: options.rule, kernel, typed: options.bandwidth, treated: first.treated };
  const bw = blameDonut(
    options.donut,
    () => chooseBandwidth(first.score, first.outcome!, cutoff, bwOptions),
    () => {
      const all = prepare(input, input.outcomes[0]);
      chooseBandwidth(all.score, all.outcome!, cutoff, { ...bwOptions, treated: all.treated });
    },
  );
  const h = bw.value;
  const warnings: string[] = [...bw.warnings];

  // Take-up on its own rows; its sign decides the eligible side.
  const tk = prepare(input, undefined, false, donut?.mask);
  checkSides(tk.score, cutoff, (below) => emptySideMessage(input, undefined, cutoff, below, donut?.mask));
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
  if (variance === 'cluster' && tk.clusters && input.cluster) {
    warnings.push(...clusterWarnings(tk.clusters, tkWin.below.index, tkWin.above.index, input.cluster.labels, input.cluster.name));
  }
  const opts = { bandwidth: h, kernel, variance, sign, level: options.level };
  const takeupEst = estimatesAtCutoff(tk.score, tk.treated, tk.treated, cutoff, { ...opts, clusters: tk.clusters, window: tkWin });
  for (const w of takeupEst.warnings) if (!warnings.includes(w)) warnings.push(w);

  // The validity test's bandwidth: undersmoothed mse of take-up (docs/methods.md §4.9), or the typed one.
  const testH = options.bandwidth ?? testBandwidth(tk.score, tk.treated, cutoff, kernel, h, warnings);
  const multiples = (options.sensitivity ?? DEFAULT_SENSITIVITY).filter((m) => m !== 1);
  if (options.sensitivity) checkMultiples(multiples, testH, tk.score);
  if (variance === 'cluster') {
    warnings.push(
      'the outcome–treatment test treats units as independent (it ignores the clusters); the cluster variance applies to the estimates only',
    );
  }
  const vopts = {
    kernel,
    sign,
    draws: options.draws,
    seed: options.seed,
    grid: options.grid,
    trim: options.trim,
    multiplier: options.multiplier,
    trendGuard: options.trendGuard,
  };

  const outcomes = input.outcomes.map((col, j) => {
    const p = prepared[j];
    const shared = sameRows(p.rows);
    const est = estimatesAtCutoff(p.score, p.treated, p.outcome!, cutoff, {
      ...opts,
      clusters: p.clusters,
      window: shared ? tkWin : undefined,
      takeup: shared ? takeupEst.smoothedTakeup : undefined,
    });
    const own = est.warnings.filter((w) => !warnings.includes(w));
    const vp = input.within ? prepare(input, col, true, donut?.mask) : p;
    if (vp.rows.length < p.rows.length) {
      own.push(
        `${p.rows.length - vp.rows.length} rows with a missing ${input.within!.name} were left out of the validity test within its cells`,
      );
    }
    const v = validityReport(vp.score, vp.treated, vp.outcome!, cutoff, {
      ...vopts,
      bandwidth: testH,
      multiples,
      cells: vp.cells,
      cellLabels: input.within?.labels,
    });
    for (const w of v.warnings) if (!own.includes(w) && !warnings.includes(w)) own.push(w);
    let compliers: OutcomeResult['compliers'];
    if (est.takeup.estimate > 0) {
      compliers = complierSummary(p, cutoff, { bandwidth: h, kernel, sign }, options.bins === true);
      for (const [arm, list] of [['treated', compliers.decreasing_treated], ['untreated', compliers.decreasing_untreated]] as const) {
        if (list.length === 0) continue;
        const where = list.map((st) => `${fmt(st.from)} to ${fmt(st.to)}`).join(', ');
        own.push(
          `the implied distribution of ${arm} compliers' outcomes falls (from ${where}): a probability cannot fall, ` +
            'so this is the picture of a violation of the design — or of noise; the validity test says which is likely',
        );
      }
    }
    const result: OutcomeResult = {
      name: col.name,
      rows: { used: p.rows.length, dropped: p.dropped },
      window: est.counts,
      takeup: est.takeup,
      jump: est.jump,
      effect: est.effect,
      validity: input.within ? { ...v, within: input.within.name } : v,
      compliers,
      warnings: own,
    };
    return result;
  });
  // Holm across the outcomes whose test applies (a sharp design has no p-value).
  const tested = outcomes.filter((o) => o.validity.applicable);
  const holm = holmAdjust(tested.map((o) => (o.validity.applicable ? o.validity.pvalue : NaN)));
  tested.forEach((o, j) => {
    o.validity.pvalue_holm = holm[j];
  });

  // The score's density, on every row with a score (outside the donut).
  const sc = completeRows(n, [input.score.missing, donut?.mask]);
  const density = densitySection(keep(input.score.values, sc.rows, sc.dropped), cutoff, {
    sign,
    bin: options.densityBin,
    bandwidth: options.densityBandwidth,
  });
  if (!density) warnings.push('neither density test could be computed on these data');
  const covs = (input.covariates ?? []).map((c) => {
    const cr = completeRows(n, [input.score.missing, c.missing, variance === 'cluster' ? input.cluster?.missing : undefined, donut?.mask]);
    return {
      name: c.name,
      score: keep(input.score.values, cr.rows, cr.dropped),
      values: keep(c.values, cr.rows, cr.dropped),
      clusters: variance === 'cluster' && input.cluster ? keep(input.cluster.codes, cr.rows, cr.dropped) : undefined,
      dropped: cr.dropped,
    };
  });
  const balance = covs.length > 0 ? balanceSection(covs, cutoff, { rule: options.rule, typed: options.bandwidth, kernel, variance, sign, seed: options.seed }) : undefined;
  let bins: BinnedSeries[] | undefined;
  if (options.bins) {
    bins = [binnedSeries(input.treated.name, tk.score, tk.treated, cutoff, h, kernel)];
    input.outcomes.forEach((col, j) => bins!.push(binnedSeries(col.name, prepared[j].score, prepared[j].outcome!, cutoff, h, kernel)));
    for (const c of covs) bins.push(binnedSeries(c.name, c.score, c.values, cutoff, h, kernel));
  }

  return {
    cutoff,
    eligible: sign > 0 ? 'above' : 'below',
    rows: {
      read: n,
      used: first.rows.length,
      // Missing values only; units inside a donut are counted in `donut.excluded`.
      dropped: donut ? completeRows(n, [input.score.missing, input.treated.missing, input.outcomes[0].missing, input.cluster?.missing]).dropped : first.dropped,
    },
    bandwidth: { value: h, rule: bw.rule, kernel, variance, window: takeupEst.counts },
    takeup: takeupEst.takeup,
    test_bandwidth: { value: testH, rule: options.bandwidth !== undefined ? 'typed' : 'undersmoothed mse' },
    outcomes,
    density,
    balance,
    bins,
    donut: donut && { radius: donut.radius, excluded: donut.excluded },
    warnings,
  };
}

/** A bandwidth rule that fails with the donut cut out but not without it: the donut is named as the cause. */
function blameDonut<T>(donut: number | undefined, f: () => T, withoutDonut: () => void): T {
  try {
    return f();
  } catch (e) {
    if (!(e instanceof CutlineError) || donut === undefined) throw e;
    try {
      withoutDonut();
    } catch {
      throw e;
    }
    throw new CutlineError(
      `the donut (radius ${donut}) leaves too few units or distinct scores near the cutoff for the bandwidth rule (it works without the donut); choose a smaller donut, or give a bandwidth`,
    );
  }
}

/** Widest window, in multiples of the larger of the score's range and the test bandwidth, that the sensitivity table may ask for. */
export const MAX_SPREAD = 10;

/**
 * A sensitivity multiple whose window spans more than MAX_SPREAD times the
 * scores' range adds nothing (every unit is in the window long before) and
 * says the multiple was a slip: refused, naming the largest sensible one.
 */
function checkMultiples(multiples: number[], testH: number, score: Float64Array): void {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < score.length; i++) {
    if (score[i] < lo) lo = score[i];
    if (score[i] > hi) hi = score[i];
  }
  const limit = MAX_SPREAD * Math.max(hi - lo, testH);
  const bad = multiples.find((m) => m * testH > limit);
  if (bad !== undefined) {
    throw new CutlineError(
      `the sensitivity multiple ${bad} makes the validity test's bandwidth ${fmt(bad * testH)}, more than ${MAX_SPREAD} times the range of the scores (${fmt(lo)} to ${fmt(hi)}); ` +
        `choose multiples up to ${fmt(limit / testH)}`,
    );
  }
}

/** Rows inside the donut |score − cutoff| < r (missing scores are left to the listwise rule). */
export function donutMask(score: DataColumn, cutoff: number, r?: number): { mask: Uint8Array; radius: number; excluded: number } | undefined {
  if (r === undefined) return undefined;
  if (!(r > 0) || !Number.isFinite(r)) throw new CutlineError(`--donut must be a positive number, got ${r}`);
  const mask = new Uint8Array(score.values.length);
  let excluded = 0;
  let below = 0;
  let above = 0;
  for (let i = 0; i < mask.length; i++) {
    if (score.missing?.[i]) continue;
    const x = score.values[i] - cutoff;
    if (Math.abs(x) < r) {
      mask[i] = 1;
      excluded++;
    } else if (x < 0) below++;
    else above++;
  }
  if (below === 0 || above === 0) {
    throw new CutlineError(`--donut ${r} leaves no unit ${below === 0 ? 'below' : 'above'} the cutoff`);
  }
  return { mask, radius: r, excluded };
}
