/**
 * The local linear fit lines of docs/methods.md §2 over the window, for the binned
 * plot (§8): on each side the intercept â_s (the fit at the cutoff) and slope
 * b̂_s of V on R − c with kernel weights, from the same smoother weights as
 * every jump (boundaryWindow.ts). The line of a side is â + b̂·(R − c) for R
 * from c to c ± bandwidth.
 *
 * @example fitLine(score, bill, 60, 8, 'triangular').above.intercept
 */
import { applyWeights, sideFit, KernelName } from '../fit';

export interface FitLineSide {
  intercept: number;
  slope: number;
  /** Score range the line is drawn over: the side's window. */
  from: number;
  to: number;
}

export function fitLine(
  score: ArrayLike<number>,
  values: ArrayLike<number>,
  cutoff: number,
  bandwidth: number,
  kernel: KernelName = 'triangular',
  rows?: Int32Array,
): { above: FitLineSide; below: FitLineSide } {
  const side = (above: boolean): FitLineSide => {
    const f = sideFit(score, cutoff, bandwidth, kernel, above, false, rows);
    return {
      intercept: applyWeights(f.coef1[0], f.index, values),
      slope: applyWeights(f.coef1[1], f.index, values),
      from: above ? cutoff : cutoff - bandwidth,
      to: above ? cutoff + bandwidth : cutoff,
    };
  };
  return { above: side(true), below: side(false) };
}
