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
import { equalNoiseLowBeta, marketMoments, structureAt, type MomentSummary } from "./identify.js";
import type { Candidate, IdentifiedBounds, Landmarks } from "./types.js";

export interface LandmarkResult {
  readonly landmarks: Landmarks;
  readonly diagnostics: readonly Diagnostic[];
}

/**
 * @param marketMeanStdErr standard error of the mean excess market return (sd / sqrt(n) for a sample,
 *   0 for population moments); the return-implied point is not reported when |mean| is below it.
 */
export function findLandmarks(m: MomentSummary, bounds: IdentifiedBounds, marketMeanStdErr: number): LandmarkResult {
  const market = marketMoments(m);
  const at = (b: number): Candidate => structureAt(b, m, market);
  const diagnostics: Diagnostic[] = [];
  const returnImplied = returnImpliedCandidate(m, bounds, market.mean, marketMeanStdErr, diagnostics);
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
  diagnostics: Diagnostic[],
): Candidate | null {
  if (marketMeanNearZero(lambda, lambdaStdErr)) {
    const tStat = lambdaStdErr > 0 ? lambda / lambdaStdErr : 0;
    diagnostics.push(diagnose({ code: "market-mean-near-zero", marketMean: lambda, tStat }));
    return null;
  }
  const lowBeta = m.lowMean / lambda;
  const { min, max } = bounds.lowBeta;
  if (lowBeta < min || lowBeta > max) {
    diagnostics.push(diagnose({ code: "return-implied-outside-set", lowBeta, min, max }));
  }
  if (!structureExists(lowBeta, m.weight)) return null;
  return structureAt(lowBeta, m);
}

/** The mean excess market return lambda is 0 or within one standard error of 0: no ratio of means is reported. */
export function marketMeanNearZero(lambda: number, lambdaStdErr: number): boolean {
  return lambda === 0 || Math.abs(lambda) < lambdaStdErr;
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
export function returnImpliedLowBeta(lowMean: number, lambda: number, lambdaStdErr: number, weight: number): number | null {
  if (marketMeanNearZero(lambda, lambdaStdErr)) return null;
  const lowBeta = lowMean / lambda;
  return structureExists(lowBeta, weight) ? lowBeta : null;
}

/** Rounding can put a point computed in closed form a hair outside [min, max]; keep it on the set. */
function clamp(x: number, min: number, max: number): number {
  return Math.min(Math.max(x, min), max);
}
