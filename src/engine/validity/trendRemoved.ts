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
 * (fit/polyFit.ts) on the moments of v = (x − x̄)/max|x − x̄|, centred and
 * scaled on the side, so that scores far from the cutoff or in large units
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
import { polyCoefficients, polyFrame, polyInverse, polyMoments } from '../fit';

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
 * by the engine's polynomial fit on the moments of v = (x − x̄)/max|x − x̄|
 * (fit/polyFit.ts), the coefficients brought back to x = 0. Should the
 * normal equations still be singular at that degree (scores bunched far
 * tighter than their distance from the mean), the next lower degree is fitted.
 */
function fitSide(x: Float64Array, y: Float64Array, distinct: number): SideTrend {
  const n = x.length;
  if (n === 0) return { intercept: 0, slope: 0, curvature: 0, degree: 0, units: 0 };
  const frame = polyFrame(x);
  const mom = polyMoments(x, 2, frame, { y });
  let degree = Math.max(0, Math.min(2, distinct - 1));
  let inv = polyInverse(mom, degree);
  while (!inv && degree > 0) inv = polyInverse(mom, --degree);
  // At degree 0, Γ = [n] with n > 0: never singular.
  const b = polyCoefficients(inv!, mom.cross!, frame, degree);
  return { intercept: b[0], slope: degree >= 1 ? b[1] : 0, curvature: degree >= 2 ? b[2] : 0, degree: degree as 0 | 1 | 2, units: n };
}

/** Ỹ on the rows used (all rows when `rows` is absent), from each side's own quadratic fit. */
export function trendRemoved(score: ArrayLike<number>, outcome: ArrayLike<number>, cutoff: number, rows?: Int32Array): TrendRemoved {
  const total = rows ? rows.length : score.length;
  // One pass in row order writes each side's x and Y into one buffer (above from the front,
  // below from the back) and counts each side's distinct scores up to 3.
  const xs = new Float64Array(total);
  const ys = new Float64Array(total);
  let na = 0;
  let nb = total;
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
  const above = fitSide(xs.subarray(0, na), ys.subarray(0, na), da);
  const below = fitSide(xs.subarray(nb), ys.subarray(nb), db);
  const [sa, ca, sb, cb] = [above.slope, above.curvature, below.slope, below.curvature];
  const values = rows ? Float64Array.from(outcome as ArrayLike<number>) : new Float64Array(outcome.length);
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    const x = score[i] - cutoff;
    values[i] = outcome[i] - (x >= 0 ? sa * x + ca * x * x : sb * x + cb * x * x);
  }
  // On a score handle the test reads Ỹ in sorted order: computed so from the sorted score and outcome (the same operations per unit).
  const sorted = rows ? undefined : gatheredColumns(score, [score, outcome]);
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
