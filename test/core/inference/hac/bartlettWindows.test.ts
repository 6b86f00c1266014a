/**
 * The Bartlett sum from window sums (src/core/inference/hac/bartlettWindows.ts) against its
 * definition: the double sum over all pairs of rows, sum_{s,r} (1 - |s - r|/S)_+ u_s u_r' (written
 * out here, independently of the code), and the lag-by-lag sum the tool used before (kernelSum.ts).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { autocovarianceSums, BLOCK_ROWS, weightedAutocovarianceSums } from "../../../../src/core/inference/hac/bandwidth.js";
import { bartlettKernelSum } from "../../../../src/core/inference/hac/bartlettWindows.js";
import { weightedAutocovarianceSum } from "../../../../src/core/inference/hac/kernelSum.js";
import { lagWeights } from "../../../../src/core/inference/hac/kernels.js";
import { createRandom } from "../../../../src/core/numerics/rng.js";
import { addScaledInto, scaledInto } from "../../../../src/core/numerics/seriesLoops.js";

/** The definition, O(n^2): every pair of rows with its Bartlett weight. */
function pairSum(columns: readonly Float64Array[], bandwidth: number): number[][] {
  const k = columns.length;
  const n = columns[0]!.length;
  return Array.from({ length: k }, (_, a) =>
    Array.from({ length: k }, (_, b) => {
      let total = 0;
      for (let s = 0; s < n; s++) {
        for (let r = 0; r < n; r++) {
          const weight = 1 - Math.abs(s - r) / bandwidth;
          if (weight > 0) total += weight * columns[a]![s]! * columns[b]![r]!;
        }
      }
      return total;
    }),
  );
}

function series(n: number, k: number, seed: number, shift = 0): Float64Array[] {
  const random = createRandom(seed);
  return Array.from({ length: k }, () => {
    const column = new Float64Array(n);
    let previous = 0;
    for (let t = 0; t < n; t++) {
      previous = 0.6 * previous + random.normal();
      column[t] = previous + shift;
    }
    return column;
  });
}

function expectClose(actual: number[][], expected: number[][], tolerance: number): void {
  const scale = Math.max(...expected.flat().map(Math.abs));
  actual.forEach((row, a) => {
    row.forEach((value, b) => expect(Math.abs(value - expected[a]![b]!)).toBeLessThanOrEqual(tolerance * scale));
  });
}

describe("the Bartlett sum from window sums", () => {
  it("equals the pair-by-pair definition for integer and real bandwidths, below and above n", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 60 }),
        fc.integer({ min: 1, max: 4 }),
        fc.double({ min: 0.05, max: 80, noNaN: true }),
        fc.boolean(),
        fc.integer({ min: 1, max: 1_000_000 }),
        (n, k, real, whole, seed) => {
          const bandwidth = whole ? Math.max(1, Math.round(real)) : real;
          const columns = series(n, k, seed, seed % 3 === 0 ? 5 : 0);
          expectClose(bartlettKernelSum(columns, bandwidth), pairSum(columns, bandwidth), 1e-12);
        },
      ),
      { numRuns: 300, seed: 20261203 },
    );
  });

  it("agrees with the lag-by-lag sum to 1e-12 on long series (n = 100,000, k = 5, 60 lags)", () => {
    const columns = series(100_000, 5, 7);
    for (const bandwidth of [1, 2, 17, 61, 60.4]) {
      const weights = lagWeights("bartlett", bandwidth, columns[0]!.length);
      expectClose(bartlettKernelSum(columns, bandwidth), weightedAutocovarianceSum(columns, weights), 1e-12);
    }
  });

  it("is symmetric and refuses a bandwidth that is not positive", () => {
    const sum = bartlettKernelSum(series(50, 3, 3), 4.5);
    for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) expect(sum[a]![b]).toBe(sum[b]![a]);
    expect(() => bartlettKernelSum(series(5, 1, 1), 0)).toThrow(RangeError);
    expect(() => bartlettKernelSum(series(5, 1, 1), Number.NaN)).toThrow(RangeError);
  });

  it("within pairs of columns: the whole sum's entries there, bit for bit, and NaN elsewhere", () => {
    const pairs = [
      [0, 1],
      [2, 3],
      [4, 5],
    ] as const;
    for (const [n, bandwidth] of [
      [3000, 7],
      [3000, 328.6],
      [1500, 1.5],
      [40, 90.25],
    ] as const) {
      const columns = series(n, 6, n + Math.round(bandwidth), 0.1);
      const whole = bartlettKernelSum(columns, bandwidth);
      const part = bartlettKernelSum(columns, bandwidth, pairs);
      const inside = (a: number, b: number) => pairs.some(([x, y]) => (a === x || a === y) && (b === x || b === y));
      for (let a = 0; a < 6; a++)
        for (let b = 0; b < 6; b++) {
          if (inside(a, b)) expect(Object.is(part[a]![b], whole[a]![b])).toBe(true);
          else expect(part[a]![b]).toBeNaN();
        }
    }
    // Any length around the blocks of 1,024 windows, and bandwidths whose two widths straddle a
    // block's end: bit for bit.
    fc.assert(
      fc.property(
        fc.oneof(fc.integer({ min: 1, max: 60 }), fc.integer({ min: 900, max: 2200 })),
        fc.double({ min: 1.01, max: 1200, noNaN: true }),
        fc.integer({ min: 1, max: 1e6 }),
        (n, bandwidth, seed) => {
          const columns = series(n, 3, seed, 0.2);
          const whole = bartlettKernelSum(columns, bandwidth);
          const part = bartlettKernelSum(columns, bandwidth, [[0, 2]]);
          for (const [a, b] of [
            [0, 0],
            [0, 2],
            [2, 2],
          ] as const)
            expect(Object.is(part[a]![b], whole[a]![b])).toBe(true);
        },
      ),
      { numRuns: 200, seed: 20261204 },
    );
    expect(() => bartlettKernelSum(series(20, 3, 1), 2, [[1, 0]])).toThrow(RangeError);
    expect(() => bartlettKernelSum(series(20, 3, 1), 2, [[1, 3]])).toThrow(RangeError);
  });
});

describe("the Newey-West pre-lag autocovariances in one blocked pass", () => {
  it("equal the lag-by-lag sums (definition written out here) to rounding, at every length and lag count", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5000 }), fc.integer({ min: 0, max: 40 }), fc.integer({ min: 1, max: 1e6 }), (n, lags, seed) => {
        const f = series(n, 1, seed)[0]!;
        const sums = autocovarianceSums(f, Math.min(lags, n - 1));
        for (let j = 0; j < sums.length; j++) {
          let expected = 0;
          let scale = 0;
          for (let t = 0; t + j < n; t++) {
            expected += f[t]! * f[t + j]!;
            scale += Math.abs(f[t]! * f[t + j]!);
          }
          expect(Math.abs(sums[j]! - expected)).toBeLessThanOrEqual(1e-13 * scale);
        }
      }),
      { numRuns: 200, seed: 20261203 },
    );
  });
});

describe("the Newey-West pre-lag autocovariances, lags taken four and one at a time", () => {
  it("are the bits of a lag-by-lag pass block by block (definition written out here: each block's sum from 0, rows in order)", () => {
    // Lag counts around the groups of four, and lengths around the block and its last rows.
    const lengths = fc.oneof(fc.integer({ min: 1, max: 80 }), fc.integer({ min: BLOCK_ROWS - 20, max: 2 * BLOCK_ROWS + 40 }));
    fc.assert(
      fc.property(lengths, fc.integer({ min: 0, max: 40 }), fc.integer({ min: 1, max: 1e6 }), (n, lags, seed) => {
        const f = series(n, 1, seed)[0]!;
        const lagCount = Math.min(lags, n - 1);
        const sums = autocovarianceSums(f, lagCount);
        for (let j = 0; j <= lagCount; j++) {
          let expected = 0;
          for (let start = 0; start < n; start += BLOCK_ROWS) {
            let block = 0;
            for (let t = start; t < Math.min(n, start + BLOCK_ROWS) && t + j < n; t++) block += f[t]! * f[t + j]!;
            expected += block;
          }
          expect(Object.is(sums[j], expected)).toBe(true);
        }
      }),
      { numRuns: 150, seed: 20261204 },
    );
  });
});

describe("the Newey-West pre-lag autocovariances of a weighted sum of columns, never stored whole", () => {
  it("are the bits of autocovarianceSums on the sum formed first (0 + w_a column_a, then added in order)", () => {
    const weightSets = [[1], [0, 1], [1, 1], [0.5, -2, 0], [0, 0], [1, 0, 3]];
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 7000 }),
        fc.integer({ min: 0, max: 60 }),
        fc.integer({ min: 0, max: weightSets.length - 1 }),
        fc.integer({ min: 1, max: 1e6 }),
        (n, lags, which, seed) => {
          const weights = weightSets[which]!;
          const columns = series(n, weights.length, seed);
          const f = new Float64Array(n);
          let started = false;
          columns.forEach((column, a) => {
            if (weights[a] === 0) return;
            if (started) addScaledInto(f, weights[a]!, column);
            else scaledInto(f, weights[a]!, column);
            started = true;
          });
          const lagCount = Math.min(lags, n - 1);
          const expected = autocovarianceSums(f, lagCount);
          const sums = weightedAutocovarianceSums(columns, weights, lagCount);
          expect(sums.length).toBe(expected.length);
          sums.forEach((value, j) => expect(Object.is(value, expected[j]), `lag ${j}: ${value} vs ${expected[j]}`).toBe(true));
        },
      ),
      { numRuns: 150, seed: 20261204 },
    );
  });
});
