/**
 * Bandwidth by rule (METHODS.md §3): `mse` (default), `ik`, `cer` =
 * mse·n^(−1/20) (Calonico, Cattaneo & Farrell 2020, for local linear), or a
 * number typed by the user, which always wins. `treated` given: the rule is
 * that of the fuzzy effect of `values` on take-up; absent: the sharp jump.
 */
import { bandwidthIk } from './bandwidthIk';
import { bandwidthMse } from './bandwidthMse';
import { CutlineError } from './errors';
import { KernelName } from './kernels';

export type BandwidthRule = 'mse' | 'ik' | 'cer';
export const BANDWIDTH_RULES: readonly BandwidthRule[] = ['mse', 'ik', 'cer'];

/** A typed bandwidth may exceed the largest |score − cutoff| at most this many times. */
export const MAX_BANDWIDTH_REACH = 10;

export interface BandwidthChoice {
  value: number;
  /** The rule, or "typed" for a bandwidth the user gave. */
  rule: BandwidthRule | 'typed';
}

export function chooseBandwidth(
  score: ArrayLike<number>,
  values: ArrayLike<number>,
  cutoff: number,
  options: { rule?: BandwidthRule; kernel: KernelName; typed?: number; treated?: ArrayLike<number> },
): BandwidthChoice {
  if (options.typed !== undefined) {
    if (!(options.typed > 0) || !Number.isFinite(options.typed)) {
      throw new CutlineError(`bandwidth must be a positive number, got ${options.typed}`);
    }
    // Far beyond the data the kernel weights are flat and the fits' normal equations lose
    // their precision (they are scaled by h), so a huge typed bandwidth is refused by name.
    let reach = 0;
    for (let i = 0; i < score.length; i++) reach = Math.max(reach, Math.abs(score[i] - cutoff));
    if (options.typed > MAX_BANDWIDTH_REACH * reach) {
      throw new CutlineError(
        `bandwidth ${options.typed} is more than ${MAX_BANDWIDTH_REACH} times the largest distance of a score from the cutoff ` +
          `(${Number(reach.toPrecision(6))}); a bandwidth just above that distance already puts every unit in the window`,
      );
    }
    return { value: options.typed, rule: 'typed' };
  }
  const rule = options.rule ?? 'mse';
  switch (rule) {
    case 'ik':
      return { value: bandwidthIk(score, values, cutoff, options.kernel, options.treated).bandwidth, rule };
    case 'mse':
      return { value: bandwidthMse(score, values, cutoff, options.kernel, options.treated).bandwidth, rule };
    case 'cer':
      return {
        value: bandwidthMse(score, values, cutoff, options.kernel, options.treated).bandwidth * Math.pow(score.length, -1 / 20),
        rule,
      };
    default:
      throw new CutlineError(`bandwidth rule must be one of mse, ik, cer; got "${String(rule)}"`);
  }
}
