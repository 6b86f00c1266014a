/**
 * The byte engine: the fast engine (fastGrid.ts) working on the bytes of a file instead of its
 * text, for the common case where the bytes are plain ASCII (after an optional UTF-8 byte-order
 * mark) without NUL, quote characters or lone CR. Then each byte is one character of the text
 * `decodeText` would give, so every answer is the one the fast engine gives on that text; the file
 * is never turned into one JS string, and numbers and plain ISO dates are read from the bytes.
 *
 * The read is speculative: the rows are found first, and the bytes are checked as they are read
 * (`readRows` checks the rows it reads) or at the end (`clean` checks the rest). A caller must
 * discard everything read from a grid whose `clean()` is false, and read the text instead.
 *
 * Numbers: when the digits, read as an integer, are below 2^53 and there are at most 22 fraction
 * digits (Clinger's fast path) the mantissa and the power of ten are exact doubles, so one correctly
 * rounded division gives the correctly rounded value, which is what `Number` (and so `parseDecimal`)
 * gives; anything else is handed to `parseDecimal` on the field's text.
 */
import { DAY_MS, daysInMonth, plainDateKey } from "../values/dates.js";
import type { Grid } from "./grid.js";
import { parseDecimal } from "../values/numbers.js";
import { lineEnds, rowKernelFor, type KernelChunk, type RowKernel } from "./rowKernel.js";

const POWERS_OF_TEN = Array.from({ length: 23 }, (_, k) => 10 ** k);
/** 2^53: digits accumulated in a double are exact when the result is below it (rounding is monotonic). */
const MAX_EXACT = 2 ** 53;

/** 1 for the bytes that send a file to the text path: NUL, CR (unless it ends a row), the double quote, and every non-ASCII byte. */
const UNPLAIN = Uint8Array.from({ length: 256 }, (_, b) => (b === 0 || b === 13 || b === 34 || b >= 0x80 ? 1 : 0));
/** The first bytes checked before anything is read, so that most files for the text path go there at once. */
const HEAD_CHECK = 1 << 16;

/** The rows of a file for the byte engine: where each starts, and its first byte. */
export interface PlainLines {
  /** Offset where the text starts: 3 after a UTF-8 byte-order mark, else 0. */
  readonly start: number;
  /**
   * starts[r] is the offset of row r; starts[rowCount] is one past the line feed ending the last
   * row, or bytes.length + 1 when the last row has none.
   */
  readonly starts: Int32Array;
  /** The first byte of each row (a line break for an empty row). */
  readonly firstBytes: Uint8Array;
}

/**
 * The rows of the file (split at LF, as the fast engine splits the text), or null when its first
 * `headCheck` bytes already show that the text path must be taken (or the file is 2 GiB or more). The other bytes are not checked here (see
 * `clean`).
 */
export function plainLines(bytes: Uint8Array, headCheck = HEAD_CHECK): PlainLines | null {
  const start = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  // Offsets are kept in Int32Array.
  if (bytes.length >= 0x7fffffff || !isPlain(bytes, start, Math.min(bytes.length, start + headCheck))) return null;
  const length = bytes.length;
  const ends = lineEnds(bytes, start);
  if (ends !== null) return linesFromEnds(bytes, start, ends);
  // Room for rows of 16 bytes on average (pages never written are not resident); more is grown.
  let starts = new Int32Array(Math.max(1 << 12, (length - start) >> 4));
  let firstBytes = new Uint8Array(starts.length);
  let rows = 0;
  let from = start;
  const search = asBuffer(bytes);
  for (let end = search.indexOf(10, from); end >= 0; end = search.indexOf(10, from)) {
    if (rows + 1 >= starts.length) [starts, firstBytes] = grow(starts, firstBytes);
    firstBytes[rows] = bytes[from] as number;
    starts[rows++] = from;
    from = end + 1;
  }
  if (from < length) {
    if (rows + 1 >= starts.length) [starts, firstBytes] = grow(starts, firstBytes);
    firstBytes[rows] = bytes[from] as number;
    starts[rows++] = from;
    from = length + 1;
  }
  starts[rows] = from;
  return { start, starts: starts.slice(0, rows + 1), firstBytes: firstBytes.slice(0, rows) };
}

/** plainLines from the offsets just past each line feed (the kernel finds them, see rowKernel.ts). */
function linesFromEnds(bytes: Uint8Array, start: number, ends: Int32Array): PlainLines {
  const length = bytes.length;
  const last = ends.length > 0 ? (ends[ends.length - 1] as number) : start;
  // A last row without a line feed ends one past the end, as in plainLines.
  const open = last < length;
  const starts = new Int32Array(ends.length + (open ? 2 : 1));
  starts[0] = start;
  starts.set(ends, 1);
  if (open) starts[starts.length - 1] = length + 1;
  const rows = starts.length - 1;
  const firstBytes = new Uint8Array(rows);
  for (let r = 0; r < rows; r++) firstBytes[r] = bytes[starts[r] as number] as number;
  return { start, starts, firstBytes };
}

/** True when bytes [from, to) hold no NUL, quote or non-ASCII byte, and each CR there is followed by LF. */
export function isPlain(bytes: Uint8Array, from: number, to: number): boolean {
  if (from >= to) return true;
  const range = asBuffer(bytes).subarray(from, to);
  if (range.indexOf(0) >= 0 || range.indexOf(34) >= 0 || !isAscii(range)) return false;
  for (let cr = range.indexOf(13); cr >= 0; cr = range.indexOf(13, cr + 1)) if (bytes[from + cr + 1] !== 10) return false;
  return true;
}

/**
 * The bytes as a Buffer (the same memory), for Buffer's native searches and slices: its indexOf is
 * several times faster than a plain Uint8Array's (the CLI's large files are plain Uint8Arrays, see
 * rowKernel.ts).
 */
function asBuffer(bytes: Uint8Array): Buffer {
  return Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

/** True when no byte has the high bit set. */
function isAscii(bytes: Uint8Array): boolean {
  const length = bytes.length;
  let i = 0;
  while (i < length && ((bytes.byteOffset + i) & 3) !== 0) if ((bytes[i++] as number) >= 0x80) return false;
  const wordCount = (length - i) >> 2;
  if (wordCount > 0) {
    const words = new Int32Array(bytes.buffer, bytes.byteOffset + i, wordCount);
    const blocked = wordCount & ~255;
    for (let w = 0; w < blocked; w += 256) {
      let high = 0;
      for (let k = w; k < w + 256; k += 4)
        high |= (words[k] as number) | (words[k + 1] as number) | (words[k + 2] as number) | (words[k + 3] as number);
      if ((high & 0x80808080) !== 0) return false;
    }
    let high = 0;
    for (let k = blocked; k < wordCount; k++) high |= words[k] as number;
    if ((high & 0x80808080) !== 0) return false;
    i += wordCount << 2;
  }
  while (i < length) if ((bytes[i++] as number) >= 0x80) return false;
  return true;
}

function grow(starts: Int32Array<ArrayBuffer>, firstBytes: Uint8Array<ArrayBuffer>): [Int32Array<ArrayBuffer>, Uint8Array<ArrayBuffer>] {
  const biggerStarts = new Int32Array(starts.length * 2);
  biggerStarts.set(starts);
  const biggerFirsts = new Uint8Array(starts.length * 2);
  biggerFirsts.set(firstBytes);
  return [biggerStarts, biggerFirsts];
}

/**
 * The text of ASCII bytes [from, to): latin1 decoding is the identity on ASCII, and Node's native
 * slice is several times faster than building the string in JS, above all while the code is cold
 * (full-precision numbers, 17 digits and more, come this way: see scanDecimal).
 */
export function asciiText(bytes: Uint8Array, from: number, to: number): string {
  return asBuffer(bytes).toString("latin1", from, to);
}

/** True when bytes [from, to) are all space, tab, line feed, vertical tab, form feed or CR (what `trim` removes, in ASCII). */
export function isAsciiWhiteSpace(bytes: Uint8Array, from: number, to: number): boolean {
  for (let i = from; i < to; i++) {
    const b = bytes[i] as number;
    if (b !== 32 && (b < 9 || b > 13)) return false;
  }
  return true;
}

/** A grid whose bytes may turn out not to be plain: see `clean`. */
export interface ByteGridOf extends Grid {
  /** True when the whole file is plain (see `isPlain`); everything read from the grid is void otherwise. */
  clean(): boolean;
}

/** The grid of a file's `plainLines`, split at `delimiter` (one ASCII character). */
export function byteGrid(bytes: Uint8Array, lines: PlainLines, delimiter: string): ByteGridOf {
  return new ByteGrid(bytes, delimiter, lines);
}

/**
 * Parse the number in bytes [from, ...) into target[at] (written there, not returned, so that no
 * double is boxed); returns the position p of the delimiter `d` or line end `end` after the field,
 * or ~p when the field was handed to `parseDecimal` (only then can it hold other bytes than digits,
 * signs, a point, spaces and tabs). The byte at `end` must not be a digit, point, sign, space, tab
 * or `d` (a line break does). target[at] is what `parseDecimal` gives for the field's text, NaN for null.
 */
export function scanDecimal(bytes: Uint8Array, from: number, end: number, d: number, target: Float64Array, at: number): number {
  let i = from;
  let code = bytes[i] as number;
  while ((code === 32 || code === 9) && code !== d) code = bytes[++i] as number;
  const negative = code === 45;
  if (code === 45 || code === 43) code = bytes[++i] as number;
  // Digits are accumulated in a double: exact while below 2^53, and the value only grows.
  let mantissa = 0;
  const integerStart = i;
  while (code >= 48 && code <= 57) {
    mantissa = mantissa * 10 + (code - 48);
    code = bytes[++i] as number;
  }
  let digits = i - integerStart;
  let fraction = 0;
  if (code === 46) {
    const fractionStart = ++i;
    code = bytes[i] as number;
    while (code >= 48 && code <= 57) {
      mantissa = mantissa * 10 + (code - 48);
      code = bytes[++i] as number;
    }
    fraction = i - fractionStart;
    digits += fraction;
  }
  while ((code === 32 || code === 9) && code !== d) code = bytes[++i] as number;
  if (i > end || (i < end && code !== d)) {
    i = Math.min(i, end);
    while (i < end && bytes[i] !== d) i++;
  } else if (digits > 0 && mantissa < MAX_EXACT && fraction <= 22) {
    const magnitude = fraction === 0 ? mantissa : mantissa / (POWERS_OF_TEN[fraction] as number);
    target[at] = negative ? -magnitude : magnitude;
    return i;
  }
  target[at] = parseDecimal(asciiText(bytes, from, i)) ?? Number.NaN;
  return ~i;
}

/** Tables with fewer rows are read without the row kernel (setting it up costs more). */
const KERNEL_MIN_ROWS = 64;

/** What readRows carries from row to row (and between the kernel and scanRange). */
interface RowScan {
  plain: boolean;
  /** The month of the previous plain date (y * 100 + m), its first day's key and its length. */
  month: number;
  monthKey: number;
  monthLength: number;
  /** Or of UNPLAIN over the bytes read. */
  unplain: number;
  readonly withNaN: boolean[];
}

class ByteGrid implements ByteGridOf {
  private readonly d: number;
  /** The last row ends at the end of the bytes (no line feed): read it through its text. */
  private readonly openEnd: boolean;
  private readonly start: number;
  private readonly starts: Int32Array;
  private readonly firstBytes: Uint8Array;
  /** Rows [checkedFrom, checkedTo) were found plain by readRows. */
  private checkedFrom = 0;
  private checkedTo = 0;
  /** Set when readRows met a byte that is not plain. */
  private unplain = false;

  constructor(
    private readonly bytes: Uint8Array,
    readonly delimiter: string,
    lines: PlainLines,
  ) {
    this.d = delimiter.charCodeAt(0);
    this.start = lines.start;
    this.starts = lines.starts;
    this.firstBytes = lines.firstBytes;
    this.openEnd = (this.starts[this.starts.length - 1] as number) > bytes.length;
  }

  clean(): boolean {
    if (this.unplain) return false;
    const { bytes, starts } = this;
    if (this.checkedFrom >= this.checkedTo) return isPlain(bytes, this.start, bytes.length);
    const checkedStart = starts[this.checkedFrom] as number;
    const checkedEnd = Math.min(bytes.length, starts[this.checkedTo] as number);
    return isPlain(bytes, this.start, checkedStart) && isPlain(bytes, checkedEnd, bytes.length);
  }

  get rowCount(): number {
    return this.starts.length - 1;
  }

  line(row: number): number {
    return row + 1;
  }

  private end(row: number): number {
    const start = this.starts[row] as number;
    const end = (this.starts[row + 1] as number) - 1;
    return end > start && this.bytes[end - 1] === 13 ? end - 1 : end;
  }

  isBlank(row: number): boolean {
    const { bytes, d } = this;
    const first = this.firstBytes[row] as number;
    // A printable first character lies before the line break, so the row is not blank.
    if (first > 32 && first < 128 && first !== d) return false;
    const end = this.end(row);
    for (let i = this.starts[row] as number; i < end; i++) {
      const code = bytes[i] as number;
      if (code === d || code === 32 || code === 9) continue;
      if (code > 32 && code < 128) return false;
      return this.fields(row).every((field) => field.trim() === "");
    }
    return true;
  }

  fieldCount(row: number): number {
    if (this.isBlank(row)) return 0;
    const { bytes, d } = this;
    const end = this.end(row);
    let count = 1;
    for (let i = this.starts[row] as number; i < end; i++) if (bytes[i] === d) count++;
    return count;
  }

  /** Start of field `index` of the row, or -1 beyond the last field. */
  private fieldStart(row: number, index: number, end: number): number {
    const { bytes, d } = this;
    let i = this.starts[row] as number;
    for (let f = 0; f < index; f++) {
      while (i < end && bytes[i] !== d) i++;
      if (i >= end) return -1;
      i++;
    }
    return i;
  }

  field(row: number, index: number): string {
    const end = this.end(row);
    const from = this.fieldStart(row, index, end);
    if (from < 0) return "";
    let to = from;
    while (to < end && this.bytes[to] !== this.d) to++;
    return asciiText(this.bytes, from, to);
  }

  fields(row: number): string[] {
    return asciiText(this.bytes, this.starts[row] as number, this.end(row)).split(this.delimiter);
  }

  readNumbers(row: number, slots: Int32Array, out: readonly Float64Array[], at: number): number {
    if (this.openEnd && row === this.starts.length - 2) {
      const fields = this.fields(row);
      slots.forEach((slot, f) => {
        if (slot >= 0) (out[slot] as Float64Array)[at] = parseDecimal(fields[f] ?? "") ?? Number.NaN;
      });
      return fields.length;
    }
    const { bytes, d } = this;
    const end = this.end(row);
    let i = this.starts[row] as number;
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
  ): { readonly plainDates: boolean; readonly withNaN: readonly boolean[] } {
    // Only a field handed to parseDecimal can give NaN.
    const state: RowScan = { plain: true, month: -1, monthKey: 0, monthLength: 0, unplain: 0, withNaN: out.map(() => false) };
    const kernel = count >= KERNEL_MIN_ROWS && this.d < 128 ? rowKernelFor(this.bytes) : null;
    const chunk = kernel === null ? 0 : kernel.kernel.chunkRows(slots.length, out.length);
    if (kernel === null || chunk === 0) this.scanRange(first, 0, count, slots, out, counts, dateIndex, dateKeys, state);
    else this.kernelRange(kernel.kernel, kernel.base, chunk, first, count, slots, out, counts, dateIndex, dateKeys, state);
    if (state.unplain !== 0) this.unplain = true;
    else if (count > 0) {
      this.checkedFrom = first;
      this.checkedTo = first + count;
    }
    return { plainDates: state.plain, withNaN: state.withNaN };
  }

  /**
   * readRows through the row kernel (rowKernel.ts), chunk by chunk: the numbers, field counts and
   * date digits of the simple rows come from the kernel, their date keys are formed here as
   * scanRange forms them, and every row the kernel flagged (and the open last row) is read by
   * scanRange, in row order, so that the result is scanRange's bit for bit.
   */
  private kernelRange(
    kernel: RowKernel,
    base: number,
    chunk: number,
    first: number,
    count: number,
    slots: Int32Array,
    out: readonly Float64Array[],
    counts: Int32Array,
    dateIndex: number,
    dateKeys: Float64Array,
    state: RowScan,
  ): void {
    const lastRow = this.openEnd ? this.starts.length - 2 : -1;
    for (let k0 = 0; k0 < count; k0 += chunk) {
      const k1 = Math.min(count, k0 + chunk);
      const kEnd = lastRow >= first + k0 && lastRow < first + k1 ? lastRow - first : k1;
      if (kEnd > k0) {
        const read = kernel.scan(base, this.starts, first + k0, first + kEnd, slots, out.length, this.d, dateIndex);
        out.forEach((values, slot) => values.set(read.values(slot), k0));
        counts.set(read.counts, k0);
        if (state.plain) dateKeys.set(read.keys, k0);
        if (read.badDate) state.plain = false;
        if (read.flagged > 0) this.settleFlagged(read, kernel, base, first, k0, kEnd, slots, out, counts, dateIndex, dateKeys, state);
      }
      if (kEnd < k1) this.scanRange(first, kEnd, k1, slots, out, counts, dateIndex, dateKeys, state);
    }
  }

  /**
   * The flagged rows of a kernel chunk (rows k0 .. kEnd - 1): flag 1, read here (scanRange writes
   * only what it reads, so what the kernel left for the row is cleared first); flag 2, the long
   * numbers (NaN) parsed from their spans, as scanDecimal hands them to parseDecimal (their bytes
   * are digits, signs and points, so plain).
   */
  private settleFlagged(
    read: KernelChunk,
    kernel: RowKernel,
    base: number,
    first: number,
    k0: number,
    kEnd: number,
    slots: Int32Array,
    out: readonly Float64Array[],
    counts: Int32Array,
    dateIndex: number,
    dateKeys: Float64Array,
    state: RowScan,
  ): void {
    const { flags } = read;
    const spans = out.map((_, slot) => read.spans(slot));
    // The chunk's text, made once when a long number needs it: substrings of it are cheap.
    const textFrom = base + (this.starts[first + k0] as number);
    let text: string | null = null;
    for (let k = k0; k < kEnd; k++) {
      const flag = flags[k - k0] as number;
      if (flag === 1) {
        for (const values of out) values[k] = 0;
        dateKeys[k] = 0;
        this.scanRange(first, k, k + 1, slots, out, counts, dateIndex, dateKeys, state);
      } else if (flag === 2) {
        for (let slot = 0; slot < out.length; slot++) {
          const values = out[slot] as Float64Array;
          if (!Number.isNaN(values[k] as number)) continue;
          const span = spans[slot] as Int32Array;
          const from = span[2 * (k - k0)] as number;
          const to = span[2 * (k - k0) + 1] as number;
          // The kernel checked the syntax ([+-]digits[.digits]), so parseDecimal is Number here.
          text ??= kernel.text(textFrom, base + (this.starts[first + kEnd] as number));
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

  /** Rows first + [from, to) of readRows, in JavaScript, continuing `state`. */
  private scanRange(
    first: number,
    from: number,
    to: number,
    slots: Int32Array,
    out: readonly Float64Array[],
    counts: Int32Array,
    dateIndex: number,
    dateKeys: Float64Array,
    state: RowScan,
  ): void {
    const { bytes, d, starts } = this;
    const lastRow = this.openEnd ? starts.length - 2 : -1;
    const { withNaN } = state;
    let { plain, month, monthKey, monthLength } = state;
    // Or of UNPLAIN over every byte of the rows that the loop below does not otherwise check.
    let unplain = state.unplain;
    for (let k = from; k < to; k++) {
      const row = first + k;
      const start = starts[row] as number;
      if (row === lastRow) {
        counts[k] = this.readNumbers(row, slots, out, k);
        out.forEach((values, slot) => (withNaN[slot] ||= Number.isNaN(values[k] as number)));
        if (plain) plain = this.plainIsoDates(Int32Array.of(row), dateIndex, dateKeys.subarray(k, k + 1));
        if (!isPlain(bytes, start, bytes.length)) unplain = 1;
        continue;
      }
      let end = (starts[row + 1] as number) - 1;
      if (end > start && bytes[end - 1] === 13) end--;
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
            // plainIsoDates on this field (see there), with the month of the previous date kept.
            const p = i;
            dated = true;
            if (p + 10 > end || (p + 10 < end && bytes[p + 10] !== d) || bytes[p + 4] !== 45 || bytes[p + 7] !== 45) plain = false;
            else {
              const y = digit(bytes, p) * 1000 + digit(bytes, p + 1) * 100 + digit(bytes, p + 2) * 10 + digit(bytes, p + 3);
              const m = digit(bytes, p + 5) * 10 + digit(bytes, p + 6);
              const day = digit(bytes, p + 8) * 10 + digit(bytes, p + 9);
              if (y * 100 + m !== month) {
                monthKey = plainDateKey(y, m, 1);
                month = y * 100 + m;
                monthLength = daysInMonth(y, m);
              }
              if (!(day >= 1 && day <= monthLength) || Number.isNaN(monthKey)) plain = false;
              else {
                dateKeys[k] = monthKey + (day - 1) * DAY_MS;
                i = p + 10;
              }
            }
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
    state.month = month;
    state.monthKey = monthKey;
    state.monthLength = monthLength;
    state.unplain = unplain;
  }

  plainIsoDates(rows: Int32Array, index: number, keys: Float64Array): boolean {
    const { bytes, d } = this;
    // Consecutive dates mostly share their month: its first day's key and length are kept.
    let month = -1;
    let monthKey = 0;
    let monthLength = 0;
    for (let k = 0; k < rows.length; k++) {
      const row = rows[k] as number;
      const end = this.end(row);
      const p = index === 0 ? (this.starts[row] as number) : this.fieldStart(row, index, end);
      if (p < 0 || p + 10 > end || (p + 10 < end && bytes[p + 10] !== d) || bytes[p + 4] !== 45 || bytes[p + 7] !== 45) return false;
      const y = digit(bytes, p) * 1000 + digit(bytes, p + 1) * 100 + digit(bytes, p + 2) * 10 + digit(bytes, p + 3);
      const m = digit(bytes, p + 5) * 10 + digit(bytes, p + 6);
      const day = digit(bytes, p + 8) * 10 + digit(bytes, p + 9);
      if (y * 100 + m !== month) {
        monthKey = plainDateKey(y, m, 1);
        if (Number.isNaN(monthKey)) return false;
        month = y * 100 + m;
        monthLength = daysInMonth(y, m);
      }
      if (!(day >= 1 && day <= monthLength)) return false;
      // plainDateKey(y, m, day): the day count is linear in the day of the month.
      keys[k] = monthKey + (day - 1) * DAY_MS;
    }
    return true;
  }
}

function digit(bytes: Uint8Array, i: number): number {
  const v = (bytes[i] as number) - 48;
  return v >= 0 && v <= 9 ? v : Number.NaN;
}

/**
 * What the byte engine reads for one field of ASCII bytes (no delimiter, no line break inside):
 * `scanDecimal` on it, so parseDecimal of its text or NaN for null.
 */
export function decimalOfBytes(field: Uint8Array, delimiter = ","): number {
  const padded = new Uint8Array(field.length + 1);
  padded.set(field);
  padded[field.length] = 10;
  const out = new Float64Array(1);
  scanDecimal(padded, 0, field.length, delimiter.charCodeAt(0), out, 0);
  return out[0] as number;
}
