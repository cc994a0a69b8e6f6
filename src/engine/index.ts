/**
 * The engine's public API (docs/engine-api.md): one entry point per worksheet
 * function, plus the whole check. Faces import the engine only from here.
 *
 * TEMPORARY (branch i10): a minimal adapter over the existing engine modules,
 * written to the names of docs/engine-api.md until the real index lands on
 * main. Every entry point is composed of the same steps as `runCheck`, so a
 * worksheet formula and `cutline check` give the same numbers.
 */
import { BandwidthRule, chooseBandwidth } from './bandwidth/bandwidth';
import { donutMask, testBandwidth } from './check/check';
import { balanceSection, BalanceRow, binnedSeries, BinnedSeries, densitySection, DensitySection } from './check/designChecks';
import { complierCdf, complierDensity } from './compliers/complierDistributions';
import { compact, completeRows } from './data/listwise';
import { CutlineError } from './errors';
import { applyWeights, boundaryWindow } from './fit/boundaryWindow';
import { Estimate } from './fit/estimate';
import { estimatesAtCutoff } from './fit/estimatesAtCutoff';
import { jumpAt } from './fit/jumpAt';
import { KernelName, KERNEL_NAMES } from './fit/kernels';
import { VarianceName, VARIANCE_NAMES } from './fit/residuals';
import { MultiplierName } from './validity/validityBootstrap';
import { validityReport, ValidityReport as ValidityReportCore } from './validity/validityReport';

export { CutlineError } from './errors';
export { runCheck } from './check/check';
export type { CheckInput, CheckOptions, CheckResult } from './check/check';
export type { Estimate } from './fit/estimate';
export { BANDWIDTH_RULES } from './bandwidth/bandwidth';
export type { BandwidthRule } from './bandwidth/bandwidth';
export { KERNEL_NAMES } from './fit/kernels';
export type { KernelName } from './fit/kernels';
export { VARIANCE_NAMES } from './fit/residuals';
export type { VarianceName } from './fit/residuals';
export type { MultiplierName } from './validity/validityBootstrap';
export { MAX_DRAWS, MAX_GRID } from './validity/validityTest';
export { Random } from './numeric/random';

type Column = ArrayLike<number>;

/** Per-argument missing masks (1 = missing). */
export interface Missing {
  score?: Uint8Array;
  treated?: Uint8Array;
  outcome?: Uint8Array;
  values?: Uint8Array;
  covariate?: Uint8Array;
  clusters?: Uint8Array;
}

export interface EstimateOptions {
  bandwidth?: number;
  rule?: BandwidthRule;
  kernel?: KernelName;
  variance?: VarianceName;
  clusters?: Int32Array;
  eligible?: 'above' | 'below';
  donut?: number;
  level?: number;
  missing?: Missing;
}

export interface ValidityOptions extends EstimateOptions {
  draws?: number;
  seed?: number;
  grid?: number;
  trim?: number;
  multiplier?: MultiplierName;
  /** Multiples of the test bandwidth for the by-bandwidth table; [] (default) for the test bandwidth alone. */
  sensitivity?: number[];
  /** The trend guard (default true); false gives the published test alone. */
  trendGuard?: boolean;
}

/** What every result carries. */
export interface Common {
  bandwidth: number;
  counts: { below: number; above: number };
  rows: { used: number; dropped: number };
  warnings: string[];
}

export type EstimateResult = Estimate & Common & { eligible: 'above' | 'below' };

export interface EffectResult extends Common {
  effect: Estimate;
  takeup: Estimate;
  jump: Estimate;
  eligible: 'above' | 'below';
}

export interface BandwidthResult extends Common {
  rule: BandwidthRule | 'typed' | 'undersmoothed mse';
}

export interface ComplierCurveResult extends Common {
  arm: 0 | 1;
  at: number[];
  /** The CDF or density at each `at`, in the order given. */
  values: number[];
  /** Stretches where the CDF falls or the density is negative. */
  violations: Array<{ from: number; to: number }>;
}

export type ValidityReport = ValidityReportCore & Common & { eligible: 'above' | 'below' };

export interface DensityOptions {
  /** The eligible side (default above): the log ratio is eligible side over the other. */
  eligible?: 'above' | 'below';
  /** McCrary's bin width and bandwidth (rules of thumb when absent). */
  bin?: number;
  bandwidth?: number;
  donut?: number;
  missing?: { score?: Uint8Array };
}

export type DensityReport = DensitySection & Common;

export type BalanceReport = Omit<BalanceRow, 'bandwidth' | 'rows' | 'warnings'> & Common;

export type BinsReport = Omit<BinnedSeries, 'name'> & Common;

function fail(code: string, argument: string, message: string, index?: number): never {
  throw Object.assign(new CutlineError(message), { code, argument, index });
}

const MASK_OF: Record<string, keyof Missing> = { score: 'score', treated: 'treated', outcome: 'outcome', values: 'values', covariate: 'covariate' };

/** Columns of equal length, finite where not missing, treated 0/1 (the checks of `checkColumns`). */
function checkColumns(cols: Array<[string, Column]>, missing: Missing = {}): void {
  const n = cols[0][1].length;
  for (const [name, c] of cols) {
    if (c.length !== n) fail('length', name, `${name} has ${c.length} rows but ${cols[0][0]} has ${n}`);
    const m = missing[MASK_OF[name]];
    for (let i = 0; i < c.length; i++) {
      if (m?.[i]) continue;
      const v = c[i];
      if (typeof v !== 'number' || !Number.isFinite(v)) fail('bad-value', name, `${name}, row ${i + 1}: not a finite number`, i);
      if (name === 'treated' && v !== 0 && v !== 1) fail('bad-value', name, `treated, row ${i + 1}: must be 0 or 1, found ${v}`, i);
    }
  }
}

function resolve(o: EstimateOptions): { kernel: KernelName; variance: VarianceName } {
  const kernel = o.kernel ?? 'triangular';
  const variance = o.variance ?? 'nn';
  if (!KERNEL_NAMES.includes(kernel)) fail('option', 'kernel', `kernel must be one of ${KERNEL_NAMES.join(', ')}; got "${kernel}"`);
  if (!VARIANCE_NAMES.includes(variance)) fail('option', 'variance', `variance must be one of ${VARIANCE_NAMES.join(', ')}; got "${variance}"`);
  if (variance === 'cluster' && !o.clusters) fail('option', 'variance', 'the cluster variance needs cluster codes');
  return { kernel, variance };
}

interface Rows {
  rows: Int32Array;
  dropped: number;
  pick<T extends Float64Array | Int32Array>(v: T): T;
}

function f64(c: Column): Float64Array {
  return c instanceof Float64Array ? c : Float64Array.from(c);
}

// The listwise rows of a set of masks, and the columns compacted to them, are
// remembered by the arrays' identities: the ten worksheet functions of a
// summary sheet hand the engine the same (cached) columns, so they share one
// selection, and the engine's per-array memories (sorted order, windows) hit.
const maskIds = new WeakMap<object, number>();
let nextMaskId = 1;
const idOf = (m: object | undefined): number => {
  if (!m) return 0;
  let id = maskIds.get(m);
  if (id === undefined) {
    id = nextMaskId++;
    maskIds.set(m, id);
  }
  return id;
};
const rowsMemo = new Map<string, { rows: Int32Array; dropped: number }>();
const compactMemo = new WeakMap<object, WeakMap<object, Float64Array | Int32Array>>();

/** Listwise rows of the masks, outside the donut. */
function listwise(n: number, masks: Array<Uint8Array | undefined>, donut?: Uint8Array): Rows {
  const key = `${n}|${[...masks, donut].map(idOf).join(',')}`;
  let sel = rowsMemo.get(key);
  if (!sel) {
    sel = completeRows(n, [...masks, donut]);
    rowsMemo.set(key, sel);
    if (rowsMemo.size > 64) rowsMemo.delete(rowsMemo.keys().next().value as string);
  }
  const { rows, dropped } = sel;
  if (rows.length === 0) fail('too-few', 'score', 'no row has every value this calculation needs');
  const pick = <T extends Float64Array | Int32Array>(v: T): T => {
    if (dropped === 0) return v;
    let byRows = compactMemo.get(v);
    if (!byRows) compactMemo.set(v, (byRows = new WeakMap()));
    let out = byRows.get(rows) as T | undefined;
    if (!out) byRows.set(rows, (out = compact(v, rows)));
    return out;
  };
  return { rows, dropped, pick };
}

function donutOf(score: Float64Array, cutoff: number, o: EstimateOptions): Uint8Array | undefined {
  if (o.donut === undefined) return undefined;
  if (!(o.donut > 0) || !Number.isFinite(o.donut)) fail('option', 'donut', `donut must be a positive number, got ${o.donut}`);
  try {
    return donutMask({ name: 'score', values: score, missing: o.missing?.score }, cutoff, o.donut)?.mask;
  } catch (e) {
    if (e instanceof CutlineError) fail('option', 'donut', `donut ${o.donut} leaves no unit on one side of the cutoff`);
    throw e;
  }
}

function sides(score: Float64Array, cutoff: number): void {
  if (!Number.isFinite(cutoff)) fail('option', 'cutoff', 'the cutoff must be a number');
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < score.length; i++) {
    if (score[i] < lo) lo = score[i];
    if (score[i] > hi) hi = score[i];
  }
  if (lo === hi) fail('too-few', 'score', `the score is constant (every used row is ${lo}); there is no discontinuity to study`);
  if (!(lo < cutoff)) fail('empty-side', 'cutoff', `no unit has a score below the cutoff ${cutoff}`);
  if (!(hi >= cutoff)) fail('empty-side', 'cutoff', `no unit has a score at or above the cutoff ${cutoff}`);
}

function varies(v: Float64Array, argument: string, why: string): void {
  for (let i = 1; i < v.length; i++) if (v[i] !== v[0]) return;
  fail('too-few', argument, `${argument} is constant (every used row is ${v[0]}): ${why}`);
}

/** +1 when eligibility is above the cutoff: the given side, else the sign of the take-up jump at h. */
export function eligibleSide(score: Float64Array, treated: Float64Array, cutoff: number, h: number, kernel: KernelName, given?: 'above' | 'below'): 1 | -1 {
  if (given !== undefined) {
    if (given !== 'above' && given !== 'below') fail('option', 'eligible', `eligible must be "above" or "below", got "${String(given)}"`);
    return given === 'above' ? 1 : -1;
  }
  const w = boundaryWindow(score, cutoff, h, kernel);
  const raw = applyWeights(w.above.coef1[0], w.above.index, treated) - applyWeights(w.below.coef1[0], w.below.index, treated);
  return raw < 0 ? -1 : 1;
}

const FALLS_BELOW = 'take-up falls at the cutoff: eligibility is taken to be below the cutoff, and every jump is reported as below minus above';

/** The design of a fuzzy calculation: rows, the estimates' bandwidth, the eligible side (as `runCheck`). */
function fuzzyDesign(score: Column, treated: Column, outcome: Column, cutoff: number, o: EstimateOptions) {
  checkColumns([['score', score], ['treated', treated], ['outcome', outcome]], o.missing);
  const { kernel, variance } = resolve(o);
  const s = f64(score);
  const d = f64(treated);
  const y = f64(outcome);
  const donut = donutOf(s, cutoff, o);
  const m = o.missing ?? {};
  const p = listwise(s.length, [m.score, m.treated, m.outcome, o.clusters ? m.clusters : undefined], donut);
  const ps = p.pick(s);
  const pd = p.pick(d);
  const py = p.pick(y);
  sides(ps, cutoff);
  varies(pd, 'treated', 'take-up cannot jump');
  varies(py, 'outcome', 'there is no jump to estimate or test');
  const bw = chooseBandwidth(ps, py, cutoff, { rule: o.rule, kernel, typed: o.bandwidth, treated: pd });
  const tk = listwise(s.length, [m.score, m.treated, o.clusters ? m.clusters : undefined], donut);
  const ts = tk.pick(s);
  const td = tk.pick(d);
  sides(ts, cutoff);
  const sign = eligibleSide(ts, td, cutoff, bw.value, kernel, o.eligible);
  const warnings = [...bw.warnings];
  if (sign < 0 && o.eligible === undefined) warnings.push(FALLS_BELOW);
  return { kernel, variance, p, ps, pd, py, tk, ts, td, h: bw.value, sign, warnings, clusters: o.clusters && p.pick(o.clusters) };
}

/** CUTLINE.EFFECT: the complier effect τ(Y)/τ(D), with its own take-up and outcome jumps. */
export function complierEffect(score: Column, treated: Column, outcome: Column, cutoff: number, opts: EstimateOptions = {}): EffectResult {
  const g = fuzzyDesign(score, treated, outcome, cutoff, opts);
  const est = estimatesAtCutoff(g.ps, g.pd, g.py, cutoff, {
    bandwidth: g.h,
    kernel: g.kernel,
    variance: g.variance,
    clusters: g.clusters,
    sign: g.sign,
    level: opts.level,
  });
  return {
    effect: est.effect,
    takeup: est.takeup,
    jump: est.jump,
    eligible: g.sign > 0 ? 'above' : 'below',
    bandwidth: g.h,
    counts: est.counts,
    rows: { used: g.p.rows.length, dropped: g.p.dropped },
    warnings: [...g.warnings, ...est.warnings.filter((w) => !g.warnings.includes(w))],
  };
}

/** A sharp jump of `values` at the cutoff, its bandwidth by rule on that jump. */
function sharpJump(score: Column, values: Column, cutoff: number, o: EstimateOptions, argument: 'values' | 'treated'): EstimateResult {
  checkColumns([['score', score], [argument, values]], o.missing);
  const { kernel, variance } = resolve(o);
  const s = f64(score);
  const v = f64(values);
  const m = o.missing ?? {};
  const p = listwise(s.length, [m.score, m[argument], o.clusters ? m.clusters : undefined], donutOf(s, cutoff, o));
  const ps = p.pick(s);
  const pv = p.pick(v);
  sides(ps, cutoff);
  varies(pv, argument, 'there is no jump to estimate');
  const bw = chooseBandwidth(ps, pv, cutoff, { rule: o.rule, kernel, typed: o.bandwidth });
  const sign = argument === 'treated' ? eligibleSide(ps, pv, cutoff, bw.value, kernel, o.eligible) : o.eligible === 'below' ? -1 : 1;
  if (o.eligible !== undefined) eligibleSide(ps, pv, cutoff, bw.value, kernel, o.eligible);
  const win = boundaryWindow(ps, cutoff, bw.value, kernel);
  const e = jumpAt(win, pv, { variance, clusters: o.clusters && p.pick(o.clusters), sign, level: o.level });
  const warnings = [...bw.warnings];
  if (argument === 'treated' && sign < 0 && o.eligible === undefined) warnings.push(FALLS_BELOW);
  return {
    ...e,
    eligible: sign > 0 ? 'above' : 'below',
    bandwidth: bw.value,
    counts: { below: win.below.index.length, above: win.above.index.length },
    rows: { used: p.rows.length, dropped: p.dropped },
    warnings,
  };
}

/** CUTLINE.TAKEUP: the jump in the share treated (first stage). */
export function takeupJump(score: Column, treated: Column, cutoff: number, o: EstimateOptions = {}): EstimateResult {
  return sharpJump(score, treated, cutoff, o, 'treated');
}

/** CUTLINE.JUMP: the jump in the mean of any column. */
export function outcomeJump(score: Column, values: Column, cutoff: number, o: EstimateOptions = {}): EstimateResult {
  return sharpJump(score, values, cutoff, o, 'values');
}

/** CUTLINE.BANDWIDTH: the estimates' bandwidth (rule on the effect when `treated` is given), or the validity test's. */
export function selectBandwidth(
  score: Column,
  values: Column,
  cutoff: number,
  o: EstimateOptions & { treated?: Column; purpose: 'estimate' | 'test' },
): BandwidthResult {
  // `values` plays the outcome's part in a fuzzy design.
  const fo = { ...o, missing: { ...o.missing, outcome: o.missing?.values } };
  if (o.purpose === 'test') {
    if (!o.treated) fail('option', 'treated', "the validity test's bandwidth needs the treated column");
    const g = fuzzyDesign(score, o.treated, values, cutoff, fo);
    const warnings = [...g.warnings];
    const value = o.bandwidth ?? testBandwidth(g.ts, g.td, cutoff, g.kernel, g.h, warnings);
    const win = boundaryWindow(g.ps, cutoff, value, g.kernel, { quadratic: false });
    return {
      bandwidth: value,
      rule: o.bandwidth !== undefined ? 'typed' : 'undersmoothed mse',
      counts: { below: win.below.index.length, above: win.above.index.length },
      rows: { used: g.p.rows.length, dropped: g.p.dropped },
      warnings,
    };
  }
  if (o.treated) {
    const g = fuzzyDesign(score, o.treated, values, cutoff, fo);
    const win = boundaryWindow(g.ps, cutoff, g.h, g.kernel);
    return {
      bandwidth: g.h,
      rule: o.bandwidth !== undefined ? 'typed' : (o.rule ?? 'mse'),
      counts: { below: win.below.index.length, above: win.above.index.length },
      rows: { used: g.p.rows.length, dropped: g.p.dropped },
      warnings: g.warnings,
    };
  }
  const j = outcomeJump(score, values, cutoff, o);
  return { bandwidth: j.bandwidth, rule: o.bandwidth !== undefined ? 'typed' : (o.rule ?? 'mse'), counts: j.counts, rows: j.rows, warnings: j.warnings };
}

function complierCurve(
  what: 'cdf' | 'density',
  score: Column,
  treated: Column,
  outcome: Column,
  cutoff: number,
  at: number[],
  arm: 0 | 1,
  o: EstimateOptions,
): ComplierCurveResult {
  if (arm !== 0 && arm !== 1) fail('option', 'arm', `arm must be 1 (treated compliers) or 0 (untreated), got ${String(arm)}`);
  at.forEach((a, i) => Number.isFinite(a) || fail('bad-value', 'at', `at, value ${i + 1}: not a finite number`, i));
  const g = fuzzyDesign(score, treated, outcome, cutoff, o);
  const co = { bandwidth: g.h, kernel: g.kernel, sign: g.sign };
  const win = boundaryWindow(g.ps, cutoff, g.h, g.kernel, { quadratic: false });
  const common = {
    arm,
    at: [...at],
    bandwidth: g.h,
    counts: { below: win.below.index.length, above: win.above.index.length },
    rows: { used: g.p.rows.length, dropped: g.p.dropped },
  };
  if (what === 'cdf') {
    const c = complierCdf(g.ps, g.pd, g.py, cutoff, at, arm, co);
    return { ...common, values: c.cdf, violations: c.decreasing, warnings: g.warnings };
  }
  const d = complierDensity(g.ps, g.pd, g.py, cutoff, at, arm, co);
  return { ...common, values: d.density, violations: d.negative, warnings: g.warnings };
}

/** CUTLINE.COMPLIERCDF: the implied CDF of compliers' outcomes in one arm at the values `at`. */
export function complierCdfAt(score: Column, treated: Column, outcome: Column, cutoff: number, at: number[], arm: 0 | 1, o: EstimateOptions = {}): ComplierCurveResult {
  return complierCurve('cdf', score, treated, outcome, cutoff, at, arm, o);
}

/** CUTLINE.COMPLIERDENSITY: the implied density of compliers' outcomes in one arm at the values `at`. */
export function complierDensityAt(score: Column, treated: Column, outcome: Column, cutoff: number, at: number[], arm: 0 | 1, o: EstimateOptions = {}): ComplierCurveResult {
  return complierCurve('density', score, treated, outcome, cutoff, at, arm, o);
}

/** CUTLINE.VALIDITY: the outcome–treatment test at the test bandwidth (as `cutline check`); a sharp design is an error saying why. */
export function validity(score: Column, treated: Column, outcome: Column, cutoff: number, o: ValidityOptions = {}): ValidityReport {
  const g = fuzzyDesign(score, treated, outcome, cutoff, o);
  const warnings = [...g.warnings];
  const testH = o.bandwidth ?? testBandwidth(g.ts, g.td, cutoff, g.kernel, g.h, warnings);
  const v = validityReport(g.ps, g.pd, g.py, cutoff, {
    kernel: g.kernel,
    sign: g.sign,
    draws: o.draws,
    seed: o.seed,
    grid: o.grid,
    trim: o.trim,
    multiplier: o.multiplier,
    trendGuard: o.trendGuard,
    bandwidth: testH,
    multiples: (o.sensitivity ?? []).filter((m) => m !== 1),
  });
  if (!v.applicable) fail('not-applicable', 'treated', v.reason);
  for (const w of v.warnings) if (!warnings.includes(w)) warnings.push(w);
  return {
    ...v,
    eligible: g.sign > 0 ? 'above' : 'below',
    bandwidth: testH,
    counts: v.observed.counts,
    rows: { used: g.p.rows.length, dropped: g.p.dropped },
    warnings,
  };
}

/** Units with c − h < score < c and c ≤ score < c + h. */
function windowCounts(score: ArrayLike<number>, cutoff: number, h: number): { below: number; above: number } {
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

/** CUTLINE.DENSITYTEST: a jump in the density of the score (local polynomial headline, McCrary beside; method 'none' when neither is reliable). */
export function densityTest(score: Column, cutoff: number, o: DensityOptions = {}): DensityReport {
  checkColumns([['score', score]], o.missing);
  const s = f64(score);
  const p = listwise(s.length, [o.missing?.score], donutOf(s, cutoff, o));
  const ps = p.pick(s);
  sides(ps, cutoff);
  const d = densitySection(ps, cutoff, { sign: o.eligible === 'below' ? -1 : 1, bin: o.bin, bandwidth: o.bandwidth });
  if (!d) fail('too-few', 'score', 'neither density test could be computed on these data');
  const h = d.local_polynomial?.bandwidth ?? d.mccrary?.bandwidth ?? NaN;
  return { ...d, bandwidth: h, counts: windowCounts(ps, cutoff, h), rows: { used: p.rows.length, dropped: p.dropped }, warnings: d.warnings };
}

/** CUTLINE.BALANCE: a covariate's jump at its own bandwidth and the permutation test — a check's balance row. */
export function covariateBalance(score: Column, covariate: Column, cutoff: number, o: EstimateOptions & { seed?: number } = {}): BalanceReport {
  checkColumns([['score', score], ['covariate', covariate]], o.missing);
  const { kernel, variance } = resolve(o);
  const s = f64(score);
  const c = f64(covariate);
  const m = o.missing ?? {};
  const p = listwise(s.length, [m.score, m.covariate, variance === 'cluster' ? m.clusters : undefined], donutOf(s, cutoff, o));
  const ps = p.pick(s);
  sides(ps, cutoff);
  const [row] = balanceSection(
    [{ name: 'covariate', score: ps, values: p.pick(c), clusters: variance === 'cluster' && o.clusters ? p.pick(o.clusters) : undefined, dropped: p.dropped }],
    cutoff,
    { rule: o.rule, typed: o.bandwidth, kernel, variance, sign: o.eligible === 'below' ? -1 : 1, seed: o.seed },
  );
  const h = row.bandwidth ?? NaN;
  return { ...row, bandwidth: h, counts: Number.isFinite(h) ? windowCounts(ps, cutoff, h) : { below: 0, above: 0 }, rows: row.rows, warnings: row.warnings };
}

/** CUTLINE.BINS: binned means for a plot, with the fit lines at the column's own bandwidth. */
export function binnedMeansAt(score: Column, values: Column, cutoff: number, o: EstimateOptions = {}): BinsReport {
  checkColumns([['score', score], ['values', values]], o.missing);
  const { kernel } = resolve(o);
  const s = f64(score);
  const v = f64(values);
  const m = o.missing ?? {};
  const p = listwise(s.length, [m.score, m.values], donutOf(s, cutoff, o));
  const ps = p.pick(s);
  const pv = p.pick(v);
  sides(ps, cutoff);
  const bw = chooseBandwidth(ps, pv, cutoff, { rule: o.rule, kernel, typed: o.bandwidth });
  const series = binnedSeries('values', ps, pv, cutoff, bw.value, kernel);
  return {
    bins: series.bins,
    bins_below: series.bins_below,
    bins_above: series.bins_above,
    rule: series.rule,
    fit: series.fit,
    bandwidth: bw.value,
    counts: windowCounts(ps, cutoff, bw.value),
    rows: { used: p.rows.length, dropped: p.dropped },
    warnings: [...bw.warnings],
  };
}
