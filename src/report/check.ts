/**
 * The consistency check the text report prints: every candidate of the identified set implies the
 * same CAPM betas and residual variances as the regressions on the sample (docs/methods.md §1.5).
 */

import type { Candidate, Solution } from "../core/types.js";

/** What the check needs: the grid and the observed (or population) CAPM betas and residual variances. */
export interface CapmCheckInput {
  readonly grid: Solution["grid"];
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

/** The pairs (implied by the candidate, observed in the sample) the check compares. */
function comparisons(candidate: Candidate, solution: CapmCheckInput): (readonly [number, number])[] {
  const { low, high } = solution.capm;
  const implied = candidate.impliedCapm;
  return [
    [implied.lowBeta, low.beta],
    [implied.highBeta, high.beta],
    [implied.lowResidualVariance, low.residualVariance],
    [implied.highResidualVariance, high.residualVariance],
  ];
}

/**
 * The largest relative difference, over the grid, between a candidate's implied CAPM betas and
 * residual variances and the observed ones; null when the grid is empty.
 */
export function largestCapmDiscrepancy(solution: CapmCheckInput): number | null {
  if (solution.grid.length === 0) return null;
  let largest = 0;
  for (const candidate of solution.grid) {
    for (const [implied, observed] of comparisons(candidate, solution)) {
      largest = Math.max(largest, relativeDifference(implied, observed));
    }
  }
  return largest;
}
