// The summary sheet's formula text (src/report/formulas.ts) against the
// worksheet functions' signatures in the generated dist/functions.json: each
// argument lands on the parameter of its name, and the detail labels the
// summary reads with VLOOKUP are labels the functions' detail tables have.
import * as fs from 'fs';
import * as path from 'path';
import * as F from '../../src/report/formulas';
import { demoColumns } from '../helpers/excelShaped';
import { loadFunctionsBundle } from '../helpers/functionsBundle';

const meta = JSON.parse(fs.readFileSync(path.resolve(__dirname, '..', '..', 'dist', 'functions.json'), 'utf8'));
const params = (id: string): string[] => meta.functions.find((f: { id: string }) => f.id === id).parameters.map((p: { name: string }) => p.name);
const refs = { cutoff: 'CUT', bandwidth: 'BW', settings: 'SET' };
const d = { score: 'S', treated: 'D', outcome: 'Y', values: 'V', covariate: 'C' };
/** Parameter name of each argument of a formula, by position. */
function parsed(formula: string): { id: string; args: string[] } {
  const m = /^CUTLINE\.([A-Z]+)\((.*)\)$/.exec(formula)!;
  return { id: m[1], args: m[2].split(', ') };
}
const ROLE: Record<string, string> = { S: 'score', D: 'treated', Y: 'outcome', V: 'values', C: 'covariate', CUT: 'cutoff', BW: 'bandwidth', SET: 'settings', AT: 'at', TB: 'bandwidth' };

test.each([
  F.takeup(d, refs),
  F.jump(d, refs),
  F.effect(d, refs),
  F.validity(d, refs, 'TB'),
  F.densityTest(d, refs),
  F.balance(d, refs),
  F.bins(d, refs),
  F.complierCdf(d, refs, 'AT', 1),
])('%s puts each argument on its parameter', (formula) => {
  const { id, args } = parsed(formula);
  const names = params(id);
  expect(args.length).toBeLessThanOrEqual(names.length);
  args.forEach((a, k) => {
    if (a === '') return; // an argument left empty
    if (ROLE[a]) expect([id, k, names[k]]).toEqual([id, k, ROLE[a]]);
  });
});

test('the two BANDWIDTH formulas: treated, then the purpose, then the settings', () => {
  for (const [f, purpose] of [[F.bandwidth(d, refs), '"estimate"'], [F.testBandwidth(d, refs), '"test"']] as const) {
    const { args } = parsed(f);
    expect(params('BANDWIDTH').slice(3, 6)).toEqual(['treated', 'purpose', 'settings']);
    expect(args.slice(3, 6)).toEqual(['D', purpose, 'SET']);
  }
});

test('the detail labels the summary reads exist in EFFECT, TAKEUP and VALIDITY detail tables', async () => {
  const { functions: fn } = loadFunctionsBundle();
  const demo = demoColumns();
  const [S, D, Y] = ['energy_burden', 'retrofit', 'heating_bill'].map((n) => demo.cells.get(n)!);
  const labels = (m: unknown[][]): unknown[] => m.map((r) => r[0]);
  const effect = labels(fn.get('EFFECT')!(S, D, Y, 60, null, null, true));
  for (const l of ['se', 'ci_low', 'ci_high', 'ci_robust_low', 'ci_robust_high', 'pvalue', 'takeup']) expect(effect).toContain(l);
  const takeup = labels(fn.get('TAKEUP')!(S, D, 60, null, null, true));
  for (const l of ['se', 'ci_low', 'ci_high', 'ci_robust_low', 'ci_robust_high', 'pvalue']) expect(takeup).toContain(l);
  const validity = labels(await fn.get('VALIDITY')!(S, D, Y, 60, null, null, true));
  for (const l of ['pvalue_observed', 'pvalue_trend_adjusted', 'statistic', 'critical_value']) expect(validity).toContain(l);
});
