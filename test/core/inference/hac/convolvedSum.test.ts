/**
 * Kernel sums by fast convolution (src/core/inference/hac/convolvedSum.ts) against the quadratic
 * spectral sum in exact rational arithmetic (test/fixtures/inference/spectral.json, generate_spectral.py),
 * against the lag-by-lag sum (kernelSum.ts weightedAutocovarianceSum, itself checked against R sandwich in
 * hac.sandwich.test.ts), and the quadratic spectral weights' early stop against the scan of every lag.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CONVOLUTION_FROM, convolvedAutocovarianceSum, usesConvolution } from "../../../../src/core/inference/hac/convolvedSum.js";
import { kernelSum, weightedAutocovarianceSum } from "../../../../src/core/inference/hac/kernelSum.js";
import { kernelValue, lagWeights, weightTolerance } from "../../../../src/core/inference/hac/kernels.js";
import type { Matrix } from "../../../../src/core/numerics/linearAlgebra.js";
import { createRandom } from "../../../../src/core/numerics/rng.js";
import { fixtureText } from "../fixtures.js";

/** k columns of n rows: AR(1) with coefficient phi, the columns correlated through a shared draw. */
function series(n: number, k: number, phi: number, seed: number): Float64Array[] {
  const random = createRandom(seed);
  const columns = Array.from({ length: k }, () => new Float64Array(n));
  const last = new Array<number>(k).fill(0);
  for (let t = 0; t < n; t++) {
    const shared = random.normal();
    for (let a = 0; a < k; a++) {
      last[a] = phi * last[a]! + random.normal() + 0.5 * shared;
      columns[a]![t] = last[a]!;
    }
  }
  return columns;
}

/** The largest gap of an entry (a, b) over sqrt(|expected_aa expected_bb|), the scale of its columns. */
function relativeGap(got: Matrix, expected: Matrix): number {
  let gap = 0;
  expected.forEach((row, a) => {
    row.forEach((value, b) => {
      gap = Math.max(gap, Math.abs(got[a]![b]! - value) / Math.sqrt(Math.abs(row[a]! * expected[b]![b]!)));
    });
  });
  return gap;
}

describe("kernel sums by fast convolution", () => {
  it("give the quadratic spectral sum of exact rational arithmetic (n = 3000, S = 3.7) to 1e-14 of each entry's scale", () => {
    const fixture = JSON.parse(fixtureText("spectral.json")).kernelSum as {
      bandwidth: number;
      weightCount: number;
      columns: string[][];
      sum: Matrix;
    };
    const columns = [0, 1].map((a) => Float64Array.from(fixture.columns, (row) => Number(row[a])));
    const weights = lagWeights("quadratic-spectral", fixture.bandwidth, columns[0]!.length);
    expect(weights.length).toBe(fixture.weightCount);
    expect(usesConvolution(columns[0]!.length, weights.length)).toBe(true);
    expect(relativeGap(convolvedAutocovarianceSum(columns, weights), fixture.sum)).toBeLessThan(1e-14);
    expect(relativeGap(weightedAutocovarianceSum(columns, weights), fixture.sum)).toBeLessThan(1e-14);
  });

  it("give the lag-by-lag sum to 1e-13 of each entry's scale for 1 to 5 columns of scales 1e-8 to 1e8, any weights, shorter or longer than the series", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 3000 }),
        fc.integer({ min: 1, max: 5 }),
        fc.integer({ min: 1, max: 4000 }),
        fc.integer({ min: 1, max: 1e6 }),
        (n, k, weightCount, seed) => {
          const random = createRandom(seed, 1);
          // Columns of very different sizes share a transform: each is scaled before it does.
          const columns = series(n, k, 0.7, seed).map((column) => column.map((x) => x * 10 ** Math.round(16 * random.uniform() - 8)));
          const weights = Float64Array.from({ length: weightCount }, (_, j) => (j === 0 ? 1 : random.normal() / (1 + j)));
          expect(relativeGap(convolvedAutocovarianceSum(columns, weights), weightedAutocovarianceSum(columns, weights))).toBeLessThan(
            1e-13,
          );
        },
      ),
      { numRuns: 60, seed: 20261205 },
    );
  });

  it("leave the entries of finite columns finite when another column holds NaN or an infinity", () => {
    const columns = series(2000, 3, 0.5, 9);
    columns[1]![700] = Number.NaN;
    const weights = lagWeights("quadratic-spectral", 4, 2000);
    const got = convolvedAutocovarianceSum(columns, weights);
    const direct = weightedAutocovarianceSum(columns, weights);
    for (const [a, b] of [
      [0, 0],
      [0, 2],
      [2, 0],
      [2, 2],
    ] as const) {
      expect(Math.abs(got[a]![b]! - direct[a]![b]!)).toBeLessThan(1e-13 * Math.abs(direct[0]![0]!));
    }
    for (let a = 0; a < 3; a++) expect([got[a]![1], got[1]![a]].every(Number.isNaN)).toBe(true);
    columns[1]![700] = Number.POSITIVE_INFINITY;
    expect(Number.isFinite(convolvedAutocovarianceSum(columns, weights)[0]![2])).toBe(true);
  });

  it("are what kernelSum uses for the quadratic spectral kernel once lag by lag would take more than CONVOLUTION_FROM products", () => {
    expect(usesConvolution(2048, 2048)).toBe(false);
    expect(usesConvolution(2049, 2048)).toBe(true);
    expect(usesConvolution(CONVOLUTION_FROM, 1)).toBe(false);
    const columns = series(6000, 2, 0.8, 4);
    const options = { kernel: "quadratic-spectral" as const, bandwidth: 6, prewhite: false };
    const sum = kernelSum(columns, options, [1, 1]);
    const weights = lagWeights("quadratic-spectral", 6, 6000);
    expect(usesConvolution(6000, weights.length)).toBe(true);
    expect(relativeGap(sum.sum, weightedAutocovarianceSum(columns, weights))).toBeLessThan(1e-13);
    expect(sum.sum).toEqual(convolvedAutocovarianceSum(columns, weights));
  });
});

describe("the quadratic spectral weights", () => {
  it("stop where a scan of every lag ends: the last weight above 1e-7 in absolute value", () => {
    for (const bandwidth of [0.01, 0.3, 1, 2.7, 13.5, 60]) {
      for (const n of [1, 5, 900, 40_000, 200_000]) {
        let last = 0;
        for (let j = 0; j < n; j++) if (Math.abs(kernelValue("quadratic-spectral", j / bandwidth)) > weightTolerance) last = j;
        const weights = lagWeights("quadratic-spectral", bandwidth, n);
        expect(weights.length, `S = ${bandwidth}, n = ${n}`).toBe(last + 1);
        weights.forEach((w, j) => expect(Object.is(w, kernelValue("quadratic-spectral", j / bandwidth))).toBe(true));
      }
    }
  });
});
