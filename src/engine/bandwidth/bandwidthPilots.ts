/**
 * Pilot quantities shared by the `ik` and `mse` bandwidth rules
 * (Imbens & Kalyanaraman 2012, Review of Economic Studies 79(3), §4.2; the
 * outline as recalled from memory, docs/methods.md §3.1 and §11):
 *
 * - h₁ = 1.84·sd(R)·n^(−1/5), the density f̂ = (N₁₋ + N₁₊)/(2n·h₁) and, per
 *   side, the sample variances (denominator N − 1) of each column among the
 *   units with c − h₁ ≤ R < c and c ≤ R ≤ c + h₁;
 * - m̂₃: the third derivative, 6 × the cubic coefficient of an ordinary least
 *   squares fit of V on (1, x, x², x³, 1{R ≥ c}) among the units whose score
 *   lies between the median score below and the median score above the cutoff
 *   (the engine's polynomial fit, fit/polyFit.ts, with a step).
 */
import { rememberedOn, lowerBound, orderView, sortedOrder, valuesAt } from '../data';
import { CutlineError } from '../errors';
import { sampleCovariance, sampleVariance } from '../numeric';
import { PolyFrame, polyCoefficients, polyCross, polyFrame, polyInverse, polyMoments } from '../fit';

export interface Pilots {
  n: number;
  nBelow: number;
  nAbove: number;
  h1: number;
  density: number;
  /** Positions of the units within h₁ below and above. */
  near: { below: Int32Array; above: Int32Array };
}

// Pilots depend on the scores and the cutoff only; both bandwidth rules of a
// check (the estimates' and the validity test's) use the same ones.
export function pilotWindow(score: ArrayLike<number>, cutoff: number): Pilots {
  return rememberedOn(score, `pilots|${cutoff}`, () => computePilots(score, cutoff));
}

function computePilots(score: ArrayLike<number>, cutoff: number): Pilots {
  const n = score.length;
  const sd = Math.sqrt(sampleVariance(score));
  if (!(sd > 0)) throw new CutlineError('score is constant: a bandwidth cannot be chosen');
  const h1 = 1.84 * sd * Math.pow(n, -0.2);
  // Below: c − h₁ ≤ R < c; above: c ≤ R ≤ c + h₁ (x = R − c compared with h₁, as IK state it).
  const order = sortedOrder(score);
  const c0 = lowerBound(score, order, cutoff, false);
  let lo = lowerBound(score, order, cutoff - h1, false);
  while (lo > 0 && score[order[lo - 1]] - cutoff >= -h1) lo--;
  while (lo < c0 && !(score[order[lo]] - cutoff >= -h1)) lo++;
  let hi = lowerBound(score, order, cutoff + h1, true);
  while (hi < n && score[order[hi]] - cutoff <= h1) hi++;
  while (hi > c0 && !(score[order[hi - 1]] - cutoff <= h1)) hi--;
  const below = order.slice(lo, c0);
  const above = order.slice(c0, hi);
  if (below.length < 2 || above.length < 2) {
    throw new CutlineError(
      `too few units near the cutoff to choose a bandwidth: within ${h1.toPrecision(4)} of it the score has ` +
        `${below.length} below and ${above.length} above (${distinctAt(score, below)} and ${distinctAt(score, above)} distinct scores), and the rule needs at least 2 on each side; ` +
        'give a bandwidth wide enough to hold several distinct scores on each side, or check the score column and the cutoff',
    );
  }
  return {
    n,
    nBelow: c0,
    nAbove: n - c0,
    h1,
    density: (below.length + above.length) / (2 * n * h1),
    near: { below, above },
  };
}

/** How many distinct scores the units `idx` hold (for messages). */
function distinctAt(score: ArrayLike<number>, idx: ArrayLike<number>): number {
  const seen = new Set<number>();
  for (let t = 0; t < idx.length; t++) seen.add(score[idx[t]]);
  return seen.size;
}

function pick(values: ArrayLike<number>, idx: Int32Array): Float64Array {
  const out = new Float64Array(idx.length);
  for (let t = 0; t < idx.length; t++) out[t] = values[idx[t]];
  return out;
}

/** Sample variance of a column among the pilot units of one side. */
export function pilotVariance(values: ArrayLike<number>, idx: Int32Array): number {
  return sampleVariance(pick(values, idx));
}

export function pilotCovariance(a: ArrayLike<number>, b: ArrayLike<number>, idx: Int32Array): number {
  return sampleCovariance(pick(a, idx), pick(b, idx));
}

/** Units between the median score below and the median score above the cutoff (a slice of the sorted order). */
export function medianBand(score: ArrayLike<number>, cutoff: number): Int32Array {
  return rememberedOn(score, `band|${cutoff}`, () => computeMedianBand(score, cutoff));
}

function computeMedianBand(score: ArrayLike<number>, cutoff: number): Int32Array {
  const order = sortedOrder(score);
  const nLo = lowerBound(score, order, cutoff, false);
  const med = (from: number, count: number): number =>
    count % 2 === 1
      ? score[order[from + (count - 1) / 2]]
      : 0.5 * (score[order[from + count / 2 - 1]] + score[order[from + count / 2]]);
  const mLo = med(0, nLo);
  const mHi = med(nLo, order.length - nLo);
  return order.subarray(lowerBound(score, order, mLo, false), lowerBound(score, order, mHi, true));
}

/** The step cubic's frame and Γ⁻¹ on the band: the scores alone (a score handle keeps them for every column of a check). */
function cubicInverse(score: ArrayLike<number>, cutoff: number, band: Int32Array): { frame: PolyFrame; inv: number[][] | null } {
  return rememberedOn(score, `cubic|${cutoff}|${band.byteOffset}|${band.length}`, () => {
    const r = valuesAt(band, score, orderView(score, band));
    // u = (R − c)/max|R − c| over the band: every power of u is at most 1, so the normal equations stay accurate.
    const frame = polyFrame(r, cutoff);
    return { frame, inv: polyInverse(polyMoments(r, 3, frame, { step: cutoff })) };
  });
}

/** Third derivative m̂₃ of V at the cutoff from the global cubic with a step (the engine's polynomial fit, fit/polyFit.ts). */
export function thirdDerivative(score: ArrayLike<number>, values: ArrayLike<number>, cutoff: number, band: Int32Array): number {
  const { frame, inv } = cubicInverse(score, cutoff, band);
  if (!inv) throw new CutlineError('the score takes too few distinct values between the medians of the two sides for the bandwidth rule to measure the curvature of the data (a cubic needs 4); give a bandwidth');
  const view = orderView(score, band);
  const beta = polyCoefficients(inv, polyCross(valuesAt(band, score, view), valuesAt(band, values, view), 3, frame, { step: cutoff }), frame, 3, cutoff);
  return 6 * beta[3];
}
