/**
 * The byte engine: the fast engine (fastGrid.ts) working on the bytes of a file instead of its
 * text, for the common case where the bytes are plain ASCII (after an optional UTF-8 byte-order
 * mark) without NUL, quote characters or lone CR. Then each byte is one character of the text
 * `decodeText` would give, so every answer is the one the fast engine gives on that text; the file
 * is never turned into one JS string, and numbers and ISO date stamps (plain dates and the common
 * date-times: values/dateStamps.ts) are read from the bytes.
 *
 * The read is speculative: the rows are found first, and the bytes are checked as they are read
 * (`readRows` checks the rows it reads) or at the end (`clean` checks the rest). A caller must
 * discard everything read from a grid whose `clean()` is false, and read the text instead.
 *
 * Numbers: when the digits, read as an integer, are below 2^53 and there are at most 22 fraction
 * digits (Clinger's fast path) the mantissa and the power of ten are exact doubles, so one correctly
 * rounded division gives the correctly rounded value, which is what `Number` (and so `parseDecimal`)
 * gives; anything else is handed to `parseDecimal` on the field's text (byteNumbers.ts). The rows
 * are found by plainLines.ts; large tables are read through the row kernel (byteGridKernel.ts). The
 * bytes are all in memory or a window onto a large file (byteWindow.ts): rows are read where `reach`
 * puts them.
 */
import { NO_FORM, PLAIN_DATE_FORM, scanStamp, stampScan } from "../values/dateStamps.js";
import { parseDecimal } from "../values/numbers.js";
import { kernelRange, type RowScan, type RowTargets, windowRange } from "./byteGridKernel.js";
import { IsoDates } from "./byteDates.js";
import { scanDecimal } from "./byteNumbers.js";
import type { Grid } from "./grid.js";
import { asciiText, type PlainLines, UNPLAIN } from "./plainLines.js";
import type { GridBytes } from "./byteWindow.js";

/** A grid whose bytes may turn out not to be plain: see `clean`. */
export interface ByteGridOf extends Grid {
  /** True when the whole file is plain (see `isPlain`); everything read from the grid is void otherwise. */
  clean(): boolean;
}

/**
 * The grid of a file's `plainLines`, split at `delimiter` (one ASCII character): the file's bytes, or
 * a window onto them (byteWindow.ts) through which the rows are read.
 */
export function byteGrid(bytes: GridBytes, lines: PlainLines, delimiter: string): ByteGridOf {
  return new ByteGrid(bytes, delimiter, lines);
}

/** Tables with fewer rows are read without the row kernel (setting it up costs more). */
const KERNEL_MIN_ROWS = 64;

class ByteGrid implements ByteGridOf {
  readonly d: number;
  /** The last row ends at the end of the bytes (no line feed): read it through its text. */
  readonly openEnd: boolean;
  private readonly start: number;
  readonly starts: Int32Array;
  private readonly firstBytes: Uint8Array;
  private readonly size: number;
  /** Rows [checkedFrom, checkedTo) were found plain by readRows. */
  private checkedFrom = 0;
  private checkedTo = 0;
  /** Set when readRows met a byte that is not plain. */
  private unplain = false;
  /** The first bytes as text and the search for those that may begin a blank row (nextMaybeBlank), once asked. */
  private maybeBlank: { readonly text: string; readonly pattern: RegExp } | null = null;
  /** Where the row `reachRow` last reached starts and ends (before any CR LF) in its bytes. */
  private rowStart = 0;
  private rowEnd = 0;

  constructor(
    private readonly bytes: GridBytes,
    readonly delimiter: string,
    lines: PlainLines,
  ) {
    this.d = delimiter.charCodeAt(0);
    this.start = lines.start;
    this.starts = lines.starts;
    this.firstBytes = lines.firstBytes;
    this.size = bytes.size;
    this.openEnd = (this.starts[this.starts.length - 1] as number) > bytes.size;
  }

  /** The bytes holding the row, its start and end (before any CR LF) there in rowStart and rowEnd. */
  private reachRow(row: number): Uint8Array {
    const from = this.starts[row] as number;
    const next = this.starts[row + 1] as number;
    const bytes = this.bytes.reach(from, Math.min(next, this.size));
    const shift = this.bytes.shift;
    const start = from - shift;
    const end = next - 1 - shift;
    this.rowStart = start;
    this.rowEnd = end > start && bytes[end - 1] === 13 ? end - 1 : end;
    return bytes;
  }

  clean(): boolean {
    if (this.unplain) return false;
    const { bytes, starts, size } = this;
    if (this.checkedFrom >= this.checkedTo) return bytes.plain(this.start, size);
    const checkedStart = starts[this.checkedFrom] as number;
    const checkedEnd = Math.min(size, starts[this.checkedTo] as number);
    return bytes.plain(this.start, checkedStart) && bytes.plain(checkedEnd, size);
  }

  get rowCount(): number {
    return this.starts.length - 1;
  }

  line(row: number): number {
    return row + 1;
  }

  isBlank(row: number): boolean {
    const { d } = this;
    const first = this.firstBytes[row] as number;
    // A printable first character lies before the line break, so the row is not blank.
    if (first > 32 && first < 128 && first !== d) return false;
    const bytes = this.reachRow(row);
    const end = this.rowEnd;
    for (let i = this.rowStart; i < end; i++) {
      const code = bytes[i] as number;
      if (code === d || code === 32 || code === 9) continue;
      if (code > 32 && code < 128) return false;
      return this.fields(row).every((field) => field.trim() === "");
    }
    return true;
  }

  /**
   * A row may be blank only when its first byte is not printable ASCII or is the delimiter (isBlank's
   * first test). The first bytes are searched as Latin-1 text by a regular expression, natively: a loop
   * over them ran in V8's interpreter, about 0.3 microseconds a row on 10,000 rows.
   */
  nextMaybeBlank(from: number): number {
    const rows = this.rowCount;
    if (this.maybeBlank === null) {
      const firsts = this.firstBytes;
      const text = Buffer.from(firsts.buffer, firsts.byteOffset, Math.min(rows, firsts.length)).toString("latin1");
      const d = this.d.toString(16).padStart(2, "0");
      this.maybeBlank = { text, pattern: new RegExp(`[^\\x21-\\x7f]|\\x${d}`, "g") };
    }
    const { text, pattern } = this.maybeBlank;
    pattern.lastIndex = from;
    const found = pattern.exec(text);
    return found === null ? rows : found.index;
  }

  fieldCount(row: number): number {
    if (this.isBlank(row)) return 0;
    const { d } = this;
    const bytes = this.reachRow(row);
    // The row's own bytes (so that no search runs past its end), searched by indexOf, natively: a loop
    // over the bytes here ran in V8's interpreter for the rows a layout check reads (a millisecond or
    // more at start-up for 1,000 rows).
    const own = bytes.subarray(this.rowStart, this.rowEnd);
    let count = 1;
    for (let i = own.indexOf(d); i >= 0; i = own.indexOf(d, i + 1)) count++;
    return count;
  }

  /** Where field `index` of the row in `bytes` [start, end) starts there, or -1 beyond the last field. */
  private fieldStart(bytes: Uint8Array, start: number, end: number, index: number): number {
    const { d } = this;
    let i = start;
    for (let f = 0; f < index; f++) {
      while (i < end && bytes[i] !== d) i++;
      if (i >= end) return -1;
      i++;
    }
    return i;
  }

  field(row: number, index: number): string {
    const bytes = this.reachRow(row);
    const end = this.rowEnd;
    const from = this.fieldStart(bytes, this.rowStart, end, index);
    if (from < 0) return "";
    let to = from;
    while (to < end && bytes[to] !== this.d) to++;
    return asciiText(bytes, from, to);
  }

  fields(row: number): string[] {
    const bytes = this.reachRow(row);
    return asciiText(bytes, this.rowStart, this.rowEnd).split(this.delimiter);
  }

  readNumbers(row: number, slots: Int32Array, out: readonly Float64Array[], at: number): number {
    if (this.openEnd && row === this.starts.length - 2) {
      const fields = this.fields(row);
      slots.forEach((slot, f) => {
        if (slot >= 0) (out[slot] as Float64Array)[at] = parseDecimal(fields[f] ?? "") ?? Number.NaN;
      });
      return fields.length;
    }
    const { d } = this;
    const bytes = this.reachRow(row);
    const end = this.rowEnd;
    let i = this.rowStart;
    let f = 0;
    for (;;) {
      const slot = f < slots.length ? (slots[f] as number) : -1;
      if (slot >= 0) {
        i = scanDecimal(bytes, i, end, d, out[slot] as Float64Array, at);
        if (i < 0) i = ~i;
      } else while (i < end && bytes[i] !== d) i++;
      f++;
      if (i >= end) return f;
      i++;
    }
  }

  readRows(
    first: number,
    count: number,
    slots: Int32Array,
    out: readonly Float64Array[],
    counts: Int32Array,
    dateIndex: number,
    dateKeys: Float64Array,
  ): { readonly plainDates: boolean; readonly dateForm: number; readonly withNaN: readonly boolean[] } {
    // Only a field handed to parseDecimal can give NaN.
    const state: RowScan = { plain: true, ...stampScan(), unplain: 0, withNaN: out.map(() => false) };
    const kernel = count >= KERNEL_MIN_ROWS && this.d < 128 ? this.bytes.kernel() : null;
    const chunk = kernel === null ? 0 : kernel.kernel.chunkRows(slots.length, out.length);
    const targets: RowTargets = { slots, out, counts, dateIndex, dateKeys };
    if (kernel === null || chunk === 0) this.scanRange(first, 0, count, targets, state);
    else if (this.bytes.span === Number.POSITIVE_INFINITY)
      kernelRange(this, kernel.kernel, kernel.base, chunk, first, count, targets, state);
    else windowRange(this, this.bytes, chunk, first, count, targets, state);
    if (state.unplain !== 0) this.unplain = true;
    else if (count > 0) {
      this.checkedFrom = first;
      this.checkedTo = first + count;
    }
    return { plainDates: state.plain, dateForm: state.form === NO_FORM ? PLAIN_DATE_FORM : state.form, withNaN: state.withNaN };
  }

  /** Rows first + [from, to) of readRows, in JavaScript, continuing `state`. */
  scanRange(first: number, from: number, to: number, targets: RowTargets, state: RowScan): void {
    const { d, starts } = this;
    const { slots, out, counts, dateIndex, dateKeys } = targets;
    const lastRow = this.openEnd ? starts.length - 2 : -1;
    const { withNaN } = state;
    let { plain } = state;
    // Or of UNPLAIN over every byte of the rows that the loop below does not otherwise check.
    let unplain = state.unplain;
    for (let k = from; k < to; k++) {
      const row = first + k;
      const bytes = this.reachRow(row);
      const start = this.rowStart;
      const end = this.rowEnd;
      if (row === lastRow) {
        counts[k] = this.readNumbers(row, slots, out, k);
        out.forEach((values, slot) => (withNaN[slot] ||= Number.isNaN(values[k] as number)));
        if (plain) {
          const p = dateIndex === 0 ? start : this.fieldStart(bytes, start, end, dateIndex);
          plain = p >= 0 && scanStamp(bytes, p, end, d, dateKeys, k, state) >= 0;
        }
        if (!this.bytes.plain(starts[row] as number, this.size)) unplain = 1;
        continue;
      }
      let i = start;
      let f = 0;
      let dated = false;
      for (;;) {
        const slot = f < slots.length ? (slots[f] as number) : -1;
        if (slot >= 0) {
          const fieldStart = i;
          i = scanDecimal(bytes, i, end, d, out[slot] as Float64Array, k);
          // A field parseDecimal accepted holds only plain bytes (its pattern allows nothing else);
          // only a rejected one (NaN) needs checking.
          if (i < 0) {
            i = ~i;
            if (Number.isNaN((out[slot] as Float64Array)[k] as number)) {
              withNaN[slot] = true;
              for (let j = fieldStart; j < i; j++) unplain |= UNPLAIN[bytes[j] as number] as number;
            }
          }
        } else {
          if (f === dateIndex && plain) {
            // The stamp (see scanStamp), with the month of the previous date and the column's form kept.
            dated = true;
            const after = scanStamp(bytes, i, end, d, dateKeys, k, state);
            if (after < 0) plain = false;
            else i = after;
          }
          for (; i < end; i++) {
            const b = bytes[i] as number;
            if (b === d) break;
            unplain |= UNPLAIN[b] as number;
          }
        }
        f++;
        if (i >= end) break;
        i++;
      }
      counts[k] = f;
      if (!dated) plain = false;
    }
    state.plain = plain;
    state.unplain = unplain;
  }

  plainIsoDates(rows: Int32Array, index: number, keys: Float64Array): boolean {
    const dates = new IsoDates(this.d);
    for (let k = 0; k < rows.length; k++) {
      const bytes = this.reachRow(rows[k] as number);
      const end = this.rowEnd;
      const p = index === 0 ? this.rowStart : this.fieldStart(bytes, this.rowStart, end, index);
      if (p < 0 || !dates.read(bytes, p, end, keys, k)) return false;
    }
    return true;
  }
}
