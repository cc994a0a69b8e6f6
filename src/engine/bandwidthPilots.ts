/**
 * Pilot quantities shared by the `ik` and `mse` bandwidth rules
 * (Imbens & Kalyanaraman 2012, Review of Economic Studies 79(3), §4.2; the
 * outline as recalled from memory in METHODS.md §3):
 *
 * - h₁ = 1.84·sd(R)·n^(−1/5), the density f̂ = (N₁₋ + N₁₊)/(2n·h₁) and, per
 *   side, the sample variances (denominator N − 1) of each column among the
 *   units with c − h₁ ≤ R < c and c ≤ R ≤ c + h₁;
 * - m̂₃: the third derivative, 6 × the cubic coefficient of an ordinary least
 *   squares fit of V on (1, 1{R ≥ c}, x, x², x³) among the units whose score
 *   lies between the median score below and the median score above the cutoff.
 */
import { CutlineError } from './errors';
import { mean, sampleCovariance, sampleVariance } from './describe';
import { sortedOrder } from './boundaryWindow';
import { invertSmall } from './linalg';

export interface Pilots {
  n: number;
  nBelow: number;
  nAbove: number;
  h1: number;
  density: number;
  /** Positions of the units within h₁ below and above. */
  near: { below: Int32Array; above: Int32Array };
}

export function pilotWindow(score: ArrayLike<number>, cutoff: number): Pilots {
  const n = score.length;
  const sd = Math.sqrt(sampleVariance(score));
  if (!(sd > 0)) throw new CutlineError('score is constant: a bandwidth cannot be chosen');
  const h1 = 1.84 * sd * Math.pow(n, -0.2);
  const below: number[] = [];
  const above: number[] = [];
  let nBelow = 0;
  for (let i = 0; i < n; i++) {
    const x = score[i] - cutoff;
    if (x < 0) {
      nBelow++;
      if (x >= -h1) below.push(i);
    } else if (x <= h1) above.push(i);
  }
  if (below.length < 2 || above.length < 2) {
    throw new CutlineError(
      `too few units near the cutoff for the pilot bandwidth ${h1.toPrecision(4)} ` +
        `(${below.length} below, ${above.length} above; at least 2 each are needed)`,
    );
  }
  return {
    n,
    nBelow,
    nAbove: n - nBelow,
    h1,
    density: (below.length + above.length) / (2 * n * h1),
    near: { below: Int32Array.from(below), above: Int32Array.from(above) },
  };
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

/** Units between the median score below and the median score above the cutoff. */
export function medianBand(score: ArrayLike<number>, cutoff: number): Int32Array {
  // Medians read off the sorted order (shared with the windows, boundaryWindow.ts).
  const order = sortedOrder(score);
  let nLo = 0;
  while (nLo < order.length && score[order[nLo]] < cutoff) nLo++;
  const med = (from: number, count: number): number =>
    count % 2 === 1
      ? score[order[from + (count - 1) / 2]]
      : 0.5 * (score[order[from + count / 2 - 1]] + score[order[from + count / 2]]);
  const mLo = med(0, nLo);
  const mHi = med(nLo, order.length - nLo);
  const out: number[] = [];
  for (let i = 0; i < score.length; i++) if (score[i] >= mLo && score[i] <= mHi) out.push(i);
  return Int32Array.from(out);
}

/** Third derivative m̂₃ of V at the cutoff from the global cubic with a step. */
export function thirdDerivative(score: ArrayLike<number>, values: ArrayLike<number>, cutoff: number, band: Int32Array, scale: number): number {
  // Regressors in units of x/scale for conditioning; the cubic coefficient is rescaled back.
  const beta = olsCoefficients(
    band,
    5,
    (i, z) => {
      const u = (score[i] - cutoff) / scale;
      z[0] = 1;
      z[1] = score[i] >= cutoff ? 1 : 0;
      z[2] = u;
      z[3] = u * u;
      z[4] = u * u * u;
    },
    values,
  );
  if (!beta) throw new CutlineError('the scores between the two side medians take too few values for the pilot cubic fit');
  return (6 * beta[4]) / (scale * scale * scale);
}

export { mean };
