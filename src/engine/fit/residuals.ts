/**
 * Per-unit residual terms e_i of one side of the window, such that the
 * variance of a smoother Σ w_i V_i is Σ w_i² e_i² (docs/methods.md §2.3):
 *
 * - `hc0`, `cluster`: e_i = V_i − fitted value of the side's fit (degree 1 for
 *   the estimate, degree 2 for the bias-corrected one).
 * - `hc1`: hc0 times sqrt(n_s/(n_s − q)), q the fit's parameter count (2 for
 *   the line, the usual degrees-of-freedom factor; 3 for the quadratic, Cutline's choice).
 * - `nn`: sqrt(J_i/(J_i+1))·(V_i − mean of V over the nearest neighbours by
 *   score on the same side of the window), Calonico, Cattaneo & Titiunik
 *   (2014, §3 and supplement): the J = 3 nearest, and every further unit at
 *   the same distance as the 3rd up to 1e-12 relative (J_i ≥ 3 counts them). Taking all the ties
 *   makes the residuals a function of the data, not of the order of the rows
 *   (a score with mass points would otherwise let the row order pick among
 *   tied units); Cutline's reading, recalled from memory as the supplement's.
 */
import { rememberedFor } from '../data/memo';
import { SideFit, SortedSide, valuesAt } from './boundaryWindow';

export type VarianceName = 'hc0' | 'hc1' | 'nn' | 'cluster';
export const VARIANCE_NAMES: readonly VarianceName[] = ['hc0', 'hc1', 'nn', 'cluster'];

export const NN_NEIGHBOURS = 3;

/** Residuals of the side's least-squares fit of V, degree 1 or 2. */
export function fitResiduals(side: SideFit, values: ArrayLike<number>, degree: 1 | 2): Float64Array {
  const coefs = degree === 1 ? side.coef1 : side.coef2;
  if (!coefs) throw new Error('quadratic weights were not computed for this window');
  const { index, x } = side;
  const n = index.length;
  const b = coefs.map((w) => {
    let s = 0;
    for (let t = 0; t < n; t++) s += w[t] * values[index[t]];
    return s;
  });
  const e = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    let fitted = 0;
    let pw = 1;
    for (let j = 0; j < b.length; j++) {
      fitted += b[j] * pw;
      pw *= x[t];
    }
    e[t] = values[index[t]] - fitted;
  }
  return e;
}

// A column's values at a side's units, in the side's order: every pass over a
// window reads them, and the gather from the data order is the slow part.
const gatherCache = new WeakMap<object, WeakMap<object, Float64Array>>();

/** values[index[t]] for the side's units, computed once per side and column. */
export function gathered(side: SortedSide, values: ArrayLike<number>): Float64Array {
  return rememberedFor(gatherCache, side, values as object, () => valuesAt(side.index, values));
}

// nn residuals depend on the side and the column only; a check asks for the
// same ones several times (pilots, estimates). Callers never write to them.
const nnCache = new WeakMap<object, WeakMap<object, Float64Array>>();

/** Nearest-neighbour residuals (J = 3) of V on one side. */
export function nnResiduals(side: SortedSide, values: ArrayLike<number>, J = NN_NEIGHBOURS): Float64Array {
  if (J !== NN_NEIGHBOURS) return computeNn(side, values, J);
  return rememberedFor(nnCache, side, values as object, () => computeNn(side, values, J));
}

function computeNn(side: SortedSide, values: ArrayLike<number>, J: number): Float64Array {
  const { index, x } = side;
  const n = index.length;
  const v = gathered(side, values);
  const e = new Float64Array(n);
  const jj = Math.min(J, n - 1);
  for (let t = 0; t < n; t++) {
    let l = t - 1;
    let r = t + 1;
    let sum = 0;
    let count = 0;
    let last = 0;
    const xt = x[t];
    for (let c = 0; c < jj; c++) {
      // The closer of the next unit on the left and on the right (the order of equals does not matter: all ties are taken below).
      if (r >= n || (l >= 0 && xt - x[l] <= x[r] - xt)) {
        last = xt - x[l];
        sum += v[l--];
      } else {
        last = x[r] - xt;
        sum += v[r++];
      }
      count++;
    }
    // Every further unit as far as the J-th neighbour, up to rounding (1e-12
    // relative: equal spacings of a grid differ in their last bits, and the
    // choice must not depend on the score's scale).
    const reach = last + last * 1e-12;
    while (l >= 0 && xt - x[l] <= reach) {
      sum += v[l--];
      count++;
    }
    while (r < n && x[r] - xt <= reach) {
      sum += v[r++];
      count++;
    }
    e[t] = count > 0 ? Math.sqrt(count / (count + 1)) * (v[t] - sum / count) : 0;
  }
  return e;
}

/** The e_i of the chosen variance for V on one side. */
export function sideResiduals(
  side: SideFit,
  values: ArrayLike<number>,
  variance: VarianceName,
  degree: 1 | 2,
): Float64Array {
  if (variance === 'nn') return nnResiduals(side, values);
  const e = fitResiduals(side, values, degree);
  if (variance === 'hc1') {
    const n = e.length;
    const q = degree + 1;
    const f = n > q ? Math.sqrt(n / (n - q)) : 1;
    for (let t = 0; t < n; t++) e[t] *= f;
  }
  return e;
}
