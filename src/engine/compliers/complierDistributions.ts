/**
 * Implied complier distributions at the cutoff (docs/methods.md §5; Imbens & Rubin
 * 1997, Review of Economic Studies 64(4), for the complier-distribution
 * identity; Arai, Hsu, Kitagawa, Mourifié & Wan 2022 for its use as a check).
 *
 * With the window's local linear intercept weights ω (boundaryWindow.ts) and
 * the take-up jump π = p̂₊(D=1) − p̂₋(D=1):
 *
 *   F₁(y) = [P̂₊(Y ≤ y, D=1) − P̂₋(Y ≤ y, D=1)] / π
 *   F₀(y) = [P̂₋(Y ≤ y, D=0) − P̂₊(Y ≤ y, D=0)] / π
 *
 * Densities replace 1{Y ≤ y} by a Gaussian kernel φ((y − Y)/b)/b; b by
 * Silverman's rule 0.9·min(sd, IQR/1.34)·N^(−1/5) on the window's outcomes
 * (sd with divisor N − 1, quartiles by linear interpolation, Hyndman & Fan
 * type 7; when the IQR is 0, as for a binary outcome, sd alone). Means use
 * Y·1{D=d}; their difference is τ(Y)/τ(D) exactly by linearity. Nothing is
 * clipped: decreasing stretches of F and negative stretches of the density
 * are reported, as the picture of a violation.
 *
 * `sign` −1 (eligibility below) swaps the sides. π ≤ 0 is an error: the
 * distributions are not defined when take-up does not rise.
 *
 * @example
 *   complierCdf(score, treated, bill, 60, [400, 500, 600], 1, { bandwidth: 8, kernel: 'triangular' }).cdf
 */
import { SideFit, Window, boundaryWindow, KernelName, gathered, sideIntercept } from '../fit';
import { CutlineError } from '../errors';
import { formatNumber, rankLookup, rankOf } from '../numeric';

export interface ComplierOptions {
  bandwidth: number;
  kernel: KernelName;
  sign?: 1 | -1;
}

interface Prepared {
  win: Window;
  plus: SideFit;
  minus: SideFit;
  pi: number;
  sign: 1 | -1;
}

// The CDFs, densities and means of one check use the same window, columns and
// sign: the checked window is remembered by the window's side (per treated and
// outcome column), so it lives as long as the window.
function prepare(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  opts: ComplierOptions,
): Prepared {
  const sign = opts.sign ?? 1;
  if (treated.length !== score.length || outcome.length !== score.length)
    throw new CutlineError(`score, treated and outcome must have the same length (${score.length}, ${treated.length}, ${outcome.length})`);
  const win = boundaryWindow(score, cutoff, opts.bandwidth, opts.kernel, { quadratic: false });
  const byTreated = win.above.memo.compliers;
  let byOutcome = byTreated.get(treated as object);
  if (!byOutcome) {
    byOutcome = new WeakMap();
    byTreated.set(treated as object, byOutcome);
  }
  const hit = byOutcome.get(outcome as object) as Prepared | undefined;
  if (hit && hit.sign === sign && hit.win.below === win.below) return hit;
  const p = checkWindow(win, treated, outcome, opts, sign);
  byOutcome.set(outcome as object, p);
  return p;
}

function checkWindow(win: Window, treated: ArrayLike<number>, outcome: ArrayLike<number>, opts: ComplierOptions, sign: number): Prepared {
  if (sign !== 1 && sign !== -1) throw new CutlineError(`sign must be 1 (eligibility above) or -1 (below), got ${String(sign)}`);
  const plus = sign === 1 ? win.above : win.below;
  const minus = sign === 1 ? win.below : win.above;
  // The columns were checked where they entered the engine (checkColumns at every entry point and in a check's settle).
  // Σ ω·D per side from the gathered column (the same sums, read in window order).
  const pi = sideIntercept(plus, treated) - sideIntercept(minus, treated);
  if (!(pi > 0))
    throw new CutlineError(
      `the take-up jump is ${formatNumber(pi)} at bandwidth ${opts.bandwidth}: take-up does not rise at the cutoff, ` +
        `so the complier distributions are not defined — check the treated column and the eligibility side`,
    );
  return { win, plus, minus, pi, sign: sign as 1 | -1 };
}

function checkArm(arm: number): void {
  if (arm !== 0 && arm !== 1) throw new CutlineError(`arm must be 1 (treated compliers) or 0 (untreated compliers), got ${String(arm)}`);
}

function checkAt(at: number[]): void {
  at.forEach((v, j) => {
    if (!Number.isFinite(v)) throw new CutlineError(`at must hold finite numbers; value ${j + 1} is ${v}`);
  });
}

/** Runs of steps j → j+1 of the sorted `at` with flags[j] set, as [start of first step, end of last step]. */
function stretches(sortedAt: number[], flags: boolean[]): Array<{ from: number; to: number }> {
  const out: Array<{ from: number; to: number }> = [];
  let start = -1;
  for (let j = 0; j <= flags.length; j++) {
    if (j < flags.length && flags[j]) {
      if (start < 0) start = j;
    } else if (start >= 0) {
      out.push({ from: sortedAt[start], to: sortedAt[j] ?? sortedAt[j - 1] });
      start = -1;
    }
  }
  return out;
}

/**
 * The implied complier CDF F_arm at the values `at` (any order; results in
 * the same order). `decreasing` lists stretches [from, to] of consecutive
 * sorted `at` values over which F falls.
 */
export function complierCdf(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  at: number[],
  arm: 0 | 1,
  opts: ComplierOptions,
): ComplierCdf {
  checkArm(arm);
  return complierCdfArms(score, treated, outcome, cutoff, at, [arm], opts)[0];
}

export interface ComplierCdf {
  at: number[];
  cdf: number[];
  decreasing: Array<{ from: number; to: number }>;
}

/**
 * complierCdf for several arms in one pass over the window (a check wants
 * both): each arm's sums are taken in the same order as alone, so each equals
 * complierCdf's to the last digit.
 */
export function complierCdfArms(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  at: number[],
  arms: Array<0 | 1>,
  opts: ComplierOptions,
): ComplierCdf[] {
  arms.forEach(checkArm);
  checkAt(at);
  const p = prepare(score, treated, outcome, cutoff, opts);
  const order = at.map((_, j) => j).sort((a, b) => at[a] - at[b]);
  const sortedAt = order.map((j) => at[j]);
  // Signed weights of the arm's units: F(y) = Σ_{Y_i ≤ y} c_i, c = ±ω/π. Each
  // unit adds its weight at the first sorted `at` value ≥ Y_i (a bucket table, numeric/rankLookup.ts),
  // then a running sum gives F at every point: O(N log |at|), no sort of the window.
  // bucket[d] collects the units with D = d (an arm not asked for is never read).
  const bucket = [new Float64Array(sortedAt.length + 1), new Float64Array(sortedAt.length + 1)];
  const grid = rankLookup(Float64Array.from(sortedAt), sortedAt[0], sortedAt[sortedAt.length - 1]);
  for (const [side, s] of [[p.plus, 1], [p.minus, -1]] as const) {
    const w = side.coef1[0];
    const c1 = s / p.pi;
    const c0 = -s / p.pi;
    const d = gathered(side, treated);
    const y = gathered(side, outcome);
    const one = bucket[1];
    const zero = bucket[0];
    if (arms.length === 1) {
      const arm = arms[0];
      const out = bucket[arm];
      const c = arm === 1 ? c1 : c0;
      for (let t = 0; t < w.length; t++) if (d[t] === arm) out[rankOf(grid, y[t])] += c * w[t];
    } else {
      for (let t = 0; t < w.length; t++) {
        if (d[t] === 1) one[rankOf(grid, y[t])] += c1 * w[t];
        else zero[rankOf(grid, y[t])] += c0 * w[t];
      }
    }
  }
  return arms.map((arm) => {
    const sortedCdf: number[] = [];
    let acc = 0;
    for (let j = 0; j < sortedAt.length; j++) {
      acc += bucket[arm][j];
      sortedCdf.push(acc);
    }
    const cdf = new Array<number>(at.length);
    order.forEach((j, r) => (cdf[j] = sortedCdf[r]));
    const falls = sortedCdf.slice(1).map((v, r) => v < sortedCdf[r]);
    return { at: [...at], cdf, decreasing: stretches(sortedAt, falls) };
  });
}

/** Silverman's rule of thumb on the window outcomes (see the doc comment). */
export function silvermanBandwidth(values: number[]): number {
  const n = values.length;
  const s = [...values].sort((a, b) => a - b);
  const mean = s.reduce((a, b) => a + b, 0) / n;
  const sd = Math.sqrt(s.reduce((a, b) => a + (b - mean) * (b - mean), 0) / (n - 1));
  const q = (p: number): number => {
    const h = (n - 1) * p;
    const lo = Math.floor(h);
    return s[lo] + (h - lo) * ((s[Math.min(lo + 1, n - 1)] ?? s[lo]) - s[lo]);
  };
  const iqr = q(0.75) - q(0.25);
  const spread = iqr > 0 ? Math.min(sd, iqr / 1.34) : sd;
  return 0.9 * spread * Math.pow(n, -0.2);
}

/** The implied complier density of arm `arm` at `at`; `negative` lists stretches where it is below 0. */
export function complierDensity(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  at: number[],
  arm: 0 | 1,
  opts: ComplierOptions & { densityBandwidth?: number },
): { at: number[]; density: number[]; negative: Array<{ from: number; to: number }>; densityBandwidth: number } {
  checkArm(arm);
  checkAt(at);
  const p = prepare(score, treated, outcome, cutoff, opts);
  let b = opts.densityBandwidth;
  if (b !== undefined) {
    if (!(b > 0) || !Number.isFinite(b)) throw new CutlineError(`densityBandwidth must be a positive number, got ${b}`);
  } else {
    const ys = [...p.plus.index, ...p.minus.index].map((i) => outcome[i]);
    b = silvermanBandwidth(ys);
    if (!(b > 0)) throw new CutlineError('the outcome takes a single value in the window: the complier density is not defined');
  }
  const ys: number[] = [];
  const cs: number[] = [];
  for (const [side, s] of [[p.plus, 1], [p.minus, -1]] as const) {
    const w = side.coef1[0];
    const c = (arm === 1 ? s : -s) / p.pi;
    side.index.forEach((i, t) => {
      if (treated[i] === arm) {
        ys.push(outcome[i]);
        cs.push(c * w[t]);
      }
    });
  }
  const norm = 1 / (b * Math.sqrt(2 * Math.PI));
  const density = at.map((y) => {
    let f = 0;
    for (let r = 0; r < ys.length; r++) {
      const u = (y - ys[r]) / b!;
      f += cs[r] * Math.exp(-0.5 * u * u);
    }
    return f * norm;
  });
  const order = at.map((_, j) => j).sort((a, c) => at[a] - at[c]);
  const sortedAt = order.map((j) => at[j]);
  // A stretch runs from the first to the last negative point of a run of sorted `at`.
  const neg: Array<{ from: number; to: number }> = [];
  let start = -1;
  order.forEach((j, r) => {
    if (density[j] < 0) {
      if (start < 0) start = r;
      if (r === order.length - 1 || !(density[order[r + 1]] < 0)) {
        neg.push({ from: sortedAt[start], to: sortedAt[r] });
        start = -1;
      }
    }
  });
  return { at: [...at], density, negative: neg, densityBandwidth: b };
}

/** Complier means of the treated and untreated outcome; mean_treated − mean_untreated = τ(Y)/τ(D). */
export function complierMeans(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  opts: ComplierOptions,
): { mean_treated: number; mean_untreated: number; takeup: number } {
  const p = prepare(score, treated, outcome, cutoff, opts);
  // Intercepts of Y·1{D=1} and Y·1{D=0} on each side, in one pass per side.
  const sums = (side: SideFit): [number, number] => {
    const w = side.coef1[0];
    const d = gathered(side, treated);
    const y = gathered(side, outcome);
    let treatedSum = 0;
    let untreatedSum = 0;
    for (let t = 0; t < w.length; t++) {
      if (d[t] === 1) treatedSum += w[t] * y[t];
      else untreatedSum += w[t] * y[t];
    }
    return [treatedSum, untreatedSum];
  };
  const [plusTreated, plusUntreated] = sums(p.plus);
  const [minusTreated, minusUntreated] = sums(p.minus);
  return {
    mean_treated: (plusTreated - minusTreated) / p.pi,
    mean_untreated: (minusUntreated - plusUntreated) / p.pi,
    takeup: p.pi,
  };
}
