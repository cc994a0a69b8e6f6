/** The demo data (demo/retrofit.csv, DESIGN.md's energy-retrofit scenario) read as the command line reads it. */
import * as fs from 'fs';
import * as path from 'path';
import { CheckInput } from '../../src/engine';
import { labelColumn, numericColumn } from '../../src/input/columns';
import { parseCsv } from '../../src/input/csv';

export const DEMO_CUTOFF = 60;

export function demoInput(opts: { outcomes?: string[]; covariates?: string[]; cluster?: boolean } = {}): CheckInput {
  const table = parseCsv(fs.readFileSync(path.join(__dirname, '..', '..', 'demo', 'retrofit.csv')));
  return {
    score: numericColumn(table, 'energy_burden', 'score'),
    treated: numericColumn(table, 'retrofit', 'treated'),
    outcomes: (opts.outcomes ?? ['heating_bill']).map((o) => numericColumn(table, o, 'outcome')),
    covariates: (opts.covariates ?? []).map((c) => numericColumn(table, c, 'covariate')),
    cluster: opts.cluster ? labelColumn(table, 'neighbourhood', 'cluster') : undefined,
  };
}
