/**
 * A second, deliberately dense implementation of the validity test's moments
 * (METHODS.md §4), written the obvious way from the definitions: it fits each
 * indicator g_ℓ by weighted least squares on each side (2×2 normal equations
 * solved directly), takes hc0 variances from its residuals, and keeps the
 * units × intervals matrices. Used only by the tests.
 */
import { Random } from '../../src/engine/numeric/random';

export interface DenseMoment {
  arm: 0 | 1;
  first: number;
  last: number;
  estimate: number;
  se: number;
  t: number;
  /** ψ_i(ℓ) = c_s ω_i ε̂_i(ℓ) per window unit (above units, then below, in data order). */
  psi: Float64Array;
}

export interface DenseResult {
  moments: DenseMoment[];
  T: number;
  floor: number;
  /** Window units: data row, side (true above), ω. */
  rows: number[];
  above: boolean[];
}

function K(kernel: string, u: number): number {
  const a = Math.abs(u);
  if (a >= 1) return 0;
  if (kernel === 'triangular') return 1 - a;
  if (kernel === 'epanechnikov') return 0.75 * (1 - u * u);
  return 0.5;
}

export function denseValidity(
  score: number[],
  treated: number[],
  outcome: number[],
  cutoff: number,
  h: number,
  kernel: string,
  grid: number,
  trim: number,
  sign: 1 | -1 = 1,
): DenseResult {
  const rows: number[] = [];
  const above: boolean[] = [];
  for (let i = 0; i < score.length; i++) {
    const x = score[i] - cutoff;
    if (K(kernel, x / h) > 0) {
      rows.push(i);
      above.push(x >= 0);
    }
  }
  const N = rows.length;
  const k = rows.map((i) => K(kernel, (score[i] - cutoff) / h));
  const x = rows.map((i) => score[i] - cutoff);
  // ω_i = e1' M_s^{-1} (1, x_i) k_i, M_s = Σ_s k z z'.
  const omega = new Array<number>(N).fill(0);
  for (const side of [true, false]) {
    let m00 = 0, m01 = 0, m11 = 0;
    for (let t = 0; t < N; t++) if (above[t] === side) {
      m00 += k[t];
      m01 += k[t] * x[t];
      m11 += k[t] * x[t] * x[t];
    }
    const det = m00 * m11 - m01 * m01;
    for (let t = 0; t < N; t++) if (above[t] === side) omega[t] = ((m11 - m01 * x[t]) / det) * k[t];
  }
  // Bins from the definition.
  const ys = rows.map((i) => outcome[i]).sort((a, b) => a - b);
  const distinct = [...new Set(ys)];
  let member: (y: number) => number; // bin number before dropping
  let nb: number;
  if (distinct.length <= grid) {
    nb = distinct.length;
    member = (y) => distinct.indexOf(y);
  } else {
    const z: number[] = [];
    for (let kk = 1; kk < grid; kk++) z.push(ys[Math.ceil((kk * N) / grid) - 1]);
    nb = grid;
    member = (y) => {
      if (y <= z[0]) return 0;
      for (let b = 1; b < grid - 1; b++) if (z[b - 1] < y && y <= z[b]) return b;
      return grid - 1;
    };
  }
  const raw = rows.map((i) => member(outcome[i]));
  const used = [...new Set(raw)].sort((a, b) => a - b);
  const bin = raw.map((b) => used.indexOf(b));
  const G = used.length;
  void nb;

  const fitSide = (g: number[], side: boolean): { a: number; e: number[] } => {
    let s0 = 0, s1 = 0, s2 = 0, t0 = 0, t1 = 0;
    for (let t = 0; t < N; t++) if (above[t] === side) {
      s0 += k[t];
      s1 += k[t] * x[t];
      s2 += k[t] * x[t] * x[t];
      t0 += k[t] * g[t];
      t1 += k[t] * x[t] * g[t];
    }
    const det = s0 * s2 - s1 * s1;
    const a = (s2 * t0 - s1 * t1) / det;
    const b = (s0 * t1 - s1 * t0) / det;
    return { a, e: g.map((gv, t) => gv - a - b * x[t]) };
  };
  let sw2 = 0;
  for (let t = 0; t < N; t++) sw2 += omega[t] * omega[t];
  const floor = trim * Math.sqrt(sw2);
  const moments: DenseMoment[] = [];
  const plus = sign === 1;
  for (const arm of [1, 0] as const)
    for (let j = 0; j < G; j++)
      for (let l = j; l < G; l++) {
        const g = rows.map((i, t) => (treated[i] === arm && bin[t] >= j && bin[t] <= l ? 1 : 0));
        const fa = fitSide(g, true);
        const fb = fitSide(g, false);
        const pPlus = plus ? fa.a : fb.a;
        const pMinus = plus ? fb.a : fa.a;
        const estimate = arm === 1 ? pMinus - pPlus : pPlus - pMinus;
        const cPlus = arm === 1 ? -1 : 1;
        const psi = new Float64Array(N);
        let v = 0;
        for (let t = 0; t < N; t++) {
          const e = above[t] ? fa.e[t] : fb.e[t];
          const isPlus = above[t] === plus;
          psi[t] = (isPlus ? cPlus : -cPlus) * omega[t] * e;
          v += psi[t] * psi[t];
        }
        const se = Math.sqrt(v);
        moments.push({ arm, first: j, last: l, estimate, se, t: estimate / Math.max(se, floor), psi });
      }
  return { moments, T: Math.max(...moments.map((m) => m.t)), floor, rows, above };
}

/** Simulated fuzzy design: take-up 0.2 → 0.7 at c = 0, outcome by `kind`. */
export function simulate(
  n: number,
  seed: number,
  kind: 'continuous' | 'discrete' | 'binary' | 'ties',
): { score: number[]; treated: number[]; outcome: number[] } {
  const rng = new Random(seed);
  const score: number[] = [];
  const treated: number[] = [];
  const outcome: number[] = [];
  for (let i = 0; i < n; i++) {
    const r = 2 * rng.uniform() - 1;
    const d = rng.uniform() < (r >= 0 ? 0.7 : 0.2) + 0.1 * r ? 1 : 0;
    const y0 = 1 + 0.5 * r + d + rng.normal();
    let y: number;
    if (kind === 'continuous') y = y0;
    else if (kind === 'discrete') y = Math.max(0, Math.min(9, Math.round(2 * y0 + 2)));
    else if (kind === 'binary') y = y0 > 1.5 ? 1 : 0;
    else y = Math.max(0, Math.min(40, Math.round(4 * y0 + 10)));
    score.push(Math.round(r * 1000) / 1000); // ties in the score too
    treated.push(d);
    outcome.push(y);
  }
  return { score, treated, outcome };
}
