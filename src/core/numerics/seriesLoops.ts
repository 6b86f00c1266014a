/**
 * Elementwise passes over long series, taken in chunks of rows by small functions that V8 optimises
 * as a whole after a few calls: one long loop inside a larger function runs in on-stack-replaced
 * code on Node 20, which boxes its doubles and is several times slower (see moments.ts).
 * The arithmetic is that of the plain loop, row by row: the results are the same bits. Where the
 * WebAssembly kernel has the pass (seriesKernel.ts: product, blend), series go through it instead,
 * chunk by chunk at every length: V8 would interpret the loop on short series, and at 100,000 rows it
 * still runs much of it before optimising (1M rows: the same time either way).
 *
 * A value that is either a number parameter or an array's element (`rates === null ? rate : rates[t]`)
 * is a phi of a tagged value and a double to the optimiser, which then boxes the element into a new
 * heap number at every row (15 MB of garbage a million rows, even in optimised code). Taking the
 * parameter as `+rate` first (the same number) makes the phi a double: no allocation, and 2.4 times
 * faster in isolation. The chunk functions with a risk-free rate or series do so (`fixedRate`).
 */
import { inChunks, seriesKernel } from "./seriesKernel.js";

/**
 * Rows per call of a chunked pass (these and every other one in the core): small enough for V8 to
 * optimise the chunk's function after a few calls.
 */
export const CHUNK = 1024;

/** a[0] + a[1] + ... in row order. */
export function plainSum(a: ArrayLike<number>): number {
  const n = a.length;
  const total = new Float64Array(1);
  for (let from = 0; from < n; from += CHUNK) sumChunk(a, from, Math.min(n, from + CHUNK), total);
  return total[0]!;
}

function sumChunk(a: ArrayLike<number>, from: number, to: number, total: Float64Array): void {
  let sum = total[0]!;
  for (let t = from; t < to; t++) sum += a[t]!;
  total[0] = sum;
}

/** out[t] = a[t] * b[t]. */
export function productInto(out: Float64Array, a: ArrayLike<number>, b: ArrayLike<number>, useKernel = true): Float64Array {
  const n = out.length;
  const kernel = useKernel ? seriesKernel() : null;
  if (kernel !== null) {
    inChunks(kernel, { x: a, y: b, rates: null }, (from, count) => {
      kernel.product(count);
      out.set(kernel.columns[2].subarray(0, count), from);
    });
    return out;
  }
  for (let from = 0; from < n; from += CHUNK) productChunk(out, a, b, from, Math.min(n, from + CHUNK));
  return out;
}

function productChunk(out: Float64Array, a: ArrayLike<number>, b: ArrayLike<number>, from: number, to: number): void {
  for (let t = from; t < to; t++) out[t] = a[t]! * b[t]!;
}

/** out[t] = 0 + w * a[t]: addScaledInto on an array of zeros (the same bits: 0 + x, as that gives), without the zeros. */
export function scaledInto(out: Float64Array, w: number, a: ArrayLike<number>): Float64Array {
  const n = out.length;
  for (let from = 0; from < n; from += CHUNK) scaledChunk(out, w, a, from, Math.min(n, from + CHUNK));
  return out;
}

function scaledChunk(out: Float64Array, w: number, a: ArrayLike<number>, from: number, to: number): void {
  for (let t = from; t < to; t++) out[t] = 0 + w * a[t]!;
}

/** out[t] = w * a[t] + v * b[t]. */
export function blendInto(
  out: Float64Array,
  w: number,
  a: ArrayLike<number>,
  v: number,
  b: ArrayLike<number>,
  useKernel = true,
): Float64Array {
  const n = out.length;
  const kernel = useKernel ? seriesKernel() : null;
  if (kernel !== null) {
    inChunks(kernel, { x: a, y: b, rates: null }, (from, count) => {
      kernel.blend(count, w, v);
      out.set(kernel.columns[2].subarray(0, count), from);
    });
    return out;
  }
  for (let from = 0; from < n; from += CHUNK) blendChunk(out, w, a, v, b, from, Math.min(n, from + CHUNK));
  return out;
}

function blendChunk(out: Float64Array, w: number, a: ArrayLike<number>, v: number, b: ArrayLike<number>, from: number, to: number): void {
  for (let t = from; t < to; t++) out[t] = w * a[t]! + v * b[t]!;
}

/** out[t] = out[t] + w * a[t]. */
export function addScaledInto(out: Float64Array, w: number, a: ArrayLike<number>): Float64Array {
  const n = out.length;
  for (let from = 0; from < n; from += CHUNK) addScaledChunk(out, w, a, from, Math.min(n, from + CHUNK));
  return out;
}

function addScaledChunk(out: Float64Array, w: number, a: ArrayLike<number>, from: number, to: number): void {
  for (let t = from; t < to; t++) out[t] = out[t]! + w * a[t]!;
}
