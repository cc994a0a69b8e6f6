/**
 * The kernel window at the cutoff and the local polynomial smoother weights
 * of docs/methods.md §2.2, computed once per side from the scores alone and reused
 * for every outcome, indicator and bootstrap draw.
 *
 * On each side, the coefficient vector of a weighted least-squares fit of V on
 * (1, x, …, x^p), x = R − c, weights k_i = K(x_i/h), is Σ_i W_j(i) V_i with
 * W(i) = (Σ_l k_l z_l z_l')⁻¹ z_i k_i. Row 0 of W (the intercept weights) is
 * the ω of docs/methods.md §2.2. Units of a side are stored sorted by score, which the
 * nearest-neighbour variance and the validity test rely on.
 *
 * Reference: Fan & Gijbels (1996), Local Polynomial Modelling, §3.
 *
 * @example
 *   const w = boundaryWindow(score, 60, 8, 'triangular');
 *   const a = w.above.coef[0].reduce((s, om, i) => s + om * y[w.above.index[i]], 0);
 */
import { IndexedScore, lowerBound, OrderView, orderView, sortedOrder, valuesAt } from '../data';
import { CutlineError } from '../errors';
import { KernelName, kernelWeight } from './kernels';
import type { NeighbourGroups } from './residuals';
import { argsortBy, formatNumber } from '../numeric';
import { coefficientWeights, PolyMoments, polyFrameSorted, polyInverse, polyMoments } from './polyFit';


export interface SideFit {
  /** True for the side R ≥ c. */
  above: boolean;
  /** Positions of the window's units in the data arrays, sorted by score. */
  index: Int32Array;
  /** x_i = R_i − c. */
  x: Float64Array;
  /** Kernel weights k_i > 0. */
  k: Float64Array;
  /** Linear fit: coef1[0] intercept weights ω, coef1[1] slope weights. */
  coef1: [Float64Array, Float64Array];
  /** Quadratic fit on the same window (for bias correction), if asked for; its first two rows are made when first read. */
  coef2?: [Float64Array, Float64Array, Float64Array];
  /** The quadratic fit's x² weights (coef2[2]), made with the fit: all that bias correction reads. */
  x2Weights?: Float64Array;
  /** Number of distinct scores in the side's window. */
  distinct: number;
  /** Results derived from this side and a column (gathered values, residuals), by kind; they live as long as the fit. */
  memo: SideMemo;
}

/** What a side remembers per column (keyed by the column object, for the lifetime of the side only). */
export interface SideMemo {
  gathered: WeakMap<object, Float64Array>;
  residuals: WeakMap<object, Float64Array>;
  biasCorrected?: Float64Array;
  /** Where the side's units sit in the score handle's sorted order (columns are then read as slices). */
  view?: OrderView;
  compliers: WeakMap<object, WeakMap<object, unknown>>;
  /** The side's groups of equal scores and their neighbour runs (residuals.ts), found once. */
  neighbours?: NeighbourGroups;
}

export function sideMemo(view?: OrderView): SideMemo {
  return { gathered: new WeakMap(), residuals: new WeakMap(), compliers: new WeakMap(), view };
}

export interface Window {
  cutoff: number;
  bandwidth: number;
  kernel: KernelName;
  above: SideFit;
  below: SideFit;
}

function sideName(above: boolean): string {
  return above ? 'above' : 'below';
}

/** The window's moments Σ k uʲ (j ≤ 4, u = x/s, s its largest |x|): one pass serves the line and the curve. */
function windowMoments(x: Float64Array, k: Float64Array, h: number): PolyMoments {
  // Scaled by the window's largest |x|, not h: a bandwidth far beyond the data would make every u tiny and the normal equations look singular.
  // x ascends (window units sorted by score): the frame from its ends.
  return polyMoments(x, 2, polyFrameSorted(x, 0, h), { weights: k });
}

/** Coefficient weights W_j(i) (x units) of the degree-p fit, for the rows asked for (all when `only` is absent). */
function polyWeights(x: Float64Array, k: Float64Array, h: number, p: number, above: boolean, only: number | undefined, wm: PolyMoments): Float64Array[] {
  const inv = polyInverse(wm, p);
  if (!inv) {
    throw new CutlineError(
      `the window (bandwidth ${formatNumber(h, 6)}) ${sideName(above)} the cutoff cannot be fitted by a degree-${p} polynomial: ` +
        `its scores take too few distinct values — widen the bandwidth`,
    );
  }
  return Array.from({ length: p + 1 }, (_, j) => (only === undefined || only === j ? coefficientWeights(x, k, inv, wm.frame, j) : new Float64Array(0)));
}

/**
 * Positions inside the window on each side, sorted by score (ties by
 * position). Every kernel is zero exactly outside the open interval (−1, 1).
 */
function windowPositions(score: ArrayLike<number>, cutoff: number, h: number, rows?: Int32Array): { above: Int32Array; below: Int32Array } {
  if (rows) {
    const above: number[] = [];
    const below: number[] = [];
    for (let t = 0; t < rows.length; t++) {
      const xv = score[rows[t]] - cutoff;
      if (xv >= 0) {
        if (xv < h) above.push(rows[t]);
      } else if (-xv < h) below.push(rows[t]);
    }
    return { above: argsortBy(score, Int32Array.from(above)), below: argsortBy(score, Int32Array.from(below)) };
  }
  const order = sortedOrder(score);
  // below: cutoff − h < R < cutoff; above: cutoff ≤ R < cutoff + h (x computed as R − c, as in the fit).
  let a = lowerBound(score, order, cutoff - h, true);
  while (a < order.length && !(-(score[order[a]] - cutoff) < h)) a++;
  while (a > 0 && -(score[order[a - 1]] - cutoff) < h && score[order[a - 1]] < cutoff) a--;
  const c = lowerBound(score, order, cutoff, false);
  let e = lowerBound(score, order, cutoff + h, false);
  while (e > c && !(score[order[e - 1]] - cutoff < h)) e--;
  while (e < order.length && score[order[e]] - cutoff < h) e++;
  // Views, not copies: see orderView.
  return { above: order.subarray(c, e), below: order.subarray(Math.min(a, c), c) };
}

/** x = R − c, kernel weights and the count of distinct scores of window units sorted by score. */
function coordinates(
  score: ArrayLike<number>,
  cutoff: number,
  h: number,
  kernel: KernelName,
  index: Int32Array,
): { x: Float64Array; k: Float64Array; distinct: number } {
  const n = index.length;
  const r = valuesAt(index, score, orderView(score, index));
  const x = new Float64Array(n);
  const k = new Float64Array(n);
  let distinct = 0;
  // The kernel's loop is chosen once, not per unit (window units have |x| < h); the triangular one, the
  // default, is computed in the same pass.
  const triangular = kernel === 'triangular';
  for (let t = 0; t < n; t++) {
    const xt = r[t] - cutoff;
    x[t] = xt;
    if (t === 0 || xt !== x[t - 1]) distinct++;
    if (triangular) k[t] = 1 - Math.abs(xt / h);
  }
  if (!triangular) for (let t = 0; t < n; t++) k[t] = kernelWeight(kernel, x[t] / h);
  return { x, k, distinct };
}

/** One side's fit from its window positions (sorted by score). */
function fitPositions(
  score: ArrayLike<number>,
  cutoff: number,
  h: number,
  kernel: KernelName,
  above: boolean,
  withQuadratic: boolean,
  positions: Int32Array,
): SideFit {
  const index = positions;
  const { x, k, distinct } = coordinates(score, cutoff, h, kernel, index);
  const n = index.length;
  if (n < 3) {
    throw new CutlineError(
      `the window (bandwidth ${formatNumber(h, 6)}) holds ${n} unit${n === 1 ? '' : 's'} ${sideName(above)} the cutoff; ` +
        `at least 3 are needed — widen the bandwidth`,
    );
  }
  if (distinct < 2) {
    throw new CutlineError(
      `all scores in the window ${sideName(above)} the cutoff are equal (bandwidth ${formatNumber(h, 6)}); a line cannot be fitted — widen the bandwidth`,
    );
  }
  const wm = windowMoments(x, k, h);
  const [w0, w1] = polyWeights(x, k, h, 1, above, undefined, wm);
  const fit: SideFit = { above, index, x, k, coef1: [w0, w1], distinct, memo: sideMemo(orderView(score, index)) };
  if (withQuadratic) {
    if (distinct < 3 || n < 4) {
      throw new CutlineError(
        `the window (bandwidth ${formatNumber(h, 6)}) ${sideName(above)} the cutoff holds only ${distinct} distinct score${distinct === 1 ? '' : 's'}; ` +
          `the bias-corrected interval fits a curve and needs at least 3 — widen the bandwidth`,
      );
    }
    const q2 = polyWeights(x, k, h, 2, above, 2, wm)[2];
    fit.x2Weights = q2;
    // The intercept and slope rows only serve the residuals of the fit-based variances: made when first read.
    let coef2: [Float64Array, Float64Array, Float64Array] | undefined;
    Object.defineProperty(fit, 'coef2', {
      enumerable: true,
      get: () => (coef2 ??= [polyWeights(x, k, h, 2, above, 0, wm)[0], polyWeights(x, k, h, 2, above, 1, wm)[1], q2]),
    });
  }
  return fit;
}

/** The units and positions of one side's window, sorted by score: all a nearest-neighbour pass needs. */
export interface SortedSide {
  index: Int32Array;
  x: Float64Array;
  memo?: SideMemo;
}

/**
 * Only the x² coefficient weights of one side's local quadratic fit (for the
 * curvature pilots of the bandwidth rules, which need nothing else), not cached.
 */
export function curvatureWeights(
  score: ArrayLike<number>,
  cutoff: number,
  b: number,
  kernel: KernelName,
  above: boolean,
): SortedSide & { q2: Float64Array } {
  checkBandwidth(b);
  const pos = windowPositions(score, cutoff, b);
  const index = above ? pos.above : pos.below;
  const n = index.length;
  const { x, k, distinct } = coordinates(score, cutoff, b, kernel, index);
  if (n < 4 || distinct < 3) {
    throw new CutlineError(
      `the score takes only ${distinct} distinct value${distinct === 1 ? '' : 's'} within ${formatNumber(b, 6)} ${sideName(above)} the cutoff, too few for the bandwidth rule to measure the data's curvature (it needs 3); give a bandwidth instead`,
    );
  }
  return { index, x, q2: polyWeights(x, k, b, 2, above, 2, windowMoments(x, k, b))[2], memo: sideMemo(orderView(score, index)) };
}

function checkBandwidth(h: number): void {
  if (!(h > 0) || !Number.isFinite(h)) throw new CutlineError(`bandwidth must be a positive number, got ${h}`);
}

// A check asks for the same side fit several times (bandwidth pilots shared by
// two rules, the estimates and the complier distributions at one bandwidth):
// a score handle (data/indexedScore.ts) keeps its last few fits. A fit with the
// quadratic serves a request without it. A plain array keeps nothing.
const FITS_KEPT = 6;

function cachedFit(
  score: ArrayLike<number>,
  cutoff: number,
  h: number,
  kernel: KernelName,
  above: boolean,
  withQuadratic: boolean,
  positions: () => Int32Array,
): SideFit {
  if (!(score instanceof IndexedScore)) return fitPositions(score, cutoff, h, kernel, above, withQuadratic, positions());
  const cache = (score.memo ??= new Map());
  const key = (q: boolean): string => `fit|${cutoff}|${h}|${kernel}|${above}|${q}`;
  const hit = (cache.get(key(true)) ?? (withQuadratic ? undefined : cache.get(key(false)))) as SideFit | undefined;
  if (hit) return hit;
  const fit = fitPositions(score, cutoff, h, kernel, above, withQuadratic, positions());
  cache.set(key(withQuadratic), fit);
  const fits = [...cache.keys()].filter((k) => k.startsWith('fit|'));
  if (fits.length > FITS_KEPT) cache.delete(fits[0]);
  return fit;
}

/**
 * The units of one side inside the window, sorted by score, with their fit
 * weights. `rows` (optional) restricts the data to those positions.
 */
export function sideFit(
  score: ArrayLike<number>,
  cutoff: number,
  h: number,
  kernel: KernelName,
  above: boolean,
  withQuadratic: boolean,
  rows?: Int32Array,
): SideFit {
  checkBandwidth(h);
  const pos = (): Int32Array => {
    const p = windowPositions(score, cutoff, h, rows);
    return above ? p.above : p.below;
  };
  if (rows) return fitPositions(score, cutoff, h, kernel, above, withQuadratic, pos());
  return cachedFit(score, cutoff, h, kernel, above, withQuadratic, pos);
}

/** Both sides of the window at bandwidth h. */
export function boundaryWindow(
  score: ArrayLike<number>,
  cutoff: number,
  h: number,
  kernel: KernelName,
  options: { quadratic?: boolean; rows?: Int32Array } = {},
): Window {
  const quad = options.quadratic ?? true;
  checkBandwidth(h);
  if (options.rows) {
    const pos = windowPositions(score, cutoff, h, options.rows);
    return {
      cutoff,
      bandwidth: h,
      kernel,
      above: fitPositions(score, cutoff, h, kernel, true, quad, pos.above),
      below: fitPositions(score, cutoff, h, kernel, false, quad, pos.below),
    };
  }
  let pos: { above: Int32Array; below: Int32Array } | undefined;
  const get = (): { above: Int32Array; below: Int32Array } => (pos ??= windowPositions(score, cutoff, h));
  return {
    cutoff,
    bandwidth: h,
    kernel,
    above: cachedFit(score, cutoff, h, kernel, true, quad, () => get().above),
    below: cachedFit(score, cutoff, h, kernel, false, quad, () => get().below),
  };
}

/** Σ_i w_i V[index_i]: a smoother applied to a data column. */
export function applyWeights(w: Float64Array, index: Int32Array, values: ArrayLike<number>): number {
  let s = 0;
  for (let t = 0; t < w.length; t++) s += w[t] * values[index[t]];
  return s;
}
