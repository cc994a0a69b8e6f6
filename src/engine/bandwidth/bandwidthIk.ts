/**
 * The `ik` bandwidth of Imbens & Kalyanaraman (2012, Review of Economic
 * Studies 79(3)), sharp and fuzzy, with their regularisation terms. Steps as
 * stated in docs/methods.md §3.3 (an outline recalled from memory; check it
 * against the paper's own statement):
 *
 * 1. pilots of bandwidthPilots.ts: h₁, f̂, σ̂²_±, m̂₃;
 * 2. h₂,± = 3.56·(σ̂²_±/(f̂·m̂₃²))^(1/7)·N_±^(−1/7) (3.56 is the uniform-kernel
 *    constant of a local quadratic second derivative, bandwidthConstants.ts);
 * 3. m̂''_± = 2 × the x² coefficient of an unweighted quadratic fit on side ±
 *    among the units with |R − c| ≤ h₂,±; N₂,± their number;
 * 4. r̂_± = 2160·σ̂²_±/(N₂,±·h₂,±⁴);
 * 5. h = C_K·[(σ̂²₋ + σ̂²₊)/(f̂·((m̂''₊ − m̂''₋)² + r̂₊ + r̂₋))]^(1/5)·n^(−1/5),
 *    C_K the kernel's constant (3.4375 for the triangular kernel).
 *
 * Fuzzy version (Cutline's reading of IK §5): with the pilot ratio τ̃ (the
 * local linear fuzzy estimate at h₁ with the chosen kernel), the variance
 * term is Σ_±(σ̂²_Y± − 2τ̃σ̂_YD± + τ̃²σ̂²_D±), the curvature term
 * ((m̂''_Y₊ − m̂''_Y₋) − τ̃(m̂''_D₊ − m̂''_D₋))², and the regularisation
 * r̂_Y₊ + r̂_Y₋ + τ̃²(r̂_D₊ + r̂_D₋); the steps 2–4 are run for Y and D separately.
 */
import { boundaryConstants } from './bandwidthConstants';
import { medianBand, pilotCovariance, pilotVariance, Pilots, pilotWindow, thirdDerivative } from './bandwidthPilots';
import { boundaryWindow, fitPolynomial, KernelName, smoothJump } from '../fit';
import { widenForTies } from './bandwidthTies';
import { CutlineError } from '../errors';

export interface IkSide {
  sigma2: number;
  h2: number;
  n2: number;
  m2: number;
  r: number;
}

export interface IkCurvature {
  m3: number;
  below: IkSide;
  above: IkSide;
}

export interface IkBandwidth {
  bandwidth: number;
  h1: number;
  density: number;
  outcome: IkCurvature;
  treated?: IkCurvature & { covBelow: number; covAbove: number; tau: number };
}

function sideCurvature(
  score: ArrayLike<number>,
  values: ArrayLike<number>,
  cutoff: number,
  above: boolean,
  sigma2: number,
  density: number,
  m3: number,
  nSide: number,
): IkSide {
  let h2 = 3.56 * Math.pow(sigma2 / (density * m3 * m3), 1 / 7) * Math.pow(nSide, -1 / 7);
  if (!(h2 > 0) || !Number.isFinite(h2)) h2 = Infinity; // m̂₃ = 0 or σ̂² = 0: the whole side
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = 0; i < score.length; i++) {
    const x = score[i] - cutoff;
    if ((x >= 0) === above && Math.abs(x) <= h2) {
      xs.push(x);
      ys.push(values[i]);
    }
  }
  // The engine's polynomial fit (fit/polyFit.ts), centred and scaled on the side's units.
  const beta = fitPolynomial(xs, ys, 2);
  if (!beta) {
    throw new CutlineError(
      `the score takes too few distinct values within ${h2.toPrecision(4)} ${above ? 'above' : 'below'} the cutoff ` +
        `(${xs.length} units) for the ik rule to measure the curvature of the data (it needs 3); give a bandwidth instead`,
    );
  }
  const m2 = 2 * beta[2];
  const n2 = xs.length;
  const r = (2160 * sigma2) / (n2 * Math.pow(h2, 4));
  return { sigma2, h2, n2, m2, r: Number.isFinite(r) ? r : 0 };
}

function curvature(score: ArrayLike<number>, values: ArrayLike<number>, cutoff: number, p: Pilots, band: Int32Array): IkCurvature {
  const m3 = thirdDerivative(score, values, cutoff, band);
  return {
    m3,
    below: sideCurvature(score, values, cutoff, false, pilotVariance(values, p.near.below), p.density, m3, p.nBelow),
    above: sideCurvature(score, values, cutoff, true, pilotVariance(values, p.near.above), p.density, m3, p.nAbove),
  };
}

export function bandwidthIk(
  score: ArrayLike<number>,
  values: ArrayLike<number>,
  cutoff: number,
  kernel: KernelName,
  treated?: ArrayLike<number>,
): IkBandwidth {
  const p = pilotWindow(score, cutoff);
  const band = medianBand(score, cutoff);
  const ck = boundaryConstants(kernel, 1, 0).constant;
  const y = curvature(score, values, cutoff, p, band);
  let num = y.below.sigma2 + y.above.sigma2;
  let bias = y.above.m2 - y.below.m2;
  let reg = y.above.r + y.below.r;
  let treatedPart: IkBandwidth['treated'];
  if (treated) {
    const d = curvature(score, treated, cutoff, p, band);
    const win = boundaryWindow(score, cutoff, widenForTies(score, cutoff, p.h1, 2).bandwidth, kernel, { quadratic: false });
    const tau = smoothJump(win, values, 'hc0').estimate / smoothJump(win, treated, 'hc0').estimate;
    const covBelow = pilotCovariance(values, treated, p.near.below);
    const covAbove = pilotCovariance(values, treated, p.near.above);
    num = num - 2 * tau * (covBelow + covAbove) + tau * tau * (d.below.sigma2 + d.above.sigma2);
    bias = bias - tau * (d.above.m2 - d.below.m2);
    reg = reg + tau * tau * (d.above.r + d.below.r);
    treatedPart = { ...d, covBelow, covAbove, tau };
  }
  const h = ck * Math.pow(num / (p.density * (bias * bias + reg)), 0.2) * Math.pow(p.n, -0.2);
  if (!(h > 0) || !Number.isFinite(h)) {
    throw new CutlineError('the ik rule cannot choose a bandwidth for these data (no variation near the cutoff); type a bandwidth instead');
  }
  return { bandwidth: h, h1: p.h1, density: p.density, outcome: y, treated: treatedPart };
}
