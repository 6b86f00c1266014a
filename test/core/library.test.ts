/**
 * The library's entry points (betabound/core) check their arguments and return typed failures, with
 * stable codes, naming the argument, the position and the value: never a NaN result, a silently
 * rounded seed, an out-of-memory grid or an R^2 of 1 for no points.
 */

import { describe, expect, test } from "vitest";
import {
  assessUncertainty,
  compensatedSum,
  createRandom,
  crossProducts,
  type Diagnostic,
  fitLine,
  implied,
  maximumSteps,
  mean,
  type Result,
  sampleCovariance,
  sampleStdev,
  sampleVariance,
  simulateSample,
  solve,
} from "../../src/core/index.js";
import { expectClose } from "../support/close.js";
import { ok } from "./helpers.js";

/** The details of a failure (the test fails if the call succeeded). */
function refused<T>(result: Result<T, Diagnostic[]>): Diagnostic["detail"][] {
  expect(result.ok, "the call should have been refused").toBe(false);
  return result.ok ? [] : result.issues.map((d) => d.detail);
}

const low = [0.01, -0.02, 0.015, 0.004, -0.006, 0.012, 0.003, -0.011, 0.02, 0.001, -0.004, 0.007];
const high = [0.02, -0.035, 0.03, 0.001, -0.012, 0.02, 0.004, -0.02, 0.033, 0.005, -0.01, 0.011];
const structure = { lowBeta: 0.7, weight: 0.5, factorVol: 0.04, factorMean: 0.005, lowNoiseVol: 0.01, highNoiseVol: 0.02 };

describe("non-finite values and holes are refused, naming the argument, the index and the value", () => {
  const withNaN = [...low.slice(0, 3), Number.NaN, ...low.slice(4)];
  const withHole = [...low];
  delete withHole[5];
  const withInfinity = [...high.slice(0, 7), Number.POSITIVE_INFINITY, ...high.slice(8)];

  test("solve", () => {
    expect(refused(solve({ low: withNaN, high }))).toEqual([{ code: "invalid-number", argument: "low", index: 3, value: "NaN" }]);
    expect(refused(solve({ low: withHole, high }))).toEqual([
      { code: "invalid-number", argument: "low", index: 5, value: "a hole (no value)" },
    ]);
    expect(refused(solve({ low, high: withInfinity }))).toEqual([
      { code: "invalid-number", argument: "high", index: 7, value: "Infinity" },
    ]);
    expect(refused(solve({ low, high, riskFree: Number.NaN }))).toEqual([
      { code: "invalid-argument", argument: "riskFree", value: "NaN", expected: "a finite number" },
    ]);
    expect(refused(solve({ low, high: high.slice(1) }))).toEqual([{ code: "length-mismatch", argument: "high", length: 11, expected: 12 }]);
    const message = solve({ low: withNaN, high });
    expect(message.ok ? "" : message.issues[0]!.message).toBe("low[3] is NaN: every value must be a finite number");
  });

  test("the moments functions and compensatedSum", () => {
    expect(refused(mean(withNaN))).toEqual([{ code: "invalid-number", argument: "x", index: 3, value: "NaN" }]);
    expect(refused(sampleVariance(withHole))).toEqual([{ code: "invalid-number", argument: "x", index: 5, value: "a hole (no value)" }]);
    expect(refused(sampleStdev(withInfinity))).toEqual([{ code: "invalid-number", argument: "x", index: 7, value: "Infinity" }]);
    expect(refused(sampleCovariance(low, withInfinity))).toEqual([{ code: "invalid-number", argument: "y", index: 7, value: "Infinity" }]);
    expect(refused(crossProducts([low, withNaN]))).toEqual([{ code: "invalid-number", argument: "series[1]", index: 3, value: "NaN" }]);
    expect(refused(compensatedSum([1, 2, Number.NaN]))).toEqual([{ code: "invalid-number", argument: "values", index: 2, value: "NaN" }]);
    expect(refused(compensatedSum([1e308, 1e308]))).toMatchObject([{ code: "invalid-argument", argument: "values" }]);
    expect(refused(sampleCovariance(low, high.slice(2)))).toEqual([{ code: "length-mismatch", argument: "y", length: 10, expected: 12 }]);
  });

  test("fitLine, assessUncertainty", () => {
    expect(refused(fitLine(low, withNaN))).toEqual([{ code: "invalid-number", argument: "y", index: 3, value: "NaN" }]);
    expect(refused(assessUncertainty({ low: withHole, high }))).toEqual([
      { code: "invalid-number", argument: "low", index: 5, value: "a hole (no value)" },
    ]);
  });

  test("in Float64Arrays (the one-pass check of the largest values) every bad value is found and named as in arrays", () => {
    const f = (values: readonly number[]) => Float64Array.from(values);
    const rf = f(low.map(() => 0.0001));
    const at = (values: readonly number[], i: number, value: number) => f(values.map((v, t) => (t === i ? value : v)));
    const entries: ((sample: Parameters<typeof solve>[0]) => Result<unknown, Diagnostic[]>)[] = [solve, assessUncertainty];
    for (const assess of entries) {
      expect(refused(assess({ low: at(low, 3, Number.NaN), high: f(high) }))).toEqual([
        { code: "invalid-number", argument: "low", index: 3, value: "NaN" },
      ]);
      expect(refused(assess({ low: f(low), high: at(high, 11, Number.NEGATIVE_INFINITY), riskFree: rf }))).toEqual([
        { code: "invalid-number", argument: "high", index: 11, value: "-Infinity" },
      ]);
      // An infinite rate in both books' rows: low - rf and high - rf are NaN, the rate itself infinite.
      expect(refused(assess({ low: f(low), high: f(high), riskFree: at(rf.slice() as unknown as number[], 0, Infinity) }))).toEqual([
        { code: "invalid-number", argument: "riskFree", index: 0, value: "Infinity" },
      ]);
      // null is no rate: refused as in arrays, not read as 0.
      expect(refused(assess({ low: f(low), high: f(high), riskFree: null as unknown as number }))).toEqual(
        refused(assess({ low, high, riskFree: null as unknown as number })),
      );
      expect(refused(assess({ low: f(low), high: f(high), riskFree: null as unknown as number }))[0]).toMatchObject({
        code: "invalid-argument",
        argument: "riskFree",
      });
      expect(refused(assess({ low: f(low), high: f(high), riskFree: Number.POSITIVE_INFINITY }))).toEqual([
        { code: "invalid-argument", argument: "riskFree", value: "Infinity", expected: "a finite number" },
      ]);
      expect(refused(assess({ low: f(low), high: f(high.slice(1)) }))).toEqual([
        { code: "length-mismatch", argument: "high", length: 11, expected: 12 },
      ]);
      expect(refused(assess({ low: f(low), high: f(high), riskFree: rf.subarray(2) }))).toEqual([
        { code: "length-mismatch", argument: "riskFree", length: 10, expected: 12 },
      ]);
    }
    // A clean sample in Float64Arrays solves to the same numbers as in arrays.
    expect(solve({ low: f(low), high: f(high), riskFree: rf })).toEqual(solve({ low, high, riskFree: Array.from(rf) }));
  });

  test("a value that is not a number at all is named by its kind", () => {
    const text = [...low] as unknown as number[];
    (text as unknown[])[2] = "0.01";
    expect(refused(solve({ low: text, high }))).toEqual([
      { code: "invalid-number", argument: "low", index: 2, value: 'the string "0.01"' },
    ]);
  });
});

describe("sizes and counts have limits and too few values are a failure, not a number", () => {
  test("fitLine([], []) and two points are too few (not R^2 = 1); a constant x has no slope", () => {
    expect(refused(fitLine([], []))).toEqual([{ code: "too-few-observations", observations: 0, minimum: 3 }]);
    expect(refused(fitLine([1, 2], [3, 5]))).toEqual([{ code: "too-few-observations", observations: 2, minimum: 3 }]);
    expect(refused(fitLine([2, 2, 2], [1, 2, 3]))).toEqual([{ code: "zero-variance", series: "x" }]);
  });

  test("a mean needs one value, a variance or covariance two", () => {
    expect(refused(mean([]))).toEqual([{ code: "too-few-observations", observations: 0, minimum: 1 }]);
    expect(refused(sampleVariance([0.01]))).toEqual([{ code: "too-few-observations", observations: 1, minimum: 2 }]);
    expect(refused(sampleCovariance([0.01], [0.02]))).toEqual([{ code: "too-few-observations", observations: 1, minimum: 2 }]);
    expect(refused(assessUncertainty({ low: low.slice(0, 9), high: high.slice(0, 9) }))).toEqual([
      { code: "too-few-observations", observations: 9, minimum: 10 },
    ]);
  });

  test("steps beyond maximumSteps are refused at once (1e9 would exhaust memory), by solve and implied", () => {
    expect(refused(solve({ low, high }, { steps: 1e9 }))).toMatchObject([
      { code: "invalid-argument", argument: "steps", value: "1000000000" },
    ]);
    expect(refused(implied(structure, 1e9))).toMatchObject([{ code: "invalid-argument", argument: "steps" }]);
    expect(ok(solve({ low, high }, { steps: maximumSteps })).grid).toHaveLength(maximumSteps);
    expect(refused(solve({ low, high }, { steps: 2.5 }))).toMatchObject([{ code: "invalid-argument", argument: "steps" }]);
  });

  test("weights and confidence levels outside their ranges are refused in the option table's words", () => {
    const [weight] = refused(solve({ low, high }, { weight: 1e-17 }));
    expect(weight).toEqual({ code: "invalid-argument", argument: "weight", value: "1e-17", expected: "a number >= 0.0001 and <= 0.9999" });
    expect(refused(assessUncertainty({ low, high }, { confidence: 0.9999999999999999 }))).toMatchObject([
      { code: "invalid-argument", argument: "confidence", expected: "a number >= 0.5 and <= 0.9999" },
    ]);
    expect(refused(implied({ ...structure, lowBeta: 2 }, 3))).toMatchObject([{ code: "invalid-argument", argument: "lowBeta" }]);
  });
});

describe("seeds and periods must be whole numbers", () => {
  test("simulateSample with seed 1.5 or periods NaN is refused (not a silently rounded or empty sample)", () => {
    expect(refused(simulateSample(structure, { periods: 12, seed: 1.5 }))).toMatchObject([
      { code: "invalid-argument", argument: "seed", value: "1.5" },
    ]);
    expect(refused(simulateSample(structure, { periods: Number.NaN, seed: 1 }))).toMatchObject([
      { code: "invalid-argument", argument: "periods", value: "NaN" },
    ]);
    expect(refused(simulateSample(structure, { periods: 12, seed: 1, garch: { alpha: 0.5, beta: 0.5 } }))).toMatchObject([
      { code: "invalid-argument", argument: "garch" },
    ]);
    expect(refused(simulateSample({ ...structure, factorVol: Number.POSITIVE_INFINITY }, { periods: 12, seed: 1 }))).toMatchObject([
      { code: "invalid-argument", argument: "factorVol" },
    ]);
    const drawn = ok(simulateSample(structure, { periods: 12, seed: 7 }));
    expect(drawn.low).toHaveLength(12);
  });

  test("createRandom with a seed that is not a whole number is a programming error (RangeError), not seed 1", () => {
    expect(() => createRandom(1.5)).toThrow(RangeError);
    expect(() => createRandom(1, -1)).toThrow(RangeError);
    expect(createRandom(1).uniform()).toBe(createRandom(1).uniform());
  });
});

describe("valid arguments give the same numbers as before the checks", () => {
  test("the moments of a small sample: closed forms (mean 3.5, variance 3.5 of 1..6; covariance of x and 2x = 2 var)", () => {
    const x = [1, 2, 3, 4, 5, 6];
    expect(ok(mean(x))).toBe(3.5);
    expect(ok(sampleVariance(x))).toBe(3.5);
    expectClose(ok(sampleStdev(x)), Math.sqrt(3.5), { rel: 1e-15 });
    expect(
      ok(
        sampleCovariance(
          x,
          x.map((v) => 2 * v),
        ),
      ),
    ).toBe(7);
    expect(ok(crossProducts([x, x])).sums[0]![1]).toBe(17.5);
    expect(ok(compensatedSum([1e16, 1, -1e16]))).toBe(1);
  });

  test("fitLine through exact points: y = 1 + 2x has alpha 1, beta 2, R^2 1 and zero residuals", () => {
    const fit = ok(fitLine([1, 2, 3, 4], [3, 5, 7, 9]));
    expect(fit.alpha).toBe(1);
    expect(fit.beta).toBe(2);
    expect(fit.rSquared).toBe(1);
    expect(fit.residualSumOfSquares).toBe(0);
  });

  test("moments of values of 1e-90 are those of the unscaled values in their units", () => {
    const scaled = low.map((v) => v * 1e-90);
    expectClose(ok(sampleVariance(scaled)), ok(sampleVariance(low)) * 1e-180, { rel: 1e-13 });
    const fit = ok(
      fitLine(
        low,
        scaled.map((v, t) => v + 1e-92 * high[t]!),
      ),
    );
    expectClose(
      fit.beta,
      ok(
        fitLine(
          low,
          low.map((v, t) => v + 1e-2 * high[t]!),
        ),
      ).beta * 1e-90,
      { rel: 1e-12 },
    );
    expect(refused(sampleVariance(low.map((v) => v * 1e-300)))).toMatchObject([{ code: "invalid-argument", argument: "x" }]);
  });
});
