/**
 * Listwise selection (docs/methods.md §1): a row missing in any column that a
 * calculation uses is dropped from that calculation, and counted.
 */

/** Rows with no missing cell in any of the masks, and how many were dropped. */
// Whether a mask marks any row, remembered per mask: a check asks for the
// listwise rows of the same columns many times.
const anyMissing = new WeakMap<Uint8Array, boolean>();

function marksAny(m: Uint8Array): boolean {
  let v = anyMissing.get(m);
  if (v === undefined) {
    v = m.indexOf(1) >= 0;
    anyMissing.set(m, v);
  }
  return v;
}

// Rows arrays are read-only for every caller, so one identity array serves all.
let lastIdentity = new Int32Array(0);
function identity(n: number): Int32Array {
  if (lastIdentity.length !== n) {
    lastIdentity = new Int32Array(n);
    for (let i = 0; i < n; i++) lastIdentity[i] = i;
  }
  return lastIdentity;
}

export function completeRows(n: number, masks: (Uint8Array | undefined)[]): { rows: Int32Array; dropped: number } {
  const used = masks.filter((m): m is Uint8Array => m !== undefined && marksAny(m));
  if (used.length === 0) return { rows: identity(n), dropped: 0 };
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
