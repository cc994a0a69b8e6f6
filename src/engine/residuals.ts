/**
 * Per-unit residual terms e_i of one side of the window, such that the
 * variance of a smoother Σ w_i V_i is Σ w_i² e_i² (METHODS.md §2):
 *
 * - `hc0`, `cluster`: e_i = V_i − fitted value of the side's fit (degree 1 for
 *   the estimate, degree 2 for the bias-corrected one).
 * - `hc1`: hc0 times sqrt(n_s/(n_s − q)), q the fit's parameter count (2 for
 *   the line, as METHODS.md states; 3 for the quadratic, Cutline's choice).
 * - `nn`: sqrt(J/(J+1))·(V_i − mean of V over the J = 3 nearest neighbours by
 *   score on the same side), Calonico, Cattaneo & Titiunik (2014, §3 and
 *   supplement). Units are sorted by score; a neighbour tie in distance goes
 *   to the unit on the left (lower score), Cutline's deterministic choice.
 */
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
const gatherCache = new WeakMap<SortedSide, WeakMap<object, Float64Array>>();

/** values[index[t]] for the side's units, computed once per side and column. */
export function gathered(side: SortedSide, values: ArrayLike<number>): Float64Array {
  let bySide = gatherCache.get(side);
  if (!bySide) {
    bySide = new WeakMap();
    gatherCache.set(side, bySide);
  }
  let v = bySide.get(values as object);
  if (!v) {
    v = valuesAt(side.index, values);
    bySide.set(values as object, v);
  }
  return v;
}

// nn residuals depend on the side and the column only; a check asks for the
// same ones several times (pilots, estimates). Callers never write to them.
const nnCache = new WeakMap<SortedSide, WeakMap<object, Float64Array>>();

/** Nearest-neighbour residuals (J = 3) of V on one side. */
export function nnResiduals(side: SortedSide, values: ArrayLike<number>, J = NN_NEIGHBOURS): Float64Array {
  if (J !== NN_NEIGHBOURS) return computeNn(side, values, J);
  let bySide = nnCache.get(side);
  if (!bySide) {
    bySide = new WeakMap();
    nnCache.set(side, bySide);
  }
  let e = bySide.get(values as object);
  if (!e) {
    e = computeNn(side, values, J);
    bySide.set(values as object, e);
  }
  return e;
}

function computeNn(side: SortedSide, values: ArrayLike<number>, J: number): Float64Array {
  const { index, x } = side;
  const n = index.length;
  const v = gathered(side, values);
  const e = new Float64Array(n);
  const jj = Math.min(J, n - 1);
  const scale = Math.sqrt(jj / (jj + 1));
  for (let t = 0; t < n; t++) {
    let l = t - 1;
    let r = t + 1;
    let sum = 0;
    const xt = x[t];
    for (let c = 0; c < jj; c++) {
      // Take the left neighbour when it is at least as close (ties go left).
      if (r >= n || (l >= 0 && xt - x[l] <= x[r] - xt)) sum += v[l--];
      else sum += v[r++];
    }
    e[t] = scale * (v[t] - sum / jj);
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
