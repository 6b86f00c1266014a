/** The chi-square upper tail against scipy.stats.chi2.sf (test/fixtures/factor-model/generate_factor.py). */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { chiSquareSurvival, upperGammaRegularized } from "../../../src/core/numerics/chiSquare.js";
import { expectClose } from "../../support/close.js";

const fixture = JSON.parse(readFileSync(new URL("../../fixtures/factor-model/factor_expected.json", import.meta.url), "utf8")) as {
  chiSquare: { x: number; df: number; sf: number }[];
};

describe("chiSquareSurvival", () => {
  it.each(fixture.chiSquare)("matches scipy.stats.chi2.sf at x = $x, df = $df", ({ x, df, sf }) => {
    // Series and continued fraction both converge to 1e-16 relative; 1e-11 leaves room for log-gamma's rounding.
    expectClose(chiSquareSurvival(x, df), sf, { rel: 1e-11 });
  });

  it("is exp(-x/2) for two degrees of freedom (closed form)", () => {
    for (const x of [0.1, 1, 7.5, 40]) expectClose(chiSquareSurvival(x, 2), Math.exp(-x / 2), { rel: 1e-13 });
  });

  it("is 1 at zero and NaN outside its domain", () => {
    expect(chiSquareSurvival(0, 3)).toBe(1);
    expect(upperGammaRegularized(-1, 2)).toBeNaN();
  });
});
