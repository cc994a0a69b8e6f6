/**
 * Bad input to the validity test (METHODS.md §4, RULES: a CutlineError naming
 * the option, never a NaN), warnings, and the by-bandwidth helper.
 */
import { CutlineError } from '../../../src/engine/errors';
import { validityReport, verdictWarnings } from '../../../src/engine/validity/validityReport';
import { validityTest } from '../../../src/engine/validity/validityTest';
import { ranTest } from '../../helpers/validityRan';
import { simulate } from '../../helpers/validityDense';

const d = simulate(800, 9, 'continuous');
const base = { bandwidth: 0.5, kernel: 'triangular' as const, draws: 49 };
const run = (o: object, y = d.outcome, t = d.treated) => () => ranTest(d.score, t, y, 0, { ...base, ...o });

test.each([
  [{ draws: 0 }, 'draws must be a whole number of at least 1, got 0'],
  [{ draws: 2.5 }, 'draws must be a whole number of at least 1, got 2.5'],
  [{ draws: -3 }, 'draws must be a whole number of at least 1, got -3'],
  [{ grid: 1 }, 'grid must be a whole number of at least 2, got 1'],
  [{ grid: 0 }, 'grid must be a whole number of at least 2, got 0'],
  [{ trim: -0.1 }, 'trim must be a number of at least 0, got -0.1'],
  [{ seed: 1.5 }, 'seed must be a whole number'],
  [{ multiplier: 'gamma' }, 'multiplier must be "normal" or "rademacher"'],
  [{ bandwidth: 0 }, 'bandwidth must be a positive number, got 0'],
  [{ bandwidth: 0.001 }, 'at least 3 are needed'],
])('%j → CutlineError', (o, msg) => {
  expect(run(o)).toThrow(CutlineError);
  expect(run(o)).toThrow(msg);
});

test('constant outcome', () => {
  expect(run({}, d.outcome.map(() => 4))).toThrow('the outcome is constant (every row used is 4)');
});

test('an outcome with one value inside the window', () => {
  const y = d.outcome.map((v, i) => (Math.abs(d.score[i]) < 0.5 ? 1 : v));
  expect(run({}, y)).toThrow(/the outcome takes a single value \(1\) among the \d+ units in the window/);
});

test('no treated unit on the eligible side', () => {
  const t = d.treated.map((v, i) => (d.score[i] >= 0 ? 0 : v));
  expect(run({}, d.outcome, t)).toThrow('no treated unit above the cutoff inside the window');
  // With eligibility below, the same data are fine on that count.
  expect(() => run({ sign: -1 }, d.outcome, t)()).not.toThrow();
});

test('treated other than 0/1 and non-finite outcomes name the row', () => {
  const t = [...d.treated];
  t[4] = 2;
  expect(run({}, d.outcome, t)).toThrow('treated must be 0 or 1, got 2 at row 5');
  const y = [...d.outcome];
  y[7] = NaN;
  expect(run({}, y)).toThrow('outcome is not a finite number at row 8');
});

test('a sharp design is not applicable (no p-value, never NaN), even with trim 0', () => {
  // Before the arms rule (docs/methods.md §4.7) this ran and gave a p-value.
  const t = d.score.map((s) => (s >= 0 ? 1 : 0));
  const r = validityTest(d.score, t, d.outcome, 0, { ...base, trim: 0 });
  expect(r.applicable).toBe(false);
  if (r.applicable) return;
  expect(r.reason).toMatch(/the design is sharp in this window: no unit below the cutoff is treated and every unit above it is/);
  expect(Object.values(r).some((v) => typeof v === 'number' && Number.isNaN(v))).toBe(false);
});

test('trim 0 never gives NaN in a one-sided design, and the nearly-sharp warning names the test window', () => {
  // No always-takers: arm 1 is left out; 5% never-takers above keep arm 0.
  const t = d.score.map((s, i) => (s >= 0 && i % 20 !== 0 ? 1 : 0));
  const r = ranTest(d.score, t, d.outcome, 0, { ...base, trim: 0 });
  expect(Number.isFinite(r.statistic) && Number.isFinite(r.pvalue) && Number.isFinite(r.critical_value)).toBe(true);
  expect(r.left_out.map((a) => a.arm)).toEqual([1]);
  expect(r.takeup).toBeGreaterThan(0.9);
  expect(r.warnings.join(' ')).toMatch(/the take-up jump in the test's window \(bandwidth 0.5\) is 0.9\d+, above 0.8: in a nearly sharp design/);
});

test('binary outcome works (two single-value bins, 6 intervals)', () => {
  const y = simulate(800, 9, 'binary').outcome;
  const r = ranTest(d.score, d.treated, y, 0, base);
  expect(r.intervals).toBe(6);
  expect(r.pvalue).toBeGreaterThanOrEqual(0);
});

test('warnings: small windows and an insignificant take-up jump', () => {
  const t = d.treated.map((_, i) => (i % 3 === 0 ? 1 : 0));
  const r = ranTest(d.score.slice(0, 150), t.slice(0, 150), d.outcome.slice(0, 150), 0, base);
  expect(r.warnings.some((w) => /fewer than 50/.test(w))).toBe(true);
  expect(r.warnings.some((w) => /not significantly positive/.test(w))).toBe(true);
});

test('rows and cells: a cell test is the max over cells, and one cell equals the test on its rows', () => {
  const cells = Int32Array.from(d.score, (_, i) => i % 2);
  const rows0 = Int32Array.from(d.score.map((_, i) => i).filter((i) => i % 2 === 0));
  const rows1 = Int32Array.from(d.score.map((_, i) => i).filter((i) => i % 2 === 1));
  const all = ranTest(d.score, d.treated, d.outcome, 0, { ...base, bandwidth: 0.8, cells });
  const a = ranTest(d.score, d.treated, d.outcome, 0, { ...base, bandwidth: 0.8, rows: rows0 });
  const b = ranTest(d.score, d.treated, d.outcome, 0, { ...base, bandwidth: 0.8, rows: rows1 });
  expect(all.statistic).toBe(Math.max(a.statistic, b.statistic));
  expect(all.intervals).toBe(a.intervals + b.intervals);
  expect(all.worst.cell).toBe(a.statistic >= b.statistic ? 0 : 1);
  expect(all.counts.above).toBe(a.counts.above + b.counts.above);
});

test('by bandwidth: an unfittable bandwidth gives an error entry, and verdict changes are worded', () => {
  const rep = validityReport(d.score, d.treated, d.outcome, 0, { ...base, multiples: [0.001, 1, 2] });
  if (!rep.applicable) throw new Error(rep.reason);
  const out = rep.by_bandwidth;
  expect(out.map((b) => b.multiple)).toEqual([0.001, 1, 2]);
  expect(out[0].error).toMatch(/at least 3 are needed/);
  expect(out[1].pvalue).toBeGreaterThanOrEqual(0);
  expect(out[2].bandwidth).toBe(1);
  const w = verdictWarnings([
    { multiple: 1, bandwidth: 1, statistic: 3, pvalue: 0.01, critical_value: 2, rejects: true },
    { multiple: 2, bandwidth: 2, statistic: 1, pvalue: 0.4, critical_value: 2, rejects: false },
  ]);
  expect(w[0]).toMatch(/changes with the bandwidth: rejected at 1, not rejected at 2/);
  expect(verdictWarnings(out).some((s) => /could not run at bandwidth 0.0005/.test(s))).toBe(true);
});
