/**
 * Distinct score values near the cutoff, and the data-specific caveat the
 * density tests (docs/methods.md §6.3) and the binned plots attach when the score is
 * discrete or heaped. McCrary (2008, §2 and §5) and Cattaneo, Jansson & Ma
 * (2020, §2) both assume a continuously distributed score; with a score that
 * takes few values (mass points) the histogram heights or the empirical
 * distribution function jump at the support points, the density estimates
 * are not consistent and the p-value can mislead. Their advice, as Cutline
 * states it: do not read the test as evidence either way; look at the counts
 * at the support points next to the cutoff.
 *
 * Cutline's rule (its own choice): a side's scores are "mostly repeated" when its
 * window holds fewer than 10 distinct scores, or when on average more than 20
 * units share each distinct score (heaping). A score recorded to one decimal
 * over a window of many tenths is not flagged: the density tests' bins and
 * bandwidths span many support points there.
 */

import { orderView, rememberedOn, sortedOrder, valuesAt } from './indexedScore';
import { firstAtLeast } from '../numeric';

export interface DistinctScores {
  below: number;
  above: number;
  unitsBelow: number;
  unitsAbove: number;
}

export const FEW_DISTINCT = 10;
/** More units than this per distinct score value, on average, is heaping. */
export const UNITS_PER_VALUE = 20;

/** Number of distinct values in an ascending array. */
export function countDistinctSorted(sorted: ArrayLike<number>): number {
  let d = 0;
  for (let i = 0; i < sorted.length; i++) if (i === 0 || sorted[i] !== sorted[i - 1]) d++;
  return d;
}

/** Distinct scores in (c − h, c) and [c, c + h); h = Infinity counts whole sides. */
export function windowDistinctScores(
  score: ArrayLike<number>,
  cutoff: number,
  bandwidth: number,
  rows?: Int32Array,
): DistinctScores {
  // On a score handle, once per window: McCrary's test and the density section ask for the same one.
  if (!rows) return rememberedOn(score, `distinct|${cutoff}|${bandwidth}`, () => distinctFromOrder(score, cutoff, bandwidth));
  const total = rows ? rows.length : score.length;
  const inWindow = (x: number) => (x >= 0 ? x < bandwidth : -x < bandwidth);
  let na = 0;
  let nb = 0;
  for (let t = 0; t < total; t++) {
    const x = score[rows ? rows[t] : t] - cutoff;
    if (inWindow(x)) x >= 0 ? na++ : nb++;
  }
  const a = new Float64Array(na);
  const b = new Float64Array(nb);
  na = nb = 0;
  for (let t = 0; t < total; t++) {
    const x = score[rows ? rows[t] : t] - cutoff;
    if (inWindow(x)) {
      if (x >= 0) a[na++] = x;
      else b[nb++] = x;
    }
  }
  a.sort();
  b.sort();
  return { below: countDistinctSorted(b), above: countDistinctSorted(a), unitsBelow: b.length, unitsAbove: a.length };
}

/** The same counts read off the shared sorted order of the scores (no sort, no copy). */
function distinctFromOrder(score: ArrayLike<number>, cutoff: number, bandwidth: number): DistinctScores {
  const order = sortedOrder(score);
  // The scores in sorted order, read sequentially (a handle keeps them gathered: indexedScore.ts).
  const sorted = valuesAt(order, score, orderView(score, order));
  const out = { below: 0, above: 0, unitsBelow: 0, unitsAbove: 0 };
  let prev = NaN;
  // First unit with x > −bandwidth (the predicate is monotone along the order).
  const lo = firstAtLeast((t) => sorted[t] - cutoff > -bandwidth ? 1 : 0, 0, order.length, 1, false);
  for (let t = lo; t < order.length; t++) {
    const r = sorted[t];
    const x = r - cutoff;
    if (x >= 0 ? !(x < bandwidth) : !(-x < bandwidth)) {
      if (x >= 0) break;
      continue;
    }
    if (x >= 0) {
      out.unitsAbove++;
      if (out.unitsAbove === 1 || r !== prev) out.above++;
    } else {
      out.unitsBelow++;
      if (out.unitsBelow === 1 || r !== prev) out.below++;
    }
    prev = r;
  }
  return out;
}

/** True when a side's window holds mostly repeated scores (see the rule above). */
export function mostlyRepeated(distinct: number, units: number): boolean {
  return units > 0 && (distinct < FEW_DISTINCT || distinct * UNITS_PER_VALUE < units);
}

/** The caveat for a density test or plot, or null when the score looks continuous. */
export function distinctScoreWarning(d: DistinctScores, what = 'the density tests'): string | null {
  const bad: string[] = [];
  if (mostlyRepeated(d.below, d.unitsBelow)) bad.push(`${d.below} distinct values among ${d.unitsBelow} units below the cutoff`);
  if (mostlyRepeated(d.above, d.unitsAbove)) bad.push(`${d.above} distinct values among ${d.unitsAbove} units above the cutoff`);
  if (bad.length === 0) return null;
  return (
    `the score takes few distinct values near the cutoff (${bad.join('; ')}): a continuously distributed score ` +
    `is assumed by ${what} (McCrary 2008; Cattaneo, Jansson & Ma 2020), so with a discrete or heaped score the ` +
    `result is not reliable either way — compare the counts at the score values next to the cutoff instead`
  );
}
