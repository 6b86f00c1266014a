/**
 * One bandwidth per bound (docs/methods.md §4): each bound's long-run variance is the kernel sum of its
 * own influence series grad'(z_t - zbar). Checks by identities that hold whatever the data:
 * - the kernel sum is bilinear, so at one shared bandwidth the variance of g'z equals g' Omega g with
 *   Omega the long-run covariance of z at that bandwidth (longRun.ts, itself checked against R sandwich);
 * - an automatic rule applied per bound gives each bound the bandwidth the rule gives on its own
 *   series (bandwidth.ts, checked against R sandwich's bwNeweyWest);
 * - "auto" is 6 sqrt(T) for both bounds.
 * And, on a GARCH sample where the factor's squared returns cluster, that the lower bound's own
 * series asks for a longer Newey-West lag than the upper bound's.
 */

import { describe, expect, test } from "vitest";
import { boundGradients, momentSeries } from "../../../src/core/inference/boundsDelta.js";
import { boundInfluenceSeries, boundsLongRun, influenceSeries } from "../../../src/core/inference/boundsLongRun.js";
import { neweyWest1994Bandwidth } from "../../../src/core/inference/hac/bandwidth.js";
import { longRunCovariance, longRunCovarianceInPlace } from "../../../src/core/inference/hac/longRun.js";
import { bilinear } from "../../../src/core/numerics/linearAlgebra.js";
import { drawSample } from "../../../src/core/forward/simulate.js";
import { expectClose } from "../../support/close.js";

function prepared(garch: boolean) {
  const s = drawSample(
    { lowBeta: 0.8, weight: 0.5, factorVol: 0.01, factorMean: 0.0003, lowNoiseVol: 0.002, highNoiseVol: 0.008 },
    garch ? { periods: 2520, seed: 7, garch: { alpha: 0.05, beta: 0.9 }, noiseAr: 0.2 } : { periods: 800, seed: 7 },
  );
  const x = Float64Array.from(s.low, (v) => v * 64);
  const y = Float64Array.from(s.high, (v) => v * 64);
  const n = x.length;
  const mean = (a: Float64Array) => a.reduce((p, q) => p + q, 0) / n;
  const cov = (a: Float64Array, b: Float64Array) => {
    const ma = mean(a);
    const mb = mean(b);
    return a.reduce((p, v, t) => p + (v - ma) * (b[t]! - mb), 0) / (n - 1);
  };
  const moments = { weight: 0.5, lowVariance: cov(x, x), highVariance: cov(y, y), covariance: cov(x, y) };
  return { z: momentSeries(x, y), gradients: boundGradients(moments), n, x, y };
}

describe("the memory-saving paths give the same numbers, bit for bit", () => {
  test("influence series straight from the returns equal those of the moment series", () => {
    for (const garch of [false, true]) {
      const { z, gradients, x, y } = prepared(garch);
      const direct = boundInfluenceSeries(x, y, gradients);
      expect(direct.lower).toEqual(influenceSeries(z, gradients.lower));
      expect(direct.upper).toEqual(influenceSeries(z, gradients.upper));
    }
  });

  test("the long-run covariance centred in place equals the copying one, and centres the columns", () => {
    const { z } = prepared(true);
    const copies = z.map((c) => c.slice());
    const plain = longRunCovariance(z, { bandwidth: 301.5 });
    expect(z).toEqual(copies); // the copying form leaves its columns alone
    const inPlace = longRunCovarianceInPlace(copies, { bandwidth: 301.5 });
    expect(inPlace.covariance).toEqual(plain.covariance);
    for (const c of copies) expect(Math.abs(c.reduce((p, q) => p + q, 0))).toBeLessThan(1e-9);
  });
});

describe("per-bound long-run variances", () => {
  const { z, gradients, n } = prepared(false);

  test.each([0, 3, 12])("at a shared fixed lag %s they are g' Omega g and g_l' Omega g_u", (lags) => {
    const omega = longRunCovariance(z, { lags }).covariance;
    const lr = boundsLongRun(z, gradients, { lags }, 0.95);
    expectClose(lr.lower.variance, bilinear(gradients.lower, omega, gradients.lower), { rel: 1e-10 });
    expectClose(lr.upper.variance, bilinear(gradients.upper, omega, gradients.upper), { rel: 1e-10 });
    expectClose(lr.covariance, bilinear(gradients.lower, omega, gradients.upper), { rel: 1e-9 });
    expect(lr.lower.lags).toBe(lags);
  });

  test('"auto" takes the Bartlett bandwidth 6 sqrt(T) for both bounds', () => {
    const lr = boundsLongRun(z, gradients, {}, 0.95);
    expectClose(lr.lower.bandwidth, 6 * Math.sqrt(n), { rel: 1e-15 });
    expect(lr.upper.bandwidth).toBe(lr.lower.bandwidth);
    const omega = longRunCovariance(z, { bandwidth: 6 * Math.sqrt(n) }).covariance;
    expectClose(lr.lower.variance, bilinear(gradients.lower, omega, gradients.lower), { rel: 1e-10 });
    expect(lr.lower.criticalFactor).toBeGreaterThan(1);
  });

  test("identically zero influence series (identical books) under an automatic rule and the quadratic-spectral kernel: zero variances", () => {
    const zero = [new Float64Array(50), new Float64Array(50), new Float64Array(50)];
    const lr = boundsLongRun(zero, gradients, { bandwidth: "andrews-1991", kernel: "quadratic-spectral" }, 0.95);
    expect([lr.lower.variance, lr.upper.variance, lr.covariance]).toEqual([0, 0, 0]);
    expect(lr.lower.bandwidth).toBe(0);
  });

  test("the quadratic-spectral kernel keeps normal critical values", () => {
    const lr = boundsLongRun(z, gradients, { kernel: "quadratic-spectral" }, 0.95);
    expect(lr.lower.criticalFactor).toBe(1);
    expect(lr.lower.lags).toBeNull();
  });
});

describe("an automatic rule chooses each bound's bandwidth on its own influence series", () => {
  const { z, gradients, n } = prepared(true);
  const lr = boundsLongRun(z, gradients, { bandwidth: "newey-west-1994" }, 0.95);

  test("each bandwidth is Newey-West 1994 on that bound's series", () => {
    for (const [end, gradient] of [
      [lr.lower, gradients.lower],
      [lr.upper, gradients.upper],
    ] as const) {
      expectClose(end.bandwidth, neweyWest1994Bandwidth([influenceSeries(z, gradient)], "bartlett", [1], n, false), { rel: 1e-14 });
      expect(end.lags).toBe(Math.floor(end.bandwidth));
    }
  });

  test("under volatility clustering the lower bound, driven by the factor's squares, gets the longer lag", () => {
    expect(lr.lower.bandwidth).toBeGreaterThan(lr.upper.bandwidth);
  });

  test("the two estimates' correlation stays within [-1, 1]", () => {
    const correlation = lr.covariance / Math.sqrt(lr.lower.variance * lr.upper.variance);
    expect(Math.abs(correlation)).toBeLessThanOrEqual(1);
  });
});
