/**
 * The engine's one weighted least-squares polynomial fit (docs/methods.md §2.2):
 * every fit of a column on powers of the score — the local linear and quadratic
 * fits at the cutoff, the local polynomial density slopes, the bandwidth rules'
 * pilot fits (with a step at the cutoff for the global cubic), the global
 * quartics of the density and plot rules of thumb, the trend guard's quadratic
 * per side — is this one, on its moments:
 *
 *   y ≈ Σ_{j≤p} γ_j u^j [+ γ_step 1{x ≥ step}],   u = (x − centre)/scale,
 *   Γ γ = c,   Γ = Σ_i w_i z_i z_i',   c = Σ_i w_i z_i y_i,   z_i = (1, u_i, …, u_i^p [, 1{x_i ≥ step}]),
 *
 * so Γ is the Hankel matrix of the moments Σ w u^j (j ≤ 2p), bordered by the
 * step's moments. The coefficient weights W(i) = e_j'Γ⁻¹z_i w_i (the fit's
 * j-th coefficient is Σ_i W(i) y_i, Fan & Gijbels 1996, §3.2.2, the
 * "equivalent kernel") depend on the scores alone, so one pass over a window
 * serves every column fitted on it.
 *
 * Conditioning: the normal equations square the design's condition number
 * (Golub & Van Loan 2013, Matrix Computations, 4th ed., §5.3, recalled from
 * memory), so they are set up in u, not x: the scale (the largest |x − centre|
 * among units of positive weight) makes every power of u at most 1 whatever
 * the score's units, and centring (at the mean of x by default) keeps the
 * columns 1, u, u², … far from collinear when the data lie far from zero. A
 * local fit is centred at its own cutoff instead (x = 0: its window starts
 * there, u ∈ [−1, 1], and the coefficients wanted are those at that point).
 * Coefficients are returned in x units about a chosen origin (0 by default):
 * β_k = Σ_{j≥k} C(j, k)·d^(j−k)·γ_j / scale^j, d = origin − centre.
 *
 * @example
 *   // a quadratic through (0, 1), (1, 2), (2, 5), (3, 10): y = 1 + x²
 *   fitPolynomial([0, 1, 2, 3], [1, 2, 5, 10], 2); // ≈ Float64Array [1, 0, 1]
 *   // the intercept weights of a triangular-kernel local line at 0
 *   const x = Float64Array.of(0.1, 0.4, 0.7), k = x.map((v) => 1 - v);
 *   const f = polyFrame(x, 0);
 *   const inv = polyInverse(polyMoments(x, 1, f, { weights: k }))!;
 *   coefficientWeights(x, k, inv, f, 0); // Σ W_i y_i is the fitted value at 0
 */
import { invertSmall } from '../numeric';

/** The rescaled variable u = (x − centre)/scale of a fit. */
export interface PolyFrame {
  centre: number;
  scale: number;
}

/** What the normal equations need: Σ w u^j (j ≤ 2p), with the step's and the column's moments when asked for. */
export interface PolyMoments {
  degree: number;
  frame: PolyFrame;
  /** Σ w u^j, j = 0..2p. */
  gram: Float64Array;
  /** With a step: Σ_{x ≥ step} w u^j, j = 0..p. */
  stepGram?: Float64Array;
  /** With a column y: Σ w u^j y, j = 0..p, then Σ_{x ≥ step} w y with a step. */
  cross?: Float64Array;
}

export interface PolyOptions {
  /** Weights w_i ≥ 0 (1 when absent); units of weight 0 do not enter. */
  weights?: ArrayLike<number>;
  /** An extra column 1{x ≥ step} (its coefficient comes last). */
  step?: number;
}

/**
 * The frame of a fit: centred at `about` (the mean of x when absent), scaled by
 * the largest |x − centre| among units of positive weight (`fallback` if none).
 */
export function polyFrame(x: ArrayLike<number>, about?: number, weights?: ArrayLike<number>, fallback = 1): PolyFrame {
  const centre = about ?? meanOf(x, weights);
  let scale = 0;
  for (let i = 0; i < x.length; i++) {
    const d = Math.abs(x[i] - centre);
    if (d > scale && (!weights || weights[i] > 0)) scale = d;
  }
  return { centre, scale: scale > 0 ? scale : fallback };
}

/**
 * polyFrame for ascending x with every weight positive: the largest
 * |x − centre| is at one end, so no pass over the units (the same frame).
 *
 * @example polyFrameSorted(Float64Array.of(-2, -1, 0.5), 0, 1) // { centre: 0, scale: 2 }
 */
export function polyFrameSorted(x: ArrayLike<number>, about: number, fallback = 1): PolyFrame {
  const n = x.length;
  const scale = n > 0 ? Math.max(Math.abs(x[0] - about), Math.abs(x[n - 1] - about)) : 0;
  return { centre: about, scale: scale > 0 ? scale : fallback };
}

/** The mean of x over units of positive weight (0 if none). */
function meanOf(x: ArrayLike<number>, weights?: ArrayLike<number>): number {
  let s = 0;
  let m = 0;
  for (let i = 0; i < x.length; i++) {
    if (weights && !(weights[i] > 0)) continue;
    s += x[i];
    m++;
  }
  return m > 0 ? s / m : 0;
}

// Units per block of the compensated sums (see addBlock).
const BLOCK = 256;

/**
 * Adds a block's plain partial sums `part` into `total` with Kahan's
 * compensation (`comp` carries the lost low-order parts), then clears `part`.
 * A global fit sums over up to millions of units, and the level of y cancels
 * in the solve (the curvature of a side is tiny beside its mean): plain sums
 * lost up to 1e−10 of the curvature at a million rows. Blocks of plain sums
 * keep the cost of a plain pass; the error is that of one block.
 */
function addBlock(total: Float64Array, comp: Float64Array, part: Float64Array): void {
  for (let k = 0; k < part.length; k++) {
    const v = part[k] - comp[k];
    const t = total[k] + v;
    comp[k] = t - total[k] - v;
    total[k] = t;
    part[k] = 0;
  }
}

/**
 * The moments of a degree-p fit in `frame` (with the column y's when given): one pass over the units.
 * Sums are compensated (addBlock) except on the local fits' paths (weights, no column, no step),
 * whose windows' moments carry no cancelling level and are summed plainly, as they always were.
 */
export function polyMoments(x: ArrayLike<number>, degree: number, frame: PolyFrame, options: PolyOptions & { y?: ArrayLike<number> } = {}): PolyMoments {
  const { weights, step, y } = options;
  // Each path is its own function, so that each loop is compiled for the one case it serves.
  if (step === undefined && weights && !y) return localMoments(x, degree, frame, weights);
  if (degree === 2 && step === undefined && !weights && y) return quadraticMoments(x, y, frame);
  return compensatedMoments(x, degree, frame, options);
}

/** The local fits' moments Σ w uʲ (weights, no column), summed plainly, as they always were. */
function localMoments(x: ArrayLike<number>, degree: number, frame: PolyFrame, weights: ArrayLike<number>): PolyMoments {
  return degree <= 2 ? localMoments2(x, degree, frame, weights) : localMomentsAny(x, degree, frame, weights);
}

/** The hot path (side fits), unrolled: Σ w uʲ to j = 4 whatever p ≤ 2 (one pass serves the line and the curve). */
function localMoments2(x: ArrayLike<number>, degree: number, frame: PolyFrame, weights: ArrayLike<number>): PolyMoments {
  const { centre, scale } = frame;
  const n = x.length;
  let m0 = 0;
  let m1 = 0;
  let m2 = 0;
  let m3 = 0;
  let m4 = 0;
  for (let i = 0; i < n; i++) {
    const u = (x[i] - centre) / scale;
    const k = weights[i];
    const ku = k * u;
    const ku2 = ku * u;
    m0 += k;
    m1 += ku;
    m2 += ku2;
    m3 += ku2 * u;
    m4 += ku2 * u * u;
  }
  return { degree, frame, gram: Float64Array.of(m0, m1, m2, m3, m4).subarray(0, 2 * degree + 1) };
}

function localMomentsAny(x: ArrayLike<number>, degree: number, frame: PolyFrame, weights: ArrayLike<number>): PolyMoments {
  const { centre, scale } = frame;
  const gram = new Float64Array(2 * degree + 1);
  for (let i = 0; i < x.length; i++) {
    const u = (x[i] - centre) / scale;
    let pw = weights[i];
    for (let a = 0; a < gram.length; a++) {
      gram[a] += pw;
      pw *= u;
    }
  }
  return { degree, frame, gram };
}

/** Σ uʲ (j ≤ 4) and Σ uʲ y (j ≤ 2), unweighted, compensated: the trend guard's path (a million rows). */
function quadraticMoments(x: ArrayLike<number>, y: ArrayLike<number>, frame: PolyFrame): PolyMoments {
  const { centre, scale } = frame;
  const n = x.length;
  const degree = 2;
  const total = new Float64Array(7);
  const comp = new Float64Array(7);
  const part = new Float64Array(7);
  for (let b = 0; b < n; b += BLOCK) {
    const e = Math.min(n, b + BLOCK);
    let m1 = 0;
    let m2 = 0;
    let m3 = 0;
    let m4 = 0;
    let c0 = 0;
    let c1 = 0;
    let c2 = 0;
    for (let i = b; i < e; i++) {
      const u = (x[i] - centre) / scale;
      const u2 = u * u;
      const v = y[i];
      m1 += u;
      m2 += u2;
      m3 += u2 * u;
      m4 += u2 * u2;
      c0 += v;
      c1 += u * v;
      c2 += u2 * v;
    }
    part[0] = m1;
    part[1] = m2;
    part[2] = m3;
    part[3] = m4;
    part[4] = c0;
    part[5] = c1;
    part[6] = c2;
    addBlock(total, comp, part);
  }
  return { degree, frame, gram: Float64Array.of(n, total[0], total[1], total[2], total[3]), cross: total.slice(4, 7) };
}

/** Every other case, compensated (addBlock). */
function compensatedMoments(x: ArrayLike<number>, degree: number, frame: PolyFrame, options: PolyOptions & { y?: ArrayLike<number> }): PolyMoments {
  const { weights, step, y } = options;
  const { centre, scale } = frame;
  const n = x.length;
  // One accumulator vector [Σ w uʲ (j ≤ 2p) | Σ_{x ≥ step} w uʲ (j ≤ p) | Σ w uʲ y (j ≤ p) | Σ_{x ≥ step} w y].
  const q = degree + 1;
  const g = 2 * degree + 1;
  const sg = step === undefined ? 0 : q;
  const cr = y ? q + (step === undefined ? 0 : 1) : 0;
  const total = new Float64Array(g + sg + cr);
  const comp = new Float64Array(total.length);
  const part = new Float64Array(total.length);
  for (let b = 0; b < n; b += BLOCK) {
    const e = Math.min(n, b + BLOCK);
    if (!y && step === undefined && !weights) {
      for (let i = b; i < e; i++) {
        const u = (x[i] - centre) / scale;
        let pw = 1;
        for (let a = 0; a < g; a++) {
          part[a] += pw;
          pw *= u;
        }
      }
      addBlock(total, comp, part);
      continue;
    }
    for (let i = b; i < e; i++) {
      const k = weights ? weights[i] : 1;
      if (k === 0) continue;
      const u = (x[i] - centre) / scale;
      const on = step !== undefined && x[i] >= step;
      const v = y ? y[i] : 0;
      let pw = k;
      for (let a = 0; a < g; a++) {
        part[a] += pw;
        if (a < q) {
          if (on) part[g + a] += pw;
          if (y) part[g + sg + a] += pw * v;
        }
        pw *= u;
      }
      if (on && y) part[g + sg + q] += k * v;
    }
    addBlock(total, comp, part);
  }
  return {
    degree,
    frame,
    gram: total.slice(0, g),
    stepGram: sg ? total.slice(g, g + sg) : undefined,
    cross: cr ? total.slice(g + sg) : undefined,
  };
}

/** Σ w u^j y (j ≤ p, then Σ_{x ≥ step} w y with a step), compensated: a new column on a fit whose Γ⁻¹ is known. */
export function polyCross(x: ArrayLike<number>, y: ArrayLike<number>, degree: number, frame: PolyFrame, options: PolyOptions = {}): Float64Array {
  const { weights, step } = options;
  const { centre, scale } = frame;
  const q = degree + 1;
  const n = x.length;
  const total = new Float64Array(q + (step === undefined ? 0 : 1));
  const comp = new Float64Array(total.length);
  const part = new Float64Array(total.length);
  for (let b = 0; b < n; b += BLOCK) {
    const e = Math.min(n, b + BLOCK);
    for (let i = b; i < e; i++) {
      const k = weights ? weights[i] : 1;
      if (k === 0) continue;
      const u = (x[i] - centre) / scale;
      const kv = k * y[i];
      let pw = kv;
      for (let a = 0; a < q; a++) {
        part[a] += pw;
        pw *= u;
      }
      if (step !== undefined && x[i] >= step) part[q] += kv;
    }
    addBlock(total, comp, part);
  }
  return total;
}

/** Γ⁻¹ of the fit of degree d ≤ the moments' (the step's row and column last), or null when Γ is singular. */
export function polyInverse(mom: PolyMoments, degree = mom.degree): number[][] | null {
  const q = degree + 1;
  const g = mom.gram;
  const m = Array.from({ length: q }, (_, a) => Array.from({ length: q }, (_, b) => g[a + b]));
  const s = mom.stepGram;
  if (s) {
    for (let a = 0; a < q; a++) m[a].push(s[a]);
    m.push([...Array.from(s.subarray(0, q)), s[0]]);
  }
  return invertSmall(m);
}

/** β_k (x units about `origin`) from γ (u about the centre), γ_j for j ≤ degree — see the doc comment. */
function toOrigin(gamma: ArrayLike<number>, frame: PolyFrame, origin: number, degree: number, k: number): number {
  const d = origin - frame.centre;
  let s = 0;
  let binom = 1; // C(j, k)
  let dp = 1; // d^(j − k)
  for (let j = k; j <= degree; j++) {
    s += (binom * dp * gamma[j]) / Math.pow(frame.scale, j);
    binom = (binom * (j + 1)) / (j + 1 - k);
    dp *= d;
  }
  return s;
}

/**
 * The coefficients β of a degree-p fit in x units about `origin` (Σ_j β_j (x − origin)^j),
 * the step's jump last when the fit has one; `cross` from polyMoments or polyCross
 * (its first p + 1 entries, and its last for the step, are read).
 */
export function polyCoefficients(inv: number[][], cross: ArrayLike<number>, frame: PolyFrame, degree: number, origin = 0): Float64Array {
  const q = inv.length;
  const c = (b: number): number => (b <= degree ? cross[b] : cross[cross.length - (q - b)]);
  const gamma = new Float64Array(q);
  for (let a = 0; a < q; a++) {
    let s = 0;
    for (let b = 0; b < q; b++) s += inv[a][b] * c(b);
    gamma[a] = s;
  }
  const out = new Float64Array(q);
  for (let k = 0; k <= degree; k++) out[k] = toOrigin(gamma, frame, origin, degree, k);
  for (let k = degree + 1; k < q; k++) out[k] = gamma[k];
  return out;
}

/**
 * The weights W(i) of the coefficient of (x − origin)^row (x units) of a fit
 * without a step: β_row = Σ_i W(i) y_i for every column y on these units.
 */
export function coefficientWeights(
  x: ArrayLike<number>,
  weights: ArrayLike<number> | undefined,
  inv: number[][],
  frame: PolyFrame,
  row: number,
  origin = 0,
): Float64Array {
  const q = inv.length;
  const n = x.length;
  const { centre, scale } = frame;
  // Row `row` of the map to x units applied to Γ⁻¹: a polynomial in u, evaluated by Horner's rule
  // (one small function per case, so that each loop is compiled for the one case it serves).
  const c = Array.from({ length: q }, (_, b) => toOrigin(inv.map((r) => r[b]), frame, origin, q - 1, row));
  const o = new Float64Array(n);
  if (!weights) hornerAny(x, c, centre, scale, o);
  else if (q === 2) hornerLine(x, weights, c[0], c[1], centre, scale, o);
  else if (q === 3) hornerCurve(x, weights, c[0], c[1], c[2], centre, scale, o);
  else hornerWeighted(x, weights, c, centre, scale, o);
  return o;
}

function hornerAny(x: ArrayLike<number>, c: number[], centre: number, scale: number, o: Float64Array): void {
  const q = c.length;
  for (let i = 0; i < x.length; i++) {
    const u = (x[i] - centre) / scale;
    let s = c[q - 1];
    for (let b = q - 2; b >= 0; b--) s = s * u + c[b];
    o[i] = s;
  }
}

/** The local line's rows (the hot path). */
function hornerLine(x: ArrayLike<number>, w: ArrayLike<number>, c0: number, c1: number, centre: number, scale: number, o: Float64Array): void {
  for (let i = 0; i < x.length; i++) o[i] = (c0 + c1 * ((x[i] - centre) / scale)) * w[i];
}

/** The local quadratic's rows. */
function hornerCurve(x: ArrayLike<number>, w: ArrayLike<number>, c0: number, c1: number, c2: number, centre: number, scale: number, o: Float64Array): void {
  for (let i = 0; i < x.length; i++) {
    const u = (x[i] - centre) / scale;
    o[i] = (c0 + u * (c1 + u * c2)) * w[i];
  }
}

function hornerWeighted(x: ArrayLike<number>, w: ArrayLike<number>, c: number[], centre: number, scale: number, o: Float64Array): void {
  const q = c.length;
  for (let i = 0; i < x.length; i++) {
    const u = (x[i] - centre) / scale;
    let s = c[q - 1];
    for (let b = q - 2; b >= 0; b--) s = s * u + c[b];
    o[i] = s * w[i];
  }
}

/**
 * Weighted least-squares polynomial y ≈ Σ_j β_j x^j in one call: the frame centred
 * at `about` (the mean of x by default), the coefficients about 0; null when fewer
 * units than coefficients or a singular design.
 */
export function fitPolynomial(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  degree: number,
  options: { weights?: ArrayLike<number>; about?: number } = {},
): Float64Array | null {
  const { weights, about } = options;
  if (x.length < degree + 1) return null;
  const frame = polyFrame(x, about, weights, NaN);
  if (!(frame.scale > 0)) return null;
  const mom = polyMoments(x, degree, frame, { weights, y });
  const inv = polyInverse(mom);
  return inv ? polyCoefficients(inv, mom.cross!, frame, degree) : null;
}

/** Value of the polynomial with coefficients a at x. */
export function polyValue(a: ArrayLike<number>, x: number): number {
  let s = 0;
  for (let j = a.length - 1; j >= 0; j--) s = s * x + a[j];
  return s;
}

/** Value of the polynomial's d-th derivative at x. */
export function polyDerivative(a: ArrayLike<number>, x: number, d: number): number {
  let s = 0;
  for (let j = a.length - 1; j >= d; j--) {
    let c = a[j];
    for (let k = 0; k < d; k++) c *= j - k;
    s = s * x + c;
  }
  return s;
}
