/**
 * The local polynomial density test of Cattaneo, Jansson & Ma (2020, JASA
 * 115(531)), docs/methods.md §6.2: on each side of the cutoff, a local polynomial
 * fit of the empirical distribution function F̂(R_i) = #{j: R_j ≤ R_i}/n (all
 * n units) on (1, x, x², …), x = R_i − c, triangular weights 1 − |x|/h, using
 * only that side's units; the slope at c is the side's density.
 *
 * - Point estimates: local quadratic (p = 2), f̂₊ and f̂₋; log ratio
 *   ln f̂₊ − ln f̂₋ (eligible side over the other when sign = −1).
 * - Robust bias-corrected test of f₊ = f₋: the cubic (p + 1 = 3) fit at the
 *   same bandwidth. With the pilot bandwidth equal to h, correcting the
 *   quadratic slope for its leading bias by a cubic fit gives exactly the
 *   cubic slope (the same identity as for the local linear jump in
 *   smoothJump.ts), so the test statistic is (f̂₊³ − f̂₋³)/se³ with the cubic
 *   fit's variance, and ci_above/ci_below are the cubic fit's intervals.
 * - Variance: the jackknife-type estimator of CJM (2020, §2), as recalled
 *   from memory: f̂ = Σ_i s_i F̂_i with slope weights s_i is exactly the mean
 *   over all n units j of g_j = Σ_i s_i·1(R_j ≤ R_i), so Cutline uses
 *   Var(a·f̂₊ + b·f̂₋) = n⁻² Σ_j (a(g⁺_j − f̂₊) + b(g⁻_j − f̂₋))², which counts
 *   the (small, O(1/n)) covariance of the two sides through F̂. It treats the
 *   weights s as fixed; their own randomness multiplies the fit residual of F̂
 *   and is of smaller order. Units outside both windows each add
 *   (a f̂₊ + b f̂₋)², so the sum costs one pass over the windows.
 * - se is the delta-method standard error of the (quadratic) log ratio.
 *
 * Bandwidth, unless given — Cutline's rule, written down here: the h that
 * minimises the sum of the two sides' asymptotic MSEs of the quadratic slope,
 *   MSE_s(h) = (h²·f_s''(c)·B/6)² + f_s(c)·V/(n·h),
 *   h = [V·(f₊ + f₋) / (4n·(B/6)²·(f₊''² + f₋''²))]^(1/5),
 * with the kernel constants B = e₂'Γ⁻¹Λ (bias) and V = ∫₀¹ G(v)² dv,
 * G(v) = e₂'Γ⁻¹∫_v^1 K(u) r(u) du (variance), computed exactly below; and
 * pilots in the spirit of McCrary's rule: a global quartic fitted to the
 * histogram heights of each side (McCrary's default bin), f_s = its value at
 * c and f_s''² replaced by the mean of its squared second derivative over the
 * side's bins (a global roughness that cannot vanish by accident at c). The
 * result is capped at the shorter side's range.
 *
 * @example localPolynomialDensityTest(score, 60).pvalue
 */
import { CutlineError } from '../errors';
import { orderView, sortedOrder, valuesAt, countDistinctSorted, distinctScoreWarning, requireBothSides, scoreSummary, ScoreSummary } from '../data';
import { firstAtLeast, invertSmall, normalQuantile, twoSidedPvalue, formatNumber } from '../numeric';
import { histogramHeights, mccraryDefaultBin } from './densityMcCrary';
import { coefficientWeights, fitPolynomial, polyDerivative, polyFrameSorted, polyInverse, polyMoments, polyValue } from '../fit';

export interface LocalPolynomialDensityOptions {
  bandwidth?: number;
  sign?: 1 | -1;
  rows?: Int32Array;
  level?: number;
}

export interface LocalPolynomialDensityResult {
  log_ratio: number;
  se: number;
  /** Two-sided p-value of the robust bias-corrected test of equal densities. */
  pvalue: number;
  /** Robust bias-corrected z statistic (eligible side minus the other). */
  statistic: number;
  bandwidth: number;
  density_above: number;
  density_below: number;
  /** Robust bias-corrected intervals for each side's density. */
  ci_above: [number, number];
  ci_below: [number, number];
  units_below: number;
  units_above: number;
  warnings: string[];
}


/** ∫₀¹ (1 − u) u^j du. */
function mu(j: number): number {
  return 1 / ((j + 1) * (j + 2));
}

/** Bias constant B and variance constant V of the triangular quadratic slope (see above). */
export function densityKernelConstants(p = 2): { B: number; V: number } {
  const q = p + 1;
  const gam = Array.from({ length: q }, (_, a) => Array.from({ length: q }, (_, b) => mu(a + b)));
  const inv = invertSmall(gam)!;
  const c = inv[1];
  let B = 0;
  for (let a = 0; a < q; a++) B += c[a] * mu(a + q);
  // G(v) = Σ_a c_a (−v^(a+1)/(a+1) + v^(a+2)/(a+2)) as polynomial coefficients.
  const g = new Array<number>(q + 2).fill(0);
  for (let a = 0; a < q; a++) {
    g[a + 1] -= c[a] / (a + 1);
    g[a + 2] += c[a] / (a + 2);
  }
  let V = 0;
  for (let i = 0; i < g.length; i++) for (let j = 0; j < g.length; j++) V += (g[i] * g[j]) / (i + j + 1);
  return { B, V };
}

const CONST2 = densityKernelConstants(2);

/** Cutline's MSE rule of thumb for the density bandwidth (see the doc comment). */
export function localPolynomialDensityBandwidth(
  score: ArrayLike<number>,
  cutoff: number,
  s: ScoreSummary,
  rows?: Int32Array,
): number {
  const hist = histogramHeights(score, cutoff, mccraryDefaultBin(s), s, rows);
  const f = hist.firstAbove;
  let fsum = 0;
  let rough = 0;
  for (const [lo, hi, side, count, range] of [
    [0, f, 'below', s.below, cutoff - s.min],
    [f, hist.x.length, 'above', s.above, s.max - cutoff],
  ] as const) {
    const x = hist.x.subarray(lo, hi);
    const y = hist.height.subarray(lo, hi);
    const a = x.length >= 6 ? fitPolynomial(x, y, 4) : null;
    if (!a) {
      throw new CutlineError(
        `the density bandwidth rule needs a spread of scores ${side} the cutoff (at least 6 histogram bins, got ${x.length}); give a density bandwidth`,
      );
    }
    const f0 = polyValue(a, 0);
    fsum += f0 > 0 ? f0 : count / (s.n * range);
    let r = 0;
    for (let j = 0; j < x.length; j++) r += polyDerivative(a, x[j], 2) ** 2;
    rough += r / x.length;
  }
  const cap = Math.min(cutoff - s.min, s.max - cutoff);
  if (!(rough > 0)) return cap;
  const { B, V } = CONST2;
  const h = Math.pow((V * fsum) / (4 * s.n * (B / 6) ** 2 * rough), 0.2);
  return Math.min(h, cap);
}

interface SideWindow {
  /** Sorted x = R − c of the side's units within the bandwidth. */
  x: Float64Array;
  /** F̂ at each unit. */
  F: Float64Array;
}

/** Slope weights (x units) of the degree-p triangular fit on one side (the local fit at the cutoff, polyFit.ts). */
function slopeWeights(x: Float64Array, h: number, p: number, side: string): Float64Array {
  const k = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) k[i] = 1 - Math.abs(x[i] / h);
  const frame = polyFrameSorted(x, 0, h);
  const inv = polyInverse(polyMoments(x, p, frame, { weights: k }));
  if (!inv) throw new CutlineError(`the density window ${side} the cutoff cannot be fitted (too few distinct scores); widen the density bandwidth`);
  return coefficientWeights(x, k, inv, frame, 1);
}

interface SideFitResult {
  f: number;
  /** g_j − f for the side's window units. */
  dev: Float64Array;
}

function fitSide(win: SideWindow, h: number, p: number, side: string): SideFitResult {
  const s = slopeWeights(win.x, h, p, side);
  const m = win.x.length;
  let f = 0;
  for (let i = 0; i < m; i++) f += s[i] * win.F[i];
  // g_j = Σ_{i: x_i ≥ x_j} s_i, a tail sum that starts at the first of x_j's ties.
  const dev = new Float64Array(m);
  let tail = 0;
  for (let i = m - 1; i >= 0; ) {
    let k = i;
    while (k > 0 && win.x[k - 1] === win.x[i]) k--;
    for (let t = k; t <= i; t++) tail += s[t];
    for (let t = k; t <= i; t++) dev[t] = tail - f;
    i = k - 1;
  }
  return { f, dev };
}

/** Var(a f̂₊ + b f̂₋) by the jackknife-type formula of the doc comment. */
function comboVariance(up: SideFitResult, lo: SideFitResult, a: number, b: number, n: number): number {
  let ss = 0;
  for (let j = 0; j < up.dev.length; j++) ss += (a * up.dev[j] - b * lo.f) ** 2;
  for (let j = 0; j < lo.dev.length; j++) ss += (-a * up.f + b * lo.dev[j]) ** 2;
  ss += (n - up.dev.length - lo.dev.length) * (a * up.f + b * lo.f) ** 2;
  return ss / (n * n);
}

/** x = R − c of the window's units on each side, ascending, read off the shared sorted order. */
function windowFromOrder(score: ArrayLike<number>, cutoff: number, h: number): { xa: Float64Array; xb: Float64Array } {
  const order = sortedOrder(score);
  // The scores in sorted order, read sequentially (a handle keeps them gathered).
  const sorted = valuesAt(order, score, orderView(score, order));
  // First position where pred holds (pred is monotone along the order).
  const first = (pred: (x: number) => boolean): number => firstAtLeast((t) => (pred(sorted[t] - cutoff) ? 1 : 0), 0, order.length, 1, false);
  const b0 = first((x) => x > -h);
  const c0 = first((x) => x >= 0);
  const a1 = first((x) => x >= 0 && !(x < h));
  const xb = new Float64Array(Math.max(0, c0 - b0));
  for (let t = b0; t < c0; t++) xb[t - b0] = sorted[t] - cutoff;
  const xa = new Float64Array(a1 - c0);
  for (let t = c0; t < a1; t++) xa[t - c0] = sorted[t] - cutoff;
  return { xa, xb };
}

function collectWindows(score: ArrayLike<number>, cutoff: number, h: number, s: ScoreSummary, rows?: Int32Array) {
  if (!rows) {
    const { xa, xb } = windowFromOrder(score, cutoff, h);
    return { above: { x: xa, F: ecdf(xa, s.below, s.n) }, below: { x: xb, F: ecdf(xb, s.below - xb.length, s.n) } };
  }
  const total = rows ? rows.length : score.length;
  let na = 0;
  let nb = 0;
  for (let t = 0; t < total; t++) {
    const x = score[rows ? rows[t] : t] - cutoff;
    if (x >= 0 ? x < h : -x < h) x >= 0 ? na++ : nb++;
  }
  const xa = new Float64Array(na);
  const xb = new Float64Array(nb);
  na = nb = 0;
  for (let t = 0; t < total; t++) {
    const x = score[rows ? rows[t] : t] - cutoff;
    if (x >= 0) {
      if (x < h) xa[na++] = x;
    } else if (-x < h) xb[nb++] = x;
  }
  xa.sort();
  xb.sort();
  return {
    above: { x: xa, F: ecdf(xa, s.below, s.n) },
    below: { x: xb, F: ecdf(xb, s.below - xb.length, s.n) },
  };
}

/** F̂ at each unit of an ascending window, ties sharing the count of units ≤ them; `offset` units lie before the window. */
function ecdf(x: Float64Array, offset: number, n: number): Float64Array {
  const F = new Float64Array(x.length);
  for (let i = x.length - 1; i >= 0; ) {
    let k = i;
    while (k > 0 && x[k - 1] === x[i]) k--;
    for (let t = k; t <= i; t++) F[t] = (offset + i + 1) / n;
    i = k - 1;
  }
  return F;
}

export function localPolynomialDensityTest(
  score: ArrayLike<number>,
  cutoff: number,
  opts: LocalPolynomialDensityOptions = {},
): LocalPolynomialDensityResult {
  const s = scoreSummary(score, cutoff, opts.rows);
  requireBothSides(s, 1, 'the density test');
  if (!(s.sd > 0)) throw new CutlineError('the score is constant; its density cannot be tested');
  let h: number;
  if (opts.bandwidth !== undefined) {
    h = opts.bandwidth;
    if (!(h > 0) || !Number.isFinite(h)) throw new CutlineError(`the density bandwidth must be a positive number, got ${h}`);
  } else {
    h = localPolynomialDensityBandwidth(score, cutoff, s, opts.rows);
  }
  const win = collectWindows(score, cutoff, h, s, opts.rows);
  const distinct = { below: countDistinctSorted(win.below.x), above: countDistinctSorted(win.above.x) };
  for (const side of ['below', 'above'] as const) {
    if (distinct[side] < 5) {
      throw new CutlineError(
        `the density bandwidth ${formatNumber(h, 6)} holds ${win[side].x.length} units with ${distinct[side]} distinct scores ${side} the cutoff; ` +
          `the local polynomial density test needs at least 5 distinct scores on each side — widen the bandwidth`,
      );
    }
  }
  const up2 = fitSide(win.above, h, 2, 'above');
  const lo2 = fitSide(win.below, h, 2, 'below');
  for (const [v, side] of [[lo2.f, 'below'], [up2.f, 'above']] as const) {
    if (!(v > 0)) {
      throw new CutlineError(`the local polynomial density estimate ${side} the cutoff is not positive (${formatNumber(v, 6)}); widen the density bandwidth`);
    }
  }
  const up3 = fitSide(win.above, h, 3, 'above');
  const lo3 = fitSide(win.below, h, 3, 'below');
  const n = s.n;
  const sign = opts.sign ?? 1;
  const z = normalQuantile(0.5 + (opts.level ?? 0.95) / 2);
  const seLog = Math.sqrt(comboVariance(up2, lo2, 1 / up2.f, -1 / lo2.f, n));
  const seDiff = Math.sqrt(comboVariance(up3, lo3, 1, -1, n));
  const seUp = Math.sqrt(comboVariance(up3, lo3, 1, 0, n));
  const seLo = Math.sqrt(comboVariance(up3, lo3, 0, 1, n));
  const statistic = (sign * (up3.f - lo3.f)) / seDiff;
  const warnings: string[] = [];
  const w = distinctScoreWarning(
    { below: distinct.below, above: distinct.above, unitsBelow: win.below.x.length, unitsAbove: win.above.x.length },
    'the local polynomial density test',
  );
  if (w) warnings.push(w);
  for (const side of ['below', 'above'] as const) {
    const u = win[side].x.length;
    if (u < 30) warnings.push(`the local polynomial density test: only ${u} units lie within the density bandwidth ${side} the cutoff; the normal p-value is a rough guide`);
  }
  return {
    log_ratio: sign * (Math.log(up2.f) - Math.log(lo2.f)),
    se: seLog,
    pvalue: twoSidedPvalue(statistic),
    statistic,
    bandwidth: h,
    density_above: up2.f,
    density_below: lo2.f,
    ci_above: [up3.f - z * seUp, up3.f + z * seUp],
    ci_below: [lo3.f - z * seLo, lo3.f + z * seLo],
    units_below: win.below.x.length,
    units_above: win.above.x.length,
    warnings,
  };
}
