/**
 * Automatic HAC bandwidths, following R sandwich's bwNeweyWest and bwAndrews exactly (docs/methods.md
 * section 8; reproduced there to the printed digits of sandwich-Ex.Rout.save).
 *
 * Both take the estimating functions h_t (columns) after any prewhitening, `columnWeights` w_a
 * (R: 1 for every column, 0 for an intercept column, all 1 if that leaves none), and the number of
 * rows T of the original series.
 *
 * Newey & West (1994), Review of Economic Studies 61(4), 631-653:
 *   pre-lag m = floor(c (T/100)^rate), c = 4, or 3 with prewhitening, rate 2/9 (Bartlett) or 2/25 (QS),
 *   computed from the ORIGINAL T; f_t = sum_a w_a h_t,a over the n rows used (n = T - 1 if
 *   prewhitened); sigma_j = sum_{t=1}^{n-j} f_t f_{t+j} / n; s0 = sigma_0 + 2 sum sigma_j,
 *   s1 = 2 sum j sigma_j, s2 = 2 sum j^2 sigma_j;
 *   Bartlett 1.1447 ((s1/s0)^2)^{1/3} T^{1/3};  QS 1.3221 ((s2/s0)^2)^{1/5} T^{1/5}.
 * Andrews (1991), Econometrica 59(3), 817-858, AR(1) plug-in: per column a, an AR(1) with intercept
 *   fitted by least squares to the demeaned column (R: ar(x, order.max = 1, aic = FALSE,
 *   method = "ols")), rho_a the slope, sigma_a^2 = RSS/(n - 1);
 *   alpha(1) = sum w 4 rho^2 sigma^4 / ((1-rho)^6 (1+rho)^2) / sum w sigma^4/(1-rho)^4,
 *   alpha(2) = sum w 4 rho^2 sigma^4 / (1-rho)^8 / the same denominator;
 *   Bartlett 1.1447 (alpha(1) n)^{1/3};  QS 1.3221 (alpha(2) n)^{1/5}, n the rows used (T - 1 if
 *   prewhitened).
 */

import type { HacKernel } from "../options.js";
import { autocovarianceKernel } from "./autocovarianceKernel.js";

export function neweyWest1994Bandwidth(
  columns: readonly Float64Array[],
  kernel: HacKernel,
  columnWeights: readonly number[],
  originalRows: number,
  prewhitened: boolean,
): number {
  const n = columns[0]!.length;
  const rate = kernel === "bartlett" ? 2 / 9 : 2 / 25;
  const preLag = Math.min(n - 1, Math.floor((prewhitened ? 3 : 4) * (originalRows / 100) ** rate));
  // f = sum of w_a column_a over the weighted columns, formed block by block as the sums go (never stored whole).
  const sums = weightedAutocovarianceSums(columns, columnWeights, preLag);
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  for (let j = 0; j <= preLag; j++) {
    const sigma = sums[j]! / n;
    s0 += j === 0 ? sigma : 2 * sigma;
    s1 += 2 * j * sigma;
    s2 += 2 * j * j * sigma;
  }
  if (kernel === "bartlett") return 1.1447 * ((s1 / s0) ** 2) ** (1 / 3) * originalRows ** (1 / 3);
  return 1.3221 * ((s2 / s0) ** 2) ** (1 / 5) * originalRows ** (1 / 5);
}

/** Rows per block of the autocovariance passes: the block and its lags stay in the cache. */
export const BLOCK_ROWS = 2048;

/**
 * sum_{t} f_t f_{t+j} for j = 0..lags in one pass over f in blocks that stay in the cache (each sum
 * adds its products in the order of t, as a pass per lag would, block by block). The blocks go through
 * the WebAssembly kernel (autocovarianceKernel.ts, the same bits) unless `useKernel` is false or it is
 * unavailable.
 */
export function autocovarianceSums(f: Float64Array, lags: number, useKernel = true): Float64Array {
  const n = f.length;
  const kernel = useKernel ? autocovarianceKernel(lags, BLOCK_ROWS) : null;
  if (kernel !== null) {
    kernel.sums.fill(0, 0, lags + 1);
    for (let start = 0; start < n; start += BLOCK_ROWS) {
      kernel.rows.set(f.subarray(start, Math.min(n, start + BLOCK_ROWS + lags)));
      kernel.block(0, Math.min(n, start + BLOCK_ROWS) - start, n - start, lags);
    }
    return kernel.sums.slice(0, lags + 1);
  }
  const sums = new Float64Array(lags + 1);
  // A block by a small function V8 optimises whole (its running sums would be boxed in one long loop).
  for (let start = 0; start < n; start += BLOCK_ROWS) autocovarianceBlock(f, 0, n, lags, start, sums);
  return sums;
}

/**
 * autocovarianceSums of f = sum_a w_a column_a (the columns with w_a = 0 left out, the first one
 * written as 0 + w_a column_a and the others added in order, as scaledInto and addScaledInto would; all
 * zeros if every weight is 0) without storing f: each block's rows and the `lags` after them are formed
 * in a small buffer (the kernel's own memory when it is used), so the same numbers meet in the same
 * order and the sums are the same bits.
 */
export function weightedAutocovarianceSums(
  columns: readonly Float64Array[],
  columnWeights: readonly number[],
  lags: number,
  useKernel = true,
): Float64Array {
  const n = columns[0]!.length;
  const kernel = useKernel ? autocovarianceKernel(lags, BLOCK_ROWS) : null;
  const whole = kernel?.wholeColumns(columns.length, n) ?? null;
  if (kernel !== null && whole !== null) {
    whole.weights.set(columnWeights.slice(0, columns.length));
    columns.forEach((column, a) => whole.columns[a]!.set(column));
    kernel.weightedSums(columns.length, n, lags, BLOCK_ROWS);
    return kernel.sums.slice(0, lags + 1);
  }
  const sums = kernel === null ? new Float64Array(lags + 1) : kernel.sums.fill(0, 0, lags + 1);
  const buffer = kernel === null ? new Float64Array(Math.min(n, BLOCK_ROWS + lags)) : kernel.rows;
  for (let start = 0; start < n; start += BLOCK_ROWS) {
    const stop = Math.min(n, start + BLOCK_ROWS + lags);
    let started = false;
    columns.forEach((column, a) => {
      const w = columnWeights[a]!;
      if (w === 0) return;
      if (kernel === null) weightedRows(buffer, w, column, start, stop, started);
      else {
        kernel.stage.set(column.subarray(start, stop));
        kernel.weigh(stop - start, w, started);
      }
      started = true;
    });
    if (!started) buffer.fill(0, 0, stop - start);
    if (kernel === null) autocovarianceBlock(buffer, start, n, lags, start, sums);
    else kernel.block(0, Math.min(n, start + BLOCK_ROWS) - start, n - start, lags);
  }
  return kernel === null ? sums : sums.slice(0, lags + 1);
}

/** buffer[t - start] = 0 + w column[t] (first) or buffer[t - start] + w column[t], rows [start, stop). */
function weightedRows(buffer: Float64Array, w: number, column: Float64Array, start: number, stop: number, add: boolean): void {
  if (add) for (let t = start; t < stop; t++) buffer[t - start] = buffer[t - start]! + w * column[t]!;
  else for (let t = start; t < stop; t++) buffer[t - start] = 0 + w * column[t]!;
}

/**
 * The products of rows [start, start + BLOCK_ROWS) of a series of n rows added to sums[j], j = 0..lags;
 * `f` holds the series from row `base` on (f[u] is row base + u).
 */
function autocovarianceBlock(f: Float64Array, base: number, n: number, lags: number, start: number, sums: Float64Array): void {
  const end = Math.min(n, start + BLOCK_ROWS) - base;
  const rows = n - base;
  let j = 0;
  // Four lags at a time over the rows all four reach (each f_t read once for them), then the rest.
  for (; j + 3 <= lags; j += 4) {
    const last = Math.min(end, rows - j - 3);
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    let u = start - base;
    for (; u < last; u++) {
      const x = f[u]!;
      s0 += x * f[u + j]!;
      s1 += x * f[u + j + 1]!;
      s2 += x * f[u + j + 2]!;
      s3 += x * f[u + j + 3]!;
    }
    // Rows near the end that only the shorter lags reach.
    for (let r = u; r < Math.min(end, rows - j); r++) s0 += f[r]! * f[r + j]!;
    for (let r = u; r < Math.min(end, rows - j - 1); r++) s1 += f[r]! * f[r + j + 1]!;
    for (let r = u; r < Math.min(end, rows - j - 2); r++) s2 += f[r]! * f[r + j + 2]!;
    sums[j] = sums[j]! + s0;
    sums[j + 1] = sums[j + 1]! + s1;
    sums[j + 2] = sums[j + 2]! + s2;
    sums[j + 3] = sums[j + 3]! + s3;
  }
  for (; j <= lags; j++) {
    const last = Math.min(end, rows - j);
    let sum = 0;
    for (let u = start - base; u < last; u++) sum += f[u]! * f[u + j]!;
    sums[j] = sums[j]! + sum;
  }
}

export function andrews1991Bandwidth(columns: readonly Float64Array[], kernel: HacKernel, columnWeights: readonly number[]): number {
  const n = columns[0]!.length;
  let numerator1 = 0;
  let numerator2 = 0;
  let denominator = 0;
  columns.forEach((column, a) => {
    const w = columnWeights[a]!;
    if (w === 0) return;
    const { rho, variance } = autoregression1(column);
    const sigma4 = variance * variance;
    numerator1 += (w * 4 * rho * rho * sigma4) / ((1 - rho) ** 6 * (1 + rho) ** 2);
    numerator2 += (w * 4 * rho * rho * sigma4) / (1 - rho) ** 8;
    denominator += (w * sigma4) / (1 - rho) ** 4;
  });
  if (kernel === "bartlett") return 1.1447 * ((numerator1 / denominator) * n) ** (1 / 3);
  return 1.3221 * ((numerator2 / denominator) * n) ** (1 / 5);
}

/** AR(1) with intercept by least squares on the demeaned series; variance RSS / (n - 1) (R's ar.ols). */
function autoregression1(x: Float64Array): { rho: number; variance: number } {
  const n = x.length;
  let mean = 0;
  for (let t = 0; t < n; t++) mean += x[t]!;
  mean /= n;
  // Regress y_t = x_t - mean (t = 2..n) on (1, y_{t-1}).
  let meanLag = 0;
  let meanCur = 0;
  for (let t = 1; t < n; t++) {
    meanLag += x[t - 1]! - mean;
    meanCur += x[t]! - mean;
  }
  meanLag /= n - 1;
  meanCur /= n - 1;
  let sxx = 0;
  let sxy = 0;
  for (let t = 1; t < n; t++) {
    const lag = x[t - 1]! - mean - meanLag;
    sxx += lag * lag;
    sxy += lag * (x[t]! - mean - meanCur);
  }
  const rho = sxy / sxx;
  let rss = 0;
  for (let t = 1; t < n; t++) {
    const e = x[t]! - mean - meanCur - rho * (x[t - 1]! - mean - meanLag);
    rss += e * e;
  }
  return { rho, variance: rss / (n - 1) };
}
