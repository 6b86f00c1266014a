/**
 * VAR(1) prewhitening of a vector series and the matrix that recolours a long-run covariance.
 *
 * ## Method (Andrews & Monahan 1992, Econometrica 60(4), 953-966; docs/methods.md §8)
 * Fit h_t = A h_{t-1} + e_t by least squares without an intercept (R: ar(umat, order.max = 1,
 * demean = FALSE, aic = FALSE, method = "ols")), equation by equation over t = 2..n. The kernel
 * estimator then runs on the n - 1 residuals e_t, and its sum S* is recoloured as S = D S* D' with
 * D = (I - A)^{-1}.
 */

import { crossColumns, identity, inverse, solve, type Matrix } from "../../numerics/linearAlgebra.js";

export interface Prewhitened {
  /** The VAR(1) residuals, one column per series, n - 1 rows. */
  readonly residuals: Float64Array[];
  /** The coefficient matrix A (row i: the equation of series i). */
  readonly coefficients: Matrix;
  /** D = (I - A)^{-1}. */
  readonly recolour: Matrix;
}

export function prewhitenVar1(columns: readonly Float64Array[]): Prewhitened {
  const k = columns.length;
  const n = k === 0 ? 0 : columns[0]!.length;
  if (n < k + 2) throw new RangeError(`prewhitenVar1: ${n} rows are too few for a VAR(1) in ${k} series`);
  const lagged = columns.map((c) => c.subarray(0, n - 1));
  const current = columns.map((c) => c.subarray(1, n));
  // B = (X'X)^{-1} X'Y with X the lagged and Y the current values; A = B'.
  const b = solve(crossColumns(lagged, lagged), crossColumns(lagged, current));
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
  return { residuals, coefficients, recolour: inverse(iMinusA) };
}
