import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { welfordCrossProducts, excessCrossProducts } from "../../src/core/moments.js";
import { CHUNK } from "../../src/core/moments.js";
import { excessResidualSums, residualSumOfSquares } from "../../src/core/regression.js";
import { normals } from "../support/random.js";

const finite = fc.double({ min: -1e3, max: 1e3, noNaN: true, noDefaultInfinity: true });
const rowsOf = (width: number) => fc.array(fc.array(finite, { minLength: width, maxLength: width }), { minLength: 1, maxLength: 60 });
const columnOf = (rows: number[][], i: number): number[] => rows.map((r) => r[i]!);

describe("welfordCrossProducts", () => {
  it("gives the same bits from the unrolled three-series path (Float64Array) and the general path", () => {
    fc.assert(
      fc.property(rowsOf(3), (rows) => {
        const columns = [0, 1, 2].map((i) => columnOf(rows, i));
        const unrolled = welfordCrossProducts(columns.map((c) => Float64Array.from(c)));
        const general = welfordCrossProducts(columns); // plain arrays take the general loop
        expect(unrolled).toEqual(general); // toEqual compares numbers with Object.is: bit for bit
      }),
      { seed: 20261202, numRuns: 300 },
    );
  });

  it("gives the same bits from the two-series path (Float64Array) and the general path, across chunks", () => {
    fc.assert(
      fc.property(rowsOf(2), (rows) => {
        const columns = [0, 1].map((i) => columnOf(rows, i));
        expect(welfordCrossProducts(columns.map((c) => Float64Array.from(c)))).toEqual(welfordCrossProducts(columns));
      }),
      { seed: 20261204, numRuns: 300 },
    );
    const z = normals(7);
    const long = [0, 1].map((i) => Array.from({ length: 2 * CHUNK + 5 }, () => 1e-3 * (i + 1) * z() + 0.5));
    expect(welfordCrossProducts(long.map((c) => Float64Array.from(c)))).toEqual(welfordCrossProducts(long));
  });
});

describe("the excess passes of solve (series formed on the fly)", () => {
  const weight = fc.double({ min: 0.01, max: 0.99, noNaN: true });
  // Each case: rows of (low, high, rf), the weight, and whether rf is one number (the first row's) or a series.
  const cases = fc.tuple(rowsOf(3), weight, fc.boolean());

  /** The three excess series built first, as solve did before the fused passes. */
  function built(rows: number[][], w: number, constantRate: boolean) {
    const rf = constantRate ? rows[0]![2]! : Float64Array.from(columnOf(rows, 2));
    const rate = (t: number): number => (typeof rf === "number" ? rf : rf[t]!);
    const low = Float64Array.from(rows, (r, t) => r[0]! - rate(t));
    const high = Float64Array.from(rows, (r, t) => r[1]! - rate(t));
    const market = Float64Array.from(low, (l, t) => w * l + (1 - w) * high[t]!);
    return { rf, low, high, market, raw: { low: Float64Array.from(columnOf(rows, 0)), high: Float64Array.from(columnOf(rows, 1)) } };
  }

  it("excessCrossProducts equals welfordCrossProducts of the built series bit for bit", () => {
    fc.assert(
      fc.property(cases, ([rows, w, constantRate]) => {
        const { rf, low, high, market, raw } = built(rows, w, constantRate);
        expect(excessCrossProducts(raw.low, raw.high, rf, w)).toEqual(welfordCrossProducts([low, high, market]));
      }),
      { seed: 20261203, numRuns: 300 },
    );
  });

  it("excessResidualSums equals residualSumOfSquares of each fit on the built series bit for bit", () => {
    fc.assert(
      fc.property(
        cases,
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.double({ min: -3, max: 3, noNaN: true }),
        ([rows, w, constantRate], lowBeta, highBeta) => {
          const { rf, low, high, market, raw } = built(rows, w, constantRate);
          const cp = welfordCrossProducts([low, high, market]);
          const [xbar, lowBar, highBar] = [cp.means[2]!, cp.means[0]!, cp.means[1]!];
          const sums = excessResidualSums(
            raw.low,
            raw.high,
            rf,
            w,
            xbar,
            { ybar: lowBar, beta: lowBeta },
            { ybar: highBar, beta: highBeta },
          );
          expect(sums).toEqual([
            residualSumOfSquares(market, low, xbar, lowBar, lowBeta),
            residualSumOfSquares(market, high, xbar, highBar, highBeta),
          ]);
        },
      ),
      { seed: 20261204, numRuns: 300 },
    );
  });

  it("refuses series of different lengths", () => {
    expect(() => excessCrossProducts([1, 2, 3], [1, 2], 0, 0.5)).toThrow(RangeError);
    expect(() => excessCrossProducts([1, 2, 3], [1, 2, 3], [0, 0], 0.5)).toThrow(RangeError);
  });
});

/**
 * The passes above take their rows in chunks of CHUNK (1,024) rows; the short samples above never
 * reach a second chunk. Here the samples run to a few thousand rows, so every case crosses at least
 * one chunk boundary, and the chunked passes must still equal the plain ones bit for bit.
 */
describe("the chunked passes across chunk boundaries", () => {
  /** n rows of returns (low, high, rf) drawn from a seeded normal generator at a given scale and level. */
  function sample(n: number, seed: number, scale: number, level: number) {
    const z = normals(seed);
    const low = new Float64Array(n);
    const high = new Float64Array(n);
    const rf = new Float64Array(n);
    for (let t = 0; t < n; t++) {
      low[t] = level + scale * z();
      high[t] = level + 1.5 * scale * z();
      rf[t] = 0.0001 + 1e-6 * z();
    }
    return { low, high, rf };
  }
  const lengths = fc.oneof(
    fc.constantFrom(CHUNK - 1, CHUNK, CHUNK + 1, 2 * CHUNK - 1, 2 * CHUNK, 2 * CHUNK + 1, 3 * CHUNK + 7),
    fc.integer({ min: CHUNK + 1, max: 4 * CHUNK }),
  );
  const cases = fc.record({
    n: lengths,
    seed: fc.integer({ min: 1, max: 2 ** 31 - 1 }),
    scale: fc.constantFrom(1e-4, 0.01, 1, 1e3),
    level: fc.constantFrom(0, 0.05, 100),
    weight: fc.double({ min: 0.01, max: 0.99, noNaN: true }),
    constantRate: fc.boolean(),
  });

  it("excessCrossProducts equals welfordCrossProducts of the built series bit for bit", () => {
    fc.assert(
      fc.property(cases, ({ n, seed, scale, level, weight, constantRate }) => {
        const { low, high, rf } = sample(n, seed, scale, level);
        const rate = (t: number): number => (constantRate ? rf[0]! : rf[t]!);
        const lowX = Float64Array.from(low, (x, t) => x - rate(t));
        const highX = Float64Array.from(high, (x, t) => x - rate(t));
        const market = Float64Array.from(lowX, (l, t) => weight * l + (1 - weight) * highX[t]!);
        const chunked = excessCrossProducts(low, high, constantRate ? rf[0]! : rf, weight);
        expect(chunked).toEqual(welfordCrossProducts([lowX, highX, market])); // unrolled path, chunked
        expect(chunked).toEqual(welfordCrossProducts([Array.from(lowX), Array.from(highX), Array.from(market)])); // general loop, one pass
      }),
      { seed: 20261205, numRuns: 40 },
    );
  });

  it("excessResidualSums equals residualSumOfSquares on the built series bit for bit", () => {
    fc.assert(
      fc.property(cases, fc.double({ min: -3, max: 3, noNaN: true }), ({ n, seed, scale, level, weight, constantRate }, beta) => {
        const { low, high, rf } = sample(n, seed, scale, level);
        const rate = (t: number): number => (constantRate ? rf[0]! : rf[t]!);
        const lowX = Float64Array.from(low, (x, t) => x - rate(t));
        const highX = Float64Array.from(high, (x, t) => x - rate(t));
        const market = Float64Array.from(lowX, (l, t) => weight * l + (1 - weight) * highX[t]!);
        const cp = welfordCrossProducts([lowX, highX, market]);
        const [xbar, lowBar, highBar] = [cp.means[2]!, cp.means[0]!, cp.means[1]!];
        const sums = excessResidualSums(
          low,
          high,
          constantRate ? rf[0]! : rf,
          weight,
          xbar,
          { ybar: lowBar, beta },
          { ybar: highBar, beta: 2 - beta },
        );
        expect(sums).toEqual([
          residualSumOfSquares(market, lowX, xbar, lowBar, beta),
          residualSumOfSquares(market, highX, xbar, highBar, 2 - beta),
        ]);
      }),
      { seed: 20261206, numRuns: 40 },
    );
  });
});
