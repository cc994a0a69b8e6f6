/**
 * The engine's public API: everything a face (command line, worksheet
 * functions, task pane, report writers) or a benchmark may use, and nothing
 * else. Faces import only from here (an ESLint rule and a test enforce it);
 * docs/engine-api.md describes the contract.
 *
 * - Entry points, one per worksheet function: each takes plain columns, a
 *   cutoff and options, checks its columns first (CutlineError naming the
 *   argument and 0-based index) and returns its quantity with its bandwidth,
 *   window counts, rows used and dropped, and warnings.
 * - `runCheck`, the whole check, and the steps it is composed of, so that an
 *   entry point and the check give the same number to the last digit.
 * - Method functions the benchmarks and Monte Carlo studies time directly.
 */

// Entry points.
export {
  binnedMeansAt,
  complierCdfAt,
  complierDensityAt,
  complierEffect,
  covariateBalance,
  densityTest,
  outcomeJump,
  selectBandwidth,
  takeupJump,
  validity,
} from './api';
export type {
  BalanceReport,
  BandwidthResult,
  BinsReport,
  ComplierCurveResult,
  DensityOptions,
  DensityReport,
  EffectResult,
  EstimateOptions,
  EstimateResult,
  MissingMasks,
  ResultBase,
  ValidityEntryReport,
  ValidityOptions,
} from './api';

// The whole check and its steps.
export {
  complierWarnings,
  DEFAULT_SENSITIVITY,
  donutMask,
  eligibleSide,
  estimatesBandwidth,
  runCheck,
  testBandwidth,
  verdictByBandwidth,
  checkMultiples,
  blameDonut,
} from './check';
export type {
  BalanceRow,
  BinnedSeries,
  CheckInput,
  CheckOptions,
  CheckResult,
  CodeColumn,
  ComplierSummary,
  DataColumn,
  DensitySection,
  Eligible,
  EstimateSummary,
  OutcomeResult,
  ValiditySummary,
} from './check';

// Columns, errors, names and limits.
export { checkColumns } from './data';
export type { Column, ColumnSpec } from './data';
export { CutlineError } from './errors';
export type { ErrorCode, ErrorDetail } from './errors';
export { BANDWIDTH_RULES } from './bandwidth';
export type { BandwidthRule } from './bandwidth';
export { KERNEL_NAMES, VARIANCE_NAMES } from './fit';
export type { Estimate, KernelName, VarianceName } from './fit';
export { limitProblem, MAX_DRAWS, MAX_GRID, VALIDITY_LIMITS } from './limits';
export type { WholeLimit } from './limits';
export type { MultiplierName, ValidityAtBandwidth, ValidityReport, ValidityReportOutcome, ValidityResult } from './validity';

// Method functions for the benchmarks and Monte Carlo studies.
export { Random } from './numeric';
export { bootstrapMaxima, intervalClass, resolveValidityOptions, selection, validityMoments, validityMomentSets, validityReport, validityTest } from './validity';
export { localPolynomialDensityTest, mccraryTest } from './density';
export { permutationBalanceTest } from './covariates';
export { bandwidthMse, chooseBandwidth, widenForTies } from './bandwidth';
export { boundaryWindow, estimatesAtCutoff, gathered, jumpAt, neighbourResiduals } from './fit';
export { binnedMeans } from './plots';
