/**
 * The CAPM fits, identified set and landmarks of every window, from its sums, in closed form.
 *
 * ## Method (CAPM and the set)
 * The regressions of each book on M are functions of the 2x2 moments (S_ll, S_hh, S_lh):
 *   S_MM = w^2 S_ll + 2 w (1 - w) S_lh + (1 - w)^2 S_hh,  S_lM = w S_ll + (1 - w) S_lh,
 *   beta_low = S_lM / S_MM,  alpha = mean_low - beta mean_M,
 *   SSR_low = (1 - w)^2 D / S_MM,  SSR_high = w^2 D / S_MM,  D = S_ll S_hh - S_lh^2,
 *   R^2_low = S_lM^2 / (S_ll S_MM), s^2 = SSR / (n - 2), se(beta) = s / sqrt(S_MM),
 *   se(alpha) = s sqrt(1/n + mean_M^2 / S_MM), residualVariance = SSR / (n - 1).
 * SSR is never formed as S_yy - S_xy^2 / S_xx: D is computed with error-free products (Dekker's
 * TwoProduct), so its only error is what the sums themselves carry, a relative eps / (1 - rho^2) with
 * rho the correlation of low and high (1e-14 at rho = 0.99). R^2 as a ratio stays accurate near 0.
 * S_MM has no cancellation when S_lh >= 0 (the only case with an identified set); with strongly
 * negatively correlated books it loses digits that a third series would keep. The identified set,
 * grid end points and landmarks come from `identifySet(summary, 2, sd_M / sqrt(n))`, as in solve.
 *
 * ## References
 * - Dekker, T. J. (1971), "A floating-point technique for extending the available precision",
 *   Numerische Mathematik 18, 224-242 (TwoProduct via Veltkamp splitting).
 */

import { boundedScale, largestValues, type RoundingScales, varianceCancellation } from "../cancellation.js";
import { diagnose, type Diagnostic, type DiagnosticDetail } from "../diagnostics.js";
import type { MomentSummary } from "../identify.js";
import {
  isIdentity,
  scaleFor,
  type Units,
  unitsOf,
  unscaleBounds,
  unscaleDiagnostic,
  unscaleLandmarks,
  unscaleSummary,
} from "../scaling.js";
import { identifySet } from "../solve.js";
import { fiellerCriticalValue } from "../landmarks.js";
import type { IdentifiedBounds, Landmarks, LineFit, Maybe } from "../types.js";
import { scanWindows, type WindowSums } from "./scan.js";
import type { WindowSpec } from "./windowPlan.js";

/** The CAPM fit of one book on the market proxy, with solve's field names (a subset of LineFit). */
export type CapmLine = Pick<LineFit, "alpha" | "beta" | "alphaStdErr" | "betaStdErr" | "rSquared" | "residualVariance">;

export interface CapmPair {
  readonly low: CapmLine;
  readonly high: CapmLine;
}

/** The moments of one window. */
export interface WindowMoments {
  /** Index of the window's first row in the input. */
  readonly start: number;
  /** Index of the window's last row (inclusive). */
  readonly end: number;
  readonly observations: number;
  /** Means, variances and covariance of the excess returns (divisor n - 1), as solve summarises them. */
  readonly summary: MomentSummary;
  /** Mean and variance (divisor n - 1) of the excess market proxy. */
  readonly market: { readonly mean: number; readonly variance: number };
  /** The CAPM fits; null when the market proxy is constant over the window (its beta is undefined). */
  readonly capm: Maybe<CapmPair>;
}

/** Everything rollSolve reports for one window. Field names follow solve's Solution. */
export interface WindowSolution extends WindowMoments {
  /** Null when the window is rejected (a diagnostic with severity "error" says why). */
  readonly bounds: Maybe<IdentifiedBounds>;
  readonly landmarks: Maybe<Landmarks>;
  readonly diagnostics: readonly Diagnostic[];
}

/**
 * The moments and CAPM fits of every window, in order.
 * @param riskFree one rate for every row, or a series aligned with low and high.
 * @throws RangeError on a programming error: series of different lengths, a weight outside (0, 1),
 *   a window smaller than 3 rows, or a step that is not a positive integer.
 */
export function rollingMoments(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
): WindowMoments[] {
  return Array.from(iterateRollingMoments(low, high, riskFree, weight, spec));
}

/** `rollingMoments` one window at a time (memory independent of the number of windows). */
export function* iterateRollingMoments(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
): Generator<WindowMoments, void, undefined> {
  const { scale } = rollingScale(low, high, riskFree);
  const units = unitsOf(scale);
  for (const raw of scanWindows(low, high, riskFree, weight, spec, scale)) yield unscaleWindowMoments(describeWindow(raw, weight), units);
}

/**
 * The scale the windows are computed at (scaling.ts: the power of two that brings the largest excess
 * return into [1, 2)) and the largest risk-free return at that scale (for the rounding scales of
 * cancellation.ts). The magnitudes are the caller's to check first (`magnitudeIssue`).
 */
export function rollingScale(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
): { scale: number; largestRiskFree: number } {
  const extent = largestValues(low, high, riskFree);
  const scale = scaleFor(Math.max(extent.low, extent.high));
  return { scale, largestRiskFree: extent.riskFree * scale };
}

/**
 * The moments, CAPM fits, identified set and landmarks of every window: for each window what
 * `solve` reports on that window's rows (its bounds, CAPM fits and landmarks), without the grid.
 * A window in which a series is constant gets null capm, bounds and landmarks and a zero-variance
 * diagnostic, as solve fails on it.
 * @throws RangeError as rollingMoments.
 */
export function rollSolve(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
  criticalValue: number = fiellerCriticalValue(),
): WindowSolution[] {
  return Array.from(iterateRollSolve(low, high, riskFree, weight, spec, criticalValue));
}

/** `rollSolve` one window at a time (memory independent of the number of windows). */
export function* iterateRollSolve(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
  criticalValue: number = fiellerCriticalValue(),
): Generator<WindowSolution, void, undefined> {
  const { scale, largestRiskFree } = rollingScale(low, high, riskFree);
  const units = unitsOf(scale);
  for (const raw of scanWindows(low, high, riskFree, weight, spec, scale)) {
    yield unscaleWindow(solveWindow(describeWindow(raw, weight), largestRiskFree, criticalValue), units);
  }
}

/**
 * Why a window has no CAPM fits and no set, as solve would fail on its rows: a series constant, or
 * constant up to rounding (cancellation.ts, with the window's rounding scales bounded from its own
 * moments); null when it has both.
 */
export function windowRejection(window: WindowMoments, largestRiskFree: number): DiagnosticDetail | null {
  const { summary, market, capm, observations: n } = window;
  const constant =
    summary.lowVariance === 0 ? "low" : summary.highVariance === 0 ? "high" : market.variance === 0 || capm === null ? "market" : null;
  if (constant !== null) return { code: "zero-variance", series: constant };
  return varianceCancellation(n, summary, market.variance, windowScales(window, largestRiskFree));
}

/** Bounds on each book's |excess return| + |risk-free return| over the window's rows (cancellation.ts). */
export function windowScales(window: WindowMoments, largestRiskFree: number): RoundingScales {
  const { summary: m, observations: n } = window;
  return {
    low: boundedScale(m.lowMean, m.lowVariance * (n - 1), largestRiskFree),
    high: boundedScale(m.highMean, m.highVariance * (n - 1), largestRiskFree),
  };
}

/**
 * The identified set of one window from its moments (solve's checks, in solve's order).
 * `largestRiskFree`: the largest |risk-free return| at the windows' scale (rollingScale).
 */
export function solveWindow(window: WindowMoments, largestRiskFree = 0, criticalValue: number = fiellerCriticalValue()): WindowSolution {
  const { start, end, observations, summary, market, capm } = window;
  const rejection = windowRejection(window, largestRiskFree);
  if (rejection !== null) {
    const diagnostics = [diagnose(rejection)];
    return { start, end, observations, summary, market, capm: null, bounds: null, landmarks: null, diagnostics };
  }
  const rounding = { n: observations, ...windowScales(window, largestRiskFree) };
  const marketMeanStdErr = Math.sqrt(market.variance) / Math.sqrt(observations);
  const { bounds, landmarks, diagnostics } = identifySet(summary, 2, marketMeanStdErr, rounding, criticalValue);
  return { start, end, observations, summary, market, capm, bounds, landmarks, diagnostics };
}

/** A window's moments computed on scaled data, in the data's units (scaling.ts). */
export function unscaleWindowMoments(w: WindowMoments, u: Units): WindowMoments {
  if (isIdentity(u)) return w;
  const line = (c: CapmLine): CapmLine => ({
    ...c,
    alpha: c.alpha * u.first,
    alphaStdErr: c.alphaStdErr * u.first,
    residualVariance: c.residualVariance * u.second,
  });
  return {
    start: w.start,
    end: w.end,
    observations: w.observations,
    summary: unscaleSummary(w.summary, u),
    market: { mean: w.market.mean * u.first, variance: w.market.variance * u.second },
    capm: w.capm === null ? null : { low: line(w.capm.low), high: line(w.capm.high) },
  };
}

function unscaleWindow(w: WindowSolution, u: Units): WindowSolution {
  if (isIdentity(u)) return w;
  return {
    ...unscaleWindowMoments(w, u),
    bounds: unscaleBounds(w.bounds, u),
    landmarks: unscaleLandmarks(w.landmarks, u),
    diagnostics: w.diagnostics.map((d) => unscaleDiagnostic(d, u)),
  };
}

/** The CAPM fits and summary of one window from its sums (the formulas above). */
export function describeWindow(sums: WindowSums, weight: number): WindowMoments {
  const { observations: n, lowMean, highMean, lowLow, highHigh, lowHigh } = sums;
  const w = weight;
  const v = 1 - w;
  const dof = n - 1;
  const summary: MomentSummary = {
    weight,
    lowMean,
    highMean,
    lowVariance: lowLow / dof,
    highVariance: highHigh / dof,
    covariance: lowHigh / dof,
  };
  const marketMean = w * lowMean + v * highMean;
  const marketSum = w * w * lowLow + 2 * w * v * lowHigh + v * v * highHigh;
  const market = { mean: marketMean, variance: marketSum / dof };
  if (!(marketSum > 0)) return { start: sums.start, end: sums.end, observations: n, summary, market, capm: null };
  const determinant = Math.max(0, productDifference(lowLow, highHigh, lowHigh, lowHigh));
  const line = (ownSum: number, withMarket: number, residualSum: number, mean: number): CapmLine => {
    const beta = withMarket / marketSum;
    const s2 = residualSum / (n - 2);
    const s = Math.sqrt(s2);
    return {
      alpha: mean - beta * marketMean,
      beta,
      alphaStdErr: s * Math.sqrt(1 / n + (marketMean * marketMean) / marketSum),
      betaStdErr: s / Math.sqrt(marketSum),
      rSquared: ownSum > 0 ? (withMarket / ownSum) * (withMarket / marketSum) : 1,
      residualVariance: residualSum / dof,
    };
  };
  const capm: CapmPair = {
    low: line(lowLow, w * lowLow + v * lowHigh, (v * v * determinant) / marketSum, lowMean),
    high: line(highHigh, w * lowHigh + v * highHigh, (w * w * determinant) / marketSum, highMean),
  };
  return { start: sums.start, end: sums.end, observations: n, summary, market, capm };
}

/** a b - c d with error-free products (Dekker 1971): only the final subtraction and sum round. */
function productDifference(a: number, b: number, c: number, d: number): number {
  const p = a * b;
  const q = c * d;
  return p - q + (twoProductError(a, b, p) - twoProductError(c, d, q));
}

const splitter = 134217729; // 2^27 + 1 (Veltkamp)

/** The rounding error of p = fl(a b), exactly: a b = p + error (no overflow for |a|, |b| < 1e150). */
function twoProductError(a: number, b: number, p: number): number {
  const ca = splitter * a;
  const ah = ca - (ca - a);
  const al = a - ah;
  const cb = splitter * b;
  const bh = cb - (cb - b);
  const bl = b - bh;
  return al * bl - (p - ah * bh - al * bh - ah * bl);
}
