/**
 * The series passes' WebAssembly kernel (src/core/numerics/seriesKernel.ts) against their JavaScript
 * twins, bit for bit (`Object.is` on every number), non-finite and extreme values included, at lengths
 * around the kernel's chunk and the window sums' blocks.
 */
import { describe, expect, it } from "vitest";
import { edgeSeries, expectSameBits } from "../../support/kernelTwins.js";
import { autocovarianceKernel } from "../../../src/core/inference/hac/autocovarianceKernel.js";
import { windowSquaresOfTwo, windowSquaresOfTwoWidths } from "../../../src/core/inference/hac/bartlettWindows.js";
import { excessCrossProducts } from "../../../src/core/moments.js";
import { createRandom } from "../../../src/core/numerics/rng.js";
import { influenceKernel, KERNEL_ROWS, columnKernel, seriesKernel } from "../../../src/core/numerics/seriesKernel.js";

const flat = (m: { means: readonly number[]; sums: readonly (readonly number[])[] }): number[] => [...m.means, ...m.sums.flat()];

describe("the series kernels", () => {
  it("are available on Node 20 (else every pass would silently take the JavaScript path)", () => {
    expect(seriesKernel()).not.toBeNull();
    expect(influenceKernel()).not.toBeNull();
    expect(columnKernel()).not.toBeNull();
  });

  it("share one memory (its pages are first touched once, not once per kernel)", () => {
    const buffer = seriesKernel()?.area.buffer;
    expect(buffer).toBeDefined();
    expect(influenceKernel()?.area.buffer).toBe(buffer);
    expect(columnKernel()?.area.buffer).toBe(buffer);
    expect(autocovarianceKernel(8, 64)?.sums.buffer).toBe(buffer);
  });
});

describe("excessCrossProducts in the kernel", () => {
  const lengths = [0, 1, 2, 3, 1023, 1024, 1025, 2520, KERNEL_ROWS - 1, KERNEL_ROWS, KERNEL_ROWS + 1, 2 * KERNEL_ROWS + 17];

  it("equals the JavaScript pass bit for bit, with a fixed risk-free rate and with a series of them", () => {
    for (const [i, n] of lengths.entries()) {
      const low = edgeSeries(n, 10 + i);
      const high = edgeSeries(n, 40 + i, 0.012, 0.035);
      const rates = edgeSeries(n, 70 + i, 0.0001, 0.00002);
      for (const [rf, weight, scale] of [
        [0.0001, 0.5, 1],
        [rates, 0.3, 1],
        [rates, 0.75, 2 ** 20],
        [0, 1, 2 ** -30],
      ] as const) {
        const label = `n ${n}, ${typeof rf === "number" ? `rf ${rf}` : "rates"}, w ${weight}, scale ${scale}`;
        expectSameBits(
          flat(excessCrossProducts(low, high, rf, weight, scale)),
          flat(excessCrossProducts(low, high, rf, weight, scale, false)),
          label,
        );
      }
    }
  });

  it("equals the JavaScript pass bit for bit with NaN, infinities, signed zeros, huge and subnormal values", () => {
    for (let seed = 0; seed < 12; seed++) {
      const n = 700 + 311 * seed;
      const low = edgeSeries(n, seed, 0, 1, seed % 4);
      const high = edgeSeries(n, 100 + seed, 0, 1e-200, (seed + 1) % 3);
      const rates = edgeSeries(n, 200 + seed, 0, 1e-310, seed % 2);
      expectSameBits(
        flat(excessCrossProducts(low, high, rates, 0.5)),
        flat(excessCrossProducts(low, high, rates, 0.5, 1, false)),
        `seed ${seed}`,
      );
      expectSameBits(
        flat(excessCrossProducts(low, high, -0, 0.9)),
        flat(excessCrossProducts(low, high, -0, 0.9, 1, false)),
        `seed ${seed}, -0`,
      );
    }
  });

  it("takes plain arrays as well as Float64Arrays", () => {
    const low = Array.from(edgeSeries(1500, 5));
    const high = Array.from(edgeSeries(1500, 6));
    expectSameBits(
      flat(excessCrossProducts(low, high, 0.0002, 0.4)),
      flat(excessCrossProducts(low, high, 0.0002, 0.4, 1, false)),
      "arrays",
    );
  });
});

describe("windowSquaresOfTwo in the kernel", () => {
  it("equals the JavaScript windows bit for bit across widths and block edges", () => {
    for (const [i, n] of [1, 2, 5, 1023, 1024, 1025, 2520, 10_000, KERNEL_ROWS, 2 * KERNEL_ROWS + 17].entries()) {
      const x = edgeSeries(n, 300 + i, 0, 0.01);
      const y = edgeSeries(n, 400 + i, 0.001, 0.03);
      // Beyond a column, and windows so wide that a chunk holds few blocks (or none: the JavaScript path).
      for (const width of [1, 2, 7, 31, 1024, 1500, 20_000, KERNEL_ROWS - 1024, n + 3]) {
        expectSameBits(windowSquaresOfTwo(x, y, width), windowSquaresOfTwo(x, y, width, false), `n ${n}, width ${width}`);
      }
    }
  });

  it("gives both widths in one pass, each the JavaScript windows of its width bit for bit", () => {
    for (const [i, n] of [1, 2, 5, 1022, 1023, 1024, 1025, 2520, KERNEL_ROWS, 2 * KERNEL_ROWS + 17].entries()) {
      const x = edgeSeries(n, 700 + i, 0, 0.01, i % 3);
      const y = edgeSeries(n, 800 + i, 0.001, 0.03);
      for (const width of [2, 3, 31, 1023, 1024, 1025, 1026, 20_000, n + 1, n + 3]) {
        const [wide, narrow] = windowSquaresOfTwoWidths(x, y, width, true);
        expectSameBits(wide, windowSquaresOfTwo(x, y, width, false), `n ${n}, width ${width}`);
        expectSameBits(narrow ?? [], windowSquaresOfTwo(x, y, width - 1, false), `n ${n}, width ${width - 1}`);
        const [alone, none] = windowSquaresOfTwoWidths(x, y, width, false);
        expectSameBits(alone, wide, `n ${n}, width ${width} alone`);
        expect(none).toBeNull();
      }
    }
  });

  it("gives both widths bit for bit where the running sums' low parts round (magnitudes 1e-3 to 1e16)", () => {
    for (let seed = 0; seed < 6; seed++) {
      const n = 1500 + 211 * seed;
      const random = createRandom(900 + seed);
      const wild = () => Float64Array.from({ length: n }, () => random.normal() * 10 ** Math.floor(random.uniform() * 20 - 3));
      const [x, y] = [wild(), wild()];
      for (const width of [2, 5, 64]) {
        const [wide, narrow] = windowSquaresOfTwoWidths(x, y, width, true);
        expectSameBits(wide, windowSquaresOfTwo(x, y, width, false), `seed ${seed}, width ${width}`);
        expectSameBits(narrow ?? [], windowSquaresOfTwo(x, y, width - 1, false), `seed ${seed}, width ${width - 1}`);
      }
    }
  });

  it("equals the JavaScript windows bit for bit with non-finite and extreme values", () => {
    for (let seed = 0; seed < 10; seed++) {
      const x = edgeSeries(900 + 97 * seed, 500 + seed, 0, 1e150, seed % 5);
      const y = edgeSeries(900 + 97 * seed, 600 + seed, 0, 1e-160, (seed + 2) % 4);
      expectSameBits(windowSquaresOfTwo(x, y, 13), windowSquaresOfTwo(x, y, 13, false), `seed ${seed}`);
    }
  });

  it("leaves nothing behind between calls (each starts from zeros)", () => {
    const x = edgeSeries(3000, 1);
    const y = edgeSeries(3000, 2);
    const first = Array.from(windowSquaresOfTwo(x, y, 40));
    windowSquaresOfTwo(edgeSeries(500, 3, 1e6, 1e6), edgeSeries(500, 4, -1e6, 1), 9);
    expectSameBits(windowSquaresOfTwo(x, y, 40), first, "again");
  });

  it("goes chunk by chunk over longer series, each chunk's windows continuing the last's", () => {
    const n = 3 * KERNEL_ROWS + 5;
    const x = edgeSeries(n, 7);
    const y = edgeSeries(n, 8);
    for (const width of [50, 1024, 1025, KERNEL_ROWS - 1025, KERNEL_ROWS - 1024])
      expectSameBits(windowSquaresOfTwo(x, y, width), windowSquaresOfTwo(x, y, width, false), `long, width ${width}`);
  });
});
