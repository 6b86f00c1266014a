/**
 * Real solutions for the report tests, made by the core's `solve` from small deterministic series
 * drawn from a one-factor model (seeded generator, so every run sees the same numbers).
 */

import type { PricingJson } from "../../src/schema/pricing.js";
import { solve } from "../../src/core/solve.js";
import type { Uncertainty } from "../../src/core/inference/uncertaintyTypes.js";
import type { ReturnSample, Solution, SolveOptions } from "../../src/core/types.js";
import type { InputDescription, SolveReport } from "../../src/report/types.js";
import { normals } from "../support/random.js";

export interface FactorModel {
  readonly n: number;
  readonly seed: number;
  readonly factorMean: number;
  readonly factorSd: number;
  readonly lowBeta: number;
  readonly highBeta: number;
  readonly lowNoiseSd: number;
  readonly highNoiseSd: number;
}

export const monthly: FactorModel = {
  n: 60,
  seed: 7,
  factorMean: 0.008,
  factorSd: 0.04,
  lowBeta: 0.7,
  highBeta: 1.3,
  lowNoiseSd: 0.012,
  highNoiseSd: 0.02,
};

/** Draws low and high return series from the model. */
export function drawSample(model: FactorModel): { low: number[]; high: number[] } {
  const z = normals(model.seed);
  const low: number[] = [];
  const high: number[] = [];
  for (let t = 0; t < model.n; t++) {
    const f = model.factorMean + model.factorSd * z();
    low.push(model.lowBeta * f + model.lowNoiseSd * z());
    high.push(model.highBeta * f + model.highNoiseSd * z());
  }
  return { low, high };
}

/** Solves a sample, failing the test if the core cannot. */
export function solved(sample: ReturnSample, options: SolveOptions = {}): Solution {
  const result = solve(sample, options);
  if (!result.ok) throw new Error(`fixture did not solve: ${result.issues.map((d) => d.message).join("; ")}`);
  return result.value;
}

export const input: InputDescription = {
  source: "examples/books.csv",
  dateColumn: "Date",
  lowColumn: "Low Vol",
  highColumn: "High Beta",
  riskFree: { kind: "constant", rate: 0.001 },
  units: "percent",
  firstDate: "2019-01-31",
  lastDate: "2023-12-31",
  layout: "wide",
  inputKind: "returns",
  block: 1,
  rowsRead: 62,
  rowsUsed: 60,
  rowsDropped: 2,
  rowsConsumed: 0,
  join: null,
  droppedDates: ["2020-03-31", "2021-07-31"],
  frequency: { name: "monthly", periodsPerYear: 12 },
};

export function reportOf(
  solution: Solution,
  overrides: Partial<InputDescription> = {},
  uncertainty: Uncertainty | null = null,
  pricing: PricingJson | null = null,
): SolveReport {
  const rowsRead = solution.observations + input.rowsDropped;
  return {
    tool: { name: "betabound", version: "0.1.0-test" },
    input: { ...input, rowsRead, rowsUsed: solution.observations, ...overrides },
    solution,
    uncertainty,
    pricing,
    index: null,
    sensitivity: null,
    factorModel: null,
    inputWarnings: [],
  };
}

/** A typical sample: identified set, all five landmarks, 11 grid candidates. */
export function typicalSolution(): Solution {
  return solved({ ...drawSample(monthly), riskFree: 0.001 }, { weight: 0.5, steps: 11 });
}

/** Low noise much larger than the covariance: V_low > C, so the set's upper end exceeds 1 (a warning). */
export function labelFlipSolution(): Solution {
  return solved(drawSample({ ...monthly, seed: 11, lowBeta: 0.9, highBeta: 1.1, lowNoiseSd: 0.06 }), { weight: 0.6, steps: 5 });
}

/** Demeaned series: the market mean is ~0, so returnImplied is null (an info diagnostic). */
export function zeroMeanSolution(): Solution {
  const { low, high } = drawSample({ ...monthly, seed: 3 });
  const demean = (xs: number[]): number[] => {
    const m = xs.reduce((a, b) => a + b, 0) / xs.length;
    return xs.map((x) => x - m);
  };
  return solved({ low: demean(low), high: demean(high) }, { steps: 3 });
}

/** Negative mean factor return: expected alphas change sign (and zero may come out as -0). */
export function negativePremiumSolution(): Solution {
  return solved(drawSample({ ...monthly, seed: 5, factorMean: -0.02 }), { weight: 0.4, steps: 7 });
}

/** high = -low + noise: the covariance is negative, the model is rejected (bounds and landmarks null). */
export function rejectedSolution(): Solution {
  const z = normals(99);
  const low = Array.from({ length: 24 }, () => 0.01 + 0.03 * z());
  const high = low.map((x) => -x + 0.005 * z());
  return solved({ low, high });
}

/** Every fixture that has an identified set, by name. */
export function solvedFixtures(): Record<string, Solution> {
  return {
    typical: typicalSolution(),
    labelFlip: labelFlipSolution(),
    zeroMean: zeroMeanSolution(),
    negativePremium: negativePremiumSolution(),
  };
}
