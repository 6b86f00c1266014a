/**
 * Named points of the identified set (docs/methods.md §1.2, §1.4, §1.5, §1.6):
 * - lowNoiseFree: s_low = 0, the upper bound of b_low;
 * - highNoiseFree: s_high = 0, the lower bound of b_low;
 * - equalNoise: s_low = s_high (Deming slope with error-variance ratio 1);
 * - capmConsistent: b = CAPM beta, so the expected CAPM alpha is zero (always inside the set);
 * - returnImplied: b_low = mean excess low / mean excess market, the loading that mean returns imply
 *   if only the factor is priced; a joint check of the model when compared with the set.
 */

import { diagnose, type Diagnostic } from "./diagnostics.js";
import { normalQuantile } from "./numerics/normal.js";
import { defaultConfidence } from "./parameters.js";
import { equalNoiseLowBeta, marketMoments, structureAt, type MomentSummary } from "./identify.js";
import type { Candidate, IdentifiedBounds, Landmarks } from "./types.js";

export interface LandmarkResult {
  readonly landmarks: Landmarks;
  readonly diagnostics: readonly Diagnostic[];
}

/** The two-sided normal critical value of Fieller's condition at `confidence` (1.96 at 0.95). */
export const fiellerCriticalValue = (confidence: number = defaultConfidence): number => normalQuantile(1 - (1 - confidence) / 2);

/**
 * @param marketMeanStdErr standard error of the mean excess market return (sd / sqrt(n) for a sample,
 *   0 for population moments); the return-implied point is not reported unless |mean| exceeds
 *   `criticalValue` times it (Fieller's condition: its confidence set is then bounded, §26, §30).
 */
export function findLandmarks(
  m: MomentSummary,
  bounds: IdentifiedBounds,
  marketMeanStdErr: number,
  criticalValue: number = fiellerCriticalValue(),
): LandmarkResult {
  const market = marketMoments(m);
  const at = (b: number): Candidate => structureAt(b, m, market);
  const diagnostics: Diagnostic[] = [];
  const returnImplied = returnImpliedCandidate(m, bounds, market.mean, marketMeanStdErr, criticalValue, diagnostics);
  return {
    landmarks: {
      lowNoiseFree: structureAt(bounds.lowBeta.max, m, market, bounds.highBeta.min),
      highNoiseFree: structureAt(bounds.lowBeta.min, m, market, bounds.highBeta.max),
      equalNoise: at(clamp(equalNoiseLowBeta(m), bounds.lowBeta.min, bounds.lowBeta.max)),
      capmConsistent: at(clamp(market.lowCapmBeta, bounds.lowBeta.min, bounds.lowBeta.max)),
      returnImplied,
    },
    diagnostics,
  };
}

function returnImpliedCandidate(
  m: MomentSummary,
  bounds: IdentifiedBounds,
  lambda: number,
  lambdaStdErr: number,
  criticalValue: number,
  diagnostics: Diagnostic[],
): Candidate | null {
  if (marketMeanNearZero(lambda, lambdaStdErr, criticalValue)) {
    const tStat = lambdaStdErr > 0 ? lambda / lambdaStdErr : 0;
    diagnostics.push(diagnose({ code: "market-mean-near-zero", marketMean: lambda, tStat, criticalValue }));
    return null;
  }
  const lowBeta = m.lowMean / lambda;
  const { min, max } = bounds.lowBeta;
  // A point estimate outside the set is no evidence by itself: the pricing test (src/core/pricing) decides.
  if (lowBeta < min || lowBeta > max) {
    diagnostics.push(diagnose({ code: "return-implied-outside-not-significant", lowBeta, min, max, pValue: null, confidence: null }));
  }
  if (!structureExists(lowBeta, m.weight)) return null;
  return structureAt(lowBeta, m);
}

/**
 * The mean excess market return lambda is 0 or within `criticalValue` standard errors of 0, so that
 * Fieller's set for the ratio of means is unbounded: no ratio is reported.
 */
export function marketMeanNearZero(lambda: number, lambdaStdErr: number, criticalValue: number = fiellerCriticalValue()): boolean {
  return lambda === 0 || Math.abs(lambda) <= criticalValue * lambdaStdErr;
}

/** Both structural betas are positive (0 < b_low < 1/w), so a structure exists at b_low. */
export function structureExists(lowBeta: number, weight: number): boolean {
  return lowBeta > 0 && lowBeta < 1 / weight;
}

/**
 * The return-implied low beta mean excess low / lambda by the rules of findLandmarks, as a number:
 * null when lambda is near zero or no structure exists there (for rolling windows and bootstrap
 * replicates, which keep numbers rather than candidates and diagnostics).
 */
export function returnImpliedLowBeta(
  lowMean: number,
  lambda: number,
  lambdaStdErr: number,
  weight: number,
  criticalValue: number = fiellerCriticalValue(),
): number | null {
  if (marketMeanNearZero(lambda, lambdaStdErr, criticalValue)) return null;
  const lowBeta = lowMean / lambda;
  return structureExists(lowBeta, weight) ? lowBeta : null;
}

/** Rounding can put a point computed in closed form a hair outside [min, max]; keep it on the set. */
function clamp(x: number, min: number, max: number): number {
  return Math.min(Math.max(x, min), max);
}
