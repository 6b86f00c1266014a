/**
 * Long-run covariance of a vector series z_t (the spectral density at frequency 0 times 2 pi).
 *
 * ## Convention (Newey & West 1987; Andrews 1991; docs/methods.md sections 4 and 8)
 *   Omega_hat = S / T,  S = kernel sum (kernelSum.ts) of h_t = z_t - zbar,
 * so that Var(zbar) is approximately Omega_hat / T. Kernels, bandwidths and prewhitening as for the
 * HAC regression covariance; every component gets weight 1 in the automatic bandwidths (there is no
 * intercept). No small-sample adjustment. The "iid" alternative is the sample covariance of z_t
 * with divisor T - 1 (`sampleCovarianceOf`).
 */

import type { ColumnPairs } from "./bartlettWindows.js";
import { kernelSum } from "./kernelSum.js";
import { scale, symmetrise, type Matrix } from "../../numerics/linearAlgebra.js";
import { plainSum } from "../../numerics/seriesLoops.js";
import { KERNEL_ROWS, type SeriesKernel, seriesKernel } from "../../numerics/seriesKernel.js";
import type { HacKernel, HacOptions } from "../options.js";
import { welfordCrossProducts } from "../../moments.js";

export interface LongRunCovariance {
  readonly covariance: Matrix;
  readonly kernel: HacKernel;
  readonly bandwidth: number;
  readonly lags: number | null;
  readonly prewhite: boolean;
}

/** Omega_hat of the series given as columns (all of one length T); the columns are left as they are. */
export function longRunCovariance(columns: readonly Float64Array[], options: HacOptions = {}): LongRunCovariance {
  return longRunCovarianceInPlace(
    columns.map((column) => column.slice()),
    options,
  );
}

/**
 * Omega_hat as `longRunCovariance`, centring the caller's columns in place (the same numbers, without
 * a copy of every series: on 10 million rows each copy is 80 MB). For series built for this call only.
 * With `within`, entries outside those pairs of columns may be NaN (kernelSum). With `sums`, the
 * columns' plain sums in row order, as the caller formed them while writing the columns (the mean
 * pass is then skipped: the same means).
 */
export function longRunCovarianceInPlace(
  columns: readonly Float64Array[],
  options: HacOptions = {},
  { within, sums }: { readonly within?: ColumnPairs; readonly sums?: readonly number[] } = {},
): LongRunCovariance {
  const n = columns[0]?.length ?? 0;
  if (n < 2) throw new RangeError("longRunCovariance: needs at least 2 rows");
  const kernel = seriesKernel();
  columns.forEach((column, a) => {
    const sum = sums?.[a];
    // A whole column in the kernel: its sum, mean and centring in one call (the same bits).
    if (sum === undefined && kernel !== null && n <= KERNEL_ROWS) {
      centreOnOwnMean(kernel, column);
      return;
    }
    const mean = (sum ?? plainSum(column)) / n;
    if (kernel === null) for (let t = 0; t < n; t++) column[t] = column[t]! - mean;
    else centreInKernel(kernel, column, mean);
  });
  const estimate = kernelSum(
    columns,
    options,
    columns.map(() => 1),
    within,
  );
  return {
    covariance: symmetrise(scale(estimate.sum, 1 / n)),
    kernel: estimate.kernel,
    bandwidth: estimate.bandwidth,
    lags: estimate.lags,
    prewhite: estimate.prewhite,
  };
}

/** The sample covariance matrix of the columns, divisor T - 1 (compensated one-pass sums). */
export function sampleCovarianceOf(columns: readonly Float64Array[]): Matrix {
  const cp = welfordCrossProducts(columns);
  return cp.sums.map((row) => row.map((value) => value / (cp.n - 1)));
}

/** column[t] - plainSum(column) / n for every row, in place, in one call of the kernel (n <= KERNEL_ROWS). */
function centreOnOwnMean(kernel: SeriesKernel, column: Float64Array): void {
  kernel.columns[0].set(column);
  kernel.centreOnMean(column.length);
  column.set(kernel.columns[0].subarray(0, column.length));
}

/** column[t] - mean for every row, in place, in the WebAssembly kernel (the same bits as the loop above). */
function centreInKernel(kernel: SeriesKernel, column: Float64Array, mean: number): void {
  const [c0] = kernel.columns;
  for (let from = 0; from < column.length; from += KERNEL_ROWS) {
    const to = Math.min(column.length, from + KERNEL_ROWS);
    c0.set(column.subarray(from, to));
    kernel.centre(to - from, mean);
    column.set(c0.subarray(0, to - from), from);
  }
}
