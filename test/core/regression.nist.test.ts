/**
 * fitLine against NIST StRD "Norris" (36 observations, y = B0 + B1 x, lower difficulty).
 *
 * Certified values are parsed from test/fixtures/nist-strd/Norris.dat. Each must agree to at least 12
 * significant digits (numpy's lstsq reaches 12.3 on the parameters, 13.9 on the SEs, 14.0 on the residual
 * SD and 15 on R², per the NIST fixtures' reference README), measured as the log relative error.
 */

import { describe, expect, test } from "vitest";
import { fitLine } from "../../src/core/statistics.js";
import { ok } from "./helpers.js";
import { expectClose, logRelativeError } from "../support/close.js";
import { readNorris } from "../support/nist.js";

const norris = readNorris();
const fit = ok(fitLine(norris.x, norris.y));
const certified = norris.certified;
const requiredDigits = 12;

describe("fitLine on NIST StRD Norris (certified values from the file header)", () => {
  test("uses all 36 observations", () => {
    expect(fit.observations).toBe(norris.x.length);
    expect(fit.observations).toBe(36); // Norris.dat header: "36 Observations"
  });

  test.each([
    { field: "alpha (intercept B0)", actual: () => fit.alpha, expected: certified.intercept.estimate },
    { field: "beta (slope B1)", actual: () => fit.beta, expected: certified.slope.estimate },
    { field: "alphaStdErr (SD of B0)", actual: () => fit.alphaStdErr, expected: certified.intercept.stdErr },
    { field: "betaStdErr (SD of B1)", actual: () => fit.betaStdErr, expected: certified.slope.stdErr },
    { field: "residualStdError (residual SD)", actual: () => fit.residualStdError, expected: certified.residualStdDev },
    { field: "rSquared", actual: () => fit.rSquared, expected: certified.rSquared },
    // Residual row of the certified ANOVA table.
    { field: "residualSumOfSquares", actual: () => fit.residualSumOfSquares, expected: certified.residualSumOfSquares },
  ])("$field agrees with the NIST certified value to at least 12 digits", ({ actual, expected }) => {
    expect(logRelativeError(actual(), expected)).toBeGreaterThanOrEqual(requiredDigits);
  });

  test("the residual degrees of freedom behind residualStdError are the certified n - 2 = 34", () => {
    // residualStdError^2 is the certified residual mean square SSR / df.
    expect(norris.x.length - 2).toBe(certified.residualDegreesOfFreedom);
    expect(logRelativeError(fit.residualStdError ** 2, certified.residualMeanSquare)).toBeGreaterThanOrEqual(requiredDigits);
  });

  test("residualVariance is the certified residual sum of squares over n - 1 (the moments' divisor)", () => {
    expect(logRelativeError(fit.residualVariance, certified.residualSumOfSquares / (norris.x.length - 1))).toBeGreaterThanOrEqual(
      requiredDigits,
    );
  });

  // The t-statistics are estimate / SE, each factor checked to 12 digits above, so their ratio is good to
  // about 1e-11 relative.
  test("betaTStat is the GAMS LS01 value 2331.60578589043 (docs/methods.md §10)", () => {
    expectClose(fit.betaTStat, 2331.60578589043 /* GAMS LS01, docs/methods.md §10 */, { rel: 1e-11 });
  });

  test("alphaTStat is the GAMS LS01 value -1.12672907498579 (docs/methods.md §10)", () => {
    expectClose(fit.alphaTStat, -1.12672907498579 /* GAMS LS01, docs/methods.md §10 */, { rel: 1e-11 });
  });

  // NIST certifies no p-values. scipy's t_34 two-sided p for B0 is printed to 12 digits in docs/methods.md §10;
  // 1e-9 leaves room for that rounding and for the t-distribution routine. (The GAMS file's
  // 0.267746835947037 differs from scipy at 1e-7 and is not used.)
  test("alphaPValue is scipy's two-sided t_34 p-value 0.267746742333 (docs/methods.md §10)", () => {
    expectClose(fit.alphaPValue, 0.267746742333 /* scipy t_34, docs/methods.md §10 */, { rel: 1e-9 });
  });

  // Deep tail: scipy 1.17.1 gives 2 * stats.t.sf(2331.60578589043, 34) = 4.654040852474098e-90 (computed
  // when this test was written, from the GAMS t-statistic of docs/methods.md §10). A tail this far out is only
  // asked to carry 6 digits: it tests that the p-value is computed in the tail, not as 1 - CDF (which is 0).
  test("betaPValue is scipy's two-sided t_34 tail probability 4.654040852474098e-90 to 6 digits", () => {
    expectClose(fit.betaPValue, 4.654040852474098e-90 /* scipy 1.17.1 t_34, at the docs/methods.md §10 t */, { rel: 1e-6 });
  });
});
