// The public face of src/engine/fit: what other folders and the engine's index (src/engine/index.ts) use.
// Everything not listed here is private to the folder; import it from here, never from its file.
export { applyWeights, boundaryWindow, curvatureWeights, sideFit } from './boundaryWindow';
export type { SideFit, SortedSide, Window } from './boundaryWindow';
export type { Estimate } from './estimate';
export { estimatesAtCutoff, windowWarnings } from './estimatesAtCutoff';
export type { CutoffEstimates } from './estimatesAtCutoff';
export { varianceOf } from './influence';
export { jumpAt } from './jumpAt';
export { KERNEL_NAMES, kernelMoment } from './kernels';
export type { KernelName } from './kernels';
export { coefficientWeights, fitPolynomial, polyCoefficients, polyCross, polyDerivative, polyFrame, polyFrameSorted, polyInverse, polyMoments, polyValue } from './polyFit';
export type { PolyFrame, PolyMoments } from './polyFit';
export { VARIANCE_NAMES, gathered, neighbourResiduals, sideIntercept } from './residuals';
export type { VarianceName } from './residuals';
export { ratioPsi, smoothJump } from './smoothJump';
export { windowValues } from './windowValues';
