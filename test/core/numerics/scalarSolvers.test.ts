/**
 * Brent's root finder and the golden-section minimiser on problems with known answers.
 * Expected values: the Dottie number (the fixed point of cos, 0.7390851332151607; OEIS A003957),
 * sqrt(2), and minimisers that follow from calculus.
 */

import { describe, expect, test } from "vitest";
import { findRoot, minimiseUnimodal } from "../../../src/core/numerics/scalarSolvers.js";
import { expectClose } from "../../support/close.js";

describe("findRoot (Brent 1973)", () => {
  test("finds the fixed point of cos, 0.7390851332151607 (OEIS A003957)", () => {
    expectClose(
      findRoot((x) => Math.cos(x) - x, 0, 1),
      0.7390851332151607,
      { rel: 1e-15 },
    );
  });

  test("finds sqrt(2) as the positive root of x^2 - 2", () => {
    expectClose(
      findRoot((x) => x * x - 2, 0, 2),
      Math.SQRT2,
      { rel: 1e-15 },
    );
  });

  test("returns an endpoint at which f is exactly 0", () => {
    expect(findRoot((x) => x - 1, 1, 3)).toBe(1);
  });

  test("refuses a bracket without a sign change", () => {
    expect(() => findRoot((x) => x * x + 1, -1, 1)).toThrow(RangeError);
  });
});

describe("minimiseUnimodal (golden section)", () => {
  // At a smooth minimum f(x) - f(x*) ~ (x - x*)^2 vanishes below rounding once |x - x*| < sqrt(eps) |x*|,
  // so no comparison-based search can locate it more closely than ~1.5e-8 relative (Numerical Recipes §10.1).
  test("minimises a smooth function: (x - 2)^2 + 1 at x = 2, to the sqrt(eps) limit of any search", () => {
    expectClose(
      minimiseUnimodal((x) => (x - 2) ** 2 + 1, -5, 7, 1e-10),
      2,
      { abs: 2 * Math.sqrt(Number.EPSILON) * 2 },
    );
  });

  test("minimises a kinked convex function: max(3 - x, 2x - 3) at its kink x = 2", () => {
    expectClose(
      minimiseUnimodal((x) => Math.max(3 - x, 2 * x - 3), 0, 10, 1e-10),
      2,
      { abs: 1e-9 },
    );
  });
});
