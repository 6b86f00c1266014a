/**
 * The pure core of betabound (`import { ... } from "betabound/core"`): numbers in, values out; no
 * files, clock, console or process, and no package loaded.
 *
 * @example
 * import { solve } from "betabound/core";
 * const result = solve({ low: [0.01, -0.02, 0.015, 0.004], high: [0.02, -0.035, 0.03, 0.001] });
 * if (result.ok) console.log(result.value.bounds?.lowBeta); // { min: ..., max: ... }
 */

export { solve, solveKeepingMoments, identifySet, defaultSteps, defaultWeight, minimumObservations, type SolvedMoments } from "./solve.js";
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
} from "./identify.js";
export { findLandmarks, type LandmarkResult } from "./landmarks.js";
export {
  compensatedSum,
  crossProducts,
  fitLine,
  mean,
  sampleCovariance,
  sampleStdev,
  sampleVariance,
  type CrossProducts,
} from "./statistics.js";
export { studentTTwoSidedP } from "./numerics/studentT.js";
export { populationMoments, type Structure } from "./forward/populationMoments.js";
export { simulateSample, type SimulatedSample, type SimulationOptions } from "./forward/simulate.js";
export { createRandom, type RandomSource } from "./numerics/rng.js";
export { periodDates, frequencies, frequencyTable, periodsPerYear, type FrequencyName } from "./calendar.js";
export {
  describeDiagnostic,
  diagnose,
  hasError,
  type Diagnostic,
  type DiagnosticCode,
  type DiagnosticDetail,
  type Severity,
} from "./diagnostics.js";
export { failure, success, type Result } from "./result.js";
export type * from "./types.js";
export { landmarkNames } from "./types.js";
export { implied, type ImpliedSolution, type PopulationFit } from "./forward/implied.js";
export * from "./inference/index.js";
export { defaultConfidence, maximumReplicates, maximumSteps, parameters, type Rule } from "./parameters.js";
export {
  correlatedNoiseSet,
  noiseStructuresAt,
  type NoiseMoments,
  type NoiseSensitivity,
  type NoiseStructure,
  type SensitivityKind,
} from "./models/correlatedNoise.js";
export {
  indexJacobian,
  indexParameterNames,
  indexPoint,
  type IndexEstimates,
  type IndexMoments,
  type IndexParameter,
} from "./models/indexModel.js";
export { solveIndex, type IndexOptions, type IndexSample, type IndexSolution, type IndexValues } from "./models/indexSolve.js";
