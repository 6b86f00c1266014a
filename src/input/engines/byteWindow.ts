/**
 * A large file read through one reused window instead of held whole: touching fresh memory costs
 * about as much as reading the file, so a file of hundreds of MB read into a few MB used over and
 * over is read several times faster. The window lies in the row kernel's memory (rowKernel.ts), so
 * that the kernel finds line ends and reads rows in it in place.
 *
 * `scanPages` is the first pass, piece by piece: the rows (as plainLines.ts finds them on the whole
 * file) and the checks that every byte is plain; a file that is not plain (or not text, see
 * notTextIssue) is read whole instead (`wholeBytes`), so that every answer is the one reading its
 * bytes whole gives. Pure: the file is read through `PagedBytes`, which the CLI implements.
 */
import { freshInt32, freshUint8 } from "../../core/numerics/freshMemory.js";
import { notTextIssue } from "../decodeText.js";
import { asBuffer, asciiText, isAsciiWhiteSpace, isPlain, type PlainLines } from "./plainLines.js";
import { kernelWindow, largeInputBuffer, type LineEnds, type RowKernel } from "./rowKernel.js";

/** A file read by position (the CLI's is fs.readSync on an open file). */
export interface PagedBytes {
  /** The file's size in bytes, when it was opened. */
  readonly size: number;
  /** Bytes of the window it is read through (WINDOW_BYTES unless set). */
  readonly window?: number;
  /** Reads up to `length` bytes at `position` of the file into target[offset...]: the bytes read (0 at the end). */
  read(position: number, target: Uint8Array, offset: number, length: number): number;
}

/**
 * Bytes of the window, unless a row is longer: small enough to stay in the processor's cache between
 * the kernel's passes over it. Measured against 4 MB (interleaved medians, 7-11 rounds, 2026-12-05):
 * 1M rows without the uncertainty 415 to 397 ms, 10M minute rows 1.29 to 1.26 s, roll --step 21 on
 * 1M rows 715 to 701 ms; 256 KB was no faster than 512.
 */
export const WINDOW_BYTES = 512 << 10;
/** Bytes read around a range reached away from the window. */
const NEAR_BYTES = 64 << 10;

/** Where the byte grid's bytes are: all in memory, or a window onto a file. See byteGrid.ts. */
export interface GridBytes {
  readonly size: number;
  /** The file offset of reach(...)[0]. */
  readonly shift: number;
  /** Bytes holding file offsets [from, to) at [from - shift, to - shift): valid until the next call. */
  reach(from: number, to: number): Uint8Array;
  /** True when file bytes [from, to) are plain (see isPlain). */
  plain(from: number, to: number): boolean;
  /** The row kernel reading the bytes reach last gave in place, and the address of file offset 0; null without one. */
  kernel(): { readonly kernel: RowKernel; readonly base: number } | null;
  /** The most bytes reach holds at once. */
  readonly span: number;
}

/** The bytes of a file through one window, moved (re-read) when a range outside it is reached. */
export class ByteWindow implements GridBytes {
  readonly size: number;
  shift = 0;
  private end = 0;
  private held: ReturnType<typeof kernelWindow>;

  constructor(readonly file: PagedBytes) {
    this.size = file.size;
    const capacity = file.window ?? WINDOW_BYTES;
    this.held = kernelWindow(Math.max(16, Math.min(capacity, file.size)));
  }

  get span(): number {
    return this.held.bytes.length;
  }

  /** The window's bytes (the first `length` hold the range read last). */
  get bytes(): Uint8Array {
    return this.held.bytes;
  }

  reach(from: number, to: number): Uint8Array {
    if (from >= this.shift && to <= this.end) return this.held.bytes;
    if (to - from > this.held.bytes.length) this.held = kernelWindow(to - from);
    const capacity = this.held.bytes.length;
    // Reading on (from within the window) fills the window; a jump elsewhere (a row asked for alone,
    // a backward walk) reads a little, ending at `to` when backwards, so that jumps stay cheap.
    const onward = from >= this.shift && from <= this.end;
    const length = onward ? capacity : Math.min(capacity, Math.max(to - from, NEAR_BYTES));
    const at = from < this.shift ? Math.max(0, to - length) : from;
    this.load(at, Math.min(length, this.size - at));
    return this.held.bytes;
  }

  /** Reads file bytes [at, at + length) into the window's start. */
  load(at: number, length: number): Uint8Array {
    readFully(this.file, at, this.held.bytes, 0, length);
    this.shift = at;
    this.end = at + length;
    return this.held.bytes.subarray(0, length);
  }

  /** The text of file bytes [from, to), read apart from the window (ASCII: latin1 is the identity). */
  text(from: number, to: number): string {
    const bytes = new Uint8Array(to - from);
    readFully(this.file, from, bytes, 0, bytes.length);
    return asciiText(bytes, 0, bytes.length);
  }

  plain(): boolean {
    // Only a file whose every byte scanPages found plain is read through a window.
    return true;
  }

  kernel(): { readonly kernel: RowKernel; readonly base: number } | null {
    const { kernel, address } = this.held;
    return kernel === null ? null : { kernel, base: address - this.shift };
  }
}

/** Reads exactly `length` bytes at `position`; a file that shrank meanwhile is an error. */
function readFully(file: PagedBytes, position: number, target: Uint8Array, offset: number, length: number): void {
  let done = 0;
  while (done < length) {
    const read = file.read(position + done, target, offset + done, length - done);
    if (read <= 0) throw new Error(`the file ended at byte ${position + done} while reading it (${file.size} bytes when opened)`);
    done += read;
  }
}

/** The whole file in plain bytes (large ones straight into the kernel's memory, as the CLI reads them). */
export function wholeBytes(file: PagedBytes): Uint8Array {
  const bytes = largeInputBuffer(file.size) ?? new Uint8Array(file.size);
  readFully(file, 0, bytes, 0, file.size);
  return bytes;
}

/** A file's rows found through its window, and whether it is blank (only ASCII white space after any byte-order mark). */
export interface PagedLines {
  readonly lines: PlainLines;
  readonly blank: boolean;
}

/**
 * The first pass over a file through `window`: its rows, as plainLines gives them for its bytes,
 * when every byte is plain and its first bytes are not those of a binary file or UTF-16/32 text;
 * null otherwise (the file must be read whole).
 */
export function scanPages(window: ByteWindow): PagedLines | null {
  const { size } = window;
  const capacity = window.span;
  let blank = true;
  /** The previous piece ended with a CR: this one must start with a LF. */
  let pendingCr = false;
  // The first bytes decide whether the file is text at all (notTextIssue samples 4096) and where it starts.
  const head = new Uint8Array(Math.min(size, 1 << 16));
  readFully(window.file, 0, head, 0, head.length);
  if (notTextIssue(head, "") !== null) return null;
  const start = head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf ? 3 : 0;
  let found: LineEnds = { ends: new Int32Array(1024), count: 1 };
  found.ends[0] = start;
  let firstBytes: Uint8Array = new Uint8Array(1024);
  let filled = 0;
  for (let at = 0; at < size; at += capacity) {
    const piece = window.load(at, Math.min(capacity, size - at));
    const length = piece.length;
    const from = Math.max(0, start - at);
    if (from >= length) continue;
    if (pendingCr && piece[from] !== 10) return null;
    pendingCr = piece[length - 1] === 13;
    // The kernel's search for line feeds also says whether every byte is plain; only a piece where
    // it saw a NUL, CR, quote or non-ASCII byte is checked byte by byte.
    const appended = appendEnds(window, piece, at, from, found);
    if (!appended.plain && !isPlain(piece, from, pendingCr ? length - 1 : length)) return null;
    found = appended;
    if (blank) blank = isAsciiWhiteSpace(piece, from, length);
    if (at === 0 && length < size) {
      // Room for the rows, as dense as in the first piece, and a tenth more.
      const guess = Math.ceil(((found.count * size) / length) * 1.1) + 2;
      found = { ends: grownInts(found.ends.subarray(0, found.count), guess), count: found.count };
      firstBytes = freshUint8(guess);
    }
    if (firstBytes.length < found.count) firstBytes = grown(firstBytes, found.count);
    const { ends, count } = found;
    for (; filled < count && (ends[filled] as number) < at + length; filled++)
      firstBytes[filled] = piece[(ends[filled] as number) - at] as number;
  }
  if (pendingCr) return null;
  let { ends, count } = found;
  // The rows start at ends[0, count); a last row without a line feed ends one past the end.
  const open = (ends[count - 1] as number) < size;
  if (!open) count--;
  if (count + 1 > ends.length) ends = grownInts(ends, count + 1);
  if (open) ends[count] = size + 1;
  return { lines: { start, starts: ends.subarray(0, count + 1), firstBytes: firstBytes.subarray(0, count) }, blank };
}

/**
 * Appends the offsets just past each line feed of the piece (file offset `at`) from `from` on;
 * `plain` true when the kernel saw only plain bytes (false: not known).
 */
function appendEnds(
  window: ByteWindow,
  piece: Uint8Array,
  at: number,
  from: number,
  found: LineEnds,
): LineEnds & { readonly plain: boolean } {
  const kernel = window.kernel();
  if (kernel !== null) return kernel.kernel.appendLineEnds(kernel.base, at + from, at + piece.length, found);
  let { ends, count } = found;
  const search = asBuffer(piece);
  for (let end = search.indexOf(10, from); end >= 0; end = search.indexOf(10, end + 1)) {
    if (count >= ends.length) ends = grownInts(ends, count + 1);
    ends[count++] = at + end + 1;
  }
  return { ends, count, plain: false };
}

function grownInts(values: Int32Array, least: number): Int32Array {
  const bigger = freshInt32(Math.max(least, 2 * values.length));
  bigger.set(values);
  return bigger;
}

function grown(values: Uint8Array, least: number): Uint8Array {
  const bigger = freshUint8(Math.max(least, 2 * values.length));
  bigger.set(values);
  return bigger;
}
