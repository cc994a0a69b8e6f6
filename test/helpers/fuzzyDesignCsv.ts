/**
 * A small deterministic fuzzy design as CSV text (no randomness): take-up
 * 0.2 below and 0.7 at or above the cutoff 0, outcome y = 1 + r + 2·d + a
 * wobble, a covariate `age`. `shift` moves the wobble so that files differ.
 */
export function fuzzyDesignCsv(n = 400, shift = 0): string {
  const lines = ['score,treated,y,age'];
  for (let i = 0; i < n; i++) {
    const r = -1 + (2 * (i + 0.5)) / n;
    const u = ((i * 7919 + shift * 131) % 1000) / 1000;
    const d = u < (r >= 0 ? 0.7 : 0.2) ? 1 : 0;
    const y = 1 + r + 2 * d + Math.sin(i * 1.7 + shift) * 0.3;
    lines.push(`${r.toFixed(5)},${d},${y.toFixed(5)},${30 + ((i + shift) % 17)}`);
  }
  return lines.join('\n') + '\n';
}

/** The same design as rows of numbers (header first), for writing a workbook. */
export function fuzzyDesignRows(n = 400, shift = 0): Array<Array<string | number>> {
  return fuzzyDesignCsv(n, shift)
    .trim()
    .split('\n')
    .map((l, k) => (k === 0 ? l.split(',') : l.split(',').map(Number)));
}
