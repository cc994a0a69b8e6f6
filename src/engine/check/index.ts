// The public face of src/engine/check: what other folders and the engine's index (src/engine/index.ts) use.
// Everything not listed here is private to the folder; import it from here, never from its file.
export { runCheck } from './check';
export type { CheckOptions, CheckResult, ComplierSummary, EstimateSummary, OutcomeResult, ValiditySummary } from './check';
export { balanceSection, binnedSeries, densitySection } from './designChecks';
export type { BalanceRow, BinnedSeries, DensitySection } from './designChecks';
export { outcomeEstimates, outcomeValidity } from './outcomeSections';
export { settle } from './setting';
export type { CheckInput, CodeColumn, DataColumn } from './setting';
export { DEFAULT_SENSITIVITY, blameDonut, checkMultiples, complierWarnings, donutMask, eligibleSide, estimatesBandwidth, ruleBandwidth, testBandwidth, verdictByBandwidth } from './steps';
export type { Eligible } from './steps';
