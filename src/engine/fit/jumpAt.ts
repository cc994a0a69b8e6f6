/**
 * The sharp jump in the mean of a column at the cutoff, and the fuzzy
 * (complier) effect, on a given window (docs/methods.md §2.4).
 *
 * Fuzzy: τ̂ = τ(Y)/τ(D), with the delta-method variance
 * [Var τ(Y) − 2τ̂ Cov(τ(Y), τ(D)) + τ̂² Var τ(D)]/τ(D)², computed exactly as
 * the variance of the influence terms (ψ_Y − τ̂ψ_D)/τ(D). The robust interval
 * is centred at the ratio of the bias-corrected jumps.
 *
 * @example
 *   const w = boundaryWindow(score, 60, 8, 'triangular');
 *   jumpAt(w, bill, { variance: 'neighbours' }).estimate
 */
import { CutlineError } from '../errors';
import { Window } from './boundaryWindow';
import { Estimate, makeEstimate } from './estimate';
import { varianceOf } from './influence';
import { VarianceName } from './residuals';
import { ratioPsi, smoothJump, SmoothedJump } from './smoothJump';

export interface JumpOptions {
  variance: VarianceName;
  /** Cluster id of every unit in the data (required for `cluster`). */
  clusters?: Int32Array;
  /** +1: eligibility above the cutoff; −1: below. */
  sign?: 1 | -1;
  level?: number;
}

/** Cluster ids of the window's units, aligned with the influence terms. */
export function windowClusters(win: Window, clusters?: Int32Array): Int32Array | null {
  if (!clusters) return null;
  const na = win.above.index.length;
  const out = new Int32Array(na + win.below.index.length);
  win.above.index.forEach((i, t) => (out[t] = clusters[i]));
  win.below.index.forEach((i, t) => (out[na + t] = clusters[i]));
  return out;
}

function check(opts: JumpOptions): void {
  if (opts.variance === 'cluster' && !opts.clusters) {
    throw new CutlineError('the cluster variance needs a cluster code for every row', { code: 'option', argument: 'clusters' });
  }
}

export function jumpFrom(win: Window, s: SmoothedJump, opts: JumpOptions): Estimate {
  const g = opts.variance === 'cluster' ? windowClusters(win, opts.clusters) : null;
  // Unclustered, Σψ² was summed with the terms, in the order varianceOf reads them.
  return makeEstimate(
    s.estimate,
    Math.sqrt(g ? varianceOf(s.psi, g) : s.psiSquares),
    s.estimateRobust,
    Math.sqrt(g ? varianceOf(s.psiRobust, g) : s.psiRobustSquares),
    opts.level,
  );
}

/** Sharp jump of `values` at the cutoff. */
export function jumpAt(win: Window, values: ArrayLike<number>, opts: JumpOptions): Estimate {
  check(opts);
  return jumpFrom(win, smoothJump(win, values, opts.variance, opts.sign ?? 1), opts);
}

/** Fuzzy effect from already smoothed jumps of the outcome and of take-up. */
export function effectFrom(win: Window, y: SmoothedJump, d: SmoothedJump, opts: JumpOptions): Estimate {
  const g = opts.variance === 'cluster' ? windowClusters(win, opts.clusters) : null;
  const tau = y.estimate / d.estimate;
  const tauR = y.estimateRobust / d.estimateRobust;
  return makeEstimate(
    tau,
    Math.sqrt(ratioVariance(y.psi, d.psi, y.estimate, d.estimate, g)),
    tauR,
    Math.sqrt(ratioVariance(y.psiRobust, d.psiRobust, y.estimateRobust, d.estimateRobust, g)),
    opts.level,
  );
}

/**
 * varianceOf(ratioPsi(psiA, psiB, a, b), clusters), without the array of the
 * ratio's influence terms when there are no clusters: the same terms, squared
 * and summed in the same order.
 */
function ratioVariance(psiA: Float64Array, psiB: Float64Array, a: number, b: number, clusters: Int32Array | null): number {
  if (clusters) return varianceOf(ratioPsi(psiA, psiB, a, b), clusters);
  const r = a / b;
  let s = 0;
  for (let i = 0; i < psiA.length; i++) {
    const v = (psiA[i] - r * psiB[i]) / b;
    s += v * v;
  }
  return s;
}

/** Fuzzy (complier) effect τ(Y)/τ(D). */
export function effectAt(win: Window, outcome: ArrayLike<number>, treated: ArrayLike<number>, opts: JumpOptions): Estimate {
  check(opts);
  const sign = opts.sign ?? 1;
  return effectFrom(win, smoothJump(win, outcome, opts.variance, sign), smoothJump(win, treated, opts.variance, sign), opts);
}
