/**
 * The pre-lag autocovariances' WebAssembly kernel (src/core/inference/hac/autocovarianceKernel.ts)
 * against the definition written out here (each block's sum from 0, rows in order, as a pass per lag
 * would) and against the JavaScript loop, bit for bit (`Object.is`), non-finite values included.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { autocovarianceKernel, MAX_KERNEL_LAGS } from "../../../../src/core/inference/hac/autocovarianceKernel.js";
import { autocovarianceSums, BLOCK_ROWS, weightedAutocovarianceSums } from "../../../../src/core/inference/hac/bandwidth.js";
import { createRandom } from "../../../../src/core/numerics/rng.js";

/** n rows: normal draws, with `specials` of them replaced by values that test the arithmetic's edges. */
function series(n: number, seed: number, specials = 0): Float64Array {
  const random = createRandom(seed);
  const f = Float64Array.from({ length: n }, () => random.normal());
  const odd = [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, -0, 0, 1e300, -1e-320, 5e-324];
  for (let i = 0; i < specials; i++) f[Math.floor(random.uniform() * n)] = odd[i % odd.length]!;
  return f;
}

/** The definition: per lag, per block of BLOCK_ROWS rows, the products from 0 in row order, blocks added. */
function definition(f: Float64Array, lags: number): number[] {
  const n = f.length;
  return Array.from({ length: lags + 1 }, (_, j) => {
    let total = 0;
    for (let start = 0; start < n; start += BLOCK_ROWS) {
      let block = 0;
      for (let t = start; t < Math.min(n, start + BLOCK_ROWS) && t + j < n; t++) block += f[t]! * f[t + j]!;
      total += block;
    }
    return total;
  });
}

const sameBits = (got: ArrayLike<number>, expected: ArrayLike<number>): void => {
  expect(got.length).toBe(expected.length);
  for (let j = 0; j < expected.length; j++) expect(Object.is(got[j], expected[j]), `lag ${j}: ${got[j]} vs ${expected[j]}`).toBe(true);
};

describe("the pre-lag autocovariances' WebAssembly kernel", () => {
  it("is used on Node 20 for the lags it has room for, and not beyond them", () => {
    expect(autocovarianceKernel(30, BLOCK_ROWS)).not.toBeNull();
    expect(autocovarianceKernel(MAX_KERNEL_LAGS, BLOCK_ROWS)).not.toBeNull();
    expect(autocovarianceKernel(MAX_KERNEL_LAGS + 1, BLOCK_ROWS)).toBeNull();
    // Beyond the kernel, the JavaScript loop gives the definition.
    const f = series(3000, 7);
    sameBits(autocovarianceSums(f, MAX_KERNEL_LAGS + 5), definition(f, MAX_KERNEL_LAGS + 5));
  });

  it("gives the definition's bits at every lag count around its groups of eight and every length around a block", () => {
    const lengths = fc.oneof(fc.integer({ min: 1, max: 40 }), fc.integer({ min: BLOCK_ROWS - 12, max: 2 * BLOCK_ROWS + 80 }));
    fc.assert(
      fc.property(lengths, fc.integer({ min: 0, max: 70 }), fc.integer({ min: 1, max: 1e6 }), (n, lags, seed) => {
        const f = series(n, seed);
        const lagCount = Math.min(lags, n - 1);
        sameBits(autocovarianceSums(f, lagCount), definition(f, lagCount));
      }),
      { numRuns: 200, seed: 20261205 },
    );
  });

  it("gives the JavaScript loop's bits with NaN, infinities, signed zeros, overflow and subnormals in the rows", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5000 }), fc.integer({ min: 0, max: 50 }), fc.integer({ min: 1, max: 1e6 }), (n, lags, seed) => {
        const f = series(n, seed, 1 + (seed % 9));
        const lagCount = Math.min(lags, n - 1);
        sameBits(autocovarianceSums(f, lagCount), autocovarianceSums(f, lagCount, false));
        const g = series(n, seed + 1, seed % 3);
        const weights = [0.5, 0, -2];
        const columns = [f, g, f];
        sameBits(weightedAutocovarianceSums(columns, weights, lagCount), weightedAutocovarianceSums(columns, weights, lagCount, false));
      }),
      { numRuns: 150, seed: 20261205 },
    );
  });

  it("gives the same bits with columns filling its memory to the last double, and longer ones (a block at a time)", () => {
    // k weights, k columns, the series and 8 doubles of room: 2 + 3 x 38,226 + 8 doubles are exactly the
    // 114,688 from the third page to the end; one more row does not fit.
    for (const [n, k] of [
      [38_226, 2],
      [38_227, 2],
      [28_669, 3],
      [40_000, 2],
      [20_000, 6],
    ] as const) {
      const columns = Array.from({ length: k }, (_, a) => series(n, 40 + a, a));
      const weights = columns.map((_, a) => (a === 1 ? 0 : 0.25 * (a + 1)));
      sameBits(weightedAutocovarianceSums(columns, weights, 37), weightedAutocovarianceSums(columns, weights, 37, false));
    }
  });

  it("leaves nothing behind between calls (a long series, then a short one with fewer lags)", () => {
    const long = series(3 * BLOCK_ROWS + 5, 11);
    sameBits(autocovarianceSums(long, 60), definition(long, 60));
    const short = series(9, 12);
    sameBits(autocovarianceSums(short, 3), definition(short, 3));
    sameBits(weightedAutocovarianceSums([short], [0], 3), [0, 0, 0, 0]);
  });
});
