/**
 * The kernel window at the cutoff and the local polynomial smoother weights
 * of METHODS.md §2, computed once per side from the scores alone and reused
 * for every outcome, indicator and bootstrap draw.
 *
 * On each side, the coefficient vector of a weighted least-squares fit of V on
 * (1, x, …, x^p), x = R − c, weights k_i = K(x_i/h), is Σ_i W_j(i) V_i with
 * W(i) = (Σ_l k_l z_l z_l')⁻¹ z_i k_i. Row 0 of W (the intercept weights) is
 * the ω of METHODS.md. Units of a side are stored sorted by score, which the
 * nearest-neighbour variance and the validity test rely on.
 *
 * Reference: Fan & Gijbels (1996), Local Polynomial Modelling, §3.
 *
 * @example
 *   const w = boundaryWindow(score, 60, 8, 'triangular');
 *   const a = w.above.coef[0].reduce((s, om, i) => s + om * y[w.above.index[i]], 0);
 */
import { CutlineError } from './errors';
import { KernelName, kernelWeight } from './kernels';
import { invertSmall } from './linalg';

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
  /** Quadratic fit on the same window (for bias correction), if asked for. */
  coef2?: [Float64Array, Float64Array, Float64Array];
  /** Number of distinct scores in the side's window. */
  distinct: number;
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

/** Coefficient weights of the degree-p fit, W_j(i) in units of x (not x/h). */
function polyWeights(x: Float64Array, k: Float64Array, h: number, p: number, above: boolean): Float64Array[] {
  const n = x.length;
  const q = p + 1;
  const m: number[][] = Array.from({ length: q }, () => new Array<number>(q).fill(0));
  // Moments in u = x/h for conditioning; Σ k u^(a+b).
  const mom = new Array<number>(2 * p + 1).fill(0);
  for (let i = 0; i < n; i++) {
    const u = x[i] / h;
    let pw = k[i];
    for (let a = 0; a <= 2 * p; a++) {
      mom[a] += pw;
      pw *= u;
    }
  }
  for (let a = 0; a < q; a++) for (let b = 0; b < q; b++) m[a][b] = mom[a + b];
  const inv = invertSmall(m);
  if (!inv) {
    throw new CutlineError(
      `the window (bandwidth ${fmt(h)}) ${sideName(above)} the cutoff cannot be fitted by a degree-${p} polynomial: ` +
        `its scores take too few distinct values — widen the bandwidth`,
    );
  }
  const out = Array.from({ length: q }, () => new Float64Array(n));
  for (let i = 0; i < n; i++) {
    const u = x[i] / h;
    for (let j = 0; j < q; j++) {
      let s = 0;
      let pw = 1;
      for (let b = 0; b < q; b++) {
        s += inv[j][b] * pw;
        pw *= u;
      }
      out[j][i] = (s * k[i]) / Math.pow(h, j);
    }
  }
  return out;
}

function fmt(v: number): string {
  return Number(v.toPrecision(6)).toString();
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
  if (!(h > 0) || !Number.isFinite(h)) throw new CutlineError(`bandwidth must be a positive number, got ${h}`);
  const total = rows ? rows.length : score.length;
  const pos: number[] = [];
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    const xv = score[i] - cutoff;
    if ((xv >= 0) !== above) continue;
    if (kernelWeight(kernel, xv / h) > 0) pos.push(i);
  }
  const index = Int32Array.from(pos);
  index.sort((a, b) => score[a] - score[b] || a - b);
  const n = index.length;
  const x = new Float64Array(n);
  const k = new Float64Array(n);
  let distinct = 0;
  for (let t = 0; t < n; t++) {
    x[t] = score[index[t]] - cutoff;
    k[t] = kernelWeight(kernel, x[t] / h);
    if (t === 0 || x[t] !== x[t - 1]) distinct++;
  }
  if (n < 3) {
    throw new CutlineError(
      `the window (bandwidth ${fmt(h)}) holds ${n} unit${n === 1 ? '' : 's'} ${sideName(above)} the cutoff; ` +
        `at least 3 are needed — widen the bandwidth`,
    );
  }
  if (distinct < 2) {
    throw new CutlineError(
      `all scores in the window ${sideName(above)} the cutoff are equal (bandwidth ${fmt(h)}); a line cannot be fitted — widen the bandwidth`,
    );
  }
  const [w0, w1] = polyWeights(x, k, h, 1, above);
  const fit: SideFit = { above, index, x, k, coef1: [w0, w1], distinct };
  if (withQuadratic) {
    if (distinct < 3 || n < 4) {
      throw new CutlineError(
        `the window (bandwidth ${fmt(h)}) ${sideName(above)} the cutoff holds too few distinct scores (${distinct}) ` +
          `for the bias correction's quadratic fit — widen the bandwidth`,
      );
    }
    const [q0, q1, q2] = polyWeights(x, k, h, 2, above);
    fit.coef2 = [q0, q1, q2];
  }
  return fit;
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
  return {
    cutoff,
    bandwidth: h,
    kernel,
    above: sideFit(score, cutoff, h, kernel, true, quad, options.rows),
    below: sideFit(score, cutoff, h, kernel, false, quad, options.rows),
  };
}

/** Σ_i w_i V[index_i]: a smoother applied to a data column. */
export function applyWeights(w: Float64Array, index: Int32Array, values: ArrayLike<number>): number {
  let s = 0;
  for (let t = 0; t < w.length; t++) s += w[t] * values[index[t]];
  return s;
}
