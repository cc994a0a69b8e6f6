/**
 * What the entry points share: their options, the fields every result
 * carries, and the conversion of plain checked columns into a settled check
 * (check/setting.ts) so that each entry point computes its quantity exactly as
 * `runCheck` does.
 */
import { BandwidthRule } from '../bandwidth';
import { addNew } from '../addNew';
import { CheckInput, DataColumn, Eligible } from '../check';
import { checkColumns, Column } from '../data';
import { CutlineError } from '../errors';
import { KernelName, VarianceName } from '../fit';

/** Missing-value masks (1 = missing) per argument; a masked row is left out of the calculation, never read. */
export interface MissingMasks {
  score?: Uint8Array;
  treated?: Uint8Array;
  outcome?: Uint8Array;
  values?: Uint8Array;
  covariate?: Uint8Array;
  clusters?: Uint8Array;
}

export interface EstimateOptions {
  /** A typed bandwidth: used as it is, wins over the rule. */
  bandwidth?: number;
  /** Bandwidth rule (default 'mse'). */
  rule?: BandwidthRule;
  kernel?: KernelName;
  /** Variance of the estimates (default 'neighbours'; 'cluster' needs `clusters`). */
  variance?: VarianceName;
  /** Cluster code of every row (whole numbers). */
  clusters?: Column;
  /** The eligible side; detected from the take-up jump when absent (where take-up is given). */
  eligible?: Eligible;
  /** Rows with |score − cutoff| < donut are left out. */
  donut?: number;
  /** Level of the intervals (default 0.95). */
  level?: number;
  missing?: MissingMasks;
}

/** Fields every result carries. */
export interface ResultBase {
  /** The bandwidth the quantity was computed at. */
  bandwidth: number;
  /** Units inside the window below and above the cutoff. */
  counts: { below: number; above: number };
  /** Rows used, and rows left out (a missing value, or inside the donut). */
  rows: { used: number; dropped: number };
  /** Plain-language cautions about this result. */
  warnings: string[];
}

/** Plain columns (score, treated, an outcome under its argument name) checked and made into a check's input. */
export function columnsInput(
  cols: { score: Column; treated?: Column; outcome?: Column; outcomeArgument?: 'outcome' | 'values' | 'covariate' },
  opts: EstimateOptions,
): CheckInput & { treatedGiven: boolean } {
  const m = opts.missing ?? {};
  const oa = cols.outcomeArgument ?? 'outcome';
  const c = checkColumns({
    score: { values: cols.score, missing: m.score },
    treated: { values: cols.treated, missing: m.treated, kind: 'binary' },
    [oa]: { values: cols.outcome, missing: m[oa] },
    clusters: { values: opts.clusters, missing: m.clusters, kind: 'code' },
  } as Record<string, { values: Column | undefined; missing?: Uint8Array; kind?: 'number' | 'binary' | 'code' }>);
  const n = c.score.length;
  const col = (name: string, values: Float64Array, missing?: Uint8Array): DataColumn => ({ name, values, missing });
  const treated = c.treated ?? new Float64Array(n);
  const input: CheckInput & { treatedGiven: boolean } = {
    score: col('score', c.score, m.score),
    treated: col('treated', treated, m.treated),
    outcomes: c[oa] ? [col(oa, c[oa], m[oa])] : [],
    treatedGiven: c.treated !== undefined,
  };
  if (c.clusters) input.cluster = { name: 'clusters', codes: Int32Array.from(c.clusters), labels: [], missing: m.clusters };
  if ((opts.variance ?? 'neighbours') === 'cluster' && !c.clusters) {
    throw new CutlineError('the cluster variance needs a cluster code for every row', { code: 'option', argument: 'clusters' });
  }
  return input;
}

/** Units with c − h < score < c and c ≤ score < c + h (the window's counts). */
export function windowCounts(score: ArrayLike<number>, cutoff: number, h: number): { below: number; above: number } {
  let below = 0;
  let above = 0;
  for (let i = 0; i < score.length; i++) {
    const x = score[i] - cutoff;
    if (x >= 0) {
      if (x < h) above++;
    } else if (-x < h) below++;
  }
  return { below, above };
}

/** Warnings of a step, then those of the result not already said. */
export function merged(...lists: string[][]): string[] {
  const out: string[] = [];
  for (const list of lists) addNew(out, list);
  return out;
}
