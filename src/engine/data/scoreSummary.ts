/**
 * One linear pass over the score (optionally restricted to `rows`): count,
 * mean, sample standard deviation, range and the counts on each side of the
 * cutoff (a unit at the cutoff is above, docs/methods.md §1). Shared by the density
 * tests, the permutation test and the binned plots; a non-finite score is a
 * CutlineError naming the row (the input layer should have caught it).
 */
import { rememberedOn } from './indexedScore';
import { CutlineError } from '../errors';

export interface ScoreSummary {
  n: number;
  mean: number;
  sd: number;
  min: number;
  max: number;
  below: number;
  above: number;
}

// The density tests and the permutation tests of a check summarise the same
// scores: a score handle remembers the summary per cutoff (whole arrays only).
export function scoreSummary(score: ArrayLike<number>, cutoff: number, rows?: Int32Array, what = 'score'): ScoreSummary {
  if (rows) return computeSummary(score, cutoff, rows, what);
  return rememberedOn(score, `summary|${cutoff}|${what}`, () => computeSummary(score, cutoff, undefined, what));
}

function computeSummary(score: ArrayLike<number>, cutoff: number, rows: Int32Array | undefined, what: string): ScoreSummary {
  if (!Number.isFinite(cutoff)) throw new CutlineError(`the cutoff must be a finite number, got ${cutoff}`);
  // The whole column, or its rows gathered once: the passes below then read one array in order.
  const r = rows ? Float64Array.from(rows, (i) => score[i]) : score;
  const n = r.length;
  let sum = 0;
  let min = Infinity;
  let max = -Infinity;
  let above = 0;
  for (let t = 0; t < n; t++) {
    const v = r[t];
    if (!Number.isFinite(v)) throw new CutlineError(`the ${what} must be a finite number; row ${(rows ? rows[t] : t) + 1} holds ${v}`);
    sum += v;
    if (v < min) min = v;
    if (v > max) max = v;
    if (v >= cutoff) above++;
  }
  const mean = n > 0 ? sum / n : NaN;
  let ss = 0;
  for (let t = 0; t < n; t++) {
    const d = r[t] - mean;
    ss += d * d;
  }
  return { n, mean, sd: n > 1 ? Math.sqrt(ss / (n - 1)) : 0, min, max, below: n - above, above };
}

/** Throws unless both sides of the cutoff hold at least `min` units. */
export function requireBothSides(s: ScoreSummary, min: number, what: string): void {
  for (const [count, side] of [[s.below, 'below'], [s.above, 'above']] as const) {
    if (count < min) {
      throw new CutlineError(
        `${what} needs at least ${min} unit${min === 1 ? '' : 's'} ${side} the cutoff; the data hold ${count}`,
      );
    }
  }
}
