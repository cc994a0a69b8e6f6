/**
 * Bandwidth by rule (docs/methods.md §3): `mse` (default), `ik`, `cer` =
 * mse·n^(−1/20) (Calonico, Cattaneo & Farrell 2020, for local linear), or a
 * number typed by the user, which always wins. `treated` given: the rule is
 * that of the fuzzy effect of `values` on take-up; absent: the sharp jump.
 */
import { bandwidthIk } from './bandwidthIk';
import { bandwidthMse } from './bandwidthMse';
import { CutlineError } from '../errors';
import { KernelName } from '../fit';
import { widenForTies } from './bandwidthTies';
import { formatNumber } from '../numeric';

export type BandwidthRule = 'mse' | 'ik' | 'cer';
export const BANDWIDTH_RULES: readonly BandwidthRule[] = ['mse', 'ik', 'cer'];

/** A typed bandwidth may exceed the largest |score − cutoff| at most this many times. */
export const MAX_BANDWIDTH_REACH = 10;

export interface BandwidthChoice {
  value: number;
  /** The rule, or "typed" for a bandwidth the user gave. */
  rule: BandwidthRule | 'typed';
  /** Plain-words notes on the choice (a rule's value widened for mass points). */
  warnings: string[];
}

/** Scales outside this range are rescaled before a rule runs (its constants would under- or overflow). */
const SCALE_SAFE = [1e-30, 1e30];

function sdOf(v: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < v.length; i++) m += v[i];
  m /= v.length;
  let s = 0;
  for (let i = 0; i < v.length; i++) s += (v[i] - m) * (v[i] - m);
  return Math.sqrt(s / Math.max(1, v.length - 1));
}

const unsafe = (sd: number): boolean => sd > 0 && (sd < SCALE_SAFE[0] || sd > SCALE_SAFE[1]);

/**
 * The rule on data of extreme scale: h is equivariant in the score's scale and
 * invariant to the outcome's (test/properties.test.ts), so the rule runs on
 * (R − c)/sd(R) and V/sd(V) and h is scaled back. Ordinary data go straight through.
 */
function onSafeScale(
  score: ArrayLike<number>,
  values: ArrayLike<number>,
  cutoff: number,
  rule: (score: ArrayLike<number>, values: ArrayLike<number>, cutoff: number) => number,
): number {
  const sr = sdOf(score);
  const sv = sdOf(values);
  if (!unsafe(sr) && !unsafe(sv)) return rule(score, values, cutoff);
  const r = unsafe(sr) ? Float64Array.from(score, (x) => (x - cutoff) / sr) : score;
  const v = unsafe(sv) ? Float64Array.from(values, (x) => x / sv) : values;
  return rule(r, v, unsafe(sr) ? 0 : cutoff) * (unsafe(sr) ? sr : 1);
}

export function chooseBandwidth(
  score: ArrayLike<number>,
  values: ArrayLike<number>,
  cutoff: number,
  options: { rule?: BandwidthRule; kernel: KernelName; typed?: number; treated?: ArrayLike<number> },
): BandwidthChoice {
  if (options.typed !== undefined) {
    if (!(options.typed > 0) || !Number.isFinite(options.typed)) {
      throw new CutlineError(`the bandwidth must be a positive number, got ${options.typed}`, { code: 'option', argument: 'bandwidth' });
    }
    // Far beyond the data the kernel weights are flat and the fits' normal equations lose
    // their precision (they are scaled by h), so a huge typed bandwidth is refused by name.
    let reach = 0;
    for (let i = 0; i < score.length; i++) reach = Math.max(reach, Math.abs(score[i] - cutoff));
    if (options.typed > MAX_BANDWIDTH_REACH * reach) {
      throw new CutlineError(
        `the bandwidth ${options.typed} is more than ${MAX_BANDWIDTH_REACH} times the largest distance of a score from the cutoff ` +
          `(${formatNumber(reach, 6)}); a bandwidth just above that distance already puts every unit in the window`,
        { code: 'option', argument: 'bandwidth' },
      );
    }
    return { value: options.typed, rule: 'typed', warnings: [] };
  }
  const rule = options.rule ?? 'mse';
  const { kernel, treated } = options;
  let value: number;
  switch (rule) {
    case 'ik':
      value = onSafeScale(score, values, cutoff, (r, v, c) => bandwidthIk(r, v, c, kernel, treated).bandwidth);
      break;
    case 'mse':
      value = onSafeScale(score, values, cutoff, (r, v, c) => bandwidthMse(r, v, c, kernel, treated).bandwidth);
      break;
    case 'cer':
      value =
        onSafeScale(score, values, cutoff, (r, v, c) => bandwidthMse(r, v, c, kernel, treated).bandwidth) * Math.pow(score.length, -1 / 20);
      break;
    default:
      throw new CutlineError(`the bandwidth rule must be one of mse, ik, cer; got "${String(rule)}"`, { code: 'option', argument: 'rule' });
  }
  // The estimates' bias correction fits a quadratic on each side: it needs 3 distinct scores there.
  const w = widenForTies(score, cutoff, value, 3);
  const warnings = w.widened
    ? [
        `the ${rule} bandwidth ${formatNumber(value)} holds fewer than 3 distinct scores on a side (mass points); ` +
          `it was widened to ${formatNumber(w.bandwidth)} so that the local fits can be computed`,
      ]
    : [];
  return { value: w.bandwidth, rule, warnings };
}
