/**
 * The jump τ(V) = â₊(V) − â₋(V) of docs/methods.md §2.4 and its robust
 * bias-corrected counterpart, each with per-unit influence terms so that any
 * variance (influence.ts) and the delta method of the fuzzy ratio follow.
 *
 * Bias correction (Calonico, Cattaneo & Titiunik 2014, Econometrica 82(6)):
 * applying the local linear intercept weights ω to a quadratic a + bx + c x²
 * returns a + c·Σω_i x_i², so the bias is estimated by β·ĉ with β = Σ ω_i x_i²
 * and ĉ the x² coefficient of a local quadratic fit. Cutline takes the pilot
 * bandwidth b equal to h (ρ = h/b = 1, which CCT's theory covers and
 * Calonico, Cattaneo & Farrell 2020 recommend as a simple default), so the
 * quadratic is fitted on the same window with the same kernel. The corrected
 * estimate is the linear smoother ω_bc = ω − β q₂, and its variance uses ω_bc
 * with the quadratic fit's residuals (nearest-neighbour residuals under `neighbours`).
 *
 * `sign` is +1 when eligibility sits above the cutoff and −1 when it sits
 * below (then every jump is reported as below − above).
 */
import { Window, SideFit } from './boundaryWindow';
import { VarianceName, gathered, sideResiduals } from './residuals';

export interface SmoothedJump {
  estimate: number;
  /** Influence terms, above units first then below units, in window order. */
  psi: Float64Array;
  estimateRobust: number;
  psiRobust: Float64Array;
  /** Σψ² and Σψ_robust² in ψ's order (the unclustered variances, summed as the terms are made). */
  psiSquares: number;
  psiRobustSquares: number;
}

/** Bias-corrected intercept weights of one side: ω − (Σ ω x²) q₂. */
export function biasCorrectedWeights(side: SideFit): Float64Array {
  const [w] = side.coef1;
  const q2 = side.x2Weights!;
  let beta = 0;
  for (let t = 0; t < w.length; t++) beta += w[t] * side.x[t] * side.x[t];
  const out = new Float64Array(w.length);
  for (let t = 0; t < w.length; t++) out[t] = w[t] - beta * q2[t];
  return out;
}

/** The side's bias-corrected weights, computed once per side. */
function bcWeights(side: SideFit): Float64Array {
  return (side.memo.biasCorrected ??= biasCorrectedWeights(side));
}

export function smoothJump(win: Window, values: ArrayLike<number>, variance: VarianceName, sign: 1 | -1 = 1): SmoothedJump {
  const na = win.above.index.length;
  const nb = win.below.index.length;
  const psi = new Float64Array(na + nb);
  const psiRobust = new Float64Array(na + nb);
  let estimate = 0;
  let estimateRobust = 0;
  let psiSquares = 0;
  let psiRobustSquares = 0;
  const robust = win.above.x2Weights !== undefined && win.below.x2Weights !== undefined;
  const sums = new Float64Array(2);
  for (const side of [win.above, win.below]) {
    const s = (side.above ? 1 : -1) * sign;
    const off = side.above ? 0 : na;
    const e1 = sideResiduals(side, values, variance, 1);
    const v = gathered(side, values);
    sums[1] = psiSquares;
    weighted(side.coef1[0], v, e1, s, psi, off, sums);
    estimate += s * sums[0];
    psiSquares = sums[1];
    if (robust) {
      const e2 = variance === 'neighbours' ? e1 : sideResiduals(side, values, variance, 2);
      sums[1] = psiRobustSquares;
      weighted(bcWeights(side), v, e2, s, psiRobust, off, sums);
      estimateRobust += s * sums[0];
      psiRobustSquares = sums[1];
    }
  }
  return { estimate, psi, estimateRobust: robust ? estimateRobust : NaN, psiRobust, psiSquares, psiRobustSquares };
}

/**
 * One side's smoother Σ w·v (into sums[0]) and influence terms ψ = s·w·e
 * (into psi from `off`), adding Σψ² to the running total in sums[1]. One
 * function for the four passes of a jump (each side, plain and robust), so
 * V8 compiles its loop once.
 */
function weighted(w: Float64Array, v: Float64Array, e: Float64Array, s: number, psi: Float64Array, off: number, sums: Float64Array): void {
  let a = 0;
  let q = sums[1];
  for (let t = 0; t < w.length; t++) {
    a += w[t] * v[t];
    const p = s * w[t] * e[t];
    psi[off + t] = p;
    q += p * p;
  }
  sums[0] = a;
  sums[1] = q;
}

/** Influence terms of the ratio A/B: (ψ_A − r ψ_B)/B with r = A/B. */
export function ratioPsi(psiA: Float64Array, psiB: Float64Array, a: number, b: number): Float64Array {
  const r = a / b;
  const out = new Float64Array(psiA.length);
  for (let i = 0; i < out.length; i++) out[i] = (psiA[i] - r * psiB[i]) / b;
  return out;
}
