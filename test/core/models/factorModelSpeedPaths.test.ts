/**
 * The factor model's faster paths change no result: the covariance with the risk-free return subtracted
 * in its first pass is the covariance of the excess series to the bit, and the fit recovers a population
 * structure exactly whether the leading eigenvalue stands far from the rest (power iteration from the
 * previous step's vector) or near them (a weak factor, where the power iteration does not settle in 100 steps
 * and Jacobi takes over).
 */
import { describe, expect, it } from "vitest";
import { factorModelFromCovariance, sampleCovariance } from "../../../src/core/models/factorModel.js";
import { createRandom } from "../../../src/core/numerics/rng.js";
import { expectClose } from "../../support/close.js";

const population = (b: number[], psi: number[], phi: number): number[][] =>
  b.map((x, i) => b.map((y, j) => phi * x * y + (i === j ? psi[i]! : 0)));

describe("sampleCovariance with an offset", () => {
  const random = createRandom(7, 1);
  const n = 3_000;
  const raw = Array.from({ length: 4 }, () => Float64Array.from({ length: n }, () => 0.01 * random.normal() + 0.0003));
  const rf = Float64Array.from({ length: n }, (_, t) => 0.0001 + 0.00005 * Math.sin(t / 100));

  it("is the covariance of the excess series, bit for bit (a series or a number subtracted)", () => {
    const excess = raw.map((x) => Float64Array.from(x, (v, t) => v - rf[t]!));
    expect(sampleCovariance(raw, rf)).toEqual(sampleCovariance(excess));
    const shifted = raw.map((x) => Float64Array.from(x, (v) => v - 0.0002));
    expect(sampleCovariance(raw, 0.0002)).toEqual(sampleCovariance(shifted));
  });

  it("is symmetric and has the series' variances (divisor n - 1) on its diagonal", () => {
    const s = sampleCovariance(raw);
    for (let i = 0; i < 4; i++) {
      for (let j = 0; j < 4; j++) expect(s[i]![j]).toBe(s[j]![i]);
      const x = raw[i]!;
      const mean = x.reduce((a, v) => a + v, 0) / n;
      expectClose(s[i]![i]!, x.reduce((a, v) => a + (v - mean) ** 2, 0) / (n - 1), { rel: 1e-12 });
    }
  });
});

describe("the fit on population moments, strong and weak factors", () => {
  const names = ["A", "B", "C", "D", "E", "F"];
  it("recovers a strong factor (leading eigenvalue about 200 times the next)", () => {
    const b = [0.5, 0.7, 0.9, 1.1, 1.3, 1.5]; // equal weights: mean 1
    const psi = [1e-5, 2e-5, 1.5e-5, 3e-5, 2e-5, 4e-5];
    const model = factorModelFromCovariance(names, [1, 1, 1, 1, 1, 1], population(b, psi, 0.002), 1000);
    model.portfolios.forEach((p, i) => {
      expectClose(p.loading, b[i]!, { rel: 1e-11 });
      expectClose(p.noiseVariance, psi[i]!, { rel: 1e-9 });
    });
    expect(model.diagnostics).toEqual([]);
  });

  it("recovers a weak factor (leading eigenvalue about 1.3 against 1 for the rest)", () => {
    const b = [0.8, 0.9, 1.0, 1.0, 1.1, 1.2];
    const psi = [1, 1.2, 0.9, 1.1, 1, 1.3];
    const model = factorModelFromCovariance(names, [1, 1, 1, 1, 1, 1], population(b, psi, 0.05), 1000);
    model.portfolios.forEach((p, i) => {
      expectClose(p.loading, b[i]!, { rel: 1e-10 });
      expectClose(p.noiseVariance, psi[i]!, { rel: 1e-9 });
    });
  });
});
