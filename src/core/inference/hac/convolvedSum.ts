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
 * S conj(W). Two columns share a transform as its real and imaginary parts (the weights are real).
 * Rounding: each v_b[t] carries an error of about log2(N) unit roundoffs of the block's norm times the
 * weights' norm, so entries agree with the lag-by-lag sum to about 1e-13 of the matrix's scale
 * (test/core/inference/hac/convolvedSum.test.ts); the lag-by-lag sum is kept where it is cheap, so
 * small samples keep its bits. A column with a value that is not finite is transformed alone, so only
 * the entries it enters are not finite (NaN, where lag by lag may give an infinity).
 */
import type { Matrix } from "../../numerics/linearAlgebra.js";
import { fft, twiddles } from "../../numerics/fft.js";

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
  const finite = columns.map(allFinite);
  for (let b = 0; b < k; ) {
    const first = columns[b]!;
    const second = b + 1 < k && finite[b] && finite[b + 1] ? columns[b + 1]! : null;
    totals.fill(0);
    for (let start = 0; start < n; start += outputs) {
      const count = Math.min(size, n - start);
      re.set(first.subarray(start, start + count));
      re.fill(0, count);
      if (second === null) im.fill(0);
      else {
        im.set(second.subarray(start, start + count));
        im.fill(0, count);
      }
      fft(re, im, table, false);
      timesConjugate(re, im, wr, wi, size);
      fft(re, im, table, true);
      const valid = Math.min(outputs, n - start);
      for (let a = 0; a < k; a++) dotPair(columns[a]!, start, valid, re, im, totals, 2 * a);
    }
    // The inverse transform was not divided by its length (a power of two: an exact scaling).
    for (let a = 0; a < k; a++) {
      m[a]![b] = totals[2 * a]! / size;
      if (second !== null) m[a]![b + 1] = totals[2 * a + 1]! / size;
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

/** Whether every value is finite (x * 0 is NaN exactly when x is not finite). */
function allFinite(u: Float64Array): boolean {
  let zero = 0;
  for (let i = 0; i < u.length; i++) zero += u[i]! * 0;
  return zero === 0;
}
