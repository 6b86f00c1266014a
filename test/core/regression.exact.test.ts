/**
 * fitLine on an exact line: one series a multiple of the other, in decimal data, leaves residuals of
 * rounding alone. They are no evidence of an intercept: the fit reports 0 for the residual sum of
 * squares and the intercept, standard errors 0 and no t-statistic or p-value (a p-value of 0.04 on an
 * intercept of 4e-18 was reported before). A line that is nearly exact but not to rounding keeps its
 * residuals and its tests. The pricing test on such books is no test, as its standard errors are
 * rounding too (docs/methods.md §1.5, §30).
 */
import { describe, expect, it } from "vitest";
import { assessPricing } from "../../src/core/pricing/assessPricing.js";
import { fitLine } from "../../src/core/statistics.js";
import { ok } from "./helpers.js";

const x = [0.0751, -0.0149, 0.0168, 0.0094, 0.0301, -0.0371, -0.0074, -0.0175, -0.0272, -0.0203, -0.0104, -0.0036];

describe("an exact line", () => {
  it("a low book L on the market of L and a high book 2L (w = 1/2, rounded): residuals and intercept are 0, no tests", () => {
    const fit = ok(
      fitLine(
        x.map((v) => (v + 2 * v) / 2),
        x,
      ),
    );
    expect(fit.residualSumOfSquares).toBe(0);
    expect(fit.alpha).toBe(0);
    expect(fit.alphaStdErr).toBe(0);
    expect(fit.alphaTStat).toBeNull();
    expect(fit.alphaPValue).toBeNull();
    expect(fit.rSquared).toBe(1);
    expect(fit.beta).toBeCloseTo(2 / 3, 14);
  });

  it("a line with a real intercept and exact slope keeps its intercept (only rounding is set to 0)", () => {
    const fit = ok(
      fitLine(
        x,
        x.map((v) => 0.01 + 2 * v),
      ),
    );
    expect(fit.alpha).toBeCloseTo(0.01, 15);
    expect(fit.residualSumOfSquares).toBe(0);
    expect(fit.alphaTStat).toBeNull();
  });

  it("a nearly exact line whose residuals exceed rounding keeps them and its tests", () => {
    const noise = [1e-9, -2e-9, 1.5e-9, 0, -1e-9, 2e-9, -0.5e-9, 1e-9, -1.5e-9, 0.5e-9, -1e-9, 1e-9];
    const fit = ok(
      fitLine(
        x,
        x.map((v, i) => 2 * v + (noise[i] as number)),
      ),
    );
    expect(fit.residualSumOfSquares).toBeGreaterThan(0);
    expect(fit.alphaTStat).not.toBeNull();
    expect(fit.alphaPValue).not.toBeNull();
  });
});

describe("the pricing test on an exact line", () => {
  it("one book an exact multiple of the other: no test (its standard errors are rounding), as with an exact 0", () => {
    const more = [...x, 0.0177, -0.0114, -0.0909, 0.0407, -0.0068, -0.0173, 0.0131, 0.0119, 0.0066, -0.0206, 0.0107, 0.0051];
    const pricing = assessPricing({ low: more, high: more.map((v) => 2 * v) }, { weight: 0.5, confidence: 0.95, longRun: "hac", hac: {} });
    expect(pricing).not.toBeNull();
    expect(pricing?.test).toBeNull();
    // A real pair of books is tested.
    const other = more.map((v, i) => 1.3 * v + (i % 3 === 0 ? 0.004 : -0.002));
    expect(assessPricing({ low: more, high: other }, { weight: 0.5, confidence: 0.95, longRun: "hac", hac: {} })?.test).not.toBeNull();
  });
});
