import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { populationMoments, type Structure } from "../../../src/core/forward/populationMoments.js";
import { identifiedBounds, marketMoments, structureAt } from "../../../src/core/identify.js";
import { expectClose } from "../../support/close.js";

// Example A of docs/methods.md §1.7 (exact rationals): b_low = 3/4, phi = 16/3, s_low = 1, s_high = 2/3
// gives V_low = 4, V_high = 9, C = 5 with w = 1/2.
const exampleA: Structure = {
  lowBeta: 3 / 4,
  weight: 0.5,
  factorVol: Math.sqrt(16 / 3),
  factorMean: 0.01,
  lowNoiseVol: 1,
  highNoiseVol: Math.sqrt(2 / 3),
};

describe("populationMoments", () => {
  it("reproduces the moments of docs/methods.md §1.7 Example A from its structure", () => {
    const m = populationMoments(exampleA);
    expectClose(m.lowVariance, 4);
    expectClose(m.highVariance, 9);
    expectClose(m.covariance, 5);
    expectClose(m.lowMean, 0.0075); // b_low * factorMean
    expectClose(m.highMean, 0.0125); // b_high = 5/4
  });

  it("gives back the structure it came from when back-solved at the true low beta (1e-12)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 0.95, noNaN: true }),
        fc.double({ min: 0.2, max: 1.6, noNaN: true }),
        fc.double({ min: 1e-3, max: 0.1, noNaN: true }),
        fc.double({ min: 1e-4, max: 0.1, noNaN: true }),
        fc.double({ min: 1e-4, max: 0.1, noNaN: true }),
        (weight, lowBetaShare, factorVol, lowNoiseVol, highNoiseVol) => {
          const lowBeta = (lowBetaShare / 1.6) * (0.999 / weight);
          const structure: Structure = { lowBeta, weight, factorVol, factorMean: 0.004, lowNoiseVol, highNoiseVol };
          const m = populationMoments(structure);
          const back = structureAt(lowBeta, m);
          expectClose(back.factorVariance, factorVol ** 2, { rel: 1e-12 });
          expectClose(back.lowNoiseVariance, lowNoiseVol ** 2, { rel: 1e-9, abs: 1e-15 * m.lowVariance });
          expectClose(back.highNoiseVariance, highNoiseVol ** 2, { rel: 1e-9, abs: 1e-15 * m.highVariance });
          const bounds = identifiedBounds(m);
          expect(lowBeta).toBeGreaterThanOrEqual(bounds.lowBeta.min * (1 - 1e-12));
          expect(lowBeta).toBeLessThanOrEqual(bounds.lowBeta.max * (1 + 1e-12));
        },
      ),
      { seed: 20261201, numRuns: 300 },
    );
  });

  it("implies CAPM betas and residual variances equal to the closed forms of docs/methods.md §1.5", () => {
    const m = populationMoments(exampleA);
    const market = marketMoments(m);
    const point = structureAt(exampleA.lowBeta, m, market);
    // Section 1.7: beta_L = 18/23, beta_H = 28/23, Var(M) = 23/4, residual variances 11/23 each.
    expectClose(market.lowCapmBeta, 18 / 23);
    expectClose(market.highCapmBeta, 28 / 23);
    expectClose(market.variance, 23 / 4);
    expectClose(point.impliedCapm.lowBeta, 18 / 23);
    expectClose(point.impliedCapm.highBeta, 28 / 23);
    expectClose(point.impliedCapm.lowResidualVariance, 11 / 23);
    expectClose(point.impliedCapm.highResidualVariance, 11 / 23);
    // Section 1.6: expected alpha (b - beta) lambda, and w alpha_L + (1 - w) alpha_H = 0.
    expectClose(point.expectedLowAlpha, (3 / 4 - 18 / 23) * 0.01);
    expectClose(0.5 * point.expectedLowAlpha + 0.5 * point.expectedHighAlpha, 0, { abs: 1e-18 });
  });

  it("gives the two-indicator set [15/26, 17/16] of docs/methods.md §3's exact example", () => {
    // Section 3: truth b_low = 3/4, b_high = 5/4, phi = 4, s = (2, 3) -> V_low = 17/4, V_high = 37/4,
    // C = 15/4; "the two-indicator set from the same (V_L, V_H, C_LH) is [15/26, 17/16]".
    const m = populationMoments({
      lowBeta: 0.75,
      weight: 0.5,
      factorVol: 2,
      factorMean: 0,
      lowNoiseVol: Math.sqrt(2),
      highNoiseVol: Math.sqrt(3),
    });
    expectClose(m.lowVariance, 17 / 4);
    expectClose(m.highVariance, 37 / 4);
    expectClose(m.covariance, 15 / 4);
    const bounds = identifiedBounds(m);
    expectClose(bounds.lowBeta.min, 15 / 26);
    expectClose(bounds.lowBeta.max, 17 / 16);
  });
});
