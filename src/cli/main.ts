/**
 * `cutline check FILE --score COL --treated COL --outcome COL … --cutoff NUM`
 * (DESIGN.md). Exit status 0 on success, 2 for bad input (one line on
 * standard error saying what and where), 1 for anything else.
 */
import { BANDWIDTH_RULES, CheckInput, CutlineError, KERNEL_NAMES, MAX_DRAWS, MAX_GRID, runCheck, VARIANCE_NAMES } from '../engine';
import { labelColumn, numericColumn } from '../input/columns';
import { errorLine } from './errorLine';
import { choiceOption, numberOption, one, parseArgs, ParsedArgs, required } from './args';
import { toJson } from './json';
import { readable } from './readable';
import { readTable } from './readTable';
import { withFlags } from './flagHints';

const USAGE = `usage: cutline check FILE --score COL --treated COL --outcome COL [--outcome COL …] --cutoff NUM
  [--sheet NAME] [--bandwidth NUM | --bandwidth-rule mse|ik|cer] [--kernel triangular|epanechnikov|uniform]
  [--variance neighbours|hc0|hc1|cluster] [--cluster COL] [--covariate COL …]
  [--draws N] [--seed N] [--grid N] [--trim NUM] [--multiplier normal|rademacher] [--trend-guard on|off]
  [--sensitivity 0.5,0.75,1,1.5,2|off] [--within COL] [--density-bin NUM] [--density-bandwidth NUM]
  [--donut NUM] [--json [--bins]]
`;

/** `--sensitivity 0.5,0.75,1,1.5,2` or `off`. */
function sensitivityOption(s: string | undefined): number[] | undefined {
  if (s === undefined) return undefined;
  if (s.trim().toLowerCase() === 'off') return [];
  const parts = s.split(',').map((p) => p.trim());
  const values = parts.map(Number);
  const bad = parts.findIndex((p, i) => p === '' || !(values[i] > 0) || !Number.isFinite(values[i]));
  if (bad >= 0) throw new CutlineError(`--sensitivity must be positive multiples separated by commas, or off; got ${JSON.stringify(parts[bad])}`);
  return values;
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

/**
 * The file's columns the check uses. The table (the file's bytes and field
 * offsets, about twice the file's size) is dropped when this returns, before
 * the check runs: only the columns stay.
 */
async function readInput(
  file: string,
  args: ParsedArgs,
  names: { scoreName: string; treatedName: string; outcomeNames: string[]; clusterName?: string; withinName?: string },
): Promise<CheckInput> {
  const table = await readTable(file, one(args, 'sheet'));
  return {
    score: numericColumn(table, names.scoreName, 'score'),
    treated: numericColumn(table, names.treatedName, 'treated'),
    outcomes: names.outcomeNames.map((o) => numericColumn(table, o, 'outcome')),
    covariates: (args.values.get('covariate') ?? []).map((c) => numericColumn(table, c, 'covariate')),
    cluster: names.clusterName !== undefined ? labelColumn(table, names.clusterName, 'cluster') : undefined,
    within: names.withinName !== undefined ? labelColumn(table, names.withinName, 'within') : undefined,
  };
}

async function check(args: ParsedArgs): Promise<void> {
  const file = args.file;
  if (!file) throw new CutlineError('check needs an input FILE (CSV or XLSX)');
  for (const unsupported of ['out', 'html']) {
    if (args.values.has(unsupported)) throw new CutlineError(`--${unsupported}: report files are not available in this version of Cutline`);
  }
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

  const draws = numberOption(args, 'draws', (v) =>
    !Number.isInteger(v) || v < 1 ? 'must be a whole number of at least 1' : v > MAX_DRAWS ? `must be at most ${MAX_DRAWS} (more draws only slow the check down)` : null,
  );
  const seed = numberOption(args, 'seed', (v) => (Number.isInteger(v) && v >= 0 && v <= 4294967295 ? null : 'must be a whole number from 0 to 4294967295'));
  const grid = numberOption(args, 'grid', (v) =>
    !Number.isInteger(v) || v < 2 ? 'must be a whole number of at least 2' : v > MAX_GRID ? `must be at most ${MAX_GRID} (the intervals grow as its square)` : null,
  );
  const trim = numberOption(args, 'trim', (v) => (v >= 0 ? null : 'must be at least 0'));
  const multiplier = choiceOption(args, 'multiplier', ['normal', 'rademacher'] as const);
  const trendGuard = choiceOption(args, 'trend-guard', ['on', 'off'] as const);
  const sensitivity = sensitivityOption(one(args, 'sensitivity'));
  const withinName = one(args, 'within');
  const densityBin = numberOption(args, 'density-bin', (v) => (v > 0 ? null : 'must be positive'));
  const densityBandwidth = numberOption(args, 'density-bandwidth', (v) => (v > 0 ? null : 'must be positive'));
  const donut = numberOption(args, 'donut', (v) => (v > 0 ? null : 'must be positive'));
  const bins = args.flags.has('bins');
  if (bins && !args.flags.has('json')) throw new CutlineError('--bins adds the binned tables to the JSON document: use it with --json');

  const input = await readInput(file, args, { scoreName, treatedName, outcomeNames, clusterName, withinName });
  distinctRoles(input);
  if (variance === 'cluster' && input.cluster && input.cluster.labels.length < 2) {
    throw new CutlineError(
      `--cluster: column ${JSON.stringify(input.cluster.name)} holds ${input.cluster.labels.length} cluster${input.cluster.labels.length === 1 ? '' : 's'}; clustered standard errors need at least 2 (and are rough with fewer than about 20)`,
    );
  }
  const result = runCheck(input, {
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
    bins,
  });
  if (args.flags.has('json')) process.stdout.write(JSON.stringify(toJson(result), null, 2) + '\n');
  else process.stdout.write(readable(file, result));
}

async function main(argv: string[]): Promise<number> {
  try {
    if (argv.length === 0 || argv[0] === 'help' || argv[0] === '--help') {
      process.stdout.write(USAGE);
      return argv.length === 0 ? 2 : 0;
    }
    // `cutline check --help` (anywhere after the command) prints the usage too.
    if (argv[0] === 'check' && argv.slice(1).some((a) => a === '--help' || a === '-h')) {
      process.stdout.write(USAGE);
      return 0;
    }
    const args = parseArgs(argv);
    if (args.command !== 'check') throw new CutlineError(`unknown command ${JSON.stringify(args.command)}; the command is \`cutline check\``);
    await check(args);
    return 0;
  } catch (e) {
    if (e instanceof CutlineError) {
      process.stderr.write(`cutline: ${withFlags(errorLine(e))}\n`);
      return 2;
    }
    process.stderr.write(`cutline: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
    return 1;
  }
}

main(process.argv.slice(2)).then((code) => {
  // Exit once standard output has been flushed, without waiting for the heap of
  // a million-row check to be torn down.
  process.stdout.write('', () => process.exit(code));
});
