// The public face of src/engine/validity: what other folders and the engine's index (src/engine/index.ts) use.
// Everything not listed here is private to the folder; import it from here, never from its file.
export { bootstrapMaxima, selection } from './validityBootstrap';
export type { MultiplierName } from './validityBootstrap';
export { MAX_DRAWS, MAX_GRID, resolveValidityOptions, validityByBandwidth, validityMomentSets, validityTest, verdictWarnings } from './validityTest';
export type { ValidityAtBandwidth, ValidityResult } from './validityTest';
