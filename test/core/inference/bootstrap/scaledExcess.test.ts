/**
 * The scaled excess returns (scaledExcessReturns, and excessReturnsScaledBy given the largest values
 * the argument check found) against the three passes written out here: the excess returns, their
 * largest absolute value, then each times the power of two that brings it into [1, 2). The same numbers.
 */
import { describe, expect, it } from "vitest";
import { excessReturnsScaledBy, scaledExcessReturns } from "../../../../src/core/inference/bootstrap/replicates.js";
import { largestValues } from "../../../../src/core/cancellation.js";
import { scaleFor } from "../../../../src/core/scaling.js";
import { normals } from "../../../support/random.js";

const same = (a: Float64Array, b: Float64Array) => a.length === b.length && a.every((v, i) => Object.is(v, b[i]));

describe("excess returns scaled by the largest values found", () => {
  const draw = normals(5);
  const n = 3000;
  const low = Float64Array.from({ length: n }, () => 0.01 * draw());
  const high = Float64Array.from({ length: n }, () => 0.02 * draw());
  const rates = Float64Array.from({ length: n }, (_, t) => 0.0001 * (1 + (t % 5)));
  for (const [name, riskFree, factor] of [
    ["no rate", undefined, 1],
    ["a constant rate", 0.0002, 1],
    ["a rate a period", rates, 1],
    ["excess returns at most in [1, 2): a scale of 1", rates, "one"],
    ["large returns: a scale below 1", rates, 1e6],
  ] as const) {
    it(`equal the three passes with ${name}`, () => {
      // "one": the books scaled so that their largest excess return is 1.5.
      const first = largestValues(low, high, riskFree ?? 0);
      const by = factor === "one" ? 1.5 / Math.max(first.low, first.high) : factor;
      const books = { low: low.map((x) => x * by), high: high.map((x) => x * by), weight: 0.5 };
      const data = riskFree === undefined ? books : { ...books, riskFree };
      const rate = (t: number) => (riskFree === undefined ? 0 : typeof riskFree === "number" ? riskFree : riskFree[t]!);
      const excessLow = data.low.map((x, t) => x - rate(t));
      const excessHigh = data.high.map((x, t) => x - rate(t));
      let largest = 0;
      for (let t = 0; t < n; t++) largest = Math.max(largest, Math.abs(excessLow[t]!), Math.abs(excessHigh[t]!));
      const scale = scaleFor(largest);
      expect(largest * scale).toBeGreaterThanOrEqual(1);
      expect(largest * scale).toBeLessThan(2);
      const expectedLow = excessLow.map((x) => x * scale);
      const expectedHigh = excessHigh.map((x) => x * scale);
      const extent = largestValues(data.low, data.high, riskFree ?? 0);
      const one = excessReturnsScaledBy(data, Math.max(extent.low, extent.high), (k) => new Float64Array(k).fill(Number.NaN));
      for (const found of [one, scaledExcessReturns(data)]) {
        expect(found.scale).toBe(scale);
        expect(same(found.low, expectedLow)).toBe(true);
        expect(same(found.high, expectedHigh)).toBe(true);
      }
      if (factor === "one") expect(scale).toBe(1);
    });
  }
});
