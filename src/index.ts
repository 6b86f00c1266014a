/**
 * betabound as a library: the pure core (no files, clock, console or process).
 *
 * @example
 * import { solve } from "betabound";
 * const result = solve({ low: [0.01, -0.02, 0.015, 0.004], high: [0.02, -0.035, 0.03, 0.001] });
 * if (result.ok) console.log(result.value.bounds?.lowBeta); // { min: ..., max: ... }
 */

export { solve, identifySet, defaultSteps, defaultWeight, minimumObservations } from "./core/solve.js";
export {
  candidateGrid,
  equalNoiseLowBeta,
  highBetaFromLow,
  identifiedBounds,
  lowBetaFromRatio,
  marketMoments,
  structureAt,
  type MarketMoments,
  type MomentSummary,
} from "./core/identify.js";
export { findLandmarks, type LandmarkResult } from "./core/landmarks.js";
export { compensatedSum, crossProducts, mean, sampleCovariance, sampleStdev, sampleVariance, type CrossProducts } from "./core/moments.js";
export { fitLine } from "./core/regression.js";
export { studentTTwoSidedP } from "./core/numerics/studentT.js";
export { populationMoments, type Structure } from "./core/forward/populationMoments.js";
export { simulateSample, type SimulatedSample, type SimulationOptions } from "./core/forward/simulate.js";
export { createRandom, type RandomSource } from "./core/numerics/rng.js";
export { periodDates, frequencies, frequencyTable, periodsPerYear, type FrequencyName } from "./core/calendar.js";
export {
  describeDiagnostic,
  diagnose,
  hasError,
  type Diagnostic,
  type DiagnosticCode,
  type DiagnosticDetail,
  type Severity,
} from "./core/diagnostics.js";
export { failure, success, type Result } from "./core/result.js";
export type * from "./core/types.js";
export { landmarkNames } from "./core/types.js";
export { implied, type ImpliedSolution, type PopulationFit } from "./core/forward/implied.js";
export * from "./core/inference/index.js";
