/**
 * Listwise selection (docs/methods.md §1): a row missing in any column that a
 * calculation uses is dropped from that calculation, and counted.
 */

/** Rows with no missing cell in any of the masks, and how many were dropped. */
export function completeRows(n: number, masks: (Uint8Array | undefined)[]): { rows: Int32Array; dropped: number } {
  const used = masks.filter((m): m is Uint8Array => m !== undefined && m.indexOf(1) >= 0);
  if (used.length === 0) {
    const all = new Int32Array(n);
    for (let i = 0; i < n; i++) all[i] = i;
    return { rows: all, dropped: 0 };
  }
  const keep = new Int32Array(n);
  let m = 0;
  for (let r = 0; r < n; r++) {
    let ok = true;
    for (const mk of used) if (mk[r]) ok = false;
    if (ok) keep[m++] = r;
  }
  return { rows: keep.slice(0, m), dropped: n - m };
}

/** The values at the kept rows, as a new compact array (the input is never changed). */
export function compact<T extends Float64Array | Int32Array>(values: T, rows: Int32Array): T {
  const out = new (values.constructor as { new (n: number): T })(rows.length);
  for (let t = 0; t < rows.length; t++) out[t] = values[rows[t]];
  return out;
}
