/**
 * The forward model: from a structure (structural betas, factor and noise variances) to the
 * population moments it implies. The inverse of the back-solution in identify.ts.
 *
 * Conventions: per period, decimal units; `factorMean` is the factor's mean excess return (the price
 * of factor risk lambda when only the factor is priced), so E[R_i - rf] = b_i * factorMean.
 */

import { issues, parameterIssue } from "../arguments.js";
import { diagnose, type Diagnostic } from "../diagnostics.js";
import { highBetaFromLow, type MomentSummary } from "../identify.js";

export interface Structure {
  /** Structural beta of the low book; the high book's follows from w b_low + (1 - w) b_high = 1. */
  readonly lowBeta: number;
  /** Weight of the low book in the market proxy, 0 < w < 1. */
  readonly weight: number;
  /** Standard deviation of the latent factor per period. */
  readonly factorVol: number;
  /** Mean excess return of the latent factor per period. */
  readonly factorMean: number;
  /** Standard deviations of the two books' noise per period. */
  readonly lowNoiseVol: number;
  readonly highNoiseVol: number;
}

/** Population moments of the excess returns under `structure` (docs/methods.md §1). */
export function populationMoments(structure: Structure): MomentSummary {
  const { lowBeta, weight } = structure;
  const highBeta = highBetaFromLow(lowBeta, weight);
  const phi = structure.factorVol ** 2;
  return {
    weight,
    lowMean: lowBeta * structure.factorMean,
    highMean: highBeta * structure.factorMean,
    lowVariance: lowBeta * lowBeta * phi + structure.lowNoiseVol ** 2,
    highVariance: highBeta * highBeta * phi + structure.highNoiseVol ** 2,
    covariance: lowBeta * highBeta * phi,
  };
}

/** The structure's parameters that break their rules (core/parameters.ts), as "invalid-argument" diagnostics. */
export function structureIssues(structure: Structure): Diagnostic[] {
  if (structure === null || typeof structure !== "object") {
    return [diagnose({ code: "invalid-argument", argument: "structure", value: String(structure), expected: "an object" })];
  }
  const found = issues(
    parameterIssue("weight", "weight", structure.weight),
    parameterIssue("lowBeta", "lowBeta", structure.lowBeta),
    parameterIssue("factorVol", "factorVol", structure.factorVol),
    parameterIssue("factorMean", "mean", structure.factorMean),
    parameterIssue("lowNoiseVol", "noiseVol", structure.lowNoiseVol),
    parameterIssue("highNoiseVol", "noiseVol", structure.highNoiseVol),
  );
  if (found.length === 0 && !(structure.lowBeta < 1 / structure.weight)) {
    found.push(
      diagnose({
        code: "invalid-argument",
        argument: "lowBeta",
        value: String(structure.lowBeta),
        expected: "below 1/w, so that the high book's beta is positive",
      }),
    );
  }
  return found;
}
