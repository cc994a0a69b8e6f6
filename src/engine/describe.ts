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

/** The k-th smallest value (0-based) by quickselect on a copy: linear on average. */
export function kthSmallest(values: ArrayLike<number>, k: number): number {
  const a = Float64Array.from(values);
  let lo = 0;
  let hi = a.length - 1;
  while (hi > lo) {
    const pivot = a[(lo + hi) >> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}

/** Median (average of the two middle values for an even count). */
export function median(values: ArrayLike<number>): number {
  const n = values.length;
  if (n % 2 === 1) return kthSmallest(values, (n - 1) / 2);
  return 0.5 * (kthSmallest(values, n / 2 - 1) + kthSmallest(values, n / 2));
}
