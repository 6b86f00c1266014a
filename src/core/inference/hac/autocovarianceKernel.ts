/**
 * The Newey-West pre-lag autocovariances of a block of rows in WebAssembly (autocovarianceKernel.wat):
 * eight lags at a time in two-lane SIMD, each lane adding its products in the order of the rows, so the
 * sums are those of the JavaScript loop in bandwidth.ts bit for bit (docs/methods.md section 8; the
 * tests compare both). About three times faster than that loop; null where WebAssembly or its SIMD is
 * unavailable, or for more lags than the kernel has room for (the JavaScript loop is used).
 *
 * Memory: the series kernels' shared memory (seriesKernel.ts: its pages are faulted once for all of
 * them), of which this kernel lays out the first sixteen pages, committed as they are touched: the sums
 * at 0 (MAX_LAGS + 1 doubles), then a block of rows and its lags, with 8 doubles of room after them for
 * the lanes past the last lag; the second page stages a column's rows for `weigh` (a short sample's
 * weighted rows would otherwise be formed in V8's interpreter); from the third, the weights and whole
 * columns of `weightedSums`, which does a short sample's weighted sums in one call instead of two calls a
 * column and a block.
 */
import { kernelInstance, sharedKernelMemory } from "../../numerics/seriesKernel.js";
import { autocovarianceKernelWasm } from "./autocovarianceKernelWasm.js";

/** Most lags the kernel takes (its sums and the rows after a block fit its one page). */
export const MAX_KERNEL_LAGS = 1023;
const SUMS_AT = 0;
const ROWS_AT = (MAX_KERNEL_LAGS + 1) * 8;
const STAGE_AT = 65_536;
/** Rows the kernel's block (and its lags) and its staging area each hold. */
const ROOM = (STAGE_AT - ROWS_AT) / 8;
const WHOLE_AT = 2 * STAGE_AT;
/** Doubles from WHOLE_AT to the end of the memory. */
const WHOLE_ROOM = (16 * 65_536 - WHOLE_AT) / 8;

export interface AutocovarianceKernel {
  /** Where a block's rows (and the `lags` rows after it) are put for `block`. */
  readonly rows: Float64Array;
  /** The running sums, sums[j] for j = 0..lags. */
  readonly sums: Float64Array;
  /** sums[j] += sum of rows[u] rows[u + j] over u in [begin, min(end, rowCount - j)), j = 0..lags. */
  block(begin: number, end: number, rowCount: number, lags: number): void;
  /** Where a column's rows are put for `weigh` (as many as `rows` holds). */
  readonly stage: Float64Array;
  /** rows[i] = 0 + w stage[i] (add false) or rows[i] + w stage[i], i < count (bandwidth.ts weightedRows). */
  weigh(count: number, w: number, add: boolean): void;
  /**
   * Room for `weightedSums` on k columns of n rows: the weights (k doubles) and the columns, for the
   * caller to fill; null when they do not fit.
   */
  wholeColumns(k: number, n: number): { readonly weights: Float64Array; readonly columns: Float64Array[] } | null;
  /**
   * bandwidth.ts weightedAutocovarianceSums on the weights and columns placed by `wholeColumns`, in
   * blocks of `blockRows` rows: sums[j] for j = 0..lags (the same bits as the blocks one at a time).
   */
  weightedSums(k: number, n: number, lags: number, blockRows: number): void;
}

let kernel: AutocovarianceKernel | null | undefined;

/** The kernel for `lags` lags on blocks of `blockRows` rows, or null (use the JavaScript loop). */
export function autocovarianceKernel(lags: number, blockRows: number): AutocovarianceKernel | null {
  if (kernel === undefined) kernel = instantiate();
  if (kernel === null || lags > MAX_KERNEL_LAGS || blockRows + lags + 8 > ROOM) return null;
  return kernel;
}

function instantiate(): AutocovarianceKernel | null {
  return kernelInstance(
    autocovarianceKernelWasm,
    (exports, memory) => {
      const run = exports.block as (f: number, begin: number, end: number, rows: number, lags: number, sums: number) => void;
      const weigh = exports.weigh as (f: number, g: number, count: number, w: number, add: number) => void;
      const weightedSums = exports.weightedSums as (
        at: number,
        k: number,
        n: number,
        lags: number,
        blockRows: number,
        sums: number,
      ) => void;
      return {
        rows: new Float64Array(memory.buffer, ROWS_AT, ROOM),
        stage: new Float64Array(memory.buffer, STAGE_AT, ROOM),
        sums: new Float64Array(memory.buffer, SUMS_AT, MAX_KERNEL_LAGS + 1),
        block: (begin, end, rowCount, lags) => run(ROWS_AT, begin, end, rowCount, lags, SUMS_AT),
        weigh: (count, w, add) => weigh(ROWS_AT, STAGE_AT, count, w, add ? 1 : 0),
        wholeColumns: (k, n) => {
          // The weights, the columns, then the series they form and 8 doubles of room after it.
          if (k + (k + 1) * n + 8 > WHOLE_ROOM) return null;
          const columns = Array.from({ length: k }, (_, a) => new Float64Array(memory.buffer, WHOLE_AT + 8 * (k + a * n), n));
          return { weights: new Float64Array(memory.buffer, WHOLE_AT, k), columns };
        },
        weightedSums: (k, n, lags, blockRows) => weightedSums(WHOLE_AT, k, n, lags, blockRows, SUMS_AT),
      };
    },
    sharedKernelMemory,
  );
}
