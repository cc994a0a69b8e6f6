// The batch's plan and index without running a check: report names never collide, the CSV index quotes
// what RFC 4180 says must be quoted, and a failed file keeps its row with its error.
import * as path from 'path';
import Papa from 'papaparse';
import { planBatch } from '../../src/cli/batch';
import { indexCsv, indexHtml, IndexRow } from '../../src/cli/batchIndex';

test('report names: the input name without extension, numbered when two inputs share it', () => {
  const plan = planBatch(['a/x.csv', 'b/x.xlsx', 'b/X.csv', 'c/y.csv'], '/out', ['xlsx', 'html']);
  expect(plan.map((p) => p.reports)).toEqual([
    ['x.report.xlsx', 'x.report.html'],
    ['x-2.report.xlsx', 'x-2.report.html'],
    ['X-3.report.xlsx', 'X-3.report.html'],
    ['y.report.xlsx', 'y.report.html'],
  ]);
  expect(plan[1].req).toEqual({ xlsx: path.join('/out', 'x-2.report.xlsx'), html: path.join('/out', 'x-2.report.html') });
  expect(planBatch(['x.csv'], '/out', ['html'])[0].req).toEqual({ html: path.join('/out', 'x.report.html') });
});

test('the CSV index reads back with Papa Parse, error rows included', () => {
  const rows: IndexRow[] = [
    {
      file: 'clients/a, "b".csv',
      reports: ['a.report.html'],
      headline: { cutoff: 60, eligible: 'above', rows_used: 99, bandwidth: 7.5, takeup: 0.5, takeup_pvalue: 0.001, outcomes: [{ name: 'bill', effect: -180.25, ci_robust: [-250, -110], effect_pvalue: 0.0002, validity_pvalue: 0.04, rejects: true }], density_pvalue: 0.5 },
    },
    { file: 'clients/bad.csv', error: 'column "score" (score), row 6: not a number, found "abc"', reports: [] },
  ];
  const parsed = Papa.parse<Record<string, string>>(indexCsv(rows, ['bill']), { header: true, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  expect(parsed.data).toHaveLength(2);
  expect(parsed.data[0].file).toBe('clients/a, "b".csv');
  expect(Number(parsed.data[0].bill_effect)).toBe(-180.25);
  expect(parsed.data[0].bill_verdict).toBe('contradicted');
  expect(parsed.data[0].covariates_min_holm_pvalue).toBe('');
  expect(parsed.data[1].status).toBe('error');
  expect(parsed.data[1].error).toBe('column "score" (score), row 6: not a number, found "abc"');
  const html = indexHtml(rows, ['bill']);
  expect(html).toContain('error: column &quot;score&quot; (score), row 6');
  expect(html).toContain('<span class="reject">contradicted (p = 0.040)</span>');
});
