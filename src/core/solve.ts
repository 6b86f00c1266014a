/**
 * solve: from aligned return series to moments, CAPM fits, the identified set, its candidate grid and
 * landmarks. Pure: numbers in, values out.
 *
 * Conventions: inputs are per-period returns in decimal units; every output is per period. Moments are
 * of excess returns (return minus the risk-free return of the same period); the market proxy is
 * M = w low + (1 - w) high, formed from the excess returns (valid because the weights sum to 1).
 * Divisor n - 1 throughout.
 */

import { diagnose, type Diagnostic } from "./diagnostics.js";
import { candidateGrid, identifiedBounds, marketMoments, type MomentSummary } from "./identify.js";
import { findLandmarks } from "./landmarks.js";
import { excessCrossProducts } from "./moments.js";
import { excessResidualSums, lineFitFromSums, type LineSums } from "./regression.js";
import { failure, success, type Result } from "./result.js";
import type { ReturnSample, SampleMoments, SeriesMoments, Solution, SolveOptions } from "./types.js";
import { assertParameter, defaultSteps, defaultWeight, minimumObservations } from "./parameters.js";

export { defaultSteps, defaultWeight, minimumObservations };

/** Solves the identified set for one sample. Fails (with diagnostics) only when nothing can be computed. */
export function solve(sample: ReturnSample, options: SolveOptions = {}): Result<Solution, Diagnostic[]> {
  const weight = options.weight ?? defaultWeight;
  const steps = options.steps ?? defaultSteps;
  assertParameter("solve", "weight", weight);
  assertParameter("solve", "steps", steps);
  if (sample.low.length !== sample.high.length) throw new RangeError("solve: low and high differ in length");

  const n = sample.low.length;
  if (n < minimumObservations) {
    return failure([diagnose({ code: "too-few-observations", observations: n, minimum: minimumObservations })]);
  }
  const riskFree = sample.riskFree ?? 0;
  if (typeof riskFree !== "number" && riskFree.length !== n) throw new RangeError("solve: riskFree differs in length");
  // The excess series low - rf, high - rf and the market are formed on the fly, never stored.
  const cp = excessCrossProducts(sample.low, sample.high, riskFree, weight);
  const variance = (i: number): number => cp.sums[i]![i]! / (n - 1);
  const covariance = (i: number, j: number): number => cp.sums[i]![j]! / (n - 1);
  const names = ["low", "high", "market"] as const;
  const constant = names.findIndex((_, i) => variance(i) === 0);
  if (constant >= 0) return failure([diagnose({ code: "zero-variance", series: names[constant]! })]);

  const seriesMoments = (i: number): SeriesMoments => {
    const v = variance(i);
    const stdev = Math.sqrt(v);
    return { mean: cp.means[i]!, variance: v, stdev, sharpeRatio: stdev > 0 ? cp.means[i]! / stdev : null };
  };
  const correlation = (i: number, j: number): number => cp.sums[i]![j]! / Math.sqrt(cp.sums[i]![i]! * cp.sums[j]![j]!);
  const moments: SampleMoments = {
    low: seriesMoments(0),
    high: seriesMoments(1),
    market: seriesMoments(2),
    covariance: { lowHigh: covariance(0, 1), lowMarket: covariance(0, 2), highMarket: covariance(1, 2) },
    correlation: { lowHigh: correlation(0, 1), lowMarket: correlation(0, 2), highMarket: correlation(1, 2) },
  };
  // Both CAPM fits from the same centred sums; their residuals take one more pass together.
  const lineSums = (i: number) => ({
    n,
    xbar: cp.means[2]!,
    ybar: cp.means[i]!,
    sxx: cp.sums[2]![2]!,
    sxy: cp.sums[i]![2]!,
    syy: cp.sums[i]![i]!,
  });
  const [lowSums, highSums] = [lineSums(0), lineSums(1)];
  const line = (sums: LineSums) => ({ ybar: sums.ybar, beta: sums.sxy / sums.sxx });
  const [lowSsr, highSsr] = excessResidualSums(sample.low, sample.high, riskFree, weight, cp.means[2]!, line(lowSums), line(highSums));
  const capm = { low: lineFitFromSums(lowSums, lowSsr), high: lineFitFromSums(highSums, highSsr) };
  const summary: MomentSummary = {
    weight,
    lowMean: moments.low.mean,
    highMean: moments.high.mean,
    lowVariance: moments.low.variance,
    highVariance: moments.high.variance,
    covariance: moments.covariance.lowHigh,
  };
  const identified = identifySet(summary, steps, moments.market.stdev / Math.sqrt(n));
  return success({ observations: n, weight, moments, capm, ...identified });
}

/** The identified set, grid and landmarks from moments alone (shared with the forward model). */
export function identifySet(
  summary: MomentSummary,
  steps: number,
  marketMeanStdErr: number,
): Pick<Solution, "bounds" | "grid" | "landmarks" | "diagnostics"> {
  const diagnostics: Diagnostic[] = [];
  const c = summary.covariance;
  const correlation = c / Math.sqrt(summary.lowVariance * summary.highVariance);
  if (!(c > 0)) {
    diagnostics.push(diagnose({ code: "nonpositive-covariance", covariance: c, correlation }));
    return { bounds: null, grid: [], landmarks: null, diagnostics };
  }
  if (Math.abs(correlation) >= 1 - 1e-12) diagnostics.push(diagnose({ code: "perfect-correlation", correlation }));
  const bounds = identifiedBounds(summary);
  if (bounds.lowBeta.max > 1) diagnostics.push(diagnose({ code: "low-beta-above-one", upperBound: bounds.lowBeta.max }));
  const { landmarks, diagnostics: landmarkDiagnostics } = findLandmarks(summary, bounds, marketMeanStdErr);
  diagnostics.push(...landmarkDiagnostics);
  const grid = candidateGrid(summary, bounds, steps);
  const nonFinite = firstNonFinite({ bounds, grid, landmarks });
  if (nonFinite !== null) {
    diagnostics.push(diagnose({ code: "degenerate-moments", quantity: nonFinite }));
    return { bounds: null, grid: [], landmarks: null, diagnostics };
  }
  return { bounds, grid, landmarks, diagnostics };
}

/**
 * The path of the first NaN or infinite number in `value`, or null: the core never reports either.
 * A plain walk without allocation (it runs once per window when rolling over a million rows).
 */
function firstNonFinite(value: unknown): string | null {
  if (typeof value === "number") return Number.isFinite(value) ? null : "";
  if (value === null || typeof value !== "object") return null;
  for (const key in value) {
    const found = firstNonFinite((value as Record<string, unknown>)[key]);
    if (found !== null) return found === "" ? key : `${key}.${found}`;
  }
  return null;
}

export { marketMoments };
