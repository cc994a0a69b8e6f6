/**
 * The tests of a jump in the score’s density at the cutoff (docs/methods.md §6):
 * the local polynomial test (Cattaneo, Jansson & Ma 2020), the headline when
 * it can be computed, and McCrary's (2008), on every row with a score (outside
 * the donut), as in a check.
 *
 * @example densityTest(score, 60).pvalue // 0.571 on the demo
 */
import { densitySection, DensitySection, donutMask } from '../check';
import { checkColumns, checkCutoff, Column, compact, completeRows, indexScores } from '../data';
import { CutlineError } from '../errors';
import { ResultBase, windowCounts } from './common';

export interface DensityOptions {
  /** The eligible side (default above): the log ratio is eligible side over the other. */
  eligible?: 'above' | 'below';
  /** McCrary's bin width and bandwidth (rules of thumb when absent). */
  bin?: number;
  bandwidth?: number;
  donut?: number;
  missing?: { score?: Uint8Array };
}

export type DensityReport = DensitySection & ResultBase;

export function densityTest(score: Column, cutoff: number, opts: DensityOptions = {}): DensityReport {
  const c = checkCutoff(cutoff);
  const m = opts.missing?.score;
  const r = checkColumns({ score: { values: score, missing: m } }).score;
  const donut = donutMask(r, c, opts.donut, m);
  const { rows, dropped } = completeRows(r.length, [m, donut?.mask]);
  const x = indexScores(compact(r, rows));
  const d = densitySection(x, c, { sign: opts.eligible === 'below' ? -1 : 1, bin: opts.bin, bandwidth: opts.bandwidth });
  if (!d) throw new CutlineError('neither density test could be computed on these data', { code: 'too-few', argument: 'score' });
  const h = d.local_polynomial?.bandwidth ?? d.mccrary!.bandwidth;
  return { ...d, bandwidth: h, counts: windowCounts(x, c, h), rows: { used: rows.length, dropped }, warnings: d.warnings };
}
