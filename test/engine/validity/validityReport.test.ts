/**
 * The validity report (docs/methods.md §4.8): which version is the
 * headline, when the guard applies, the same Ỹ at every bandwidth and in
 * every covariate cell (the pooled fit), and the option to turn it off. The
 * expectations follow from the rule's statement; the numbers of each version
 * are checked against NumPy in validityTrendNumpy.test.ts.
 */
import { CutlineError } from '../../../src/engine/errors';
import { trendRemoved } from '../../../src/engine/validity/trendRemoved';
import { validityReport, ValidityReport } from '../../../src/engine/validity/validityReport';
import { simulate } from '../../helpers/validityDense';
import { ranTest } from '../../helpers/validityRan';

const d = simulate(900, 21, 'continuous');
// A steep trend common to every unit: valid, but the published test's fits are biased.
const steep = d.outcome.map((y, i) => y + 25 * d.score[i]);
const base = { bandwidth: 0.5, kernel: 'triangular' as const, draws: 199 };
const report = (y: number[], o: object = {}): ValidityReport => {
  const r = validityReport(d.score, d.treated, y, 0, { ...base, ...o });
  if (!r.applicable) throw new Error(r.reason);
  return r;
};

test('guard on: both versions, the headline is the larger p-value, and it names the version that decided', () => {
  const r = report(steep);
  expect(r.guard).toBe('applied');
  const a = r.trend_adjusted!;
  expect(r.pvalue).toBe(Math.max(r.observed.pvalue, a.pvalue));
  expect(r.decided_by).toBe(a.pvalue > r.observed.pvalue ? 'trend_adjusted' : a.pvalue < r.observed.pvalue ? 'observed' : 'both');
  // With this steep trend the published test rejects and the adjusted one does not (the false alarm of issue 7).
  expect(r.observed.pvalue).toBeLessThanOrEqual(0.05);
  expect(a.pvalue).toBeGreaterThan(0.05);
  expect(r.rejects).toBe(false);
  expect(r.decided_by).toBe('trend_adjusted');
  // The adjusted version is the published test run on Ỹ.
  const y = trendRemoved(d.score, steep, 0).values;
  expect(ranTest(d.score, d.treated, y, 0, base).statistic).toBe(a.statistic);
});

test('guard off: the published test alone is the headline', () => {
  const r = report(steep, { trendGuard: false });
  expect(r.guard).toBe('off');
  expect(r.trend_adjusted).toBeUndefined();
  expect(r.trend).toBeUndefined();
  expect(r.pvalue).toBe(r.observed.pvalue);
  expect(r.decided_by).toBe('observed');
  expect(() => validityReport(d.score, d.treated, steep, 0, { ...base, trendGuard: 'no' as unknown as boolean })).toThrow(CutlineError);
});

test('at most G distinct window outcomes (discrete): no guard, the observed version is the headline', () => {
  const y = simulate(900, 21, 'discrete').outcome;
  const r = report(y);
  expect(r.guard).toBe('few outcome values');
  expect(r.trend_adjusted).toBeUndefined();
  expect(r.pvalue).toBe(r.observed.pvalue);
  // With a grid smaller than the number of values the guard applies.
  expect(report(y, { grid: 5 }).guard).toBe('applied');
});

test('the same Ỹ serves every bandwidth of the table; each entry gives both p-values and the headline', () => {
  const r = report(steep, { multiples: [0.5, 1, 2] });
  expect(r.by_bandwidth.map((b) => b.multiple)).toEqual([0.5, 1, 2]);
  const y = trendRemoved(d.score, steep, 0).values;
  for (const b of r.by_bandwidth) {
    const obs = ranTest(d.score, d.treated, steep, 0, { ...base, bandwidth: b.bandwidth });
    const adj = ranTest(d.score, d.treated, y, 0, { ...base, bandwidth: b.bandwidth });
    expect([b.pvalue_observed, b.pvalue_trend_adjusted, b.pvalue]).toEqual([obs.pvalue, adj.pvalue, Math.max(obs.pvalue, adj.pvalue)]);
    expect(b.rejects).toBe(b.pvalue! <= 0.05);
  }
  expect(r.by_bandwidth[1].pvalue).toBe(r.pvalue);
});

test('within covariate cells: Ỹ from the pooled fit (one removed function for every cell)', () => {
  const cells = Int32Array.from(d.score, (_, i) => i % 3);
  const r = report(steep, { cells, cellLabels: ['a', 'b', 'c'] });
  const y = trendRemoved(d.score, steep, 0).values;
  const adj = ranTest(d.score, d.treated, y, 0, { ...base, cells, cellLabels: ['a', 'b', 'c'] });
  expect(r.trend_adjusted!.statistic).toBe(adj.statistic);
  expect(r.trend_adjusted!.pvalue).toBe(adj.pvalue);
  expect(['a', 'b', 'c']).toContain(r.observed.worst.cell_label);
});

test('a one-sided design leaves out the arm that tests nothing, says why, and counts half the intervals', () => {
  // No always-takers: nobody below the cutoff is treated.
  const t = d.treated.map((v, i) => (d.score[i] < 0 ? 0 : v));
  const r = report(d.outcome, { grid: 10 });
  const one = validityReport(d.score, t, d.outcome, 0, { ...base, grid: 10 });
  if (!one.applicable) throw new Error(one.reason);
  expect(one.observed.left_out).toEqual([
    { arm: 1, reason: expect.stringMatching(/no unit below the cutoff in the window is treated/) },
  ]);
  expect(one.observed.intervals).toBe(r.observed.intervals / 2);
  expect(one.observed.worst.arm).toBe(0);
});

test('a design sharp at the test bandwidth is not applicable; at other bandwidths the table says where', () => {
  const t = d.score.map((s) => (s >= 0 ? 1 : 0));
  const r = validityReport(d.score, t, steep, 0, { ...base, multiples: [2] });
  expect(r.applicable).toBe(false);
  if (!r.applicable) expect(r.reason).toMatch(/^the design is sharp in this window/);
  // One treated unit below the cutoff, far from it: sharp at h = 0.5, one-sided at h = 1.
  const far = d.score.findIndex((s) => s < -0.7);
  const t2 = t.map((v, i) => (i === far ? 1 : v));
  const r2 = validityReport(d.score, t2, steep, 0, { ...base, bandwidth: 1, multiples: [0.5] });
  if (!r2.applicable) throw new Error(r2.reason);
  expect(r2.by_bandwidth[0]).toMatchObject({ multiple: 0.5, applicable: false });
  expect(r2.observed.left_out.map((a) => a.arm)).toEqual([0]);
  expect(r2.warnings.join(' ')).toMatch(/not applicable at bandwidth 0.5: the design is sharp/);
});
