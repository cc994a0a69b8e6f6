/**
 * The trend guard's outcomes (docs/methods.md §4.8, Cutline's
 * addition to Arai, Hsu, Kitagawa, Mourifié & Wan 2022): on each side of the
 * cutoff, the ordinary least squares fit Y = β₀ + β₁x + β₂x², x = R − c, over
 * every unit of that side used in the calculation (after the donut, whatever
 * the bandwidth), and
 *
 *   Ỹ_i = Y_i − (β̂₁ x_i + β̂₂ x_i²).
 *
 * The removed function is 0 at x = 0 from both sides, so (Ỹ, D) and (Y, D)
 * have the same joint distribution at the cutoff: the test's null hypothesis
 * is unchanged, only the slope of the indicators inside the window flattens.
 * The fit does not depend on the bandwidth, so one Ỹ serves every bandwidth
 * of the sensitivity table and every covariate cell (the pooled fit).
 *
 * Choices Cutline states: "above" is x ≥ 0 (docs/methods.md §1) whatever the
 * eligible side; the least squares are solved by Householder QR on the
 * columns (1, u, u²), u = x / max|x| on the side, so that scores far from
 * the cutoff or in large units do not spoil the solve; a side with fewer
 * than 3 distinct scores is fitted with the highest degree its scores
 * identify (2 distinct → a line, 1 → nothing removed) and says so in `degree`.
 *
 * @example
 *   const t = trendRemoved(score, bill, 60);
 *   t.values[i]; // bill[i] − (β̂₁(score[i] − 60) + β̂₂(score[i] − 60)²)
 *   t.above.slope; t.above.curvature; // β̂₁, β̂₂ above the cutoff
 */

import { gatheredColumns, keepGathered } from '../data';

export interface SideTrend {
  /** β̂₀ (the side's fitted value at the cutoff), β̂₁, β̂₂ in the score's and outcome's units. */
  intercept: number;
  slope: number;
  curvature: number;
  /** Polynomial degree actually fitted (2 unless the side has fewer than 3 distinct scores). */
  degree: 0 | 1 | 2;
  units: number;
}

export interface TrendRemoved {
  /** Ỹ at every data row of the calculation; rows outside `rows` keep Y. */
  values: Float64Array;
  below: SideTrend;
  above: SideTrend;
}

/**
 * Least squares of y on the columns (1, c₁, …, c_{p−1}) by Householder QR,
 * the columns c and y given as arrays that are overwritten. The column of
 * ones is not stored: its reflection is written out (its entries below the
 * first stay 1, so a product with it is a plain sum). The passes are fused
 * where they do not depend on one another (every dot product of a step in
 * one pass; each step's update with the next step's norm), each sum keeping
 * its order, so the result is the textbook algorithm's to the last bit.
 */
function householderSolve(cols: Float64Array[], y: Float64Array, n: number): number[] {
  const p = cols.length + 1;
  // targets[k], k = 1..p: the stored columns, then y.
  const targets: Float64Array[] = [y, ...cols, y];
  const diag: number[] = [];
  // Step 0, the column of ones: Σ 1² = n exactly.
  const alpha0 = -Math.sqrt(n);
  const a0 = 1 - alpha0;
  let vv0 = 0;
  vv0 += a0 * a0;
  for (let i = 1; i < n; i++) vv0 += 1;
  diag.push(alpha0);
  const f0 = dots(null, a0, targets.slice(1), 0, n).map((dot) => (2 * dot) / vv0);
  let norm = updateAndNorm(targets, 0, p, n, f0, null, a0, p === 1);
  for (let j = 1; j < p; j++) {
    const a = targets[j];
    const alpha = a[j] > 0 ? -Math.sqrt(norm) : Math.sqrt(norm);
    a[j] -= alpha;
    let vv = 0;
    for (let i = j; i < n; i++) vv += a[i] * a[i];
    diag.push(alpha);
    const next = j + 1 < p ? targets[j + 1] : null;
    if (vv === 0) {
      norm = 0;
      if (next) for (let i = j + 1; i < n; i++) norm += next[i] * next[i];
      continue;
    }
    const f = dots(a, 0, targets.slice(j + 1), j, n).map((dot) => (2 * dot) / vv);
    norm = updateAndNorm(targets, j, p, n, f, a, 0, j === p - 1);
  }
  // Back substitution: R[j][j] = diag[j], R[j][k] = column k's entry j.
  const beta = new Array<number>(p).fill(0);
  for (let j = p - 1; j >= 0; j--) {
    let s = y[j];
    for (let k = j + 1; k < p; k++) s -= targets[k][j] * beta[k];
    beta[j] = s / diag[j];
  }
  return beta;
}

/**
 * Σ_{i≥j} v_i b_i for each b of `bs` (at most 3), in one pass, each sum in
 * index order; v = `a`, or the column of ones reflected (first entry a0) when a is null.
 */
function dots(a: Float64Array | null, a0: number, bs: Float64Array[], j: number, n: number): number[] {
  const [b1, b2, b3] = bs;
  let d1 = 0;
  let d2 = 0;
  let d3 = 0;
  if (a === null) {
    // Entries of v below the first are 1: v_i·b_i is b_i itself.
    d1 += a0 * b1[0];
    if (bs.length === 1) for (let i = 1; i < n; i++) d1 += b1[i];
    else if (bs.length === 2) {
      d2 += a0 * b2[0];
      for (let i = 1; i < n; i++) {
        d1 += b1[i];
        d2 += b2[i];
      }
    } else {
      d2 += a0 * b2[0];
      d3 += a0 * b3[0];
      for (let i = 1; i < n; i++) {
        d1 += b1[i];
        d2 += b2[i];
        d3 += b3[i];
      }
    }
  } else if (bs.length === 1) for (let i = j; i < n; i++) d1 += a[i] * b1[i];
  else if (bs.length === 2)
    for (let i = j; i < n; i++) {
      d1 += a[i] * b1[i];
      d2 += a[i] * b2[i];
    }
  else
    for (let i = j; i < n; i++) {
      d1 += a[i] * b1[i];
      d2 += a[i] * b2[i];
      d3 += a[i] * b3[i];
    }
  return [d1, d2, d3].slice(0, bs.length);
}

/**
 * Step j's update b ← b − f·v of targets j+1..p (v = `a`, or the column of
 * ones reflected, first entry a0, when a is null) in one pass, returning the
 * next column's Σ_{i>j} b_i² after its update. In the last step only y's
 * first p entries are still read.
 */
function updateAndNorm(targets: Float64Array[], j: number, p: number, n: number, f: number[], a: Float64Array | null, a0: number, last: boolean): number {
  const end = last ? Math.min(n, p) : n;
  const bs = targets.slice(j + 1);
  const [b1, b2, b3] = bs;
  const [f1, f2, f3] = f;
  const m = bs.length;
  // The first entry (v_j = a0 or a[j]).
  const vj = a === null ? a0 : a[j];
  if (end > j) for (let k = 0; k < m; k++) bs[k][j] -= f[k] * vj;
  let norm = 0;
  const withNorm = j + 1 < p;
  if (a === null) {
    // v_i·f is f itself below the first entry.
    if (m === 1) for (let i = 1; i < end; i++) b1[i] -= f1;
    else if (m === 2)
      for (let i = 1; i < end; i++) {
        b1[i] -= f1;
        norm += b1[i] * b1[i];
        b2[i] -= f2;
      }
    else
      for (let i = 1; i < end; i++) {
        b1[i] -= f1;
        norm += b1[i] * b1[i];
        b2[i] -= f2;
        b3[i] -= f3;
      }
  } else if (m === 1) for (let i = j + 1; i < end; i++) b1[i] -= f1 * a[i];
  else
    for (let i = j + 1; i < end; i++) {
      b1[i] -= f1 * a[i];
      norm += b1[i] * b1[i];
      b2[i] -= f2 * a[i];
    }
  // With one target left it is y (no next column) — or, at m > 1, b1 is the next column.
  return withNorm && m > 1 ? norm : 0;
}

/** The side's trend from its columns (u = x/s, u² when the degree asks for them) and outcomes. */
function fitSide(u: Float64Array | null, u2: Float64Array | null, y: Float64Array, n: number, degree: 0 | 1 | 2, s: number): SideTrend {
  if (n === 0) return { intercept: 0, slope: 0, curvature: 0, degree: 0, units: 0 };
  const cols = degree === 2 ? [u!, u2!] : degree === 1 ? [u!] : [];
  const g = householderSolve(cols, y, n);
  return {
    intercept: g[0],
    slope: degree >= 1 ? g[1] / s : 0,
    curvature: degree >= 2 ? g[2] / (s * s) : 0,
    degree,
    units: n,
  };
}

/** What one pass over a side's scores tells its fit: count, largest |x| and distinct scores up to 3. */
class SideScan {
  count = 0;
  reach = 0;
  distinct = 0;
  private first = NaN;
  private second = NaN;
  add(x: number): void {
    this.count++;
    const ax = Math.abs(x);
    if (ax > this.reach) this.reach = ax;
    if (this.distinct < 3 && x !== this.first && x !== this.second) {
      if (this.distinct === 0) this.first = x;
      else if (this.distinct === 1) this.second = x;
      this.distinct++;
    }
  }
  get degree(): 0 | 1 | 2 {
    return Math.max(0, Math.min(2, this.distinct - 1)) as 0 | 1 | 2;
  }
  get scale(): number {
    return this.reach > 0 ? this.reach : 1;
  }
}

/** A side's columns u = x/s and u² (those its degree needs) and outcomes, filled in row order. */
class SideColumns {
  at = 0;
  readonly u: Float64Array | null;
  readonly u2: Float64Array | null;
  readonly y: Float64Array;
  readonly s: number;
  constructor(readonly scan: SideScan) {
    this.u = scan.degree >= 1 ? new Float64Array(scan.count) : null;
    this.u2 = scan.degree >= 2 ? new Float64Array(scan.count) : null;
    this.y = new Float64Array(scan.count);
    this.s = scan.scale;
  }
  add(x: number, y: number): void {
    const k = this.at++;
    if (this.u !== null) {
      const v = x / this.s;
      this.u[k] = v;
      if (this.u2 !== null) this.u2[k] = v * v;
    }
    this.y[k] = y;
  }
  fit(): SideTrend {
    return fitSide(this.u, this.u2, this.y, this.scan.count, this.scan.degree, this.s);
  }
}

/** Ỹ on the rows used (all rows when `rows` is absent), from each side's own quadratic fit. */
export function trendRemoved(score: ArrayLike<number>, outcome: ArrayLike<number>, cutoff: number, rows?: Int32Array): TrendRemoved {
  const total = rows ? rows.length : score.length;
  const scanBelow = new SideScan();
  const scanAbove = new SideScan();
  for (let t = 0; t < total; t++) {
    const x = score[rows ? rows[t] : t] - cutoff;
    if (x >= 0) scanAbove.add(x);
    else scanBelow.add(x);
  }
  const colsBelow = new SideColumns(scanBelow);
  const colsAbove = new SideColumns(scanAbove);
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    const x = score[i] - cutoff;
    if (x >= 0) colsAbove.add(x, outcome[i]);
    else colsBelow.add(x, outcome[i]);
  }
  const below = colsBelow.fit();
  const above = colsAbove.fit();
  const values = rows ? Float64Array.from(outcome as ArrayLike<number>) : new Float64Array(outcome.length);
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    const x = score[i] - cutoff;
    const f = x >= 0 ? above : below;
    values[i] = outcome[i] - (f.slope * x + f.curvature * x * x);
  }
  // On a score handle the test reads Ỹ in sorted order: computed so from the sorted score and outcome (the same operations per unit).
  const sorted = rows ? undefined : gatheredColumns(score, [score, outcome]);
  if (sorted) {
    const [r, y] = sorted;
    const copy = new Float64Array(r.length);
    for (let t = 0; t < r.length; t++) {
      const x = r[t] - cutoff;
      const f = x >= 0 ? above : below;
      copy[t] = y[t] - (f.slope * x + f.curvature * x * x);
    }
    keepGathered(score, values, copy);
  }
  return { values, below, above };
}
