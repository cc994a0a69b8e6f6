// The public face of src/engine/bandwidth: what other folders and the engine's index (src/engine/index.ts) use.
// Everything not listed here is private to the folder; import it from here, never from its file.
export { BANDWIDTH_RULES, chooseBandwidth } from './bandwidth';
export type { BandwidthChoice, BandwidthRule } from './bandwidth';
export { bandwidthMse } from './bandwidthMse';
export { widenForTies } from './bandwidthTies';
