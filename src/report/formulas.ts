/**
 * The text of the CUTLINE.* worksheet formulas that make a summary live
 * (DESIGN.md "Names"). Every formula the summary model writes is made here,
 * so that the argument order can follow the worksheet functions in one place.
 *
 * Conventions (DESIGN.md): data ranges first, then the cutoff, then the
 * optional bandwidth and the `settings` range (two columns of name/value
 * pairs), and a `detail` flag that spills a two-column (label, value) table;
 * a field other than the headline number is read from that table by its label
 * with VLOOKUP, so the formula does not depend on the order of its rows.
 *
 * Example:
 *   effect({ score: 'Data!$A$2:$A$101', treated: 'Data!$B$2:$B$101', outcome: 'Data!$C$2:$C$101' },
 *          { cutoff: '$B$5', bandwidth: '$B$6', settings: '$A$8:$B$16' })
 *   // 'CUTLINE.EFFECT(Data!$A$2:$A$101, Data!$B$2:$B$101, Data!$C$2:$C$101, $B$5, $B$6, $A$8:$B$16)'
 */

/** Addresses of the settings cells a formula refers to. */
export interface SettingRefs {
  cutoff: string;
  bandwidth: string;
  /** The two-column name/value range of the other options. */
  settings: string;
}

const call = (fn: string, args: string[]): string => `CUTLINE.${fn}(${args.join(', ')})`;

/** A field of a function's detail table, by label (e.g. 'se', 'pvalue'). */
export function detailField(formula: string, label: string): string {
  const withDetail = formula.replace(/\)$/, ', TRUE)');
  return `VLOOKUP("${label}", ${withDetail}, 2, FALSE)`;
}

export function takeup(d: { score: string; treated: string }, s: SettingRefs): string {
  return call('TAKEUP', [d.score, d.treated, s.cutoff, s.bandwidth, s.settings]);
}

export function jump(d: { score: string; values: string }, s: SettingRefs): string {
  return call('JUMP', [d.score, d.values, s.cutoff, s.bandwidth, s.settings]);
}

export function effect(d: { score: string; treated: string; outcome: string }, s: SettingRefs): string {
  return call('EFFECT', [d.score, d.treated, d.outcome, s.cutoff, s.bandwidth, s.settings]);
}

/** The rule's bandwidth for the complier effect of an outcome (the settings name the rule). */
export function bandwidth(d: { score: string; treated: string; outcome: string }, s: Omit<SettingRefs, 'bandwidth'>): string {
  return call('BANDWIDTH', [d.score, d.outcome, s.cutoff, d.treated, '"estimate"', s.settings]);
}

/**
 * The validity test's default bandwidth (undersmoothed mse of the take-up jump). Its pilot is the rule's
 * bandwidth of the first outcome's effect, as in the check, so `values` is that outcome (with the take-up
 * column itself as `values` the effect's rule has nothing to choose from: #N/A).
 */
export function testBandwidth(d: { score: string; treated: string; outcome: string }, s: Omit<SettingRefs, 'bandwidth'>): string {
  return call('BANDWIDTH', [d.score, d.outcome, s.cutoff, d.treated, '"test"', s.settings]);
}

/** Headline p-value of the outcome–treatment test; `testBandwidth` is the test's own bandwidth cell. */
export function validity(d: { score: string; treated: string; outcome: string }, s: SettingRefs, testBandwidth: string): string {
  return call('VALIDITY', [d.score, d.treated, d.outcome, s.cutoff, testBandwidth, s.settings]);
}

export function densityTest(d: { score: string }, s: SettingRefs): string {
  return call('DENSITYTEST', [d.score, s.cutoff, s.settings]);
}

/** The covariate's jump p-value at its own bandwidth (the rule in the settings; the bandwidth argument left empty). */
export function balance(d: { score: string; covariate: string }, s: SettingRefs): string {
  return call('BALANCE', [d.score, d.covariate, s.cutoff, '', s.settings]);
}

/** Binned means (spills a table from its cell). */
export function bins(d: { score: string; values: string }, s: SettingRefs): string {
  return call('BINS', [d.score, d.values, s.cutoff, s.bandwidth, s.settings]);
}

/** Implied complier CDF at the values `at` (a range), arm 1 treated or 0 untreated (spills). */
export function complierCdf(d: { score: string; treated: string; outcome: string }, s: SettingRefs, at: string, arm: 0 | 1): string {
  return call('COMPLIERCDF', [d.score, d.treated, d.outcome, s.cutoff, at, String(arm), s.bandwidth, s.settings]);
}

/** A1 column letters of a 0-based column index. */
export function columnLetters(index: number): string {
  let s = '';
  let n = index + 1;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** A sheet name as a formula prefix: quoted when it holds anything but letters, digits and _. */
export function sheetPrefix(sheet: string): string {
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(sheet) ? `${sheet}!` : `'${sheet.replace(/'/g, "''")}'!`;
}

/** Absolute A1 range of a data column: rows first..last (1-based sheet rows). */
export function columnRange(sheet: string, index: number, first: number, last: number): string {
  const c = columnLetters(index);
  return `${sheetPrefix(sheet)}$${c}$${first}:$${c}$${last}`;
}

/** The 1-based row of an A1 address, with or without `$` (e.g. `$B$6` → 6). */
export const rowOf = (address: string): number => Number(/\d+$/.exec(address)![0]);

/** Absolute address of one cell on the summary sheet (row 1-based, col 0-based). */
export function cellAddress(row: number, col: number): string {
  return `$${columnLetters(col)}$${row}`;
}
