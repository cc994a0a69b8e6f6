/**
 * Binned means for the plot of docs/methods.md §8: evenly spaced bins on each side
 * of the cutoff, below from the lowest score to c, above from c to the
 * highest score (the last bin above is closed), with the mean and count of
 * the values in each bin at the bin midpoint. Empty bins are left out of
 * `bins`; `binsBelow`/`binsAbove` are the numbers of bins laid.
 *
 * Number of bins, unless given: the IMSE-optimal evenly spaced count of
 * Calonico, Cattaneo & Titiunik (2015, JASA 110(512)), J = ⌈(2B/V)^(1/3)·n_s^(1/3)⌉
 * (form recalled from memory), with Cutline's derivation of B and V for bin
 * means with side range L: IMSE(J) = L²·E[μ'(R)²]/(12J²) + J·∫σ²(x)dx/(n_s·L),
 * hence J = ⌈(n_s·L³·E[μ'²]/(6∫σ²))^(1/3)⌉. Cutline estimates μ by a global
 * quartic in R − c fitted on the side (E[μ'²] = the side mean of its squared
 * derivative) and σ² as constant, the quartic's residual mean square (so
 * ∫σ² = σ̂²·L) — the homoskedastic simplification is Cutline's choice.
 * J is at least 1 and at most n_s; a side with fewer than 6 units or too
 * few distinct scores for the quartic takes J = ⌈n_s^(1/3)⌉.
 *
 * @example binnedMeans(score, bill, 60).bins
 */
import { CutlineError } from '../errors';
import { fitPolynomial, polyDerivative, polyValue } from '../fit';

export interface BinnedMean {
  side: 'below' | 'above';
  from: number;
  to: number;
  midpoint: number;
  mean: number;
  count: number;
}

export interface BinnedMeansOptions {
  binsBelow?: number;
  binsAbove?: number;
  rows?: Int32Array;
}

export interface BinnedMeansResult {
  bins: BinnedMean[];
  binsBelow: number;
  binsAbove: number;
  rule: 'given' | 'imse_evenly_spaced';
}

/** CCT (2015) IMSE-optimal evenly spaced bin count for one side (see above). */
export function imseEvenBinCount(x: Float64Array, y: Float64Array, range: number): number {
  const n = x.length;
  const fallback = Math.max(1, Math.min(n, Math.ceil(Math.cbrt(n))));
  if (n < 6 || !(range > 0)) return fallback;
  const a = fitPolynomial(x, y, 4);
  if (!a) return fallback;
  let sse = 0;
  let d2 = 0;
  for (let i = 0; i < n; i++) {
    sse += (y[i] - polyValue(a, x[i])) ** 2;
    d2 += polyDerivative(a, x[i], 1) ** 2;
  }
  const sigma2 = sse / (n - 5);
  const slope2 = d2 / n;
  if (!(sigma2 > 0)) return n; // values are an exact quartic of the score: every unit is informative
  const J = Math.ceil(Math.cbrt((n * range * range * slope2) / (6 * sigma2)));
  return Math.max(1, Math.min(n, J));
}

function checkCount(v: number | undefined, name: string): void {
  if (v !== undefined && (!Number.isInteger(v) || v < 1)) {
    throw new CutlineError(`${name} must be a whole number of at least 1, got ${v}`);
  }
}

export function binnedMeans(
  score: ArrayLike<number>,
  values: ArrayLike<number>,
  cutoff: number,
  opts: BinnedMeansOptions = {},
): BinnedMeansResult {
  if (values.length !== score.length) throw new CutlineError(`the values have ${values.length} rows but the score has ${score.length}`);
  if (!Number.isFinite(cutoff)) throw new CutlineError(`the cutoff must be a finite number, got ${cutoff}`);
  checkCount(opts.binsBelow, 'the number of bins below the cutoff');
  checkCount(opts.binsAbove, 'the number of bins above the cutoff');
  const total = opts.rows ? opts.rows.length : score.length;
  let nAbove = 0;
  for (let t = 0; t < total; t++) {
    const i = opts.rows ? opts.rows[t] : t;
    const r = score[i];
    const v = values[i];
    if (!Number.isFinite(r)) throw new CutlineError(`the score must be a finite number; row ${i + 1} holds ${r}`);
    if (!Number.isFinite(v)) throw new CutlineError(`the values must be finite numbers; row ${i + 1} holds ${v}`);
    if (r >= cutoff) nAbove++;
  }
  const xs = [new Float64Array(total - nAbove), new Float64Array(nAbove)];
  const ys = [new Float64Array(total - nAbove), new Float64Array(nAbove)];
  const fill = [0, 0];
  for (let t = 0; t < total; t++) {
    const i = opts.rows ? opts.rows[t] : t;
    const s = score[i] >= cutoff ? 1 : 0;
    xs[s][fill[s]] = score[i] - cutoff;
    ys[s][fill[s]++] = values[i];
  }
  const out: BinnedMean[] = [];
  const counts: number[] = [];
  for (const s of [0, 1] as const) {
    const side = s === 1 ? 'above' : 'below';
    const x = xs[s];
    const y = ys[s];
    if (x.length === 0) throw new CutlineError(`there are no units ${side} the cutoff; binned means need units on both sides`);
    // The side's span in x = R − c: below [min, 0), above [0, max].
    let lo = 0;
    let hi = 0;
    for (let i = 0; i < x.length; i++) {
      if (s === 0 && x[i] < lo) lo = x[i];
      if (s === 1 && x[i] > hi) hi = x[i];
    }
    const range = hi - lo;
    const given = s === 1 ? opts.binsAbove : opts.binsBelow;
    const J = range > 0 ? given ?? imseEvenBinCount(x, y, range) : 1;
    counts.push(J);
    const w = range / J;
    const sum = new Float64Array(J);
    const cnt = new Float64Array(J);
    for (let i = 0; i < x.length; i++) {
      let k = w > 0 ? Math.floor((x[i] - lo) / w) : 0;
      if (k >= J) k = J - 1;
      if (k < 0) k = 0;
      sum[k] += y[i];
      cnt[k]++;
    }
    for (let k = 0; k < J; k++) {
      if (cnt[k] === 0) continue;
      const from = cutoff + lo + k * w;
      const to = k === J - 1 ? cutoff + hi : cutoff + lo + (k + 1) * w;
      out.push({ side, from, to, midpoint: (from + to) / 2, mean: sum[k] / cnt[k], count: cnt[k] });
    }
  }
  const rule = opts.binsBelow !== undefined && opts.binsAbove !== undefined ? 'given' : 'imse_evenly_spaced';
  return { bins: out, binsBelow: counts[0], binsAbove: counts[1], rule };
}
