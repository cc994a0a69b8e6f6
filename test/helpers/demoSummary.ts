/**
 * The demo data (demo/retrofit.csv) checked as the task pane checks them and
 * laid out as the live summary sheet: for the summary model's tests and the
 * browser test's expected numbers.
 */
import * as fs from 'fs';
import * as path from 'path';
import { runCheck } from '../../src/engine';
import type { CheckInput, CheckOptions } from '../../src/engine';
import { labelColumn, numericColumn } from '../../src/input/columns';
import { parseCsv } from '../../src/input/csv';
import { planSheet } from '../../src/report/sheetPlan';
import { buildSummary, DataRanges } from '../../src/report/summaryModel';

// From the sources (jest) or from a bundle run in the repository (the browser test).
export const DEMO_CSV = [path.resolve(__dirname, '../../demo/retrofit.csv'), path.resolve(process.cwd(), 'demo/retrofit.csv')].find((f) => fs.existsSync(f))!;

export const DEMO_ROLES = {
  score: 'energy_burden',
  treated: 'retrofit',
  outcomes: ['heating_bill', 'arrears'],
  covariates: ['dwelling_age', 'household_size'],
  cluster: 'neighbourhood',
};

/** The demo's check input and where its columns sit on a sheet named `sheet` (header in row 1, from column A). */
export function demoInput(sheet = 'Data'): { input: CheckInput; data: DataRanges } {
  const table = parseCsv(fs.readFileSync(DEMO_CSV), 'retrofit.csv');
  const input: CheckInput = {
    score: numericColumn(table, DEMO_ROLES.score, 'score'),
    treated: numericColumn(table, DEMO_ROLES.treated, 'treated'),
    outcomes: DEMO_ROLES.outcomes.map((o) => numericColumn(table, o, 'outcome')),
    covariates: DEMO_ROLES.covariates.map((c) => numericColumn(table, c, 'covariate')),
    cluster: labelColumn(table, DEMO_ROLES.cluster, 'cluster'),
  };
  const columns: Record<string, number> = {};
  table.header.forEach((h, k) => (columns[h] = k));
  return { input, data: { sheet, firstRow: 2, lastRow: table.rowCount + 1, columns } };
}

/** The pane's options for the demo at a cutoff (the pane's defaults: rule mse, 999 draws, seed 1, bins for the charts). */
export const demoOptions = (cutoff: number, eligible?: 'above' | 'below'): CheckOptions => ({ cutoff, bins: true, draws: 999, seed: 1, rule: 'mse', ...(eligible ? { eligible } : {}) });

/** The demo's summary model and live sheet plan at a cutoff (the eligible side detected unless given). */
export function demoSummary(cutoff = 60, takenSheetNames: string[] = ['Data'], eligible?: 'above' | 'below') {
  const { input, data } = demoInput();
  const result = runCheck(input, demoOptions(cutoff, eligible));
  const model = buildSummary(result, {
    source: 'Data!A1:H6001',
    data,
    options: demoOptions(cutoff, eligible),
    takenSheetNames,
    names: { score: DEMO_ROLES.score, treated: DEMO_ROLES.treated, covariates: DEMO_ROLES.covariates },
  });
  return { input, data, result, model, plan: planSheet(model, { source: 'Data!A1:H6001' }) };
}
