// The public face of src/engine/density: what other folders and the engine's index (src/engine/index.ts) use.
// Everything not listed here is private to the folder; import it from here, never from its file.
export { localPolynomialDensityTest } from './densityLocalPolynomial';
export type { LocalPolynomialDensityResult } from './densityLocalPolynomial';
export { mccraryTest } from './densityMcCrary';
export type { McCraryResult } from './densityMcCrary';
