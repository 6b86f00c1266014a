/**
 * A small Monte Carlo version of scripts/coverage-study.ts (docs/coverage-study.md): 200 samples of
 * n = 500 from the model with the true low beta at the lower end of its identified set (no noise in
 * the high book), where the Imbens-Manski (2004) 95% interval is exact asymptotically.
 * Checks, each against its sampling error:
 * - coverage of the true beta within 3 binomial standard deviations of 95%:
 *   0.95 +- 3 sqrt(0.95 * 0.05 / 200) = [0.904, 0.996];
 * - the mean delta-method standard error within 15% of the Monte Carlo sd of the estimates times
 *   sqrt(1 - b + b^2/3), b = 6 sqrt(500)/500 the default bandwidth's share of the sample: under fixed-b
 *   asymptotics the Bartlett estimate's expected share of the long-run variance is 1 - b + b^2/3
 *   (Kiefer & Vogelsang 2005), which the fixed-b critical value makes up for (the sd of a sample sd
 *   from 200 draws is about 1/sqrt(2 * 199) = 5%; 15% is three of those).
 */

import { describe, expect, test } from "vitest";
import { populationMoments } from "../../../src/core/forward/populationMoments.js";
import { identifiedBounds } from "../../../src/core/identify.js";
import { assessUncertainty } from "../../../src/core/inference/uncertainty.js";
import { ok } from "../helpers.js";
import { drawSample } from "../../../src/core/forward/simulate.js";

const structure = { lowBeta: 0.7, weight: 0.5, factorVol: 0.01, factorMean: 0.0003, lowNoiseVol: 0.006, highNoiseVol: 0 };
const reps = 200;

describe("coverage of the Imbens-Manski interval at the end of the set (Gaussian iid, n = 500)", () => {
  const estimates: number[] = [];
  const stdErrors: number[] = [];
  let covered = 0;
  for (let rep = 0; rep < reps; rep++) {
    const u = ok(assessUncertainty(drawSample(structure, { periods: 500, seed: 500 + rep })));
    const interval = u.lowBeta!.interval;
    if (interval.lower <= structure.lowBeta && structure.lowBeta <= interval.upper) covered++;
    estimates.push(u.bounds!.lowBeta.min.estimate);
    stdErrors.push(u.bounds!.lowBeta.min.stdError);
  }

  test("the truth is the population lower bound (s_high = 0 makes b_low = Lb, docs/methods.md §1.2)", () => {
    expect(identifiedBounds(populationMoments(structure)).lowBeta.min).toBeCloseTo(0.7, 12);
  });

  test("covers the true beta in 95% of samples, within 3 binomial standard deviations", () => {
    const band = 3 * Math.sqrt((0.95 * 0.05) / reps);
    expect(Math.abs(covered / reps - 0.95)).toBeLessThanOrEqual(band);
  });

  test("the delta-method standard error of the lower bound matches the Monte Carlo spread, shrunk as fixed-b expects, within 15%", () => {
    const mean = estimates.reduce((s, v) => s + v, 0) / reps;
    const sd = Math.sqrt(estimates.reduce((s, v) => s + (v - mean) ** 2, 0) / (reps - 1));
    const averageSe = stdErrors.reduce((s, v) => s + v, 0) / reps;
    const b = (6 * Math.sqrt(500)) / 500;
    expect(Math.abs(averageSe / (sd * Math.sqrt(1 - b + (b * b) / 3)) - 1)).toBeLessThan(0.15);
  });
});
