// The public face of src/engine/covariates: what other folders and the engine's index (src/engine/index.ts) use.
// Everything not listed here is private to the folder; import it from here, never from its file.
export { permutationBalanceTest } from './covariatePermutation';
