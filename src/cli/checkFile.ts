/**
 * The options of `cutline check` turned into the engine's options once
 * (CheckSpec), and one file checked with them: read, columns converted,
 * runCheck. The single-file command and every batch worker share this, so a
 * file gives the same numbers alone or in a folder.
 */
import { BANDWIDTH_RULES, CheckInput, CheckOptions, CheckResult, CutlineError, KERNEL_NAMES, limitProblem, runCheck, VARIANCE_NAMES } from '../engine';
import { labelColumn, numericColumn } from '../input/columns';
import { readMultiples } from '../input/multiples';
import { choiceOption, numberOption, one, ParsedArgs, required } from './args';
import { readTable } from './readTable';
import { Table } from '../input/table';
import type { SourceFile } from './reportFiles';

export interface CheckSpec {
  scoreName: string;
  treatedName: string;
  outcomeNames: string[];
  covariateNames: string[];
  clusterName?: string;
  withinName?: string;
  sheet?: string;
  options: CheckOptions;
}

/** `--sensitivity 0.5,0.75,1,1.5,2` or `off`: read as a settings block reads its sensitivity (src/input/multiples.ts). */
function sensitivityOption(s: string | undefined): number[] | undefined {
  return s === undefined ? undefined : readMultiples(s, '--sensitivity');
}

/** Equal values and equal missing cells on every row. */
function sameValues(a: CheckInput['score'], b: CheckInput['score']): boolean {
  for (let i = 0; i < a.values.length; i++) {
    const ma = a.missing?.[i] ?? 0;
    if (ma !== (b.missing?.[i] ?? 0) || (!ma && a.values[i] !== b.values[i])) return false;
  }
  return true;
}

/** One column, one role: an outcome given twice, or the score as the outcome, is a slip, not a request. */
function distinctRoles(input: CheckInput): void {
  const roles: Array<[string, string]> = [
    ['--score', input.score.name],
    ['--treated', input.treated.name],
    ...input.outcomes.map((o): [string, string] => ['--outcome', o.name]),
  ];
  roles.forEach(([role, name], i) => {
    const j = roles.findIndex(([, other]) => other === name);
    if (j < i) throw new CutlineError(`${role}: column ${JSON.stringify(name)} is already given as ${roles[j][0]}`);
  });
  const covs = input.covariates ?? [];
  covs.forEach((c, i) => {
    if (covs.findIndex((o) => o.name === c.name) < i) throw new CutlineError(`--covariate: column ${JSON.stringify(c.name)} is given twice`);
    // A covariate is a characteristic fixed before treatment: the score, the treated column or an
    // outcome (or a copy of one under another name) would show a "jump" by construction. Refused.
    const role = roles.find(([, name]) => name === c.name);
    if (role) {
      throw new CutlineError(
        `--covariate: column ${JSON.stringify(c.name)} is already given as ${role[0]}; a covariate must be a characteristic fixed before treatment (the balance check of the score, take-up or an outcome is meaningless), so give another column`,
      );
    }
    const same = [input.score, input.treated, ...input.outcomes].find((col) => sameValues(col, c));
    if (same) {
      const r = roles.find(([, name]) => name === same.name)!;
      throw new CutlineError(
        `--covariate: column ${JSON.stringify(c.name)} holds the same values as ${JSON.stringify(same.name)} (${r[0]}) on every row; a covariate must be a characteristic fixed before treatment, so give another column`,
      );
    }
  });
}

export function parseCheckSpec(args: ParsedArgs): CheckSpec {
  const scoreName = required(args, 'score', 'the column of the running variable');
  const treatedName = required(args, 'treated', 'the column of treatment received (0/1)');
  const outcomeNames = args.values.get('outcome') ?? [];
  if (outcomeNames.length === 0) throw new CutlineError('--outcome is required: at least one outcome column');
  const cutoff = numberOption(args, 'cutoff');
  if (cutoff === undefined) throw new CutlineError('--cutoff is required: the score at which eligibility changes');
  const bandwidth = numberOption(args, 'bandwidth', (v) => (v > 0 ? null : 'must be positive'));
  const rule = choiceOption(args, 'bandwidth-rule', BANDWIDTH_RULES);
  if (bandwidth !== undefined && rule !== undefined) throw new CutlineError('give --bandwidth or --bandwidth-rule, not both');
  const kernel = choiceOption(args, 'kernel', KERNEL_NAMES);
  const clusterName = one(args, 'cluster');
  const variance = choiceOption(args, 'variance', VARIANCE_NAMES) ?? (clusterName !== undefined ? 'cluster' : undefined);
  if (variance === 'cluster' && clusterName === undefined) throw new CutlineError('--variance cluster needs --cluster COL');
  // The engine's limits (VALIDITY_LIMITS), checked here to name the flag; the task pane checks the same.
  const draws = numberOption(args, 'draws', (v) => limitProblem('draws', v));
  const seed = numberOption(args, 'seed', (v) => limitProblem('seed', v));
  const grid = numberOption(args, 'grid', (v) => limitProblem('grid', v));
  const trim = numberOption(args, 'trim', (v) => (v >= 0 ? null : 'must be at least 0'));
  const multiplier = choiceOption(args, 'multiplier', ['normal', 'rademacher'] as const);
  const trendGuard = choiceOption(args, 'trend-guard', ['on', 'off'] as const);
  const sensitivity = sensitivityOption(one(args, 'sensitivity'));
  const densityBin = numberOption(args, 'density-bin', (v) => (v > 0 ? null : 'must be positive'));
  const densityBandwidth = numberOption(args, 'density-bandwidth', (v) => (v > 0 ? null : 'must be positive'));
  const donut = numberOption(args, 'donut', (v) => (v > 0 ? null : 'must be positive'));
  return {
    scoreName,
    treatedName,
    outcomeNames,
    covariateNames: args.values.get('covariate') ?? [],
    clusterName,
    withinName: one(args, 'within'),
    sheet: one(args, 'sheet'),
    options: {
      cutoff,
      bandwidth,
      rule,
      kernel,
      variance,
      draws,
      seed,
      grid,
      trim,
      multiplier,
      trendGuard: trendGuard === undefined ? undefined : trendGuard === 'on',
      sensitivity,
      densityBin,
      densityBandwidth,
      donut,
    },
  };
}

export interface CheckedFile {
  result: CheckResult;
  /** The file's bytes and table, for the report writers (absent when `keepSource` is false). */
  source?: SourceFile;
  names: { score: string; treated: string };
}

/**
 * The file's columns for the check, and its table when `keepSource` (the
 * report writers read it). In a function of its own so that without it the
 * table — the file's bytes, row starts and read numbers —
 * is let go when this returns, before the check runs.
 */
async function readColumns(file: string, spec: CheckSpec, keepSource: boolean): Promise<{ input: CheckInput; table?: Table; bytes?: Buffer; isXlsx?: boolean }> {
  const numeric = [spec.scoreName, spec.treatedName, ...spec.outcomeNames, ...spec.covariateNames];
  const { table, bytes, isXlsx } = await readTable(file, spec.sheet, numeric);
  const input: CheckInput = {
    score: numericColumn(table, spec.scoreName, 'score'),
    treated: numericColumn(table, spec.treatedName, 'treated'),
    outcomes: spec.outcomeNames.map((o) => numericColumn(table, o, 'outcome')),
    covariates: spec.covariateNames.map((c) => numericColumn(table, c, 'covariate')),
    cluster: spec.clusterName !== undefined ? labelColumn(table, spec.clusterName, 'cluster') : undefined,
    within: spec.withinName !== undefined ? labelColumn(table, spec.withinName, 'within') : undefined,
  };
  return keepSource ? { input, table, bytes, isXlsx } : { input };
}

/** Reads and checks one file; `bins` adds the plot data (reports and --json --bins need them); `keepSource` keeps the file for the reports. */
export async function checkFile(file: string, spec: CheckSpec, bins: boolean, keepSource = true): Promise<CheckedFile> {
  const { input, table, bytes, isXlsx } = await readColumns(file, spec, keepSource);
  distinctRoles(input);
  if (spec.options.variance === 'cluster' && input.cluster && input.cluster.labels.length < 2) {
    throw new CutlineError(
      `--cluster: column ${JSON.stringify(input.cluster.name)} holds ${input.cluster.labels.length} cluster${input.cluster.labels.length === 1 ? '' : 's'}; clustered standard errors need at least 2 (and are rough with fewer than about 20)`,
    );
  }
  const result = runCheck(input, { ...spec.options, bins });
  const names = { score: input.score.name, treated: input.treated.name };
  if (!table || !bytes) return { result, names };
  return { result, source: { file, bytes, sheet: spec.sheet, isXlsx: isXlsx === true, table }, names };
}
