/**
 * The kernel-weighted sum of autocovariances of a vector series: the "meat" shared by the HAC
 * regression covariance (hac.ts) and the long-run covariance (longRun.ts).
 *
 * ## Conventions (R sandwich meatHAC; docs/methods.md §8)
 * With rows u_1..u_n and lag weights w_0, w_1, ...:
 *   M = 0.5 w_0 sum_t u_t u_t' + sum_{j>=1} w_j sum_{t=1}^{n-j} u_t u_{t+j}',   S = M + M'
 * which is the Newey-West sum Gamma_0 + sum_j w_j (Gamma_j + Gamma_j'). Nothing is divided by n here.
 * Bandwidth resolution: a fixed `lags` L is Bartlett bandwidth L + 1; with the Newey-West (1994) rule
 * ("auto" is that rule here) and the Bartlett kernel the bandwidth S becomes the lag floor(S) (R's NeweyWest), so the weights are
 * 1 - j/(floor(S) + 1); every other case uses k(j/S) directly (R's kernHAC / weightsAndrews).
 * With prewhitening the sum runs over the VAR(1) residuals and is recoloured D S D' (prewhiten.ts);
 * when the VAR(1) fit is singular (a constant column, or one that is a combination of the others) or
 * the recoloured sum is not finite, the series is not prewhitened and `prewhite` says so (false).
 * The Bartlett sum is computed in linear time from window sums (bartlettWindows.ts), the others lag
 * by lag (weightedAutocovarianceSum, which stays the reference the window form is tested against), or
 * by fast convolution where lag by lag would take more than CONVOLUTION_FROM products a pair of columns
 * (convolvedSum.ts: the quadratic spectral kernel's weights reach about 1,450 bandwidths).
 */

import { andrews1991Bandwidth, neweyWest1994Bandwidth } from "./bandwidth.js";
import { bartlettKernelSum, type ColumnPairs } from "./bartlettWindows.js";
import { convolvedAutocovarianceSum, usesConvolution } from "./convolvedSum.js";
import { lagWeights } from "./kernels.js";
import { sandwich, type Matrix } from "../../numerics/linearAlgebra.js";
import { defaultHac, type BandwidthChoice, type HacKernel, type HacOptions } from "../options.js";
import { prewhitenVar1 } from "./prewhiten.js";

export interface KernelSum {
  /** S (recoloured if prewhitened); divide by n for a long-run covariance. */
  readonly sum: Matrix;
  readonly kernel: HacKernel;
  /** The bandwidth chosen or given (before any Bartlett rounding to a lag). */
  readonly bandwidth: number;
  /** Highest lag with a non-zero weight: the Newey-West lag for Bartlett; null for quadratic spectral. */
  readonly lags: number | null;
  readonly prewhite: boolean;
}

/**
 * The weighted sum M + M' of `columns` (n rows each) for given lag weights. Each lag is one pass over
 * the rows accumulating all k^2 cross-products at once (each in the same order over t as separate
 * passes would, so the result is the same bit for bit); k <= 3, the cases the tool uses, have loops
 * of their own.
 */
export function weightedAutocovarianceSum(columns: readonly Float64Array[], weights: ArrayLike<number>): Matrix {
  const k = columns.length;
  const n = k === 0 ? 0 : columns[0]!.length;
  const m: Matrix = Array.from({ length: k }, () => new Array<number>(k).fill(0));
  const lastLag = Math.min(weights.length, n) - 1;
  const totals = new Float64Array(k * k);
  for (let j = 0; j <= lastLag; j++) {
    const w = j === 0 ? 0.5 * weights[0]! : weights[j]!;
    if (w === 0) continue;
    laggedCrossProducts(columns, j, totals);
    for (let a = 0; a < k; a++) {
      const row = m[a]!;
      for (let b = 0; b < k; b++) row[b] = row[b]! + w * totals[a * k + b]!;
    }
  }
  return m.map((row, a) => row.map((value, b) => value + m[b]![a]!));
}

/** totals[a k + b] = sum_{t=0}^{n-j-1} u_a[t] u_b[t + j]. */
function laggedCrossProducts(columns: readonly Float64Array[], j: number, totals: Float64Array): void {
  const k = columns.length;
  const n = columns[0]!.length;
  const end = n - j;
  if (k === 1) {
    const u = columns[0]!;
    let s = 0;
    for (let t = 0; t < end; t++) s += u[t]! * u[t + j]!;
    totals[0] = s;
  } else if (k === 2) {
    const [u, v] = columns as [Float64Array, Float64Array];
    let uu = 0,
      uv = 0,
      vu = 0,
      vv = 0;
    for (let t = 0; t < end; t++) {
      const a = u[t]!,
        b = v[t]!,
        c = u[t + j]!,
        d = v[t + j]!;
      uu += a * c;
      uv += a * d;
      vu += b * c;
      vv += b * d;
    }
    totals[0] = uu;
    totals[1] = uv;
    totals[2] = vu;
    totals[3] = vv;
  } else if (k === 3) {
    const [u, v, x] = columns as [Float64Array, Float64Array, Float64Array];
    let s00 = 0,
      s01 = 0,
      s02 = 0,
      s10 = 0,
      s11 = 0,
      s12 = 0,
      s20 = 0,
      s21 = 0,
      s22 = 0;
    for (let t = 0; t < end; t++) {
      const a = u[t]!,
        b = v[t]!,
        c = x[t]!,
        d = u[t + j]!,
        e = v[t + j]!,
        f = x[t + j]!;
      s00 += a * d;
      s01 += a * e;
      s02 += a * f;
      s10 += b * d;
      s11 += b * e;
      s12 += b * f;
      s20 += c * d;
      s21 += c * e;
      s22 += c * f;
    }
    totals.set([s00, s01, s02, s10, s11, s12, s20, s21, s22]);
  } else {
    for (let a = 0; a < k; a++) {
      for (let b = 0; b < k; b++) {
        const ua = columns[a]!;
        const ub = columns[b]!;
        let total = 0;
        for (let t = 0; t < end; t++) total += ua[t]! * ub[t + j]!;
        totals[a * k + b] = total;
      }
    }
  }
}

/**
 * The kernel sum S of the series `columns` under `options`, with `columnWeights` for the automatic
 * bandwidths (0 for an intercept's estimating function). With `within` (ColumnPairs) the caller reads
 * only the entries within those pairs of columns: the Bartlett sum without prewhitening then computes
 * those alone (the others NaN); every other sum is computed whole.
 */
export function kernelSum(
  columns: readonly Float64Array[],
  options: HacOptions,
  columnWeights: readonly number[],
  within?: ColumnPairs,
): KernelSum {
  const kernel = options.kernel ?? defaultHac.kernel;
  const prewhite = options.prewhite ?? defaultHac.prewhite;
  const rows = columns[0]?.length ?? 0;
  if (options.lags !== undefined && !(Number.isInteger(options.lags) && options.lags >= 0)) {
    throw new RangeError(`HAC lags must be a non-negative integer, got ${options.lags}`);
  }
  if (options.lags !== undefined && kernel !== "bartlett") throw new RangeError("HAC lags apply to the Bartlett kernel only");
  if (prewhite) {
    const whitened = prewhitenVar1(columns);
    if (whitened !== null) {
      const estimate = weightedSum(whitened.residuals, kernel, options, columnWeights, rows, true);
      const sum = sandwich(whitened.recolour, estimate.sum);
      if (sum.every((row) => row.every(Number.isFinite))) return { ...estimate, sum };
    }
  }
  return weightedSum(columns, kernel, options, columnWeights, rows, false, within);
}

/**
 * The kernel sum of `series` (prewhitened or not) at the bandwidth the options ask for. When an
 * automatic rule is undefined (its estimate of the long-run variance of the weighted estimating
 * functions is 0, as when they are identically 0, or the estimate is not finite) every bandwidth
 * gives the same sum or none is defined: the sum keeps lag 0 only, and the bandwidth is reported as 0.
 */
function weightedSum(
  series: readonly Float64Array[],
  kernel: HacKernel,
  options: HacOptions,
  columnWeights: readonly number[],
  rows: number,
  prewhite: boolean,
  within?: ColumnPairs,
): KernelSum {
  const n = series[0]?.length ?? 0;
  const choice: BandwidthChoice = options.lags !== undefined ? options.lags + 1 : (options.bandwidth ?? defaultHac.bandwidth);
  // "auto" is Newey-West 1994 for the sums this file serves (the bounds' own rule is boundsLongRun.ts).
  const rule =
    choice === "newey-west-1994" || choice === "auto"
      ? neweyWest1994Bandwidth(series, kernel, columnWeights, rows, prewhite)
      : choice === "andrews-1991"
        ? andrews1991Bandwidth(series, kernel, columnWeights)
        : choice;
  const defined = rule > 0 && Number.isFinite(rule);
  if (!defined && typeof choice === "number") throw new RangeError(`HAC bandwidth must be positive, got ${choice}`);
  const bandwidth = defined ? rule : 0;
  const effective = !defined
    ? 0
    : kernel === "bartlett" && (choice === "newey-west-1994" || choice === "auto")
      ? Math.floor(bandwidth) + 1
      : bandwidth;
  const weights = !defined ? Float64Array.of(1) : lagWeights(kernel, effective, n);
  let lags: number | null = null;
  if (kernel === "bartlett") {
    lags = 0;
    for (let j = 0; j < weights.length; j++) if (weights[j]! > 0) lags = j;
  }
  // Bartlett in linear time from window sums (bartlettWindows.ts); other kernels, and lag 0 alone, lag by lag
  // or, where that is long, by fast convolution (convolvedSum.ts).
  const sum =
    defined && kernel === "bartlett"
      ? bartlettKernelSum(series, effective, within)
      : usesConvolution(n, weights.length)
        ? convolvedAutocovarianceSum(series, weights)
        : weightedAutocovarianceSum(series, weights);
  return { sum, kernel, bandwidth, lags, prewhite };
}
