/**
 * The bivariate normal upper probability against mpmath quadrature at 30 digits
 * (test/fixtures/pricing/bivariate_normal.py, its output bivariate-normal.json) and Sheppard's closed
 * form at the origin, P(X > 0, Y > 0) = 1/4 + asin(r) / (2 pi) (a textbook identity).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { bivariateNormalCdf, bivariateNormalUpper } from "../../../src/core/numerics/bivariateNormal.js";
import { normalCdf } from "../../../src/core/numerics/normal.js";

const fixture = JSON.parse(readFileSync(new URL("../../fixtures/pricing/bivariate-normal.json", import.meta.url), "utf8")) as {
  cases: { h: number; k: number; r: number; upper: number }[];
};

describe("bivariateNormalUpper", () => {
  it.each(fixture.cases.map((c) => [c.h, c.k, c.r, c.upper] as const))("P(X > %s, Y > %s; r = %s) = %s (mpmath)", (h, k, r, upper) => {
    expect(Math.abs(bivariateNormalUpper(h, k, r) - upper)).toBeLessThan(1e-13);
  });

  it("is Sheppard's 1/4 + asin(r)/(2 pi) at the origin", () => {
    for (let r = -0.99; r <= 0.99; r += 0.03) expect(bivariateNormalUpper(0, 0, r)).toBeCloseTo(0.25 + Math.asin(r) / (2 * Math.PI), 14);
  });

  it("factorises at r = 0 and reaches the limits at r = +-1", () => {
    expect(bivariateNormalUpper(0.7, -1.2, 0)).toBeCloseTo(normalCdf(-0.7) * normalCdf(1.2), 15);
    expect(bivariateNormalUpper(0.7, -1.2, 1)).toBeCloseTo(normalCdf(-0.7), 15);
    expect(bivariateNormalUpper(0.7, -1.2, -1)).toBeCloseTo(normalCdf(-0.7) - normalCdf(-1.2), 15);
    expect(bivariateNormalUpper(0.7, 1.2, -1)).toBe(0);
  });

  it("is symmetric in its arguments and the CDF is the upper probability reflected", () => {
    expect(bivariateNormalUpper(0.4, -1.1, 0.85)).toBeCloseTo(bivariateNormalUpper(-1.1, 0.4, 0.85), 15);
    expect(bivariateNormalCdf(1.96, 1.96, 0.5)).toBeCloseTo(bivariateNormalUpper(-1.96, -1.96, 0.5), 15);
    expect(Number.isNaN(bivariateNormalUpper(0, 0, 1.5))).toBe(true);
  });
});
