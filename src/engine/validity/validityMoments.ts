/**
 * Estimates, hc0 variances and studentised values of every moment of the
 * validity test (docs/methods.md §4.2; Arai, Hsu, Kitagawa, Mourifié & Wan 2022,
 * Quantitative Economics 13(1)) on one window, from per-bin sums.
 *
 * A moment ℓ = (I, d) is the indicator g_ℓ = 1{Y ∈ I, D = d}, I a union of
 * consecutive bins. On side s its local linear intercept and slope are
 * â_s = Σ_{i∈ℓ} ω_i and b̂_s = Σ_{i∈ℓ} β_i (ω, β the window's intercept and
 * slope weights). As g ∈ {0, 1}, the hc0 variance of â_s expands into sums
 * over the bins plus side totals:
 *
 *   Σ_s ω_i² (g_i − â − b̂x_i)² = Q₀(ℓ) − 2[â Q₀(ℓ) + b̂ Q₁(ℓ)] + â² S₀ + 2âb̂ S₁ + b̂² S₂,
 *
 * Q₀ = Σ_{i∈ℓ} ω², Q₁ = Σ_{i∈ℓ} ω²x, S_j = Σ_{i∈s} ω² xʲ. So every moment costs
 * O(1) after one pass over the window: no units × intervals matrix.
 *
 * ν(I,1) = p₋(I,1) − p₊(I,1), ν(I,0) = p₊(I,0) − p₋(I,0); t = ν̂ / max(σ̂, f),
 * f = ξ·sqrt(Σ_{i∈W} ω_i²). Cutline's addition: the denominator never falls
 * below 1e−8·sqrt(Σ_W ω²), so that a moment fitted exactly (σ̂ = 0, possible
 * only with trim 0) never divides by zero. Order: arm 1 first, then first
 * bin, then last bin.
 */
import { SideFit, Window, gathered } from '../fit';
import { IntervalClass, binOf } from './intervalClass';

/** Per window unit (side order): its cell, ω and ωx — what unit-level multipliers (Rademacher) need. */
export interface UnitTerms {
  cell: Int32Array;
  w: Float64Array;
  wx: Float64Array;
}

/** Per-side cell sums; cell = arm-1 bins 0..G′−1, then arm-0 bins G′..2G′−1. */
export interface SideSums {
  /** Σω, Σβ, Σω², Σω²x per cell. */
  sw: Float64Array;
  sb: Float64Array;
  q0: Float64Array;
  q1: Float64Array;
  /** Σω², Σω²x, Σω²x² over the side. */
  s0: number;
  s1: number;
  s2: number;
  /** Units of the side in the window. */
  n: number;
  /** The per-unit terms, made on first call (the normal bootstrap never needs them) and then kept. */
  units(): UnitTerms;
}

/** All moments of one window (one covariate cell). */
export interface MomentSet {
  cls: IntervalClass;
  /** The + side (take-up rises from − to +) and the − side. */
  plus: SideSums;
  minus: SideSums;
  /** f = ξ·sqrt(Σ_W ω²), and the denominator floor actually used. */
  floor: number;
  denFloor: number;
  count: number;
  arm: Uint8Array;
  first: Int32Array;
  last: Int32Array;
  estimate: Float64Array;
  se: Float64Array;
  den: Float64Array;
  t: Float64Array;
  /** Intercepts and slopes of g_ℓ on each side (for the bootstrap's residuals). */
  aPlus: Float64Array;
  bPlus: Float64Array;
  aMinus: Float64Array;
  bMinus: Float64Array;
}

/** `bins`: the bin of each of the side's units in window order (intervalClass's binsOut), else looked up. */
function sideSums(side: SideFit, cls: IntervalClass, treated: ArrayLike<number>, outcome: ArrayLike<number>, bins?: Int32Array): SideSums {
  const G = cls.bins;
  const n = side.index.length;
  const [om, be] = side.coef1;
  const xs = side.x;
  const ds = gathered(side, treated);
  let unitBins = bins;
  if (!unitBins) {
    const ys = gathered(side, outcome);
    unitBins = new Int32Array(n);
    for (let t = 0; t < n; t++) unitBins[t] = binOf(cls, ys[t]);
  }
  const sums = cellSums(om, be, xs, unitBins, ds, G);
  const cells = unitBins;
  let units: UnitTerms | undefined;
  const makeUnits = (): UnitTerms => {
    const u = { cell: new Int32Array(n), w: new Float64Array(n), wx: new Float64Array(n) };
    for (let t = 0; t < n; t++) {
      u.cell[t] = cells[t] + (ds[t] === 1 ? 0 : G);
      u.w[t] = om[t];
      u.wx[t] = om[t] * xs[t];
    }
    return u;
  };
  return { ...sums, n, units: () => (units ??= makeUnits()) };
}

/**
 * The per-cell and per-side sums of one side, in one pass over its units
 * (cell = bin for the treated, G + bin for the untreated). A function of its
 * own, with nothing but arrays to read: V8 compiles its one long loop quickly.
 */
function cellSums(
  om: Float64Array,
  be: Float64Array,
  xs: Float64Array,
  bins: Int32Array,
  ds: Float64Array,
  G: number,
): Pick<SideSums, 'sw' | 'sb' | 'q0' | 'q1' | 's0' | 's1' | 's2'> {
  const sw = new Float64Array(2 * G);
  const sb = new Float64Array(2 * G);
  const q0 = new Float64Array(2 * G);
  const q1 = new Float64Array(2 * G);
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  for (let t = 0; t < om.length; t++) {
    const c = bins[t] + (ds[t] === 1 ? 0 : G);
    const w = om[t];
    const x = xs[t];
    const w2 = w * w;
    sw[c] += w;
    sb[c] += be[t];
    q0[c] += w2;
    q1[c] += w2 * x;
    s0 += w2;
    s1 += w2 * x;
    s2 += w2 * x * x;
  }
  return { sw, sb, q0, q1, s0, s1, s2 };
}

/** hc0 variance on one side of a moment with intercept a, slope b and in-moment sums Q₀, Q₁. */
function sideVariance(s: SideSums, a: number, b: number, Q0: number, Q1: number): number {
  return Q0 - 2 * (a * Q0 + b * Q1) + a * a * s.s0 + 2 * a * b * s.s1 + b * b * s.s2;
}

/**
 * Every moment of the window. `sign` +1: the + side is above the cutoff;
 * −1: below (take-up falls at c as the score rises). `bins`: each side's
 * units' bins, when intervalClass has found them.
 */
export function validityMoments(
  win: Window,
  cls: IntervalClass,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  trim: number,
  sign: 1 | -1,
  bins?: { above: Int32Array; below: Int32Array },
): MomentSet {
  const plusSide = sign === 1 ? win.above : win.below;
  const minusSide = sign === 1 ? win.below : win.above;
  const plus = sideSums(plusSide, cls, treated, outcome, bins && (sign === 1 ? bins.above : bins.below));
  const minus = sideSums(minusSide, cls, treated, outcome, bins && (sign === 1 ? bins.below : bins.above));
  const root = Math.sqrt(plus.s0 + minus.s0);
  const floor = trim * root;
  const denFloor = Math.max(floor, 1e-8 * root);
  const G = cls.bins;
  const count = G * (G + 1);
  const m: MomentSet = {
    cls,
    plus,
    minus,
    floor,
    denFloor,
    count,
    arm: new Uint8Array(count),
    first: new Int32Array(count),
    last: new Int32Array(count),
    estimate: new Float64Array(count),
    se: new Float64Array(count),
    den: new Float64Array(count),
    t: new Float64Array(count),
    aPlus: new Float64Array(count),
    bPlus: new Float64Array(count),
    aMinus: new Float64Array(count),
    bMinus: new Float64Array(count),
  };
  let l = 0;
  for (const arm of [1, 0]) {
    const off = arm === 1 ? 0 : G;
    const cPlus = arm === 1 ? -1 : 1;
    for (let j = 0; j < G; j++) {
      let ap = 0, bp = 0, qp0 = 0, qp1 = 0, am = 0, bm = 0, qm0 = 0, qm1 = 0;
      for (let k = j; k < G; k++) {
        const c = off + k;
        ap += plus.sw[c];
        bp += plus.sb[c];
        qp0 += plus.q0[c];
        qp1 += plus.q1[c];
        am += minus.sw[c];
        bm += minus.sb[c];
        qm0 += minus.q0[c];
        qm1 += minus.q1[c];
        const v = sideVariance(plus, ap, bp, qp0, qp1) + sideVariance(minus, am, bm, qm0, qm1);
        const se = Math.sqrt(Math.max(0, v));
        const est = cPlus * (ap - am);
        const den = Math.max(se, denFloor);
        m.arm[l] = arm;
        m.first[l] = j;
        m.last[l] = k;
        m.estimate[l] = est;
        m.se[l] = se;
        m.den[l] = den;
        m.t[l] = est / den;
        m.aPlus[l] = ap;
        m.bPlus[l] = bp;
        m.aMinus[l] = am;
        m.bMinus[l] = bm;
        l++;
      }
    }
  }
  return m;
}

/** p̂₊(all, 1) − p̂₋(all, 1) and its hc0 standard error: the take-up jump. */
export function takeupOf(m: MomentSet): { estimate: number; se: number } {
  // The arm-1 interval holding every bin is moment G′−1 (first bin 0, last bin G′−1).
  const l = m.cls.bins - 1;
  return { estimate: -m.estimate[l], se: m.se[l] };
}

/** The moment set restricted to the moments `keep` (in that order); for tests of single moments. */
export function selectMoments(m: MomentSet, keep: number[]): MomentSet {
  const pick = <T extends Float64Array | Int32Array | Uint8Array>(a: T): T => {
    const out = new (a.constructor as { new (n: number): T })(keep.length);
    keep.forEach((l, j) => (out[j] = a[l]));
    return out;
  };
  return {
    ...m,
    count: keep.length,
    arm: pick(m.arm),
    first: pick(m.first),
    last: pick(m.last),
    estimate: pick(m.estimate),
    se: pick(m.se),
    den: pick(m.den),
    t: pick(m.t),
    aPlus: pick(m.aPlus),
    bPlus: pick(m.bPlus),
    aMinus: pick(m.aMinus),
    bMinus: pick(m.bMinus),
  };
}
