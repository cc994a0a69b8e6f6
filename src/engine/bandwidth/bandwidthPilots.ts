/**
 * Pilot quantities shared by the `ik` and `mse` bandwidth rules
 * (Imbens & Kalyanaraman 2012, Review of Economic Studies 79(3), §4.2; the
 * outline as recalled from memory, docs/methods.md §3.1 and §11):
 *
 * - h₁ = 1.84·sd(R)·n^(−1/5), the density f̂ = (N₁₋ + N₁₊)/(2n·h₁) and, per
 *   side, the sample variances (denominator N − 1) of each column among the
 *   units with c − h₁ ≤ R < c and c ≤ R ≤ c + h₁;
 * - m̂₃: the third derivative, 6 × the cubic coefficient of an ordinary least
 *   squares fit of V on (1, 1{R ≥ c}, x, x², x³) among the units whose score
 *   lies between the median score below and the median score above the cutoff.
 */
import { rememberedOn, lowerBound, orderView, sortedOrder, valuesAt } from '../data';
import { CutlineError } from '../errors';
import { sampleCovariance, sampleVariance, invertSmall } from '../numeric';

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

/** OLS coefficients of V on the given regressors (rows of design built by `row`). */
export function olsCoefficients(
  rows: Int32Array,
  p: number,
  row: (i: number, out: Float64Array) => void,
  values: ArrayLike<number>,
): Float64Array | null {
  const xtx = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  const xty = new Array<number>(p).fill(0);
  const z = new Float64Array(p);
  for (let t = 0; t < rows.length; t++) {
    row(rows[t], z);
    const v = values[rows[t]];
    for (let a = 0; a < p; a++) {
      xty[a] += z[a] * v;
      for (let b = 0; b <= a; b++) xtx[a][b] += z[a] * z[b];
    }
  }
  for (let a = 0; a < p; a++) for (let b = a + 1; b < p; b++) xtx[a][b] = xtx[b][a];
  const inv = invertSmall(xtx);
  if (!inv) return null;
  const beta = new Float64Array(p);
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) beta[a] += inv[a][b] * xty[b];
  return beta;
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

/** (X'X)⁻¹ of the step cubic on the band: the scores alone (a score handle keeps it for every column of a check). */
function cubicInverse(score: ArrayLike<number>, cutoff: number, band: Int32Array, scale: number): number[][] | null {
  // Regressors (1, 1{R ≥ c}, u, u², u³) with u = x/scale for conditioning; the cubic coefficient is rescaled back.
  return rememberedOn(score, `cubic|${cutoff}|${scale}|${band.byteOffset}|${band.length}`, () => {
    const m = new Float64Array(7); // Σ u^k, k = 0..6
    const ms = new Float64Array(4); // Σ_{R ≥ c} u^k, k = 0..3
    const r = valuesAt(band, score, orderView(score, band));
    for (let t = 0; t < band.length; t++) {
      const u = (r[t] - cutoff) / scale;
      const u2 = u * u;
      const u3 = u2 * u;
      m[0] += 1;
      m[1] += u;
      m[2] += u2;
      m[3] += u3;
      m[4] += u2 * u2;
      m[5] += u2 * u3;
      m[6] += u3 * u3;
      if (u >= 0) {
        ms[0] += 1;
        ms[1] += u;
        ms[2] += u2;
        ms[3] += u3;
      }
    }
    const a = [
      [m[0], ms[0], m[1], m[2], m[3]],
      [ms[0], ms[0], ms[1], ms[2], ms[3]],
      [m[1], ms[1], m[2], m[3], m[4]],
      [m[2], ms[2], m[3], m[4], m[5]],
      [m[3], ms[3], m[4], m[5], m[6]],
    ];
    return invertSmall(a);
  });
}

/** Third derivative m̂₃ of V at the cutoff from the global cubic with a step. */
export function thirdDerivative(score: ArrayLike<number>, values: ArrayLike<number>, cutoff: number, band: Int32Array, scale: number): number {
  // Regressors (1, 1{R ≥ c}, u, u², u³) with u = x/scale for conditioning; the cubic coefficient is rescaled back.
  const inv = cubicInverse(score, cutoff, band, scale);
  if (!inv) throw new CutlineError('the score takes too few distinct values between the medians of the two sides for the bandwidth rule to measure the curvature of the data (a cubic needs 4); give a bandwidth');
  const xty = [0, 0, 0, 0, 0];
  const view = orderView(score, band);
  const r = valuesAt(band, score, view);
  const vs = valuesAt(band, values, view);
  for (let t = 0; t < band.length; t++) {
    const u = (r[t] - cutoff) / scale;
    const v = vs[t];
    const uv = u * v;
    xty[0] += v;
    if (u >= 0) xty[1] += v;
    xty[2] += uv;
    xty[3] += u * uv;
    xty[4] += u * u * uv;
  }
  let b4 = 0;
  for (let k = 0; k < 5; k++) b4 += inv[4][k] * xty[k];
  return (6 * b4) / (scale * scale * scale);
}

