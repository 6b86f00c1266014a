/**
 * The conventions and model assumptions every report states, in one place so that the JSON, the text
 * report and their tests use the same words.
 */

import type { LandmarkName } from "../core/types.js";
import type { SolveOutputJson } from "../schema/solveOutput.js";
import type { RiskFreeSource, SolveReport } from "./types.js";

/** The model's maintained assumptions, as short sentences (docs/methods.md §1). */
export const modelAssumptions = [
  "one common latent factor F drives both books: R = a + b F + e",
  "each book's noise e is uncorrelated with the factor and with the other book's noise",
  "betas and variances are constant over the sample",
  "the market proxy is M = w low + (1 - w) high, and the structural betas are scaled so that " + "w b_low + (1 - w) b_high = 1",
  "for the expected alphas and the return-implied point only: the factor is the only priced risk, " + "so E[R - rf] = b E[M - rf]",
] as const;

/** The `conventions` block of the JSON output (its type is the schema's). */
export type Conventions = SolveOutputJson["conventions"];

/** Plain words for what the returns were measured in excess of. */
export function excessReturnBasis(riskFree: RiskFreeSource): string {
  switch (riskFree.kind) {
    case "none":
      return "none: no risk-free rate was given, so the raw returns are used";
    case "constant":
      return `a constant risk-free return of ${riskFree.rate} per period`;
    case "column":
      return `the risk-free return in column "${riskFree.column}", period by period`;
  }
}

/** The conventions block for one report. */
export function conventionsFor(report: SolveReport): Conventions {
  return {
    units: "decimal, per period",
    divisor: "n - 1",
    excessReturns: excessReturnBasis(report.input.riskFree),
    marketProxy: "M = w low + (1 - w) high",
    marketProxyWeight: report.solution.weight,
    normalisation: "w b_low + (1 - w) b_high = 1",
    assumptions: [...modelAssumptions],
  };
}

/** The landmarks in plain words, for the text, HTML and chart (the JSON and CSV keep the codes). */
export const landmarkWords: Record<LandmarkName, string> = {
  lowNoiseFree: "low book noise-free",
  highNoiseFree: "high book noise-free",
  equalNoise: "equal noise",
  capmConsistent: "CAPM-consistent",
  returnImplied: "return-implied",
};
