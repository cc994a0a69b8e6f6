/**
 * Where to show the implied complier distributions of a check (docs/methods.md §5):
 * the distinct window outcomes when they are few (binary, counts, scales),
 * else the quantiles 2%, 6%, …, 98% of the window outcomes (25 points; type 1,
 * an outcome value each). Cutline's choice: a grid that follows the data, so
 * a decreasing stretch of an implied CDF is seen where the units are.
 */
import { boundaryWindow } from '../fit/boundaryWindow';
import { KernelName } from '../fit/kernels';
import { gathered } from '../fit/residuals';

export const COMPLIER_GRID_POINTS = 25;

export function complierGrid(score: ArrayLike<number>, outcome: ArrayLike<number>, cutoff: number, bandwidth: number, kernel: KernelName): number[] {
  const win = boundaryWindow(score, cutoff, bandwidth, kernel, { quadratic: false });
  const ys = new Float64Array(win.above.index.length + win.below.index.length);
  let u = 0;
  for (const side of [win.above, win.below]) {
    ys.set(gathered(side, outcome), u);
    u += side.index.length;
  }
  ys.sort();
  const distinct: number[] = [];
  for (let t = 0; t < ys.length && distinct.length <= COMPLIER_GRID_POINTS; t++) if (t === 0 || ys[t] !== ys[t - 1]) distinct.push(ys[t]);
  if (distinct.length <= COMPLIER_GRID_POINTS) return distinct;
  const out: number[] = [];
  for (let k = 0; k < COMPLIER_GRID_POINTS; k++) {
    const p = (2 + 4 * k) / 100;
    const v = ys[Math.min(ys.length - 1, Math.ceil(p * ys.length) - 1)];
    if (out.length === 0 || v !== out[out.length - 1]) out.push(v);
  }
  return out;
}
