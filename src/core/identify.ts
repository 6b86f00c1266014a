/**
 * The identified set of the one-factor model and the structure at any point of it.
 *
 * Model: R_i = a_i + b_i F + e_i (i = low, high), Var F = phi, Var e_i = s_i, F, e_low, e_high mutually
 * uncorrelated; market proxy M = w R_low + (1 - w) R_high with w b_low + (1 - w) b_high = 1.
 * Back-solution at a given b_low (docs/methods.md §1.1):
 *   b_high = (1 - w b_low) / (1 - w), phi = C / (b_low b_high),
 *   s_low = V_low - b_low C / b_high,  s_high = V_high - b_high C / b_low.
 * Non-negative noise gives the identified set (section 1.2):
 *   C / ((1 - w) V_high + w C) <= b_low <= V_low / (w V_low + (1 - w) C).
 * All inputs are moments of excess returns with one divisor (n - 1 for samples; population moments
 * for `implied`). Bounds and betas do not depend on the divisor; variances scale with it.
 */

import type { Candidate, IdentifiedBounds } from "./types.js";

/** The sufficient statistics of the identified set: excess-return means and second moments. */
export interface MomentSummary {
  /** Weight of the low book in the market proxy, 0 < w < 1. */
  readonly weight: number;
  readonly lowMean: number;
  readonly highMean: number;
  readonly lowVariance: number;
  readonly highVariance: number;
  /** Covariance of low and high. */
  readonly covariance: number;
}

/** The summary of a solved sample's moments (what identifySet and structureAt take). */
export function summaryOfMoments(
  weight: number,
  moments: {
    readonly low: { readonly mean: number; readonly variance: number };
    readonly high: { readonly mean: number; readonly variance: number };
    readonly covariance: { readonly lowHigh: number };
  },
): MomentSummary {
  return {
    weight,
    lowMean: moments.low.mean,
    highMean: moments.high.mean,
    lowVariance: moments.low.variance,
    highVariance: moments.high.variance,
    covariance: moments.covariance.lowHigh,
  };
}

/** Second moments of the market proxy and the CAPM betas, all functions of the data only (section 1.5). */
export interface MarketMoments {
  readonly mean: number;
  readonly variance: number;
  readonly lowCovariance: number;
  readonly highCovariance: number;
  readonly lowCapmBeta: number;
  readonly highCapmBeta: number;
}

export function marketMoments(m: MomentSummary): MarketMoments {
  const w = m.weight;
  const v = 1 - w;
  const variance = w * w * m.lowVariance + 2 * w * v * m.covariance + v * v * m.highVariance;
  const lowCovariance = w * m.lowVariance + v * m.covariance;
  const highCovariance = w * m.covariance + v * m.highVariance;
  return {
    mean: w * m.lowMean + v * m.highMean,
    variance,
    lowCovariance,
    highCovariance,
    lowCapmBeta: lowCovariance / variance,
    highCapmBeta: highCovariance / variance,
  };
}

/** b_high from b_low under the normalisation w b_low + (1 - w) b_high = 1. */
export function highBetaFromLow(lowBeta: number, weight: number): number {
  return (1 - weight * lowBeta) / (1 - weight);
}

/** b_low from the loading ratio t = b_high / b_low (section 1.3). */
export function lowBetaFromRatio(ratio: number, weight: number): number {
  return 1 / (weight + (1 - weight) * ratio);
}

/**
 * Bounds of the identified set. Requires covariance > 0 (the caller reports the rejection otherwise).
 * The factor variance phi = C / (b_low b_high) is smallest where b_low b_high peaks, at b_low = 1/(2w)
 * when that lies in the set, and largest at the endpoint with the smaller product (section 1.5).
 */
export function identifiedBounds(m: MomentSummary): IdentifiedBounds {
  const w = m.weight;
  const c = m.covariance;
  const lowerDenominator = (1 - w) * m.highVariance + w * c;
  const upperDenominator = w * m.lowVariance + (1 - w) * c;
  const lower = c / lowerDenominator;
  const upper = Math.max(lower, m.lowVariance / upperDenominator);
  // b_high at the two ends in closed form: 1 - w b_low cancels badly when C is tiny next to V_low.
  const highAtUpper = Math.min(c / upperDenominator, m.highVariance / lowerDenominator);
  const highAtLower = m.highVariance / lowerDenominator;
  const phiAt = (b: number, h: number): number => c / (b * h);
  const peak = Math.min(Math.max(1 / (2 * w), lower), upper);
  return {
    lowBeta: { min: lower, max: upper },
    highBeta: { min: highAtUpper, max: highAtLower },
    factorVariance: {
      min: phiAt(peak, highBetaFromLow(peak, w)),
      max: Math.max(phiAt(lower, highAtLower), phiAt(upper, highAtUpper)),
    },
  };
}

/**
 * Noise variances within this fraction of the book's variance of zero are rounding noise at an
 * endpoint of the set (where they are exactly 0 in exact arithmetic) and are reported as 0.
 */
const roundingFraction = 1e-12;

const snap = (value: number, scale: number): number => (Math.abs(value) <= roundingFraction * scale ? 0 : value);

/**
 * The structure at a given low structural beta, with what it implies for the CAPM regressions.
 * Defined for 0 < b_low < 1/w (both structural betas positive); `insideSet` says whether both noise
 * variances are non-negative. `capmBetas` are the observed CAPM betas, used for the expected alphas.
 * `highBeta` may be passed when it is known more accurately than 1 - w b_low allows (at the bounds).
 */
export function structureAt(
  lowBeta: number,
  m: MomentSummary,
  capmBetas = marketMoments(m),
  highBeta = highBetaFromLow(lowBeta, m.weight),
): Candidate {
  const w = m.weight;
  const v = 1 - w;
  const c = m.covariance;
  const phi = c / (lowBeta * highBeta);
  const sLow = snap(m.lowVariance - (lowBeta * c) / highBeta, m.lowVariance);
  const sHigh = snap(m.highVariance - (highBeta * c) / lowBeta, m.highVariance);
  // Forward: the moments this structure implies, and the CAPM regression on its market proxy.
  const lowVar = lowBeta * lowBeta * phi + sLow;
  const highVar = highBeta * highBeta * phi + sHigh;
  const marketVar = phi + w * w * sLow + v * v * sHigh;
  // V_low V_high - C^2 expanded without cancellation: b_l^2 phi s_h + b_h^2 phi s_l + s_l s_h.
  const determinant = lowBeta * lowBeta * phi * sHigh + highBeta * highBeta * phi * sLow + sLow * sHigh;
  const lambda = capmBetas.mean;
  const expectedLowAlpha = (lowBeta - capmBetas.lowCapmBeta) * lambda;
  const sharpe = (beta: number, variance: number): number | null => (variance > 0 ? (beta * lambda) / Math.sqrt(variance) : null);
  return {
    lowBeta,
    highBeta,
    factorVariance: phi,
    lowNoiseVariance: sLow,
    highNoiseVariance: sHigh,
    noiseShare: sLow + sHigh > 0 ? sLow / (sLow + sHigh) : null,
    lowFactorRSquared: (lowBeta * lowBeta * phi) / m.lowVariance,
    highFactorRSquared: (highBeta * highBeta * phi) / m.highVariance,
    impliedCapm: {
      lowBeta: (lowBeta * phi + w * sLow) / marketVar,
      highBeta: (highBeta * phi + v * sHigh) / marketVar,
      lowResidualVariance: (v * v * determinant) / marketVar,
      highResidualVariance: (w * w * determinant) / marketVar,
    },
    expectedLowAlpha,
    // w alpha_low + (1 - w) alpha_high = 0 identically (section 1.6); using it keeps the pair exact.
    expectedHighAlpha: (-w * expectedLowAlpha) / v,
    impliedLowSharpe: sharpe(lowBeta, lowVar),
    impliedHighSharpe: sharpe(highBeta, highVar),
    insideSet: sLow >= 0 && sHigh >= 0 && phi > 0,
  };
}

/** `steps` candidates with b_low evenly spaced over the set, both endpoints included exactly. */
export function candidateGrid(m: MomentSummary, bounds: IdentifiedBounds, steps: number): Candidate[] {
  const { lowBeta, highBeta } = bounds;
  const market = marketMoments(m);
  const grid: Candidate[] = [];
  for (let k = 0; k < steps; k++) {
    const last = k === steps - 1;
    const fraction = k / (steps - 1);
    // b_high is linear in b_low, so it is interpolated between its exact end values.
    const low = last ? lowBeta.max : lowBeta.min + (lowBeta.max - lowBeta.min) * fraction;
    const high = last ? highBeta.min : highBeta.max + (highBeta.min - highBeta.max) * fraction;
    grid.push(structureAt(low, m, market, high));
  }
  return grid;
}

/** Books correlated this closely (|correlation| >= 1 - 1e-12) are perfectly correlated: their set is one point. */
export const isPerfectCorrelation = (correlation: number): boolean => Math.abs(correlation) >= 1 - 1e-12;

/**
 * The identified set of perfectly correlated books: one point, the structure with no noise. With
 * V_low = b_low^2 phi and V_high = b_high^2 phi, the loading ratio is t = sqrt(V_high / V_low) and
 * b_low = 1 / (w + (1 - w) t) (section 1.3); phi = C / (b_low b_high). Both noise variances are 0 by
 * definition here (what the formulas of `structureAt` give in exact arithmetic), so rounding cannot
 * put the point a hair outside its own set.
 */
export function noiseFreePoint(m: MomentSummary): { bounds: IdentifiedBounds; structure: Candidate } {
  const ratio = Math.sqrt(m.highVariance) / Math.sqrt(m.lowVariance);
  const lowBeta = lowBetaFromRatio(ratio, m.weight);
  const highBeta = ratio * lowBeta;
  const at = structureAt(lowBeta, m, marketMoments(m), highBeta);
  const structure: Candidate = {
    ...at,
    lowNoiseVariance: 0,
    highNoiseVariance: 0,
    noiseShare: null,
    lowFactorRSquared: 1,
    highFactorRSquared: 1,
    impliedCapm: { lowBeta, highBeta, lowResidualVariance: 0, highResidualVariance: 0 },
    insideSet: true,
  };
  const phi = structure.factorVariance;
  return {
    bounds: { lowBeta: { min: lowBeta, max: lowBeta }, highBeta: { min: highBeta, max: highBeta }, factorVariance: { min: phi, max: phi } },
    structure,
  };
}

/**
 * b_low at which both noise variances are equal: the Deming (1943) orthogonal-regression slope with
 * error-variance ratio 1 (section 1.4), t = [V_h - V_l + sqrt((V_h - V_l)^2 + 4 C^2)] / (2 C).
 */
export function equalNoiseLowBeta(m: MomentSummary): number {
  const d = m.highVariance - m.lowVariance;
  const ratio = (d + Math.hypot(d, 2 * m.covariance)) / (2 * m.covariance);
  return lowBetaFromRatio(ratio, m.weight);
}
