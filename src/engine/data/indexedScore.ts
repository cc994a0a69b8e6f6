/**
 * A score column that carries its sorted order and the results a check derives
 * from the scores alone (side fits, bandwidth pilots, summaries), so that each
 * is computed once per check. It is an explicit handle: `indexScores` makes one
 * per check (runCheck) or per call of an entry point, and it lives no longer
 * than that call. There is no module-level cache keyed by the caller's arrays,
 * so a caller who changes a column between two calls gets the new answer.
 *
 * The handle is a view of the caller's Float64Array (no copy) that every part
 * of the engine reads as a plain column; the engine never writes to it.
 *
 * @example
 *   const s = indexScores(Float64Array.of(3, 1, 2));
 *   sortedOrder(s); // Int32Array [1, 2, 0], computed once for s
 */
import { argsortWithValues, firstAtLeast } from '../numeric';

/** A sorted order with the columns gathered into it (read-only for every caller). */
interface SortedOrder {
  order: Int32Array;
  columns: WeakMap<object, Float64Array>;
}

export class IndexedScore extends Float64Array {
  /** Results derived from these scores, by key (see `rememberedOn`). */
  memo?: Map<string, unknown>;
  sorted?: SortedOrder;
}

/** The column as a handle that remembers what is derived from it (the column itself if it is one). */
export function indexScores(values: Float64Array): IndexedScore {
  if (values instanceof IndexedScore) return values;
  return new IndexedScore(values.buffer as ArrayBuffer, values.byteOffset, values.length);
}

/** make(), remembered on the handle under `key`; for a plain array computed afresh every time. */
export function rememberedOn<V>(score: ArrayLike<number>, key: string, make: () => V): V {
  if (!(score instanceof IndexedScore)) return make();
  const memo = (score.memo ??= new Map());
  if (memo.has(key)) return memo.get(key) as V;
  const v = make();
  memo.set(key, v);
  return v;
}

function makeOrder(score: ArrayLike<number>): SortedOrder {
  const all = new Int32Array(score.length);
  for (let i = 0; i < all.length; i++) all[i] = i;
  // The sort carries the scores along: they are the handle's gathered score column from the start.
  const { order, sorted } = argsortWithValues(score, all);
  const columns = new WeakMap<object, Float64Array>();
  columns.set(score as object, sorted);
  return { order, columns };
}

/** Positions of all units sorted by score (ties by position): once per handle, afresh for a plain array. */
export function sortedOrder(score: ArrayLike<number>): Int32Array {
  if (score instanceof IndexedScore) return (score.sorted ??= makeOrder(score)).order;
  return makeOrder(score).order;
}

/** First position in the sorted order whose score is ≥ v (or > v when strict). */
export function lowerBound(score: ArrayLike<number>, order: Int32Array, v: number, strict: boolean): number {
  return firstAtLeast((t) => score[order[t]], 0, order.length, v, strict);
}

/**
 * Where a run of positions sits in a handle's sorted order. Windows of whole
 * arrays are views (subarrays) of the sorted order, so a window's units are a
 * contiguous run of it, and a column gathered once into sorted order (kept by
 * the handle, per column) serves every window as a slice.
 */
export interface OrderView {
  sorted: SortedOrder;
  start: number;
}

/** The view of `index` in the sorted order of the handle `score`, if it is one (else undefined). */
export function orderView(score: ArrayLike<number>, index: Int32Array): OrderView | undefined {
  if (!(score instanceof IndexedScore) || !score.sorted || index.buffer !== score.sorted.order.buffer || index.length === 0) return undefined;
  return { sorted: score.sorted, start: (index.byteOffset - score.sorted.order.byteOffset) / Int32Array.BYTES_PER_ELEMENT };
}

/**
 * values[index[t]] for a window's positions: a slice of the column gathered
 * into sorted order when the positions are a view of it, else a plain gather
 * (callers only read it).
 */
export function valuesAt(index: Int32Array, values: ArrayLike<number>, view?: OrderView): Float64Array {
  if (view) {
    const s = view.sorted;
    let col = s.columns.get(values as object);
    if (!col) {
      col = new Float64Array(s.order.length);
      for (let t = 0; t < s.order.length; t++) col[t] = values[s.order[t]];
      s.columns.set(values as object, col);
    }
    return col.subarray(view.start, view.start + index.length);
  }
  const out = new Float64Array(index.length);
  for (let t = 0; t < index.length; t++) out[t] = values[index[t]];
  return out;
}

/**
 * The columns in the handle's sorted order (each gathered once and kept, as
 * valuesAt does), or undefined for a plain array or a handle not yet sorted.
 * With keepGathered, a column derived elementwise from others (the trend
 * guard's outcomes) is computed along the sorted order by sequential reads
 * instead of gathered afterwards by random ones.
 */
export function gatheredColumns(score: ArrayLike<number>, columns: ArrayLike<number>[]): Float64Array[] | undefined {
  if (!(score instanceof IndexedScore) || !score.sorted) return undefined;
  const view: OrderView = { sorted: score.sorted, start: 0 };
  return columns.map((c) => valuesAt(score.sorted!.order, c, view));
}

/** Keeps `sortedCopy` (values[order[t]] at t, computed by the caller) as the handle's gathered copy of `values`. */
export function keepGathered(score: ArrayLike<number>, values: Float64Array, sortedCopy: Float64Array): void {
  if (score instanceof IndexedScore && score.sorted && sortedCopy.length === score.sorted.order.length) score.sorted.columns.set(values, sortedCopy);
}
