/**
 * The cell references of a worksheet formula (A1 style), so that a sheet
 * plan can be checked without a spreadsheet: which cells and ranges, on
 * which sheet, each formula reads. Text in double quotes is skipped; a
 * sheet prefix may be bare (`Data!`) or quoted (`'My data'!`).
 *
 * @example
 *   formulaRefs("=CUTLINE.TAKEUP(Data!$C$2:$C$6001, $B$6)", 'Summary')
 *   // [{ sheet: 'Data', top: 2, left: 2, bottom: 6001, right: 2 }, { sheet: 'Summary', top: 6, left: 1, bottom: 6, right: 1 }]
 */

export interface CellBox {
  sheet: string;
  /** 1-based rows, 0-based columns, inclusive. */
  top: number;
  left: number;
  bottom: number;
  right: number;
}

const colIndex = (letters: string): number => letters.toUpperCase().split('').reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0) - 1;

const REF = /(?:'((?:[^']|'')+)'!|([A-Za-z_][A-Za-z0-9_.]*)!)?\$?([A-Za-z]{1,3})\$?(\d+)(?::\$?([A-Za-z]{1,3})\$?(\d+))?(?![A-Za-z0-9_(.])/g;

/** The boxes a formula reads; `sheet` is the sheet the formula is on (for unprefixed references). */
export function formulaRefs(formula: string, sheet: string): CellBox[] {
  // Blank out string literals so that "<" or "se" inside quotes are not read.
  const code = formula.replace(/"(?:[^"]|"")*"/g, (s) => ' '.repeat(s.length));
  const out: CellBox[] = [];
  for (const m of code.matchAll(REF)) {
    const before = code[m.index! - 1];
    if (before !== undefined && /[A-Za-z0-9_.$]/.test(before)) continue; // part of a name such as LOG10
    const s = m[1] !== undefined ? m[1].replace(/''/g, "'") : (m[2] ?? sheet);
    const r1 = Number(m[4]);
    const c1 = colIndex(m[3]);
    const r2 = m[6] !== undefined ? Number(m[6]) : r1;
    const c2 = m[5] !== undefined ? colIndex(m[5]) : c1;
    out.push({ sheet: s, top: Math.min(r1, r2), bottom: Math.max(r1, r2), left: Math.min(c1, c2), right: Math.max(c1, c2) });
  }
  return out;
}

/** The box of an A1 address or range on a sheet. */
export function boxOf(address: string, sheet: string): CellBox {
  const b = formulaRefs(address, sheet);
  if (b.length !== 1) throw new Error(`not one address: ${address}`);
  return b[0];
}

export function inside(inner: CellBox, outer: CellBox): boolean {
  return inner.sheet === outer.sheet && inner.top >= outer.top && inner.bottom <= outer.bottom && inner.left >= outer.left && inner.right <= outer.right;
}

export function overlaps(a: CellBox, b: CellBox): boolean {
  return a.sheet === b.sheet && a.top <= b.bottom && b.top <= a.bottom && a.left <= b.right && b.left <= a.right;
}
