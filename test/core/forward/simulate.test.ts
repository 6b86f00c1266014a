import { describe, expect, it } from "vitest";
import { populationMoments, type Structure } from "../../../src/core/forward/populationMoments.js";
import { welfordCrossProducts } from "../../../src/core/moments.js";
import { drawSample } from "../../../src/core/forward/simulate.js";

const structure: Structure = {
  lowBeta: 0.7,
  weight: 0.5,
  factorVol: 0.04,
  factorMean: 0.005,
  lowNoiseVol: 0.012,
  highNoiseVol: 0.018,
};
const n = 1_000_000;

/** Sample kurtosis m4 / m2^2 and its standard error from the influence function (delta method). */
function kurtosisWithStdErr(x: ArrayLike<number>): { kurtosis: number; stdErr: number } {
  const count = x.length;
  let mean = 0;
  for (let t = 0; t < count; t++) mean += x[t]!;
  mean /= count;
  let m2 = 0;
  let m4 = 0;
  for (let t = 0; t < count; t++) {
    const d = (x[t]! - mean) ** 2;
    m2 += d;
    m4 += d * d;
  }
  m2 /= count;
  m4 /= count;
  let sumSquares = 0;
  for (let t = 0; t < count; t++) {
    const d2 = (x[t]! - mean) ** 2;
    const influence = (d2 * d2 - m4) / (m2 * m2) - (2 * m4 * (d2 - m2)) / (m2 * m2 * m2);
    sumSquares += influence * influence;
  }
  return { kurtosis: m4 / (m2 * m2), stdErr: Math.sqrt(sumSquares / count / count) };
}

/** |estimate - truth| within z standard errors (z = 4.5: a false alarm about once in 150,000 checks). */
function expectWithinStdErrs(estimate: number, truth: number, stdErr: number, z = 4.5): void {
  expect(Math.abs(estimate - truth), `estimate ${estimate}, truth ${truth}, se ${stdErr}`).toBeLessThanOrEqual(z * stdErr);
}

describe("drawSample", () => {
  it("gives the same sample for the same seed and a different one for another seed", () => {
    const a = drawSample(structure, { periods: 500, seed: 11 });
    const b = drawSample(structure, { periods: 500, seed: 11 });
    const c = drawSample(structure, { periods: 500, seed: 12 });
    expect(Array.from(a.low)).toEqual(Array.from(b.low));
    expect(Array.from(a.high)).toEqual(Array.from(b.high));
    expect(Array.from(a.low)).not.toEqual(Array.from(c.low));
  });

  it("converges to the population moments for a long normal sample (within 4.5 standard errors)", () => {
    const sample = drawSample(structure, { periods: n, seed: 3, riskFree: 0.001 });
    const truth = populationMoments(structure);
    const cp = welfordCrossProducts([sample.low, sample.high]);
    const vLow = cp.sums[0]![0]! / (n - 1);
    const vHigh = cp.sums[1]![1]! / (n - 1);
    const cov = cp.sums[0]![1]! / (n - 1);
    // Normal data: se(variance) = sqrt(2/n) V, se(covariance) = sqrt((V_l V_h + C^2)/n), se(mean) = sqrt(V/n).
    expectWithinStdErrs(cp.means[0]! - 0.001, truth.lowMean, Math.sqrt(truth.lowVariance / n));
    expectWithinStdErrs(cp.means[1]! - 0.001, truth.highMean, Math.sqrt(truth.highVariance / n));
    expectWithinStdErrs(vLow, truth.lowVariance, Math.sqrt(2 / n) * truth.lowVariance);
    expectWithinStdErrs(vHigh, truth.highVariance, Math.sqrt(2 / n) * truth.highVariance);
    expectWithinStdErrs(cov, truth.covariance, Math.sqrt((truth.lowVariance * truth.highVariance + truth.covariance ** 2) / n));
  });

  it("scales Student t innovations to the requested variance with kurtosis 3 + 6/(df - 4)", () => {
    const df = 10;
    const factorOnly: Structure = { ...structure, lowBeta: 1, factorMean: 0, lowNoiseVol: 0, highNoiseVol: 0 };
    const sample = drawSample(factorOnly, { periods: n, seed: 5, tails: df });
    const cp = welfordCrossProducts([sample.low]);
    const variance = cp.sums[0]![0]! / (n - 1);
    const { kurtosis, stdErr } = kurtosisWithStdErr(sample.low);
    // se(variance) = V sqrt((kurtosis - 1)/n) for any distribution with a finite fourth moment.
    expectWithinStdErrs(variance, 0.04 ** 2, 0.04 ** 2 * Math.sqrt((kurtosis - 1) / n));
    expectWithinStdErrs(kurtosis, 3 + 6 / (df - 4), stdErr);
  });

  it("keeps the unconditional factor variance under GARCH(1,1) and adds the theoretical excess kurtosis", () => {
    const alpha = 0.05;
    const beta = 0.9;
    const factorOnly: Structure = { ...structure, lowBeta: 1, factorMean: 0, lowNoiseVol: 0, highNoiseVol: 0 };
    const sample = drawSample(factorOnly, { periods: n, seed: 9, garch: { alpha, beta } });
    const { kurtosis, stdErr } = kurtosisWithStdErr(sample.low);
    // Normal GARCH(1,1) kurtosis (Bollerslev 1986): 3 (1 - (a + b)^2) / (1 - (a + b)^2 - 2 a^2).
    const persistence = (alpha + beta) ** 2;
    const theoretical = (3 * (1 - persistence)) / (1 - persistence - 2 * alpha * alpha);
    expectWithinStdErrs(kurtosis, theoretical, stdErr);
    // Variance: volatility clustering inflates its standard error; bound it by a batch-means estimate.
    const batches = 100;
    const size = n / batches;
    const batchVariances: number[] = [];
    for (let k = 0; k < batches; k++) {
      const cp = welfordCrossProducts([sample.low.subarray(k * size, (k + 1) * size)]);
      batchVariances.push(cp.sums[0]![0]! / (size - 1));
    }
    const meanVariance = batchVariances.reduce((a, b) => a + b, 0) / batches;
    const spread = Math.sqrt(batchVariances.reduce((a, b) => a + (b - meanVariance) ** 2, 0) / (batches - 1) / batches);
    expectWithinStdErrs(meanVariance, 0.04 ** 2, spread);
  });

  it("gives the noise the requested lag-1 autocorrelation and keeps its variance", () => {
    const rho = 0.4;
    const noiseOnly: Structure = { ...structure, lowBeta: 1, factorVol: 1e-12, factorMean: 0, lowNoiseVol: 0.01, highNoiseVol: 0.01 };
    const sample = drawSample(noiseOnly, { periods: n, seed: 13, noiseAr: rho });
    const x = sample.low;
    const lagged = welfordCrossProducts([x.subarray(1), x.subarray(0, n - 1)]);
    const r1 = lagged.sums[0]![1]! / Math.sqrt(lagged.sums[0]![0]! * lagged.sums[1]![1]!);
    // se(r1) for an AR(1) is sqrt((1 - rho^2)/n) (Bartlett's formula).
    expectWithinStdErrs(r1, rho, Math.sqrt((1 - rho * rho) / n));
    const variance = lagged.sums[0]![0]! / (n - 2);
    // Long-run variance of squared AR(1) terms: se(variance) ~ V sqrt(2 (1 + rho^2)/(1 - rho^2) / n).
    expectWithinStdErrs(variance, 1e-4, 1e-4 * Math.sqrt((2 * (1 + rho * rho)) / (1 - rho * rho) / n));
  });
});
