// The public face of src/engine/compliers: what other folders and the engine's index (src/engine/index.ts) use.
// Everything not listed here is private to the folder; import it from here, never from its file.
export { complierCdf, complierCdfArms, complierDensity, complierMeans } from './complierDistributions';
export type { ComplierCdf } from './complierDistributions';
export { complierGrid } from './complierGrid';
