/**
 * Properties of solve on random samples from the one-factor model (fast-check, fixed seed).
 *
 * Each sample: n in [30, 250] periods of R_i = a_i + b_i F + e_i with b_low in (0.3, 1.2), w in
 * [0.2, 0.8], b_high = (1 - w b_low)/(1 - w), phi and s_i on daily-return scales, drawn with a small
 * seeded normal generator; samples whose covariance is not positive are discarded (no set then).
 * The algebra behind every property is in docs/methods.md §1.1-§1.5 (back-solution, identified set, CAPM
 * constant over the set, beta inside the set) and §1.2's invariance note.
 *
 * Tolerance 1e-9 relative: each property is an algebraic identity, so only float64 rounding separates
 * the two sides; quantities that are differences of moments (noise and residual variances) are
 * compared with an absolute floor of 1e-9 times the book's variance, because near-perfect correlation
 * makes them small next to the moments they come from.
 */

import fc from "fast-check";
import { describe, expect, test } from "vitest";
import type { Candidate, ReturnSample } from "../../src/core/types.js";
import { expectClose } from "../support/close.js";
import { normals } from "../support/random.js";
import { solveWithSet } from "./helpers.js";

const seed = 20261201;
const numRuns = 150;
const rel = 1e-9;

interface ModelSample {
  readonly sample: { readonly low: number[]; readonly high: number[] };
  readonly weight: number;
  readonly lowBeta: number;
}

const modelSample: fc.Arbitrary<ModelSample> = fc
  .record({
    n: fc.integer({ min: 30, max: 250 }),
    weight: fc.double({ min: 0.2, max: 0.8, noNaN: true }),
    lowBeta: fc.double({ min: 0.3, max: 1.2, noNaN: true }),
    factorSd: fc.double({ min: 0.003, max: 0.02, noNaN: true }),
    lowNoiseSd: fc.double({ min: 0.0005, max: 0.02, noNaN: true }),
    highNoiseSd: fc.double({ min: 0.0005, max: 0.02, noNaN: true }),
    factorMean: fc.double({ min: -0.002, max: 0.002, noNaN: true }),
    lowAlpha: fc.double({ min: -0.001, max: 0.001, noNaN: true }),
    highAlpha: fc.double({ min: -0.001, max: 0.001, noNaN: true }),
    drawSeed: fc.integer({ min: 1, max: 2 ** 31 - 1 }),
  })
  .map((p) => {
    const z = normals(p.drawSeed);
    const highBeta = (1 - p.weight * p.lowBeta) / (1 - p.weight);
    const low: number[] = [];
    const high: number[] = [];
    for (let t = 0; t < p.n; t++) {
      const f = p.factorMean + p.factorSd * z();
      low.push(p.lowAlpha + p.lowBeta * f + p.lowNoiseSd * z());
      high.push(p.highAlpha + highBeta * f + p.highNoiseSd * z());
    }
    return { sample: { low, high }, weight: p.weight, lowBeta: p.lowBeta };
  })
  .filter(({ sample }) => centredCrossProduct(sample.low, sample.high) > 0);

function centredCrossProduct(x: readonly number[], y: readonly number[]): number {
  const mx = x.reduce((a, b) => a + b, 0) / x.length;
  const my = y.reduce((a, b) => a + b, 0) / y.length;
  return x.reduce((a, xi, i) => a + (xi - mx) * ((y[i] as number) - my), 0);
}

const run = (property: (s: ModelSample) => void): void => {
  fc.assert(fc.property(modelSample, property), { seed, numRuns });
};

const landmarkList = (l: { lowNoiseFree: Candidate; highNoiseFree: Candidate; equalNoise: Candidate; capmConsistent: Candidate }) => [
  l.lowNoiseFree,
  l.highNoiseFree,
  l.equalNoise,
  l.capmConsistent,
];

describe("solve on random one-factor samples with positive covariance (fast-check, seeded)", () => {
  test("bounds are ordered: min <= max for the low beta, the high beta and the factor variance", () => {
    run(({ sample, weight }) => {
      const { bounds } = solveWithSet(sample, { weight });
      expect(bounds.lowBeta.min).toBeLessThanOrEqual(bounds.lowBeta.max);
      expect(bounds.highBeta.min).toBeLessThanOrEqual(bounds.highBeta.max);
      expect(bounds.factorVariance.min).toBeLessThanOrEqual(bounds.factorVariance.max);
    });
  });

  test("every grid candidate and landmark reproduces the observed V_low = b_low² phi + s_low, V_high = b_high² phi + s_high, C = b_low b_high phi (§1.1)", () => {
    run(({ sample, weight }) => {
      const s = solveWithSet(sample, { weight });
      const vLow = s.moments.low.variance;
      const vHigh = s.moments.high.variance;
      for (const c of [...s.grid, ...landmarkList(s.landmarks)]) {
        expectClose(c.lowBeta ** 2 * c.factorVariance + c.lowNoiseVariance, vLow, { rel });
        expectClose(c.highBeta ** 2 * c.factorVariance + c.highNoiseVariance, vHigh, { rel });
        expectClose(c.lowBeta * c.highBeta * c.factorVariance, s.moments.covariance.lowHigh, { rel });
        expectClose(weight * c.lowBeta + (1 - weight) * c.highBeta, 1, { rel }); // normalisation
      }
    });
  });

  test("every grid candidate and landmark implies exactly the observed CAPM betas and residual variances (§1.5)", () => {
    run(({ sample, weight }) => {
      const s = solveWithSet(sample, { weight });
      const vLow = s.moments.low.variance;
      const vHigh = s.moments.high.variance;
      for (const c of [...s.grid, ...landmarkList(s.landmarks)]) {
        expectClose(c.impliedCapm.lowBeta, s.capm.low.beta, { rel });
        expectClose(c.impliedCapm.highBeta, s.capm.high.beta, { rel });
        expectClose(c.impliedCapm.lowResidualVariance, s.capm.low.residualVariance, { rel, abs: rel * vLow });
        expectClose(c.impliedCapm.highResidualVariance, s.capm.high.residualVariance, { rel, abs: rel * vHigh });
      }
    });
  });

  test("noise variances are >= -1e-12 V on the set, and every grid candidate is flagged insideSet (§1.2)", () => {
    run(({ sample, weight }) => {
      const s = solveWithSet(sample, { weight });
      for (const c of [...s.grid, ...landmarkList(s.landmarks)]) {
        expect(c.lowNoiseVariance).toBeGreaterThanOrEqual(-1e-12 * s.moments.low.variance);
        expect(c.highNoiseVariance).toBeGreaterThanOrEqual(-1e-12 * s.moments.high.variance);
        expect(c.insideSet).toBe(true);
      }
    });
  });

  test("the CAPM low beta lies inside the identified set [Lb, U] (§1.5: U - beta and beta - Lb are >= 0)", () => {
    run(({ sample, weight }) => {
      const s = solveWithSet(sample, { weight });
      const slack = 1e-12 * s.bounds.lowBeta.max;
      expect(s.capm.low.beta).toBeGreaterThanOrEqual(s.bounds.lowBeta.min - slack);
      expect(s.capm.low.beta).toBeLessThanOrEqual(s.bounds.lowBeta.max + slack);
      expectClose(s.landmarks.capmConsistent.lowBeta, s.capm.low.beta, { rel });
    });
  });

  test("swapping low and high with w -> 1 - w swaps the low- and high-beta bounds and the lowNoiseFree and highNoiseFree landmarks", () => {
    run(({ sample, weight }) => {
      const s = solveWithSet(sample, { weight });
      const t = solveWithSet({ low: sample.high, high: sample.low }, { weight: 1 - weight });
      expectClose(t.bounds.lowBeta.min, s.bounds.highBeta.min, { rel });
      expectClose(t.bounds.lowBeta.max, s.bounds.highBeta.max, { rel });
      expectClose(t.bounds.highBeta.min, s.bounds.lowBeta.min, { rel });
      expectClose(t.bounds.highBeta.max, s.bounds.lowBeta.max, { rel });
      expectClose(t.bounds.factorVariance.min, s.bounds.factorVariance.min, { rel });
      expectClose(t.bounds.factorVariance.max, s.bounds.factorVariance.max, { rel });
      const pairs: [Candidate, Candidate][] = [
        [t.landmarks.lowNoiseFree, s.landmarks.highNoiseFree],
        [t.landmarks.highNoiseFree, s.landmarks.lowNoiseFree],
      ];
      for (const [swapped, original] of pairs) {
        expectClose(swapped.lowBeta, original.highBeta, { rel });
        expectClose(swapped.highBeta, original.lowBeta, { rel });
        expectClose(swapped.factorVariance, original.factorVariance, { rel });
        expectClose(swapped.lowNoiseVariance, original.highNoiseVariance, { rel, abs: rel * s.moments.high.variance });
        expectClose(swapped.highNoiseVariance, original.lowNoiseVariance, { rel, abs: rel * s.moments.low.variance });
      }
    });
  });

  test("scaling all returns by c leaves betas and bounds unchanged and scales every variance by c² (§1.2)", () => {
    fc.assert(
      fc.property(modelSample, fc.constantFrom(100, 0.01, 3, 0.5), ({ sample, weight }, c) => {
        const s = solveWithSet(sample, { weight });
        const scaled = solveWithSet({ low: sample.low.map((x) => c * x), high: sample.high.map((x) => c * x) }, { weight });
        expectClose(scaled.capm.low.beta, s.capm.low.beta, { rel });
        expectClose(scaled.capm.high.beta, s.capm.high.beta, { rel });
        for (const key of ["lowBeta", "highBeta"] as const) {
          expectClose(scaled.bounds[key].min, s.bounds[key].min, { rel });
          expectClose(scaled.bounds[key].max, s.bounds[key].max, { rel });
        }
        expectClose(scaled.bounds.factorVariance.min, c * c * s.bounds.factorVariance.min, { rel });
        expectClose(scaled.bounds.factorVariance.max, c * c * s.bounds.factorVariance.max, { rel });
        expectClose(scaled.moments.low.variance, c * c * s.moments.low.variance, { rel });
        expectClose(scaled.moments.high.variance, c * c * s.moments.high.variance, { rel });
        expectClose(scaled.moments.market.variance, c * c * s.moments.market.variance, { rel });
        expectClose(scaled.moments.covariance.lowHigh, c * c * s.moments.covariance.lowHigh, { rel });
        expectClose(scaled.capm.low.residualVariance, c * c * s.capm.low.residualVariance, { rel });
        s.grid.forEach((g, k) => {
          const h = scaled.grid[k] as Candidate;
          expectClose(h.lowBeta, g.lowBeta, { rel });
          expectClose(h.factorVariance, c * c * g.factorVariance, { rel });
          expectClose(h.lowNoiseVariance, c * c * g.lowNoiseVariance, { rel, abs: rel * c * c * s.moments.low.variance });
          expectClose(h.highNoiseVariance, c * c * g.highNoiseVariance, { rel, abs: rel * c * c * s.moments.high.variance });
        });
      }),
      { seed, numRuns: 60 },
    );
  });

  test("returns shifted by a constant risk-free rate, passed as riskFree, leave CAPM betas and bounds unchanged", () => {
    fc.assert(
      fc.property(modelSample, fc.double({ min: 0, max: 0.0005, noNaN: true }), ({ sample, weight }, rf) => {
        const s = solveWithSet(sample, { weight });
        const shifted = { low: sample.low.map((x) => x + rf), high: sample.high.map((x) => x + rf) };
        const variants: ReturnSample[] = [
          { ...shifted, riskFree: rf },
          { ...shifted, riskFree: sample.low.map(() => rf) },
        ];
        for (const variant of variants) {
          const r = solveWithSet(variant, { weight });
          expectClose(r.capm.low.beta, s.capm.low.beta, { rel });
          expectClose(r.capm.high.beta, s.capm.high.beta, { rel });
          expectClose(r.bounds.lowBeta.min, s.bounds.lowBeta.min, { rel });
          expectClose(r.bounds.lowBeta.max, s.bounds.lowBeta.max, { rel });
          expectClose(r.bounds.highBeta.min, s.bounds.highBeta.min, { rel });
          expectClose(r.bounds.highBeta.max, s.bounds.highBeta.max, { rel });
          // The excess returns are the originals, so the mean excess market return is too.
          expectClose(r.moments.market.mean, s.moments.market.mean, { rel, abs: 1e-15 });
        }
      }),
      { seed, numRuns: 60 },
    );
  });
});
