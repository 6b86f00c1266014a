/**
 * Long-run covariance of a vector series. For OLS scores h_t = x_t e_t (mean exactly zero, so the
 * demeaning is immaterial) the HAC covariance is (X'X)^{-1} [T Omega_hat(h)] (X'X)^{-1}, so sandwiching
 * T Omega_hat must reproduce the published matrices:
 * - statsmodels test_hac_simple / R NeweyWest(fm, lag = 4, prewhite = FALSE) on macrodata (docs/methods.md §8(a)),
 * - R sandwich NeweyWest(fm) on Investment, which after prewhitening uses lag 0 (docs/methods.md §8(b)).
 * Tolerances as in the HAC tests: 1e-10 relative (statsmodels, full digits), 1e-9 relative or half a
 * printed digit (R).
 */

import { describe, expect, test } from "vitest";
import { leastSquares } from "../../../../src/core/numerics/leastSquares.js";
import { scale, multiply } from "../../../../src/core/numerics/linearAlgebra.js";
import { longRunCovariance, longRunCovarianceInPlace, sampleCovarianceOf } from "../../../../src/core/inference/hac/longRun.js";
import { expectClose } from "../../../support/close.js";
import { investmentRegression, macrodataRegression } from "../fixtures.js";
import { expectMatrixClose } from "../matrices.js";

function scoreSandwich(regression: { design: Float64Array[]; y: Float64Array }, options: Parameters<typeof longRunCovariance>[1]) {
  const fit = leastSquares(regression.design, regression.y);
  const n = fit.residuals.length;
  const scores = regression.design.map((column) => column.map((value, t) => value * fit.residuals[t]!));
  const omega = longRunCovariance(scores, options);
  const bread = fit.inverseCrossProduct;
  return { omega, covariance: multiply(multiply(bread, scale(omega.covariance, n)), bread) };
}

describe("long-run covariance of OLS scores, sandwiched", () => {
  test("Bartlett lag 4 on macrodata gives statsmodels' NW covariance (adjust = FALSE)", () => {
    const { omega, covariance } = scoreSandwich(macrodataRegression(), { lags: 4 });
    expect(omega.lags).toBe(4);
    expectMatrixClose(
      covariance,
      [
        ["1.3855512908840137", "-0.3133096102522685", "-0.0597207976835705"],
        ["-0.3133096102522685", "0.108101169035130618", "0.000389440793564339"],
        ["-0.0597207976835705", "0.000389440793564336", "0.086211852740503622"],
      ],
      1e-10,
    );
  });

  test("VAR(1)-prewhitened lag 0 on Investment gives R's NeweyWest(fm)", () => {
    const { covariance } = scoreSandwich(investmentRegression(), { lags: 0, prewhite: true });
    expectMatrixClose(
      covariance,
      [
        ["594.1004817", "-0.5617817294", "36.04992496"],
        ["-0.5617817", "0.0005563172", "-0.04815937"],
        ["36.0499250", "-0.0481593694", "13.24912546"],
      ],
      1e-9,
    );
  });
});

describe("iid alternative", () => {
  // Deviations (-1.5, -0.5, 0.5, 1.5) and (-3.25, -1.25, 0.75, 3.75): sums of squares 5, cross-product 11.5.
  test("sampleCovarianceOf uses divisor T - 1: var(1, 2, 3, 4) = 5/3, cov with (2, 4, 6, 9) = 23/6", () => {
    const c = sampleCovarianceOf([Float64Array.from([1, 2, 3, 4]), Float64Array.from([2, 4, 6, 9])]);
    expectClose(c[0]![0], 5 / 3, { rel: 1e-15 });
    expectClose(c[0]![1], 23 / 6, { rel: 1e-15 });
  });

  test("Bartlett lag 0 is the sample covariance with divisor T", () => {
    const a = Float64Array.from([1, 2, 3, 4]);
    const b = Float64Array.from([2, 4, 6, 9]);
    const lrv = longRunCovariance([a, b], { lags: 0 });
    expectClose(lrv.covariance[0]![0], 5 / 4, { rel: 1e-15 });
    expectClose(lrv.covariance[0]![1], 23 / 8, { rel: 1e-15 });
  });
});

describe("the in-place form with the columns' sums given", () => {
  test("gives the same bits as forming the means itself; the sums given are the ones used", () => {
    const columns = [0, 1].map((a) => Float64Array.from({ length: 500 }, (_, t) => Math.sin(t * (0.3 + a)) + 0.2 * a));
    const sums = columns.map((c) => c.reduce((s, x) => s + x, 0));
    const own = longRunCovarianceInPlace(
      columns.map((c) => c.slice()),
      {},
    );
    const given = longRunCovarianceInPlace(
      columns.map((c) => c.slice()),
      {},
      { sums },
    );
    expect(given).toEqual(own);
    const shifted = longRunCovarianceInPlace(
      columns.map((c) => c.slice()),
      {},
      { sums: [sums[0]! + 50, sums[1]!] },
    );
    expect(shifted.covariance[0]![0]).not.toBe(own.covariance[0]![0]);
  });
});
