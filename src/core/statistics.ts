/**
 * The library's moments and line fit (exported by betabound/core): each checks its arguments and
 * returns a typed failure (diagnostics with stable codes, core/diagnostics.ts) rather than a NaN:
 * an entry that is not a finite number or a hole ("invalid-number", naming its index and value),
 * series of different lengths ("length-mismatch"), too few values ("too-few-observations"), values
 * whose squares leave double precision ("invalid-argument": the largest absolute value of a series
 * must lie within 1e-100 to 1e+100, core/parameters.ts), and for a line a constant x ("zero-variance").
 * Each series is computed scaled by its own power of two and the results scaled back (scaling.ts,
 * docs/methods.md §29), so the numbers are those of the plain computation bit for bit.
 */

import { firstInvalidNumber, issues, lengthMismatch } from "./arguments.js";
import { diagnose, type Diagnostic } from "./diagnostics.js";
import { type CrossProducts, welfordCrossProducts } from "./moments.js";
import { magnitudeRange } from "./parameters.js";
import { lineFitFromSums, residualSumOfSquares } from "./regression.js";
import { failure, type Result, success } from "./result.js";
import { scaleFor } from "./scaling.js";
import type { LineFit } from "./types.js";

export type { CrossProducts };

/** Checks every series; the scaled copies and their scales when all are valid. */
function checkedSeries(
  names: readonly string[],
  series: readonly ArrayLike<number>[],
  minimum: number,
): Result<{ scaled: Float64Array[]; scales: number[] }, Diagnostic[]> {
  const found = issues(...series.map((s, i) => firstInvalidNumber(names[i]!, s)));
  if (found.length > 0) return failure(found);
  const n = series[0]?.length ?? 0;
  found.push(...issues(...series.map((s, i) => lengthMismatch(names[i]!, s, n))));
  if (found.length > 0) return failure(found);
  if (n < minimum) return failure([diagnose({ code: "too-few-observations", observations: n, minimum })]);
  const scaled: Float64Array[] = [];
  const scales: number[] = [];
  for (const [i, s] of series.entries()) {
    let largest = 0;
    for (let t = 0; t < n; t++) largest = Math.max(largest, Math.abs(s[t]!));
    if (largest > 0 && (largest < magnitudeRange.min || largest > magnitudeRange.max)) {
      const expected = `values whose largest absolute value is within ${magnitudeRange.min} to ${magnitudeRange.max} (beyond, their squares leave double precision)`;
      found.push(diagnose({ code: "invalid-argument", argument: names[i]!, value: `up to ${largest} in absolute value`, expected }));
      continue;
    }
    const scale = scaleFor(largest);
    scaled.push(Float64Array.from({ length: n }, (_, t) => s[t]! * scale));
    scales.push(scale);
  }
  return found.length > 0 ? failure(found) : success({ scaled, scales });
}

/**
 * Means and centred sums of squares and cross-products of aligned series, in one pass
 * (moments.ts: Welford's updates with compensated sums). At least one value each.
 * @example crossProducts([[1, 2, 3], [2, 4, 7]]) // ok, value.sums[0][1] === 5
 */
export function crossProducts(series: readonly ArrayLike<number>[]): Result<CrossProducts, Diagnostic[]> {
  if (!Array.isArray(series))
    return failure([diagnose({ code: "invalid-argument", argument: "series", value: String(series), expected: "an array of series" })]);
  const checked = checkedSeries(
    series.map((_, i) => `series[${i}]`),
    series,
    1,
  );
  if (!checked.ok) return checked;
  const { scaled, scales } = checked.value;
  const cp = welfordCrossProducts(scaled);
  return success({
    n: cp.n,
    means: cp.means.map((m, i) => m / scales[i]!),
    sums: cp.sums.map((row, i) => row.map((v, j) => v / (scales[i]! * scales[j]!))),
  });
}

/** The arithmetic mean of at least one value. */
export function mean(x: ArrayLike<number>): Result<number, Diagnostic[]> {
  const checked = checkedSeries(["x"], [x], 1);
  if (!checked.ok) return checked;
  const { scaled, scales } = checked.value;
  return success(welfordCrossProducts(scaled).means[0]! / scales[0]!);
}

/** The sample variance (divisor n - 1, Bessel's correction) of at least two values. */
export function sampleVariance(x: ArrayLike<number>): Result<number, Diagnostic[]> {
  return secondMoment(["x"], [x]);
}

/** The sample standard deviation: the square root of `sampleVariance`. */
export function sampleStdev(x: ArrayLike<number>): Result<number, Diagnostic[]> {
  const variance = sampleVariance(x);
  return variance.ok ? success(Math.sqrt(variance.value)) : variance;
}

/** The sample covariance (divisor n - 1) of two aligned series of at least two values. */
export function sampleCovariance(x: ArrayLike<number>, y: ArrayLike<number>): Result<number, Diagnostic[]> {
  return secondMoment(["x", "y"], [x, y]);
}

/** sums[0][last] / (n - 1) of one or two series. */
function secondMoment(names: readonly string[], series: readonly ArrayLike<number>[]): Result<number, Diagnostic[]> {
  const checked = checkedSeries(names, series, 2);
  if (!checked.ok) return checked;
  const { scaled, scales } = checked.value;
  const cp = welfordCrossProducts(scaled);
  const last = scaled.length - 1;
  return success(cp.sums[0]![last]! / (cp.n - 1) / (scales[0]! * scales[last]!));
}

/**
 * Neumaier's compensated sum (an improved Kahan-Babuska summation): the rounding error of each
 * addition is carried separately and added back at the end. Fails on a value that is not a finite
 * number (naming its position) and on a sum beyond double precision.
 * Neumaier, A. (1974), ZAMM 54(1), 39-51.
 */
export function compensatedSum(values: Iterable<number>): Result<number, Diagnostic[]> {
  let sum = 0;
  let compensation = 0;
  let index = 0;
  for (const v of values) {
    if (typeof v !== "number" || !Number.isFinite(v)) {
      return failure([diagnose({ code: "invalid-number", argument: "values", index, value: String(v) })]);
    }
    const t = sum + v;
    compensation += Math.abs(sum) >= Math.abs(v) ? sum - t + v : v - t + sum;
    sum = t;
    index++;
  }
  const total = sum + compensation;
  if (!Number.isFinite(total)) {
    return failure([
      diagnose({
        code: "invalid-argument",
        argument: "values",
        value: "a sum beyond double precision",
        expected: "values whose sum is a finite number",
      }),
    ]);
  }
  return success(total);
}

/**
 * Ordinary least squares of y = alpha + beta x + e with classical standard errors (regression.ts,
 * docs/methods.md §10), on at least three points with a non-constant x.
 */
export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>): Result<LineFit, Diagnostic[]> {
  const checked = checkedSeries(["x", "y"], [x, y], 3);
  if (!checked.ok) return checked;
  const [xs, ys] = checked.value.scaled as [Float64Array, Float64Array];
  const [px, py] = checked.value.scales as [number, number];
  const cp = welfordCrossProducts([xs, ys]);
  const [xbar, ybar] = cp.means as [number, number];
  const sums = { n: cp.n, xbar, ybar, sxx: cp.sums[0]![0]!, sxy: cp.sums[0]![1]!, syy: cp.sums[1]![1]! };
  if (!(sums.sxx > 0)) return failure([diagnose({ code: "zero-variance", series: "x" })]);
  const fit = lineFitFromSums(sums, residualSumOfSquares(xs, ys, xbar, ybar, sums.sxy / sums.sxx));
  // Back in the data's units: y's (alpha and the residuals) and y's per x's (beta).
  const slope = px / py;
  return success({
    ...fit,
    alpha: fit.alpha / py,
    beta: fit.beta * slope,
    alphaStdErr: fit.alphaStdErr / py,
    betaStdErr: fit.betaStdErr * slope,
    residualVariance: fit.residualVariance / (py * py),
    residualStdError: fit.residualStdError / py,
    residualSumOfSquares: fit.residualSumOfSquares / (py * py),
  });
}
