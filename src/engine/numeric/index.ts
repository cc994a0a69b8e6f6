// The public face of src/engine/numeric: what other folders and the engine's index (src/engine/index.ts) use.
// Everything not listed here is private to the folder; import it from here, never from its file.
export { argsortBy, argsortWithValues } from './argsort';
export { firstAtLeast, searchSorted } from './binarySearch';
export { sampleCovariance, sampleVariance } from './describe';
export { dot, sum } from './dot';
export { formatNumber } from './formatNumber';
export { holmAdjust } from './holm';
export { invertSmall } from './linalg';
export { normalQuantile, twoSidedPvalue } from './normal';
export { orderStatistics } from './orderStatistics';
export { rankLookup, rankOf } from './rankLookup';
export type { RankLookup } from './rankLookup';
export { Random } from './random';
