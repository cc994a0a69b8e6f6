/**
 * A rule's bandwidth on a score with repeated values (mass points) (test scores, ages in
 * years) can leave fewer distinct scores on a side than a fit needs. Cutline's
 * choice: widen it to 1.25 × the distance of the `need`-th nearest distinct
 * score on the side that needs it most (so that score still gets weight), and
 * say so. A typed bandwidth is never widened: it fails with a clear message.
 *
 * @example widenForTies(intScores, 0, 1.6, 3) // { bandwidth: 3.75, widened: true }
 */
import { lowerBound, sortedOrder } from '../data';

/** Distance from the cutoff of the `need`-th nearest distinct score on each side (Infinity when the side has fewer). */
function nthDistinctDistance(score: ArrayLike<number>, cutoff: number, need: number): { below: number; above: number } {
  const order = sortedOrder(score);
  const lo = lowerBound(score, order, cutoff, false);
  const walk = (start: number, step: number, inside: (t: number) => boolean): number => {
    let count = 0;
    let prev = NaN;
    for (let t = start; inside(t); t += step) {
      const r = score[order[t]];
      if (count === 0 || r !== prev) {
        count++;
        prev = r;
        if (count === need) return Math.abs(r - cutoff);
      }
    }
    return Infinity;
  };
  return {
    below: walk(lo - 1, -1, (t) => t >= 0),
    above: walk(lo, 1, (t) => t < order.length),
  };
}

export function widenForTies(
  score: ArrayLike<number>,
  cutoff: number,
  bandwidth: number,
  need: number,
): { bandwidth: number; widened: boolean } {
  const d = nthDistinctDistance(score, cutoff, need);
  const reach = Math.max(d.below, d.above);
  // A side with fewer distinct scores than needed cannot be helped by widening: leave it to the fit's own error.
  if (!Number.isFinite(reach) || bandwidth > reach) return { bandwidth, widened: false };
  return { bandwidth: 1.25 * reach, widened: true };
}
