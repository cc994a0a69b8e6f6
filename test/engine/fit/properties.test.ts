/**
 * Property tests (fast-check) of the local linear estimates (METHODS.md §2)
 * and of the mse / cer bandwidths (§3). These are exact algebraic facts of
 * weighted least squares, not outside references: invariance to the score's
 * origin and units, exactness on lines, equivariance in the outcome, and the
 * reproducing identities of the smoother weights. Runs use a fixed fast-check
 * seed so every machine checks the same cases.
 */
import fc from 'fast-check';
import { bandwidthMse } from '../../../src/engine/bandwidth/bandwidthMse';
import { chooseBandwidth } from '../../../src/engine/bandwidth/bandwidth';
import { applyWeights, boundaryWindow } from '../../../src/engine/fit/boundaryWindow';
import { effectAt, jumpAt } from '../../../src/engine/fit/jumpAt';
import { KernelName } from '../../../src/engine/fit/kernels';
import { Random } from '../../../src/engine/numeric/random';
import { biasCorrectedWeights } from '../../../src/engine/fit/smoothJump';

const RUNS = { numRuns: 60, seed: 20240601 };
const kernels: KernelName[] = ['triangular', 'epanechnikov', 'uniform'];

interface Data {
  score: Float64Array;
  outcome: Float64Array;
  treated: Float64Array;
  cutoff: number;
  h: number;
}

/**
 * Scores uniform on (−1, 1), kept at least 1e-3 from the cutoff and from the
 * window's edges c ± h, so that rounding in a shifted or rescaled score cannot
 * move a unit across the cutoff or the window's edge.
 */
function makeData(seed: number, n: number, cutoff: number, h: number): Data {
  const rng = new Random(seed);
  const s: number[] = [];
  while (s.length < n) {
    const r = 2 * rng.uniform() - 1;
    const ax = Math.abs(r - cutoff);
    if (ax < 1e-3 || Math.abs(ax - h) < 1e-3) continue;
    s.push(r);
  }
  const score = Float64Array.from(s);
  const treated = score.map((r) => (rng.uniform() < 0.2 + 0.6 * (r >= cutoff ? 1 : 0) ? 1 : 0));
  const outcome = score.map((r, i) => {
    const x = r - cutoff;
    return 1 + 0.5 * x - x * x + 1.5 * x ** 3 + 0.7 * treated[i] + 0.4 * rng.normal();
  });
  return { score, outcome, treated, cutoff, h };
}

const dataArb = fc
  .record({
    seed: fc.integer({ min: 1, max: 2 ** 31 - 1 }),
    n: fc.integer({ min: 150, max: 400 }),
    cutoff: fc.double({ min: -0.3, max: 0.3, noNaN: true }),
    h: fc.double({ min: 0.35, max: 0.7, noNaN: true }),
    kernel: fc.constantFrom(...kernels),
  })
  .map((p) => ({ ...makeData(p.seed, p.n, p.cutoff, p.h), kernel: p.kernel }));

function close(a: number, b: number, tol: number, scale = 1): boolean {
  return Math.abs(a - b) <= tol * Math.max(scale, Math.abs(a), Math.abs(b));
}

test('the jump and its se are unchanged when the score is shifted and rescaled (cutoff and bandwidth alike)', () => {
  fc.assert(
    fc.property(
      dataArb,
      fc.double({ min: -100, max: 100, noNaN: true }),
      fc.double({ min: 1e-3, max: 1e3, noNaN: true }),
      (d, shift, a) => {
        const base = jumpAt(boundaryWindow(d.score, d.cutoff, d.h, d.kernel), d.outcome, { variance: 'hc0' });
        const s2 = d.score.map((r) => a * r + shift);
        const moved = jumpAt(boundaryWindow(s2, a * d.cutoff + shift, a * d.h, d.kernel), d.outcome, { variance: 'hc0' });
        return (
          close(moved.estimate, base.estimate, 1e-8, base.se) &&
          close(moved.se, base.se, 1e-8) &&
          close(moved.estimate_robust, base.estimate_robust, 1e-8, base.se_robust) &&
          close(moved.se_robust, base.se_robust, 1e-8)
        );
      },
    ),
    RUNS,
  );
});

test('exactly linear data: the same line on both sides gives a zero jump; different lines give the gap at c', () => {
  fc.assert(
    fc.property(
      dataArb,
      fc.tuple(fc.double({ min: -10, max: 10, noNaN: true }), fc.double({ min: -10, max: 10, noNaN: true })),
      fc.tuple(fc.double({ min: -10, max: 10, noNaN: true }), fc.double({ min: -10, max: 10, noNaN: true })),
      (d, [a1, b1], [a0, b0]) => {
        const win = boundaryWindow(d.score, d.cutoff, d.h, d.kernel);
        const same = d.score.map((r) => a1 + b1 * (r - d.cutoff));
        const two = d.score.map((r) => (r >= d.cutoff ? a1 + b1 * (r - d.cutoff) : a0 + b0 * (r - d.cutoff)));
        const scale = 1 + Math.abs(a1) + Math.abs(b1) + Math.abs(a0) + Math.abs(b0);
        const e1 = jumpAt(win, same, { variance: 'hc0' });
        const e2 = jumpAt(win, two, { variance: 'hc1' });
        return (
          Math.abs(e1.estimate) <= 1e-12 * scale &&
          Math.abs(e1.estimate_robust) <= 1e-10 * scale &&
          Math.abs(e2.estimate - (a1 - a0)) <= 1e-12 * scale &&
          Math.abs(e2.estimate_robust - (a1 - a0)) <= 1e-10 * scale &&
          e2.se <= 1e-12 * scale // no residual, no variance
        );
      },
    ),
    RUNS,
  );
});

test('adding δ to every outcome above the cutoff moves the jump by exactly δ; the se does not move', () => {
  fc.assert(
    fc.property(dataArb, fc.double({ min: -50, max: 50, noNaN: true }), (d, delta) => {
      const win = boundaryWindow(d.score, d.cutoff, d.h, d.kernel);
      const base = jumpAt(win, d.outcome, { variance: 'hc0' });
      const y2 = d.outcome.map((v, i) => (d.score[i] >= d.cutoff ? v + delta : v));
      const moved = jumpAt(win, y2, { variance: 'hc0' });
      const scale = 1 + Math.abs(delta);
      return (
        Math.abs(moved.estimate - base.estimate - delta) <= 1e-12 * scale &&
        Math.abs(moved.estimate_robust - base.estimate_robust - delta) <= 1e-10 * scale &&
        close(moved.se, base.se, 1e-10 * scale) &&
        close(moved.se_robust, base.se_robust, 1e-9 * scale)
      );
    }),
    RUNS,
  );
});

test('the estimate is a weighted sum: intercept weights sum to 1, slope weights to 0 (and reproduce x); bias-corrected weights sum to 1', () => {
  fc.assert(
    fc.property(dataArb, (d) => {
      const win = boundaryWindow(d.score, d.cutoff, d.h, d.kernel);
      const jump = jumpAt(win, d.outcome, { variance: 'hc0' }).estimate;
      const byHand =
        applyWeights(win.above.coef1[0], win.above.index, d.outcome) - applyWeights(win.below.coef1[0], win.below.index, d.outcome);
      if (!close(jump, byHand, 1e-13)) return false;
      for (const side of [win.above, win.below]) {
        const [w0, w1] = side.coef1;
        const wb = biasCorrectedWeights(side);
        let s0 = 0, s1 = 0, s0x = 0, s1x = 0, sb = 0, sbx = 0, sbx2 = 0, abs1 = 0; // prettier-ignore
        for (let t = 0; t < w0.length; t++) {
          const x = side.x[t];
          s0 += w0[t];
          s0x += w0[t] * x;
          s1 += w1[t];
          s1x += w1[t] * x;
          abs1 += Math.abs(w1[t]);
          sb += wb[t];
          sbx += wb[t] * x;
          sbx2 += wb[t] * x * x;
        }
        const ok =
          Math.abs(s0 - 1) < 1e-12 &&
          Math.abs(s0x) < 1e-12 * d.h &&
          Math.abs(s1) < 1e-12 * abs1 &&
          Math.abs(s1x - 1) < 1e-12 &&
          Math.abs(sb - 1) < 1e-11 &&
          Math.abs(sbx) < 1e-11 * d.h &&
          Math.abs(sbx2) < 1e-11 * d.h * d.h;
        if (!ok) return false;
      }
      return true;
    }),
    RUNS,
  );
});

test('fuzzy effect: outcome × a scales effect and se by a; outcome + k leaves both unchanged', () => {
  fc.assert(
    fc.property(
      dataArb,
      fc.double({ min: -20, max: 20, noNaN: true }).filter((a) => Math.abs(a) > 1e-3),
      fc.double({ min: -100, max: 100, noNaN: true }),
      (d, a, k) => {
        const win = boundaryWindow(d.score, d.cutoff, d.h, d.kernel);
        const base = effectAt(win, d.outcome, d.treated, { variance: 'hc0' });
        const scaled = effectAt(win, d.outcome.map((v) => a * v), d.treated, { variance: 'hc0' });
        const shifted = effectAt(win, d.outcome.map((v) => v + k), d.treated, { variance: 'hc0' });
        const tol = 1e-9 * (1 + Math.abs(k));
        return (
          close(scaled.estimate, a * base.estimate, 1e-10, Math.abs(a) * base.se) &&
          close(scaled.se, Math.abs(a) * base.se, 1e-10) &&
          close(shifted.estimate, base.estimate, tol, base.se) &&
          close(shifted.se, base.se, tol)
        );
      },
    ),
    RUNS,
  );
});

describe('mse bandwidth (bandwidthMse) invariances, and cer = mse·n^(−1/20)', () => {
  const MSE_RUNS = { numRuns: 25, seed: 7 };
  const arb = fc.record({
    seed: fc.integer({ min: 1, max: 2 ** 31 - 1 }),
    n: fc.integer({ min: 300, max: 800 }),
    cutoff: fc.double({ min: -0.3, max: 0.3, noNaN: true }),
    kernel: fc.constantFrom(...kernels),
    fuzzy: fc.boolean(),
  });

  test('score × a (cutoff × a) ⇒ h × a; score + s ⇒ h unchanged; outcome + k ⇒ h unchanged', () => {
    fc.assert(
      fc.property(
        arb,
        fc.double({ min: 1e-3, max: 1e3, noNaN: true }),
        fc.double({ min: -100, max: 100, noNaN: true }),
        (p, a, k) => {
          const d = makeData(p.seed, p.n, p.cutoff, 0.5);
          const t = p.fuzzy ? d.treated : undefined;
          const h = bandwidthMse(d.score, d.outcome, d.cutoff, p.kernel, t).bandwidth;
          const hs = bandwidthMse(d.score.map((r) => a * r), d.outcome, a * d.cutoff, p.kernel, t).bandwidth;
          const hShift = bandwidthMse(d.score.map((r) => r + k), d.outcome, d.cutoff + k, p.kernel, t).bandwidth;
          const hy = bandwidthMse(d.score, d.outcome.map((v) => v + k), d.cutoff, p.kernel, t).bandwidth;
          return close(hs, a * h, 1e-8) && close(hShift, h, 1e-8) && close(hy, h, 1e-8);
        },
      ),
      MSE_RUNS,
    );
  });

  test('cer = mse · n^(−1/20) (Calonico, Cattaneo & Farrell 2020, as in METHODS.md §3)', () => {
    fc.assert(
      fc.property(arb, (p) => {
        const d = makeData(p.seed, p.n, p.cutoff, 0.5);
        const o = { kernel: p.kernel, treated: p.fuzzy ? d.treated : undefined };
        const mse = chooseBandwidth(d.score, d.outcome, d.cutoff, { ...o, rule: 'mse' }).value;
        const cer = chooseBandwidth(d.score, d.outcome, d.cutoff, { ...o, rule: 'cer' }).value;
        return close(cer, mse * Math.pow(p.n, -1 / 20), 1e-14);
      }),
      MSE_RUNS,
    );
  });
});
