/**
 * The `mse` bandwidth (the default): the MSE-optimal bandwidth of the local
 * linear jump, after Calonico, Cattaneo & Titiunik (2014, Econometrica 82(6))
 * and Calonico, Cattaneo & Farrell (2020, Econometrics Journal 23(2)). With
 * bias h²·B_K·Δ/2 and variance A/h the MSE h⁴B_K²Δ²/4 + A/h is smallest at
 *
 *   h = [A / (B_K²·(Δ̂² + R̂))]^(1/5),
 *
 * Cutline's estimates of the constants (its own choices, written here):
 * - A (variance): h₁ × the nearest-neighbour variance of the jump, fitted by
 *   local linear with the chosen kernel at the pilot h₁ = 1.84·sd(R)·n^(−1/5)
 *   (the variance of a boundary local linear fit is proportional to 1/h);
 * - Δ̂ (curvature): m̂''₊ − m̂''₋, each 2 × the x² coefficient of a local
 *   quadratic fit with the chosen kernel at the pilot b_± =
 *   C₂·(σ̂²_±/(f̂·m̂₃²))^(1/7)·N_±^(−1/7), C₂ the kernel's second-derivative
 *   constant (bandwidthConstants.ts), σ̂², f̂, m̂₃ from bandwidthPilots.ts; b is
 *   capped at the side's range;
 * - R̂ (regularisation, as in CCT 2014 §4): the nearest-neighbour variance of
 *   Δ̂, so that a noisy curvature estimate cannot make h explode;
 * - B_K = e₁'Γ⁻¹Λ of the kernel (−0.1 for the triangular kernel).
 * Fuzzy effect: the constants of the ratio τ = τ_Y/τ_D, through the influence
 * terms (ψ_Y − τ̃ψ_D)/τ̃_D with the pilot τ̃ at h₁; the curvature is
 * (Δ_Y − τ̃Δ_D)/τ̃_D, both fitted on the outcome's pilot windows b_±.
 */
import { boundaryConstants } from './bandwidthConstants';
import { medianBand, pilotVariance, pilotWindow, thirdDerivative } from './bandwidthPilots';
import { boundaryWindow, curvatureWeights, SortedSide, varianceOf, KernelName, gathered, neighbourResiduals, ratioPsi, smoothJump } from '../fit';
import { sortedOrder } from '../data';
import { widenForTies } from './bandwidthTies';
import { CutlineError } from '../errors';

export interface MseBandwidth {
  bandwidth: number;
  h1: number;
  variance: number;
  curvature: number;
  regularisation: number;
  pilot: { below: number; above: number };
}

function sideRange(score: ArrayLike<number>, cutoff: number, above: boolean): number {
  const order = sortedOrder(score);
  return above ? score[order[order.length - 1]] - cutoff : cutoff - score[order[0]];
}

/**
 * One side's curvature pieces: m̂'' = Σ 2q₂V for V = Y (and D), and the sums
 * of products of the influence terms 2q₂e (nearest-neighbour residuals e) that the
 * regularisation needs — Σψ_Y², Σψ_Yψ_D, Σψ_D² — without storing ψ.
 */
function sideCurvature(
  side: SortedSide & { q2: Float64Array },
  y: ArrayLike<number>,
  d?: ArrayLike<number>,
): { m2y: number; m2d: number; yy: number; yd: number; dd: number } {
  const q2 = side.q2;
  const ey = neighbourResiduals(side, y);
  const vy = gathered(side, y);
  let m2y = 0;
  let yy = 0;
  for (let t = 0; t < q2.length; t++) {
    const w = 2 * q2[t];
    m2y += w * vy[t];
    yy += w * w * ey[t] * ey[t];
  }
  if (!d) return { m2y, m2d: 0, yy, yd: 0, dd: 0 };
  const ed = neighbourResiduals(side, d);
  const vd = gathered(side, d);
  let m2d = 0;
  let yd = 0;
  let dd = 0;
  for (let t = 0; t < q2.length; t++) {
    const w = 2 * q2[t];
    const w2 = w * w;
    m2d += w * vd[t];
    yd += w2 * ey[t] * ed[t];
    dd += w2 * ed[t] * ed[t];
  }
  return { m2y, m2d, yy, yd, dd };
}

export function bandwidthMse(
  score: ArrayLike<number>,
  values: ArrayLike<number>,
  cutoff: number,
  kernel: KernelName,
  treated?: ArrayLike<number>,
): MseBandwidth {
  const p = pilotWindow(score, cutoff);
  const pilotWin = boundaryWindow(score, cutoff, widenForTies(score, cutoff, p.h1, 2).bandwidth, kernel, { quadratic: false });
  const y = smoothJump(pilotWin, values, 'neighbours');
  const d = treated ? smoothJump(pilotWin, treated, 'neighbours') : null;
  const psiPilot = d ? ratioPsi(y.psi, d.psi, y.estimate, d.estimate) : y.psi;
  const A = p.h1 * varianceOf(psiPilot);

  const m3 = thirdDerivative(score, values, cutoff, medianBand(score, cutoff));
  const c2 = boundaryConstants(kernel, 2, 2).constant;
  const pilotB = (above: boolean): number => {
    const sigma2 = pilotVariance(values, above ? p.near.above : p.near.below);
    const nSide = above ? p.nAbove : p.nBelow;
    const b = c2 * Math.pow(sigma2 / (p.density * m3 * m3), 1 / 7) * Math.pow(nSide, -1 / 7);
    const range = sideRange(score, cutoff, above) * (1 + 1e-9) + 1e-12;
    // No curvature (m̂₃ = 0) or no variance (a column constant near the cutoff): the whole side.
    return b > 0 && Number.isFinite(b) && b < range ? b : range;
  };
  const bBelow = pilotB(false);
  const bAbove = pilotB(true);
  const above = curvatureWeights(score, cutoff, bAbove, kernel, true);
  const below = curvatureWeights(score, cutoff, bBelow, kernel, false);
  const ca = sideCurvature(above, values, d ? treated : undefined);
  const cb = sideCurvature(below, values, d ? treated : undefined);
  // Sides are independent: Var(Δ̂) = Σ over both sides of the squared influence terms.
  let delta = ca.m2y - cb.m2y;
  let R = ca.yy + cb.yy;
  if (treated && d) {
    const tau = y.estimate / d.estimate;
    delta = (delta - tau * (ca.m2d - cb.m2d)) / d.estimate;
    R = (R - 2 * tau * (ca.yd + cb.yd) + tau * tau * (ca.dd + cb.dd)) / (d.estimate * d.estimate);
  }
  const bk = boundaryConstants(kernel, 1, 0).bias;
  const h = Math.pow(A / (bk * bk * (delta * delta + R)), 0.2);
  if (!(h > 0) || !Number.isFinite(h)) {
    throw new CutlineError('the mse rule cannot choose a bandwidth for these data (no variation near the cutoff); type a bandwidth instead');
  }
  return { bandwidth: h, h1: p.h1, variance: A, curvature: delta, regularisation: R, pilot: { below: bBelow, above: bAbove } };
}
