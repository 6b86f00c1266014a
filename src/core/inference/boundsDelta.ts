/**
 * Delta-method standard errors of the bounds of the identified set (docs/methods.md §4).
 *
 * Bounds of the low structural beta, from V_l = Var(low), V_h = Var(high), C = Cov(low, high) and the
 * market weight w:  Lb = C / D_l, U = V_l / D_u, D_l = (1-w) V_h + w C, D_u = w V_l + (1-w) C, with
 *   dLb/d(V_l, V_h, C) = (0, -(1-w) C / D_l^2, (1-w) V_h / D_l^2),
 *   dU /d(V_l, V_h, C) = ((1-w) C / D_u^2, 0, -(1-w) V_l / D_u^2).
 * Var(theta_hat) ~ g' Omega g / T and Cov(Lb_hat, U_hat) ~ g_l' Omega g_u / T, where Omega is the
 * long-run covariance of z_t = ((x_t - xbar)^2, (y_t - ybar)^2, (x_t - xbar)(y_t - ybar)) (HAC,
 * longRun.ts) or, for "iid", its sample covariance (divisor T - 1). Estimating the means inside z_t
 * has no first-order effect. The high beta's bounds follow from b_high = (1 - w b_low)/(1 - w): the
 * minimum of b_high comes from U and the maximum from Lb, with standard errors times w/(1 - w); the
 * correlation of the two bound estimates is unchanged.
 */

import { bilinear, type Matrix } from "../numerics/linearAlgebra.js";
import { longRunCovariance, sampleCovarianceOf } from "./hac/longRun.js";
import type { HacKernel, HacOptions, LongRunMethod } from "./options.js";

export interface SecondMoments {
  readonly weight: number;
  readonly lowVariance: number;
  readonly highVariance: number;
  readonly covariance: number;
}

export interface BoundStdErrors {
  readonly estimate: number;
  readonly stdError: number;
}

export interface BoundsDelta {
  readonly lowBeta: { readonly min: BoundStdErrors; readonly max: BoundStdErrors };
  readonly highBeta: { readonly min: BoundStdErrors; readonly max: BoundStdErrors };
  /** corr(Lb_hat, U_hat), the same for the high beta's pair. */
  readonly correlation: number;
}

export interface BoundsDeltaFromData extends BoundsDelta {
  readonly omega: Matrix;
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
  const w = m.weight;
  const { lower: gl, upper: gu } = boundGradients(m);
  // A quadratic form of a positive semi-definite Omega: negative only by rounding (a singular Omega,
  // as with perfectly correlated books), where the standard error is 0.
  const lowerSe = Math.sqrt(Math.max(0, bilinear(gl, omega, gl)) / observations);
  const upperSe = Math.sqrt(Math.max(0, bilinear(gu, omega, gu)) / observations);
  const covariance = bilinear(gl, omega, gu) / observations;
  const lb = m.covariance / ((1 - w) * m.highVariance + w * m.covariance);
  const ub = m.lowVariance / (w * m.lowVariance + (1 - w) * m.covariance);
  const high = (b: number) => (1 - w * b) / (1 - w);
  const ratio = w / (1 - w);
  return {
    lowBeta: { min: { estimate: lb, stdError: lowerSe }, max: { estimate: ub, stdError: upperSe } },
    highBeta: { min: { estimate: high(ub), stdError: ratio * upperSe }, max: { estimate: high(lb), stdError: ratio * lowerSe } },
    correlation: lowerSe > 0 && upperSe > 0 ? covariance / (lowerSe * upperSe) : 0,
  };
}

/** z_t = ((x - xbar)^2, (y - ybar)^2, (x - xbar)(y - ybar)). */
export function momentSeries(x: ArrayLike<number>, y: ArrayLike<number>): Float64Array[] {
  const n = x.length;
  let mx = 0;
  let my = 0;
  for (let t = 0; t < n; t++) {
    mx += x[t]!;
    my += y[t]!;
  }
  mx /= n;
  my /= n;
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

/** The delta method on excess returns x (low) and y (high), with Omega estimated from the data. */
export function boundsDeltaFromData(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  moments: SecondMoments,
  method: LongRunMethod,
  hac: HacOptions = {},
): BoundsDeltaFromData {
  const z = momentSeries(x, y);
  if (method === "iid") {
    const omega = sampleCovarianceOf(z);
    return { ...boundsDelta(moments, omega, x.length), omega, longRun: { method, kernel: null, bandwidth: null, lags: null } };
  }
  const lrv = longRunCovariance(z, hac);
  return {
    ...boundsDelta(moments, lrv.covariance, x.length),
    omega: lrv.covariance,
    longRun: { method, kernel: lrv.kernel, bandwidth: lrv.bandwidth, lags: lrv.lags },
  };
}
