/**
 * Weighted least-squares polynomial fit y ≈ Σ_j a_j x^j (degree ≤ 4), solved
 * through the normal equations in the rescaled variable u = x/max|x| for
 * conditioning. A small helper of the density tests' and the binned plots'
 * global "rule of thumb" fits; returns null when the design is singular.
 */
import { invertSmall } from '../numeric';

export function fitPolynomial(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  degree: number,
  w?: ArrayLike<number>,
): Float64Array | null {
  const n = x.length;
  const q = degree + 1;
  let scale = 0;
  for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(x[i]));
  if (!(scale > 0) || n < q) return null;
  const mom = new Float64Array(2 * degree + 1);
  const rhs = new Float64Array(q);
  for (let i = 0; i < n; i++) {
    const wi = w ? w[i] : 1;
    if (wi === 0) continue;
    const u = x[i] / scale;
    let p = wi;
    for (let a = 0; a <= 2 * degree; a++) {
      mom[a] += p;
      if (a < q) rhs[a] += p * y[i];
      p *= u;
    }
  }
  const m = Array.from({ length: q }, (_, a) => Array.from({ length: q }, (_, b) => mom[a + b]));
  const inv = invertSmall(m);
  if (!inv) return null;
  const out = new Float64Array(q);
  for (let a = 0; a < q; a++) {
    let s = 0;
    for (let b = 0; b < q; b++) s += inv[a][b] * rhs[b];
    out[a] = s / Math.pow(scale, a);
  }
  return out;
}

/** Value of the polynomial with coefficients a at x. */
export function polyValue(a: ArrayLike<number>, x: number): number {
  let s = 0;
  for (let j = a.length - 1; j >= 0; j--) s = s * x + a[j];
  return s;
}

/** Value of the polynomial's d-th derivative at x. */
export function polyDerivative(a: ArrayLike<number>, x: number, d: number): number {
  let s = 0;
  for (let j = a.length - 1; j >= d; j--) {
    let c = a[j];
    for (let k = 0; k < d; k++) c *= j - k;
    s = s * x + c;
  }
  return s;
}
