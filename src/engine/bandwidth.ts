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
