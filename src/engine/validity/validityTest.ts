/**
 * The outcome–treatment validity test of a fuzzy discontinuity design:
 * Arai, Hsu, Kitagawa, Mourifié & Wan (2022), "Testing identifying
 * assumptions in fuzzy regression discontinuity designs", Quantitative
 * Economics 13(1), 1–28; inference by Andrews & Shi (2013, Econometrica 81(2)).
 *
 * docs/methods.md §4: window W (k_i > 0) at the given bandwidth and
 * kernel; interval class from W's outcomes (intervalClass.ts); for each
 * moment ℓ = (I, d), ν̂ and its hc0 σ̂ from per-bin sums (validityMoments.ts);
 * t = ν̂/max(σ̂, f), f = ξ·sqrt(Σ_W ω²); T = max t; multiplier bootstrap with
 * κ_n = sqrt(0.3 ln n), B_n = sqrt(0.4 ln n / ln ln n), n the number of units
 * used (all rows in the calculation, not only the window); p = #{T*_b ≥ T}/B.
 *
 * Choices Cutline states:
 * - the 5% critical value is the order statistic T*_(⌈0.95·B⌉) (the inverse of
 *   the empirical distribution function, Hyndman & Fan type 1);
 * - `rejects` (by bandwidth) means p ≤ 0.05;
 * - with `cells` (a discrete covariate), each cell has its own window fit,
 *   interval class and floor f; the moments of all cells, ordered by cell id
 *   then as in §4, enter one maximum and one joint bootstrap (cells hold
 *   disjoint units, so their draws are independent); the take-up jump reported
 *   is that of the pooled window;
 * - the take-up jump counts as significantly positive when its hc0 z ≥ 1.645;
 * - arms that test nothing (docs/methods.md §4.7, Cutline's rule): when no unit of the
 *   window on the non-eligible side is treated, the arm-1 moments are left out
 *   of T and of every draw; when no unit of the window on the eligible side is
 *   untreated, the arm-0 moments are; both (a sharp design) → the result is
 *   `{ applicable: false, reason }`, never a p-value. Within covariate cells
 *   the rule applies cell by cell (each cell has its own window); the test is
 *   not applicable only when every cell tests nothing. `intervals` counts the
 *   moments kept.
 *
 * @example
 *   const r = validityTest(score, treated, bill, 60, { bandwidth: 8, kernel: 'triangular' });
 *   r.pvalue; r.worst; // { arm: 1, from: 410, to: 530, t: 2.7 }
 */
import { boundaryWindow, KernelName, gathered, windowValues } from '../fit';
import { CutlineError } from '../errors';
import { VALIDITY_LIMITS as LIMITS } from '../limits';
import { formatNumber, sum } from '../numeric';
import { intervalClass } from './intervalClass';
import { MultiplierName, bootstrapMaxima, selection } from './validityBootstrap';
import { MomentSet, selectMoments, takeupOf, validityMoments } from './validityMoments';

export interface ValidityOptions {
  bandwidth: number;
  kernel: KernelName;
  /** Bootstrap draws B (default 999). */
  draws?: number;
  /** Seed of the multipliers (default 1). */
  seed?: number;
  /** Grid size G (default 30). */
  grid?: number;
  /** Trimming ξ (default 0.1). */
  trim?: number;
  multiplier?: MultiplierName;
  /** +1: take-up rises at c (eligibility above); −1: eligibility below. */
  sign?: 1 | -1;
  /** Discrete covariate cell id per data row (test within cells). */
  cells?: Int32Array;
  /** The cells' names for messages (cellLabels[id]); ids are shown when absent. */
  cellLabels?: string[];
  /** Subset of data rows to use. */
  rows?: Int32Array;
}

/** An arm left out of the test because its restrictions cannot fail. */
export interface ArmLeftOut {
  arm: 0 | 1;
  /** Covariate cell id and name (test within cells). */
  cell?: number;
  cell_label?: string;
  reason: string;
}

export interface ValidityResult {
  applicable: true;
  statistic: number;
  pvalue: number;
  critical_value: number;
  intervals: number;
  draws: number;
  seed: number;
  bandwidth: number;
  /** `cell` is the covariate cell's id, `cell_label` its name when `cellLabels` is given. */
  worst: { arm: 0 | 1; from: number; to: number; t: number; cell?: number; cell_label?: string };
  counts: { below: number; above: number };
  /** The take-up jump in the test's window (pooled over cells). */
  takeup: number;
  kappa: number;
  /** Arms left out (empty when both arms are tested). */
  left_out: ArmLeftOut[];
  warnings: string[];
}

/** The test cannot say anything here (a sharp design in this window). */
export interface ValidityNotApplicable {
  applicable: false;
  reason: string;
  bandwidth: number;
  counts: { below: number; above: number };
  warnings: string[];
}

export type ValidityOutcome = ValidityResult | ValidityNotApplicable;

export interface ResolvedOptions {
  draws: number;
  seed: number;
  grid: number;
  trim: number;
  multiplier: MultiplierName;
  sign: 1 | -1;
}

/** Checks the options and fills defaults; errors name the option. */
export function resolveValidityOptions(o: ValidityOptions): ResolvedOptions {
  const draws = o.draws ?? 999;
  const seed = o.seed ?? 1;
  const grid = o.grid ?? 30;
  const trim = o.trim ?? 0.1;
  const multiplier = o.multiplier ?? 'normal';
  const sign = o.sign ?? 1;
  if (!Number.isInteger(draws) || draws < LIMITS.draws.min) throw new CutlineError(`draws must be a whole number of at least ${LIMITS.draws.min}, got ${draws}`);
  if (draws > LIMITS.draws.max) throw new CutlineError(`draws must be at most ${LIMITS.draws.max}, got ${draws}`);
  if (!Number.isInteger(seed) || seed < LIMITS.seed.min || seed > LIMITS.seed.max)
    throw new CutlineError(`seed must be a whole number from ${LIMITS.seed.min} to ${LIMITS.seed.max}, got ${seed}`);
  if (!Number.isInteger(grid) || grid < LIMITS.grid.min) throw new CutlineError(`grid must be a whole number of at least ${LIMITS.grid.min}, got ${grid}`);
  if (grid > LIMITS.grid.max) throw new CutlineError(`grid must be at most ${LIMITS.grid.max}, got ${grid}`);
  if (!(trim >= 0) || !Number.isFinite(trim)) throw new CutlineError(`trim must be a number of at least 0, got ${trim}`);
  if (multiplier !== 'normal' && multiplier !== 'rademacher')
    throw new CutlineError(`multiplier must be "normal" or "rademacher", got "${String(multiplier)}"`);
  if (sign !== 1 && sign !== -1) throw new CutlineError(`sign must be 1 (eligibility above) or -1 (below), got ${String(sign)}`);
  if (!(o.bandwidth > 0) || !Number.isFinite(o.bandwidth)) throw new CutlineError(`bandwidth must be a positive number, got ${o.bandwidth}`);
  return { draws, seed, grid, trim, multiplier, sign };
}

/** Checks the columns on the rows used; returns the number of rows used. */
export function checkColumns(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  rows?: Int32Array,
): number {
  const n = score.length;
  if (treated.length !== n || outcome.length !== n)
    throw new CutlineError(`score, treated and outcome must have the same length (${n}, ${treated.length}, ${outcome.length})`);
  const total = rows ? rows.length : n;
  let first = NaN;
  let constant = true;
  for (let t = 0; t < total; t++) {
    const i = rows ? rows[t] : t;
    if (!(i >= 0 && i < n)) throw new CutlineError(`rows holds ${i}, which is not a data row (0..${n - 1})`);
    if (!Number.isFinite(score[i])) throw new CutlineError(`score is not a finite number at row ${i + 1}`);
    if (!Number.isFinite(outcome[i])) throw new CutlineError(`outcome is not a finite number at row ${i + 1}`);
    if (treated[i] !== 0 && treated[i] !== 1) throw new CutlineError(`treated must be 0 or 1, got ${treated[i]} at row ${i + 1}`);
    if (t === 0) first = outcome[i];
    else if (outcome[i] !== first) constant = false;
  }
  if (total > 0 && constant) throw new CutlineError(`the outcome is constant (every row used is ${first}); the validity test needs an outcome that varies`);
  return total;
}

/** One window's moments, with the arms that test nothing left out. */
export interface WindowMoments {
  /** The moments kept (null: neither arm tests anything in this window). */
  set: MomentSet | null;
  /** Take-up jump and its hc0 se in this window (from every moment, before leaving arms out). */
  takeup: { estimate: number; se: number };
  left: Array<{ arm: 0 | 1; reason: string }>;
  counts: { plus: number; minus: number };
}

/** Moments of one window; `label` prefixes errors (covariate cell). */
function momentsFor(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  o: ValidityOptions,
  r: ResolvedOptions,
  rows: Int32Array | undefined,
  label: string,
): WindowMoments {
  let win;
  try {
    win = boundaryWindow(score, cutoff, o.bandwidth, o.kernel, { quadratic: false, rows });
  } catch (e) {
    if (e instanceof CutlineError && label) throw new CutlineError(`${label}: ${e.message}`);
    throw e;
  }
  const plusSide = r.sign === 1 ? win.above : win.below;
  const minusSide = r.sign === 1 ? win.below : win.above;
  const where = r.sign === 1 ? 'above' : 'below';
  const other = r.sign === 1 ? 'below' : 'above';
  // Treated counts from the sides' gathered columns (read in window order, kept by the side for the moments).
  const treatedPlus = sum(gathered(plusSide, treated));
  const treatedMinus = sum(gathered(minusSide, treated));
  const pre = label ? `${label}: ` : '';
  if (treatedPlus === 0)
    throw new CutlineError(
      `${pre}no treated unit ${where} the cutoff inside the window (bandwidth ${formatNumber(o.bandwidth)}): take-up cannot rise there; ` +
        `check the treated column and the eligibility side`,
    );
  // Below the cutoff first, then above (a view of the sorted column when the sides are adjacent in it).
  const ys = windowValues(win, outcome);
  const bins = new Int32Array(ys.length);
  const cls = intervalClass(ys, r.grid, bins);
  if (cls.singleValues && cls.distinct < 2)
    throw new CutlineError(
      `${pre}the outcome takes a single value (${ys[0]}) among the ${ys.length} units in the window (bandwidth ${formatNumber(o.bandwidth)}); ` +
        `the validity test needs an outcome that varies there — widen the bandwidth`,
    );
  const nb = win.below.index.length;
  const all = validityMoments(win, cls, treated, outcome, r.trim, r.sign, { below: bins.subarray(0, nb), above: bins.subarray(nb) });
  const left: WindowMoments['left'] = [];
  if (treatedMinus === 0)
    left.push({
      arm: 1,
      reason:
        `no unit ${other} the cutoff in the window is treated, so these restrictions only say that a share is not negative ` +
        `and cannot fail`,
    });
  if (treatedPlus === plusSide.index.length)
    left.push({
      arm: 0,
      reason:
        `every unit ${where} the cutoff in the window is treated, so these restrictions only say that a share is not negative ` +
        `and cannot fail`,
    });
  const keep: number[] = [];
  for (let l = 0; l < all.count; l++) if (!left.some((a) => a.arm === all.arm[l])) keep.push(l);
  return {
    set: keep.length === 0 ? null : keep.length === all.count ? all : selectMoments(all, keep),
    takeup: takeupOf(all),
    left,
    counts: { plus: plusSide.index.length, minus: minusSide.index.length },
  };
}

/** A cell's name for messages: its label when given, else its id. */
function cellName(o: ValidityOptions, id: number): string {
  const label = o.cellLabels?.[id];
  return label === undefined ? String(id) : JSON.stringify(label);
}

/** The windows' moments (one per covariate cell, ascending ids) and the cell ids. */
export function validityMomentSets(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  o: ValidityOptions,
  r: ResolvedOptions,
): { windows: WindowMoments[]; cellIds: number[] | null } {
  if (!o.cells) return { windows: [momentsFor(score, treated, outcome, cutoff, o, r, o.rows, '')], cellIds: null };
  const cells = o.cells;
  if (cells.length !== score.length) throw new CutlineError(`cells must have one id per data row (${score.length}), got ${cells.length}`);
  const byCell = new Map<number, number[]>();
  const total = o.rows ? o.rows.length : score.length;
  for (let t = 0; t < total; t++) {
    const i = o.rows ? o.rows[t] : t;
    const list = byCell.get(cells[i]);
    if (list) list.push(i);
    else byCell.set(cells[i], [i]);
  }
  const ids = [...byCell.keys()].sort((a, b) => a - b);
  const windows = ids.map((id) =>
    momentsFor(score, treated, outcome, cutoff, o, r, Int32Array.from(byCell.get(id)!), `within cell ${cellName(o, id)}`),
  );
  return { windows, cellIds: ids };
}

/** The reason a sharp design gets no p-value (docs/methods.md §4.7). */
export function sharpReason(sign: 1 | -1, cells: boolean): string {
  const where = sign === 1 ? 'above' : 'below';
  const other = sign === 1 ? 'below' : 'above';
  return (
    `the design is sharp in this window${cells ? ' (in every cell)' : ''}: no unit ${other} the cutoff is treated and every unit ${where} it is, ` +
    `so the outcome–treatment restrictions hold trivially and say nothing about the design; the test is not run`
  );
}

/**
 * The validity test at one bandwidth, on the outcome given (the observed
 * outcome, or the trend guard's Ỹ: see validityReport.ts).
 */
export function validityTest(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  options: ValidityOptions,
): ValidityOutcome {
  const r = resolveValidityOptions(options);
  return validityTestChecked(score, treated, outcome, cutoff, options, r, checkTestInput(score, treated, outcome, cutoff, options.rows));
}

/** The cutoff and the columns on the rows used, checked once for any number of runs; returns the rows used. */
export function checkTestInput(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  rows?: Int32Array,
): number {
  if (!Number.isFinite(cutoff)) throw new CutlineError(`cutoff must be a finite number, got ${cutoff}`);
  return checkColumns(score, treated, outcome, rows);
}

/**
 * validityTest on columns already checked (checkColumns: `n` rows used) with
 * options already resolved: the validity report checks once for all its runs
 * (both versions, every bandwidth), a pass over every row each time otherwise.
 */
export function validityTestChecked(
  score: ArrayLike<number>,
  treated: ArrayLike<number>,
  outcome: ArrayLike<number>,
  cutoff: number,
  options: ValidityOptions,
  r: ResolvedOptions,
  n: number,
): ValidityOutcome {
  const { windows, cellIds } = validityMomentSets(score, treated, outcome, cutoff, options, r);
  const plusName = r.sign === 1 ? 'above' : 'below';
  const minusName = r.sign === 1 ? 'below' : 'above';
  const counts = { below: 0, above: 0 };
  for (const w of windows) {
    counts[plusName] += w.counts.plus;
    counts[minusName] += w.counts.minus;
  }
  const tested = windows.map((w, g) => ({ w, g })).filter((e) => e.w.set !== null);
  if (tested.length === 0)
    return { applicable: false, reason: sharpReason(r.sign, cellIds !== null), bandwidth: options.bandwidth, counts, warnings: [] };
  const sets = tested.map((e) => e.w.set!);
  const kappa = Math.sqrt(0.3 * Math.log(n));
  const bn = Math.sqrt((0.4 * Math.log(n)) / Math.log(Math.log(n)));

  // T and the earliest moment attaining it.
  let T = -Infinity;
  let worstSet = 0;
  let worstL = 0;
  let intervals = 0;
  sets.forEach((m, g) => {
    intervals += m.count;
    for (let l = 0; l < m.count; l++)
      if (m.t[l] > T) {
        T = m.t[l];
        worstSet = g;
        worstL = l;
      }
  });
  const phis = sets.map((m) => selection(m, kappa, bn));
  const tstar = bootstrapMaxima(sets, phis, r.draws, r.seed, r.multiplier);
  let exceed = 0;
  for (let b = 0; b < tstar.length; b++) if (tstar[b] >= T) exceed++;
  tstar.sort();
  const critical = tstar[Math.ceil(0.95 * r.draws) - 1];

  const wm = sets[worstSet];
  const worst: ValidityResult['worst'] = {
    arm: wm.arm[worstL] as 0 | 1,
    from: wm.cls.binMin[wm.first[worstL]],
    to: wm.cls.binMax[wm.last[worstL]],
    t: T,
  };
  if (cellIds) {
    worst.cell = cellIds[tested[worstSet].g];
    const label = options.cellLabels?.[worst.cell];
    if (label !== undefined) worst.cell_label = label;
  }

  const warnings: string[] = [];
  const left_out: ArmLeftOut[] = [];
  windows.forEach((w, g) => {
    const where = cellIds ? ` in cell ${cellName(options, cellIds[g])}` : '';
    for (const [cnt, name] of [[w.counts.minus, minusName], [w.counts.plus, plusName]] as const)
      if (cnt < 50)
        warnings.push(`only ${cnt} units ${name} the cutoff${where} inside the window (fewer than 50): the bootstrap p-value may be inaccurate`);
    for (const a of w.left) {
      if (!cellIds) left_out.push(a);
      else {
        const label = options.cellLabels?.[cellIds[g]];
        left_out.push({ ...a, cell: cellIds[g], ...(label !== undefined ? { cell_label: label } : {}) });
      }
    }
  });

  // A floor above every interval's standard error replaces them all: every t is then near 0, every
  // moment is selected, and the test can hardly reject whatever the data (measured: p from 0 at
  // trim 0.1 to 0.12 at trim 10 on a design it rejects with t = 10).
  if (r.trim > 0 && sets.every((m) => m.se.every((se) => se < m.floor))) {
    warnings.push(
      `the trim ${formatNumber(r.trim)} is so large that it replaces the standard error of every interval: the test no longer weighs intervals by their precision and loses power (at larger trims it can hardly reject, whatever the data); use a trim near the default 0.1`,
    );
  }
  const tk = cellIds ? momentsFor(score, treated, outcome, cutoff, options, r, options.rows, '').takeup : windows[0].takeup;
  if (tk.estimate > 0.8)
    warnings.push(
      `the take-up jump in the test's window (bandwidth ${formatNumber(options.bandwidth)}) is ${formatNumber(tk.estimate)}, above 0.8: in a nearly ` +
        `sharp design the test has little power to detect continuity failures, because the restrictions bind only through the few non-compliers`,
    );
  const z = tk.se > 0 ? tk.estimate / tk.se : tk.estimate > 0 ? Infinity : -Infinity;
  if (!(z >= 1.645))
    warnings.push(
      `the take-up jump in the test's window (${formatNumber(tk.estimate)}, z = ${formatNumber(z)}) is not significantly positive at 5%: ` +
        `the restrictions then say little, and a non-rejection is weak evidence`,
    );

  return {
    applicable: true,
    statistic: T,
    pvalue: exceed / r.draws,
    critical_value: critical,
    intervals,
    draws: r.draws,
    seed: r.seed,
    bandwidth: options.bandwidth,
    worst,
    counts,
    takeup: tk.estimate,
    kappa,
    left_out,
    warnings,
  };
}
