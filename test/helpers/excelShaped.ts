/**
 * The demo data (demo/retrofit.csv) as Excel hands ranges to a custom
 * function: one array per row holding one cell, numbers as numbers, empty
 * cells alternately as "" and as null, the text "NA" as text, a title cell at
 * the top, and (for whole-column ranges) blank cells after the data.
 */
import * as fs from 'fs';
import * as path from 'path';

export const DEMO = path.resolve(__dirname, '..', '..', 'demo', 'retrofit.csv');

export type Cells = unknown[][];

export interface DemoColumns {
  header: string[];
  /** Column name → its cells, title first. */
  cells: Map<string, Cells>;
  rows: number;
}

export function demoColumns(options: { trailingBlanks?: number } = {}): DemoColumns {
  const lines = fs.readFileSync(DEMO, 'utf8').trim().split(/\r?\n/);
  const header = lines[0].split(',');
  const cells = new Map<string, Cells>(header.map((h) => [h, [[h]]]));
  let blank = 0;
  for (const line of lines.slice(1)) {
    const parts = line.split(',');
    header.forEach((h, c) => {
      const s = parts[c];
      let cell: unknown;
      if (s === '') cell = blank++ % 2 === 0 ? '' : null;
      else if (Number.isFinite(Number(s))) cell = Number(s);
      else cell = s;
      cells.get(h)!.push([cell]);
    });
  }
  for (const col of cells.values()) for (let i = 0; i < (options.trailingBlanks ?? 0); i++) col.push([i % 2 ? null : '']);
  return { header, cells, rows: lines.length - 1 };
}

/** A copy of a range's cells with some cells replaced (data row r is cells[r + 1] when a title is present). */
export function withCells(cells: Cells, changes: Array<[number, unknown]>): Cells {
  const out = cells.map((row) => [...row]);
  for (const [k, v] of changes) out[k] = [v];
  return out;
}

/** A 0/1 column as TRUE/FALSE booleans. */
export function asBooleans(cells: Cells): Cells {
  return cells.map(([v]) => [v === 1 ? true : v === 0 ? false : v]);
}
