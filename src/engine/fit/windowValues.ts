/**
 * A column's values at every unit of a window, the units below the cutoff
 * first, then those above (each side in its window order). When the two
 * sides' gathered columns lie end to end in one array — as they do for a
 * window of a whole score handle, whose sides are adjacent runs of its sorted
 * order (data/indexedScore.ts) — the result is a view of that array, not a
 * copy; else the two are copied into a new array. Callers only read it.
 *
 * @example windowValues(win, outcome).length // win.below.index.length + win.above.index.length
 */
import type { Window } from './boundaryWindow';
import { gathered } from './residuals';

export function windowValues(win: Window, values: ArrayLike<number>): Float64Array {
  const below = gathered(win.below, values);
  const above = gathered(win.above, values);
  if (below.buffer === above.buffer && below.byteOffset + below.byteLength === above.byteOffset) {
    return new Float64Array(below.buffer, below.byteOffset, below.length + above.length);
  }
  const out = new Float64Array(below.length + above.length);
  out.set(below, 0);
  out.set(above, below.length);
  return out;
}
