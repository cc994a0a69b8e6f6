// The BUILT functions bundle (dist/functions.js) loaded with a test-supplied
// CustomFunctions object, called with ranges shaped as Excel passes them. The
// values must equal, to the last digit, the engine's (called directly from
// the sources on the CSV's columns) and the command line's (`cutline check
// --json` on demo/retrofit.csv) — the outside reference for "the same
// numbers in every face" (DESIGN.md).
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as path from 'path';
import * as engine from '../../src/engine';
import { parseCsv } from '../../src/input/csv';
import { numericColumn } from '../../src/input/columns';
import { asBooleans, DEMO, demoColumns, withCells } from '../helpers/excelShaped';
import { errorOf, loadFunctionsBundle, MockExcelError } from '../helpers/functionsBundle';

const root = path.resolve(__dirname, '..', '..');
const { functions: fn, associations } = loadFunctionsBundle();
const demo = demoColumns();
const whole = demoColumns({ trailingBlanks: 250 });
const col = (name: string, d = demo): unknown[][] => d.cells.get(name)!;
const S = col('energy_burden');
const D = col('retrofit');
const Y = col('heating_bill');
const A = col('arrears');
const AGE = col('dwelling_age');

const cli = JSON.parse(
  spawnSync(
    process.execPath,
    [
      path.join(root, 'bin/cutline.cjs'),
      'check',
      DEMO,
      '--score',
      'energy_burden',
      '--treated',
      'retrofit',
      '--outcome',
      'heating_bill',
      '--covariate',
      'dwelling_age',
      '--cutoff',
      '60',
      '--json',
    ],
    { encoding: 'utf8', cwd: root },
  ).stdout,
);

// The engine on the same file, read by the CLI's own reader.
const table = parseCsv(fs.readFileSync(DEMO));
const c = (name: string, role: 'score' | 'treated' | 'outcome' | 'covariate') => numericColumn(table, name, role);
const score = c('energy_burden', 'score');
const treated = c('retrofit', 'treated');
const bill = c('heating_bill', 'outcome');
const missing = { score: score.missing, treated: treated.missing, outcome: bill.missing };

const one = (m: unknown): number => {
  expect(Array.isArray(m)).toBe(true);
  const rows = m as unknown[][];
  expect(rows).toHaveLength(1);
  expect(rows[0]).toHaveLength(1);
  return rows[0][0] as number;
};
/** The value beside a label in a detail table. */
const labelled = (m: unknown[][], label: string): unknown => {
  const row = m.find((r) => r[0] === label);
  if (!row) throw new Error(`no row ${label}: ${JSON.stringify(m.map((r) => r[0]))}`);
  return row[1];
};

describe('the built bundle registers the ten functions', () => {
  test('associate is called once for each, with the ids of DESIGN.md', () => {
    expect([...associations].sort()).toEqual(
      ['BALANCE', 'BANDWIDTH', 'BINS', 'COMPLIERCDF', 'COMPLIERDENSITY', 'DENSITYTEST', 'EFFECT', 'JUMP', 'TAKEUP', 'VALIDITY'].sort(),
    );
  });
});

describe('same numbers as cutline check on demo/retrofit.csv (one outcome, same settings)', () => {
  test('EFFECT is the effect the CLI prints, to the last digit, and the engine’s', () => {
    const v = one(fn.get('EFFECT')!(S, D, Y, 60));
    expect(v).toBe(cli.outcomes[0].effect.estimate);
    expect(v).toBe(engine.complierEffect(score.values, treated.values, bill.values, 60, { missing }).effect.estimate);
  });
  test('EFFECT detail: se, both intervals, p-value, bandwidth, window counts and rows as the CLI', () => {
    const m = fn.get('EFFECT')!(S, D, Y, 60, null, null, true) as unknown[][];
    const e = cli.outcomes[0].effect;
    expect(labelled(m, 'se')).toBe(e.se);
    expect(labelled(m, 'ci_low')).toBe(e.ci[0]);
    expect(labelled(m, 'ci_high')).toBe(e.ci[1]);
    expect(labelled(m, 'ci_robust_low')).toBe(e.ci_robust[0]);
    expect(labelled(m, 'ci_robust_high')).toBe(e.ci_robust[1]);
    expect(labelled(m, 'pvalue')).toBe(e.pvalue);
    expect(labelled(m, 'bandwidth')).toBe(cli.bandwidth.value);
    expect(labelled(m, 'jump')).toBe(cli.outcomes[0].jump.estimate);
    // The effect's own take-up (on the rows with an outcome): the ratio holds exactly.
    expect((labelled(m, 'jump') as number) / (labelled(m, 'takeup') as number)).toBe(e.estimate);
    expect(labelled(m, 'window_below')).toBe(cli.outcomes[0].window.below);
    expect(labelled(m, 'window_above')).toBe(cli.outcomes[0].window.above);
    expect(labelled(m, 'rows_used')).toBe(cli.rows.used);
    expect(labelled(m, 'rows_dropped')).toBe(cli.rows.dropped);
    expect(m.every((r) => r.length === 2)).toBe(true);
  });
  test('VALIDITY is the p-value the CLI prints (a promise)', async () => {
    const p = fn.get('VALIDITY')!(S, D, Y, 60);
    expect(p).toBeInstanceOf(Promise);
    const v = one(await p);
    expect(v).toBe(cli.outcomes[0].validity.pvalue);
    const m = (await fn.get('VALIDITY')!(S, D, Y, 60, null, null, true)) as unknown[][];
    const cv = cli.outcomes[0].validity;
    expect(labelled(m, 'statistic')).toBe(cv.statistic);
    expect(labelled(m, 'critical_value')).toBe(cv.critical_value);
    expect(labelled(m, 'pvalue_observed')).toBe(cv.pvalue_observed);
    expect(labelled(m, 'pvalue_trend_adjusted')).toBe(cv.trend_adjusted.pvalue);
    expect(labelled(m, 'worst_from')).toBe(cv.worst.from);
    expect(labelled(m, 'bandwidth')).toBe(cli.outcomes[0].validity.bandwidth);
    expect(labelled(m, 'draws')).toBe(999);
  });
  test('DENSITYTEST is the density p-value the CLI prints', () => {
    expect(one(fn.get('DENSITYTEST')!(S, 60))).toBe(cli.density.pvalue);
    const m = fn.get('DENSITYTEST')!(S, 60, null, true) as unknown[][];
    expect(labelled(m, 'log_ratio')).toBe(cli.density.log_ratio);
    expect(labelled(m, 'pvalue_mccrary')).toBe(cli.density.mccrary.pvalue);
  });
  test('BALANCE is the covariate p-value the CLI prints (one covariate: Holm changes nothing)', () => {
    const m = fn.get('BALANCE')!(S, AGE, 60, null, null, true) as unknown[][];
    expect(labelled(m, 'pvalue')).toBe(cli.balance[0].pvalue);
    expect(labelled(m, 'jump')).toBe(cli.balance[0].jump);
    expect(labelled(m, 'permutation_pvalue')).toBe(cli.balance[0].permutation_pvalue);
  });
  test('settings change the numbers as the engine says: kernel, draws, seed', async () => {
    const settings = [['kernel', 'uniform'], ['draws', 199], ['seed', 7], ['', '']];
    const o = { missing, kernel: 'uniform' as const, draws: 199, seed: 7 };
    expect(one(fn.get('EFFECT')!(S, D, Y, 60, null, settings))).toBe(engine.complierEffect(score.values, treated.values, bill.values, 60, o).effect.estimate);
    const v = engine.validity(score.values, treated.values, bill.values, 60, { ...o, sensitivity: [] });
    if (!v.applicable) throw new Error('the demo design is fuzzy');
    expect(one(await fn.get('VALIDITY')!(S, D, Y, 60, null, settings))).toBe(v.pvalue);
    expect(one(fn.get('EFFECT')!(S, D, Y, 60, null, settings))).not.toBe(cli.outcomes[0].effect.estimate);
  });
  test('a typed bandwidth is used as given', () => {
    const m = fn.get('EFFECT')!(S, D, Y, 60, 8, null, true) as unknown[][];
    expect(labelled(m, 'bandwidth')).toBe(8);
    expect(labelled(m, 'estimate')).toBe(engine.complierEffect(score.values, treated.values, bill.values, 60, { missing, bandwidth: 8 }).effect.estimate);
  });
});

describe('the other functions equal the engine', () => {
  const sv = score.values;
  test('JUMP and TAKEUP', () => {
    expect(one(fn.get('JUMP')!(S, Y, 60))).toBe(engine.outcomeJump(sv, bill.values, 60, { missing: { score: score.missing, values: bill.missing } }).estimate);
    expect(one(fn.get('TAKEUP')!(S, D, 60))).toBe(engine.takeupJump(sv, treated.values, 60, { missing }).estimate);
  });
  test('BANDWIDTH with treated is the bandwidth of every estimate of the check', () => {
    expect(one(fn.get('BANDWIDTH')!(S, Y, 60, D))).toBe(cli.bandwidth.value);
    expect(one(fn.get('BANDWIDTH')!(S, Y, 60, D, 'test'))).toBe(cli.outcomes[0].validity.bandwidth);
    expect(one(fn.get('BANDWIDTH')!(S, Y, 60))).toBe(
      engine.selectBandwidth(sv, bill.values, 60, { missing: { score: score.missing, values: bill.missing }, purpose: 'estimate' }).bandwidth,
    );
  });
  test('COMPLIERCDF and COMPLIERDENSITY spill one value per `at`, in its shape', () => {
    const at = [[1200], [1500], [1800], [2100]];
    const cdf = fn.get('COMPLIERCDF')!(S, D, Y, 60, at, 1) as unknown[][];
    const ref = engine.complierCdfAt(sv, treated.values, bill.values, 60, [1200, 1500, 1800, 2100], 1, { missing });
    expect(cdf).toEqual(ref.values.map((v) => [v]));
    const row = fn.get('COMPLIERCDF')!(S, D, Y, 60, [[1200, 1500, 1800, 2100]], 'treated') as unknown[][];
    expect(row).toEqual([ref.values]);
    const dens = fn.get('COMPLIERDENSITY')!(S, D, Y, 60, at, 0) as unknown[][];
    expect(dens).toEqual(engine.complierDensityAt(sv, treated.values, bill.values, 60, [1200, 1500, 1800, 2100], 0, { missing }).values.map((v) => [v]));
  });
  test('BINS spills a titled table of the engine’s bins', () => {
    const m = fn.get('BINS')!(S, Y, 60) as unknown[][];
    const ref = engine.binnedMeansAt(sv, bill.values, 60, { missing: { score: score.missing, values: bill.missing } });
    expect(m[0]).toEqual(['midpoint', 'mean', 'count', 'side']);
    expect(m.slice(1)).toEqual(ref.bins.map((b) => [b.midpoint, b.mean, b.count, b.side]));
  });
});

describe('ranges as Excel hands them', () => {
  test('a whole column (trailing blanks) and no title give the same numbers', () => {
    const v = one(fn.get('EFFECT')!(col('energy_burden', whole), col('retrofit', whole), col('heating_bill', whole), 60));
    expect(v).toBe(cli.outcomes[0].effect.estimate);
    const noTitle = one(fn.get('EFFECT')!(S.slice(1), D.slice(1), Y.slice(1), 60));
    expect(noTitle).toBe(v);
  });
  test('TRUE/FALSE for treated are 1/0', () => {
    expect(one(fn.get('EFFECT')!(S, asBooleans(D), Y, 60))).toBe(cli.outcomes[0].effect.estimate);
  });
  test('#N/A error values are missing (dropped listwise and counted); "" and null too', () => {
    const yNa = withCells(Y, [[11, { code: '#N/A' }]]);
    const yBlank = withCells(Y, [[11, null]]);
    const a = fn.get('EFFECT')!(S, D, yNa, 60, null, null, true) as unknown[][];
    const b = fn.get('EFFECT')!(S, D, yBlank, 60, null, null, true) as unknown[][];
    expect(a).toEqual(b);
    expect(labelled(a, 'rows_dropped')).toBe(cli.rows.dropped + 1);
  });
  test('a second outcome (arrears, 0/1) works as an outcome', () => {
    expect(one(fn.get('EFFECT')!(S, D, A, 60))).toBe(
      engine.complierEffect(score.values, treated.values, c('arrears', 'outcome').values, 60, {
        missing: { ...missing, outcome: c('arrears', 'outcome').missing },
      }).effect.estimate,
    );
  });
});

describe('bad ranges give Excel errors naming the argument and the first bad cell', () => {
  const addresses = { parameterAddresses: ['Data!C1:C6001', 'Data!D1:D6001', 'Data!E1:E6001', 'Data!K1', null, 'Data!M1:N4'] };
  test('text in a number column: #VALUE! with the cell address when the runtime gives it', async () => {
    const e = await errorOf(() => fn.get('EFFECT')!(withCells(S, [[7, 'n/a?']]), D, Y, 60, null, null, null, addresses));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toBe('CUTLINE.EFFECT: score: cell Data!C8 is not a number; it holds "n/a?"');
  });
  test('without addresses, the row in the range', async () => {
    const e = await errorOf(() => fn.get('EFFECT')!(S, D, withCells(Y, [[3, 'abc']]), 60));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toBe('CUTLINE.EFFECT: outcome: row 4 of the range is not a number; it holds "abc"');
  });
  test('an error value in a range', async () => {
    const e = await errorOf(() => fn.get('JUMP')!(S, withCells(Y, [[5, { code: '#DIV/0!' }]]), 60));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toBe('CUTLINE.JUMP: values: row 6 of the range holds the error #DIV/0!; correct it or leave the cell empty');
  });
  test('treated other than 0/1', async () => {
    const e = await errorOf(() => fn.get('TAKEUP')!(S, withCells(D, [[2, 2]]), 60, null, null, null, addresses));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toBe('CUTLINE.TAKEUP: treated: cell Data!D3 must be 0, 1, TRUE or FALSE; it holds 2');
  });
  test('ranges of unequal length name both lengths', async () => {
    const e = await errorOf(() => fn.get('EFFECT')!(S, D.slice(0, 5991), Y, 60));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toBe('CUTLINE.EFFECT: treated has 5990 cells of data but score has 6000; the ranges must cover the same rows');
  });
  test('a range two columns wide', async () => {
    const e = await errorOf(() => fn.get('DENSITYTEST')!(S.map((r) => [r[0], r[0]]), 60));
    expect(e.message).toBe('CUTLINE.DENSITYTEST: score must be a single column (or row) of cells; it has 6001 rows and 2 columns');
  });
  test('an unknown setting, with its cell', async () => {
    const e = await errorOf(() => fn.get('EFFECT')!(S, D, Y, 60, null, [['kernal', 'uniform']], null, addresses));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toMatch(/^CUTLINE\.EFFECT: settings, cell Data!M1: "kernal" is not a setting; the settings are kernel, variance, rule/);
  });
  test('a bad setting value, with its cell', async () => {
    const e = await errorOf(() => fn.get('VALIDITY')!(S, D, Y, 60, null, [['draws', 99.5]], null, addresses));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toBe('CUTLINE.VALIDITY: settings, cell Data!N1: draws must be a whole number; it holds "99.5"');
  });
  test('a cutoff beyond the scores: #N/A saying why', async () => {
    const e = await errorOf(() => fn.get('EFFECT')!(S, D, Y, 500));
    expect(e.code).toBe('#N/A');
    expect(e.message).toBe('CUTLINE.EFFECT: cutoff: no unit has a score at or above the cutoff 500');
  });
  test('a non-positive bandwidth', async () => {
    const e = await errorOf(() => fn.get('JUMP')!(S, Y, 60, -2));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toMatch(/^CUTLINE\.JUMP: bandwidth must be a positive number; it is -2/);
  });
  test('errors are never cached as values: the fixed range computes', async () => {
    await errorOf(() => fn.get('EFFECT')!(S, D, withCells(Y, [[3, 'abc']]), 60));
    expect(one(fn.get('EFFECT')!(S, D, Y, 60))).toBe(cli.outcomes[0].effect.estimate);
  });
  test('every error built is a #VALUE!, #N/A or #NUM! of the runtime', async () => {
    const e = await errorOf(() => fn.get('BINS')!(S, Y, 'sixty'));
    expect(e).toBeInstanceOf(MockExcelError);
    expect(e.message).toBe('CUTLINE.BINS: cutoff must be a number; it is "sixty"');
  });
});

describe('VALIDITY never blocks and honours cancellation', () => {
  test('it returns before the test runs; a cancel before it starts rejects without running', async () => {
    const inv: { onCanceled?: () => void } = {};
    const p = fn.get('VALIDITY')!(S, D, Y, 61, null, [['draws', 50]], null, inv);
    expect(typeof inv.onCanceled).toBe('function');
    inv.onCanceled!();
    const e = await errorOf(() => p);
    expect(e.code).toBe('#N/A');
    expect(e.message).toBe('CUTLINE.VALIDITY: canceled by Excel before it ran');
  });
  test('a sharp design (treated exactly by the cutoff) has nothing to test: #N/A saying why', async () => {
    const sharp = S.map(([v], k) => [k === 0 ? 'treated' : typeof v === 'number' ? (v >= 60 ? 1 : 0) : '']);
    const e = await errorOf(() => fn.get('VALIDITY')!(S, sharp, Y, 60));
    expect(e.code).toBe('#N/A');
    expect(e.message).toMatch(/^CUTLINE\.VALIDITY: the test does not apply: /);
    expect((e.message ?? "").length).toBeGreaterThan(40);
  });
  test('bad input rejects the promise with the Excel error', async () => {
    const e = await errorOf(() => fn.get('VALIDITY')!(S, D.slice(0, 10), Y, 60));
    expect(e.code).toBe('#VALUE!');
  });
});
