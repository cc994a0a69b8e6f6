/**
 * What every calculation of a check settles first, in one place so that a
 * whole check and an entry point for one quantity settle it the same way:
 * the checked columns, the donut, each calculation's listwise rows (score,
 * treated, the outcome, the cluster), the estimates' bandwidth and the
 * eligible side. The score of each set of rows is an explicit handle
 * (data/indexedScore.ts) made here and dropped with the setting: what one
 * check derives from the scores is reused within it, never across calls.
 */
import { BandwidthChoice, BandwidthRule } from '../bandwidth';
import { checkColumns, checkCutoff, IndexedScore, indexScores, compact, completeRows } from '../data';
import { CutlineError } from '../errors';
import { Window, KernelName, VarianceName } from '../fit';
import { blameDonut, Donut, donutMask, Eligible, eligibleSide, estimatesBandwidth, requireSides, requireVaries, ruleBandwidth } from './steps';
import { clusterWarnings } from './designWarnings';
import { emptySideMessage, noRowMessage } from './emptySide';

export interface DataColumn {
  name: string;
  values: Float64Array;
  missing?: Uint8Array;
}

export interface CodeColumn {
  name: string;
  codes: Int32Array;
  labels: string[];
  missing?: Uint8Array;
}

export interface CheckInput {
  score: DataColumn;
  treated: DataColumn;
  outcomes: DataColumn[];
  covariates?: DataColumn[];
  cluster?: CodeColumn;
  /** A discrete covariate: the validity test is run within its cells. */
  within?: CodeColumn;
}

/** The options every calculation shares. */
export interface SettingOptions {
  cutoff: number;
  bandwidth?: number;
  rule?: BandwidthRule;
  kernel?: KernelName;
  variance?: VarianceName;
  /** Units with |score − cutoff| < donut are left out of every estimate and test. */
  donut?: number;
  /** The eligible side; detected from the take-up jump when absent. */
  eligible?: Eligible;
}

export interface Prepared {
  rows: Int32Array;
  dropped: number;
  score: IndexedScore;
  treated: Float64Array;
  outcome?: Float64Array;
  clusters?: Int32Array;
  cells?: Int32Array;
}

export interface Setting {
  cutoff: number;
  kernel: KernelName;
  variance: VarianceName;
  n: number;
  donut?: Donut;
  /** Each outcome's rows (score, treated, the outcome, the cluster). */
  prepared: Prepared[];
  /** The take-up's rows (score, treated, the cluster). */
  takeupRows: Prepared;
  bandwidth: BandwidthChoice;
  sign: 1 | -1;
  eligible: Eligible;
  /** The take-up's window at the estimates' bandwidth. */
  takeupWindow: Window;
  warnings: string[];
  /** The listwise rows of more columns (the within cells, a covariate), with the same handles. */
  rowsOf(outcome: DataColumn | undefined, masks: (Uint8Array | undefined)[], withCells?: boolean): Prepared;
  /** The score handle of a set of values (one per distinct array of the check). */
  handle(values: Float64Array): IndexedScore;
}

/** The column itself when no row is dropped (the engine never writes to it), else a compact copy. */
export function keep<T extends Float64Array | Int32Array>(values: T, rows: Int32Array, dropped: number): T {
  return dropped === 0 ? values : compact(values, rows);
}

/** Checks every column of the input (numbers, 0/1 treated, equal lengths), naming the argument and 0-based index. */
export function checkInput(input: CheckInput): void {
  const col = (c: DataColumn, argument: string, kind: 'number' | 'binary' = 'number') => ({
    values: c.values,
    missing: c.missing,
    kind,
    argument,
    label: `column ${JSON.stringify(c.name)}`,
  });
  const specs: Record<string, Parameters<typeof checkColumns>[0][string]> = {
    score: col(input.score, 'score'),
    treated: col(input.treated, 'treated', 'binary'),
  };
  input.outcomes.forEach((o, j) => (specs[`outcome ${j}`] = col(o, 'outcome')));
  (input.covariates ?? []).forEach((c, j) => (specs[`covariate ${j}`] = col(c, 'covariate')));
  checkColumns(specs);
  for (const [argument, c] of [['cluster', input.cluster], ['within', input.within]] as const) {
    if (c && c.codes.length !== input.score.values.length) {
      throw new CutlineError(`column ${JSON.stringify(c.name)} has ${c.codes.length} values but the score has ${input.score.values.length}`, {
        code: 'length',
        argument,
      });
    }
  }
}

/**
 * Settles a check: `outcome` rows for each outcome (at least one is needed for
 * a bandwidth by rule unless `takeupOnly`), the estimates' bandwidth (the rule
 * on the first outcome's complier effect, or on the take-up jump alone when
 * there is no outcome) and the eligible side.
 */
export function settle(input: CheckInput, options: SettingOptions): Setting {
  const kernel = options.kernel ?? 'triangular';
  const variance = options.variance ?? 'neighbours';
  const cutoff = checkCutoff(options.cutoff);
  if (variance === 'cluster' && !input.cluster) {
    throw new CutlineError('the cluster variance needs a cluster column', { code: 'option', argument: 'variance' });
  }
  checkInput(input);
  const n = input.score.values.length;
  const donut = donutMask(input.score.values, cutoff, options.donut, input.score.missing);
  const handles = new Map<Float64Array, IndexedScore>();
  const handle = (values: Float64Array): IndexedScore => {
    let h = handles.get(values);
    if (!h) {
      h = indexScores(values);
      handles.set(values, h);
    }
    return h;
  };
  const rowsOf = (outcome: DataColumn | undefined, masks: (Uint8Array | undefined)[], withCells = false): Prepared => {
    const all = [input.score.missing, input.treated.missing, outcome?.missing, input.cluster?.missing, donut?.mask, ...masks];
    if (withCells) all.push(input.within?.missing);
    const { rows, dropped } = completeRows(n, all);
    if (rows.length === 0) throw new CutlineError(noRowMessage(input, outcome, withCells, donut?.mask), { code: 'too-few' });
    return {
      rows,
      dropped,
      score: handle(keep(input.score.values, rows, dropped)),
      treated: keep(input.treated.values, rows, dropped),
      outcome: outcome ? keep(outcome.values, rows, dropped) : undefined,
      clusters: input.cluster ? keep(input.cluster.codes, rows, dropped) : undefined,
      cells: withCells && input.within ? keep(input.within.codes, rows, dropped) : undefined,
    };
  };
  // Each outcome's listwise rows, selected once for the checks, estimates and bins.
  const prepared = input.outcomes.map((col) => rowsOf(col, []));
  const takeupRows = rowsOf(undefined, []);
  const first = prepared[0] ?? takeupRows;
  requireSides(first.score, cutoff, (below) => emptySideMessage(input, input.outcomes[0], cutoff, below, donut?.mask));
  requireVaries(first.treated, 'treated', `column ${JSON.stringify(input.treated.name)}`, 'take-up cannot jump');
  input.outcomes.forEach((col, j) => {
    requireVaries(prepared[j].outcome!, 'outcome', `column ${JSON.stringify(col.name)}`, 'there is no jump to estimate or test');
  });
  const rule = { rule: options.rule, kernel, typed: options.bandwidth };
  const choose = (p: Prepared): BandwidthChoice =>
    p.outcome ? estimatesBandwidth(p.score, p.treated, p.outcome, cutoff, rule) : ruleBandwidth(p.score, p.treated, cutoff, rule);
  const bandwidth = blameDonut(
    options.donut,
    () => choose(first),
    () => {
      const all = completeRows(n, [input.score.missing, input.treated.missing, input.outcomes[0]?.missing, input.cluster?.missing]);
      choose({
        rows: all.rows,
        dropped: all.dropped,
        score: indexScores(keep(input.score.values, all.rows, all.dropped)),
        treated: keep(input.treated.values, all.rows, all.dropped),
        outcome: input.outcomes[0] && keep(input.outcomes[0].values, all.rows, all.dropped),
      });
    },
  );
  const warnings = [...bandwidth.warnings];
  // Take-up on its own rows; its sign decides the eligible side.
  requireSides(takeupRows.score, cutoff, (below) => emptySideMessage(input, undefined, cutoff, below, donut?.mask));
  const side = eligibleSide(takeupRows.score, takeupRows.treated, cutoff, bandwidth.value, kernel, options.eligible);
  warnings.push(...side.warnings);
  if (variance === 'cluster' && takeupRows.clusters && input.cluster) {
    warnings.push(...clusterWarnings(takeupRows.clusters, side.window.below.index, side.window.above.index, input.cluster.labels, input.cluster.name));
  }
  return {
    cutoff,
    kernel,
    variance,
    n,
    donut,
    prepared,
    takeupRows,
    bandwidth,
    sign: side.sign,
    eligible: side.eligible,
    takeupWindow: side.window,
    warnings,
    rowsOf,
    handle,
  };
}
