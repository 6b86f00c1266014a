/**
 * The consistency check the text report prints: every candidate of the identified set implies the
 * same CAPM betas and residual variances as the regressions on the sample (docs/methods.md §1.5).
 */

import type { Candidate, Solution } from "../core/types.js";

/** What the check needs: the grid, the books' variances, and the observed (or population) CAPM betas and residual variances. */
export interface CapmCheckInput {
  readonly grid: Solution["grid"];
  readonly moments: {
    readonly low: { readonly variance: number };
    readonly high: { readonly variance: number };
  };
  readonly capm: {
    readonly low: { readonly beta: number; readonly residualVariance: number };
    readonly high: { readonly beta: number; readonly residualVariance: number };
  };
}

/** Relative difference |a - b| / max(|a|, |b|), 0 when both are 0. */
export function relativeDifference(a: number, b: number): number {
  const scale = Math.max(Math.abs(a), Math.abs(b));
  return scale === 0 ? 0 : Math.abs(a - b) / scale;
}

/**
 * Residual variances are compared relative to the larger of the two, but never to less than 1e-12 of
 * the book's variance: below that both are rounding (perfectly correlated books have residual
 * variances of 0 and about 1e-35), as noise variances that small are reported as 0 (identify.ts).
 */
const residualFloor = 1e-12;

function residualDifference(implied: number, observed: number, bookVariance: number): number {
  const scale = Math.max(Math.abs(implied), Math.abs(observed), residualFloor * bookVariance);
  return scale === 0 ? 0 : Math.abs(implied - observed) / scale;
}

/** The relative differences between what a candidate implies and what the sample shows. */
function differences(candidate: Candidate, solution: CapmCheckInput): number[] {
  const { low, high } = solution.capm;
  const implied = candidate.impliedCapm;
  return [
    relativeDifference(implied.lowBeta, low.beta),
    relativeDifference(implied.highBeta, high.beta),
    residualDifference(implied.lowResidualVariance, low.residualVariance, solution.moments.low.variance),
    residualDifference(implied.highResidualVariance, high.residualVariance, solution.moments.high.variance),
  ];
}

/**
 * The largest relative difference, over the grid, between a candidate's implied CAPM betas and
 * residual variances and the observed ones; null when the grid is empty.
 */
export function largestCapmDiscrepancy(solution: CapmCheckInput): number | null {
  if (solution.grid.length === 0) return null;
  let largest = 0;
  for (const candidate of solution.grid) for (const difference of differences(candidate, solution)) largest = Math.max(largest, difference);
  return largest;
}
