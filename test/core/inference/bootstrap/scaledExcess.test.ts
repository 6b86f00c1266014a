/**
 * The excess returns scaled in one pass from the largest values the argument check found
 * (excessReturnsScaledBy) against the three-pass form (scaledExcessReturns): the same numbers.
 */
import { describe, expect, it } from "vitest";
import { excessReturnsScaledBy, scaledExcessReturns } from "../../../../src/core/inference/bootstrap/replicates.js";
import { largestValues } from "../../../../src/core/cancellation.js";
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
    it(`equal scaledExcessReturns with ${name}`, () => {
      // "one": the books scaled so that their largest excess return is 1.5.
      const first = largestValues(low, high, riskFree ?? 0);
      const by = factor === "one" ? 1.5 / Math.max(first.low, first.high) : factor;
      const books = { low: low.map((x) => x * by), high: high.map((x) => x * by), weight: 0.5 };
      const data = riskFree === undefined ? books : { ...books, riskFree };
      const extent = largestValues(data.low, data.high, riskFree ?? 0);
      const one = excessReturnsScaledBy(data, Math.max(extent.low, extent.high), (k) => new Float64Array(k).fill(Number.NaN));
      const three = scaledExcessReturns(data);
      expect(one.scale).toBe(three.scale);
      if (factor === "one") expect(one.scale).toBe(1);
      expect(same(one.low, three.low)).toBe(true);
      expect(same(one.high, three.high)).toBe(true);
    });
  }
});
