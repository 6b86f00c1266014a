/**
 * The test of "some structure in the identified set explains the mean returns" (docs/methods.md §30).
 *
 * With d1 = mu_x - Lb lambda and d2 = U lambda - mu_x (the CAPM alpha less the least, and the greatest
 * explainable alpha less the alpha), a b in [Lb, U] with mu_x = b lambda exists exactly when d1 and d2
 * do not have strictly opposite signs: H0 = {d1 >= 0, d2 >= 0} (lambda > 0) or {d1 <= 0, d2 <= 0}
 * (lambda < 0). Written in d1, d2 rather than in the ratio mu_x / lambda, the test needs no bounded
 * ratio and keeps its size when lambda is near 0.
 *
 * Each branch is a pair of moment inequalities, tested with the max statistic T = max_j(-t_j) of the
 * studentised estimates and generalized moment selection (Andrews & Soares 2010, Econometrica 78,
 * 119-157): an inequality whose t exceeds kappa_n = sqrt(ln n) is taken as slack, and the p-value is
 * P(max over the selected j of Z_j >= T) with Z normal with the estimates' correlation (bivariate
 * normal, bivariateNormal.ts), 1 when none is selected. H0 is rejected when both branches are: the
 * p-value is the larger of the two. "Explained" needs the opposite: d1 and d2 significantly of one
 * sign, an intersection-union test (Berger 1982, Technometrics 24, 295-300) with p-value
 * 1 - Phi(max(min(t1, t2), min(-t1, -t2))), valid at its level without adjustment.
 */

import { bivariateNormalCdf } from "../numerics/bivariateNormal.js";
import { normalCdf, normalSurvival } from "../numerics/normal.js";

export type PricingVerdict = "explained" | "not explained" | "undetermined";

export interface MomentInequalityTest {
  /** min over the branches of max_j(-t_j): positive when the alpha lies outside what noise explains. */
  readonly statistic: number;
  /** p-value of H0 "noise explains the alpha". */
  readonly pValue: number;
  /** p-value of "noise does not explain the alpha" (the intersection-union test). */
  readonly explainedPValue: number;
  readonly verdict: PricingVerdict;
  /** t statistics of d1 and d2, and the correlation of their estimates. */
  readonly tStats: readonly [number, number];
  readonly correlation: number;
}

/** Moment selection threshold kappa_n = sqrt(ln n) (Andrews & Soares 2010, their BIC-like choice). */
export const selectionThreshold = (observations: number): number => Math.sqrt(Math.log(observations));

/**
 * The test from the estimates d1, d2 with standard errors se1, se2 > 0 and correlation `correlation`,
 * on `observations` rows, with the verdict at `confidence`.
 */
export function momentInequalityTest(
  d: readonly [number, number],
  se: readonly [number, number],
  correlation: number,
  observations: number,
  confidence: number,
): MomentInequalityTest {
  const t1 = d[0] / se[0];
  const t2 = d[1] / se[1];
  const kappa = selectionThreshold(observations);
  const rho = Math.max(-1, Math.min(1, correlation));
  const positive = branch(t1, t2, rho, kappa);
  const negative = branch(-t1, -t2, rho, kappa);
  const pValue = Math.max(positive.pValue, negative.pValue);
  const explainedPValue = normalSurvival(Math.max(Math.min(t1, t2), Math.min(-t1, -t2)));
  const alpha = 1 - confidence;
  const verdict: PricingVerdict = pValue < alpha ? "not explained" : explainedPValue < alpha ? "explained" : "undetermined";
  return {
    statistic: Math.min(positive.statistic, negative.statistic),
    pValue,
    explainedPValue,
    verdict,
    tStats: [t1, t2],
    correlation: rho,
  };
}

/** One branch: inequalities s_j >= 0 with t statistics s1, s2. */
function branch(s1: number, s2: number, rho: number, kappa: number): { statistic: number; pValue: number } {
  const statistic = Math.max(-s1, -s2);
  const first = s1 <= kappa;
  const second = s2 <= kappa;
  if (first && second) return { statistic, pValue: 1 - bivariateNormalCdf(statistic, statistic, rho) };
  if (first || second) return { statistic, pValue: 1 - normalCdf(statistic) };
  return { statistic, pValue: 1 };
}
