/**
 * The pricing assessment against an independent computation (test/fixtures/pricing/pricing_reference.py:
 * numpy numerical gradients of each statistic in the five moments times the Bartlett long-run
 * covariance of the moment contributions at lag 8; scipy's normal and bivariate normal for p-values).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { assessPricing } from "../../../src/core/pricing/assessPricing.js";
import { solveKeepingMoments } from "../../../src/core/solve.js";

type Reference = { low: number[]; high: number[] } & {
  [key in
    | "weight"
    | "lags"
    | "confidence"
    | "returnImplied"
    | "returnImpliedStdError"
    | "fiellerLower"
    | "fiellerUpper"
    | "d1"
    | "d2"
    | "d1StdError"
    | "d2StdError"
    | "correlation"
    | "statistic"
    | "pValue"
    | "explainedPValue"
    | "observedAlpha"
    | "explainableLow"
    | "explainableHigh"
    | "explainableLowStdError"
    | "explainableHighStdError"]: number;
};
const ref = JSON.parse(readFileSync(new URL("../../fixtures/pricing/pricing-reference.json", import.meta.url), "utf8")) as Reference;

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe("assessPricing against numpy/scipy (pricing_reference.py)", () => {
  const pricing = assessPricing(
    { low: ref.low, high: ref.high },
    { weight: ref.weight, confidence: ref.confidence, longRun: "hac", hac: { kernel: "bartlett", lags: ref.lags } },
  );
  if (pricing === null) throw new Error("no pricing");
  const tolerance = 1e-7; // the reference's gradients are central differences

  it("the return-implied beta, its delta-method standard error and Fieller's interval", () => {
    expect(relative(pricing.returnImplied.estimate ?? Number.NaN, ref.returnImplied)).toBeLessThan(1e-12);
    expect(relative(pricing.returnImplied.stdError ?? Number.NaN, ref.returnImpliedStdError)).toBeLessThan(tolerance);
    const fieller = pricing.returnImplied.fieller;
    expect(fieller.shape).toBe("bounded");
    if (fieller.shape !== "bounded") return;
    expect(relative(fieller.lower, ref.fiellerLower)).toBeLessThan(tolerance);
    expect(relative(fieller.upper, ref.fiellerUpper)).toBeLessThan(tolerance);
  });

  it("the test's t statistics, correlation, statistic and p-values", () => {
    const test = pricing.test;
    if (test === null) throw new Error("no test");
    expect(relative(test.tStats[0], ref.d1 / ref.d1StdError)).toBeLessThan(tolerance);
    expect(relative(test.tStats[1], ref.d2 / ref.d2StdError)).toBeLessThan(tolerance);
    expect(relative(test.correlation, ref.correlation)).toBeLessThan(tolerance);
    expect(relative(test.statistic, ref.statistic)).toBeLessThan(tolerance);
    expect(relative(test.pValue, ref.pValue)).toBeLessThan(1e-6);
    expect(relative(test.explainedPValue, ref.explainedPValue)).toBeLessThan(1e-6);
    expect(test.verdict).toBe("not explained");
  });

  it("the alpha decomposition of the low book, and the high book's as -w/(1-w) times it", () => {
    const { low, high } = pricing.alpha;
    expect(relative(low.observed, ref.observedAlpha)).toBeLessThan(1e-12);
    expect(relative(low.explainableMin, ref.explainableLow)).toBeLessThan(1e-12);
    expect(relative(low.explainableMax, ref.explainableHigh)).toBeLessThan(1e-12);
    expect(relative(low.explainableMinStdError, ref.explainableLowStdError)).toBeLessThan(tolerance);
    expect(relative(low.explainableMaxStdError, ref.explainableHighStdError)).toBeLessThan(tolerance);
    expect(relative(low.unexplained, ref.observedAlpha - ref.explainableHigh)).toBeLessThan(1e-12);
    const k = ref.weight / (1 - ref.weight);
    expect(high.observed).toBeCloseTo(-k * low.observed, 15);
    expect(high.explainableMin).toBeCloseTo(-k * low.explainableMax, 15);
    expect(high.unexplained).toBeCloseTo(-k * low.unexplained, 15);
    expect(low.observedLower).toBeNull();
  });
});

describe("assessPricing with the point figures alone (solve --no-uncertainty)", () => {
  const options = {
    weight: ref.weight,
    confidence: ref.confidence,
    longRun: "hac" as const,
    hac: { kernel: "bartlett" as const, lags: ref.lags },
  };
  const full = assessPricing({ low: ref.low, high: ref.high }, options);
  const point = assessPricing({ low: ref.low, high: ref.high }, { ...options, pointOnly: true });

  it("keeps every point figure of the full assessment, bit for bit", () => {
    if (full === null || point === null) throw new Error("no pricing");
    expect(point.returnImplied.estimate).toBe(full.returnImplied.estimate);
    for (const book of ["low", "high"] as const) {
      const { observed, explainableMin, explainableMax, unexplained } = full.alpha[book];
      expect(point.alpha[book]).toMatchObject({ observed, explainableMin, explainableMax, unexplained });
    }
  });

  it("has no test and standard errors of 0 (the report shows none)", () => {
    if (point === null) throw new Error("no pricing");
    expect(point.test).toBeNull();
    expect(point.returnImplied.stdError).toBe(0);
    expect(point.alpha.low.explainableMinStdError).toBe(0);
  });
});

describe("assessPricing with the moments solve formed", () => {
  const sample = { low: ref.low, high: ref.high, riskFree: ref.low.map((_, t) => 0.0001 * (1 + (t % 3))) };
  const options = { weight: ref.weight, confidence: ref.confidence, longRun: "hac" as const, hac: {} };

  it("gives what its own pass over the rows gives, bit for bit, with and without standard errors", () => {
    const solved = solveKeepingMoments(sample, { weight: ref.weight });
    if (!solved.ok) throw new Error("solve failed");
    for (const pointOnly of [false, true]) {
      const own = assessPricing(sample, { ...options, pointOnly });
      const reused = assessPricing(sample, { ...options, pointOnly, solved: solved.value.moments });
      expect(own).not.toBeNull();
      expect(reused).toEqual(own);
    }
  });

  it("ignores moments formed for another sample or another weight", () => {
    const other = { ...sample, low: sample.low.map((x) => x * 1.5) };
    const otherSolved = solveKeepingMoments(other, { weight: ref.weight });
    const otherWeight = solveKeepingMoments(sample, { weight: 0.3 });
    if (!otherSolved.ok || !otherWeight.ok) throw new Error("solve failed");
    const own = assessPricing(sample, options);
    expect(assessPricing(sample, { ...options, solved: otherSolved.value.moments })).toEqual(own);
    expect(assessPricing(sample, { ...options, solved: otherWeight.value.moments })).toEqual(own);
  });

  it("uses the moments it is given for its sample and weight (no pass of its own then)", () => {
    const solved = solveKeepingMoments(sample, { weight: ref.weight });
    if (!solved.ok) throw new Error("solve failed");
    const { moments } = solved.value;
    // The same sample and weight with the low book's mean moved: only a step that reads them changes.
    const moved = {
      ...moments,
      crossProducts: { ...moments.crossProducts, means: [moments.crossProducts.means[0]! * 2, ...moments.crossProducts.means.slice(1)] },
    };
    const own = assessPricing(sample, options);
    const reused = assessPricing(sample, { ...options, solved: moved });
    expect(reused?.alpha.low.observed).not.toBe(own?.alpha.low.observed);
  });
});
