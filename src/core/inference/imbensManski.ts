/**
 * Imbens & Manski (2004) confidence interval for a partially identified parameter.
 *
 * Imbens, G. W. & Manski, C. F. (2004), "Confidence Intervals for Partially Identified Parameters",
 * Econometrica 72(6), 1845-1857 (docs/methods.md §5.1). For estimated bounds theta_l <= theta_u with
 * standard errors se_l, se_u, the interval covers the true parameter (a point of the set, not the whole
 * set) with probability 1 - alpha:
 *   [theta_l - C se_l, theta_u + C se_u],   Phi(C + Delta / max(se_l, se_u)) - Phi(-C) = 1 - alpha,
 * Delta = theta_u - theta_l. C lies in [z_{1-alpha}, z_{1-alpha/2}]: the two-sided value when the set
 * is a point, the one-sided value when it is wide relative to the standard errors.
 */

import { normalCdf, normalQuantile, normalSurvival } from "../numerics/normal.js";
import { findRoot } from "../numerics/scalarSolvers.js";
import { assertParameter } from "../parameters.js";

/** C_N for r = Delta / max(se) >= 0 and confidence level 1 - alpha. */
export function imbensManskiCriticalValue(ratio: number, confidence: number): number {
  assertParameter("imbensManski", "confidence", confidence);
  if (!(ratio >= 0)) throw new RangeError(`Imbens-Manski: Delta / se must be >= 0, got ${ratio}`);
  const alpha = 1 - confidence;
  const lo = normalQuantile(1 - alpha);
  const hi = normalQuantile(1 - alpha / 2);
  // Phi(C + r) - Phi(-C) - (1 - alpha), written with the upper tail for accuracy when r is large.
  const excess = (c: number) => normalCdf(c) - normalSurvival(c + ratio) - confidence;
  if (excess(hi) <= 0) return hi;
  if (excess(lo) >= 0) return lo;
  return findRoot(excess, lo, hi);
}

export interface BoundsEstimate {
  readonly lower: number;
  readonly upper: number;
  readonly lowerStdError: number;
  readonly upperStdError: number;
}

export interface ParameterInterval {
  readonly lower: number;
  readonly upper: number;
  /** Multipliers of the lower and upper standard errors (equal for Imbens-Manski). */
  readonly criticalValue: { readonly lower: number; readonly upper: number };
}

/** The Imbens-Manski interval. Negative Delta (crossed estimates) is treated as 0. */
export function imbensManskiInterval(bounds: BoundsEstimate, confidence: number): ParameterInterval {
  const width = Math.max(bounds.upper - bounds.lower, 0);
  const largest = Math.max(bounds.lowerStdError, bounds.upperStdError);
  const ratio = largest > 0 ? width / largest : width > 0 ? Infinity : 0;
  const c = imbensManskiCriticalValue(ratio, confidence);
  return {
    lower: bounds.lower - c * bounds.lowerStdError,
    upper: bounds.upper + c * bounds.upperStdError,
    criticalValue: { lower: c, upper: c },
  };
}

/**
 * An interval for b_low cut to its admissible range [0, 1/w] (docs/methods.md §5): every structure of
 * the model has 0 < b_low < 1/w (b_high = (1 - w b_low)/(1 - w) > 0), so limits beyond it, which an
 * imprecise covariance can give, would cover nothing possible. The critical values stay as computed.
 */
export function admissibleInterval(interval: ParameterInterval, weight: number): ParameterInterval {
  const top = 1 / weight;
  return {
    ...interval,
    lower: Math.min(Math.max(interval.lower, 0), top),
    upper: Math.max(Math.min(interval.upper, top), 0),
  };
}
