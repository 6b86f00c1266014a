/**
 * VAR(1) prewhitening of a vector series and the matrix that recolours a long-run covariance.
 *
 * ## Method (Andrews & Monahan 1992, Econometrica 60(4), 953-966; docs/methods.md §8)
 * Fit h_t = A h_{t-1} + e_t by least squares without an intercept (R: ar(umat, order.max = 1,
 * demean = FALSE, aic = FALSE, method = "ols")), equation by equation over t = 2..n. The kernel
 * estimator then runs on the n - 1 residuals e_t, and its sum S* is recoloured as S = D S* D' with
 * D = (I - A)^{-1}.
 */

import { crossColumns, identity, solveOrNull, type Matrix } from "../../numerics/linearAlgebra.js";

export interface Prewhitened {
  /** The VAR(1) residuals, one column per series, n - 1 rows. */
  readonly residuals: Float64Array[];
  /** The coefficient matrix A (row i: the equation of series i). */
  readonly coefficients: Matrix;
  /** D = (I - A)^{-1}. */
  readonly recolour: Matrix;
}

/**
 * Pivots below this share of the largest entry make a system numerically singular here: a series
 * that is a combination of the others (perfectly correlated books) or constant has no VAR(1) fit.
 */
const singularTolerance = 1e-12;

/**
 * The VAR(1) fit and its residuals, or null when the fit or the recolouring is singular (a column is
 * constant or a combination of the others, or I - A is singular): the caller then does not prewhiten.
 */
export function prewhitenVar1(columns: readonly Float64Array[]): Prewhitened | null {
  const k = columns.length;
  const n = k === 0 ? 0 : columns[0]!.length;
  if (n < k + 2) throw new RangeError(`prewhitenVar1: ${n} rows are too few for a VAR(1) in ${k} series`);
  const lagged = columns.map((c) => c.subarray(0, n - 1));
  const current = columns.map((c) => c.subarray(1, n));
  // B = (X'X)^{-1} X'Y with X the lagged and Y the current values; A = B'.
  const b = solveOrNull(crossColumns(lagged, lagged), crossColumns(lagged, current), singularTolerance);
  if (b === null) return null;
  const coefficients: Matrix = Array.from({ length: k }, (_, i) => Array.from({ length: k }, (_, j) => b[j]![i]!));
  const residuals = current.map((y, i) => {
    const row = coefficients[i]!;
    const e = new Float64Array(n - 1);
    for (let t = 0; t < n - 1; t++) {
      let fitted = 0;
      for (let j = 0; j < k; j++) fitted += row[j]! * lagged[j]![t]!;
      e[t] = y[t]! - fitted;
    }
    return e;
  });
  const iMinusA = identity(k).map((row, i) => row.map((value, j) => value - coefficients[i]![j]!));
  const recolour = solveOrNull(iMinusA, identity(k), singularTolerance);
  return recolour === null ? null : { residuals, coefficients, recolour };
}
