/**
 * HAC (heteroskedasticity- and autocorrelation-consistent) covariance of OLS coefficients.
 *
 * ## Convention (R sandwich NeweyWest / kernHAC / vcovHAC; docs/methods.md §8)
 *   Cov(b_hat) = (X'X)^{-1} S (X'X)^{-1},   S = kernel sum of h_t = x_t e_t (kernelSum.ts),
 * times T/(T - k) when `adjust` is set. Kernels: Bartlett (Newey & West 1987, Econometrica 55(3),
 * 703-708) or quadratic spectral (Andrews 1991); bandwidth fixed (`lags` L <=> Bartlett bandwidth
 * L + 1), Newey & West (1994) or Andrews (1991) AR(1); optional VAR(1) prewhitening (Andrews &
 * Monahan 1992). For the automatic bandwidths a design column of ones (the intercept) gets weight 0,
 * as in R. Defaults: Bartlett, Newey-West 1994 lag, no prewhitening, no adjustment. R's NeweyWest()
 * instead defaults to prewhite = TRUE and kernHAC() to adjust = TRUE: pass those to reproduce them.
 */

import { borrowSeries, giveBack } from "../../numerics/scratch.js";
import { kernelSum } from "./kernelSum.js";
import { productInto } from "../../numerics/seriesLoops.js";
import { crossColumns, inverse, scale, symmetrise, type Matrix } from "../../numerics/linearAlgebra.js";
import type { HacKernel, HacOptions } from "../options.js";

export interface HacCovariance {
  /** k x k covariance of the coefficients, in the order of the design columns. */
  readonly covariance: Matrix;
  readonly kernel: HacKernel;
  /** Bandwidth S chosen or given (for Newey-West 1994 Bartlett, before rounding down to `lags`). */
  readonly bandwidth: number;
  /** Bartlett lag truncation actually used; null for the quadratic-spectral kernel. */
  readonly lags: number | null;
  readonly prewhite: boolean;
  readonly adjust: boolean;
}

/**
 * @param design k columns, intercept included as a column of ones
 * @param residuals OLS residuals of the same regression
 */
export function hacCovariance(design: readonly Float64Array[], residuals: Float64Array, options: HacOptions = {}): HacCovariance {
  const n = residuals.length;
  const k = design.length;
  if (k === 0) throw new RangeError("hacCovariance: the design has no columns");
  for (const column of design) if (column.length !== n) throw new RangeError("hacCovariance: design and residuals differ in length");
  const scores = design.map((column) => productInto(borrowSeries(n), column, residuals));
  const estimate = kernelSum(scores, options, interceptWeights(design));
  giveBack(...scores);
  return covarianceOf(estimate, inverse(crossColumns(design, design)), n, k, options);
}

/**
 * `hacCovariance([ones, x], residuals)` of a regression on an intercept and x, given the fit's
 * (X'X)^{-1} (leastSquares' inverseCrossProduct): the intercept's score 1 * e_t is the residual
 * itself, so it is not copied, and neither the ones nor X'X are passed over again. The same bits.
 */
export function interceptHacCovariance(
  x: ArrayLike<number>,
  residuals: Float64Array,
  inverseCrossProduct: Matrix,
  options: HacOptions = {},
): HacCovariance {
  const n = residuals.length;
  if (x.length !== n) throw new RangeError("hacCovariance: design and residuals differ in length");
  const slope = productInto(borrowSeries(n), x, residuals);
  // interceptWeights of [ones, x]: 0 for the ones, and 1 for both when x is all ones as well.
  let allOnes = true;
  for (let t = 0; t < n && allOnes; t++) allOnes = x[t] === 1;
  const estimate = kernelSum([residuals, slope], options, allOnes ? [1, 1] : [0, 1]);
  giveBack(slope);
  return covarianceOf(estimate, inverseCrossProduct, n, 2, options);
}

function covarianceOf(estimate: ReturnType<typeof kernelSum>, bread: Matrix, n: number, k: number, options: HacOptions): HacCovariance {
  const adjust = options.adjust ?? false;
  const meat = adjust ? scale(estimate.sum, n / (n - k)) : estimate.sum;
  const covariance = symmetrise(multiplyThree(bread, meat, bread));
  return { covariance, kernel: estimate.kernel, bandwidth: estimate.bandwidth, lags: estimate.lags, prewhite: estimate.prewhite, adjust };
}

/** 0 for columns of ones (an intercept), 1 otherwise; all 1 if every column is an intercept. */
export function interceptWeights(design: readonly Float64Array[]): number[] {
  const weights = design.map((column) => (column.every((value) => value === 1) ? 0 : 1));
  return weights.every((w) => w === 0) ? weights.map(() => 1) : weights;
}

function multiplyThree(a: Matrix, b: Matrix, c: Matrix): Matrix {
  const ab = a.map((row) => b[0]!.map((_, j) => row.reduce((sum, value, l) => sum + value * b[l]![j]!, 0)));
  return ab.map((row) => c[0]!.map((_, j) => row.reduce((sum, value, l) => sum + value * c[l]![j]!, 0)));
}
