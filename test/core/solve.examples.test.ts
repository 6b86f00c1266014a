/**
 * solve on the exact worked examples of docs/methods.md §1.7 (w = 1/2, exact rationals):
 *   Example A: V_low = 4, V_high = 9, C = 5;   Example B (ordering flip): V_low = 4, V_high = 9, C = 3.
 *
 * solve takes series, so each example is realised by 7 integer observations whose sample moments
 * (divisor n - 1 = 6) are exactly the example's: centred integer vectors with sum of squares 24 and 54
 * and cross-product 30 (A) or 18 (B), found by exhaustive search over small integers, then shifted by
 * the means 5 (low) and 7 (high). Integer data make every sum exact in floating point. The first tests
 * check the moments with exact integer arithmetic before anything else is trusted.
 *
 * The means do not enter §1.7 (it is about second moments); they give the mean excess market return
 * lambda = (5 + 7)/2 = 6 used for the §1.6 alpha and Sharpe fields, each computed here from §1.6/§6
 * formulas with the §1.7 values.
 *
 * Tolerance: 1e-12 relative (the brief). Values that are exactly 0 in §1.7 (a noise variance at an
 * endpoint, an alpha at the CAPM point) get an absolute 1e-12 times the scale of the quantity.
 */

import { describe, expect, test } from "vitest";
import type { Candidate } from "../../src/core/types.js";
import { expectClose } from "../support/close.js";
import { codes, gridAt, nonNull, solveWithSet } from "./helpers.js";

const rel = 1e-12;
const w = 0.5;

const lowDeviations = [-4, -1, 0, 1, 1, 1, 2];
const highDeviationsA = [-6, -1, 2, 0, 2, 3, 0];
const highDeviationsB = [-5, 1, 4, -1, -1, 3, -1];
const lowMean = 5;
const highMean = 7;
const exampleA = { low: lowDeviations.map((d) => d + lowMean), high: highDeviationsA.map((d) => d + highMean) };
const exampleB = { low: lowDeviations.map((d) => d + lowMean), high: highDeviationsB.map((d) => d + highMean) };

/** Exact integer sums (all values are small integers): centred cross-product over n - 1. */
function exactCovariance(x: readonly number[], y: readonly number[]): number {
  const n = x.length;
  const sx = x.reduce((a, b) => a + b, 0);
  const sy = y.reduce((a, b) => a + b, 0);
  const sxy = x.reduce((a, xi, i) => a + xi * (y[i] as number), 0);
  // n * sxy - sx * sy is an exact integer; dividing once at the end keeps the result exact for these data.
  return (n * sxy - sx * sy) / (n * (n - 1));
}

/** s_low, s_high from the §1.1 back-solution, written out for readability of the expected values. */
function expectStructure(
  c: Candidate,
  expected: { lowBeta: number; highBeta: number; phi: number; sLow: number; sHigh: number },
  scale: { vLow: number; vHigh: number },
): void {
  expectClose(c.lowBeta, expected.lowBeta, { rel });
  expectClose(c.highBeta, expected.highBeta, { rel });
  expectClose(c.factorVariance, expected.phi, { rel });
  expectClose(c.lowNoiseVariance, expected.sLow, { rel, abs: expected.sLow === 0 ? 1e-12 * scale.vLow : 0 });
  expectClose(c.highNoiseVariance, expected.sHigh, { rel, abs: expected.sHigh === 0 ? 1e-12 * scale.vHigh : 0 });
}

describe("docs/methods.md §1.7 Example A (V_low = 4, V_high = 9, C = 5, w = 1/2)", () => {
  const scale = { vLow: 4, vHigh: 9 };

  test("the constructed series have exactly the example's sample moments (exact integer arithmetic)", () => {
    expect(exactCovariance(exampleA.low, exampleA.low)).toBe(4);
    expect(exactCovariance(exampleA.high, exampleA.high)).toBe(9);
    expect(exactCovariance(exampleA.low, exampleA.high)).toBe(5);
  });

  const s = solveWithSet(exampleA, { weight: w });

  test("solve reports those moments: V_low = 4, V_high = 9, C = 5, corr = 5/6 (§1.7)", () => {
    expectClose(s.moments.low.variance, 4, { rel });
    expectClose(s.moments.high.variance, 9, { rel });
    expectClose(s.moments.covariance.lowHigh, 5, { rel });
    expectClose(s.moments.correlation.lowHigh, 5 / 6, { rel });
    expect(s.observations).toBe(7);
    expect(s.weight).toBe(w);
  });

  test("Var(M) = 23/4 and Cov(low, M) = 9/2, Cov(high, M) = 7 (§1.7; §1.5 formulas)", () => {
    expectClose(s.moments.market.variance, 23 / 4, { rel });
    expectClose(s.moments.covariance.lowMarket, w * 4 + (1 - w) * 5, { rel }); // §1.5: w V_L + (1-w) C
    expectClose(s.moments.covariance.highMarket, w * 5 + (1 - w) * 9, { rel }); // §1.5: w C + (1-w) V_H
  });

  test("the identified set of the low beta is [5/7, 8/9], width 11/63 (§1.7)", () => {
    expectClose(s.bounds.lowBeta.min, 5 / 7, { rel });
    expectClose(s.bounds.lowBeta.max, 8 / 9, { rel });
    expectClose(s.bounds.lowBeta.max - s.bounds.lowBeta.min, 11 / 63, { rel });
  });

  test("the high beta ranges over [10/9, 9/7], the b_high of the two endpoints (§1.7)", () => {
    expectClose(s.bounds.highBeta.min, 10 / 9, { rel });
    expectClose(s.bounds.highBeta.max, 9 / 7, { rel });
  });

  test("the factor variance ranges over [81/16, 49/9]: phi at b_low = 8/9 and 5/7 (§1.7; monotone below 1/(2w), §1.5)", () => {
    expectClose(s.bounds.factorVariance.min, 81 / 16, { rel });
    expectClose(s.bounds.factorVariance.max, 49 / 9, { rel });
  });

  test("CAPM betas are 18/23 and 28/23 and both residual variances 11/23 (§1.7)", () => {
    expectClose(s.capm.low.beta, 18 / 23, { rel });
    expectClose(s.capm.high.beta, 28 / 23, { rel });
    expectClose(s.capm.low.residualVariance, 11 / 23, { rel });
    expectClose(s.capm.high.residualVariance, 11 / 23, { rel });
  });

  test("CAPM alphas are mean - beta lambda = 5 - (18/23) 6 = 7/23 and -7/23, summing to 0 with weights w (§1.5)", () => {
    expectClose(s.capm.low.alpha, lowMean - (18 / 23) * 6, { rel });
    expectClose(s.capm.high.alpha, highMean - (28 / 23) * 6, { rel });
    expectClose(w * s.capm.low.alpha + (1 - w) * s.capm.high.alpha, 0, { abs: 1e-12 });
  });

  test("highNoiseFree is b_low = 5/7: b_high 9/7, phi 49/9, s_low 11/9, s_high 0 (§1.7)", () => {
    expectStructure(s.landmarks.highNoiseFree, { lowBeta: 5 / 7, highBeta: 9 / 7, phi: 49 / 9, sLow: 11 / 9, sHigh: 0 }, scale);
    expectClose(s.landmarks.highNoiseFree.noiseShare, 1, { rel }); // s_low / (s_low + 0)
  });

  test("lowNoiseFree is b_low = 8/9: b_high 10/9, phi 81/16, s_low 0, s_high 11/4 (§1.7)", () => {
    expectStructure(s.landmarks.lowNoiseFree, { lowBeta: 8 / 9, highBeta: 10 / 9, phi: 81 / 16, sLow: 0, sHigh: 11 / 4 }, scale);
    expectClose(s.landmarks.lowNoiseFree.noiseShare, 0, { abs: 1e-12 });
  });

  test("capmConsistent is b_low = 18/23: b_high 28/23, phi 2645/504, s_low 11/14, s_high 11/9, delta* 14/9 (§1.7)", () => {
    const c = s.landmarks.capmConsistent;
    expectStructure(c, { lowBeta: 18 / 23, highBeta: 28 / 23, phi: 2645 / 504, sLow: 11 / 14, sHigh: 11 / 9 }, scale);
    expectClose(c.noiseShare, 1 / (1 + 14 / 9), { rel }); // s_low/(s_low + s_high) = 1/(1 + delta*)
    expectClose(c.expectedLowAlpha, 0, { abs: 1e-12 * 6 }); // (b - beta) lambda with b = beta (§1.6)
    expectClose(c.expectedHighAlpha, 0, { abs: 1e-12 * 6 });
  });

  test("equalNoise is the Deming delta = 1 point b_low = 3 - sqrt(5), where s_low = s_high (§1.7, §1.4)", () => {
    const c = s.landmarks.equalNoise;
    expectClose(c.lowBeta, 3 - Math.sqrt(5), { rel });
    expectClose(c.highBeta, (1 - w * (3 - Math.sqrt(5))) / (1 - w), { rel }); // normalisation w b_L + (1-w) b_H = 1
    expectClose(c.lowNoiseVariance, c.highNoiseVariance, { rel });
    expectClose(c.noiseShare, 1 / 2, { rel });
  });

  test("returnImplied is b_low = mean low / lambda = 5/6, inside the set (§1.6, constructed means 5 and 7)", () => {
    const c = nonNull(s.landmarks.returnImplied, "returnImplied");
    expectClose(c.lowBeta, 5 / 6, { rel });
    expectClose(c.highBeta, 7 / 6, { rel }); // mean high / lambda, equivalently the normalisation
    expect(c.insideSet).toBe(true);
    // Under the §1.6 pricing assumption the expected alpha at b^mu is the sample CAPM alpha 7/23.
    expectClose(c.expectedLowAlpha, 7 / 23, { rel }); // (5/6 - 18/23) 6
    expect(codes(s.diagnostics)).not.toContain("return-implied-outside-set");
  });

  test("a 45-point grid runs from 5/7 to 8/9 and its 10th point is b_low = 3/4 (3/4 - 5/7 = 9/44 of the width)", () => {
    const grid = solveWithSet(exampleA, { weight: w, steps: 45 }).grid;
    expect(grid).toHaveLength(45);
    expectClose(gridAt(grid, 0).lowBeta, 5 / 7, { rel });
    expectClose(gridAt(grid, 44).lowBeta, 8 / 9, { rel });
    expectStructure(gridAt(grid, 9), { lowBeta: 3 / 4, highBeta: 5 / 4, phi: 16 / 3, sLow: 1, sHigh: 2 / 3 }, scale);
  });

  test("at b_low = 3/4 the factor R² are b² phi / V: 3/4 for low and 25/27 for high (§1.7 values, §6 formula)", () => {
    const c = gridAt(solveWithSet(exampleA, { weight: w, steps: 45 }).grid, 9);
    expectClose(c.lowFactorRSquared, ((3 / 4) ** 2 * (16 / 3)) / 4, { rel });
    expectClose(c.highFactorRSquared, ((5 / 4) ** 2 * (16 / 3)) / 9, { rel });
    expectClose(c.noiseShare, 1 / (1 + 2 / 3), { rel });
  });

  test("the default grid has 11 evenly spaced candidates from 5/7 to 8/9, all inside the set", () => {
    expect(s.grid).toHaveLength(11);
    s.grid.forEach((c, k) => {
      expectClose(c.lowBeta, 5 / 7 + (k / 10) * (11 / 63), { rel });
      expect(c.insideSet).toBe(true);
    });
  });

  test("every grid candidate and landmark implies the observed CAPM: betas 18/23, 28/23 and residual variances 11/23 (§1.5)", () => {
    const all = [...s.grid, s.landmarks.lowNoiseFree, s.landmarks.highNoiseFree, s.landmarks.equalNoise, s.landmarks.capmConsistent];
    for (const c of all) {
      expectClose(c.impliedCapm.lowBeta, 18 / 23, { rel });
      expectClose(c.impliedCapm.highBeta, 28 / 23, { rel });
      expectClose(c.impliedCapm.lowResidualVariance, 11 / 23, { rel });
      expectClose(c.impliedCapm.highResidualVariance, 11 / 23, { rel });
    }
  });

  test("every candidate's expected alpha is (b - CAPM beta) lambda and implied Sharpe b lambda / sd, lambda = 6 (§1.6, §6)", () => {
    for (const c of s.grid) {
      expectClose(c.expectedLowAlpha, (c.lowBeta - 18 / 23) * 6, { rel, abs: 1e-12 });
      expectClose(c.expectedHighAlpha, (c.highBeta - 28 / 23) * 6, { rel, abs: 1e-12 });
      expectClose(c.impliedLowSharpe, (c.lowBeta * 6) / 2, { rel }); // sd_low = sqrt(4)
      expectClose(c.impliedHighSharpe, (c.highBeta * 6) / 3, { rel }); // sd_high = sqrt(9)
      expectClose(c.lowFactorRSquared, (c.lowBeta ** 2 * c.factorVariance) / 4, { rel });
      expectClose(c.highFactorRSquared, (c.highBeta ** 2 * c.factorVariance) / 9, { rel });
    }
  });

  test("Example A raises no diagnostic: U = 8/9 <= 1, correlation 5/6, lambda far from 0", () => {
    expect(codes(s.diagnostics)).toEqual([]);
  });
});

describe("docs/methods.md §1.7 Example B, the ordering flip (V_low = 4, V_high = 9, C = 3, w = 1/2)", () => {
  const scale = { vLow: 4, vHigh: 9 };

  test("the constructed series have exactly the example's sample moments (exact integer arithmetic)", () => {
    expect(exactCovariance(exampleB.low, exampleB.low)).toBe(4);
    expect(exactCovariance(exampleB.high, exampleB.high)).toBe(9);
    expect(exactCovariance(exampleB.low, exampleB.high)).toBe(3);
  });

  const s = solveWithSet(exampleB, { weight: w });

  test("solve reports V_low = 4, V_high = 9, C = 3 and Var(M) = 19/4 (§1.5: w²V_L + 2w(1-w)C + (1-w)²V_H)", () => {
    expectClose(s.moments.low.variance, 4, { rel });
    expectClose(s.moments.high.variance, 9, { rel });
    expectClose(s.moments.covariance.lowHigh, 3, { rel });
    expectClose(s.moments.market.variance, w * w * 4 + 2 * w * (1 - w) * 3 + (1 - w) ** 2 * 9, { rel });
  });

  test("the identified set of the low beta is [1/2, 8/7], reaching above 1 (§1.7)", () => {
    expectClose(s.bounds.lowBeta.min, 1 / 2, { rel });
    expectClose(s.bounds.lowBeta.max, 8 / 7, { rel });
  });

  test("the high beta ranges over [6/7, 3/2] (§1.7 endpoint values)", () => {
    expectClose(s.bounds.highBeta.min, 6 / 7, { rel });
    expectClose(s.bounds.highBeta.max, 3 / 2, { rel });
  });

  test("the factor variance ranges over [3, 4]: its minimum C is at b_low = 1/(2w) = 1 inside the set, its maximum phi(1/2) = 4 (§1.5, §1.7)", () => {
    expectClose(s.bounds.factorVariance.min, 3, { rel });
    expectClose(s.bounds.factorVariance.max, 4, { rel });
  });

  test("the CAPM low beta is 14/19 and both residual variances are 27/19 (§1.7)", () => {
    expectClose(s.capm.low.beta, 14 / 19, { rel });
    expectClose(s.capm.high.beta, (1 - w * (14 / 19)) / (1 - w), { rel }); // w beta_L + (1-w) beta_H = 1 (§1.5)
    expectClose(s.capm.low.residualVariance, 27 / 19, { rel });
    expectClose(s.capm.high.residualVariance, 27 / 19, { rel });
  });

  test("highNoiseFree is b_low = 1/2: (b_high, phi, s_low, s_high) = (3/2, 4, 3, 0) (§1.7)", () => {
    expectStructure(s.landmarks.highNoiseFree, { lowBeta: 1 / 2, highBeta: 3 / 2, phi: 4, sLow: 3, sHigh: 0 }, scale);
  });

  test("lowNoiseFree is b_low = 8/7: (b_high, phi, s_low, s_high) = (6/7, 49/16, 0, 27/4) (§1.7)", () => {
    expectStructure(s.landmarks.lowNoiseFree, { lowBeta: 8 / 7, highBeta: 6 / 7, phi: 49 / 16, sLow: 0, sHigh: 27 / 4 }, scale);
  });

  test('the flip raises warning "low-beta-above-one" with upperBound 8/7 (§1.2 caveat: U > 1 iff V_low > C)', () => {
    const d = s.diagnostics.find((x) => x.code === "low-beta-above-one");
    expect(d?.severity).toBe("warning");
    const detail = nonNull(d, "low-beta-above-one").detail;
    expect(detail.code).toBe("low-beta-above-one");
    if (detail.code === "low-beta-above-one") expectClose(detail.upperBound, 8 / 7, { rel });
  });

  test("the grid still spans the whole set [1/2, 8/7], the part above 1 included", () => {
    expectClose(gridAt(s.grid, 0).lowBeta, 1 / 2, { rel });
    expectClose(gridAt(s.grid, s.grid.length - 1).lowBeta, 8 / 7, { rel });
    for (const c of s.grid) {
      expect(c.insideSet).toBe(true);
      expectClose(c.impliedCapm.lowBeta, 14 / 19, { rel });
    }
  });
});
