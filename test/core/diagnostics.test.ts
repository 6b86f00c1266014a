/**
 * One test per diagnostic rule of solve, titled as the rule.
 *
 * Most samples are the 7-point integer series of solve.examples.test.ts, whose sample moments are
 * exactly docs/methods.md §1.7 Example A (V_low = 4, V_high = 9, C = 5: set [5/7, 8/9]) or Example B
 * (C = 3: set [1/2, 8/7]); only their means are varied. Integer data keep every sum exact.
 */

import { describe, expect, test } from "vitest";
import type { Diagnostic, DiagnosticDetail } from "../../src/core/diagnostics.js";
import { identifySet, solve } from "../../src/core/solve.js";
import { expectClose } from "../support/close.js";
import { codes, nonNull, solveOk, solveWithSet } from "./helpers.js";

const lowDeviations = [-4, -1, 0, 1, 1, 1, 2];
const highDeviationsA = [-6, -1, 2, 0, 2, 3, 0];
const highDeviationsB = [-5, 1, 4, -1, -1, 3, -1];
const exampleA = (lowMean: number, highMean: number) => ({
  low: lowDeviations.map((d) => d + lowMean),
  high: highDeviationsA.map((d) => d + highMean),
});
const exampleB = (lowMean: number, highMean: number) => ({
  low: lowDeviations.map((d) => d + lowMean),
  high: highDeviationsB.map((d) => d + highMean),
});
/** Example A's market: Var(M) = 23/4 (§1.7), n = 7, so the standard error of its mean is sqrt(23/4 / 7). */
const marketMeanStdErrA = Math.sqrt(23 / 4 / 7);

function find<C extends DiagnosticDetail["code"]>(
  diagnostics: readonly Diagnostic[],
  code: C,
): Diagnostic & { detail: Extract<DiagnosticDetail, { code: C }> } {
  const d = nonNull(
    diagnostics.find((x) => x.code === code),
    `diagnostic ${code} among [${codes(diagnostics).join(", ")}]`,
  );
  return d as Diagnostic & { detail: Extract<DiagnosticDetail, { code: C }> };
}

describe("solve diagnostics, one rule each", () => {
  test('fewer than 3 observations: solve fails with the error "too-few-observations" (3 is enough)', () => {
    for (const n of [0, 1, 2]) {
      const result = solve({ low: [0.01, -0.02].slice(0, n), high: [0.02, -0.01].slice(0, n) });
      expect(result.ok).toBe(false);
      if (result.ok) continue;
      const d = find(result.issues, "too-few-observations");
      expect(d.severity).toBe("error");
      expect(d.detail.observations).toBe(n);
      expect(d.detail.minimum).toBe(3);
    }
    expect(solve({ low: [0.01, -0.02, 0.03], high: [0.02, -0.01, 0.05] }).ok).toBe(true);
  });

  test('a constant series (low, high or the market proxy): solve fails with the error "zero-variance" naming the series', () => {
    const cases = [
      // 0.01 is not a binary fraction: a constant series must still have variance exactly 0.
      { sample: { low: Array<number>(10).fill(0.01), high: [0.02, -0.01, 0.03, 0.0, 0.01, 0.02, -0.01, 0.03, 0.0, 0.01] }, series: "low" },
      { sample: { low: [0.02, -0.01, 0.03, 0.0], high: [0.013, 0.013, 0.013, 0.013] }, series: "high" },
      // w = 1/2 and high = -low: M = 0 every period although neither book is constant.
      { sample: { low: [0.02, -0.01, 0.03, 0.0], high: [-0.02, 0.01, -0.03, 0.0] }, series: "market" },
    ] as const;
    for (const { sample, series } of cases) {
      const result = solve(sample, { weight: 0.5 });
      expect(result.ok, series).toBe(false);
      if (result.ok) continue;
      const d = find(result.issues, "zero-variance");
      expect(d.severity).toBe("error");
      expect(d.detail.series).toBe(series);
    }
  });

  test('covariance C <= 0: the error "nonpositive-covariance", with moments and CAPM still reported but no bounds, no grid, no landmarks (§1.2 caveat)', () => {
    // Multiples of 1/128, so means and deviations are exact and C is exactly what the comment says.
    const u = 1 / 128;
    const cases = [
      // Exactly zero: deviations x = (1, -1, 0, 0) u, y = (0, 0, 1, -1) u.
      { low: [2, 0, 1, 1].map((k) => k * u), high: [1, 1, 2, 0].map((k) => k * u), covariance: 0 },
      // Negative: deviations (-1.5, -0.5, 0.5, 1.5) u against (1.5, -0.5, 0.5, -1.5) u: C = -4/3 u^2.
      { low: [1, 2, 3, 4].map((k) => k * u), high: [4, 2, 3, 1].map((k) => k * u), covariance: -(4 / 3) * u * u },
    ];
    for (const { low, high, covariance } of cases) {
      const s = solveOk({ low, high });
      expect(s.bounds).toBeNull();
      expect(s.grid).toEqual([]);
      expect(s.landmarks).toBeNull();
      const d = find(s.diagnostics, "nonpositive-covariance");
      expect(d.severity).toBe("error");
      expectClose(d.detail.covariance, covariance, { rel: 1e-12 });
      expectClose(d.detail.correlation, nonNull(s.moments.correlation.lowHigh, "corr(low, high)"), { rel: 1e-12, abs: 1e-15 });
      expect(s.capm.low.observations).toBe(4);
    }
  });

  test('perfectly correlated books (high = 2 low): the info "perfect-correlation", and the set is the single point 2/3 (§1.2: a point iff |corr| = 1)', () => {
    const low = [0.01, 0.02, -0.01, 0.03, 0.005];
    const s = solveWithSet({ low, high: low.map((x) => 2 * x) }, { weight: 0.5 });
    const d = find(s.diagnostics, "perfect-correlation");
    expect(d.severity).toBe("info");
    expectClose(d.detail.correlation, 1, { rel: 1e-12 });
    // §1.2 with V_H = 4 V_L, C = 2 V_L, w = 1/2: Lb = 2V/(2V + V) = 2/3 = V/(V/2 + V) = U.
    expectClose(s.bounds.lowBeta.min, 2 / 3, { rel: 1e-12 });
    expectClose(s.bounds.lowBeta.max, 2 / 3, { rel: 1e-12 });
    expect(codes(solveOk(exampleA(5, 7)).diagnostics)).not.toContain("perfect-correlation");
  });

  test('an upper bound U > 1, i.e. V_low > C: the warning "low-beta-above-one" with the bound (§1.2 caveat; Example B U = 8/7)', () => {
    const flipped = solveWithSet(exampleB(5, 7));
    const d = find(flipped.diagnostics, "low-beta-above-one");
    expect(d.severity).toBe("warning");
    expectClose(d.detail.upperBound, 8 / 7, { rel: 1e-12 });
    expectClose(d.detail.upperBound, flipped.bounds.lowBeta.max, { rel: 1e-15 });
    // Example A: V_low = 4 < C = 5, U = 8/9: no warning.
    expect(codes(solveOk(exampleA(5, 7)).diagnostics)).not.toContain("low-beta-above-one");
  });

  test('a mean excess market return within z = 1.96 standard errors of 0 (Fieller\'s condition at 95%): the info "market-mean-near-zero" and returnImplied null', () => {
    // Means (1, 1): lambda = 1 <= 1.96 sqrt(23/28) = 1.776 (it passed the old one-standard-error rule).
    const near = solveWithSet(exampleA(1, 1));
    expect(near.landmarks.returnImplied).toBeNull();
    const d = find(near.diagnostics, "market-mean-near-zero");
    expect(d.severity).toBe("info");
    expectClose(d.detail.marketMean, 1, { rel: 1e-12 });
    expectClose(d.detail.tStat, 1 / marketMeanStdErrA, { rel: 1e-12 });
    expectClose(d.detail.criticalValue, 1.959963984540054, { rel: 1e-12 }); // scipy.stats.norm.ppf(0.975)
    // At 60% the critical value is 0.8416 (scipy.stats.norm.ppf(0.8)): lambda = 1 > 0.763 passes.
    expect(nonNull(solveOk(exampleA(1, 1), { confidence: 0.6 }).landmarks?.returnImplied ?? null, "returnImplied").lowBeta).toBeCloseTo(
      1,
      12,
    );
    // Means (2, 2): lambda = 2 > 1.776, so the return-implied point is reported.
    const far = solveWithSet(exampleA(2, 2));
    expect(codes(far.diagnostics)).not.toContain("market-mean-near-zero");
    expectClose(nonNull(far.landmarks.returnImplied, "returnImplied").lowBeta, 1, { rel: 1e-12 }); // mean low / lambda
  });

  test('a return-implied low beta outside the set by the point estimates: the info "return-implied-outside-not-significant" (untested: solve runs no test), and that landmark has insideSet false', () => {
    // Means (2, 4): lambda = 3, b_mu = 2 / 3 < Lb = 5/7 (§1.6 over-identifying check).
    const s = solveWithSet(exampleA(2, 4));
    const landmark = nonNull(s.landmarks.returnImplied, "returnImplied");
    expectClose(landmark.lowBeta, 2 / 3, { rel: 1e-12 });
    expect(landmark.insideSet).toBe(false);
    expect(landmark.highNoiseVariance).toBeLessThan(0); // below Lb the high book's noise variance is negative (§1.2)
    expect(codes(s.diagnostics)).not.toContain("return-implied-outside-set"); // a warning needs the pricing test
    const d = find(s.diagnostics, "return-implied-outside-not-significant");
    expect(d.severity).toBe("info");
    expect(d.detail.pValue).toBeNull();
    expectClose(d.detail.lowBeta, 2 / 3, { rel: 1e-12 });
    expectClose(d.detail.min, 5 / 7, { rel: 1e-12 });
    expectClose(d.detail.max, 8 / 9, { rel: 1e-12 });
    // Means (5, 7): b_mu = 5/6, inside [5/7, 8/9]: no warning.
    expect(codes(solveOk(exampleA(5, 7)).diagnostics)).not.toContain("return-implied-outside-not-significant");
  });

  test('books more than 1e20 apart in magnitude: solve fails with the error "magnitude-out-of-range", naming the smaller', () => {
    // Found by the report tests' property search: C is ~1e-90 of V_low, so phi = C / (b_low b_high)
    // at the peak of b_low b_high underflowed relative to the rest before the magnitudes were checked.
    const result = solve({ low: [0, 0, 0, 3.96e-10, 0, 0, 0, 0], high: [0, 0, 0, 0, 0, -7.3e-80, 0, 0] }, { weight: 0.05, steps: 2 });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const d = find(result.issues, "magnitude-out-of-range");
    expect(d.severity).toBe("error");
    expect(d.detail).toEqual({ code: "magnitude-out-of-range", series: "high", largest: 7.3e-80, other: 3.96e-10 });
  });

  test('a set whose numbers leave double precision: "degenerate-moments", no set, and never a non-finite number', () => {
    // Population moments (no data to check) with C ~1e-300 of the variances: phi = C / (b_low b_high)
    // is finite but the noise variances' expansion is not; identifySet rejects rather than report them.
    const summary = { weight: 0.5, lowMean: 0, highMean: 0, lowVariance: 1e300, highVariance: 1e300, covariance: 1e-300 };
    const identified = identifySet(summary, 3, 0);
    expect(identified.bounds).toBeNull();
    expect(identified.grid).toEqual([]);
    const d = find(identified.diagnostics, "degenerate-moments");
    expect(d.severity).toBe("error");
  });
});
