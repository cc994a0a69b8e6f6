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
 * eligible side; the least squares are the engine's polynomial fit
 * (fit/polyFit.ts) on the moments of the side's score centred at the middle
 * of its range and scaled by its half-width, so that scores far from the cutoff or in large units
 * do not spoil the normal equations; a side with fewer
 * than 3 distinct scores is fitted with the highest degree its scores
 * identify (2 distinct → a line, 1 → nothing removed) and says so in `degree`.
 *
 * @example
 *   const t = trendRemoved(score, bill, 60);
 *   t.values[i]; // bill[i] − (β̂₁(score[i] − 60) + β̂₂(score[i] − 60)²)
 *   t.above.slope; t.above.curvature; // β̂₁, β̂₂ above the cutoff
 */

import { gatheredColumns, keepGathered } from '../data';
import { polyCoefficients, polyInverse, polyMoments } from '../fit';

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
 * One side's quadratic (or the highest degree its `distinct` scores identify)
 * by the engine's polynomial fit (fit/polyFit.ts) on the moments of
 * v = (s − mid)/half-range, s the side's scores (`s` holds R − c, origin 0, or
 * R itself, origin c), the coefficients brought back to x = R − c = 0. Should
 * the normal equations still be singular at that degree (scores bunched far
 * tighter than their spread), the next lower degree is fitted.
 */
function fitSide(s: Float64Array, y: Float64Array, distinct: number, origin: number): SideTrend {
  const n = s.length;
  if (n === 0) return { intercept: 0, slope: 0, curvature: 0, degree: 0, units: 0 };
  let lo = s[0];
  let hi = s[0];
  for (let i = 1; i < n; i++) {
    const v = s[i];
    if (v < lo) lo = v;
    else if (v > hi) hi = v;
  }
  // Centred at the middle of the side's range and scaled by its half-width: |v| ≤ 1.
  const frame = { centre: lo + (hi - lo) / 2, scale: hi > lo ? (hi - lo) / 2 : 1 };
  const mom = polyMoments(s, 2, frame, { y });
  let degree = Math.max(0, Math.min(2, distinct - 1));
  let inv = polyInverse(mom, degree);
  while (!inv && degree > 0) inv = polyInverse(mom, --degree);
  // At degree 0, Γ = [n] with n > 0: never singular.
  const b = polyCoefficients(inv!, mom.cross!, frame, degree, origin);
  return { intercept: b[0], slope: degree >= 1 ? b[1] : 0, curvature: degree >= 2 ? b[2] : 0, degree: degree as 0 | 1 | 2, units: n };
}

/** Distinct values (counted up to 3) of an ascending array. */
function distinctSorted(r: Float64Array): number {
  let d = r.length > 0 ? 1 : 0;
  for (let t = 1; t < r.length && d < 3; t++) if (r[t] !== r[t - 1]) d++;
  return d;
}

/** Each side's trend from the rows used, in row order: one pass writes each side's x and Y (above from the front of one buffer, below from its back). */
function fitRows(score: ArrayLike<number>, outcome: ArrayLike<number>, cutoff: number, rows?: Int32Array): { below: SideTrend; above: SideTrend } {
  const total = rows ? rows.length : score.length;
  const xs = new Float64Array(total);
  const ys = new Float64Array(total);
  let na = 0;
  let nb = total;
  // Distinct scores per side, counted up to 3.
  let a1 = NaN;
  let a2 = NaN;
  let da = 0;
  let b1 = NaN;
  let b2 = NaN;
  let db = 0;
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    const x = score[i] - cutoff;
    if (x >= 0) {
      xs[na] = x;
      ys[na++] = outcome[i];
      if (da < 3 && x !== a1 && x !== a2) {
        if (da === 0) a1 = x;
        else if (da === 1) a2 = x;
        da++;
      }
    } else {
      xs[--nb] = x;
      ys[nb] = outcome[i];
      if (db < 3 && x !== b1 && x !== b2) {
        if (db === 0) b1 = x;
        else if (db === 1) b2 = x;
        db++;
      }
    }
  }
  return { above: fitSide(xs.subarray(0, na), ys.subarray(0, na), da, 0), below: fitSide(xs.subarray(nb), ys.subarray(nb), db, 0) };
}

/** Ỹ on the rows used (all rows when `rows` is absent), from each side's own quadratic fit. */
export function trendRemoved(score: ArrayLike<number>, outcome: ArrayLike<number>, cutoff: number, rows?: Int32Array): TrendRemoved {
  // On a score handle (all rows) the sides are the two runs of the sorted score and outcome: no gathering pass.
  const sorted = rows ? undefined : gatheredColumns(score, [score, outcome]);
  let fits: { below: SideTrend; above: SideTrend };
  if (sorted) {
    const [r, y] = sorted;
    let c0 = 0;
    let hi = r.length;
    while (c0 < hi) {
      const mid = (c0 + hi) >>> 1;
      if (r[mid] - cutoff >= 0) hi = mid;
      else c0 = mid + 1;
    }
    const below = r.subarray(0, c0);
    const above = r.subarray(c0);
    fits = {
      below: fitSide(below, y.subarray(0, c0), distinctSorted(below), cutoff),
      above: fitSide(above, y.subarray(c0), distinctSorted(above), cutoff),
    };
  } else fits = fitRows(score, outcome, cutoff, rows);
  const { below, above } = fits;
  const [sa, ca, sb, cb] = [above.slope, above.curvature, below.slope, below.curvature];
  const total = rows ? rows.length : score.length;
  const values = rows ? Float64Array.from(outcome as ArrayLike<number>) : new Float64Array(outcome.length);
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    const x = score[i] - cutoff;
    values[i] = outcome[i] - (x >= 0 ? sa * x + ca * x * x : sb * x + cb * x * x);
  }
  // The test reads Ỹ in sorted order: computed so from the sorted score and outcome (the same operations per unit).
  if (sorted) {
    const [r, y] = sorted;
    const copy = new Float64Array(r.length);
    for (let t = 0; t < r.length; t++) {
      const x = r[t] - cutoff;
      copy[t] = y[t] - (x >= 0 ? sa * x + ca * x * x : sb * x + cb * x * x);
    }
    keepGathered(score, values, copy);
  }
  return { values, below, above };
}
