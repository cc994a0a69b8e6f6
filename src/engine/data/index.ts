// The public face of src/engine/data: what other folders and the engine's index (src/engine/index.ts) use.
// Everything not listed here is private to the folder; import it from here, never from its file.
export { checkColumns, checkCutoff } from './checkColumns';
export type { Column, ColumnSpec } from './checkColumns';
export { gatheredColumns, IndexedScore, keepGathered, indexScores, lowerBound, orderView, rememberedOn, sortedOrder, valuesAt } from './indexedScore';
export type { OrderView } from './indexedScore';
export { compact, completeRows } from './listwise';
export { countDistinctSorted, distinctScoreWarning, windowDistinctScores } from './repeatedScores';
export { requireBothSides, scoreSummary } from './scoreSummary';
export type { ScoreSummary } from './scoreSummary';
