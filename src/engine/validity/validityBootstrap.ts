/**
 * The multiplier bootstrap of the validity test (docs/methods.md §4.5; Andrews & Shi
 * 2013, Econometrica 81(2), moment selection; Arai, Hsu, Kitagawa, Mourifié &
 * Wan 2022, Quantitative Economics 13(1)).
 *
 * A draw of moment ℓ is ν*(ℓ) = Σ_s c_s(ℓ) Σ_{i∈s} U_i ω_i ε̂_i(ℓ), where
 * ε̂_i(ℓ) = g_ℓ(i) − â_s(ℓ) − b̂_s(ℓ)x_i and c_s = ∓1 the sign of side s in ν. So
 *
 *   Σ_{i∈s} U_i ω_i ε̂_i(ℓ) = Σ_{c∈ℓ} S_c − â_s(ℓ) Σ_c S_c − b̂_s(ℓ) T,
 *   S_c = Σ_{i∈c} U_i ω_i (cells c = arm × bin),  T = Σ_{i∈s} U_i ω_i x_i.
 *
 * Normal multipliers: (S, T) is exactly Gaussian given the data, with
 * Var S_c = Σ_c ω², S_c independent across cells, Cov(S_c, T) = Σ_c ω²x,
 * Var T = Σ_s ω²x². Cutline draws it without a Cholesky factor:
 * S_c = sqrt(Σ_c ω²)·Z_c and T = Σ_c r_c S_c + η, r_c = Σ_c ω²x / Σ_c ω², η an
 * independent normal with variance Σ_s ω²x² − Σ_c (Σ_c ω²x)²/Σ_c ω² (≥ 0 by
 * Cauchy–Schwarz). Per side and draw that is 2G′ + 1 standard normals, drawn
 * for every cell (empty ones too, so the stream does not depend on the data),
 * + side before − side, arm-1 cells first; the cost does not grow with N.
 *
 * Rademacher multipliers: one ±1 per window unit (side order, + side first)
 * and the same cell sums: O(window + intervals) per draw.
 */
import { MomentSet, SideSums } from './validityMoments';
import { Random } from '../numeric';

export type MultiplierName = 'normal' | 'rademacher';

/** Per-side Gaussian loadings of the reduced draw. */
interface Loadings {
  sd: Float64Array;
  r: Float64Array;
  etaSd: number;
}

function loadings(s: SideSums): Loadings {
  const n = s.q0.length;
  const sd = new Float64Array(n);
  const r = new Float64Array(n);
  let explained = 0;
  for (let c = 0; c < n; c++) {
    if (s.q0[c] > 0) {
      sd[c] = Math.sqrt(s.q0[c]);
      r[c] = s.q1[c] / s.q0[c];
      explained += s.q1[c] * r[c];
    }
  }
  return { sd, r, etaSd: Math.sqrt(Math.max(0, s.s2 - explained)) };
}

/** Reusable buffers and loadings of one moment set. */
export interface DrawPlan {
  m: MomentSet;
  cells: number;
  plus: Loadings;
  minus: Loadings;
  sPlus: Float64Array;
  sMinus: Float64Array;
  prefix: Float64Array;
  /** Per moment: c₊/den, prefix positions. */
  scale: Float64Array;
  lo: Int32Array;
  hi: Int32Array;
}

export function drawPlan(m: MomentSet): DrawPlan {
  const G = m.cls.bins;
  const scale = new Float64Array(m.count);
  const lo = new Int32Array(m.count);
  const hi = new Int32Array(m.count);
  for (let l = 0; l < m.count; l++) {
    const off = m.arm[l] === 1 ? 0 : G + 1;
    scale[l] = (m.arm[l] === 1 ? -1 : 1) / m.den[l];
    lo[l] = off + m.first[l];
    hi[l] = off + m.last[l] + 1;
  }
  return {
    m,
    cells: 2 * G,
    plus: loadings(m.plus),
    minus: loadings(m.minus),
    sPlus: new Float64Array(2 * G),
    sMinus: new Float64Array(2 * G),
    prefix: new Float64Array(2 * (G + 1)),
    scale,
    lo,
    hi,
  };
}

/**
 * Studentised draws ν*(ℓ) ÷ den(ℓ) of every moment from the cell sums in
 * p.sPlus / p.sMinus and the T sums; writes into `out` when given and
 * returns max_ℓ [ν* ÷ den + φ] with φ from `phi` (null: φ = 0).
 */
function fromSums(p: DrawPlan, tPlus: number, tMinus: number, phi: Float64Array | null, out: Float64Array | null): number {
  const { m, sPlus, sMinus, prefix, scale, lo, hi } = p;
  const G = m.cls.bins;
  let totPlus = 0;
  let totMinus = 0;
  prefix[0] = 0;
  prefix[G + 1] = 0;
  for (let b = 0; b < G; b++) {
    prefix[b + 1] = prefix[b] + sPlus[b] - sMinus[b];
    prefix[G + 2 + b] = prefix[G + 1 + b] + sPlus[G + b] - sMinus[G + b];
    totPlus += sPlus[b] + sPlus[G + b];
    totMinus += sMinus[b] + sMinus[G + b];
  }
  const { aPlus, bPlus, aMinus, bMinus } = m;
  let best = -Infinity;
  for (let l = 0; l < m.count; l++) {
    const v =
      (prefix[hi[l]] - prefix[lo[l]] - aPlus[l] * totPlus - bPlus[l] * tPlus + aMinus[l] * totMinus + bMinus[l] * tMinus) *
      scale[l];
    if (out) out[l] = v;
    const w = phi ? v + phi[l] : v;
    if (w > best) best = w;
  }
  return best;
}

/**
 * One reduced Gaussian draw from the standard normals z (length 2·(2G′+1):
 * + side cells, + side η, − side cells, − side η). Linear in z, so feeding unit
 * vectors gives the draw's loading matrix (tests check its covariance).
 */
export function gaussianDraw(p: DrawPlan, z: ArrayLike<number>, phi: Float64Array | null, out: Float64Array | null): number {
  const n = p.cells;
  let tPlus = 0;
  let tMinus = 0;
  for (let c = 0; c < n; c++) {
    const sp = p.plus.sd[c] * z[c];
    const sm = p.minus.sd[c] * z[n + 1 + c];
    p.sPlus[c] = sp;
    p.sMinus[c] = sm;
    tPlus += p.plus.r[c] * sp;
    tMinus += p.minus.r[c] * sm;
  }
  tPlus += p.plus.etaSd * z[n];
  tMinus += p.minus.etaSd * z[2 * n + 1];
  return fromSums(p, tPlus, tMinus, phi, out);
}

/** One draw from unit-level multipliers (+ side and − side, in window side order). */
export function multiplierDraw(
  p: DrawPlan,
  uPlus: ArrayLike<number>,
  uMinus: ArrayLike<number>,
  phi: Float64Array | null,
  out: Float64Array | null,
): number {
  const tPlus = unitSums(p.m.plus, uPlus, p.sPlus);
  const tMinus = unitSums(p.m.minus, uMinus, p.sMinus);
  return fromSums(p, tPlus, tMinus, phi, out);
}

function unitSums(s: SideSums, u: ArrayLike<number>, into: Float64Array): number {
  const { cell, w, wx } = s.units();
  into.fill(0);
  let t = 0;
  for (let i = 0; i < w.length; i++) {
    into[cell[i]] += u[i] * w[i];
    t += u[i] * wx[i];
  }
  return t;
}

/**
 * The window's units in a canonical order for the unit-level draws: the side
 * order (by score, ties by row), with each run of units of equal ω and ωx —
 * tied scores — reordered by cell. Units equal in ω, ωx and cell contribute
 * alike, so the Rademacher p-value no longer depends on the order of the rows.
 * Returns, for rank j, the unit that receives the j-th sign.
 */
function canonicalRanks(sums: SideSums): Int32Array {
  const s = sums.units();
  const n = s.w.length;
  const unit = Int32Array.from({ length: n }, (_, i) => i);
  for (let a = 0; a < n; ) {
    let b = a + 1;
    while (b < n && s.w[b] === s.w[a] && s.wx[b] === s.wx[a]) b++;
    if (b - a > 1) {
      const run = Array.from(unit.subarray(a, b)).sort((i, j) => s.cell[i] - s.cell[j] || i - j);
      unit.set(run, a);
    }
    a = b;
  }
  return unit;
}

/** φ(ℓ) = 0 if t(ℓ) ≥ −κ, else −B (Andrews & Shi 2013 moment selection). */
export function selection(m: MomentSet, kappa: number, bn: number): Float64Array {
  const phi = new Float64Array(m.count);
  for (let l = 0; l < m.count; l++) phi[l] = m.t[l] >= -kappa ? 0 : -bn;
  return phi;
}

/**
 * T*_b = max over all moment sets (covariate cells, drawn independently) of
 * ν* ÷ den + φ, for b = 1..draws, with one generator seeded by `seed`. Sets are
 * drawn in the order given, within each draw.
 */
export function bootstrapMaxima(
  sets: MomentSet[],
  phis: Float64Array[],
  draws: number,
  seed: number,
  multiplier: MultiplierName,
): Float64Array {
  const rng = new Random(seed);
  const plans = sets.map(drawPlan);
  const zLen = Math.max(...plans.map((p) => 2 * (p.cells + 1)));
  const z = new Float64Array(zLen);
  const uLen = Math.max(...sets.map((m) => Math.max(m.plus.n, m.minus.n)));
  const uPlus = new Float64Array(multiplier === 'rademacher' ? uLen : 0);
  const uMinus = new Float64Array(multiplier === 'rademacher' ? uLen : 0);
  const ranks = multiplier === 'rademacher' ? plans.map((p) => [canonicalRanks(p.m.plus), canonicalRanks(p.m.minus)]) : [];
  const out = new Float64Array(draws);
  for (let b = 0; b < draws; b++) {
    let best = -Infinity;
    for (let g = 0; g < plans.length; g++) {
      const p = plans[g];
      let v: number;
      if (multiplier === 'normal') {
        const len = 2 * (p.cells + 1);
        for (let j = 0; j < len; j++) z[j] = rng.normal();
        v = gaussianDraw(p, z, phis[g], null);
      } else {
        const np = p.m.plus.n;
        const nm = p.m.minus.n;
        // The j-th sign drawn goes to the unit of canonical rank j (see canonicalRanks).
        const [rp, rm] = ranks[g];
        for (let j = 0; j < np; j++) uPlus[rp[j]] = rng.sign();
        for (let j = 0; j < nm; j++) uMinus[rm[j]] = rng.sign();
        v = multiplierDraw(p, uPlus, uMinus, phis[g], null);
      }
      if (v > best) best = v;
    }
    out[b] = best;
  }
  return out;
}
