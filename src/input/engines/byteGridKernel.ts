/**
 * The byte engine's rows read through the row kernel (rowKernel.ts), chunk by chunk: the numbers,
 * field counts and date digits of the simple rows come from the kernel, and every row the kernel
 * flagged (and the open last row) is read by the grid's JavaScript reader, in row order, so that the
 * result is that reader's bit for bit.
 */
import type { StampScan } from "../values/dateStamps.js";
import type { GridBytes } from "./byteWindow.js";
import type { KernelChunk, RowKernel } from "./rowKernel.js";

/**
 * What readRows carries from row to row (and between the kernel and scanRange): whether every date
 * so far is a plain stamp (see scanStamp), the previous date's month and the column's form.
 */
export interface RowScan extends StampScan {
  plain: boolean;
  /** Or of UNPLAIN over the bytes read. */
  unplain: number;
  readonly withNaN: boolean[];
}

/**
 * Where readRows writes row k's numbers and what else it learns: out[slot][k] for the fields that
 * `slots` maps to an output (-1: not read), counts[k] its field count, dateKeys[k] the key of its date
 * (field dateIndex).
 */
export interface RowTargets {
  readonly slots: Int32Array;
  readonly out: readonly Float64Array[];
  readonly counts: Int32Array;
  readonly dateIndex: number;
  readonly dateKeys: Float64Array;
}

/** What the kernel path needs of a byte grid: its rows, its delimiter, and its JavaScript reader. */
export interface RowRanges {
  readonly starts: Int32Array;
  /** The last row ends at the end of the bytes (no line feed). */
  readonly openEnd: boolean;
  /** The delimiter's byte. */
  readonly d: number;
  /** Rows first + [from, to), read in JavaScript, continuing `state`. */
  scanRange(first: number, from: number, to: number, targets: RowTargets, state: RowScan): void;
}

/**
 * readRows through the row kernel (rowKernel.ts), chunk by chunk: the numbers, field counts and
 * date keys of the simple rows come from the kernel (formed as scanStamp forms them, with the
 * column's form carried from chunk to chunk), and every row the kernel flagged (and the open last row) is read by
 * scanRange, in row order, so that the result is scanRange's bit for bit.
 */
export function kernelRange(
  grid: RowRanges,
  kernel: RowKernel,
  base: number,
  chunk: number,
  first: number,
  count: number,
  targets: RowTargets,
  state: RowScan,
): void {
  const { slots, out, counts, dateIndex, dateKeys } = targets;
  const lastRow = grid.openEnd ? grid.starts.length - 2 : -1;
  for (let k0 = 0; k0 < count; k0 += chunk) {
    const k1 = Math.min(count, k0 + chunk);
    const kEnd = lastRow >= first + k0 && lastRow < first + k1 ? lastRow - first : k1;
    if (kEnd > k0) {
      const read = kernel.scan(base, grid.starts, first + k0, first + kEnd, slots, out.length, grid.d, dateIndex, state.form);
      out.forEach((values, slot) => values.set(read.values(slot), k0));
      counts.set(read.counts, k0);
      if (state.plain) dateKeys.set(read.keys, k0);
      // A date that is no date, a stamp of another form than the column's: the text path reads them.
      if (read.badDate) state.plain = false;
      state.form = read.form;
      if (read.flagged > 0) settleFlagged(grid, read, kernel, base, first, k0, kEnd, targets, state);
    }
    if (kEnd < k1) grid.scanRange(first, kEnd, k1, targets, state);
  }
}

/**
 * kernelRange when the bytes are a window onto the file (byteWindow.ts): groups of at most `chunk`
 * rows whose bytes fit in the window (one row at least, for which the window grows), each read by
 * the kernel where the window holds it.
 */
export function windowRange(
  grid: RowRanges,
  bytes: GridBytes,
  chunk: number,
  first: number,
  count: number,
  targets: RowTargets,
  state: RowScan,
): void {
  const { starts } = grid;
  const { size, span } = bytes;
  for (let g0 = 0; g0 < count; ) {
    const from = starts[first + g0] as number;
    // The most rows (up to a chunk) that end within the window's span from the group's start.
    let low = g0 + 1;
    let high = Math.min(count, g0 + chunk);
    while (low < high) {
      const middle = (low + high + 1) >> 1;
      if (Math.min(size, starts[first + middle] as number) - from <= span) low = middle;
      else high = middle - 1;
    }
    const g1 = low;
    bytes.reach(from, Math.min(size, starts[first + g1] as number));
    const kernel = bytes.kernel();
    const part = (values: Float64Array): Float64Array => values.subarray(g0, g1);
    if (kernel === null) grid.scanRange(first, g0, g1, targets, state);
    else {
      const { out, counts, dateKeys } = targets;
      const partTargets = { ...targets, out: out.map(part), counts: counts.subarray(g0, g1), dateKeys: part(dateKeys) };
      kernelRange(grid, kernel.kernel, kernel.base, chunk, first + g0, g1 - g0, partTargets, state);
    }
    g0 = g1;
  }
}

/**
 * The flagged rows of a kernel chunk (rows k0 .. kEnd - 1): flag 1, read here (scanRange writes
 * only what it reads, so what the kernel left for the row is cleared first); flag 2, the long
 * numbers (NaN) parsed from their spans, as scanDecimal hands them to parseDecimal (their bytes
 * are digits, signs and points, so plain).
 */
function settleFlagged(
  grid: RowRanges,
  read: KernelChunk,
  kernel: RowKernel,
  base: number,
  first: number,
  k0: number,
  kEnd: number,
  targets: RowTargets,
  state: RowScan,
): void {
  const { out, dateKeys } = targets;
  const { flags } = read;
  const spans = out.map((_, slot) => read.spans(slot));
  // The chunk's text, made once when a long number needs it: substrings of it are cheap.
  const textFrom = base + (grid.starts[first + k0] as number);
  let text: string | null = null;
  for (let k = k0; k < kEnd; k++) {
    const flag = flags[k - k0] as number;
    if (flag === 1) {
      for (const values of out) values[k] = 0;
      dateKeys[k] = 0;
      grid.scanRange(first, k, k + 1, targets, state);
    } else if (flag === 2) {
      for (let slot = 0; slot < out.length; slot++) {
        const values = out[slot] as Float64Array;
        if (!Number.isNaN(values[k] as number)) continue;
        const span = spans[slot] as Int32Array;
        const from = span[2 * (k - k0)] as number;
        const to = span[2 * (k - k0) + 1] as number;
        // The kernel checked the syntax ([+-]digits[.digits]), so parseDecimal is Number here.
        text ??= kernel.text(textFrom, base + (grid.starts[first + kEnd] as number));
        const value = Number(text.substring(from - textFrom, to - textFrom));
        if (Number.isFinite(value)) values[k] = value;
        else {
          values[k] = Number.NaN;
          state.withNaN[slot] = true;
        }
      }
    }
  }
}
