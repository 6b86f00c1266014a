/**
 * Delta-method standard errors of the bounds of the identified set (docs/methods.md §4).
 *
 * Bounds of the low structural beta, from V_l = Var(low), V_h = Var(high), C = Cov(low, high) and the
 * market weight w:  Lb = C / D_l, U = V_l / D_u, D_l = (1-w) V_h + w C, D_u = w V_l + (1-w) C, with
 *   dLb/d(V_l, V_h, C) = (0, -(1-w) C / D_l^2, (1-w) V_h / D_l^2),
 *   dU /d(V_l, V_h, C) = ((1-w) C / D_u^2, 0, -(1-w) V_l / D_u^2).
 * Var(theta_hat) ~ g' Omega g / T and Cov(Lb_hat, U_hat) ~ g_l' Omega g_u / T, where Omega is the
 * long-run covariance of z_t = ((x_t - xbar)^2, (y_t - ybar)^2, (x_t - xbar)(y_t - ybar)) or, for
 * "iid", its sample covariance (divisor T - 1). Estimating the means inside z_t has no first-order
 * effect. With "hac", g' Omega g is the long-run variance of each bound's own influence series
 * g'(z_t - zbar), at the bandwidth chosen on that series, with the fixed-b factor of its critical
 * values (boundsLongRun.ts). The high beta's bounds follow from b_high = (1 - w b_low)/(1 - w): the
 * minimum of b_high comes from U and the maximum from Lb, with standard errors times w/(1 - w); the
 * correlation of the two bound estimates is unchanged.
 */

import { giveBack } from "../numerics/scratch.js";
import { bilinear, type Matrix } from "../numerics/linearAlgebra.js";
import { sampleCovarianceOf } from "./hac/longRun.js";
import { boundInfluenceSeries, boundsLongRunOfSeries, plainMeans } from "./boundsLongRun.js";
import type { HacKernel, HacOptions, LongRunMethod } from "./options.js";
import { defaultConfidence } from "../parameters.js";

export interface SecondMoments {
  readonly weight: number;
  readonly lowVariance: number;
  readonly highVariance: number;
  readonly covariance: number;
}

export interface BoundStdErrors {
  readonly estimate: number;
  readonly stdError: number;
  /**
   * What multiplies a normal quantile to give this bound's critical value: the fixed-b factor of its
   * Bartlett bandwidth (hac/fixedB.ts), 1 for "iid" and the quadratic-spectral kernel.
   */
  readonly criticalFactor: number;
}

export interface BoundsDelta {
  readonly lowBeta: { readonly min: BoundStdErrors; readonly max: BoundStdErrors };
  readonly highBeta: { readonly min: BoundStdErrors; readonly max: BoundStdErrors };
  /** corr(Lb_hat, U_hat), the same for the high beta's pair. */
  readonly correlation: number;
}

export interface BoundsDeltaFromData extends BoundsDelta {
  /** Bandwidth and lags: the larger of the two bounds' (the same for both under "auto" or fixed lags). */
  readonly longRun: {
    readonly method: LongRunMethod;
    readonly kernel: HacKernel | null;
    readonly bandwidth: number | null;
    readonly lags: number | null;
  };
}

/** Gradients of (Lb, U) with respect to (V_low, V_high, C). */
export function boundGradients(m: SecondMoments): { lower: number[]; upper: number[] } {
  const w = m.weight;
  const v = 1 - w;
  const dl = v * m.highVariance + w * m.covariance;
  const du = w * m.lowVariance + v * m.covariance;
  return {
    lower: [0, (-v * m.covariance) / (dl * dl), (v * m.highVariance) / (dl * dl)],
    upper: [(v * m.covariance) / (du * du), 0, (-v * m.lowVariance) / (du * du)],
  };
}

/** Standard errors and correlation of the bounds from Omega (3 x 3, order V_low, V_high, C) and T. */
export function boundsDelta(m: SecondMoments, omega: Matrix, observations: number): BoundsDelta {
  const { lower: gl, upper: gu } = boundGradients(m);
  return boundsFromVariances(
    m,
    { lower: bilinear(gl, omega, gl), upper: bilinear(gu, omega, gu), covariance: bilinear(gl, omega, gu) },
    observations,
    {
      lower: 1,
      upper: 1,
    },
  );
}

/** The bounds, their standard errors and correlation from the long-run variances of the two estimates. */
function boundsFromVariances(
  m: SecondMoments,
  longRun: { readonly lower: number; readonly upper: number; readonly covariance: number },
  observations: number,
  factors: { readonly lower: number; readonly upper: number },
): BoundsDelta {
  const w = m.weight;
  // Long-run variances are positive semi-definite: negative only by rounding (a singular Omega, as
  // with perfectly correlated books), where the standard error is 0.
  const lowerSe = Math.sqrt(Math.max(0, longRun.lower) / observations);
  const upperSe = Math.sqrt(Math.max(0, longRun.upper) / observations);
  const covariance = longRun.covariance / observations;
  const lb = m.covariance / ((1 - w) * m.highVariance + w * m.covariance);
  const ub = m.lowVariance / (w * m.lowVariance + (1 - w) * m.covariance);
  const high = (b: number) => (1 - w * b) / (1 - w);
  const ratio = w / (1 - w);
  return {
    lowBeta: {
      min: { estimate: lb, stdError: lowerSe, criticalFactor: factors.lower },
      max: { estimate: ub, stdError: upperSe, criticalFactor: factors.upper },
    },
    highBeta: {
      min: { estimate: high(ub), stdError: ratio * upperSe, criticalFactor: factors.upper },
      max: { estimate: high(lb), stdError: ratio * lowerSe, criticalFactor: factors.lower },
    },
    correlation: lowerSe > 0 && upperSe > 0 ? Math.max(-1, Math.min(1, covariance / (lowerSe * upperSe))) : 0,
  };
}

/** z_t = ((x - xbar)^2, (y - ybar)^2, (x - xbar)(y - ybar)). */
export function momentSeries(x: ArrayLike<number>, y: ArrayLike<number>): Float64Array[] {
  const n = x.length;
  const [mx, my] = plainMeans(x, y);
  const z = [new Float64Array(n), new Float64Array(n), new Float64Array(n)] as const;
  for (let t = 0; t < n; t++) {
    const dx = x[t]! - mx;
    const dy = y[t]! - my;
    z[0][t] = dx * dx;
    z[1][t] = dy * dy;
    z[2][t] = dx * dy;
  }
  return [...z];
}

/**
 * The delta method on excess returns x (low) and y (high), with the long-run variances estimated from
 * the data; `confidence` is the level of the intervals the fixed-b factors are for.
 */
export function boundsDeltaFromData(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  moments: SecondMoments,
  method: LongRunMethod,
  hac: HacOptions = {},
  confidence: number = defaultConfidence,
): BoundsDeltaFromData {
  if (method === "iid") {
    const omega = sampleCovarianceOf(momentSeries(x, y));
    return { ...boundsDelta(moments, omega, x.length), longRun: { method, kernel: null, bandwidth: null, lags: null } };
  }
  const series = boundInfluenceSeries(x, y, boundGradients(moments));
  const lr = boundsLongRunOfSeries(series.lower, series.upper, hac, confidence);
  giveBack(series.lower, series.upper);
  const wider = lr.lower.bandwidth >= lr.upper.bandwidth ? lr.lower : lr.upper;
  return {
    ...boundsFromVariances(moments, { lower: lr.lower.variance, upper: lr.upper.variance, covariance: lr.covariance }, x.length, {
      lower: lr.lower.criticalFactor,
      upper: lr.upper.criticalFactor,
    }),
    longRun: { method, kernel: lr.kernel, bandwidth: wider.bandwidth, lags: wider.lags },
  };
}
