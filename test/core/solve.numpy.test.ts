/**
 * solve against an independent numpy implementation (test/fixtures/reference/generate_solve.py):
 * 600 daily-like rows from the one-factor model with a time-varying risk-free rate, solved for
 * w = 0.5 and w = 0.3 with 11 grid steps. Every field of the Solution is compared.
 *
 * Tolerance: 1e-10 relative. Both sides are float64 on exactly the same inputs (the CSV is written with
 * repr, which round-trips), but by different algorithms: numpy's pairwise sums, np.cov and an SVD
 * lstsq against the core's own moment and closed-form OLS code, and scipy's t distribution against the
 * core's. On these well-conditioned data (correlations 0.71-0.99) such implementations agree to about
 * 1e-13; the fields that are differences (noise variances V - b^2 phi, residual variances V(1 - R^2),
 * alphas (b - beta) lambda) lose one or two more digits. 1e-10 keeps that headroom while any formula or
 * divisor slip (n vs n - 1 alone is 1.7e-3 here) fails by orders of magnitude.
 * Fields whose exact value is 0 (a noise variance at an endpoint of the set) get an absolute floor of
 * 1e-10 times their natural scale (listed in `absoluteFloor`). p-values below 1e-300 (numpy/scipy
 * return 0.0 there: the high book's beta t-statistic is near 90-170) are only required to be below
 * 1e-290: neither side carries relative accuracy in the subnormal range.
 */

import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import type { Solution } from "../../src/core/types.js";
import { codes, solveOk } from "./helpers.js";

const rel = 1e-10;

/** A tiny reader for the fixture CSV: header `date,low,high,rf`, plain decimal numbers, LF endings. */
function readDataset(): { dates: string[]; low: number[]; high: number[]; rf: number[] } {
  const text = readFileSync(new URL("../fixtures/reference/solve_dataset.csv", import.meta.url), "utf8");
  const [header, ...lines] = text.split("\n").filter((line) => line !== "");
  expect(header).toBe("date,low,high,rf");
  const out = { dates: [] as string[], low: [] as number[], high: [] as number[], rf: [] as number[] };
  for (const line of lines) {
    const cells = line.split(",");
    expect(cells, line).toHaveLength(4);
    const [date, low, high, rf] = cells as [string, string, string, string];
    const numbers = [low, high, rf].map((cell) => {
      const x = Number(cell);
      if (cell.trim() === "" || !Number.isFinite(x)) throw new Error(`solve_dataset.csv: bad number ${JSON.stringify(cell)}`);
      return x;
    });
    out.dates.push(date);
    out.low.push(numbers[0] as number);
    out.high.push(numbers[1] as number);
    out.rf.push(numbers[2] as number);
  }
  return out;
}

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

interface ExpectedSolution {
  readonly observations: number;
  readonly weight: number;
  readonly moments: Json;
  readonly capm: Json;
  readonly bounds: Json;
  readonly grid: Json[];
  readonly landmarks: Json;
  readonly diagnosticCodes: string[];
  readonly checks: { readonly marketMeanTStat: number; readonly returnImpliedLowBeta: number };
}

const expectedFile = JSON.parse(readFileSync(new URL("../fixtures/reference/solve_expected.json", import.meta.url), "utf8")) as {
  readonly generator: { readonly observations: number; readonly steps: number };
  readonly solutions: readonly ExpectedSolution[];
};
const data = readDataset();

/** Compares every leaf of `expected` with `actual`; objects must have the same keys (so no field is unchecked). */
function compareTree(actual: unknown, expected: Json, path: string, floors: Record<string, number>, failures: string[]): void {
  if (expected === null || typeof expected === "boolean" || typeof expected === "string") {
    if (actual !== expected) failures.push(`${path}: expected ${String(expected)}, got ${String(actual)}`);
    return;
  }
  if (typeof expected === "number") {
    if (typeof actual !== "number") {
      failures.push(`${path}: expected ${expected}, got ${String(actual)}`);
      return;
    }
    const key = path.slice(path.lastIndexOf(".") + 1);
    if (/PValue$/.test(key) && expected < 1e-300) {
      if (!(actual >= 0 && actual < 1e-290)) failures.push(`${path}: expected a p-value below 1e-290 (numpy ${expected}), got ${actual}`);
      return;
    }
    const bound = rel * Math.abs(expected) + rel * (floors[key] ?? 0);
    if (!(Math.abs(actual - expected) <= bound)) {
      failures.push(
        `${path}: expected ${expected} (numpy), got ${actual}, relative difference ${Math.abs(actual - expected) / Math.abs(expected)}`,
      );
    }
    return;
  }
  if (Array.isArray(expected)) {
    if (!Array.isArray(actual) || actual.length !== expected.length) {
      failures.push(`${path}: expected an array of ${expected.length}, got ${Array.isArray(actual) ? actual.length : typeof actual}`);
      return;
    }
    expected.forEach((e, i) => compareTree(actual[i], e, `${path}[${i}]`, floors, failures));
    return;
  }
  if (typeof actual !== "object" || actual === null) {
    failures.push(`${path}: expected an object, got ${String(actual)}`);
    return;
  }
  const actualKeys = Object.keys(actual).sort();
  const expectedKeys = Object.keys(expected).sort();
  if (actualKeys.join() !== expectedKeys.join())
    failures.push(`${path}: fields ${actualKeys.join(", ")} but numpy has ${expectedKeys.join(", ")}`);
  for (const key of expectedKeys)
    compareTree((actual as Record<string, unknown>)[key], expected[key] as Json, `${path}.${key}`, floors, failures);
}

describe.each(expectedFile.solutions.map((e) => ({ w: e.weight, e })))("solve on the numpy reference data set, w = $w", ({ w, e }) => {
  const solution: Solution = solveOk(
    { low: data.low, high: data.high, riskFree: data.rf },
    { weight: w, steps: expectedFile.generator.steps },
  );
  const lowVariance = (e.moments as { low: { variance: number } }).low.variance;
  const highVariance = (e.moments as { high: { variance: number } }).high.variance;
  const lambda = (e.moments as { market: { mean: number } }).market.mean;
  /** Natural scales for fields that can be exactly 0 (times rel gives the absolute floor). */
  const absoluteFloor: Record<string, number> = {
    lowNoiseVariance: lowVariance,
    highNoiseVariance: highVariance,
    lowResidualVariance: lowVariance,
    highResidualVariance: highVariance,
    noiseShare: 1,
    expectedLowAlpha: Math.abs(lambda),
    expectedHighAlpha: Math.abs(lambda),
  };
  const check = (actual: unknown, expected: Json, path: string): void => {
    const failures: string[] = [];
    compareTree(actual, expected, path, absoluteFloor, failures);
    expect(failures).toEqual([]);
  };

  test(`reads all ${expectedFile.generator.observations} rows of the CSV and reports them as the observation count (numpy fixture)`, () => {
    expect(data.low).toHaveLength(expectedFile.generator.observations);
    expect(solution.observations).toBe(e.observations);
    expect(solution.weight).toBe(e.weight);
  });

  test("the Solution has exactly the fields the numpy reference computes", () => {
    expect(Object.keys(solution).sort()).toEqual([
      "bounds",
      "capm",
      "diagnostics",
      "grid",
      "landmarks",
      "moments",
      "observations",
      "weight",
    ]);
  });

  test("moments of excess returns (means, variances, SDs, Sharpe ratios, covariances, correlations) match numpy to 1e-10", () => {
    check(solution.moments, e.moments, "moments");
  });

  test("the CAPM fits of low and high on the market match numpy lstsq with classical SEs and scipy t_{n-2} p-values to 1e-10", () => {
    check(solution.capm, e.capm, "capm");
  });

  test("the bounds of the low beta, high beta and factor variance match numpy to 1e-10", () => {
    check(solution.bounds, e.bounds, "bounds");
  });

  test("every field of all 11 grid candidates matches numpy to 1e-10", () => {
    check(solution.grid, e.grid, "grid");
  });

  test("every field of the five landmarks matches numpy to 1e-10", () => {
    check(solution.landmarks, e.landmarks, "landmarks");
  });

  test("moments are of excess returns: ignoring the time-varying risk-free rate would miss numpy's excess-return covariance", () => {
    // Guards the comparison above: with rf dropped, the covariance moves far beyond the 1e-10 tolerance.
    const raw = solveOk({ low: data.low, high: data.high }, { weight: w });
    const expectedCovariance = (e.moments as { covariance: { lowHigh: number } }).covariance.lowHigh;
    expect(Math.abs(raw.moments.covariance.lowHigh - expectedCovariance) / expectedCovariance).toBeGreaterThan(1e3 * rel);
    expect(Math.abs(raw.moments.low.mean - (e.moments as { low: { mean: number } }).low.mean)).toBeGreaterThan(1e-5);
  });

  test("the diagnostic codes are the ones the numpy reference derives", () => {
    expect(codes(solution.diagnostics).sort()).toEqual([...e.diagnosticCodes].sort());
  });
});
