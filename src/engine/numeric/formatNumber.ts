/**
 * The engine's one number formatter for messages and warnings: `digits`
 * significant digits (4 unless a message needs more), without trailing zeros.
 * The faces format their own tables (src/cli/format.ts).
 *
 * @example formatNumber(9.80123) // "9.801"; formatNumber(0.0040000, 6) // "0.004"
 */
export function formatNumber(v: number, digits = 4): string {
  return Number(v.toPrecision(digits)).toString();
}
