// The entry points of the engine's public API (docs/engine-api.md): each gives a check's number
// to the last digit on the demo data (the check is the reference: the numbers of `cutline check`,
// themselves tested against R and NumPy elsewhere); each refuses bad columns with a CutlineError
// naming the argument and the 0-based index; and none keeps state between calls.
import {
  binnedMeansAt,
  complierCdfAt,
  complierDensityAt,
  complierEffect,
  covariateBalance,
  CutlineError,
  densityTest,
  outcomeJump,
  runCheck,
  selectBandwidth,
  takeupJump,
  validity,
} from '../../../src/engine';
import { demoInput, DEMO_CUTOFF } from '../../helpers/demo';

const input = demoInput({ outcomes: ['heating_bill', 'arrears'], covariates: ['dwelling_age'] });
const check = runCheck(input, { cutoff: DEMO_CUTOFF, draws: 199, sensitivity: [0.5, 1, 2] });
const score = input.score.values;
const treated = input.treated.values;
const [bill, arrears] = input.outcomes;
const missing = (m?: Uint8Array) => ({ score: input.score.missing, treated: input.treated.missing, outcome: m, values: m });

describe('entry points give the check’s numbers to the last digit (demo)', () => {
  const h = check.bandwidth.value;

  test('complierEffect with the first outcome: effect, its own take-up and jump, bandwidth, counts, rows', () => {
    const e = complierEffect(score, treated, bill.values, DEMO_CUTOFF, { missing: missing(bill.missing) });
    const o = check.outcomes[0];
    expect(e.effect).toEqual(o.effect);
    expect(e.takeup).toEqual(o.takeup);
    expect(e.jump).toEqual(o.jump);
    expect(e.bandwidth).toBe(h);
    expect(e.counts).toEqual(o.window);
    expect(e.rows).toEqual(o.rows);
    expect(e.effect.estimate).toBe(e.jump.estimate / e.takeup.estimate);
  });

  test('complierEffect of the second outcome at the check’s bandwidth (its own rows: 2 missing arrears)', () => {
    const e = complierEffect(score, treated, arrears.values, DEMO_CUTOFF, { bandwidth: h, missing: missing(arrears.missing) });
    const o = check.outcomes[1];
    expect(e.effect).toEqual(o.effect);
    expect(e.takeup).toEqual(o.takeup);
    expect(e.rows).toEqual(o.rows);
  });

  test('validity: statistic, p-value, worst interval and the by-bandwidth table', () => {
    const v = validity(score, treated, bill.values, DEMO_CUTOFF, { draws: 199, sensitivity: [0.5, 1, 2], missing: missing(bill.missing) });
    const { pvalue_holm: _h, warnings: reportWarnings, ...o } = check.outcomes[0].validity;
    const { test_bandwidth_rule: _r, bandwidth, counts: _c, rows: _rows, warnings, ...rest } = v;
    expect(rest).toEqual(o); // both versions, worst intervals, by-bandwidth table
    expect(warnings).toEqual(expect.arrayContaining(reportWarnings));
    expect(o.applicable).toBe(true);
    expect(bandwidth).toBe(check.test_bandwidth.value);
  });

  test('takeupJump at the check’s bandwidth, outcomeJump with treated, selectBandwidth for both purposes', () => {
    const t = takeupJump(score, treated, DEMO_CUTOFF, { bandwidth: h, missing: missing() });
    const { bandwidth: _b, rule: _r, eligible: _e, counts, rows: _rows, warnings: _w, ...est } = t;
    expect(est).toEqual(check.takeup);
    expect(counts).toEqual(check.bandwidth.window);
    const j = outcomeJump(score, bill.values, DEMO_CUTOFF, { treated, missing: missing(bill.missing) });
    expect(j.estimate).toBe(check.outcomes[0].jump.estimate);
    expect(j.se_robust).toBe(check.outcomes[0].jump.se_robust);
    const be = selectBandwidth(score, bill.values, DEMO_CUTOFF, { treated, purpose: 'estimate', missing: missing(bill.missing) });
    expect(be.bandwidth).toBe(h);
    const bt = selectBandwidth(score, bill.values, DEMO_CUTOFF, { treated, purpose: 'test', missing: missing(bill.missing) });
    expect(bt.bandwidth).toBe(check.test_bandwidth.value);
  });

  test('complier CDF and density at the check’s grid', () => {
    const c = check.outcomes[0].compliers!;
    const m = missing(bill.missing);
    expect(complierCdfAt(score, treated, bill.values, DEMO_CUTOFF, c.at, 1, { missing: m }).values).toEqual(c.cdf_treated);
    expect(complierCdfAt(score, treated, bill.values, DEMO_CUTOFF, c.at, 0, { missing: m }).values).toEqual(c.cdf_untreated);
    const d = complierDensityAt(score, treated, bill.values, DEMO_CUTOFF, c.at, 1, { missing: m });
    expect(d.values.length).toBe(c.at.length);
    expect(d.density_bandwidth).toBeGreaterThan(0);
  });

  test('densityTest and covariateBalance', () => {
    const d = densityTest(score, DEMO_CUTOFF, { missing: { score: input.score.missing } });
    expect(d.log_ratio).toBe(check.density!.log_ratio);
    expect(d.pvalue).toBe(check.density!.pvalue);
    const age = input.covariates![0];
    const b = covariateBalance(score, age.values, DEMO_CUTOFF, { missing: { score: input.score.missing, covariate: age.missing } });
    const row = check.balance![0];
    expect([b.jump, b.pvalue, b.permutation_pvalue, b.q, b.bandwidth]).toEqual([row.jump, row.pvalue, row.permutation_pvalue, row.q, row.bandwidth]);
  });

  test('binnedMeansAt: the check’s bins of an outcome at the same bandwidth', () => {
    const withBins = runCheck(input, { cutoff: DEMO_CUTOFF, draws: 19, sensitivity: [], bins: true });
    const b = binnedMeansAt(score, bill.values, DEMO_CUTOFF, { bandwidth: withBins.bandwidth.value, missing: { score: input.score.missing, values: bill.missing } });
    const series = withBins.bins!.find((s) => s.name === 'heating_bill')!;
    expect(b.bins).toEqual(series.bins);
    expect(b.fit).toEqual(series.fit);
  });
});

/** A small valid design as plain number[] columns (the way a worksheet hands them over). */
function small(n = 200): { score: number[]; treated: number[]; outcome: number[] } {
  const score: number[] = [];
  const treated: number[] = [];
  const outcome: number[] = [];
  for (let i = 0; i < n; i++) {
    const r = -1 + (2 * (i + 0.5)) / n;
    const d = ((i * 7919) % 1000) / 1000 < (r >= 0 ? 0.7 : 0.2) ? 1 : 0;
    score.push(r);
    treated.push(d);
    outcome.push(1 + r + 2 * d + Math.sin(i * 1.7) * 0.3);
  }
  return { score, treated, outcome };
}

type Cols = ReturnType<typeof small>;
const calls: Array<[string, (c: Cols) => unknown, Array<'score' | 'treated' | 'outcome'>]> = [
  ['takeupJump', (c) => takeupJump(c.score, c.treated, 0, { bandwidth: 0.5 }), ['score', 'treated']],
  ['outcomeJump', (c) => outcomeJump(c.score, c.outcome, 0, { bandwidth: 0.5 }), ['score', 'outcome']],
  ['complierEffect', (c) => complierEffect(c.score, c.treated, c.outcome, 0, { bandwidth: 0.5 }), ['score', 'treated', 'outcome']],
  ['selectBandwidth', (c) => selectBandwidth(c.score, c.outcome, 0, { treated: c.treated }), ['score', 'treated', 'outcome']],
  ['complierCdfAt', (c) => complierCdfAt(c.score, c.treated, c.outcome, 0, [1, 2], 1, { bandwidth: 0.5 }), ['score', 'treated', 'outcome']],
  ['complierDensityAt', (c) => complierDensityAt(c.score, c.treated, c.outcome, 0, [1, 2], 0, { bandwidth: 0.5 }), ['score', 'treated', 'outcome']],
  ['validity', (c) => validity(c.score, c.treated, c.outcome, 0, { bandwidth: 0.5, draws: 19, sensitivity: [] }), ['score', 'treated', 'outcome']],
  ['densityTest', (c) => densityTest(c.score, 0), ['score']],
  ['covariateBalance', (c) => covariateBalance(c.score, c.outcome, 0, { bandwidth: 0.5 }), ['score', 'outcome']],
  ['binnedMeansAt', (c) => binnedMeansAt(c.score, c.outcome, 0, { bandwidth: 0.5 }), ['score', 'outcome']],
];

/** The argument name each entry point uses for its third column. */
const argumentOf = (entry: string, col: string): string =>
  col !== 'outcome' ? col : ['outcomeJump', 'selectBandwidth', 'binnedMeansAt'].includes(entry) ? 'values' : entry === 'covariateBalance' ? 'covariate' : 'outcome';

function thrown(f: () => unknown): CutlineError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(CutlineError);
    return e as CutlineError;
  }
  throw new Error('no error was thrown');
}

describe.each(calls)('%s refuses bad columns by argument and index', (entry, call, columns) => {
  test('a valid call runs', () => {
    expect(() => call(small())).not.toThrow();
  });
  const bad: Array<[string, unknown, string]> = [
    ['NaN', NaN, 'bad-value'],
    ['text', 'abc', 'bad-value'],
    ['null', null, 'bad-value'],
    ['Infinity', Infinity, 'bad-value'],
  ];
  test.each(columns.flatMap((col) => bad.map(([what, v, code]) => [col, what, v, code] as const)))('%s holding %s at index 17', (col, _what, v, code) => {
    const c = small();
    (c[col] as unknown[])[17] = v;
    const e = thrown(() => call(c));
    expect({ code: e.code, argument: e.argument, index: e.index }).toEqual({ code, argument: argumentOf(entry, col), index: 17 });
    expect(e.message).not.toMatch(/--|METHODS/);
  });
  const others = columns.filter((c) => c !== 'score');
  if (others.length > 0) test.each(others)('%s shorter than the score', (col) => {
    const c = small();
    c[col].pop();
    const e = thrown(() => call(c));
    expect({ code: e.code, argument: e.argument, index: e.index }).toEqual({ code: 'length', argument: argumentOf(entry, col), index: 199 });
  });
  if (columns.includes('treated')) {
    test('treated = 2', () => {
      const c = small();
      c.treated[40] = 2;
      const e = thrown(() => call(c));
      expect({ code: e.code, argument: e.argument, index: e.index }).toEqual({ code: 'bad-value', argument: 'treated', index: 40 });
    });
  }
});

test('the cutoff, a bad option and the arm are refused by argument', () => {
  const c = small();
  expect(thrown(() => complierEffect(c.score, c.treated, c.outcome, NaN)).argument).toBe('cutoff');
  expect(thrown(() => complierEffect(c.score, c.treated, c.outcome, 0, { bandwidth: -1 })).argument).toBe('bandwidth');
  expect(thrown(() => complierEffect(c.score, c.treated, c.outcome, 0, { donut: 5 })).argument).toBe('donut');
  expect(thrown(() => complierEffect(c.score, c.treated, c.outcome, 0, { variance: 'cluster' })).argument).toBe('clusters');
  expect(thrown(() => complierCdfAt(c.score, c.treated, c.outcome, 0, [1], 2 as 1)).argument).toBe('arm');
  expect(thrown(() => validity(c.score, c.treated, c.outcome, 0, { draws: 0 })).message).toMatch(/draws/);
});

test('a missing mask exempts its rows: a NaN marked missing is left out, not refused', () => {
  const c = small();
  const base = complierEffect(c.score, c.treated, c.outcome, 0, { bandwidth: 0.5 });
  c.outcome[110] = NaN; // score 0.105: inside the window
  const m = new Uint8Array(200);
  m[110] = 1;
  const e = complierEffect(c.score, c.treated, c.outcome, 0, { bandwidth: 0.5, missing: { outcome: m } });
  expect(e.rows).toEqual({ used: 199, dropped: 1 });
  expect(e.effect.estimate).not.toBe(base.effect.estimate);
});

describe('no hidden state: changing an input array between two calls gives the new answer', () => {
  test('the same arrays, changed in place, give what fresh arrays with the new values give', () => {
    const c = { score: Float64Array.from(small().score), treated: Float64Array.from(small().treated), outcome: Float64Array.from(small().outcome) };
    const first = complierEffect(c.score, c.treated, c.outcome, 0);
    for (let i = 0; i < 200; i++) {
      c.outcome[i] += 0.5 * c.score[i] * c.score[i];
      c.score[i] = c.score[i] * 1.5;
    }
    c.treated[101] = 1 - c.treated[101];
    const again = complierEffect(c.score, c.treated, c.outcome, 0);
    const fresh = complierEffect(Float64Array.from(c.score), Float64Array.from(c.treated), Float64Array.from(c.outcome), 0);
    expect(again).toEqual(fresh);
    expect(again.effect.estimate).not.toBe(first.effect.estimate);
    expect(again.bandwidth).not.toBe(first.bandwidth);
    const v1 = validity(c.score, c.treated, c.outcome, 0, { draws: 19, sensitivity: [] });
    c.outcome[120] += 3;
    const v2 = validity(c.score, c.treated, c.outcome, 0, { draws: 19, sensitivity: [] });
    expect(v2).toEqual(validity(Float64Array.from(c.score), Float64Array.from(c.treated), Float64Array.from(c.outcome), 0, { draws: 19, sensitivity: [] }));
    if (!v1.applicable || !v2.applicable) throw new Error('the small design is fuzzy: the test applies');
    expect(v2.observed.statistic).not.toBe(v1.observed.statistic);
  });

  test('runCheck on the same input object, changed in place, follows the change', () => {
    const s = small();
    const col = (name: string, v: number[]) => ({ name, values: Float64Array.from(v) });
    const inp = { score: col('score', s.score), treated: col('treated', s.treated), outcomes: [col('y', s.outcome)] };
    const opts = { cutoff: 0, draws: 19, sensitivity: [] };
    const a = runCheck(inp, opts);
    inp.outcomes[0].values[150] += 10;
    const b = runCheck(inp, opts);
    const fresh = runCheck({ ...inp, outcomes: [col('y', Array.from(inp.outcomes[0].values))] }, opts);
    expect(b).toEqual(fresh);
    expect(b.outcomes[0].jump.estimate).not.toBe(a.outcomes[0].jump.estimate);
  });
});

test('validity within cells: the same as the check with a discrete covariate', () => {
  const d = demoInput({ outcomes: ['heating_bill'] });
  const size = demoInput({ covariates: ['household_size'] }).covariates![0];
  const codes = Int32Array.from(size.values, (v) => v - 1);
  const labels = ['1', '2', '3', '4', '5', '6', '7', '8'];
  const c = runCheck({ ...d, within: { name: 'household_size', codes, labels } }, { cutoff: DEMO_CUTOFF, draws: 99, sensitivity: [] });
  const v = validity(d.score.values, d.treated.values, d.outcomes[0].values, DEMO_CUTOFF, {
    draws: 99,
    sensitivity: [],
    cells: codes,
    cellLabels: labels,
    cellsName: 'household_size',
    missing: { score: d.score.missing, treated: d.treated.missing, outcome: d.outcomes[0].missing },
  });
  const { pvalue_holm: _h, warnings: reportWarnings, ...o } = c.outcomes[0].validity;
  const { test_bandwidth_rule: _r, bandwidth: _b, counts: _c, rows: _rows, warnings, ...rest } = v;
  expect(rest).toEqual(o);
  expect(warnings).toEqual(expect.arrayContaining(reportWarnings));
  expect(reportWarnings.length).toBeGreaterThan(0);
  expect(o.within).toBe('household_size');
});
