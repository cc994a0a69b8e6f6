/**
 * The one validator at every public entry of the engine: each column must be
 * an array of finite numbers of the same length as the others (a `missing`
 * mask, 1 = missing, exempts a row), treated must be 0 or 1, cluster codes
 * whole numbers. Anything else is a CutlineError naming the argument and the
 * first bad 0-based index — never a silent NaN. A Float64Array is returned as
 * it is (the engine never writes to it); any other array is copied into one.
 *
 * @example
 *   checkColumns({ score: [1, 2, NaN] }) // CutlineError { code: 'bad-value', argument: 'score', index: 2 }
 */
import { CutlineError } from '../errors';

/** A column as a caller hands it over: numbers, possibly from a worksheet (so anything may turn up). */
export type Column = ArrayLike<number> | ArrayLike<unknown>;

export interface ColumnSpec {
  values: Column | undefined;
  missing?: Uint8Array;
  /** 'binary': 0 or 1 (treated); 'code': a whole number (cluster or cell codes); 'number': any finite number. */
  kind?: 'number' | 'binary' | 'code';
  /** The argument an error names (default: the key). */
  argument?: string;
  /** How a message calls the column (default: the argument), e.g. `column "bill"`. */
  label?: string;
}

function describe(v: unknown): string {
  if (v === null) return 'empty (null)';
  if (v === undefined) return 'empty (undefined)';
  if (typeof v === 'number') return Number.isNaN(v) ? 'not a number (NaN)' : `${v} (not finite)`;
  if (typeof v === 'string') return `text ${JSON.stringify(v.length > 40 ? v.slice(0, 40) + '…' : v)}`;
  return `a ${typeof v}, not a number`;
}

/**
 * Checks the named columns (a name's column `undefined` is skipped) and
 * returns them as Float64Arrays, in the same names. Lengths must agree.
 */
export function checkColumns<K extends string>(columns: Record<K, ColumnSpec>): Record<K, Float64Array> {
  const names = (Object.keys(columns) as K[]).filter((k) => columns[k].values !== undefined);
  let n = -1;
  let first = '';
  const arg = (k: K): string => columns[k].argument ?? k;
  const label = (k: K): string => columns[k].label ?? arg(k);
  for (const name of names) {
    const c = columns[name].values!;
    if (c === null || typeof c !== 'object' || typeof (c as ArrayLike<unknown>).length !== 'number') {
      throw new CutlineError(`${label(name)} must be a column of numbers`, { code: 'bad-value', argument: arg(name) });
    }
    if (n < 0) {
      n = c.length;
      first = name;
    } else if (c.length !== n) {
      throw new CutlineError(`${label(name)} has ${c.length} values but ${label(first as K)} has ${n}; the columns must have the same length`, {
        code: 'length',
        argument: arg(name),
        index: Math.min(c.length, n),
      });
    }
    const m = columns[name].missing;
    if (m !== undefined && m.length !== c.length) {
      throw new CutlineError(`the missing-value mask of ${label(name)} has ${m.length} entries for ${c.length} values`, { code: 'length', argument: arg(name) });
    }
  }
  const out = {} as Record<K, Float64Array>;
  for (const name of names) {
    const { values, missing, kind = 'number' } = columns[name];
    const c = values as ArrayLike<unknown>;
    const typed = c instanceof Float64Array;
    const v = typed ? c : new Float64Array(c.length);
    const where = { code: 'bad-value' as const, argument: arg(name) };
    const masked = missing !== undefined && missing.indexOf(1) >= 0;
    if (typed && !masked && quickPass(c as Float64Array, kind)) {
      out[name] = v;
      continue;
    }
    for (let i = 0; i < c.length; i++) {
      if (missing?.[i]) {
        if (!typed) v[i] = NaN; // never read: every calculation drops the row
        continue;
      }
      const x = c[i];
      if (typeof x !== 'number' || !Number.isFinite(x)) throw new CutlineError(`${label(name)}: ${describe(x)}`, { ...where, index: i });
      if (kind === 'binary' && x !== 0 && x !== 1) throw new CutlineError(`${label(name)} must be 0 or 1, found ${x}`, { ...where, index: i });
      if (kind === 'code' && !Number.isInteger(x)) throw new CutlineError(`${label(name)} must hold whole-number codes, found ${x}`, { ...where, index: i });
      if (!typed) v[i] = x;
    }
    out[name] = v;
  }
  return out;
}

/** True when every value is fine (the common case, checked in one tight pass); else the slow pass says where. */
function quickPass(v: Float64Array, kind: 'number' | 'binary' | 'code'): boolean {
  if (kind === 'binary') {
    for (let i = 0; i < v.length; i++) if (v[i] !== 0 && v[i] !== 1) return false;
    return true;
  }
  if (kind === 'code') {
    for (let i = 0; i < v.length; i++) if (Math.floor(v[i]) !== v[i] || !Number.isFinite(v[i])) return false;
    return true;
  }
  // x − x is 0 for every finite number, NaN for NaN and ±Infinity.
  for (let i = 0; i < v.length; i++) if (v[i] - v[i] !== 0) return false;
  return true;
}

/** The cutoff: a finite number. */
export function checkCutoff(cutoff: unknown): number {
  if (typeof cutoff !== 'number' || !Number.isFinite(cutoff)) {
    throw new CutlineError(`the cutoff must be a finite number, got ${describe(cutoff)}`, { code: 'option', argument: 'cutoff' });
  }
  return cutoff;
}
