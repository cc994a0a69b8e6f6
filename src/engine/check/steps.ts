/**
 * The steps a whole check is composed of, each exported so that an entry point
 * for one quantity (a worksheet function) computes it exactly as `runCheck`
 * does: the eligible side, the estimates' bandwidth, the validity test's
 * bandwidth, the by-bandwidth verdict, the complier warnings and the donut.
 * The choices behind them are in docs/methods.md §2.6, §4.9, §5 and §9.
 */
import { BandwidthChoice, BandwidthRule, chooseBandwidth, bandwidthMse, widenForTies } from '../bandwidth';
import { CutlineError } from '../errors';
import { boundaryWindow, sideIntercept, Window, KernelName } from '../fit';
import { sortedOrder } from '../data';
import { formatNumber } from '../numeric';
import { MultiplierName, validityReport, ValidityAtBandwidth } from '../validity';

export type Eligible = 'above' | 'below';

/** The multiples of the test bandwidth at which the verdict is shown by default. */
export const DEFAULT_SENSITIVITY = [0.5, 0.75, 1, 1.5, 2];

export const FALLING_TAKEUP_WARNING =
  'take-up falls at the cutoff: eligibility is taken to be below the cutoff, and every jump is reported as below minus above';

/**
 * The eligible side: above unless the take-up jump (above − below, local
 * linear at bandwidth h) is negative, then below with a warning. A side given
 * by the caller wins. Returns the window used, for reuse by the estimates.
 *
 * @example eligibleSide(score, treated, 60, 12, 'triangular').sign // 1
 */
export function eligibleSide(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  cutoff: number,
  h: number,
  kernel: KernelName,
  given?: Eligible,
): { sign: 1 | -1; eligible: Eligible; window: Window; warnings: string[] } {
  const window = boundaryWindow(score, cutoff, h, kernel);
  if (given !== undefined) {
    if (given !== 'above' && given !== 'below') {
      throw new CutlineError(`the eligible side must be "above" or "below", got ${JSON.stringify(given)}`, { code: 'option', argument: 'eligible' });
    }
    return { sign: given === 'above' ? 1 : -1, eligible: given, window, warnings: [] };
  }
  // Read from the sides' gathered treated column (kept for the estimates, which read it next).
  const raw = sideIntercept(window.above, treated) - sideIntercept(window.below, treated);
  const sign: 1 | -1 = raw < 0 ? -1 : 1;
  return { sign, eligible: sign > 0 ? 'above' : 'below', window, warnings: sign < 0 ? [FALLING_TAKEUP_WARNING] : [] };
}

/**
 * The one bandwidth of all estimates: the rule applied to the complier effect
 * of `outcome` (the first outcome of a check), or the typed bandwidth.
 *
 * @example estimatesBandwidth(score, treated, bill, 60, { kernel: 'triangular' }).value // 11.99 on the demo
 */
export function estimatesBandwidth(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  opts: { rule?: BandwidthRule; kernel: KernelName; typed?: number },
): BandwidthChoice {
  return ruleBandwidth(score, outcome, cutoff, { rule: opts.rule, kernel: opts.kernel, typed: opts.typed, treated });
}

/**
 * chooseBandwidth, with a rule's failure said to be about the bandwidth: when
 * the data leave a rule too little to measure (too few units or distinct
 * scores), a typed bandwidth is the way past it, so the error carries
 * `argument: 'bandwidth'` and each face names its own bandwidth input (the
 * command line's --bandwidth, a worksheet function's bandwidth parameter).
 *
 * @example ruleBandwidth(score, bill, 60, { kernel: 'triangular' }).value // 11.99 on the demo's heating bill
 */
export function ruleBandwidth(...args: Parameters<typeof chooseBandwidth>): BandwidthChoice {
  try {
    return chooseBandwidth(...args);
  } catch (e) {
    if (!(e instanceof CutlineError) || e.argument !== undefined || args[3].typed !== undefined) throw e;
    throw new CutlineError(e.message, { code: e.code, argument: 'bandwidth', index: e.index });
  }
}

/**
 * The validity test's bandwidth: the typed one, else the mse bandwidth of the
 * take-up jump times n^(−1/20). When take-up has no sampling variation near the
 * cutoff (a sharp design) that rule is undefined; the estimates' bandwidth `h`
 * times n^(−1/20) is used and said. A value that leaves fewer than 2 distinct
 * scores on a side is widened (bandwidthTies.ts).
 *
 * @example testBandwidth(score, treated, 60, 'triangular', 11.99).value // 9.801 on the demo
 */
export function testBandwidth(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  cutoff: number,
  kernel: KernelName,
  h: number,
  typed?: number,
): { value: number; rule: 'undersmoothed mse' | 'typed'; warnings: string[] } {
  if (typed !== undefined) return { value: typed, rule: 'typed', warnings: [] };
  const warnings: string[] = [];
  const shrink = Math.pow(score.length, -1 / 20);
  let value: number;
  try {
    value = bandwidthMse(score, treated, cutoff, kernel).bandwidth * shrink;
  } catch (e) {
    if (!(e instanceof CutlineError)) throw e;
    value = h * shrink;
    warnings.push(
      `the validity test's usual bandwidth (from the take-up jump) cannot be computed (${e.message}); it uses the estimates' bandwidth, shrunk slightly for the number of rows, ${formatNumber(value)}`,
    );
  }
  const w = widenForTies(score, cutoff, value, 2);
  if (w.widened) {
    warnings.push(
      `the validity test's bandwidth ${formatNumber(value)} holds a single score value on a side (mass points); it was widened to ${formatNumber(w.bandwidth)}`,
    );
  }
  return { value: w.bandwidth, rule: 'undersmoothed mse', warnings };
}

export interface ValidityTestOptions {
  kernel: KernelName;
  sign: 1 | -1;
  draws?: number;
  seed?: number;
  grid?: number;
  trim?: number;
  multiplier?: MultiplierName;
  /** The trend guard (docs/methods.md §4.8; default true). */
  trendGuard?: boolean;
  cells?: Int32Array;
  cellLabels?: string[];
}

/** The multiples of the sensitivity table besides 1 (the default table when none are given). */
export function sensitivityMultiples(sensitivity?: number[]): number[] {
  return (sensitivity ?? DEFAULT_SENSITIVITY).filter((m) => m !== 1);
}

/**
 * The verdict at multiples of the test bandwidth (same seed: common
 * multipliers), sorted by multiple, with the warnings the report gives — the
 * by-bandwidth table of the validity report (validityReport.ts) on its own.
 */
export function verdictByBandwidth(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  testH: number,
  sensitivity: number[] | undefined,
  opts: ValidityTestOptions,
): { byBandwidth: ValidityAtBandwidth[]; warnings: string[] } {
  const v = validityReport(score, treated, outcome, cutoff, { ...opts, bandwidth: testH, multiples: sensitivityMultiples(sensitivity) });
  return { byBandwidth: v.by_bandwidth ?? [], warnings: v.warnings };
}

/** Widest window, in multiples of the larger of the score's range and the test bandwidth, that the sensitivity table may ask for. */
export const MAX_SPREAD = 10;

/**
 * A sensitivity multiple whose window spans more than MAX_SPREAD times the
 * scores' range adds nothing (every unit is in the window long before) and
 * says the multiple was a slip: refused, naming the largest sensible one.
 */
export function checkMultiples(multiples: number[], testH: number, score: ArrayLike<number>): void {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < score.length; i++) {
    if (score[i] < lo) lo = score[i];
    if (score[i] > hi) hi = score[i];
  }
  const limit = MAX_SPREAD * Math.max(hi - lo, testH);
  const bad = multiples.find((m) => m * testH > limit);
  if (bad !== undefined) {
    throw new CutlineError(
      `the sensitivity multiple ${bad} makes the validity test's bandwidth ${formatNumber(bad * testH)}, more than ${MAX_SPREAD} times the range of the scores (${formatNumber(lo)} to ${formatNumber(hi)}); ` +
        `choose multiples up to ${formatNumber(limit / testH)}`,
      { code: 'option', argument: 'sensitivity' },
    );
  }
}

/** A bandwidth rule that fails with the donut cut out but not without it: the donut is named as the cause. */
export function blameDonut<T>(donut: number | undefined, f: () => T, withoutDonut: () => void): T {
  try {
    return f();
  } catch (e) {
    if (!(e instanceof CutlineError) || donut === undefined) throw e;
    try {
      withoutDonut();
    } catch {
      throw e;
    }
    throw new CutlineError(
      `the donut (radius ${donut}) leaves too few units or distinct scores near the cutoff for the bandwidth rule (it works without the donut); choose a smaller donut, or give a bandwidth`,
      { code: 'too-few', argument: 'donut' },
    );
  }
}

/** A warning for each arm whose implied complier distribution falls somewhere. */
export function complierWarnings(decreasing: { treated: Array<{ from: number; to: number }>; untreated: Array<{ from: number; to: number }> }): string[] {
  const out: string[] = [];
  for (const arm of ['treated', 'untreated'] as const) {
    const list = decreasing[arm];
    if (list.length === 0) continue;
    const where = list.map((st) => `${formatNumber(st.from)} to ${formatNumber(st.to)}`).join(', ');
    out.push(
      `the implied distribution of ${arm} compliers' outcomes falls (from ${where}): a probability cannot fall, ` +
        'so this is the picture of a violation of the design — or of noise; the validity test says which is likely',
    );
  }
  return out;
}

export interface Donut {
  /** 1 for rows inside the donut. */
  mask: Uint8Array;
  radius: number;
  excluded: number;
}

/**
 * Rows inside the donut |score − cutoff| < r, left out of every estimate and
 * test (missing scores are left to the listwise rule); undefined without r.
 */
export function donutMask(score: ArrayLike<number>, cutoff: number, r?: number, missing?: Uint8Array): Donut | undefined {
  if (r === undefined) return undefined;
  if (typeof r !== 'number' || !(r > 0) || !Number.isFinite(r)) {
    throw new CutlineError(`the donut must be a positive number, got ${r}`, { code: 'option', argument: 'donut' });
  }
  const mask = new Uint8Array(score.length);
  let excluded = 0;
  let below = 0;
  let above = 0;
  for (let i = 0; i < mask.length; i++) {
    if (missing?.[i]) continue;
    const x = score[i] - cutoff;
    if (Math.abs(x) < r) {
      mask[i] = 1;
      excluded++;
    } else if (x < 0) below++;
    else above++;
  }
  if (below === 0 || above === 0) {
    throw new CutlineError(`the donut ${r} leaves no unit ${below === 0 ? 'below' : 'above'} the cutoff`, { code: 'empty-side', argument: 'donut' });
  }
  return { mask, radius: r, excluded };
}

/** The score must vary and have units on both sides of the cutoff (read off the sorted order every window uses anyway). */
export function requireSides(score: ArrayLike<number>, cutoff: number, explain?: (below: boolean) => string | undefined): void {
  const order = sortedOrder(score);
  const lo = score[order[0]];
  const hi = score[order[order.length - 1]];
  if (lo === hi) {
    throw new CutlineError(`the score is constant (every used row is ${lo}); there is no discontinuity to study`, { code: 'constant', argument: 'score' });
  }
  // Missing values in other columns can empty a side the score itself fills: then they are at fault, not the cutoff.
  for (const below of [true, false]) {
    if (below ? lo < cutoff : hi >= cutoff) continue;
    const why = explain?.(below);
    if (why !== undefined) throw new CutlineError(why, { code: 'empty-side' });
    throw new CutlineError(`no unit has a score ${below ? 'below' : 'at or above'} the cutoff ${cutoff}`, { code: 'empty-side', argument: 'cutoff' });
  }
}

/** A column that must vary on the rows used (`what` names it, `why` says what fails without variation). */
export function requireVaries(v: ArrayLike<number>, argument: string, what: string, why: string): void {
  for (let i = 1; i < v.length; i++) if (v[i] !== v[0]) return;
  throw new CutlineError(`${what} is constant (every used row is ${v[0]}): ${why}`, { code: 'constant', argument });
}
