/**
 * The Bartlett kernel sum in linear time, from sums over windows of consecutive rows.
 *
 * ## Method (docs/methods.md §8, "the Bartlett sum from window sums")
 * Let W_t = sum of u_s over the window s = t .. t + B - 1, cut to the rows 1..n, for every window
 * start t = 2 - B .. n (n + B - 1 windows), and Q(B) = sum_t W_t W_t'. A pair of rows (s, r) lies
 * together in exactly max(B - |s - r|, 0) windows, so
 *   Q(B) = sum_{s,r} max(B - |s - r|, 0) u_s u_r',
 * which is B times the Bartlett sum with bandwidth B (weights 1 - j/B). For a real bandwidth S with
 * B = ceil(S), the weights 1 - j/S (j < S) give
 *   S_sum = ((S - B + 1) Q(B) + (B - S) Q(B - 1)) / S,    Q(0) = 0,
 * since S - j = (B - j) - (B - S) and Q(B) - Q(B - 1) counts every pair with |s - r| < B once.
 * The cost is O((n + B) k^2) instead of O(n B k^2) for the lag-by-lag sum (kernelSum.ts); the two
 * agree to rounding (test/core/inference/hac/bartlettWindows.test.ts).
 *
 * Accuracy: each window sum is a running sum held as an unevaluated pair hi + lo (Knuth's TwoSum), so
 * W_t stays correct to about one rounding of its own size whatever n, in O(k) memory; the squares are
 * summed in blocks of 1,024 windows (pairwise at one level) to keep the total's rounding small.
 */
import type { Matrix } from "../../numerics/linearAlgebra.js";
import { copyRows, influenceKernel, KERNEL_ROWS } from "../../numerics/seriesKernel.js";

/** Windows per block of the sums of W W' (each block summed apart, then added to the total). */
const BLOCK = 1024;

/**
 * Pairs of columns whose entries alone a caller reads: the sum is computed within each pair (two
 * columns at a time, the fastest form) and every other entry is NaN.
 */
export type ColumnPairs = readonly (readonly [number, number])[];

/**
 * The Bartlett sum S_sum (Gamma_0 + sum_j (1 - j/S)(Gamma_j + Gamma_j')) of `columns` at bandwidth S;
 * with `within`, only the entries within those pairs of columns (the same bits as the whole sum's).
 */
export function bartlettKernelSum(columns: readonly Float64Array[], bandwidth: number, within?: ColumnPairs): Matrix {
  if (!(bandwidth > 0 && Number.isFinite(bandwidth)))
    throw new RangeError(`bartlettKernelSum: bandwidth must be positive, got ${bandwidth}`);
  const k = columns.length;
  const whole = Math.ceil(bandwidth);
  const a = (bandwidth - whole + 1) / bandwidth;
  const b = (whole - bandwidth) / bandwidth;
  const [upper, lower] =
    within === undefined ? windowSquaresAt(columns, whole, b > 0 && whole > 1) : pairSquares(columns, whole, b > 0 && whole > 1, within);
  return Array.from({ length: k }, (_, i) =>
    Array.from({ length: k }, (_, j) => {
      const at = i <= j ? i * k + j : j * k + i;
      return a * upper[at]! + (lower === null ? 0 : b * lower[at]!);
    }),
  );
}

/** Q(width), and Q(width - 1) when `narrower` (else null). */
type WidthSquares = readonly [Float64Array, Float64Array | null];

/** windowSquares at `width` and, when `narrower`, at width - 1 (two columns: in one pass). */
function windowSquaresAt(columns: readonly Float64Array[], width: number, narrower: boolean): WidthSquares {
  if (columns.length === 2) return windowSquaresOfTwoWidths(columns[0]!, columns[1]!, width, narrower);
  return [windowSquares(columns, width), narrower ? windowSquares(columns, width - 1) : null];
}

/** windowSquaresAt's entries within each pair (a, b), a < b, by windowSquaresOfTwoWidths; the others NaN. */
function pairSquares(columns: readonly Float64Array[], width: number, narrower: boolean, pairs: ColumnPairs): WidthSquares {
  const k = columns.length;
  const upper = new Float64Array(k * k).fill(Number.NaN);
  const lower = narrower ? new Float64Array(k * k).fill(Number.NaN) : null;
  for (const [a, b] of pairs) {
    if (!(a < b && b < k)) throw new RangeError(`bartlettKernelSum: a pair of columns must be a < b < ${k}, got ${a}, ${b}`);
    const [wide, narrow] = windowSquaresOfTwoWidths(columns[a]!, columns[b]!, width, narrower);
    for (const [total, two] of [
      [upper, wide],
      [lower, narrow],
    ] as const) {
      if (total === null || two === null) continue;
      total[a * k + a] = two[0]!;
      total[a * k + b] = two[1]!;
      total[b * k + b] = two[3]!;
    }
  }
  return [upper, lower];
}

/**
 * Q(B) = sum over the n + B - 1 windows of W W' (upper triangle, row-major k x k). Each window sum
 * is kept as a running pair hi + lo: a row entering is added and a row leaving subtracted with
 * TwoSum, the rounding error of each step going to lo, so the sums do not drift over n steps.
 */
function windowSquares(columns: readonly Float64Array[], width: number): Float64Array {
  if (columns.length === 2) return windowSquaresOfTwo(columns[0]!, columns[1]!, width);
  const k = columns.length;
  const n = columns[0]!.length;
  const total = new Float64Array(k * k);
  const block = new Float64Array(k * k);
  const hi = new Float64Array(k);
  const lo = new Float64Array(k);
  const w = new Float64Array(k);
  let inBlock = 0;
  // Window t covers rows max(0, t) .. min(n, t + width) - 1; t = 1 - width is the row 0 alone.
  for (let t = 1 - width; t < n; t++) {
    const entering = t + width - 1;
    for (let a = 0; a < k; a++) {
      const column = columns[a]!;
      let s = hi[a]!;
      let c = lo[a]!;
      if (entering < n) {
        const x = column[entering]!;
        const sum = s + x;
        const virtual = sum - s;
        c += s - (sum - virtual) + (x - virtual);
        s = sum;
      }
      if (t > 0) {
        const x = -column[t - 1]!;
        const sum = s + x;
        const virtual = sum - s;
        c += s - (sum - virtual) + (x - virtual);
        s = sum;
      }
      hi[a] = s;
      lo[a] = c;
      w[a] = s + c;
    }
    for (let a = 0; a < k; a++) {
      const wa = w[a]!;
      for (let b = a; b < k; b++) block[a * k + b] = block[a * k + b]! + wa * w[b]!;
    }
    if (++inBlock === BLOCK) {
      for (let i = 0; i < total.length; i++) total[i] = total[i]! + block[i]!;
      block.fill(0);
      inBlock = 0;
    }
  }
  for (let i = 0; i < total.length; i++) total[i] = total[i]! + block[i]!;
  return total;
}

/**
 * windowSquares for two columns (most sums: the bounds, each Sharpe ratio, each CAPM fit), the same
 * operations in the same order with the running pairs in local variables: the same bits, faster. The
 * windows go by blocks of 1,024 (the blocks of the sums) in a small function V8 optimises whole; the
 * running pairs and the total are carried in `state`. They go through the WebAssembly twin
 * (numerics/seriesKernel.ts, the same bits) chunk by chunk at every length unless `useKernel` is false
 * or a window is nearly as long as a chunk: a JavaScript loop runs unoptimised for its first tens of
 * thousands of rows.
 */
export function windowSquaresOfTwo(x: Float64Array, y: Float64Array, width: number, useKernel = true): Float64Array {
  return windowSquaresOfTwoWidths(x, y, width, false, useKernel)[0];
}

/**
 * windowSquaresOfTwo at `width` and, when `narrower`, at width - 1: in the kernel both in one loop (its
 * two chains of additions overlap; each width's arithmetic is its own pass's, so the same bits).
 */
export function windowSquaresOfTwoWidths(
  x: Float64Array,
  y: Float64Array,
  width: number,
  narrower: boolean,
  useKernel = true,
): WidthSquares {
  const n = x.length;
  // Windows per call: whole blocks, with the rows they reach (width - 1 more) within a column.
  const span = Math.floor((KERNEL_ROWS - width) / BLOCK) * BLOCK;
  const kernel = useKernel && span > 0 ? influenceKernel() : null;
  if (kernel === null) return [windowSquaresOfTwoInJs(x, y, width), narrower ? windowSquaresOfTwoInJs(x, y, width - 1) : null];
  kernel.state.fill(0, 0, 16);
  for (let from = 1 - width; from < n; from += span) {
    const to = Math.min(n, from + span);
    // Window t leaves row t - 1 and takes rows up to t + width - 1 (the narrower one leaves row t).
    const first = Math.max(0, from - 1);
    const end = Math.min(n, to + width - 1);
    copyRows(kernel.columns[0], x, first, end);
    copyRows(kernel.columns[1], y, first, end);
    kernel.windowsOfTwo(from, to, first, n, width, narrower);
  }
  // Each width's state: hx, lx, hy, ly, then the totals xx, xy, -, yy (returned as its subarray(4)).
  const state = kernel.state.slice(0, 16);
  return [state.subarray(4, 8), narrower ? state.subarray(12, 16) : null];
}

function windowSquaresOfTwoInJs(x: Float64Array, y: Float64Array, width: number): Float64Array {
  const n = x.length;
  const state = new Float64Array(8);
  for (let t = 1 - width; t < n; t += BLOCK) windowBlockOfTwo(x, y, width, t, Math.min(n, t + BLOCK), state);
  return state.subarray(4);
}

/** Windows t = from .. to - 1 of windowSquaresOfTwo (one block of the sums), continuing `state`. */
function windowBlockOfTwo(x: Float64Array, y: Float64Array, width: number, from: number, to: number, state: Float64Array): void {
  const n = x.length;
  let hx = state[0]!;
  let lx = state[1]!;
  let hy = state[2]!;
  let ly = state[3]!;
  let xx = 0;
  let xy = 0;
  let yy = 0;
  for (let t = from; t < to; t++) {
    const entering = t + width - 1;
    if (entering < n) {
      const u = x[entering]!;
      const sum = hx + u;
      const virtual = sum - hx;
      lx += hx - (sum - virtual) + (u - virtual);
      hx = sum;
    }
    if (t > 0) {
      const u = -x[t - 1]!;
      const sum = hx + u;
      const virtual = sum - hx;
      lx += hx - (sum - virtual) + (u - virtual);
      hx = sum;
    }
    if (entering < n) {
      const u = y[entering]!;
      const sum = hy + u;
      const virtual = sum - hy;
      ly += hy - (sum - virtual) + (u - virtual);
      hy = sum;
    }
    if (t > 0) {
      const u = -y[t - 1]!;
      const sum = hy + u;
      const virtual = sum - hy;
      ly += hy - (sum - virtual) + (u - virtual);
      hy = sum;
    }
    const wx = hx + lx;
    const wy = hy + ly;
    xx = xx + wx * wx;
    xy = xy + wx * wy;
    yy = yy + wy * wy;
  }
  state[0] = hx;
  state[1] = lx;
  state[2] = hy;
  state[3] = ly;
  state[4] = state[4]! + xx;
  state[5] = state[5]! + xy;
  state[7] = state[7]! + yy;
}
