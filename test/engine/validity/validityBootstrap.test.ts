/**
 * The validity test's multiplier bootstrap (METHODS.md §4; Andrews & Shi 2013,
 * Econometrica 81(2)): reduced Gaussian draws against the unit-level ones of
 * the dense implementation in test/validityDense.ts, Rademacher draws against
 * dense draws with the same multipliers, the exact Gaussian law of a single
 * moment's draw, and reproducibility.
 */
import { boundaryWindow } from '../../../src/engine/fit/boundaryWindow';
import { intervalClass } from '../../../src/engine/validity/intervalClass';
import { normalUpperTail } from '../../../src/engine/numeric/normal';
import { Random } from '../../../src/engine/numeric/random';
import { bootstrapMaxima, drawPlan, gaussianDraw, multiplierDraw } from '../../../src/engine/validity/validityBootstrap';
import { selectMoments, validityMoments } from '../../../src/engine/validity/validityMoments';
import { ranTest } from '../../helpers/validityRan';
import { denseValidity, simulate } from '../../helpers/validityDense';

function setup(kind: 'continuous' | 'binary' | 'ties', grid: number, sign: 1 | -1 = 1) {
  const d = simulate(700, 21, kind);
  const h = 0.5;
  const win = boundaryWindow(d.score, 0, h, 'triangular', { quadratic: false });
  const ys = [...win.above.index, ...win.below.index].map((i) => d.outcome[i]);
  const m = validityMoments(win, intervalClass(ys, grid), d.treated, d.outcome, 0.1, sign);
  const dense = denseValidity(d.score, d.treated, d.outcome, 0, h, 'triangular', grid, 0.1, sign);
  return { d, win, m, dense };
}

describe.each([
  ['continuous', 8, 1],
  ['ties', 30, 1],
  ['binary', 30, -1],
] as const)('%s outcome, grid %d, sign %d', (kind, grid, sign) => {
  const { win, m, dense } = setup(kind, grid, sign);
  const p = drawPlan(m);

  test('reduced Gaussian draws have the covariance Ψ′Ψ of the unit-level draws (to 1e-9)', () => {
    // The draw is linear in the normals z: feeding unit vectors gives its loading matrix L.
    const dim = 2 * (p.cells + 1);
    const L: Float64Array[] = [];
    for (let j = 0; j < dim; j++) {
      const z = new Float64Array(dim);
      z[j] = 1;
      const out = new Float64Array(m.count);
      gaussianDraw(p, z, null, out);
      for (let l = 0; l < m.count; l++) out[l] *= m.den[l]; // undo the studentisation
      L.push(out);
    }
    let worst = 0;
    let scale = 0;
    for (let a = 0; a < m.count; a++)
      for (let b = a; b < m.count; b++) {
        let red = 0;
        for (let j = 0; j < dim; j++) red += L[j][a] * L[j][b];
        let den = 0;
        const pa = dense.moments[a].psi;
        const pb = dense.moments[b].psi;
        for (let i = 0; i < pa.length; i++) den += pa[i] * pb[i];
        worst = Math.max(worst, Math.abs(red - den));
        scale = Math.max(scale, Math.abs(den));
      }
    expect(worst).toBeLessThan(1e-9 * scale);
  });

  test('Rademacher draws equal dense draws Σ U_i ψ_i(ℓ) with the same multipliers', () => {
    const rng = new Random(4);
    const plusSide = sign === 1 ? win.above : win.below;
    const minusSide = sign === 1 ? win.below : win.above;
    const U = new Map<number, number>();
    const uPlus = Float64Array.from(plusSide.index, (i) => { const u = rng.sign(); U.set(i, u); return u; });
    const uMinus = Float64Array.from(minusSide.index, (i) => { const u = rng.sign(); U.set(i, u); return u; });
    const out = new Float64Array(m.count);
    multiplierDraw(p, uPlus, uMinus, null, out);
    let bad = 0;
    dense.moments.forEach((dm, l) => {
      let v = 0;
      dense.rows.forEach((i, t) => (v += (U.get(i) as number) * dm.psi[t]));
      const want = v / Math.max(dm.se, dense.floor);
      if (Math.abs(out[l] - want) > 1e-9 * Math.max(1, Math.abs(want))) bad++;
    });
    expect(bad).toBe(0);
  });
});

test('a single moment: the bootstrap p-value is the normal upper tail of its t (exact Gaussian law given the data; Andrews & Shi 2013)', () => {
  const { m } = setup('continuous', 8, 1);
  // A moment whose se exceeds the floor and whose t is near the middle of N(0,1)'s tail.
  let pick = -1;
  for (let l = 0; l < m.count; l++) if (m.se[l] > m.floor && m.t[l] > 0.3 && m.t[l] < 1.5) { pick = l; break; }
  expect(pick).toBeGreaterThanOrEqual(0);
  const one = selectMoments(m, [pick]);
  const B = 40000;
  const tstar = bootstrapMaxima([one], [new Float64Array(1)], B, 7, 'normal');
  const t = one.t[0];
  let exceed = 0, s = 0, s2 = 0;
  for (const v of tstar) { if (v >= t) exceed++; s += v; s2 += v * v; }
  const p = exceed / B;
  const want = normalUpperTail(t);
  expect(Math.abs(p - want)).toBeLessThan(4 * Math.sqrt((want * (1 - want)) / B));
  expect(Math.abs(s / B)).toBeLessThan(4 / Math.sqrt(B));
  expect(Math.abs(s2 / B - 1)).toBeLessThan(4 * Math.sqrt(2 / B));
});

describe('reproducibility', () => {
  const d = simulate(600, 5, 'continuous');
  const opts = { bandwidth: 0.6, kernel: 'triangular' as const };
  test('same seed gives the same p-value; another seed differs in draws', () => {
    const a = ranTest(d.score, d.treated, d.outcome, 0, opts);
    const b = ranTest(d.score, d.treated, d.outcome, 0, opts);
    expect(b.pvalue).toBe(a.pvalue);
    expect(b.critical_value).toBe(a.critical_value);
    const c = ranTest(d.score, d.treated, d.outcome, 0, { ...opts, seed: 2 });
    expect(c.critical_value).not.toBe(a.critical_value);
  });
  test('snapshot of the exact p-values (guards cross-machine reproducibility)', () => {
    const a = ranTest(d.score, d.treated, d.outcome, 0, opts);
    const r = ranTest(d.score, d.treated, d.outcome, 0, { ...opts, multiplier: 'rademacher', draws: 199, seed: 3 });
          // Values produced by this engine at commit time (seeded xoshiro128** + Box–Muller), not an outside source.
    expect([a.statistic.toFixed(10), a.pvalue, a.critical_value.toFixed(10)]).toEqual(['2.1647575974', 547 / 999, '3.1376649290']);
    // Rademacher signs go to units in the canonical order of validityBootstrap.ts (tied scores by cell).
    expect([r.pvalue, r.critical_value.toFixed(10)]).toEqual([71 / 199, '2.7031245442']);
  });
  test('Rademacher draws do not depend on the order of the rows (tied scores)', () => {
    // A property of Cutline's canonical order; no outside source needed.
    const n = d.score.length;
    const perm = Array.from({ length: n }, (_, i) => (i * 7 + 3) % n); // 7 is coprime with 600
    const pick = (a: number[]): number[] => perm.map((p) => a[p]);
    const ro = { ...opts, multiplier: 'rademacher' as const, draws: 199, seed: 3 };
    const a = ranTest(d.score, d.treated, d.outcome, 0, ro);
    const b = ranTest(pick(d.score), pick(d.treated), pick(d.outcome), 0, ro);
    expect(b.pvalue).toBe(a.pvalue);
    expect(b.critical_value).toBeCloseTo(a.critical_value, 12);
  });
});
