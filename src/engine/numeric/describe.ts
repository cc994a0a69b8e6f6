/** Plain descriptive statistics over typed arrays (d3-array style, no hidden state). */

export function mean(a: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i];
  return s / a.length;
}

/** Sample variance with denominator n − 1 (two-pass for accuracy). */
export function sampleVariance(a: ArrayLike<number>): number {
  const n = a.length;
  if (n < 2) return NaN;
  const m = mean(a);
  let s = 0;
  for (let i = 0; i < n; i++) s += (a[i] - m) * (a[i] - m);
  return s / (n - 1);
}

/** Sample covariance with denominator n − 1. */
export function sampleCovariance(a: ArrayLike<number>, b: ArrayLike<number>): number {
  const n = a.length;
  if (n < 2) return NaN;
  const ma = mean(a);
  const mb = mean(b);
  let s = 0;
  for (let i = 0; i < n; i++) s += (a[i] - ma) * (b[i] - mb);
  return s / (n - 1);
}
