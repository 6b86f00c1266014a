/** Public surface of the inference code (standard errors, intervals, bootstrap). */

export * from "./options.js";
export { assessUncertainty, type UncertaintyOptions, type UncertaintySample } from "./uncertainty.js";
export type { BetaInterval, CapmHac, PointwiseBound, Uncertainty } from "./uncertaintyTypes.js";
export { hacCovariance, interceptWeights, type HacCovariance } from "./hac.js";
export { longRunCovariance, sampleCovarianceOf, type LongRunCovariance } from "./longRun.js";
export { kernelValue, lagWeights } from "./kernels.js";
export { andrews1991Bandwidth, neweyWest1994Bandwidth } from "./bandwidth.js";
export { prewhitenVar1, type Prewhitened } from "./prewhiten.js";
export { leastSquares, classicalCovariance, type LeastSquaresFit } from "./leastSquares.js";
export {
  boundGradients,
  boundsDelta,
  boundsDeltaFromData,
  momentSeries,
  type BoundsDelta,
  type BoundsDeltaFromData,
  type SecondMoments,
} from "./boundsDelta.js";
export { imbensManskiCriticalValue, imbensManskiInterval, type BoundsEstimate, type ParameterInterval } from "./imbensManski.js";
export { stoyeInterval, stoyeProbability, type StoyeInput } from "./stoye.js";
export { normalCdf, normalPdf, normalQuantile, normalSurvival } from "./normal.js";
export { findRoot, minimiseUnimodal } from "./scalarSolvers.js";
export { integrate } from "./quadrature.js";
export { sharpeIidStdErr, sharpeMertensStdErr, sharpeStdErrors, type SharpeStdErrors } from "./sharpe.js";
export { commonBlockLength, optimalBlockLength, type OptimalBlockLength } from "./blockLength.js";
export { drawBlocks, replicateRandom, resampleIndices } from "./stationaryBootstrap.js";
export { bootstrapQuantities, type BootstrapQuantity } from "./bootstrapStatistics.js";
export {
  bootstrapRange,
  excessReturns,
  mergeBootstrapRanges,
  resolveBlockLength,
  type BootstrapData,
  type BootstrapPlan,
  type BootstrapRange,
} from "./bootstrapSolve.js";
export {
  bootstrapSolve,
  quantileSorted,
  summariseBootstrap,
  type BootstrapSolveOptions,
  type BootstrapSummary,
  type PercentileInterval,
} from "./bootstrapSummary.js";
