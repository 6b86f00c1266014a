/**
 * Passes over series in WebAssembly, for the samples V8 would run in its interpreter: a JavaScript loop
 * is optimised only after it has run a while, and before that every double it makes is a new heap
 * object (a 2,520-row Welford pass took 12 ms and 2 MB of garbage there; the kernel takes a fraction of
 * a millisecond). Three modules: seriesKernel.wat (the moments, magnitudes, residual sums, CAPM fits
 * and elementwise passes), influenceKernel.wat (the uncertainty's window sums and influence series)
 * and columnKernel.wat (passes over whole columns: the input layer's checks of a column, and the
 * factor model's covariance).
 * Each kernel function does its JavaScript twin's arithmetic in the same order, so the results are the
 * same bits (test/core/numerics/seriesKernel*.test.ts compare both); each twin stays as the fallback
 * where WebAssembly is missing (the kernels are then null) and as the reference.
 *
 * Memory: one for the three and the autocovariance kernel (inference/hac/autocovarianceKernel.ts, which
 * lays out its own sixteen pages), 17 pages, about 1 MB, committed as it is touched. Here: a state of up
 * to 32 doubles at 0, up to 32 parameters at 256, then four columns of KERNEL_ROWS doubles from 512, into
 * which the caller copies a series or a chunk of its rows (`copyRows`). Shared because every first touch
 * of a page costs about 10 microseconds on the virtual machines we measure on, and with a memory each
 * the kernels' copies of the same sample faulted their pages once per kernel. So a pass (the calls that
 * carry a state or fill columns, and the reading of what they leave) must not call another of these
 * kernels midway; none does. Every pass runs chunk by chunk at any length, those that need the whole
 * series as several passes with their sums carried in the state (the window sums with a window nearly
 * as long as a column excepted: they stay in JavaScript).
 */
import { influenceKernelWasm } from "./influenceKernelWasm.js";
import { columnKernelWasm } from "./columnKernelWasm.js";
import { seriesKernelWasm } from "./seriesKernelWasm.js";

/** Rows a column of a kernel holds (a series, or a chunk of a pass over a longer one). */
export const KERNEL_ROWS = 32_768;
/** Pages (64 KiB) of the kernels' memory: 512 bytes of state and parameters, then the four columns. */
const KERNEL_PAGES = 17;
/** Doubles the four columns hold together (`area`), for passes over several columns or a long one. */
export const AREA_ROWS = 4 * KERNEL_ROWS;
/** Rows per chunk of `pricingInfluence` (its six outputs share column 2). */
export const PRICING_ROWS = 4096;

/** A kernel's memory, as the caller sees it. */
export interface KernelMemory {
  /** The running state a pass reads and writes back (32 doubles). */
  readonly state: Float64Array;
  /** A pass's fixed numbers (32 doubles). */
  readonly parameters: Float64Array;
  /** The rows, column by column (KERNEL_ROWS doubles each). */
  readonly columns: readonly [Float64Array, Float64Array, Float64Array, Float64Array];
  /** The four columns as one area (AREA_ROWS doubles), for passes over many stacked series. */
  readonly area: Float64Array;
}

/** seriesKernel.wat: passes over `count` rows in chunks, or over whole series where said. */
export interface SeriesKernel extends KernelMemory {
  /** moments.ts welfordChunk over rows [from, from + count) held in the columns (x, y, z, rates). */
  welford(from: number, count: number, hasZ: boolean, hasRates: boolean, rate: number, weight: number): void;
  /** cancellation.ts largestChunk: low, high in columns 0, 1, the rates in 3; state 0..2. */
  largest(count: number, hasRates: boolean, rate: number): void;
  /** regression.ts residualChunk (columns as `largest`; its 7 fit numbers as parameters). */
  residuals(count: number, hasRates: boolean, rate: number): void;
  /** Column 0 minus `mean` in place. */
  centre(count: number, mean: number): void;
  /** Column 0 minus its own mean (its plain sum in row order over count) in place. */
  centreOnMean(count: number): void;
  /** Column 2 = column 0 x column 1 (seriesLoops.ts productInto). */
  product(count: number): void;
  /** Column 2 = w column 0 + v column 1 (seriesLoops.ts blendInto). */
  blend(count: number, w: number, v: number): void;
  /** Columns 0 and 1 become (x - r) scale in place (replicates.ts excessReturnsScaledBy); rates in 3. */
  scaledExcess(count: number, hasRates: boolean, rate: number, scale: number): void;
  /** leastSquares.ts crossChunk, x and y in columns 0 and 1; state 0..3 sx sxx sy sxy. */
  crossSums(count: number): void;
  /** leastSquares.ts interceptResidualChunk: column 2 = y - ((0 + a) + x b). */
  interceptResiduals(count: number, a: number, b: number): void;
}

/**
 * influenceKernel.wat: the uncertainty's passes, chunk by chunk at any length (those that need the whole
 * series as several passes, their sums carried in the state).
 */
export interface InfluenceKernel extends KernelMemory {
  /**
   * bartlettWindows.ts windowSquaresOfTwo over windows t = from .. to - 1 (a whole number of blocks from
   * 1 - width, or up to n) of a series of n rows, its rows from `offset` on in columns 0 and 1 (those the
   * windows reach), continuing the state (zeros before the first call): state[4], state[5] and state[7]
   * are then its sums xx, xy and yy; with `both`, state[12], [13] and [15] are those of width - 1 (from
   * zeros at 8..15), computed in the same loop.
   */
  windowsOfTwo(from: number, to: number, offset: number, n: number, width: number, both: boolean): void;
  /** boundsLongRun.ts plainSumsChunk over `count` rows in columns 0 and 1: state 0, 1 (sx, sy) continued. */
  plainSumsOfTwo(count: number): void;
  /** boundsLongRun.ts centredChunk about mx, my: state 2..4 (sxx, syy, sxy) continued. */
  centredSumsOfTwo(count: number, mx: number, my: number): void;
  /**
   * boundsLongRun.ts influenceChunk for both bounds, their gradients (lower, then upper) as parameters:
   * the lower bound's series into column 2, the upper's into 3.
   */
  influenceOfTwo(count: number, mx: number, my: number, m0: number, m1: number, m2: number): void;
  /** sharpe.ts standardise's passes over `count` rows in column 0, continuing the state: the plain sum into state 0. */
  sumOfOne(count: number): void;
  /** The squared deviations about mu into state 1. */
  squaredDeviations(count: number, mu: number): void;
  /** z = (x - mu) / sigma into column 1, z^2 - 1 into column 2; the sums of z^2, z^3, z^4, z and z^2 - 1 into state 3..7. */
  standardiseChunk(count: number, mu: number, sigma: number): void;
  /**
   * assessPricing.ts influenceChunk over count <= PRICING_ROWS rows (low, high, rates in columns 0, 1,
   * 3; its 17 terms as parameters): the six series into column 2, PRICING_ROWS rows apart.
   */
  pricingInfluence(count: number, hasRates: boolean, rate: number): void;
  /** Where pricingInfluence leaves series k (0..5) of a chunk of `count` rows. */
  pricingSeries(k: number, count: number): Float64Array;
}

/** columnKernel.wat: passes over columns of up to AREA_ROWS values in all, copied into `area`. */
export interface ColumnKernel extends KernelMemory {
  /** The first i < count with |area[i]| > limit, or -1. */
  firstBeyond(count: number, limit: number): number;
  /** The first i in [1, count) with !(area[i] - area[i - 1] > 0), or count. */
  firstNotIncreasing(count: number): number;
  /** Over |area[i step]|, i < size: how many are below (`below`) or above `threshold` (state[0]), NaN of the rest (state[1]). */
  sampleCounts(size: number, step: number, threshold: number, below: boolean): void;
  /**
   * The histogram of the whole-day gaps between the `count` keys in `area` (gaps in [0, days)), as
   * Int32 counts after the keys; null at the first gap that is not a whole day in range.
   */
  dayGaps(count: number, dayMs: number, days: number): Int32Array | null;
  /**
   * factorModel.ts sampleCovariance of k series of n rows stacked in `area` (series i from i n), the
   * rates after them (when hasRates, else `rate`): the k x k matrix, row-major, from (k + 1) n.
   */
  covariance(k: number, n: number, hasRates: boolean, rate: number): void;
}

let series: SeriesKernel | null | undefined;
let column: ColumnKernel | null | undefined;
let influence: InfluenceKernel | null | undefined;

/** seriesKernel.wat, or null (WebAssembly unavailable: use the JavaScript loops). */
export function seriesKernel(): SeriesKernel | null {
  if (series === undefined) series = instantiate(seriesKernelWasm, seriesFunctions);
  return series;
}

/** influenceKernel.wat, or null (WebAssembly unavailable: use the JavaScript loops). */
export function influenceKernel(): InfluenceKernel | null {
  if (influence === undefined) influence = instantiate(influenceKernelWasm, influenceFunctions);
  return influence;
}

/**
 * The bytes of a kernel's base64 text. A plain loop: `Uint8Array.from(text, mapFn)` calls its function
 * per byte, in V8's interpreter at start-up (0.8 against 0.35 ms for 2.6 KB).
 */
export function wasmBinary(base64: string): Uint8Array {
  const text = atob(base64);
  const bytes = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i);
  return bytes;
}

/**
 * A kernel compiled and instantiated from its base64 text (given `memory`, importing that memory), with
 * `make` building its views and functions over the exports and the memory; null where WebAssembly is
 * missing or fails (every kernel's callers then take the JavaScript path).
 */
export function kernelInstance<T>(
  base64: string,
  make: (exports: Record<string, unknown>, memory: WebAssembly.Memory) => T,
  memory?: () => WebAssembly.Memory,
): T | null {
  try {
    const imported = memory?.();
    const module = new WebAssembly.Module(wasmBinary(base64));
    const { exports } = new WebAssembly.Instance(module, imported === undefined ? undefined : { env: { memory: imported } });
    return make(exports, imported ?? (exports.memory as WebAssembly.Memory));
  } catch {
    return null;
  }
}

/** columnKernel.wat, or null (WebAssembly unavailable: use the JavaScript loops). */
export function columnKernel(): ColumnKernel | null {
  if (column === undefined) column = instantiate(columnKernelWasm, columnFunctions);
  return column;
}

/**
 * Runs `pass(from, count)` over the rows chunk by chunk (`rows` at a time), each chunk first copied into
 * the kernel's columns: x into column 0, y into 1, z (when given) into 2, the rates (when given) into 3.
 */
export function inChunks(
  kernel: KernelMemory,
  series: { x: ArrayLike<number>; y: ArrayLike<number>; z?: ArrayLike<number> | null; rates: ArrayLike<number> | null },
  pass: (from: number, count: number) => void,
  rows = KERNEL_ROWS,
): void {
  const { x, y, z, rates } = series;
  const [c0, c1, c2, c3] = kernel.columns;
  for (let from = 0; from < x.length; from += rows) {
    const to = Math.min(x.length, from + rows);
    copyRows(c0, x, from, to);
    copyRows(c1, y, from, to);
    if (z !== undefined && z !== null) copyRows(c2, z, from, to);
    if (rates !== null) copyRows(c3, rates, from, to);
    pass(from, to - from);
  }
}

/** `inChunks` for one series, copied into column 0. */
export function inChunksOfOne(kernel: KernelMemory, x: ArrayLike<number>, pass: (from: number, count: number) => void): void {
  for (let from = 0; from < x.length; from += KERNEL_ROWS) {
    const to = Math.min(x.length, from + KERNEL_ROWS);
    copyRows(kernel.columns[0], x, from, to);
    pass(from, to - from);
  }
}

/** Copies rows [from, to) of `source` to the start of `column` (to - from <= KERNEL_ROWS). */
export function copyRows(column: Float64Array, source: ArrayLike<number>, from: number, to: number): void {
  if (source instanceof Float64Array) column.set(source.subarray(from, to));
  else for (let t = from; t < to; t++) column[t - from] = source[t]!;
}

// The exports' own types: flags are i32 (0 or 1) in WebAssembly.
type Exported = (...args: number[]) => number | undefined;
const flag = (b: boolean): number => (b ? 1 : 0);

function seriesFunctions(f: Record<string, Exported>): Omit<SeriesKernel, keyof KernelMemory> {
  return {
    welford: (from, count, hasZ, hasRates, rate, weight) => f.welford!(from, count, flag(hasZ), flag(hasRates), rate, weight),
    largest: (count, hasRates, rate) => f.largest!(count, flag(hasRates), rate),
    residuals: (count, hasRates, rate) => f.residuals!(count, flag(hasRates), rate),
    centre: f.centre!,
    centreOnMean: f.centreOnMean!,
    product: f.product!,
    blend: f.blend!,
    scaledExcess: (count, hasRates, rate, scale) => f.scaledExcess!(count, flag(hasRates), rate, scale),
    crossSums: f.crossSums!,
    interceptResiduals: f.interceptResiduals!,
  };
}

function columnFunctions(f: Record<string, Exported>, buffer: ArrayBuffer): Omit<ColumnKernel, keyof KernelMemory> {
  return {
    dayGaps: (count, dayMs, days) => {
      const at = 512 + 8 * count;
      return f.dayGaps!(count, dayMs, days, at) === 1 ? new Int32Array(buffer, at, days) : null;
    },
    firstBeyond: (count, limit) => f.firstBeyond!(count, limit)!,
    firstNotIncreasing: (count) => f.firstNotIncreasing!(count)!,
    sampleCounts: (size, step, threshold, below) => void f.sampleCounts!(size, step, threshold, flag(below)),
    covariance: (k, n, hasRates, rate) => void f.covariance!(k, n, flag(hasRates), rate),
  };
}

function influenceFunctions(f: Record<string, Exported>, buffer: ArrayBuffer): Omit<InfluenceKernel, keyof KernelMemory> {
  return {
    windowsOfTwo: (from, to, offset, n, width, both) => void f.windowsOfTwo!(from, to, offset, n, width, flag(both)),
    plainSumsOfTwo: f.plainSumsOfTwo!,
    centredSumsOfTwo: f.centredSumsOfTwo!,
    influenceOfTwo: f.influenceOfTwo!,
    sumOfOne: f.sumOfOne!,
    squaredDeviations: f.squaredDeviations!,
    standardiseChunk: f.standardiseChunk!,
    pricingInfluence: (count, hasRates, rate) => f.pricingInfluence!(count, flag(hasRates), rate),
    pricingSeries: (k, count) => new Float64Array(buffer, 512 + 2 * KERNEL_ROWS * 8 + k * PRICING_ROWS * 8, count),
  };
}

function instantiate<T>(
  base64: string,
  functions: (f: Record<string, Exported>, buffer: ArrayBuffer) => Omit<T, keyof KernelMemory>,
): (T & KernelMemory) | null {
  return kernelInstance(
    base64,
    (exports, { buffer }) => {
      const column = (k: number): Float64Array => new Float64Array(buffer, 512 + k * KERNEL_ROWS * 8, KERNEL_ROWS);
      const memory: KernelMemory = {
        state: new Float64Array(buffer, 0, 32),
        parameters: new Float64Array(buffer, 256, 32),
        columns: [column(0), column(1), column(2), column(3)],
        area: new Float64Array(buffer, 512, AREA_ROWS),
      };
      return { ...memory, ...functions(exports as unknown as Record<string, Exported>, buffer) } as T & KernelMemory;
    },
    sharedKernelMemory,
  );
}

let shared: WebAssembly.Memory | undefined;

/**
 * The memory the three kernels share, and the autocovariance kernel too (hac/autocovarianceKernel.ts):
 * made by the first of them, never grown, so views into it stay valid.
 */
export function sharedKernelMemory(): WebAssembly.Memory {
  shared ??= new WebAssembly.Memory({ initial: KERNEL_PAGES, maximum: KERNEL_PAGES });
  return shared;
}
