/**
 * The k-portfolio one-factor model (docs/methods.md §31): exact recovery of the loadings from a
 * population covariance built from them, agreement with an independent scipy maximum-likelihood fit
 * (test/fixtures/factor-model), the statistic's null distribution by simulation, and typed
 * diagnostics for degenerate data.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { identifiedBounds } from "../../../src/core/identify.js";
import { factorModelFromCovariance, sampleCovariance } from "../../../src/core/models/factorModel.js";
import { createRandom } from "../../../src/core/numerics/rng.js";
import { expectClose } from "../../support/close.js";

interface Fixture {
  observations: number;
  weights: number[];
  columns: number[][];
  loadings: number[];
  noiseVariances: number[];
  factorVariance: number;
  loadingStdErrors: number[];
  statistic: number;
  degreesOfFreedom: number;
  pValue: number;
  capmBetas: number[];
}
const fixture = JSON.parse(readFileSync(new URL("../../fixtures/factor-model/factor_expected.json", import.meta.url), "utf8")) as Fixture;
const names = ["P1", "P2", "P3", "P4", "P5"];

const population = (b: number[], psi: number[], phi: number): number[][] =>
  b.map((x, i) => b.map((y, j) => phi * x * y + (i === j ? psi[i]! : 0)));

describe("factorModelFromCovariance: population moments", () => {
  it("recovers the loadings, noise variances and factor variance they were built from (exact in exact arithmetic)", () => {
    const b = [0.6, 0.8, 1.0, 1.2, 1.4]; // equal weights: sum w b = 1
    const psi = [4e-4, 3e-4, 2e-4, 3e-4, 5e-4];
    const model = factorModelFromCovariance(names, [1, 1, 1, 1, 1], population(b, psi, 0.002), 600);
    model.portfolios.forEach((p, i) => {
      expectClose(p.loading, b[i]!, { rel: 1e-12 });
      expectClose(p.noiseVariance, psi[i]!, { rel: 1e-10 });
    });
    expectClose(model.factorVariance, 0.002, { rel: 1e-12 });
    expect(model.fit?.statistic).toBeLessThan(1e-9);
    expect(model.fit?.degreesOfFreedom).toBe(5);
    expect(model.heywood).toEqual([]);
    expect(model.diagnostics).toEqual([]);
  });

  it("normalises with unequal weights and recovers a scaled structure (k = 4, two degrees of freedom)", () => {
    const raw = [0.5, 0.9, 1.3, 1.7];
    const w = [0.4, 0.3, 0.2, 0.1];
    const s = raw.reduce((sum, x, i) => sum + w[i]! * x, 0);
    const model = factorModelFromCovariance(names.slice(0, 4), [4, 3, 2, 1], population(raw, [1, 2, 1.5, 3], 0.7), 100);
    model.portfolios.forEach((p, i) => expectClose(p.loading, raw[i]! / s, { rel: 1e-11 }));
    expectClose(model.factorVariance, 0.7 * s * s, { rel: 1e-11 });
    expect(model.fit?.degreesOfFreedom).toBe(2);
  });

  it("puts the factor model's betas of each adjacent pair inside that pair's two-book set (§1.2, with the pair's own proxy)", () => {
    const b = [0.6, 0.8, 1.0, 1.2, 1.4];
    const cov = population(b, [4e-4, 3e-4, 2e-4, 3e-4, 5e-4], 0.002);
    const model = factorModelFromCovariance(names, [1, 1, 1, 1, 1], cov, 600);
    expect(model.adjacentPairs).toHaveLength(4);
    model.adjacentPairs.forEach((pair, i) => {
      const set = identifiedBounds({
        weight: 0.5,
        lowMean: 0,
        highMean: 0,
        lowVariance: cov[i]![i]!,
        highVariance: cov[i + 1]![i + 1]!,
        covariance: cov[i]![i + 1]!,
      });
      expect(pair.bounds?.lowBeta).toEqual(set.lowBeta);
      // In the pair's normalisation 0.5 b_low + 0.5 b_high = 1.
      expectClose(pair.factorLowBeta, b[i]! / (0.5 * (b[i]! + b[i + 1]!)), { rel: 1e-11 });
      expect(pair.insideSet).toBe(true);
    });
  });

  it("flags a Heywood case: a portfolio without noise", () => {
    const model = factorModelFromCovariance(names.slice(0, 4), [1, 1, 1, 1], population([0.7, 0.9, 1.1, 1.3], [1, 0, 1, 1], 2), 300);
    expect(model.heywood).toEqual(["P2"]);
    expect(model.diagnostics.map((d) => d.code)).toContain("factor-heywood");
    expect(model.portfolios[1]!.loadingStdError).toBeNull();
    expectClose(model.portfolios[0]!.loading, 0.7, { rel: 1e-6 });
  });
});

describe("factorModelFromCovariance: against scipy (test/fixtures/factor-model/generate_factor.py)", () => {
  const columns = fixture.columns.map((c) => Float64Array.from(c));
  const model = factorModelFromCovariance(names, fixture.weights, sampleCovariance(columns), fixture.observations);

  it("agrees with scipy.optimize's minimum of the ML discrepancy", () => {
    // The optimiser's minimum is flat in the parameters: F agrees to ~1e-15, the parameters to ~1e-7.
    model.portfolios.forEach((p, i) => {
      expectClose(p.loading, fixture.loadings[i]!, { rel: 1e-6 });
      expectClose(p.noiseVariance, fixture.noiseVariances[i]!, { rel: 1e-5 });
      expectClose(p.capmBeta, fixture.capmBetas[i]!, { rel: 1e-12 });
    });
    expectClose(model.factorVariance, fixture.factorVariance, { rel: 1e-6 });
    expectClose(model.fit?.statistic, fixture.statistic, { rel: 1e-8 });
    expect(model.fit?.degreesOfFreedom).toBe(fixture.degreesOfFreedom);
    expectClose(model.fit?.pValue, fixture.pValue, { rel: 1e-7 });
  });

  it("agrees with the expected information computed in vec/Kronecker form by numpy", () => {
    model.portfolios.forEach((p, i) => expectClose(p.loadingStdError, fixture.loadingStdErrors[i]!, { rel: 1e-4 }));
  });
});

describe("the goodness-of-fit statistic under the null", () => {
  it("rejects about 5% of one-factor samples at the 5% level (400 replications, k = 5, n = 600)", () => {
    const random = createRandom(20261204, 7);
    const b = [0.6, 0.8, 1.0, 1.2, 1.4];
    const sd = [0.02, 0.017, 0.014, 0.017, 0.022];
    const n = 600;
    const replications = 400;
    let rejections = 0;
    for (let r = 0; r < replications; r++) {
      const columns = b.map(() => new Float64Array(n));
      for (let t = 0; t < n; t++) {
        const f = 0.045 * random.normal();
        b.forEach((beta, i) => {
          columns[i]![t] = beta * f + sd[i]! * random.normal();
        });
      }
      const model = factorModelFromCovariance(names, [1, 1, 1, 1, 1], sampleCovariance(columns), n);
      if ((model.fit?.pValue ?? 1) < 0.05) rejections++;
    }
    // Binomial(400, 0.05): standard error sqrt(0.05 * 0.95 / 400) = 0.0109; accept within 3 of them.
    expect(Math.abs(rejections / replications - 0.05)).toBeLessThan(3 * Math.sqrt((0.05 * 0.95) / replications));
  });
});

describe("degenerate data gives typed diagnostics, never an exception", () => {
  it("fewer than three portfolios", () => {
    const model = factorModelFromCovariance(
      ["A", "B"],
      [1, 1],
      [
        [1, 0.5],
        [0.5, 1],
      ],
      50,
    );
    expect(model.diagnostics.map((d) => d.code)).toEqual(["factor-too-few-portfolios"]);
    expect(model.fit).toBeNull();
    expect(model.adjacentPairs).toHaveLength(1);
  });

  it("a constant column", () => {
    const model = factorModelFromCovariance(
      names.slice(0, 3),
      [1, 1, 1],
      [
        [1, 0, 0.5],
        [0, 0, 0],
        [0.5, 0, 1],
      ],
      50,
    );
    expect(model.diagnostics.map((d) => d.code)).toEqual(["factor-constant"]);
    expect(model.portfolios.every((p) => p.loading === null)).toBe(true);
  });

  it("perfectly correlated columns", () => {
    const x = Float64Array.from({ length: 40 }, (_, t) => Math.sin(t));
    const y = Float64Array.from({ length: 40 }, (_, t) => Math.cos(3 * t));
    const model = factorModelFromCovariance(names.slice(0, 3), [1, 1, 1], sampleCovariance([x, y, x.map((v) => 2 * v)]), 40);
    expect(model.diagnostics.map((d) => d.code)).toEqual(["factor-singular-covariance"]);
  });

  it("no more rows than portfolios", () => {
    const cols = [0, 1, 2, 3].map((i) => Float64Array.from([i, i * i, 1 - i]));
    const model = factorModelFromCovariance(names.slice(0, 4), [1, 1, 1, 1], sampleCovariance(cols), 3);
    expect(model.diagnostics.map((d) => d.code)).toEqual(["factor-singular-covariance"]);
  });
});
