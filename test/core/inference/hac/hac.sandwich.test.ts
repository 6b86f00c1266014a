/**
 * HAC covariances and automatic bandwidths against R sandwich's own examples (docs/methods.md §8(b)):
 * cran/sandwich tests/Examples/sandwich-Ex.Rout.save (R 4.0.4). Data: Greene's Investment
 * (test/fixtures/inference/Investment.csv), fm = lm(RealInv ~ RealGNP + RealInt), first row dropped
 * (RealInt NA), T = 19. R prints 7-10 significant digits; each entry is checked to 1e-9 relative or
 * half a unit of its last printed digit, whichever is larger (test/core/inference/matrices.ts).
 */

import { describe, expect, test } from "vitest";
import { hacCovariance } from "../../../../src/core/inference/hac/hac.js";
import { classicalCovariance, leastSquares } from "../../../../src/core/numerics/leastSquares.js";
import { expectClose } from "../../../support/close.js";
import { investmentRegression } from "../fixtures.js";
import { expectMatrixClose } from "../matrices.js";

const { design, y } = investmentRegression();
const fit = leastSquares(design, y);
const rel = 1e-9;

describe("R sandwich Investment examples (docs/methods.md §8(b))", () => {
  test("OLS b = (-12.53360, 0.16914, -1.00144) on T = 19 rows; vcov(fm) is the classical covariance", () => {
    expect(y.length).toBe(19);
    [-12.5336, 0.16914, -1.00144].forEach((b, i) => expectClose(fit.coefficients[i], b, { abs: 5e-6 }));
    expectMatrixClose(
      classicalCovariance(design, fit.residuals),
      [
        ["620.7706170", "-0.5038304429", "8.47475285"],
        ["-0.5038304", "0.0004229789", "-0.01145679"],
        ["8.4747529", "-0.0114567949", "5.61097245"],
      ],
      rel,
    );
  });

  test("NeweyWest(fm, lag = 4, prewhite = FALSE)", () => {
    const hac = hacCovariance(design, fit.residuals, { lags: 4 });
    expectMatrixClose(
      hac.covariance,
      [
        ["359.4170681", "-0.3115505035", "-4.089319305"],
        ["-0.3115505035", "0.0002805888", "-0.005355931"],
        ["-4.089319305", "-0.005355931", "11.171472998"],
      ],
      rel,
    );
  });

  test("NeweyWest(fm): Newey-West 1994 lag with VAR(1) prewhitening, bandwidth 0.92522 -> lag 0", () => {
    const hac = hacCovariance(design, fit.residuals, { bandwidth: "newey-west-1994", prewhite: true });
    expectClose(hac.bandwidth, 0.92522, { abs: 5e-6 });
    expect(hac.lags).toBe(0);
    expectMatrixClose(
      hac.covariance,
      [
        ["594.1004817", "-0.5617817294", "36.04992496"],
        ["-0.5617817", "0.0005563172", "-0.04815937"],
        ["36.0499250", "-0.0481593694", "13.24912546"],
      ],
      rel,
    );
  });

  test("the Newey-West 1994 bandwidth without prewhitening is 1.42031 (docs/methods.md §8(b), for reference)", () => {
    expectClose(hacCovariance(design, fit.residuals, { bandwidth: "newey-west-1994" }).bandwidth, 1.42031, { abs: 5e-6 });
  });

  test("kernHAC(fm, bw = bwNeweyWest): quadratic spectral, prewhitened, adjusted; bandwidth 1.882853", () => {
    const hac = hacCovariance(design, fit.residuals, {
      kernel: "quadratic-spectral",
      bandwidth: "newey-west-1994",
      prewhite: true,
      adjust: true,
    });
    expectClose(hac.bandwidth, 1.882853, { abs: 5e-7 });
    expect(hac.lags).toBeNull();
    expectMatrixClose(
      hac.covariance,
      [
        ["794.986166", "-0.7562570101", "48.19485118"],
        ["-0.756257", "0.0007537517", "-0.06485461"],
        ["48.194851", "-0.0648546058", "17.58798679"],
      ],
      rel,
    );
  });

  test("kernHAC(fm): quadratic spectral with the Andrews 1991 AR(1) bandwidth 1.744749", () => {
    const hac = hacCovariance(design, fit.residuals, {
      kernel: "quadratic-spectral",
      bandwidth: "andrews-1991",
      prewhite: true,
      adjust: true,
    });
    expectClose(hac.bandwidth, 1.744749, { abs: 5e-7 });
    expectMatrixClose(
      hac.covariance,
      [
        ["788.6120652", "-0.7502080996", "49.78912814"],
        ["-0.7502081", "0.0007483977", "-0.06641343"],
        ["49.7891281", "-0.0664134303", "17.71735491"],
      ],
      rel,
    );
  });
});
