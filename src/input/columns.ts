/**
 * Columns of a Table checked and converted once, for every face (docs/methods.md
 * §1). Each error names the column (and the option that asked for it) and the
 * first offending row; missing values become a mask, never a silent NaN.
 */
import { CutlineError } from '../engine';
import { cellLabel, cellNumber, decimalCommaHint, showCell, trimBlank } from './cells';
import { Table } from './table';

export interface NumericColumn {
  name: string;
  values: Float64Array;
  /** 1 where the cell is missing. */
  missing: Uint8Array;
}

export interface LabelColumn {
  name: string;
  /** Integer code of each label, in order of first appearance; −1 missing. */
  codes: Int32Array;
  labels: string[];
  missing: Uint8Array;
}

export type ColumnRole = 'score' | 'treated' | 'outcome' | 'covariate' | 'cluster' | 'within';

/** Roles without which no estimate exists: a column of them that is entirely missing is an error here. */
const REQUIRED: ReadonlySet<ColumnRole> = new Set(['score', 'treated', 'outcome']);

function requireSomeValue(table: Table, c: number, role: ColumnRole, missing: Uint8Array): void {
  if (!REQUIRED.has(role) || missing.length === 0) return;
  for (let r = 0; r < missing.length; r++) if (!missing[r]) return;
  throw new CutlineError(
    `column ${showCell(table.header[c])} (${role}) is missing on every one of its ${missing.length} rows (blank, or NA, N/A, #N/A, .); ` +
      'check that this is the intended column, or fill in its values',
  );
}

/** The columns of `header` named `name`: exact matches, else matches ignoring case. */
function matches(header: string[], name: string): number[] {
  for (const same of [(h: string) => h === name, (h: string) => h.toLowerCase() === name.toLowerCase()]) {
    const hits = header.flatMap((h, k) => (same(h) ? [k] : []));
    if (hits.length > 0) return hits;
  }
  return [];
}

/** Index of the one column named `name` (findColumn's rule), or −1 when there is none or more than one. */
export function columnIndex(header: string[], name: string): number {
  const hits = matches(header, name);
  return hits.length === 1 ? hits[0] : -1;
}

/** Index of a named column; the message lists what the table has. */
export function findColumn(table: Table, name: string, role: string): number {
  if (trimBlank(name) === '') throw new CutlineError(`${role} needs a column name, got an empty one`);
  // An exact match wins; else a match ignoring case. Two matches: refuse rather than guess.
  const hits = matches(table.header, name);
  if (hits.length > 1) {
    throw new CutlineError(`${role}: the header has ${hits.length} columns named ${showCell(name)} (columns ${hits.map((k) => k + 1).join(', ')}); rename them`);
  }
  if (hits.length === 1) return hits[0];
  // Twelve names at most, each cut as a cell value is: a header can be megabytes long.
  const shown = table.header.slice(0, 12).map((h) => showCell(h)).join(', ');
  const more = table.header.length > 12 ? `, … (${table.header.length} columns in all)` : '';
  throw new CutlineError(`${role}: no column named ${showCell(name)}; the columns are ${shown}${more}`);
}

export function numericColumn(table: Table, name: string, role: ColumnRole): NumericColumn {
  const c = findColumn(table, name, `--${role}`);
  const n = table.rowCount;
  const binary = role === 'treated';
  const read = (r: number, values: Float64Array, missing: Uint8Array): void => {
    const cell = table.get(r, c);
    const v = cellNumber(cell);
    if (v === null) {
      missing[r] = 1;
    } else if (v === undefined) {
      const what = binary ? 'treated must be 0, 1, TRUE or FALSE' : 'not a number';
      throw new CutlineError(`column ${showCell(table.header[c])} (${role}), row ${r + table.firstRow}: ${what}, found ${showCell(cell)}${decimalCommaHint(cell)}`);
    } else if (binary && v !== 0 && v !== 1) {
      throw new CutlineError(
        `column ${showCell(table.header[c])} (treated), row ${r + table.firstRow}: treated must be 0, 1, TRUE or FALSE, found ${showCell(cell)}`,
      );
    } else {
      values[r] = v;
    }
  };
  if (table.fastColumn) {
    const { values, missing, slow } = table.fastColumn(c);
    // The first bad row must be the one named: the fast reads of binary values are checked in row order too.
    let s = 0;
    for (let r = 0; r < n; r++) {
      if (s < slow.length && slow[s] === r) {
        read(r, values, missing);
        s++;
      } else if (binary && !missing[r] && values[r] !== 0 && values[r] !== 1) read(r, values, missing);
    }
    requireSomeValue(table, c, role, missing);
    return { name: table.header[c], values, missing };
  }
  const values = new Float64Array(n);
  const missing = new Uint8Array(n);
  for (let r = 0; r < n; r++) read(r, values, missing);
  requireSomeValue(table, c, role, missing);
  return { name: table.header[c], values, missing };
}

export function labelColumn(table: Table, name: string, role: ColumnRole): LabelColumn {
  const c = findColumn(table, name, `--${role}`);
  const n = table.rowCount;
  const codes = new Int32Array(n);
  const missing = new Uint8Array(n);
  const seen = new Map<string, number>();
  const labels: string[] = [];
  for (let r = 0; r < n; r++) {
    const s = cellLabel(table.get(r, c));
    if (s === null) {
      missing[r] = 1;
      codes[r] = -1;
      continue;
    }
    let code = seen.get(s);
    if (code === undefined) {
      code = labels.length;
      seen.set(s, code);
      labels.push(s);
    }
    codes[r] = code;
  }
  return { name: table.header[c], codes, labels, missing };
}

