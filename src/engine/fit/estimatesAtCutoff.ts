/**
 * The estimates of one outcome at the cutoff on a common window: take-up jump
 * (first stage), the outcome's jump, and the complier effect, with the
 * warnings of docs/methods.md §2.6 that belong to them.
 */
import { boundaryWindow, Window } from './boundaryWindow';
import { Estimate } from './estimate';
import { effectFrom, jumpFrom } from './jumpAt';
import { KernelName } from './kernels';
import { VarianceName } from './residuals';
import { smoothJump, SmoothedJump } from './smoothJump';

export interface CutoffEstimates {
  smoothedTakeup: SmoothedJump;
  window: Window;
  counts: { below: number; above: number };
  takeup: Estimate;
  jump: Estimate;
  effect: Estimate;
  warnings: string[];
}

export const SMALL_SIDE = 50;
export const FEW_SCORES = 10;

/** Warnings about the window itself: few units or few distinct scores on a side. */
export function windowWarnings(win: Window): string[] {
  const out: string[] = [];
  for (const side of [win.below, win.above]) {
    const where = side.above ? 'above' : 'below';
    if (side.index.length < SMALL_SIDE) {
      out.push(`only ${side.index.length} units ${where} the cutoff inside the bandwidth: estimates rest on few units`);
    }
    if (side.distinct < FEW_SCORES) {
      out.push(
        `the window holds only ${side.distinct} distinct scores ${where} the cutoff: with a discrete score the local fit extrapolates between mass points`,
      );
    }
  }
  return out;
}

export function estimatesAtCutoff(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  opts: { bandwidth: number; kernel: KernelName; variance: VarianceName; clusters?: Int32Array; sign: 1 | -1; level?: number; window?: Window; takeup?: SmoothedJump },
): CutoffEstimates {
  const win = opts.window ?? boundaryWindow(score, cutoff, opts.bandwidth, opts.kernel);
  const jo = { variance: opts.variance, clusters: opts.clusters, sign: opts.sign, level: opts.level };
  const d = opts.takeup ?? smoothJump(win, treated, opts.variance, opts.sign);
  const y = outcome === treated ? d : smoothJump(win, outcome, opts.variance, opts.sign);
  const takeup = jumpFrom(win, d, jo);
  const warnings = windowWarnings(win);
  if (takeup.ci_robust[0] <= 0 && takeup.ci_robust[1] >= 0) {
    warnings.push(
      'weak first stage: the confidence interval of the take-up jump covers 0, so the complier effect (a ratio with that jump below the line) is not meaningful; the numbers are shown for completeness',
    );
  }
  return {
    smoothedTakeup: d,
    window: win,
    counts: { below: win.below.index.length, above: win.above.index.length },
    takeup,
    jump: jumpFrom(win, y, jo),
    effect: effectFrom(win, y, d, jo),
    warnings,
  };
}
