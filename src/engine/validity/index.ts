// The public face of src/engine/validity: what other folders and the engine's index (src/engine/index.ts) use.
// Everything not listed here is private to the folder; import it from here, never from its file.
export { intervalClass } from './intervalClass';
export { bootstrapMaxima, selection } from './validityBootstrap';
export type { MultiplierName } from './validityBootstrap';
export { validityMoments } from './validityMoments';
export { validityReport } from './validityReport';
export type { ValidityAtBandwidth, ValidityReport, ValidityReportOutcome } from './validityReport';
export { resolveValidityOptions, validityMomentSets, validityTest } from './validityTest';
export type { ValidityResult } from './validityTest';
