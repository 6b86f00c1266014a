/**
 * solve: from aligned return series to moments, CAPM fits, the identified set, its candidate grid and
 * landmarks. Pure: numbers in, values out.
 *
 * Conventions: inputs are per-period returns in decimal units; every output is per period. Moments are
 * of excess returns (return minus the risk-free return of the same period); the market proxy is
 * M = w low + (1 - w) high, formed from the excess returns (valid because the weights sum to 1).
 * Divisor n - 1 throughout.
 */

import { checkedSample, issues, parameterIssue } from "./arguments.js";
import { covarianceCancellation, magnitudeIssue, type RoundingScales, varianceCancellation } from "./cancellation.js";
import { diagnose, type Diagnostic } from "./diagnostics.js";
import { candidateGrid, identifiedBounds, isPerfectCorrelation, marketMoments, noiseFreePoint, type MomentSummary } from "./identify.js";
import { fiellerCriticalValue, findLandmarks } from "./landmarks.js";
import { type CrossProducts, excessCrossProducts } from "./moments.js";
import { excessResidualSums, lineFitFromSums, type LineSums } from "./regression.js";
import { failure, success, type Result } from "./result.js";
import { scaleFor, unitsOf, unscaleDiagnostic, unscaleSolution } from "./scaling.js";
import type { ReturnSample, SampleMoments, SeriesMoments, Solution, SolveOptions } from "./types.js";
import { defaultConfidence, defaultSteps, defaultWeight, minimumObservations } from "./parameters.js";

export { defaultSteps, defaultWeight, minimumObservations };

/**
 * Solves the identified set for one sample. Fails (with diagnostics) when nothing can be computed: an
 * argument that is not a finite number or breaks its rule (core/parameters.ts), too few observations,
 * returns out of double precision's reach, or a series constant (or constant up to rounding).
 */
export function solve(sample: ReturnSample, options: SolveOptions = {}): Result<Solution, Diagnostic[]> {
  const solved = solveKeepingMoments(sample, options);
  return solved.ok ? success(solved.value.solution) : solved;
}

/**
 * The moments `solve` formed on its way, for the steps after it on the same sample (assessPricing
 * takes them instead of passing over the rows again): the scaled excess returns' cross products at
 * `weight`, and the sample they belong to (a step given them for another sample or weight ignores them).
 * They describe the sample's arrays as they were: a caller that changes the arrays afterwards must not
 * pass them on.
 */
export interface SolvedMoments {
  readonly sample: ReturnSample;
  readonly weight: number;
  /** The power of two the excess returns were multiplied by (scaling.ts). */
  readonly scale: number;
  /** excessCrossProducts(low, high, riskFree, weight, scale): low, high and the market. */
  readonly crossProducts: CrossProducts;
}

/** `solve`, with the moments it formed (SolvedMoments). */
export function solveKeepingMoments(
  sample: ReturnSample,
  options: SolveOptions = {},
): Result<{ solution: Solution; moments: SolvedMoments }, Diagnostic[]> {
  const weight = options.weight ?? defaultWeight;
  const steps = options.steps ?? defaultSteps;
  const confidence = options.confidence ?? defaultConfidence;
  const checked = checkedSample(sample);
  const invalid = checked.ok ? [] : checked.issues;
  invalid.push(
    ...issues(
      parameterIssue("weight", "weight", weight),
      parameterIssue("steps", "steps", steps),
      parameterIssue("confidence", "confidence", confidence),
    ),
  );
  if (!checked.ok || invalid.length > 0) return failure(invalid);

  const n = sample.low.length;
  if (n < minimumObservations) {
    return failure([diagnose({ code: "too-few-observations", observations: n, minimum: minimumObservations })]);
  }
  const riskFree = sample.riskFree ?? 0;
  const extent = checked.value;
  const outOfRange = magnitudeIssue(extent.low, extent.high);
  if (outOfRange !== null) return failure([diagnose(outOfRange)]);
  // Computed on the data times a power of two (exact), reported in the data's units (scaling.ts).
  const scale = scaleFor(Math.max(extent.low, extent.high));
  const scales: RoundingScales = { low: (extent.low + extent.riskFree) * scale, high: (extent.high + extent.riskFree) * scale };
  // The excess series low - rf, high - rf and the market are formed on the fly, never stored.
  const cp = excessCrossProducts(sample.low, sample.high, riskFree, weight, scale);
  const variance = (i: number): number => cp.sums[i]![i]! / (n - 1);
  const covariance = (i: number, j: number): number => cp.sums[i]![j]! / (n - 1);
  const names = ["low", "high", "market"] as const;
  const constant = names.findIndex((_, i) => variance(i) === 0);
  if (constant >= 0) return failure([diagnose({ code: "zero-variance", series: names[constant]! })]);

  const summary: MomentSummary = {
    weight,
    lowMean: cp.means[0]!,
    highMean: cp.means[1]!,
    lowVariance: variance(0),
    highVariance: variance(1),
    covariance: covariance(0, 1),
  };
  const cancelled = varianceCancellation(n, summary, variance(2), scales);
  if (cancelled !== null) return failure([unscaleDiagnostic(diagnose(cancelled), unitsOf(scale))]);

  const seriesMoments = (i: number): SeriesMoments => {
    const v = variance(i);
    const stdev = Math.sqrt(v);
    return { mean: cp.means[i]!, variance: v, stdev, sharpeRatio: stdev > 0 ? cp.means[i]! / stdev : null };
  };
  const correlation = (i: number, j: number): number => cp.sums[i]![j]! / (Math.sqrt(cp.sums[i]![i]!) * Math.sqrt(cp.sums[j]![j]!));
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
  const [lowSsr, highSsr] = excessResidualSums(
    sample.low,
    sample.high,
    riskFree,
    weight,
    cp.means[2]!,
    line(lowSums),
    line(highSums),
    scale,
  );
  const capm = { low: lineFitFromSums(lowSums, lowSsr), high: lineFitFromSums(highSums, highSsr) };
  const identified = identifySet(summary, steps, moments.market.stdev / Math.sqrt(n), { n, ...scales }, fiellerCriticalValue(confidence));
  return success({
    solution: unscaleSolution({ observations: n, weight, moments, capm, ...identified }, unitsOf(scale)),
    moments: { sample, weight, scale, crossProducts: cp },
  });
}

/**
 * The identified set, grid and landmarks from moments alone (shared with the forward model and the
 * rolling windows). `rounding`: the sample size and the books' rounding scales, when the moments come
 * from data (cancellation.ts); a covariance that is rounding is then refused like a non-positive one.
 */
export function identifySet(
  summary: MomentSummary,
  steps: number,
  marketMeanStdErr: number,
  rounding?: RoundingScales & { readonly n: number },
  criticalValue: number = fiellerCriticalValue(),
): Pick<Solution, "bounds" | "grid" | "landmarks" | "diagnostics"> {
  const diagnostics: Diagnostic[] = [];
  const rejected = (d: Diagnostic) => ({ bounds: null, grid: [], landmarks: null, diagnostics: [...diagnostics, d] });
  const c = summary.covariance;
  const correlation = c / (Math.sqrt(summary.lowVariance) * Math.sqrt(summary.highVariance));
  // A covariance at the level of rounding has no sign (an exact 0 is reported as not positive).
  const cancelled = rounding === undefined || c === 0 ? null : covarianceCancellation(rounding.n, summary, rounding);
  if (cancelled !== null) return rejected(diagnose(cancelled));
  if (!(c > 0)) return rejected(diagnose({ code: "nonpositive-covariance", covariance: c, correlation }));
  const perfect = isPerfectCorrelation(correlation);
  if (perfect) diagnostics.push(diagnose({ code: "perfect-correlation", correlation }));
  // Perfectly correlated books: the set is one point, the structure with no noise (identify.ts).
  const point = perfect ? noiseFreePoint(summary) : null;
  const bounds = point?.bounds ?? identifiedBounds(summary);
  // The whole set above 1 says the books look swapped; part of it, that the labels are not implied.
  if (bounds.lowBeta.min > 1)
    diagnostics.push(diagnose({ code: "books-swapped", lowerBound: bounds.lowBeta.min, upperBound: bounds.lowBeta.max }));
  else if (bounds.lowBeta.max > 1) diagnostics.push(diagnose({ code: "low-beta-above-one", upperBound: bounds.lowBeta.max }));
  const found = findLandmarks(summary, bounds, marketMeanStdErr, criticalValue);
  diagnostics.push(...found.diagnostics);
  const landmarks =
    point === null
      ? found.landmarks
      : {
          lowNoiseFree: point.structure,
          highNoiseFree: point.structure,
          equalNoise: point.structure,
          capmConsistent: point.structure,
          returnImplied: found.landmarks.returnImplied,
        };
  const grid = point === null ? candidateGrid(summary, bounds, steps) : Array.from({ length: steps }, () => point.structure);
  const nonFinite = firstNonFinite({ bounds, grid, landmarks });
  if (nonFinite !== null) return rejected(diagnose({ code: "degenerate-moments", quantity: nonFinite }));
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
