/**
 * Per-unit residual terms e_i of one side of the window, such that the
 * variance of a smoother Σ w_i V_i is Σ w_i² e_i² (docs/methods.md §2.3):
 *
 * - `hc0`, `cluster`: e_i = V_i − fitted value of the side's fit (degree 1 for
 *   the estimate, degree 2 for the bias-corrected one).
 * - `hc1`: hc0 times sqrt(n_s/(n_s − q)), q the fit's parameter count (2 for
 *   the line, the usual degrees-of-freedom factor; 3 for the quadratic, Cutline's choice).
 * - `neighbours`: sqrt(J_i/(J_i+1))·(V_i − mean of V over the nearest neighbours by
 *   score on the same side of the window), Calonico, Cattaneo & Titiunik
 *   (2014, §3 and supplement): the J = 3 nearest, and every further unit at
 *   the same distance as the 3rd up to 1e-12 relative (J_i ≥ 3 counts them). Taking all the ties
 *   makes the residuals a function of the data, not of the order of the rows
 *   (a score with mass points would otherwise let the row order pick among
 *   tied units); Cutline's reading, recalled from memory as the supplement's.
 */
import { valuesAt } from '../data';
import { dot } from '../numeric';
import { applyWeights, SideFit, SortedSide } from './boundaryWindow';

export type VarianceName = 'hc0' | 'hc1' | 'neighbours' | 'cluster';
export const VARIANCE_NAMES: readonly VarianceName[] = ['hc0', 'hc1', 'neighbours', 'cluster'];

export const NEIGHBOURS = 3;

/** Residuals of the side's least-squares fit of V, degree 1 or 2. */
export function fitResiduals(side: SideFit, values: ArrayLike<number>, degree: 1 | 2): Float64Array {
  const coefs = degree === 1 ? side.coef1 : side.coef2;
  if (!coefs) throw new Error('quadratic weights were not computed for this window');
  const { index, x } = side;
  const n = index.length;
  const b = coefs.map((w) => applyWeights(w, index, values));
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

/** values[index[t]] for the side's units, gathered once per side and column (remembered by the side). */
export function gathered(side: SortedSide, values: ArrayLike<number>): Float64Array {
  const memo = side.memo?.gathered;
  let v = memo?.get(values as object);
  if (!v) {
    v = valuesAt(side.index, values, side.memo?.view);
    memo?.set(values as object, v);
  }
  return v;
}

/** The side's local linear intercept of V, Σ ω·V, read from the side's gathered column in window order. */
export function sideIntercept(side: SideFit, values: ArrayLike<number>): number {
  return dot(side.coef1[0], gathered(side, values));
}

/** Nearest-neighbour residuals (J = 3) of V on one side; the side remembers them (pilots and estimates ask twice). */
export function neighbourResiduals(side: SortedSide, values: ArrayLike<number>, J = NEIGHBOURS): Float64Array {
  const memo = J === NEIGHBOURS ? side.memo?.residuals : undefined;
  let e = memo?.get(values as object);
  if (!e) {
    e = computeNeighbourResiduals(side, values, J);
    memo?.set(values as object, e);
  }
  return e;
}

/**
 * The neighbour set of a unit depends only on its score, so the work is done
 * per distinct score: units with one score form a group (count, sum of V);
 * for each group the J-th smallest distance to the other units is found by
 * walking outwards over groups (each holds at least one unit, so at most J
 * groups are visited), every group within that distance (up to 1e-12
 * relative) is found by walking on from there, and the neighbour mean of each unit is
 * (sum of those groups − its own V)/(their count − 1). The cost is O(n) plus
 * O(J) per distinct score, whatever the ties: the earlier unit-by-unit
 * walk cost n × (size of the largest tie group). Sums within a group are
 * compensated (Neumaier) so that a large group's sum minus one value keeps
 * the precision of a direct sum. The groups and their neighbour runs depend
 * on the scores alone, so a side finds them once for all its columns.
 */
function computeNeighbourResiduals(side: SortedSide, values: ArrayLike<number>, J: number): Float64Array {
  const n = side.x.length;
  const v = gathered(side, values);
  const e = new Float64Array(n);
  if (Math.min(J, n - 1) <= 0) return e;
  // Which groups are each group's neighbours depends on the scores alone: found once per side (and J).
  const memo = side.memo;
  let nb = memo?.neighbours;
  if (!nb || nb.J !== J) {
    nb = neighbourGroups(side.x, J);
    if (memo) memo.neighbours = nb;
  }
  const { start, first, last, G } = nb;
  // Each group's compensated sum of V.
  const sums = new Float64Array(G);
  for (let g = 0; g < G; g++) {
    let s = 0;
    let comp = 0;
    for (let u = start[g]; u < start[g + 1]; u++) {
      const a = v[u];
      const y = s + a;
      comp += Math.abs(s) >= Math.abs(a) ? s - y + a : a - y + s;
      s = y;
    }
    sums[g] = s + comp;
  }
  for (let g = 0; g < G; g++) {
    const lo = first[g];
    const hi = last[g];
    let total = 0;
    for (let k = lo; k <= hi; k++) total += sums[k];
    const count = start[hi + 1] - start[lo] - 1;
    const f = Math.sqrt(count / (count + 1));
    for (let t = start[g]; t < start[g + 1]; t++) e[t] = f * (v[t] - (total - v[t]) / count);
  }
  return e;
}

/** A side's groups of equal scores and, for each, the run of groups that holds its neighbours. */
export interface NeighbourGroups {
  J: number;
  G: number;
  /** Group g holds units start[g]..start[g+1]−1 (x is sorted). */
  start: Int32Array;
  /** The neighbours of group g's units are in groups first[g]..last[g] (g's other units included). */
  first: Int32Array;
  last: Int32Array;
}

function neighbourGroups(x: Float64Array, J: number): NeighbourGroups {
  const n = x.length;
  const jj = Math.min(J, n - 1);
  const start = new Int32Array(n + 1);
  let G = 0;
  for (let t = 0; t < n; ) {
    let u = t + 1;
    while (u < n && x[u] === x[t]) u++;
    start[G++] = t;
    t = u;
  }
  start[G] = n;
  // Each group's score (x is sorted, so these ascend).
  const gx = new Float64Array(G);
  for (let g = 0; g < G; g++) gx[g] = x[start[g]];
  const first = new Int32Array(G);
  const last = new Int32Array(G);
  for (let g = 0; g < G; g++) {
    const xg = gx[g];
    // The jj-th smallest distance from a unit of group g to the others.
    let need = jj - (start[g + 1] - start[g] - 1);
    let far = 0;
    let l = g - 1;
    let r = g + 1;
    while (need > 0) {
      // The closer of the next group on the left and on the right (left on a tie, as both are taken below).
      if (r >= G || (l >= 0 && xg - gx[l] <= gx[r] - xg)) {
        far = xg - gx[l];
        need -= start[l + 1] - start[l];
        l--;
      } else {
        far = gx[r] - xg;
        need -= start[r + 1] - start[r];
        r++;
      }
    }
    // Every group as far as the jj-th neighbour, up to rounding (1e-12 relative:
    // equal spacings of a grid differ in their last bits, and the choice must
    // not depend on the score's scale). The groups walked over are within it;
    // the search goes on outwards from them (distances grow monotonically).
    const reach = far + far * 1e-12;
    let lo = l + 1;
    while (lo > 0 && xg - gx[lo - 1] <= reach) lo--;
    let hi = r - 1;
    while (hi < G - 1 && gx[hi + 1] - xg <= reach) hi++;
    first[g] = lo;
    last[g] = hi;
  }
  return { J, G, start, first, last };
}

/** The e_i of the chosen variance for V on one side. */
export function sideResiduals(
  side: SideFit,
  values: ArrayLike<number>,
  variance: VarianceName,
  degree: 1 | 2,
): Float64Array {
  if (variance === 'neighbours') return neighbourResiduals(side, values);
  const e = fitResiduals(side, values, degree);
  if (variance === 'hc1') {
    const n = e.length;
    const q = degree + 1;
    const f = n > q ? Math.sqrt(n / (n - q)) : 1;
    for (let t = 0; t < n; t++) e[t] *= f;
  }
  return e;
}
