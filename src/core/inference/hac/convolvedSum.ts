/**
 * The kernel-weighted sum of autocovariances (weightedAutocovarianceSum in kernelSum.ts: M + M' with
 * M = 0.5 w_0 sum_t u_t u_t' + sum_{j>=1} w_j sum_t u_t u_{t+j}') by fast convolution, for kernels whose
 * weights reach many lags (the quadratic spectral's reach about 1,450 bandwidths). Lag by lag costs
 * n L k^2 products; this costs O(n log L) per pair of columns (docs/methods.md §8, "Kernel sums by fast
 * convolution").
 *
 * M_ab = sum_t u_a[t] v_b[t] with v_b[t] = sum_{j=0}^{L} w'_j u_b[t + j] (w'_0 = 0.5 w_0, w'_j = w_j,
 * rows past the end 0): v_b is the correlation of the weights with column b, taken block by block
 * (overlap-save): a block of N rows (N a power of two) and the transform of the weights give the
 * correlation at its first N - L rows exactly, up to rounding, as the inverse transform of
 * S conj(W). Two columns share a transform as its real and imaginary parts (the weights are real),
 * each first scaled by a power of two (exactly undone) to a largest value near 1, so neither swamps
 * the other. Rounding: each v_b[t] carries an error of about log2(N) unit roundoffs of the block's norm
 * times the weights' norm, so an entry agrees with the lag-by-lag sum to about 1e-14 of
 * sqrt(S_aa S_bb) (test/core/inference/hac/convolvedSum.test.ts); the lag-by-lag sum is kept where it is
 * cheap, so small samples keep its bits. A column with a value that is not finite is transformed alone,
 * so only the entries it enters are not finite (NaN, where lag by lag may give an infinity).
 */
import type { Matrix } from "../../numerics/linearAlgebra.js";
import { fft, twiddles } from "../../numerics/fft.js";
import { scaleFor } from "../../scaling.js";

/** Lag by lag up to this many products a column pair (n times the lags); by convolution beyond. */
export const CONVOLUTION_FROM = 1 << 22;

/** Whether a sum over n rows with `weightCount` lag weights is taken by convolution. */
export function usesConvolution(rows: number, weightCount: number): boolean {
  return rows * Math.min(weightCount, rows) > CONVOLUTION_FROM;
}

/** Rows per block for L lags: about four times the weights, at least 1,024, no more than the series needs. */
function blockSize(rows: number, lastLag: number): number {
  const wanted = Math.max(1024, 4 * (lastLag + 1));
  const enough = rows + lastLag;
  let size = 1;
  while (size < wanted && size < enough) size *= 2;
  return size;
}

export function convolvedAutocovarianceSum(columns: readonly Float64Array[], weights: ArrayLike<number>): Matrix {
  const k = columns.length;
  const n = k === 0 ? 0 : columns[0]!.length;
  const m: Matrix = Array.from({ length: k }, () => new Array<number>(k).fill(0));
  const lastLag = Math.min(weights.length, n) - 1;
  if (lastLag < 0) return m;
  const size = blockSize(n, lastLag);
  const outputs = size - lastLag;
  const table = twiddles(size);
  const wr = new Float64Array(size);
  const wi = new Float64Array(size);
  wr[0] = 0.5 * weights[0]!;
  for (let j = 1; j <= lastLag; j++) wr[j] = weights[j]!;
  fft(wr, wi, table, false);
  const re = new Float64Array(size);
  const im = new Float64Array(size);
  const totals = new Float64Array(2 * k);
  const scales = columns.map(columnScale);
  for (let b = 0; b < k; ) {
    const first = columns[b]!;
    const second = b + 1 < k && scales[b] !== null && scales[b + 1] !== null ? columns[b + 1]! : null;
    const firstScale = scales[b] ?? 1;
    const secondScale = second === null ? 1 : scales[b + 1]!;
    totals.fill(0);
    for (let start = 0; start < n; start += outputs) {
      const count = Math.min(size, n - start);
      scaledRows(re, first, start, count, firstScale);
      if (second === null) im.fill(0);
      else scaledRows(im, second, start, count, secondScale);
      fft(re, im, table, false);
      timesConjugate(re, im, wr, wi, size);
      fft(re, im, table, true);
      const valid = Math.min(outputs, n - start);
      for (let a = 0; a < k; a++) dotPair(columns[a]!, start, valid, re, im, totals, 2 * a);
    }
    // The inverse transform was not divided by its length, nor the columns by their scales (powers of
    // two: exact).
    for (let a = 0; a < k; a++) {
      m[a]![b] = totals[2 * a]! / size / firstScale;
      if (second !== null) m[a]![b + 1] = totals[2 * a + 1]! / size / secondScale;
    }
    b += second === null ? 1 : 2;
  }
  return m.map((row, a) => row.map((value, b) => value + m[b]![a]!));
}

/** (re + i im) times the conjugate of (wr + i wi), entry by entry. */
function timesConjugate(re: Float64Array, im: Float64Array, wr: Float64Array, wi: Float64Array, size: number): void {
  for (let q = 0; q < size; q++) {
    const a = re[q]!;
    const b = im[q]!;
    const c = wr[q]!;
    const d = wi[q]!;
    re[q] = a * c + b * d;
    im[q] = b * c - a * d;
  }
}

/** totals[at] += sum u[start + i] re[i], totals[at + 1] += sum u[start + i] im[i], i < count. */
function dotPair(
  u: Float64Array,
  start: number,
  count: number,
  re: Float64Array,
  im: Float64Array,
  totals: Float64Array,
  at: number,
): void {
  let x = 0;
  let y = 0;
  for (let i = 0; i < count; i++) {
    const value = u[start + i]!;
    x += value * re[i]!;
    y += value * im[i]!;
  }
  totals[at] = totals[at]! + x;
  totals[at + 1] = totals[at + 1]! + y;
}

/** target[i] = u[start + i] scale for i < count, 0 after. */
function scaledRows(target: Float64Array, u: Float64Array, start: number, count: number, scale: number): void {
  for (let i = 0; i < count; i++) target[i] = u[start + i]! * scale;
  target.fill(0, count);
}

/**
 * The power of two that brings the column's largest absolute value into [1, 2) (scaling.ts's scaleFor;
 * 1 for a column of zeros), kept within 2^-1000..2^1000 so that it and its inverse are normal numbers,
 * or null when a value is not finite.
 */
function columnScale(u: Float64Array): number | null {
  let largest = 0;
  for (let i = 0; i < u.length; i++) {
    const size = Math.abs(u[i]!);
    if (size > largest) largest = size;
    else if (!(size <= largest)) return null; // NaN
  }
  if (!Number.isFinite(largest)) return null;
  return Math.min(2 ** 1000, Math.max(2 ** -1000, scaleFor(largest)));
}
