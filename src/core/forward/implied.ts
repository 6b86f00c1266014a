/**
 * implied: what a structure implies for the quantities `solve` estimates: population moments of the
 * excess returns, the CAPM betas, residual variances and expected alphas, the identified set an
 * infinite sample would show, its landmarks and the Sharpe ratios. Field names match `solve`'s so a
 * script can compare the two directly.
 */

import { populationMoments, type Structure } from "./populationMoments.js";
import { marketMoments, structureAt } from "../identify.js";
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

export function implied(structure: Structure, steps: number): ImpliedSolution {
  const summary = populationMoments(structure);
  const market = marketMoments(summary);
  const moments = momentsFromSummary(summary);
  const truth = structureAt(structure.lowBeta, summary, market);
  const fit = (beta: number, variance: number, residualVariance: number, alpha: number): PopulationFit => ({
    alpha,
    beta,
    rSquared: 1 - residualVariance / variance,
    residualVariance,
  });
  const capm = {
    low: fit(market.lowCapmBeta, summary.lowVariance, truth.impliedCapm.lowResidualVariance, truth.expectedLowAlpha),
    high: fit(market.highCapmBeta, summary.highVariance, truth.impliedCapm.highResidualVariance, truth.expectedHighAlpha),
  };
  // Population moments have no sampling error: the return-implied point is reported whenever lambda != 0.
  const identified = identifySet(summary, steps, 0);
  return { structure, truth, weight: structure.weight, moments, capm, ...identified };
}
