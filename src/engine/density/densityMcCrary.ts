/**
 * McCrary's (2008, Journal of Econometrics 142(2)) test for a jump in the
 * density of the score at the cutoff, as docs/methods.md §6.1 states it:
 *
 * 1. Bins [c + k·b, c + (k+1)·b) for integer k, from the bin holding the
 *    lowest score to the bin holding the highest (empty bins included, so the
 *    cutoff is always a bin edge); default b = 2·sd(R)·n^(−1/2).
 * 2. Heights Y_j = count_j/(n·b) at the midpoints X_j.
 * 3. On each side, a local linear fit of Y_j on X_j − c with triangular
 *    weights 1 − |X_j − c|/h; the intercept is f̂₊ (bins with k ≥ 0) or f̂₋.
 * 4. θ = ln f̂₊ − ln f̂₋, se = sqrt((1/(n·h))·(24/5)·(1/f̂₊ + 1/f̂₋)),
 *    two-sided normal p-value. With eligibility below (sign −1) the log
 *    ratio is eligible side over the other, ln f̂₋ − ln f̂₊; p is unchanged.
 *
 * Bandwidth h, unless given — McCrary's rule of thumb, recalled from memory
 * (docs/methods.md §11 lists it): on each side a global quartic in X_j − c is
 * fitted to the heights by least squares; σ̃² is its residual mean square
 * (Cutline divides by J − 5, J the side's bins); then
 * h_s = 3.348·[σ̃²·L_s / Σ_j f̃''(X_j)²]^(1/5) with L_s the side's range
 * (max R − c above, c − min R below), and h = (h₋ + h₊)/2. A side whose
 * quartic has no curvature (Σ f̃''² = 0) takes h_s = L_s.
 *
 * Errors: a bin wider than the score range, a side without units, fewer than
 * 6 bins on a side for the rule of thumb, fewer than 3 bins on a side within
 * the bandwidth, a non-positive density estimate. Warnings: a discrete or
 * heaped score near the cutoff (data/repeatedScores.ts), fewer than 30 units in a
 * side's window.
 *
 * @example mccraryTest(score, 60).pvalue
 */
import { CutlineError } from '../errors';
import { distinctScoreWarning, windowDistinctScores, requireBothSides, scoreSummary, ScoreSummary } from '../data';
import { twoSidedPvalue, formatNumber } from '../numeric';
import { fitPolynomial, polyDerivative, polyValue } from '../fit';

export interface McCraryOptions {
  bin?: number;
  bandwidth?: number;
  sign?: 1 | -1;
  rows?: Int32Array;
}

export interface McCraryResult {
  log_ratio: number;
  se: number;
  pvalue: number;
  bin: number;
  bandwidth: number;
  density_above: number;
  density_below: number;
  /** Bins within the bandwidth on each side (those with positive weight). */
  bins_below: number;
  bins_above: number;
  warnings: string[];
}

export interface Histogram {
  bin: number;
  /** Midpoints minus the cutoff, ascending. */
  x: Float64Array;
  /** count/(n·b). */
  height: Float64Array;
  count: Float64Array;
  /** Index of the first bin at or above the cutoff. */
  firstAbove: number;
}

const MAX_BINS = 20_000_000;


/** Default first-step bin width 2·sd·n^(−1/2). */
export function mccraryDefaultBin(s: ScoreSummary): number {
  return (2 * s.sd) / Math.sqrt(s.n);
}

/** Step 1–2: the histogram heights on bins aligned with the cutoff. */
export function histogramHeights(
  score: ArrayLike<number>,
  cutoff: number,
  bin: number,
  s: ScoreSummary,
  rows?: Int32Array,
): Histogram {
  if (!(bin > 0) || !Number.isFinite(bin)) throw new CutlineError(`the density bin width must be a positive number, got ${bin}`);
  if (bin > s.max - s.min) {
    throw new CutlineError(
      `the density bin width ${formatNumber(bin, 6)} is larger than the range of the score (${formatNumber(s.min, 6)} to ${formatNumber(s.max, 6)}); choose a smaller bin`,
    );
  }
  const kmin = Math.floor((s.min - cutoff) / bin);
  const kmax = Math.floor((s.max - cutoff) / bin);
  const nb = kmax - kmin + 1;
  if (nb > MAX_BINS) throw new CutlineError(`the density bin width ${formatNumber(bin, 6)} makes ${nb} bins; choose a larger bin`);
  const count = new Float64Array(nb);
  const total = rows ? rows.length : score.length;
  for (let t = 0; t < total; t++) {
    const k = Math.floor((score[rows ? rows[t] : t] - cutoff) / bin) - kmin;
    count[k < 0 ? 0 : k >= nb ? nb - 1 : k]++; // clamps only floating-point edge cases
  }
  const x = new Float64Array(nb);
  const height = new Float64Array(nb);
  for (let j = 0; j < nb; j++) {
    x[j] = (kmin + j + 0.5) * bin;
    height[j] = count[j] / (s.n * bin);
  }
  return { bin, x, height, count, firstAbove: Math.max(0, -kmin) };
}

/** McCrary's rule-of-thumb bandwidth for one side (see the doc comment). */
function sideRuleOfThumb(x: Float64Array, y: Float64Array, range: number, side: string): number {
  const J = x.length;
  if (J < 6) {
    throw new CutlineError(
      `McCrary's bandwidth rule needs at least 6 bins ${side} the cutoff, the data give ${J}; give a density bandwidth or a smaller bin`,
    );
  }
  const a = fitPolynomial(x, y, 4);
  if (!a) throw new CutlineError(`the quartic of McCrary's bandwidth rule cannot be fitted ${side} the cutoff; give a density bandwidth`);
  let sse = 0;
  let curv = 0;
  for (let j = 0; j < J; j++) {
    const e = y[j] - polyValue(a, x[j]);
    sse += e * e;
    const f2 = polyDerivative(a, x[j], 2);
    curv += f2 * f2;
  }
  const sigma2 = sse / (J - 5);
  if (!(curv > 0)) return range;
  return 3.348 * Math.pow((sigma2 * range) / curv, 0.2);
}

/** McCrary's rule-of-thumb bandwidth, the two sides averaged. */
export function mccraryBandwidth(hist: Histogram, s: ScoreSummary, cutoff: number): number {
  const f = hist.firstAbove;
  const hb = sideRuleOfThumb(hist.x.subarray(0, f), hist.height.subarray(0, f), cutoff - s.min, 'below');
  const ha = sideRuleOfThumb(hist.x.subarray(f), hist.height.subarray(f), s.max - cutoff, 'above');
  return (hb + ha) / 2;
}

/** Step 3: local linear intercept at the cutoff of one side's heights. */
function sideIntercept(x: Float64Array, y: Float64Array, h: number, side: string): { f: number; bins: number } {
  const w = new Float64Array(x.length);
  let bins = 0;
  for (let j = 0; j < x.length; j++) {
    w[j] = Math.max(0, 1 - Math.abs(x[j]) / h);
    if (w[j] > 0) bins++;
  }
  if (bins < 3) {
    throw new CutlineError(
      `the density bandwidth ${formatNumber(h, 6)} holds ${bins} bin${bins === 1 ? '' : 's'} ${side} the cutoff; at least 3 are needed — widen the bandwidth or narrow the bin`,
    );
  }
  const a = fitPolynomial(x, y, 1, { weights: w, about: 0 });
  if (!a) throw new CutlineError(`the density heights ${side} the cutoff cannot be fitted; widen the density bandwidth`);
  return { f: a[0], bins };
}

export function mccraryTest(score: ArrayLike<number>, cutoff: number, opts: McCraryOptions = {}): McCraryResult {
  const s = scoreSummary(score, cutoff, opts.rows);
  requireBothSides(s, 1, 'the density test');
  if (!(s.sd > 0)) throw new CutlineError('the score is constant; its density cannot be tested');
  const bin = opts.bin ?? mccraryDefaultBin(s);
  const hist = histogramHeights(score, cutoff, bin, s, opts.rows);
  let h: number;
  if (opts.bandwidth !== undefined) {
    h = opts.bandwidth;
    if (!(h > 0) || !Number.isFinite(h)) throw new CutlineError(`the density bandwidth must be a positive number, got ${h}`);
    // Its standard error scales as 1/sqrt(n h): beyond the data that shrinks with h while the
    // estimate stays put (a bandwidth of 1e300 gave se 1e-151), so such a bandwidth is refused.
    const reach = Math.max(s.max - cutoff, cutoff - s.min);
    if (h > reach) {
      throw new CutlineError(
        `the density bandwidth ${formatNumber(h, 6)} is wider than the largest distance of a score from the cutoff (${formatNumber(reach, 6)}); McCrary's standard error needs a bandwidth inside the data`,
      );
    }
  } else {
    h = mccraryBandwidth(hist, s, cutoff);
  }
  const f = hist.firstAbove;
  const below = sideIntercept(hist.x.subarray(0, f), hist.height.subarray(0, f), h, 'below');
  const above = sideIntercept(hist.x.subarray(f), hist.height.subarray(f), h, 'above');
  for (const [v, side] of [[below.f, 'below'], [above.f, 'above']] as const) {
    if (!(v > 0)) {
      throw new CutlineError(
        `McCrary's density estimate ${side} the cutoff is not positive (${formatNumber(v, 6)}); widen the density bandwidth or the bin`,
      );
    }
  }
  const sign = opts.sign ?? 1;
  const theta = sign * (Math.log(above.f) - Math.log(below.f));
  const se = Math.sqrt((1 / (s.n * h)) * (24 / 5) * (1 / above.f + 1 / below.f));
  const warnings: string[] = [];
  const d = windowDistinctScores(score, cutoff, h, opts.rows);
  const w = distinctScoreWarning(d, "McCrary's density test");
  if (w) warnings.push(w);
  for (const [u, side] of [[d.unitsBelow, 'below'], [d.unitsAbove, 'above']] as const) {
    if (u < 30) warnings.push(`McCrary's density test: only ${u} units lie within the density bandwidth ${side} the cutoff; the normal p-value is a rough guide`);
  }
  return {
    log_ratio: theta,
    se,
    pvalue: twoSidedPvalue(theta / se),
    bin,
    bandwidth: h,
    density_above: above.f,
    density_below: below.f,
    bins_below: below.bins,
    bins_above: above.bins,
    warnings,
  };
}
