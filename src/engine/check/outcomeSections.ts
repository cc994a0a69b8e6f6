/**
 * The parts of a check that belong to one outcome — its estimates, its
 * validity report (both versions, the by-bandwidth table), the implied complier
 * distributions — computed from a settled check (setting.ts), so that
 * `runCheck` and the entry points for one quantity share them.
 */
import { complierCdfArms, complierDensity, complierMeans, complierGrid } from '../compliers';
import { CutoffEstimates, estimatesAtCutoff, KernelName } from '../fit';
import { MultiplierName, validityReport } from '../validity';
import { addNew } from '../addNew';
import type { ComplierSummary, ValiditySummary } from './check';
import { CheckInput, DataColumn, Prepared, Setting } from './setting';
import { complierWarnings, sensitivityMultiples } from './steps';

/** Two sets of listwise rows are the same: both every row (nothing dropped), or equal position by position. */
function sameRows(a: Prepared, b: Prepared): boolean {
  if (a.rows.length !== b.rows.length) return false;
  if (a.dropped === 0 && b.dropped === 0) return true;
  for (let t = 0; t < a.rows.length; t++) if (a.rows[t] !== b.rows[t]) return false;
  return true;
}

/**
 * An outcome's take-up jump, jump and complier effect on its own rows at the
 * estimates' bandwidth. Windows depend on the rows alone: an outcome with the
 * take-up's rows shares its window (and its smoothed take-up, when given).
 */
export function outcomeEstimates(s: Setting, p: Prepared, takeup?: CutoffEstimates, level?: number): CutoffEstimates {
  const shared = sameRows(p, s.takeupRows);
  return estimatesAtCutoff(p.score, p.treated, p.outcome!, s.cutoff, {
    bandwidth: s.bandwidth.value,
    kernel: s.kernel,
    variance: s.variance,
    sign: s.sign,
    level,
    clusters: p.clusters,
    window: shared ? s.takeupWindow : undefined,
    takeup: shared ? takeup?.smoothedTakeup : undefined,
  });
}

export interface ValidityRunOptions {
  draws?: number;
  seed?: number;
  grid?: number;
  trim?: number;
  multiplier?: MultiplierName;
  /** The trend guard (docs/methods.md §4.8; default true). */
  trendGuard?: boolean;
  /** Multiples of the test bandwidth for the by-bandwidth table; [] for the test bandwidth alone. */
  sensitivity?: number[];
}

/**
 * The outcome–treatment test of one outcome at the test bandwidth, within the
 * cells of `input.within` when given, with its by-bandwidth table and
 * warnings (a check adds `pvalue_holm` across its outcomes).
 */
export function outcomeValidity(
  s: Setting,
  input: CheckInput,
  col: DataColumn,
  p: Prepared,
  testH: number,
  options: ValidityRunOptions,
): { summary: ValiditySummary; warnings: string[] } {
  const warnings: string[] = [];
  const vp = input.within ? s.rowsOf(col, [], true) : p;
  if (vp.rows.length < p.rows.length) {
    warnings.push(`${p.rows.length - vp.rows.length} rows with a missing ${input.within!.name} were left out of the validity test within its cells`);
  }
  const v = validityReport(vp.score, vp.treated, vp.outcome!, s.cutoff, {
    kernel: s.kernel,
    sign: s.sign,
    draws: options.draws,
    seed: options.seed,
    grid: options.grid,
    trim: options.trim,
    multiplier: options.multiplier,
    trendGuard: options.trendGuard,
    bandwidth: testH,
    multiples: sensitivityMultiples(options.sensitivity),
    cells: vp.cells,
    cellLabels: input.within?.labels,
  });
  addNew(warnings, v.warnings);
  const summary: ValiditySummary = input.within ? { ...v, within: input.within.name } : v;
  return { summary, warnings };
}

/** Complier means, implied CDFs on the grid (and densities when asked), with the warnings of falling CDFs. */
export function complierSummary(
  p: Prepared,
  cutoff: number,
  o: { bandwidth: number; kernel: KernelName; sign: 1 | -1 },
  densities: boolean,
): { summary: ComplierSummary; warnings: string[] } {
  const y = p.outcome!;
  const m = complierMeans(p.score, p.treated, y, cutoff, o);
  const at = complierGrid(p.score, y, cutoff, o.bandwidth, o.kernel);
  const [c1, c0] = complierCdfArms(p.score, p.treated, y, cutoff, at, [1, 0], o);
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
  return { summary: out, warnings: complierWarnings({ treated: c1.decreasing, untreated: c0.decreasing }) };
}
