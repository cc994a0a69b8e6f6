/**
 * Numbers as every face shows them (presentation only): four significant
 * digits in plain notation for everyday magnitudes, p-values to three decimals.
 *
 * @example num(-179.8342) // '-179.8'; pval(0.00042) // '<0.001'
 */
export function num(v: number, digits = 4): string {
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e6 || a < 1e-4) return v.toExponential(digits - 1);
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(a)));
  return v.toFixed(Math.min(decimals, 8));
}

export function pval(p: number): string {
  if (!Number.isFinite(p)) return String(p);
  if (p < 0.001) return '<0.001';
  return p.toFixed(3);
}

/**
 * A p-value in words after "p": "p = 0.123", or "p < 0.001" (never "p = <0.001").
 *
 * @example pIs(0.0312) // 'p = 0.031'; pIs(0.00042) // 'p < 0.001'
 */
export function pIs(p: number): string {
  const s = pval(p);
  return s.startsWith('<') ? `p ${s.replace('<', '< ')}` : `p = ${s}`;
}

export function interval(ci: [number, number]): string {
  return `[${num(ci[0])}, ${num(ci[1])}]`;
}
