/**
 * The approximate permutation test of Canay & Kamat (2018, Review of Economic
 * Studies 85(3)) for continuity of a covariate's distribution at the cutoff,
 * docs/methods.md §7.
 *
 * - The q units closest to the cutoff on each side (below: R < c; above:
 *   R ≥ c), chosen by a bounded max-heap in one pass (no sort of all rows);
 *   when units tie at the q-th distance, the ones kept are drawn among the
 *   tied units (put in order of covariate value) by a seeded stream of their
 *   own, with a warning, so that the choice does not depend on the row order
 *   (Cutline's choice).
 * - Cramér–von Mises statistic, CK's normalisation (their eq. (12)):
 *   T = (1/2q)·Σ_{i=1}^{2q} (H⁻(W_i) − H⁺(W_i))², H∓ the empirical CDFs of the
 *   covariate among the q units below/above and W the 2q pooled values. For
 *   equal sizes this is 2/q times the Anderson (1962) statistic that SciPy's
 *   cramervonmises_2samp reports; the test checks that.
 * - p-value = (1 + #{b: T_b ≥ T})/(1 + B) over B seeded random permutations
 *   of the pooled values (the observed split counts as one permutation, so p
 *   is never 0). Statistics are compared in exact integer arithmetic.
 * - q, unless given: CK's rule of thumb, recalled from memory (§3.1):
 *   q = ⌈f̂(c)·σ̂_R·sqrt(1 − ρ̂²)·n^0.9/ln n⌉, f̂(c) a Gaussian kernel density
 *   estimate at c with Silverman's bandwidth 1.06·σ̂_R·n^(−1/5), ρ̂ the
 *   correlation of score and covariate; Cutline bounds it below by 10 and
 *   above by the smaller side's count.
 *
 * @example permutationBalanceTest(score, dwellingAge, 60).pvalue
 */
import { CutlineError } from '../errors';
import { Random } from '../numeric';
import { requireBothSides, scoreSummary, ScoreSummary } from '../data';

export interface PermutationBalanceOptions {
  q?: number;
  permutations?: number;
  seed?: number;
  rows?: Int32Array;
}

export interface PermutationBalanceResult {
  statistic: number;
  pvalue: number;
  q: number;
  /** 'given' or 'rule_of_thumb'. */
  q_rule: 'given' | 'rule_of_thumb';
  permutations: number;
  seed: number;
  warnings: string[];
}

export const MIN_Q = 5;

/** CK's Cramér–von Mises statistic (1/N)·Σ_pooled (F_a − F_b)² for samples of any sizes. */
export function cramerVonMises(a: ArrayLike<number>, b: ArrayLike<number>): number {
  const v = [...Array.from(a, (x) => [x, 0]), ...Array.from(b, (x) => [x, 1])].sort((p, r) => p[0] - r[0]);
  let ca = 0;
  let cb = 0;
  let s = 0;
  for (let i = 0; i < v.length; ) {
    let k = i;
    while (k < v.length && v[k][0] === v[i][0]) (v[k++][1] === 0 ? ca++ : cb++);
    s += (k - i) * (ca / a.length - cb / b.length) ** 2;
    i = k;
  }
  return s / v.length;
}

/** Positions of the q units nearest the cutoff on one side (ties at the q-th distance drawn by `rng`, see below). */
function nearest(
  score: ArrayLike<number>,
  covariate: ArrayLike<number>,
  cutoff: number,
  q: number,
  above: boolean,
  rng: Random,
  rows?: Int32Array,
): { pos: Int32Array; tied: boolean } {
  const d = new Float64Array(q);
  const p = new Int32Array(q);
  let size = 0;
  const worse = (i: number, j: number) => d[i] > d[j] || (d[i] === d[j] && p[i] > p[j]);
  const total = rows ? rows.length : score.length;
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    const x = score[i] - cutoff;
    if ((x >= 0) !== above) continue;
    const dist = Math.abs(x);
    if (size < q) {
      let c = size++;
      d[c] = dist;
      p[c] = i;
      while (c > 0) {
        const par = (c - 1) >> 1;
        if (!worse(c, par)) break;
        [d[c], d[par]] = [d[par], d[c]];
        [p[c], p[par]] = [p[par], p[c]];
        c = par;
      }
    } else if (dist < d[0] || (dist === d[0] && i < p[0])) {
      d[0] = dist;
      p[0] = i;
      let c = 0;
      for (;;) {
        const l = 2 * c + 1;
        const r = l + 1;
        let m = c;
        if (l < q && worse(l, m)) m = l;
        if (r < q && worse(r, m)) m = r;
        if (m === c) break;
        [d[c], d[m]] = [d[m], d[c]];
        [p[c], p[m]] = [p[m], p[c]];
        c = m;
      }
    }
  }
  // Does the q-th distance tie with a unit left out?
  const dq = d[0];
  let atDq = 0;
  let inHeap = 0;
  for (let k = 0; k < q; k++) if (d[k] === dq) inHeap++;
  for (let t = 0; t < total; t++) {
    const x = score[rows ? rows[t] : t] - cutoff;
    if ((x >= 0) === above && Math.abs(x) === dq) atDq++;
  }
  if (atDq <= inHeap) return { pos: p, tied: false };
  // Units tie at the q-th distance: the ones kept must not depend on the order of
  // the rows. All tied units, in the order of their covariate values (equal values
  // are interchangeable in the statistic), then a seeded draw of as many as fit.
  const closer: number[] = [];
  for (let k = 0; k < q; k++) if (d[k] < dq) closer.push(p[k]);
  const tiedAll: number[] = [];
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    const x = score[i] - cutoff;
    if ((x >= 0) === above && Math.abs(x) === dq) tiedAll.push(i);
  }
  tiedAll.sort((a, b) => covariate[a] - covariate[b]);
  const need = q - closer.length;
  for (let k = 0; k < need; k++) {
    const j = k + rng.integer(tiedAll.length - k);
    [tiedAll[k], tiedAll[j]] = [tiedAll[j], tiedAll[k]];
  }
  return { pos: Int32Array.from([...closer, ...tiedAll.slice(0, need)]), tied: true };
}

/**
 * Fisher–Yates shuffle drawing each index from one 32-bit word, exactly
 * uniform by Lemire's rejection: about twice as fast as Random.shuffle,
 * which spends 53 bits a draw, and just as reproducible.
 */
function shuffleLabels(rng: Random, a: Uint8Array): void {
  for (let i = a.length - 1; i > 0; i--) {
    // Lemire (2019, ACM TOMACS 29(1)) multiply-and-reject; x·m < 2⁵³ is exact in doubles.
    const m = i + 1;
    let prod = rng.nextUint32() * m;
    let j = Math.floor(prod / 4294967296);
    let low = prod - j * 4294967296;
    if (low < m) {
      const threshold = (4294967296 - m) % m;
      while (low < threshold) {
        prod = rng.nextUint32() * m;
        j = Math.floor(prod / 4294967296);
        low = prod - j * 4294967296;
      }
    }
    const t = a[i];
    a[i] = a[j];
    a[j] = t;
  }
}

/** CK's rule-of-thumb q (recalled from memory; see the doc comment), before bounds. */
export function canayKamatQ(score: ArrayLike<number>, covariate: ArrayLike<number>, cutoff: number, s: ScoreSummary, rows?: Int32Array): number {
  const n = s.n;
  const bw = 1.06 * s.sd * Math.pow(n, -0.2);
  let kde = 0;
  let mw = 0;
  const total = rows ? rows.length : score.length;
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    const u = (score[i] - cutoff) / bw;
    kde += Math.exp(-0.5 * u * u);
    mw += covariate[i];
  }
  kde /= n * bw * Math.sqrt(2 * Math.PI);
  mw /= n;
  let sxy = 0;
  let sww = 0;
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    sxy += (score[i] - s.mean) * (covariate[i] - mw);
    sww += (covariate[i] - mw) ** 2;
  }
  const rho = sww > 0 ? sxy / ((n - 1) * s.sd * Math.sqrt(sww / (n - 1))) : 0;
  return Math.ceil((kde * s.sd * Math.sqrt(Math.max(0, 1 - rho * rho)) * Math.pow(n, 0.9)) / Math.log(n));
}

export function permutationBalanceTest(
  score: ArrayLike<number>,
  covariate: ArrayLike<number>,
  cutoff: number,
  opts: PermutationBalanceOptions = {},
): PermutationBalanceResult {
  if (covariate.length !== score.length) {
    throw new CutlineError(`the covariate has ${covariate.length} rows but the score has ${score.length}`);
  }
  const s = scoreSummary(score, cutoff, opts.rows);
  const total = opts.rows ? opts.rows.length : score.length;
  for (let t = 0; t < total; t++) {
    const i = opts.rows ? opts.rows[t] : t;
    if (!Number.isFinite(covariate[i])) throw new CutlineError(`the covariate must be a finite number; row ${i + 1} holds ${covariate[i]}`);
  }
  requireBothSides(s, MIN_Q, 'the permutation test of covariate balance');
  const B = opts.permutations ?? 999;
  const seed = opts.seed ?? 1;
  if (!Number.isInteger(B) || B < 1) throw new CutlineError(`the number of permutations must be a positive whole number, got ${B}`);
  if (!Number.isInteger(seed)) throw new CutlineError(`the seed must be a whole number, got ${seed}`);
  const warnings: string[] = [];
  const side = Math.min(s.below, s.above);
  let q: number;
  if (opts.q !== undefined) {
    q = opts.q;
    if (!Number.isInteger(q) || q < MIN_Q) {
      throw new CutlineError(`q (units nearest the cutoff on each side) must be a whole number of at least ${MIN_Q}, got ${q}`);
    }
    if (q > side) {
      throw new CutlineError(
        `q = ${q} units on each side are asked for, but only ${s.below} lie below and ${s.above} above the cutoff`,
      );
    }
  } else {
    q = Math.max(10, canayKamatQ(score, covariate, cutoff, s, opts.rows));
    if (q > side) {
      q = side;
      warnings.push(`the permutation test uses q = ${q}, all the units on the smaller side of the cutoff`);
    }
  }
  // Its own stream of the seed, so that the permutations below are those of an untied sample.
  const tieRng = new Random((seed ^ 0x5bd1e995) >>> 0);
  const lo = nearest(score, covariate, cutoff, q, false, tieRng, opts.rows);
  const hi = nearest(score, covariate, cutoff, q, true, tieRng, opts.rows);
  if (lo.tied || hi.tied) {
    warnings.push(
      'the permutation test: scores tie at the q-th place from the cutoff; the units kept among the tied ones were drawn at random (seeded), so the result does not depend on the order of the rows',
    );
  }
  // Pool, sort once; a permutation only reshuffles the side labels.
  const m = 2 * q;
  const order = Array.from({ length: m }, (_, k) => (k < q ? lo.pos[k] : hi.pos[k - q]));
  const label = new Uint8Array(m);
  // Sorted by (covariate, side): within equal covariate values the labels start in a
  // canonical order, so that the seeded permutations do not depend on the row order.
  const sideOf = (k: number): number => (k >= q ? 1 : 0);
  const idx = Array.from({ length: m }, (_, k) => k).sort((a, b) => covariate[order[a]] - covariate[order[b]] || sideOf(a) - sideOf(b) || a - b);
  for (let k = 0; k < m; k++) label[k] = idx[k] >= q ? 1 : 0;
  const ends: number[] = [];
  for (let k = 1; k <= m; k++) if (k === m || covariate[order[idx[k]]] !== covariate[order[idx[k - 1]]]) ends.push(k);
  if (ends.length === 1) warnings.push('the covariate takes a single value among the units nearest the cutoff; the permutation test has no power (p = 1)');
  // Integer form: Σ_groups size·(C⁻ − C⁺)², T = that / (2q·q²).
  const groupEnd = Int32Array.from(ends);
  const noTies = groupEnd.length === m;
  const sumSq = (lab: Uint8Array): number => {
    if (noTies) {
      let d = 0;
      let sq = 0;
      for (let k = 0; k < m; k++) {
        d += 1 - 2 * lab[k];
        sq += d * d;
      }
      return sq;
    }
    let c = 0; // running (count below − count above)
    let start = 0;
    let acc = 0;
    for (let g = 0; g < groupEnd.length; g++) {
      const e = groupEnd[g];
      for (let k = start; k < e; k++) c += lab[k] ? -1 : 1;
      acc += (e - start) * c * c;
      start = e;
    }
    return acc;
  };
  const observed = sumSq(label);
  const rng = new Random(seed);
  let atLeast = 0;
  for (let b = 0; b < B; b++) {
    shuffleLabels(rng, label);
    if (sumSq(label) >= observed) atLeast++;
  }
  return {
    statistic: observed / (m * q * q),
    pvalue: (1 + atLeast) / (1 + B),
    q,
    q_rule: opts.q !== undefined ? 'given' : 'rule_of_thumb',
    permutations: B,
    seed,
    warnings,
  };
}
