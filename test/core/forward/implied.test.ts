import { describe, expect, it } from "vitest";
import { impliedOk } from "../helpers.js";
import type { Structure } from "../../../src/core/forward/populationMoments.js";
import { solve } from "../../../src/core/solve.js";
import { drawSample } from "../../../src/core/forward/simulate.js";
import { expectClose } from "../../support/close.js";

// docs/methods.md §1.7 Example A as a structure: b_low = 3/4, phi = 16/3, s = (1, 2/3), w = 1/2.
const exampleA: Structure = {
  lowBeta: 0.75,
  weight: 0.5,
  factorVol: Math.sqrt(16 / 3),
  factorMean: 0.02,
  lowNoiseVol: 1,
  highNoiseVol: Math.sqrt(2 / 3),
};

describe("implied", () => {
  it("reports the identified set of docs/methods.md §1.7 Example A, with the truth inside it", () => {
    const result = impliedOk(exampleA, 11);
    expectClose(result.bounds!.lowBeta.min, 5 / 7);
    expectClose(result.bounds!.lowBeta.max, 8 / 9);
    expectClose(result.capm.low.beta, 18 / 23);
    expectClose(result.capm.low.residualVariance, 11 / 23);
    expect(result.truth.insideSet).toBe(true);
    expectClose(result.truth.factorVariance, 16 / 3);
    expectClose(result.landmarks!.equalNoise.lowBeta, 3 - Math.sqrt(5)); // section 1.7 Deming delta = 1
  });

  it("puts the return-implied point at the true low beta, because only the factor is priced", () => {
    const result = impliedOk(exampleA, 5);
    expectClose(result.landmarks!.returnImplied!.lowBeta, exampleA.lowBeta);
    expectClose(result.capm.low.alpha, (0.75 - 18 / 23) * 0.02);
  });

  it("agrees with solve on a long simulated sample within sampling error", () => {
    const structure: Structure = { lowBeta: 0.7, weight: 0.5, factorVol: 0.04, factorMean: 0.006, lowNoiseVol: 0.01, highNoiseVol: 0.02 };
    const population = impliedOk(structure, 11);
    const sample = drawSample(structure, { periods: 400_000, seed: 21 });
    const solved = solve(sample);
    expect(solved.ok).toBe(true);
    if (!solved.ok) return;
    const s = solved.value;
    // Bound standard errors here are about 6e-4: docs/methods.md §4 measures 0.017 at T = 500 for a
    // similar structure, times sqrt(500 / 400,000). 5e-3 is about eight standard errors.
    expect(Math.abs(s.bounds!.lowBeta.min - population.bounds!.lowBeta.min)).toBeLessThan(5e-3);
    expect(Math.abs(s.bounds!.lowBeta.max - population.bounds!.lowBeta.max)).toBeLessThan(5e-3);
    expect(Math.abs(s.capm.low.beta - population.capm.low.beta)).toBeLessThan(5e-3);
    expect(s.bounds!.lowBeta.min).toBeLessThan(structure.lowBeta);
    expect(s.bounds!.lowBeta.max).toBeGreaterThan(structure.lowBeta);
  });
});
