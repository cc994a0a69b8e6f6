import fx from '../../fixtures/balance/balance_fixtures.json';
import { cramerVonMises, permutationBalanceTest } from '../../../src/engine/covariates/covariatePermutation';
import { CutlineError } from '../../../src/engine/errors';
import { Random } from '../../../src/engine/numeric/random';

describe('Cramér–von Mises statistic (Canay & Kamat 2018, eq. (12) normalisation)', () => {
  it('equals SciPy cramervonmises_2samp after the documented rescaling (test/fixtures/balance, SciPy 1.17)', () => {
    // SciPy (Anderson 1962): T = (m·n/N)·(1/N)Σ(F − G)²; Cutline/CK: (1/N)Σ(F − G)².
    for (const c of fx.cvm) {
      const m = c.a.length;
      const n = c.b.length;
      expect((cramerVonMises(c.a, c.b) * m * n) / (m + n)).toBeCloseTo(c.scipy_statistic, 12);
    }
  });

  it('a hand-worked example: {1,2,3} vs {4,5,6} gives (1/6)(1/9+4/9+1+4/9+1/9) = 19/54', () => {
    expect(cramerVonMises([1, 2, 3], [4, 5, 6])).toBeCloseTo(19 / 54, 15);
  });
});

describe('permutationBalanceTest', () => {
  it('selects the q nearest units on each side and reports CK statistic = (2/q)·SciPy (fixture, SciPy)', () => {
    const s = fx.selection;
    const res = permutationBalanceTest(s.score, s.covariate, s.cutoff, { q: s.q, permutations: 199 });
    expect(res.q).toBe(s.q);
    expect(res.q_rule).toBe('given');
    expect((res.statistic * s.q) / 2).toBeCloseTo(s.scipy_statistic, 12);
    // Same statistic recomputed from the fixture's selected rows.
    const a = s.below_rows.map((i) => s.covariate[i]);
    const b = s.above_rows.map((i) => s.covariate[i]);
    expect(res.statistic).toBeCloseTo(cramerVonMises(a, b), 14);
  });

  it('p-value agrees with SciPy permutation_test enumerating all 252 splits (q = 5)', () => {
    const e = fx.exact_permutation;
    // Scores: below units at −1..−5, above at 1..5, so the q = 5 nearest are exactly these.
    const score = [-1, -2, -3, -4, -5, 1, 2, 3, 4, 5];
    const cov = [...e.below, ...e.above];
    const res = permutationBalanceTest(score, cov, 0, { q: 5, permutations: 20000, seed: 9 });
    expect((res.statistic * 5) / 2).toBeCloseTo(e.scipy_statistic, 12);
    // Monte Carlo error of p with B = 20000 is about 0.002; allow 4 MC standard errors.
    expect(Math.abs(res.pvalue - e.pvalue)).toBeLessThan(0.008);
  });

  it('is reproducible for a seed and changes with it', () => {
    const rng = new Random(2);
    const r = Array.from({ length: 400 }, () => rng.normal());
    const w = r.map((v) => v + rng.normal());
    const a = permutationBalanceTest(r, w, 0, { seed: 5 });
    expect(permutationBalanceTest(r, w, 0, { seed: 5 })).toEqual(a);
    expect(a.permutations).toBe(999);
    expect(a.q_rule).toBe('rule_of_thumb');
    expect(a.q).toBeGreaterThanOrEqual(10);
    expect(permutationBalanceTest(r, w, 0, { seed: 6 }).pvalue).not.toBe(a.pvalue);
  });

  it('detects a shifted covariate distribution', () => {
    const rng = new Random(4);
    const r = Array.from({ length: 2000 }, () => rng.normal());
    const w = r.map((v) => rng.normal() + (v >= 0 ? 1.5 : 0));
    expect(permutationBalanceTest(r, w, 0).pvalue).toBeLessThan(0.01);
  });

  it('bad inputs: too small q, too few units, constant covariate, non-finite covariate, length mismatch', () => {
    const score = [-3, -2, -1, 1, 2, 3, 4, 5];
    const cov = [1, 2, 3, 4, 5, 6, 7, 8];
    expect(() => permutationBalanceTest(score, cov, 0)).toThrow(/needs at least 5 units below the cutoff; the data hold 3/);
    expect(() => permutationBalanceTest(score, cov, 0)).toThrow(CutlineError);
    const r = Array.from({ length: 40 }, (_, i) => i - 19.5);
    const w = r.map((v) => v * 2);
    expect(() => permutationBalanceTest(r, w, 0, { q: 3 })).toThrow(/q .* at least 5, got 3/);
    expect(() => permutationBalanceTest(r, w, 0, { q: 30 })).toThrow(/q = 30 units on each side are asked for, but only 20 lie below and 20 above/);
    const flat = permutationBalanceTest(r, r.map(() => 7), 0, { q: 10 });
    expect(flat.pvalue).toBe(1);
    expect(flat.warnings.join(' ')).toMatch(/single value/);
    const bad = [...w];
    bad[4] = NaN;
    expect(() => permutationBalanceTest(r, bad, 0)).toThrow(/row 5/);
    expect(() => permutationBalanceTest(r, w.slice(1), 0)).toThrow(/39 rows but the score has 40/);
    expect(() => permutationBalanceTest(r, w, 0, { permutations: 0 })).toThrow(/positive whole number/);
  });

  it('warns when scores tie at the q-th place', () => {
    const r = [-1, -1, -1, -1, -1, -1, 1, 1, 1, 1, 1, 1];
    const w = [1, 2, 3, 4, 5, 6, 1, 2, 3, 4, 5, 6];
    expect(permutationBalanceTest(r, w, 0, { q: 5 }).warnings.join(' ')).toMatch(/tie at the q-th place/);
  });
});

describe('order of the rows', () => {
  // A property of Cutline's tie rules (src/engine/covariates/covariatePermutation.ts): no outside source needed.
  test('shuffling the rows leaves the statistic and the p-value unchanged, with tied scores and covariates', () => {
    const n = 400;
    const score = Float64Array.from({ length: n }, (_, i) => Math.round(((i * 7919) % n) / 20) - 10); // integers −10..10
    const cov = Float64Array.from({ length: n }, (_, i) => (i * 31) % 5); // 5 values
    const perm = Array.from({ length: n }, (_, i) => (i * 173 + 11) % n); // 173 coprime with 400
    const s2 = Float64Array.from(perm, (p) => score[p]);
    const c2 = Float64Array.from(perm, (p) => cov[p]);
    const a = permutationBalanceTest(score, cov, 0.5, { q: 25, permutations: 199, seed: 3 });
    const b = permutationBalanceTest(s2, c2, 0.5, { q: 25, permutations: 199, seed: 3 });
    expect(a.warnings.join(' ')).toMatch(/drawn at random \(seeded\)/);
    expect(b.statistic).toBe(a.statistic);
    expect(b.pvalue).toBe(a.pvalue);
  });
});
