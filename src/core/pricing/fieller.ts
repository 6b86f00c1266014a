/**
 * Fieller's (1954) confidence set for a ratio of means theta = a / b (docs/methods.md §30): the values
 * theta for which the linear statistic a_hat - theta b_hat is within z of its standard error,
 *   (a_hat - theta b_hat)^2 <= z^2 (v_aa - 2 theta v_ab + theta^2 v_bb),
 * with v the (long-run) variances and covariance of the estimates a_hat and b_hat. The set is a bounded
 * interval exactly when b_hat is distinguishable from zero at the level (b_hat^2 > z^2 v_bb); otherwise it
 * is the whole line less an interval, or the whole line: reported as such, never as a huge finite
 * interval. Unlike the delta method it keeps its coverage as b approaches 0.
 */

export interface RatioMoments {
  readonly numerator: number;
  readonly denominator: number;
  /** Variances and covariance of the two estimates (already divided by the sample size). */
  readonly numeratorVariance: number;
  readonly denominatorVariance: number;
  readonly covariance: number;
}

export type FiellerSet =
  | { readonly shape: "bounded"; readonly lower: number; readonly upper: number }
  /** Everything at or below `lower` and at or above `upper`. */
  | { readonly shape: "two-rays"; readonly lower: number; readonly upper: number }
  | { readonly shape: "whole-line" };

/** Fieller's set for numerator / denominator at critical value `z` (e.g. 1.96 for 95%). */
export function fiellerSet(m: RatioMoments, z: number): FiellerSet {
  const z2 = z * z;
  const a = m.denominator * m.denominator - z2 * m.denominatorVariance;
  const b = m.numerator * m.denominator - z2 * m.covariance;
  const c = m.numerator * m.numerator - z2 * m.numeratorVariance;
  const discriminant = b * b - a * c;
  if (a > 0) {
    // The estimate itself satisfies the inequality, so the discriminant is not negative but by rounding.
    const root = Math.sqrt(Math.max(0, discriminant));
    return { shape: "bounded", lower: (b - root) / a, upper: (b + root) / a };
  }
  if (a < 0 && discriminant > 0) {
    const root = Math.sqrt(discriminant);
    return { shape: "two-rays", lower: (b + root) / a, upper: (b - root) / a };
  }
  return { shape: "whole-line" };
}

/** Delta-method standard error of numerator / denominator (null when the denominator is 0). */
export function ratioStdError(m: RatioMoments): number | null {
  if (m.denominator === 0) return null;
  const ratio = m.numerator / m.denominator;
  const variance = m.numeratorVariance - 2 * ratio * m.covariance + ratio * ratio * m.denominatorVariance;
  return Math.sqrt(Math.max(0, variance)) / Math.abs(m.denominator);
}
