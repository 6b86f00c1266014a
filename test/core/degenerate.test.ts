/**
 * Degenerate data give diagnostics, never exceptions, NaN or infinity (docs/methods.md §29): returns
 * at any magnitude within reach computed as if unscaled, out of reach refused; a variance or a
 * covariance within the inputs' rounding refused; perfectly correlated books one point with no noise;
 * zero estimating functions, singular prewhitening, zero standard errors and constant bootstrap
 * resamples handled. Expected numbers are closed forms stated beside them (§29, §1.3) or the unscaled
 * computation itself.
 */

import { describe, expect, test } from "vitest";
import { drawSample } from "../../src/core/forward/simulate.js";
import { hacCovariance } from "../../src/core/inference/hac/hac.js";
import { longRunCovariance } from "../../src/core/inference/hac/longRun.js";
import { quantityCount, writeStatistics } from "../../src/core/inference/bootstrap/statistics.js";
import { summariseBootstrap } from "../../src/core/inference/bootstrap/summary.js";
import { assessUncertainty } from "../../src/core/inference/uncertainty.js";
import { rollSolve } from "../../src/core/rolling/index.js";
import { solve } from "../../src/core/solve.js";
import { momentsFromSummary } from "../../src/core/summaryMoments.js";
import type { Solution } from "../../src/core/types.js";
import { expectClose } from "../support/close.js";
import { scaledDifference } from "../support/units.js";
import { codes, ok, solveOk } from "./helpers.js";

const structure = { lowBeta: 0.75, weight: 0.5, factorVol: 0.04, factorMean: 0.004, lowNoiseVol: 0.012, highNoiseVol: 0.02 };
const sample = drawSample(structure, { periods: 240, seed: 29, noiseAr: 0.2 });
const times = (x: ArrayLike<number>, s: number) => Float64Array.from(x, (v) => v * s);
const uncertaintyOptions = { interval: "stoye", bootstrap: { replicates: 300, seed: 4 } } as const;

/** Every number of a solution (and its uncertainty) that is not finite, by path. */
function nonFinite(value: unknown, path = ""): string[] {
  if (typeof value === "number") return Number.isFinite(value) ? [] : [`${path} = ${value}`];
  if (value === null || typeof value !== "object") return [];
  return Object.entries(value).flatMap(([key, v]) => nonFinite(v, `${path}.${key}`));
}

describe("scaling: returns at any magnitude within 1e-100 to 1e+100 give the unscaled results in their units", () => {
  const plain = solveOk(sample);
  const plainUncertainty = ok(assessUncertainty(sample, uncertaintyOptions));

  test.each([2 ** -200, 2 ** -60, 2 ** 60, 2 ** 250])("times the power of two %s: equal bit for bit in their units", (s) => {
    const scaled = { low: times(sample.low, s), high: times(sample.high, s) };
    const solved = scaledDifference(plain, solveOk(scaled), s, 0);
    expect(solved.compared).toBeGreaterThan(300);
    expect(solved.largest, solved.at).toBe(0);
    const uncertain = scaledDifference(plainUncertainty, ok(assessUncertainty(scaled, uncertaintyOptions)), s, 0);
    expect(uncertain.largest, uncertain.at).toBe(0);
  });

  test.each([1e-95, 1e-80, 1e-40, 1e-3, 1e40, 1e80, 1e95])("times %s: equal to 1e-12 relative in their units", (s) => {
    // Not a power of two: each return is rounded once more (2^-53 relative), which the results carry
    // to at most ~1e-13 on this sample; numbers that are 0 in exact arithmetic are compared to 1e-13 of their unit.
    const scaled = { low: times(sample.low, s), high: times(sample.high, s) };
    const solved = scaledDifference(plain, solveOk(scaled), s);
    expect(solved.largest, solved.at).toBeLessThan(1e-12);
    const uncertain = scaledDifference(plainUncertainty, ok(assessUncertainty(scaled, uncertaintyOptions)), s);
    expect(uncertain.largest, uncertain.at).toBeLessThan(1e-12);
  });

  test("rolling windows at 1e-80 are the unscaled windows in their units", () => {
    const spec = { kind: "window", size: 36, step: 17 } as const;
    const plainWindows = rollSolve(sample.low, sample.high, 0.001, 0.5, spec);
    const tiny = rollSolve(times(sample.low, 1e-80), times(sample.high, 1e-80), 1e-83, 0.5, spec);
    const difference = scaledDifference(plainWindows, tiny, 1e-80);
    expect(difference.compared).toBeGreaterThan(500);
    expect(difference.largest, difference.at).toBeLessThan(1e-12);
  });

  const largest = (x: ArrayLike<number>) => Math.max(...Array.from(x, Math.abs));
  test.each([1e-300, 1e-101, 1e101, 1e300])(
    "times %s: refused with magnitude-out-of-range naming the book out of range, never zero-variance",
    (s) => {
      const [low, high] = [times(sample.low, s), times(sample.high, s)];
      const outside = (x: Float64Array) => largest(x) < 1e-100 || largest(x) > 1e100;
      const series = outside(low) ? "low" : "high";
      expect(outside(series === "low" ? low : high)).toBe(true);
      const result = solve({ low, high });
      expect(result.ok).toBe(false);
      if (result.ok) return;
      expect(codes(result.issues)).toEqual(["magnitude-out-of-range"]);
      expect(result.issues[0]!.detail).toMatchObject({ series, other: null });
      expect(result.issues[0]!.message).toContain("outside 1e-100 to 1e+100");
    },
  );

  test("values of 1e-300 and 2e-300 vary, and are refused for their magnitude, not called constant", () => {
    const low = Float64Array.from({ length: 24 }, (_, t) => (t % 2 === 0 ? 1e-300 : 2e-300));
    const result = solve({ low, high: sample.high.subarray(0, 24) });
    expect(result.ok ? [] : codes(result.issues)).toEqual(["magnitude-out-of-range"]);
  });

  test("books 1e25 apart are refused (they share one scale), books 1e19 apart are solved", () => {
    const apart = solve({ low: times(sample.low, 1e-25), high: sample.high });
    expect(apart.ok ? [] : apart.issues.map((d) => d.detail)).toEqual([
      expect.objectContaining({ code: "magnitude-out-of-range", series: "low", other: expect.any(Number) }),
    ]);
    const near = solveOk({ low: times(sample.low, 1e-19), high: sample.high });
    expect(nonFinite(near)).toEqual([]);
  });
});

describe("cancellation: a variance or covariance within the inputs' rounding error is refused", () => {
  test("columns 0.01 and 0.02 that differ only by 1e-17 fail as constant (not [3e-18, 2] with NaN errors)", () => {
    const low = Array.from({ length: 24 }, (_, t) => (t % 2 === 0 ? 0.01 + 1e-17 : 0.01));
    const high = Array.from({ length: 24 }, (_, t) => (t % 3 === 0 ? 0.02 + 1e-17 : 0.02));
    const result = solve({ low, high });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const d = result.issues[0]!;
    expect(d.detail).toMatchObject({ code: "cancellation", quantity: "low" });
    if (d.detail.code !== "cancellation") return;
    // §29: the bound 2 u R sd sqrt(n/(n-1)), R = 0.01 + 1e-17 the largest value, sd = sqrt(variance).
    const n = 24;
    expectClose(d.detail.roundingError, 2 * 2 ** -52 * (0.01 + 1e-17) * Math.sqrt(d.detail.value) * Math.sqrt(n / (n - 1)), { rel: 1e-12 });
    expect(d.detail.roundingError).toBeGreaterThan(1e-5 * d.detail.value);
    expect(d.message).toContain("last digits");
  });

  test("both books vary but their covariance is rounding: no set, the covariance named, moments and CAPM fits still reported", () => {
    const low = Array.from({ length: 48 }, (_, t) => (t % 2 === 0 ? 0.01 : -0.01));
    const high = Array.from({ length: 48 }, (_, t) => (t % 4 < 2 ? 0.03 : -0.03));
    const s = solveOk({ low, high });
    expect(s.bounds).toBeNull();
    expect(codes(s.diagnostics)).toEqual(["cancellation"]);
    expect(s.diagnostics[0]!.detail).toMatchObject({ quantity: "covariance" });
    expect(nonFinite(s)).toEqual([]);
  });

  test("a covariance that is 0 in exact arithmetic has no set, whatever sign rounding gives it (never [~0, 1/w])", () => {
    const low = Array.from({ length: 48 }, (_, t) => (t % 2 === 0 ? 0.5 : -0.5));
    const high = Array.from({ length: 48 }, (_, t) => (t % 4 < 2 ? 0.25 : -0.25));
    const s = solveOk({ low, high });
    expect(s.bounds).toBeNull();
    expect(["cancellation", "nonpositive-covariance"]).toContain(s.diagnostics[0]?.code);
  });

  test("real data are far from the threshold: the example's moments pass with a margin of 1e8", () => {
    const s = solveOk(sample);
    expect(s.bounds).not.toBeNull();
    expect(codes(s.diagnostics)).not.toContain("cancellation");
  });
});

describe("perfectly correlated books: one point with no noise, and no NaN anywhere", () => {
  const low = sample.low;
  /** §29: with high = k low, t = sqrt(V_high / V_low) = k and b_low = 1 / (w + (1 - w) k). */
  test.each([
    [1, 0.5],
    [2, 0.5],
    [2, 0.3],
    [0.5, 0.8],
  ])("high = %s low, w = %s: the set is the point 1 / (w + (1 - w) k), every candidate on it", (k, w) => {
    const s: Solution = solveOk({ low, high: times(low, k) }, { weight: w, steps: 5 });
    const b = 1 / (w + (1 - w) * k);
    expect(codes(s.diagnostics)).toContain("perfect-correlation");
    expectClose(s.bounds!.lowBeta.min, b, { rel: 1e-14 });
    expect(s.bounds!.lowBeta.max).toBe(s.bounds!.lowBeta.min);
    expect(s.bounds!.highBeta.max).toBe(s.bounds!.highBeta.min);
    expectClose(s.bounds!.highBeta.min, k * b, { rel: 1e-14 });
    for (const c of [...s.grid, s.landmarks!.lowNoiseFree, s.landmarks!.equalNoise, s.landmarks!.capmConsistent]) {
      expect(c).toEqual(s.grid[0]);
      expect(c.lowNoiseVariance).toBe(0);
      expect(c.highNoiseVariance).toBe(0);
      expect(c.noiseShare).toBeNull();
      expect(c.insideSet).toBe(true);
    }
    // The CAPM beta of a book on a proxy it is proportional to is its structural beta (§1.5).
    expectClose(s.capm.low.beta, b, { rel: 1e-12 });
    expect(nonFinite(s)).toEqual([]);
  });

  test("its uncertainty is finite; Stoye with zero standard errors falls back to Imbens-Manski, named so; the bootstrap too", () => {
    const u = ok(assessUncertainty({ low, high: Float64Array.from(low) }, { interval: "stoye", bootstrap: { replicates: 200 } }));
    expect(nonFinite(u)).toEqual([]);
    expect(u.lowBeta!.interval.method).toBe("imbens-manski");
    expect(u.capm.low.hac.alphaStdErr).toBe(0);
    expect(u.capm.hac.bandwidth).toBe(0);
    expect(u.capm.hac.lags).toBe(0);
    const viaBootstrap = ok(
      assessUncertainty({ low, high: times(low, 2) }, { interval: "stoye", intervalSource: "bootstrap", bootstrap: { replicates: 200 } }),
    );
    expect(nonFinite(viaBootstrap)).toEqual([]);
  });
});

describe("degenerate estimating functions and resamples", () => {
  test("HAC of identically zero residuals: a zero covariance at lag 0 with the bandwidth reported as 0, for every rule", () => {
    const x = Float64Array.from(sample.low);
    const design = [new Float64Array(x.length).fill(1), x];
    for (const options of [{}, { bandwidth: "andrews-1991" as const }, { kernel: "quadratic-spectral" as const }, { prewhite: true }]) {
      const h = hacCovariance(design, new Float64Array(x.length), options);
      expect(h.covariance.flat()).toEqual([0, 0, 0, 0]);
      expect(h.bandwidth).toBe(0);
      expect(h.prewhite).toBe(false);
    }
  });

  test("prewhitening collinear series is skipped (prewhite false) and the long-run covariance stays finite", () => {
    const x = Float64Array.from(sample.low);
    const lr = longRunCovariance([x, times(x, 2), times(x, -3)], { prewhite: true });
    expect(lr.prewhite).toBe(false);
    expect(lr.covariance.flat().every(Number.isFinite)).toBe(true);
    expect(longRunCovariance([x, Float64Array.from(sample.high)], { prewhite: true }).prewhite).toBe(true);
  });

  test("a resample with a constant book gives undefined statistics (NaN), never infinite ones, and summaries skip them", () => {
    const out = new Float64Array(quantityCount);
    writeStatistics({ n: 10, weight: 0.5, lowMean: 0.01, highMean: 0.02, lowVariance: 0, highVariance: 1e-4, covariance: 0 }, out, 0, 1);
    expect(Array.from(out).some((v) => v === Infinity || v === -Infinity)).toBe(false);
    const draws = new Float64Array(quantityCount * 3).fill(0.5);
    draws[0] = Infinity;
    draws[1] = Number.NaN;
    const summary = summariseBootstrap({ from: 0, to: 3, blockLength: 1, rows: 10, draws }, 1, 0.95);
    expect(summary.validReplicates.lowBetaMin).toBe(1);
    expect(summary.intervals.lowBetaMin).toBeNull();
  });

  test("a rolling window with a constant market or a negative covariance: rejected, correlations null where undefined, no NaN", () => {
    const n = 60;
    const low = Float64Array.from(sample.low.subarray(0, n));
    const high = Float64Array.from(sample.high.subarray(0, n), (h, t) => (t < 30 ? h : -low[t]!));
    const windows = rollSolve(low, high, 0, 0.5, { kind: "window", size: 12, step: 6 });
    const constantMarket = windows.filter((w) => w.start >= 30);
    expect(constantMarket.length).toBeGreaterThan(0);
    for (const w of constantMarket) {
      expect(codes(w.diagnostics)).toEqual(["zero-variance"]);
      expect(momentsFromSummary(w.summary).correlation.lowMarket).toBeNull();
    }
    expect(nonFinite(windows.map((w) => ({ ...w, moments: momentsFromSummary(w.summary) })))).toEqual([]);
  });
});
