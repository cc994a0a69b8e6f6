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
  for (const side of [win.above, win.below]) {
    const s = (side.above ? 1 : -1) * sign;
    const off = side.above ? 0 : na;
    const w = side.coef1[0];
    const e1 = sideResiduals(side, values, variance, 1);
    const v = gathered(side, values);
    let a = 0;
    for (let t = 0; t < w.length; t++) {
      a += w[t] * v[t];
      const p = s * w[t] * e1[t];
      psi[off + t] = p;
      psiSquares += p * p;
    }
    estimate += s * a;
    if (robust) {
      const wb = bcWeights(side);
      const e2 = variance === 'neighbours' ? e1 : sideResiduals(side, values, variance, 2);
      let ab = 0;
      for (let t = 0; t < wb.length; t++) {
        ab += wb[t] * v[t];
        const p = s * wb[t] * e2[t];
        psiRobust[off + t] = p;
        psiRobustSquares += p * p;
      }
      estimateRobust += s * ab;
    }
  }
  return { estimate, psi, estimateRobust: robust ? estimateRobust : NaN, psiRobust, psiSquares, psiRobustSquares };
}

/** Influence terms of the ratio A/B: (ψ_A − r ψ_B)/B with r = A/B. */
export function ratioPsi(psiA: Float64Array, psiB: Float64Array, a: number, b: number): Float64Array {
  const r = a / b;
  const out = new Float64Array(psiA.length);
  for (let i = 0; i < out.length; i++) out[i] = (psiA[i] - r * psiB[i]) / b;
  return out;
}
