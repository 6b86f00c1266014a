/**
 * implied: what a structure implies for the quantities `solve` estimates: population moments of the
 * excess returns, the CAPM betas, residual variances and expected alphas, the identified set an
 * infinite sample would show, its landmarks and the Sharpe ratios. Field names match `solve`'s so a
 * script can compare the two directly.
 */

import { issues, parameterIssue } from "../arguments.js";
import { diagnose, type Diagnostic } from "../diagnostics.js";
import { populationMoments, type Structure, structureIssues } from "./populationMoments.js";
import { marketMoments, structureAt } from "../identify.js";
import { failure, type Result, success } from "../result.js";
import { scaleFor, unitsOf, unscaleCandidate, unscaleIdentified, unscaleMoments } from "../scaling.js";
import { identifySet } from "../solve.js";
import { momentsFromSummary } from "../summaryMoments.js";
import type { Candidate, SampleMoments, Solution } from "../types.js";

/** A population CAPM regression: no sampling error, so no standard errors. */
export interface PopulationFit {
  /** Expected CAPM alpha (b - beta) lambda under "only the factor is priced". */
  readonly alpha: number;
  readonly beta: number;
  readonly rSquared: number;
  readonly residualVariance: number;
}

export interface ImpliedSolution extends Pick<Solution, "weight" | "bounds" | "grid" | "landmarks" | "diagnostics"> {
  readonly structure: Structure;
  /** The true structure as a candidate: where it sits in its own identified set. */
  readonly truth: Candidate;
  readonly moments: SampleMoments;
  readonly capm: { readonly low: PopulationFit; readonly high: PopulationFit };
}

/**
 * What `structure` implies, with `steps` grid candidates. Fails with "invalid-argument" diagnostics
 * when a parameter breaks its rule (core/parameters.ts; the low beta must also be below 1/w).
 * Computed with the standard deviations and means scaled by a power of two to about 1 (scaling.ts).
 */
export function implied(structure: Structure, steps: number): Result<ImpliedSolution, Diagnostic[]> {
  const invalid = structureIssues(structure);
  invalid.push(...issues(parameterIssue("steps", "steps", steps)));
  if (invalid.length > 0) return failure(invalid);
  const { factorVol, factorMean, lowNoiseVol, highNoiseVol } = structure;
  const scale = scaleFor(Math.max(factorVol, Math.abs(factorMean), lowNoiseVol, highNoiseVol));
  const scaled: Structure = {
    ...structure,
    factorVol: factorVol * scale,
    factorMean: factorMean * scale,
    lowNoiseVol: lowNoiseVol * scale,
    highNoiseVol: highNoiseVol * scale,
  };
  const summary = populationMoments(scaled);
  const market = marketMoments(summary);
  const moments = momentsFromSummary(summary);
  const truth = structureAt(structure.lowBeta, summary, market);
  const fit = (beta: number, variance: number, residualVariance: number, alpha: number): PopulationFit => ({
    alpha,
    beta,
    rSquared: 1 - residualVariance / variance,
    residualVariance,
  });
  const units = unitsOf(scale);
  const unscaledFit = (f: PopulationFit): PopulationFit => ({
    ...f,
    alpha: f.alpha * units.first,
    residualVariance: f.residualVariance * units.second,
  });
  const capm = {
    low: unscaledFit(fit(market.lowCapmBeta, summary.lowVariance, truth.impliedCapm.lowResidualVariance, truth.expectedLowAlpha)),
    high: unscaledFit(fit(market.highCapmBeta, summary.highVariance, truth.impliedCapm.highResidualVariance, truth.expectedHighAlpha)),
  };
  // Population moments have no sampling error: the return-implied point is reported whenever lambda != 0.
  // The population covariance b_low b_high phi is positive; 0 here means it underflowed next to the variances.
  const identified =
    summary.covariance > 0
      ? identifySet(summary, steps, 0)
      : { bounds: null, grid: [], landmarks: null, diagnostics: [diagnose({ code: "degenerate-moments", quantity: "covariance" })] };
  return success({
    structure,
    truth: unscaleCandidate(truth, units),
    weight: structure.weight,
    moments: unscaleMoments(moments, units),
    capm,
    ...unscaleIdentified(identified, units),
  });
}
