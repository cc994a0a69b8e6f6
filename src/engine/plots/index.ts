// The public face of src/engine/plots: what other folders and the engine's index (src/engine/index.ts) use.
// Everything not listed here is private to the folder; import it from here, never from its file.
export { binnedMeans } from './binnedMeans';
export type { BinnedMeansResult } from './binnedMeans';
export { fitLine } from './fitLine';
export type { FitLineSide } from './fitLine';
