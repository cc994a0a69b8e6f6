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

/** Least squares of y on the columns of a (n × p, column arrays, modified in place) by Householder QR. */
function householderSolve(cols: Float64Array[], y: Float64Array): number[] {
  const p = cols.length;
  const n = y.length;
  const diag: number[] = [];
  const targets = [...cols, y];
  for (let j = 0; j < p; j++) {
    const a = cols[j];
    let norm = 0;
    for (let i = j; i < n; i++) norm += a[i] * a[i];
    norm = Math.sqrt(norm);
    const alpha = a[j] > 0 ? -norm : norm;
    // v = a[j:] − alpha e₁, stored in a[j:]; H = I − 2vv'/v'v applied to the later columns and y.
    a[j] -= alpha;
    let vv = 0;
    for (let i = j; i < n; i++) vv += a[i] * a[i];
    diag.push(alpha);
    if (vv === 0) continue;
    for (let k = j + 1; k <= p; k++) {
      const b = targets[k];
      let dot = 0;
      for (let i = j; i < n; i++) dot += a[i] * b[i];
      const f = (2 * dot) / vv;
      for (let i = j; i < n; i++) b[i] -= f * a[i];
    }
  }
  // Back substitution: R[j][j] = diag[j], R[j][k] = cols[k][j].
  const beta = new Array<number>(p).fill(0);
  for (let j = p - 1; j >= 0; j--) {
    let s = y[j];
    for (let k = j + 1; k < p; k++) s -= cols[k][j] * beta[k];
    beta[j] = s / diag[j];
  }
  return beta;
}

/** Number of distinct values in x, counted up to 3 (all the fit needs to know). */
function distinctUpTo3(x: Float64Array): number {
  if (x.length === 0) return 0;
  const a = x[0];
  let b = NaN;
  for (let t = 1; t < x.length; t++) {
    const v = x[t];
    if (v === a || v === b) continue;
    if (b !== b) b = v;
    else return 3;
  }
  return b !== b ? 1 : 2;
}

function fitSide(x: Float64Array, y: Float64Array): SideTrend {
  const n = x.length;
  if (n === 0) return { intercept: 0, slope: 0, curvature: 0, degree: 0, units: 0 };
  const degree = Math.min(2, distinctUpTo3(x) - 1) as 0 | 1 | 2;
  let s = 0;
  for (let t = 0; t < n; t++) s = Math.max(s, Math.abs(x[t]));
  if (!(s > 0)) s = 1;
  // Explicit loops: Float64Array.from walks an iterator, many times slower on a million rows.
  const cols: Float64Array[] = [new Float64Array(n).fill(1)];
  if (degree >= 1) {
    const u = new Float64Array(n);
    for (let t = 0; t < n; t++) u[t] = x[t] / s;
    cols.push(u);
  }
  if (degree >= 2) {
    const u = cols[1];
    const u2 = new Float64Array(n);
    for (let t = 0; t < n; t++) u2[t] = u[t] * u[t];
    cols.push(u2);
  }
  const g = householderSolve(cols, y.slice());
  return {
    intercept: g[0],
    slope: degree >= 1 ? g[1] / s : 0,
    curvature: degree >= 2 ? g[2] / (s * s) : 0,
    degree,
    units: n,
  };
}

/** Ỹ on the rows used (all rows when `rows` is absent), from each side's own quadratic fit. */
export function trendRemoved(score: ArrayLike<number>, outcome: ArrayLike<number>, cutoff: number, rows?: Int32Array): TrendRemoved {
  const total = rows ? rows.length : score.length;
  let na = 0;
  for (let t = 0; t < total; t++) if (score[rows ? rows[t] : t] - cutoff >= 0) na++;
  const xs = [new Float64Array(total - na), new Float64Array(na)];
  const ys = [new Float64Array(total - na), new Float64Array(na)];
  const at = [0, 0];
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    const x = score[i] - cutoff;
    const side = x >= 0 ? 1 : 0;
    xs[side][at[side]] = x;
    ys[side][at[side]++] = outcome[i];
  }
  const below = fitSide(xs[0], ys[0]);
  const above = fitSide(xs[1], ys[1]);
  const values = new Float64Array(outcome.length);
  for (let i = 0; i < values.length; i++) values[i] = outcome[i];
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    const x = score[i] - cutoff;
    const f = x >= 0 ? above : below;
    values[i] = outcome[i] - (f.slope * x + f.curvature * x * x);
  }
  return { values, below, above };
}
