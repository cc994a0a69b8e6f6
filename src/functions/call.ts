/**
 * What every worksheet function does around its one engine call: read the
 * ranges through the input adapter (remembering each prepared column by the
 * id of its exact cells, see seenRange), read the bandwidth and the settings block, remember the
 * result by columns, cutoff and settings, and turn any error into an Excel
 * error value that names the argument and the first bad cell.
 */
import { EstimateOptions, ValidityOptions } from '../engine';
import { RangeColumn, rangeColumns, RangeInputError } from '../input/range';
import { readSettings, Settings } from '../input/settings';
import { cellNumber, trimBlank } from '../input/cells';
import { cellPrint, CellPrint, samePrint } from '../input/cellPrint';
import { BoundedCache } from './cache';
import { excelError, toExcelError } from './excelError';

/** The part of the runtime's invocation object Cutline reads. */
export interface InvocationLike {
  /** Addresses of the arguments ("Sheet1!B2:B6001"), when the runtime gives them (CustomFunctionsRuntime 1.3). */
  parameterAddresses?: string[];
  /** Set by a cancelable function; the runtime calls it when the result is no longer wanted. */
  onCanceled?: () => void;
}

/** A range argument of a call: its name, its cells, its position among the parameters. */
export interface RangeSpec {
  argument: string;
  cells: unknown[][];
  position: number;
  binary?: boolean;
}

/**
 * Ranges seen lately, most recent first: each print (its cells, see
 * src/input/cellPrint.ts) with an id that names exactly those cells. An id is
 * never given to other cells, so a result or a column remembered under ids
 * can only be found again by the very same cells (about 0.8 MB a print at
 * 100,000 rows).
 */
const seen: Array<{ id: number; print: CellPrint }> = [];
const SEEN_KEPT = 24;
let nextId = 1;
/** Checked columns, by the id of their cells, the binary flag and the call's common length (about 0.9 MB a column at 100,000 rows). */
const columns = new BoundedCache<string, RangeColumn>(24);
/** Results: small objects. */
const results = new BoundedCache<string, unknown>(512);

/** Forget everything (for tests and benchmarks that measure a cold start). */
export function forgetAll(): void {
  seen.length = 0;
  columns.clear();
  results.clear();
}

export function cacheSizes(): { ranges: number; columns: number; results: number } {
  return { ranges: seen.length, columns: columns.size, results: results.size };
}

/** The ranges of one call: a key naming their cells exactly, and their prints (undefined for a shape the adapter refuses). */
export interface RangesSeen {
  key: string;
  ids: string[];
  prints: Array<CellPrint | undefined>;
}

/**
 * The id of a range's cells: the id of the remembered print with exactly
 * these cells (compared cell by cell, stopping at the first difference), else
 * a new id with a new print (one pass). A shape the adapter refuses gets an
 * id of its own and no print (it never computes).
 */
function seenRange(cells: unknown[][]): { id: string; print?: CellPrint } {
  for (let i = 0; i < seen.length; i++) {
    const s = seen[i];
    if (samePrint(cells, s.print)) {
      if (i > 0) seen.unshift(...seen.splice(i, 1));
      return { id: String(s.id), print: s.print };
    }
  }
  const print = cellPrint(cells);
  const id = nextId++;
  if (!print) return { id: `x${id}` };
  seen.unshift({ id, print });
  if (seen.length > SEEN_KEPT) seen.length = SEEN_KEPT;
  return { id: String(id), print };
}

/** A key for the cells of a call's ranges (one pass over each, no checking), enough to find a remembered result. */
export function rangesKey(specs: RangeSpec[]): RangesSeen {
  const ids: string[] = [];
  const prints: Array<CellPrint | undefined> = [];
  for (const s of specs) {
    if (!Array.isArray(s.cells)) throw new RangeInputError(`${s.argument} must be a range of cells`, s.argument, 'shape');
    const r = seenRange(s.cells);
    ids.push(`${r.id}${s.binary ? 'b' : ''}`);
    prints.push(r.print);
  }
  return { key: ids.join('/'), ids, prints };
}

/**
 * Checked columns of one call (`seenRanges` from rangesKey): a column read
 * before from the same cells, as binary or not and to the same length, is not
 * read (nor checked) again, so the formulas of a summary sheet share one
 * reading of each range whatever the other ranges of their calls.
 */
export function readRanges(specs: RangeSpec[], seenRanges: RangesSeen, invocation?: InvocationLike | null): RangeColumn[] {
  return rangeColumns(
    specs.map((s, k) => ({ argument: s.argument, cells: s.cells, binary: s.binary, address: invocation?.parameterAddresses?.[s.position], print: seenRanges.prints[k] })),
    (k, n, read) => columns.get(`${seenRanges.ids[k]}|${n}`, read),
  );
}

/**
 * A number argument, read exactly as a cell of a range is (cells.ts: "60 " and
 * TRUE are 60 and 1; "0x10", "Infinity" and "1e999" are not numbers; blank and
 * NA are missing), or a #VALUE! error naming it: a missing value is an error here.
 */
export function numberArgument(argument: string, v: unknown): number {
  const x = typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean' ? cellNumber(v) : undefined;
  if (typeof x !== 'number') {
    throw new RangeInputError(`${argument} must be a number; it is ${v === null || v === undefined || v === '' ? 'empty' : JSON.stringify(v)}`, argument);
  }
  return x;
}

/** The optional bandwidth: a positive number when given. */
export function bandwidthArgument(v: unknown): number | undefined {
  if (v === null || v === undefined || (typeof v === 'string' && trimBlank(v) === '')) return undefined;
  const h = numberArgument('bandwidth', v);
  if (!(h > 0)) throw new RangeInputError(`bandwidth must be a positive number; it is ${h} (leave it empty for the data-driven bandwidth)`, 'bandwidth');
  return h;
}

export function settingsArgument(cells: unknown, invocation: InvocationLike | null | undefined, position: number): Settings {
  if (cells === null || cells === undefined || cells === '') return {};
  if (!Array.isArray(cells)) throw new RangeInputError('settings must be a range of two columns (name, value)', 'settings', 'shape');
  return readSettings(cells as unknown[][], 'settings', invocation?.parameterAddresses?.[position]);
}

export function flagArgument(v: unknown): boolean {
  if (v === null || v === undefined || v === '') return false;
  if (typeof v === 'boolean') return v;
  if (typeof v === 'number') return v !== 0;
  const s = trimBlank(String(v)).toUpperCase();
  if (s === 'TRUE') return true;
  if (s === 'FALSE') return false;
  throw new RangeInputError(`detail must be TRUE or FALSE; it is ${JSON.stringify(v)}`, 'detail');
}

/** The engine's options from the typed bandwidth and the settings block. */
export function engineOptions(bandwidth: number | undefined, s: Settings, missing: EstimateOptions['missing']): ValidityOptions {
  return {
    bandwidth,
    rule: s.rule === 'typed' ? undefined : s.rule,
    kernel: s.kernel,
    variance: s.variance,
    eligible: s.eligible,
    donut: s.donut,
    level: s.level,
    draws: s.draws,
    seed: s.seed,
    grid: s.grid,
    trim: s.trim,
    multiplier: s.multiplier,
    // The by-bandwidth table only when asked for: each multiple is a whole test more.
    sensitivity: s.sensitivity ?? [],
    trendGuard: s.trendGuard === undefined ? undefined : s.trendGuard === 'on',
    missing,
  };
}

/** A key for settings (in the order of SETTINGS' fields, which readSettings keeps). */
export function settingsKey(s: Settings): string {
  return JSON.stringify(Object.keys(s).sort().map((k) => [k, s[k as keyof Settings]]));
}

/** The result for `key`, computed once while remembered. */
export function remembered<T>(key: string, compute: () => T): T {
  return results.get(key, compute) as T;
}

export function isRemembered(key: string): boolean {
  return results.peek(key) !== undefined;
}

/** Runs a function body; an error becomes the Excel error it should show. */
export function guarded<T>(fn: string, body: () => T): T {
  try {
    return body();
  } catch (e) {
    throw toExcelError(fn, e);
  }
}

export type Cell = number | string | boolean | CustomFunctions.Error;
export type Matrix = Cell[][];

/** A number for a cell: a non-finite one becomes #NUM!. */
export function cellOf(v: number | string | boolean | undefined): Cell {
  if (v === undefined) return '';
  if (typeof v === 'number' && !Number.isFinite(v)) return excelError('#NUM!');
  return v;
}

/** A single number as a 1×1 result; not finite → #NUM!. */
export function single(fn: string, v: number): Matrix {
  if (!Number.isFinite(v)) throw excelError('#NUM!', `CUTLINE.${fn}: the result is not a finite number`);
  return [[v]];
}
