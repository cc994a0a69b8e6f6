/**
 * Where to show the implied complier distributions of a check (docs/methods.md §5):
 * the distinct window outcomes when they are few (binary, counts, scales),
 * else the quantiles 2%, 6%, …, 98% of the window outcomes (25 points; type 1,
 * an outcome value each). Cutline's choice: a grid that follows the data, so
 * a decreasing stretch of an implied CDF is seen where the units are.
 */
import { boundaryWindow, KernelName, windowValues } from '../fit';
import { orderStatistics } from '../numeric';

export const COMPLIER_GRID_POINTS = 25;

export function complierGrid(score: ArrayLike<number>, outcome: ArrayLike<number>, cutoff: number, bandwidth: number, kernel: KernelName): number[] {
  const win = boundaryWindow(score, cutoff, bandwidth, kernel, { quadratic: false });
  const ys = windowValues(win, outcome);
  // At most 25 distinct outcomes (binary, counts, scales): show them all, sorted.
  const seen = new Set<number>();
  for (let t = 0; t < ys.length && seen.size <= COMPLIER_GRID_POINTS; t++) seen.add(ys[t]);
  if (seen.size <= COMPLIER_GRID_POINTS) return [...seen].sort((a, b) => a - b);
  // Else the type-1 quantiles: order statistics found without sorting the window (numeric/orderStatistics.ts).
  const ranks = Array.from({ length: COMPLIER_GRID_POINTS }, (_, k) => Math.min(ys.length - 1, Math.ceil(((2 + 4 * k) / 100) * ys.length) - 1));
  const values = orderStatistics(ys, ranks);
  const out: number[] = [];
  for (const v of values) if (out.length === 0 || v !== out[out.length - 1]) out.push(v);
  return out;
}
