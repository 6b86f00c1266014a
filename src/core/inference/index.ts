/** Public surface of the inference code (standard errors, intervals, bootstrap). */

export * from "./options.js";
export { assessUncertainty, type UncertaintyOptions, type UncertaintySample } from "./uncertainty.js";
export type { BetaInterval, CapmHac, PointwiseBound, Uncertainty } from "./uncertaintyTypes.js";
export { hacCovariance, interceptWeights, type HacCovariance } from "./hac/hac.js";
export { longRunCovariance, sampleCovarianceOf, type LongRunCovariance } from "./hac/longRun.js";
export { kernelValue, lagWeights } from "./hac/kernels.js";
export { andrews1991Bandwidth, neweyWest1994Bandwidth } from "./hac/bandwidth.js";
export { prewhitenVar1, type Prewhitened } from "./hac/prewhiten.js";
export { leastSquares, classicalCovariance, type LeastSquaresFit } from "../numerics/leastSquares.js";
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
export { normalCdf, normalPdf, normalQuantile, normalSurvival } from "../numerics/normal.js";
export { findRoot, minimiseUnimodal } from "../numerics/scalarSolvers.js";
export { integrate } from "../numerics/quadrature.js";
export { sharpeIidStdErr, sharpeMertensStdErr, sharpeStdErrors, type SharpeStdErrors } from "./sharpe.js";
export { SharpeMemo } from "./sharpeMemo.js";
export { commonBlockLength, optimalBlockLength, type OptimalBlockLength } from "./bootstrap/blockLength.js";
export { drawBlocks, replicateRandom, resampleIndices } from "./bootstrap/stationaryBootstrap.js";
export { bootstrapQuantities, type BootstrapQuantity } from "./bootstrap/statistics.js";
export {
  bootstrapRange,
  excessReturns,
  mergeBootstrapRanges,
  resolveBlockLength,
  type BootstrapData,
  type BootstrapPlan,
  type BootstrapRange,
} from "./bootstrap/replicates.js";
export {
  bootstrapSolve,
  quantileSorted,
  summariseBootstrap,
  type BootstrapSolveOptions,
  type BootstrapSummary,
  type PercentileInterval,
} from "./bootstrap/summary.js";
