/**
 * The uncertainty's passes in the series kernel (src/core/numerics/seriesKernel.ts) against their
 * JavaScript twins (`useKernel = false`) or, where a pass has no switch, against its definition written
 * out here: bit for bit (`Object.is`), with non-finite and extreme values, at lengths around the
 * kernel's chunks (KERNEL_ROWS, PRICING_ROWS) and the JavaScript chunks (1,024 rows), and beyond
 * KERNEL_ROWS (the elementwise passes, the CAPM fit's sums and the bounds' influence series go through
 * the kernel chunk by chunk at every length).
 */
import { describe, expect, it } from "vitest";
import { edgeSeries, expectSameBits } from "../../support/kernelTwins.js";
import { largestValues } from "../../../src/core/cancellation.js";
import { excessReturnsScaledBy } from "../../../src/core/inference/bootstrap/replicates.js";
import { boundInfluenceSeries } from "../../../src/core/inference/boundsLongRun.js";
import { longRunCovarianceInPlace } from "../../../src/core/inference/hac/longRun.js";
import { sharpeStdErrors } from "../../../src/core/inference/sharpe.js";
import { sampleCovariance } from "../../../src/core/models/factorModel.js";
import { interceptLeastSquares } from "../../../src/core/numerics/leastSquares.js";
import { KERNEL_ROWS, PRICING_ROWS } from "../../../src/core/numerics/seriesKernel.js";
import { blendInto, productInto } from "../../../src/core/numerics/seriesLoops.js";
import { fillInfluenceSeries, type InfluenceTerms, type Six } from "../../../src/core/pricing/assessPricing.js";
import { excessResidualSums } from "../../../src/core/regression.js";

const LENGTHS = [1, 2, 3, 1023, 1025, 2520, PRICING_ROWS + 1, KERNEL_ROWS, 2 * KERNEL_ROWS + 17];

/** Each length with plain data, then shorter runs with edge values (seed picks which and where). */
function* cases(): Generator<{ label: string; x: Float64Array; y: Float64Array; rates: Float64Array }> {
  for (const [i, n] of LENGTHS.entries())
    yield { label: `n ${n}`, x: edgeSeries(n, i), y: edgeSeries(n, 50 + i, 0.012, 0.04), rates: edgeSeries(n, 90 + i, 1e-4, 1e-5) };
  for (let seed = 0; seed < 8; seed++) {
    const n = 600 + 173 * seed;
    yield {
      label: `specials ${seed}`,
      x: edgeSeries(n, seed, 0, 1, seed % 3),
      y: edgeSeries(n, 20 + seed, 0, 1e-150, (seed + 1) % 3),
      rates: edgeSeries(n, 40 + seed, 0, 1e-300, seed % 2),
    };
  }
}

describe("the uncertainty's passes in the series kernel", () => {
  it("largestValues equals the JavaScript pass, with a fixed rate and with rates", () => {
    for (const { label, x, y, rates } of cases()) {
      for (const rf of [rates, 2e-4, -0]) {
        const got = largestValues(x, y, rf);
        const expected = largestValues(x, y, rf, false);
        expectSameBits([got.low, got.high, got.riskFree], [expected.low, expected.high, expected.riskFree], label);
      }
    }
  });

  it("excessResidualSums equals the JavaScript pass", () => {
    for (const { label, x, y, rates } of cases()) {
      const lowLine = { ybar: 0.003, beta: 0.7 };
      const highLine = { ybar: -0.002, beta: 1.3 };
      for (const [rf, scale] of [
        [rates, 1],
        [1e-4, 2 ** 10],
      ] as const) {
        const got = excessResidualSums(x, y, rf, 0.4, 0.011, lowLine, highLine, scale);
        expectSameBits(got, excessResidualSums(x, y, rf, 0.4, 0.011, lowLine, highLine, scale, false), label);
      }
    }
  });

  it("boundInfluenceSeries equals the JavaScript pass, zero gradient entries skipped as there", () => {
    for (const { label, x, y } of cases()) {
      for (const gradients of [
        { lower: [0, 0.8, -1.1], upper: [0.3, 0, 2.5] },
        { lower: [1e-3, -0, 7], upper: [Number.NaN, 1, 0] },
      ]) {
        const got = boundInfluenceSeries(x, y, gradients);
        const expected = boundInfluenceSeries(x, y, gradients, false);
        expectSameBits(got.lower, expected.lower, `${label} lower`);
        expectSameBits(got.upper, expected.upper, `${label} upper`);
      }
    }
  });

  it("sharpeStdErrors equals the JavaScript passes", () => {
    for (const { label, x } of cases()) {
      if (x.length < 3) continue;
      // Also with a Sharpe ratio near 2.5, where the skewness and kurtosis carry into the Mertens error.
      for (const shift of [0, 0.04]) {
        const shifted = x.map((v) => v + shift);
        const got = sharpeStdErrors(shifted);
        const expected = sharpeStdErrors(shifted, {}, false);
        expectSameBits(Object.values(got), Object.values(expected), `${label}, shift ${shift}`);
      }
    }
  });

  it("interceptLeastSquares equals the JavaScript passes (coefficients and residuals, or the same refusal)", () => {
    for (const { label, x, y } of cases()) {
      // Both refuse the same samples (one row, non-finite sums: a singular system) with the same error.
      const regress = (useKernel: boolean) => {
        try {
          return interceptLeastSquares(x, y, useKernel);
        } catch (error) {
          return String(error);
        }
      };
      const got = regress(true);
      const expected = regress(false);
      if (typeof got === "string" || typeof expected === "string") {
        expect(got, label).toEqual(expected);
        continue;
      }
      expectSameBits(got.coefficients, expected.coefficients, `${label} coefficients`);
      expectSameBits(got.residuals, expected.residuals, `${label} residuals`);
    }
  });

  it("productInto and blendInto equal the JavaScript loops", () => {
    for (const { label, x, y } of cases()) {
      const n = x.length;
      expectSameBits(productInto(new Float64Array(n), x, y), productInto(new Float64Array(n), x, y, false), `${label} product`);
      expectSameBits(
        blendInto(new Float64Array(n), 0.3, x, 0.7, y),
        blendInto(new Float64Array(n), 0.3, x, 0.7, y, false),
        `${label} blend`,
      );
    }
  });

  it("fillInfluenceSeries equals the JavaScript pass across its chunks of PRICING_ROWS", () => {
    const terms: InfluenceTerms = {
      ...{ scale: 4, w: 0.5, v: 0.5, mx: 0.01, my: 0.012, vx: 4e-4, vy: 1.6e-3, c: 5e-4 },
      ...{ lower: 0.4, upper: 0.9, lambda: 1.7, beta: 0.6, varM: 8e-4, gl: [0, 3.1, -2.2], gu: [-0.5, 0, 1.9] },
    };
    const six = (n: number): Six => Array.from({ length: 6 }, () => new Float64Array(n)) as Six;
    for (const { label, x, y, rates } of cases()) {
      for (const rf of [rates, 1e-4]) {
        const got = six(x.length);
        const expected = six(x.length);
        fillInfluenceSeries(got, x, y, rf, terms);
        fillInfluenceSeries(expected, x, y, rf, terms, false);
        got.forEach((f, k) => expectSameBits(f, expected[k]!, `${label} series ${k}`));
      }
    }
  });

  it("sampleCovariance of k series equals the JavaScript passes, with a number or a series of rates", () => {
    for (const [k, n] of [
      [3, 1],
      [3, 2],
      [10, 2520],
      [10, 10_000],
      [12, 10_000],
      [2, 40_000],
    ] as const) {
      const many = Array.from({ length: k }, (_, i) => edgeSeries(n, 700 + i, 0.01 * i, 0.02 + 0.01 * i, n > 2 ? i % 3 : 0));
      const rates = edgeSeries(n, 800, 1e-4, 1e-5);
      for (const offset of [0, 2e-4, rates]) {
        const got = sampleCovariance(many, offset);
        const expected = sampleCovariance(many, offset, false);
        expectSameBits(got.flat(), expected.flat(), `k ${k}, n ${n}, ${typeof offset === "number" ? offset : "rates"}`);
      }
    }
  });

  it("excessReturnsScaledBy gives (x - r) scale, row by row", () => {
    for (const { label, x, y, rates } of cases()) {
      const got = excessReturnsScaledBy({ low: x, high: y, riskFree: rates, weight: 0.5 }, 0.3, (n) => new Float64Array(n));
      expectSameBits(
        got.low,
        Array.from(x, (v, t) => (v - rates[t]!) * got.scale),
        `${label} low`,
      );
      expectSameBits(
        got.high,
        Array.from(y, (v, t) => (v - rates[t]!) * got.scale),
        `${label} high`,
      );
    }
  });

  it("longRunCovarianceInPlace centres each column as column[t] - mean", () => {
    for (const n of [2, 1500, KERNEL_ROWS, KERNEL_ROWS + 3]) {
      const x = edgeSeries(n, 3);
      const y = edgeSeries(n, 4);
      // The plain sum in row order over n, as longRun.ts takes the mean.
      const centred = (a: Float64Array) => {
        const mean = a.reduce((s, v) => s + v, 0) / n;
        return Array.from(a, (v) => v - mean);
      };
      const expectedX = centred(x);
      const expectedY = centred(y);
      longRunCovarianceInPlace([x, y], { lags: 2 });
      expectSameBits(x, expectedX, `n ${n} x`);
      expectSameBits(y, expectedY, `n ${n} y`);
    }
  });
});
