/**
 * The moment-inequality test's rules: moment selection (Andrews & Soares 2010), the p-value of each
 * branch, the larger of the two, the intersection-union p-value (Berger 1982) and the verdicts.
 */
import { describe, expect, it } from "vitest";
import { momentInequalityTest, selectionThreshold } from "../../../src/core/pricing/momentInequalities.js";
import { bivariateNormalCdf } from "../../../src/core/numerics/bivariateNormal.js";
import { normalSurvival } from "../../../src/core/numerics/normal.js";

describe("momentInequalityTest", () => {
  const n = 600;
  const kappa = selectionThreshold(n);

  it("selects the binding inequality only: p = P(Z > T) when the other is slack", () => {
    // d1 far inside (t = 8), d2 violated (t = -1.8): only d2 is selected on the positive branch.
    const test = momentInequalityTest([8, -1.8], [1, 1], -0.5, n, 0.95);
    expect(test.statistic).toBeCloseTo(1.8, 15);
    expect(test.pValue).toBeCloseTo(normalSurvival(1.8), 15);
    expect(test.verdict).toBe("not explained");
  });

  it("uses the bivariate normal when both are near binding", () => {
    const t: [number, number] = [0.5, -0.2];
    expect(Math.max(...t.map(Math.abs))).toBeLessThan(kappa);
    const test = momentInequalityTest(t, [1, 1], 0.3, n, 0.95);
    // Positive branch s = (0.5, -0.2): T = 0.2; negative branch s = (-0.5, 0.2): T = 0.5; both select both.
    const positive = 1 - bivariateNormalCdf(0.2, 0.2, 0.3);
    const negative = 1 - bivariateNormalCdf(0.5, 0.5, 0.3);
    expect(test.pValue).toBeCloseTo(Math.max(positive, negative), 14);
    expect(test.verdict).toBe("undetermined");
  });

  it("is 1 on a branch where both inequalities are slack beyond the threshold", () => {
    const test = momentInequalityTest([kappa + 3, kappa + 1], [1, 1], -0.9, n, 0.95);
    expect(test.pValue).toBe(1);
    expect(test.explainedPValue).toBeCloseTo(normalSurvival(kappa + 1), 15);
    expect(test.verdict).toBe("explained");
  });

  it("rejects on the negative branch only when both branches reject (lambda of unknown sign)", () => {
    // Both d near 0 relative to their errors: neither branch rejects.
    expect(momentInequalityTest([0.1, 0.1], [1, 1], -0.9, n, 0.95).verdict).toBe("undetermined");
    // Opposite signs, both significant: outside whichever the sign of lambda.
    const outside = momentInequalityTest([-3, 4], [1, 1], -0.9, n, 0.95);
    expect(outside.verdict).toBe("not explained");
    expect(outside.pValue).toBeLessThan(0.01);
  });

  it("takes the standard errors into the t statistics", () => {
    const a = momentInequalityTest([2, -0.9], [1, 0.5], -0.4, n, 0.95);
    const b = momentInequalityTest([4, -1.8], [2, 1], -0.4, n, 0.95);
    expect(a.statistic).toBeCloseTo(b.statistic, 15);
    expect(a.pValue).toBeCloseTo(b.pValue, 15);
  });
});
