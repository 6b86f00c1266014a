/**
 * Standard errors of the Sharpe ratio SR = mu / sigma of an excess-return series (docs/methods.md §12).
 *
 * - iid normal (Lo 2002, "The Statistics of Sharpe Ratios", Financial Analysts Journal 58(4), 36-52):
 *   SE = sqrt((1 + SR^2 / 2) / T).
 * - iid non-normal (Mertens 2002): SE = sqrt((1 - g3 SR + (g4 - 1)/4 SR^2) / T), g3 skewness, g4
 *   kurtosis (not excess).
 * - HAC delta method (Lo 2002's GMM form): theta = (mu, sigma^2), dSR/dtheta = (1/sigma,
 *   -mu / (2 sigma^3)), Var = g' Sigma g / T with Sigma the HAC long-run covariance (longRun.ts) of
 *   (r_t - mu, (r_t - mu)^2 - sigma^2). With a zero lag and Sigma's divisor T this is Mertens' form
 *   with moment estimates of divisor T. Computed on the standardised functions (d / sigma,
 *   (d / sigma)^2 - 1) with g = (1, -SR / 2), which gives the same Var for a given bandwidth and an
 *   automatic bandwidth that does not depend on the returns' units (the raw pair mixes two units).
 * The estimate uses the sample standard deviation (divisor T - 1), as the rest of the project.
 */

import { borrowSeries, giveBack } from "../numerics/scratch.js";
import { type InfluenceKernel, inChunksOfOne, influenceKernel } from "../numerics/seriesKernel.js";
import { longRunCovarianceInPlace } from "./hac/longRun.js";
import { bilinear } from "../numerics/linearAlgebra.js";
import type { HacOptions } from "./options.js";
import { CHUNK, plainSum } from "../numerics/seriesLoops.js";

export interface SharpeStdErrors {
  readonly estimate: number;
  readonly iidStdErr: number;
  /** Mertens (2002) iid standard error with the sample's skewness and kurtosis (moment estimates, divisor T). */
  readonly mertensStdErr: number;
  readonly hacStdErr: number;
}

/** Lo (2002) iid-normal standard error. */
export function sharpeIidStdErr(sharpe: number, observations: number): number {
  return Math.sqrt((1 + (sharpe * sharpe) / 2) / observations);
}

/** Mertens (2002) iid standard error with skewness and (raw) kurtosis. */
export function sharpeMertensStdErr(sharpe: number, skewness: number, kurtosis: number, observations: number): number {
  return Math.sqrt((1 - skewness * sharpe + ((kurtosis - 1) / 4) * sharpe * sharpe) / observations);
}

/** Estimate, Lo iid and HAC delta-method standard errors of the Sharpe ratio of `excess`. */
export function sharpeStdErrors(excess: ArrayLike<number>, hac: HacOptions = {}, useKernel = true): SharpeStdErrors {
  const n = excess.length;
  // Both are written in full below before they are read.
  const first = borrowSeries(n);
  const second = borrowSeries(n);
  // The moment functions standardised, (d / sigma, (d / sigma)^2 - 1), with the gradient (1, -SR / 2):
  // the same quadratic form for a given bandwidth, and an automatic bandwidth free of the returns' units.
  // sums: m2, m3, m4 and the two series' plain sums, for the long-run covariance's means (longRun.ts).
  const { mu, sigma, sums } = standardise(excess, first, second, useKernel ? influenceKernel() : null);
  const estimate = mu / sigma;
  const [m2, m3, m4, sumFirst, sumSecond] = sums as unknown as [number, number, number, number, number];
  // Skewness and kurtosis are ratios of central moments: the same from z as from the returns.
  const skewness = m3 / n / (m2 / n) ** 1.5;
  const kurtosis = m4 / n / (m2 / n) ** 2;
  const sigmaHat = longRunCovarianceInPlace([first, second], hac, { sums: [sumFirst, sumSecond] }).covariance;
  giveBack(first, second);
  const gradient = [1, -estimate / 2];
  return {
    estimate,
    iidStdErr: sharpeIidStdErr(estimate, n),
    // A quadratic in SR that is non-negative for any sample's skewness and kurtosis (g4 >= 1 + g3^2).
    mertensStdErr: sharpeMertensStdErr(estimate, skewness, kurtosis, n),
    // A quadratic form of a positive semi-definite matrix: negative only by rounding.
    hacStdErr: Math.sqrt(Math.max(0, bilinear(gradient, sigmaHat, gradient)) / n),
  };
}

/**
 * The mean, the standard deviation (divisor n - 1), the standardised series z and z^2 - 1 (into `first`
 * and `second`) and sums of z^2, z^3, z^4, z and z^2 - 1. In chunks by small functions V8 optimises
 * whole (seriesLoops.ts), or in the WebAssembly kernel (numerics/seriesKernel.ts, the same bits).
 */
function standardise(
  excess: ArrayLike<number>,
  first: Float64Array,
  second: Float64Array,
  kernel: InfluenceKernel | null,
): { mu: number; sigma: number; sums: Float64Array } {
  const n = excess.length;
  const sums = new Float64Array(5);
  if (kernel !== null) {
    // Chunk by chunk at every length: a JavaScript loop runs unoptimised for its first tens of
    // thousands of rows.
    const { state } = kernel;
    state.fill(0, 0, 8);
    inChunksOfOne(kernel, excess, (_from, count) => kernel.sumOfOne(count));
    const mu = state[0]! / n;
    inChunksOfOne(kernel, excess, (_from, count) => kernel.squaredDeviations(count, mu));
    const sigma = Math.sqrt(state[1]! / (n - 1));
    inChunksOfOne(kernel, excess, (from, count) => {
      kernel.standardiseChunk(count, mu, sigma);
      first.set(kernel.columns[1].subarray(0, count), from);
      second.set(kernel.columns[2].subarray(0, count), from);
    });
    sums.set(state.subarray(3, 8));
    return { mu, sigma, sums };
  }
  const mu = plainSum(excess) / n;
  for (let from = 0; from < n; from += CHUNK) squaredDeviationChunk(excess, mu, from, Math.min(n, from + CHUNK), sums);
  const ss = sums[0]!;
  const variance = ss / (n - 1);
  const sigma = Math.sqrt(variance);
  sums.fill(0);
  for (let from = 0; from < n; from += CHUNK) standardChunk(excess, mu, sigma, first, second, from, Math.min(n, from + CHUNK), sums);
  return { mu, sigma, sums };
}

function squaredDeviationChunk(x: ArrayLike<number>, mu: number, from: number, to: number, sums: Float64Array): void {
  let total = sums[0]!;
  for (let t = from; t < to; t++) total += (x[t]! - mu) ** 2;
  sums[0] = total;
}

/** first = z = (x - mu) / sigma and second = z^2 - 1 over rows [from, to); sums += z^2, z^3, z^4, z, z^2 - 1. */
function standardChunk(
  x: ArrayLike<number>,
  mu: number,
  sigma: number,
  first: Float64Array,
  second: Float64Array,
  from: number,
  to: number,
  sums: Float64Array,
): void {
  let m2 = sums[0]!;
  let m3 = sums[1]!;
  let m4 = sums[2]!;
  let sumFirst = sums[3]!;
  let sumSecond = sums[4]!;
  for (let t = from; t < to; t++) {
    const z = (x[t]! - mu) / sigma;
    const zz = z * z - 1;
    first[t] = z;
    second[t] = zz;
    sumFirst += z;
    sumSecond += zz;
    m2 += z * z;
    m3 += z * z * z;
    m4 += z * z * z * z;
  }
  sums[0] = m2;
  sums[1] = m3;
  sums[2] = m4;
  sums[3] = sumFirst;
  sums[4] = sumSecond;
}
