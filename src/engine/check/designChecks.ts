/**
 * The checks of the design beside the outcome–treatment test (docs/methods.md
 * §6–§8), assembled for a whole check: the score's density (both tests, the
 * local polynomial one the headline when it can be computed and its window is
 * not mostly mass points; McCrary's binned test only when the local polynomial
 * one cannot be computed and McCrary's own window is not mostly mass points;
 * otherwise no headline and a plain statement that no reliable density test is
 * available, with the reason), each
 * covariate's continuity (local linear jump, Canay–Kamat permutation test,
 * Holm across covariates) and the binned means for the plots.
 *
 * Choices (docs/methods.md §6–§7): a covariate's jump is estimated at its own
 * bandwidth (the same rule as the estimates, applied to the covariate's sharp
 * jump; a typed bandwidth wins); `pvalue_holm` adjusts the jumps' robust
 * p-values and `permutation_pvalue_holm` the permutation p-values; a test that
 * cannot be computed on these data is left out with a warning saying why.
 */
import { BandwidthRule, chooseBandwidth } from '../bandwidth';
import { binnedMeans, BinnedMeansResult, fitLine, FitLineSide } from '../plots';
import { boundaryWindow, jumpAt, KernelName, VarianceName } from '../fit';
import { permutationBalanceTest } from '../covariates';
import { localPolynomialDensityTest, LocalPolynomialDensityResult, mccraryTest, McCraryResult } from '../density';
import { CutlineError } from '../errors';
import { holmAdjust } from '../numeric';
import { distinctScoreWarning, windowDistinctScores } from '../data';
import { addNew } from '../addNew';

export const DENSITY_CAUTION =
  'A jump in the density of the score is evidence of sorting around the cutoff, not proof of an invalid design (sorting unrelated to outcomes leaves the estimand intact); a smooth density is no proof of validity.';

export interface DensitySection {
  /** The headline test; 'none' when no reliable density test is available (see `unreliable`). */
  method: 'local_polynomial' | 'mccrary' | 'none';
  /** The headline's numbers (absent when `method` is 'none'). */
  log_ratio?: number;
  se?: number;
  pvalue?: number;
  /** Why no density test is reliable here (mass points), when `method` is 'none'. */
  unreliable?: string;
  mccrary?: Pick<McCraryResult, 'log_ratio' | 'se' | 'pvalue' | 'bin' | 'bandwidth' | 'density_above' | 'density_below'>;
  local_polynomial?: Pick<
    LocalPolynomialDensityResult,
    'log_ratio' | 'se' | 'pvalue' | 'bandwidth' | 'density_above' | 'density_below' | 'ci_above' | 'ci_below'
  >;
  caution: string;
  warnings: string[];
}

function attempt<T>(what: string, warnings: string[], f: () => T): T | undefined {
  try {
    return f();
  } catch (e) {
    if (!(e instanceof CutlineError)) throw e;
    warnings.push(`${what} could not be computed: ${e.message}`);
    return undefined;
  }
}

export function densitySection(
  score: ArrayLike<number>,
  cutoff: number,
  opts: { sign: 1 | -1; bin?: number; bandwidth?: number },
): DensitySection | undefined {
  const warnings: string[] = [];
  const given = opts.bin !== undefined || opts.bandwidth !== undefined;
  let m: ReturnType<typeof mccraryTest> | undefined;
  try {
    m = mccraryTest(score, cutoff, { bin: opts.bin, bandwidth: opts.bandwidth, sign: opts.sign });
  } catch (e) {
    if (!(e instanceof CutlineError)) throw e;
    // With the caller's own bin or bandwidth a failure is bad input, not a data finding.
    if (given) throw new CutlineError(`McCrary's density test could not be computed: ${e.message}`, { code: e.code, argument: 'density' });
    warnings.push(`McCrary's density test could not be computed: ${e.message}`);
  }
  const lp = attempt('The local polynomial density test', warnings, () => localPolynomialDensityTest(score, cutoff, { sign: opts.sign }));
  // Both tests give the same mass-point caveat: say it once.
  const few = (w: string): boolean => w.startsWith('the score takes few distinct values');
  addNew(warnings, [...(m?.warnings ?? []), ...(lp?.warnings ?? [])], (had, w) => had === w || (few(had) && few(w)));
  if (!lp && !m) return undefined;
  // Each test judged on its own window (data/repeatedScores.ts): a heaped or discrete score there makes it unreliable.
  const massy = (h: number): string | null => distinctScoreWarning(windowDistinctScores(score, cutoff, h), 'the density tests');
  const lpMass = lp ? massy(lp.bandwidth) : null;
  const mMass = m ? massy(m.bandwidth) : null;
  const head = lp && !lpMass ? lp : !lp && m && !mMass ? m : undefined;
  const method: DensitySection['method'] = head === undefined ? 'none' : head === lp ? 'local_polynomial' : 'mccrary';
  const unreliable =
    head === undefined
      ? `no reliable density test is available: ${lpMass ?? mMass}` +
        (lp ? '' : '; the local polynomial test could not be computed, and McCrary\'s binned test is not used in its place with mass points')
      : undefined;
  return {
    method,
    ...(head ? { log_ratio: head.log_ratio, se: head.se, pvalue: head.pvalue } : { unreliable }),
    mccrary: m && {
      log_ratio: m.log_ratio,
      se: m.se,
      pvalue: m.pvalue,
      bin: m.bin,
      bandwidth: m.bandwidth,
      density_above: m.density_above,
      density_below: m.density_below,
    },
    local_polynomial: lp && {
      log_ratio: lp.log_ratio,
      se: lp.se,
      pvalue: lp.pvalue,
      bandwidth: lp.bandwidth,
      density_above: lp.density_above,
      density_below: lp.density_below,
      ci_above: lp.ci_above,
      ci_below: lp.ci_below,
    },
    caution: DENSITY_CAUTION,
    warnings,
  };
}

export interface BalanceRow {
  name: string;
  rows: { used: number; dropped: number };
  bandwidth?: number;
  jump?: number;
  se?: number;
  pvalue?: number;
  pvalue_holm?: number;
  permutation_pvalue?: number;
  permutation_pvalue_holm?: number;
  q?: number;
  warnings: string[];
}

export interface CovariateData {
  name: string;
  score: Float64Array;
  values: Float64Array;
  clusters?: Int32Array;
  dropped: number;
}

function isConstant(v: Float64Array): boolean {
  for (let i = 1; i < v.length; i++) if (v[i] !== v[0]) return false;
  return true;
}

export function balanceSection(
  covariates: CovariateData[],
  cutoff: number,
  opts: { rule?: BandwidthRule; typed?: number; kernel: KernelName; variance: VarianceName; sign: 1 | -1; seed?: number; permutations?: number },
): BalanceRow[] {
  const rows: BalanceRow[] = covariates.map((c) => {
    const row: BalanceRow = { name: c.name, rows: { used: c.score.length, dropped: c.dropped }, warnings: [] };
    if (c.values.length === 0) {
      row.warnings.push(`${c.name} is missing on every row that has a score: there is nothing to test`);
      return row;
    }
    if (isConstant(c.values)) {
      row.warnings.push(`${c.name} is constant on the rows used: there is nothing to test`);
      return row;
    }
    attempt(`The jump in ${c.name}`, row.warnings, () => {
      const h = chooseBandwidth(c.score, c.values, cutoff, { rule: opts.rule, kernel: opts.kernel, typed: opts.typed }).value;
      const e = jumpAt(boundaryWindow(c.score, cutoff, h, opts.kernel), c.values, { variance: opts.variance, clusters: c.clusters, sign: opts.sign });
      row.bandwidth = h;
      row.jump = e.estimate;
      row.se = e.se;
      row.pvalue = e.pvalue;
    });
    attempt(`The permutation test of ${c.name}`, row.warnings, () => {
      const p = permutationBalanceTest(c.score, c.values, cutoff, { seed: opts.seed, permutations: opts.permutations });
      row.permutation_pvalue = p.pvalue;
      row.q = p.q;
      row.warnings.push(...p.warnings);
    });
    return row;
  });
  adjust(rows, 'pvalue', 'pvalue_holm');
  adjust(rows, 'permutation_pvalue', 'permutation_pvalue_holm');
  return rows;
}

/** Holm over the rows that have the p-value. */
function adjust(rows: BalanceRow[], from: 'pvalue' | 'permutation_pvalue', to: 'pvalue_holm' | 'permutation_pvalue_holm'): void {
  const have = rows.filter((r) => r[from] !== undefined);
  const adj = holmAdjust(have.map((r) => r[from] as number));
  have.forEach((r, i) => (r[to] = adj[i]));
}

export interface BinnedSeries {
  name: string;
  bins: BinnedMeansResult['bins'];
  bins_below: number;
  bins_above: number;
  rule: BinnedMeansResult['rule'];
  fit: { below: FitLineSide; above: FitLineSide };
}

export function binnedSeries(
  name: string,
  score: ArrayLike<number>,
  values: ArrayLike<number>,
  cutoff: number,
  bandwidth: number,
  kernel: KernelName,
): BinnedSeries {
  const b = binnedMeans(score, values, cutoff);
  return { name, bins: b.bins, bins_below: b.binsBelow, bins_above: b.binsAbove, rule: b.rule, fit: fitLine(score, values, cutoff, bandwidth, kernel) };
}
