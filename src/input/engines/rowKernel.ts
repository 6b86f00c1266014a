/**
 * The row kernel: the simple rows of a plain CSV read by WebAssembly (rowKernel.wat), about twice as
 * fast as the same loop in JavaScript, and fast from the first row (no interpreter warm-up). It reads
 * the file's bytes where they are, in its own memory: a window onto a large file (`kernelWindow`, see
 * byteWindow.ts), a large file read whole straight into it (`kernelBytes`), a small one copied there. byteGrid.ts decides what the
 * kernel's output means and reads every flagged row itself, so results are those of the JavaScript
 * engine bit for bit.
 *
 * Memory layout (never grown, so views into it stay valid): pow10 table at 0, findLines' flag for a
 * byte that is not plain at 248 (ODD_AT), a scratch area for one chunk of rows (their starts, the
 * slots, the outputs) from 256, then the file's bytes at `fileBase`.
 */
import { rowKernelWasm } from "./rowKernelWasm.js";

const PAGE = 65_536;
/** Bytes of scratch for one chunk of rows. */
const SCRATCH = 4 << 20;
/** Where the scratch area starts (after the 23 powers of ten) and where the file starts. */
const SCRATCH_BASE = 256;
/** Where findLines writes whether a range held a byte that is not plain (after the powers of ten). */
const ODD_AT = 248;
const FILE_BASE = SCRATCH_BASE + SCRATCH;
/**
 * Bytes that are not already in kernel memory are copied there up to this size; larger ones are
 * read by the kernel only when they were put in its memory (`kernelBytes`).
 */
export const COPY_LIMIT = 16 << 20;
/** Most rows per chunk; fewer when many columns are read. */
const MAX_CHUNK = 16_384;
/** Fewer rows per chunk than this (very many fields or columns): the kernel is not used. */
const MIN_CHUNK = 256;

interface KernelExports {
  findLines(from: number, to: number, base: number, out: number, odd: number): number;
  readRows(
    starts: number,
    count: number,
    base: number,
    d: number,
    slots: number,
    nf: number,
    dateIndex: number,
    out: number,
    keys: number,
    counts: number,
    flags: number,
    spans: number,
    status: number,
  ): number;
}

let compiled: WebAssembly.Module | null | undefined;

/** The compiled kernel, or null where WebAssembly is unavailable (the JavaScript engine is used). */
function kernelModule(): WebAssembly.Module | null {
  if (compiled === undefined) {
    try {
      compiled = new WebAssembly.Module(Buffer.from(rowKernelWasm, "base64"));
    } catch {
      compiled = null;
    }
  }
  return compiled;
}

/**
 * Files from this size on are read straight into kernel memory. A smaller one is read plainly and
 * copied: the copy costs little, while memory of its own costs a few page faults more. Above it the
 * copy would fault in the shared copy's fresh pages as well (a 1.5 MB file: 361 faults, about 8 ms
 * on a virtual machine), so the file's pages are faulted once, where the kernel reads them.
 */
const DIRECT_READ_MIN = 256 << 10;

/**
 * Where to read a file of `size` bytes that will be given to `readReturnsFromBytes`: a file of at least
 * DIRECT_READ_MIN bytes straight into the kernel's memory (read there in place, no copy), or null for
 * a file small enough that a plain read is best (the kernel copies it).
 */
export function largeInputBuffer(size: number): Uint8Array | null {
  return size < DIRECT_READ_MIN ? null : kernelBytes(size);
}

/** Kernel memories by the ArrayBuffer of the file bytes they hold. */
const memories = new WeakMap<ArrayBufferLike, RowKernel>();

/**
 * `size` zero bytes in kernel memory, for reading a file into (the kernel then reads them in place),
 * or a plain Uint8Array when WebAssembly is unavailable.
 */
export function kernelBytes(size: number): Uint8Array {
  const module = kernelModule();
  if (module === null || size > 0xffff_ffff - FILE_BASE) return new Uint8Array(size);
  const memory = new WebAssembly.Memory({ initial: Math.ceil((FILE_BASE + size) / PAGE) });
  const kernel = new RowKernel(memory, module);
  memories.set(memory.buffer, kernel);
  return new Uint8Array(memory.buffer, FILE_BASE, size);
}

/**
 * The offsets just past each line feed of `bytes` from `from` on (where the next row starts), found
 * by the kernel 16 bytes at a time (a small file in a copy); null for a tiny file outside kernel memory, or
 * without WebAssembly.
 */
export function lineEnds(bytes: Uint8Array, from: number): Int32Array | null {
  const kernel = memories.get(bytes.buffer);
  if (kernel !== undefined) return kernel.lineEnds(bytes.byteOffset, from, bytes.length);
  // A small file is found in a copy in the shared kernel (as rowKernelFor reads its rows): a copy of a
  // few MB costs less than a call per line. A tiny one is left to the caller's search.
  const copy = bytes.length >= LINE_COPY_MIN ? rowKernelFor(bytes) : null;
  return copy === null ? null : copy.kernel.lineEnds(copy.base, from, bytes.length);
}

/** Files shorter than this are not copied to find their lines. */
const LINE_COPY_MIN = 4096;

/** The kernel whose memory small files are copied into (made on first use, never grown). */
let copyKernel: RowKernel | null | undefined;

/**
 * The kernel that reads `bytes`, and where they start in its memory: in place when they are kernel
 * bytes; else a copy in a shared kernel when they are small enough (valid until the next call);
 * null otherwise, and where WebAssembly is unavailable.
 */
export function rowKernelFor(bytes: Uint8Array): { readonly kernel: RowKernel; readonly base: number } | null {
  const own = memories.get(bytes.buffer);
  if (own !== undefined) return { kernel: own, base: bytes.byteOffset };
  if (bytes.length > COPY_LIMIT) return null;
  if (copyKernel === undefined) {
    const module = kernelModule();
    copyKernel =
      module === null ? null : new RowKernel(new WebAssembly.Memory({ initial: Math.ceil((FILE_BASE + COPY_LIMIT) / PAGE) }), module);
  }
  if (copyKernel === null) return null;
  copyKernel.write(bytes, FILE_BASE);
  return { kernel: copyKernel, base: FILE_BASE };
}

/** Line-end offsets found so far: ends[0, count). */
export interface LineEnds {
  readonly ends: Int32Array;
  readonly count: number;
}

/**
 * `size` bytes in the memory of a kernel of their own (at `address` there), for a window onto a file
 * (byteWindow.ts); without WebAssembly, plain bytes and no kernel.
 */
export function kernelWindow(size: number): { readonly kernel: RowKernel | null; readonly bytes: Uint8Array; readonly address: number } {
  const module = kernelModule();
  if (module === null || size > 0xffff_ffff - FILE_BASE - PAGE) return { kernel: null, bytes: new Uint8Array(size), address: 0 };
  // A page more than the window: the kernel's 16-byte loads never reach the end of the memory.
  const memory = new WebAssembly.Memory({ initial: Math.ceil((FILE_BASE + size) / PAGE) + 1 });
  return { kernel: new RowKernel(memory, module), bytes: new Uint8Array(memory.buffer, FILE_BASE, size), address: FILE_BASE };
}

/**
 * Files larger than this are read through a window (byteWindow.ts) rather than whole: a window a few
 * hundred KB long is faulted in once and stays in the processor's cache, while a whole file's pages are
 * each faulted (about 10 microseconds a page here). Measured (interleaved medians, 11 rounds,
 * 2026-12-05): 100,000 rows (6 MB) with the default uncertainty 300 to 277 ms, the factor model's
 * 1.4 MB file 210 to 199 ms; 10,000 rows (0.6 MB) unchanged.
 */
export const WINDOW_FROM = 512 << 10;

/** True when a file of `size` bytes is better read through a window than whole (see largeInputBuffer). */
export function readsThroughWindow(size: number): boolean {
  return size > WINDOW_FROM;
}

/** One chunk's outputs: views into the scratch area, valid until the next `scan`. */
export interface KernelChunk {
  /** values(slot)[k]: the number read for row k of the chunk; NaN for a long number (see spans). */
  values(slot: number): Float64Array;
  /** spans(slot)[2k], [2k + 1]: where the long number of row k starts and ends in memory. */
  spans(slot: number): Int32Array;
  /** The date key of each row (0 where the date is not a calendar date). */
  readonly keys: Float64Array;
  readonly counts: Int32Array;
  /** 0: read; 1: the caller reads the row; 2: the caller parses the long numbers (NaN values). */
  readonly flags: Uint8Array;
  readonly flagged: number;
  /**
   * True when some row that was read has a well-formed stamp that is not a real date and time, or
   * one of another form than the column's (see scanStamp).
   */
  readonly badDate: boolean;
  /** The column's stamp form after the chunk (NO_FORM while no stamp was read). */
  readonly form: number;
}

export class RowKernel {
  private readonly exports: KernelExports;
  private readonly bytes: Uint8Array;
  private readonly words: Int32Array;
  private readonly doubles: Float64Array;
  /** The memory as a Buffer, for its native latin1 slices. */
  private readonly latin1: Buffer;

  constructor(memory: WebAssembly.Memory, module: WebAssembly.Module) {
    this.latin1 = Buffer.from(memory.buffer);
    this.exports = new WebAssembly.Instance(module, { env: { memory } }).exports as unknown as KernelExports;
    this.bytes = new Uint8Array(memory.buffer);
    this.words = new Int32Array(memory.buffer);
    this.doubles = new Float64Array(memory.buffer);
    for (let k = 0; k <= 22; k++) this.doubles[k] = 10 ** k;
  }

  /** See `lineEnds`: the file is at `base`, `length` bytes long. */
  lineEnds(base: number, from: number, length: number): Int32Array {
    const found = this.appendLineEnds(base, from, length, { ends: new Int32Array(Math.max(4096, (length - from) >> 5)), count: 0 });
    return found.ends.subarray(0, found.count);
  }

  /**
   * The offsets just past each line feed of file bytes [from, to) (the file at `base` in this memory:
   * its bytes there may be only those of a window), appended to `found` (grown when full); `plain`
   * is true when no byte of the range is NUL, CR, a double quote or non-ASCII (when false, isPlain
   * decides: a CR before a LF is plain).
   */
  appendLineEnds(base: number, from: number, to: number, found: LineEnds): LineEnds & { readonly plain: boolean } {
    // Each block can hold as many line feeds as bytes: one i32 each in the scratch area.
    const block = SCRATCH >> 2;
    let { ends, count } = found;
    let plain = true;
    for (let at = from; at < to; at += block) {
      const count1 = this.exports.findLines(base + at, base + Math.min(to, at + block), base, SCRATCH_BASE, ODD_AT);
      if (this.words[ODD_AT >> 2] !== 0) plain = false;
      if (count + count1 > ends.length) {
        const bigger = new Int32Array(Math.max(2 * ends.length, count + count1));
        bigger.set(ends.subarray(0, count));
        ends = bigger;
      }
      ends.set(this.words.subarray(SCRATCH_BASE >> 2, (SCRATCH_BASE >> 2) + count1), count);
      count += count1;
    }
    return { ends, count, plain };
  }

  /** Copies `bytes` into the kernel's memory at `at`. */
  write(bytes: Uint8Array, at: number): void {
    this.bytes.set(bytes, at);
  }

  /** Rows per chunk for `fields` fields and `columns` outputs, or 0 when the kernel cannot take them. */
  chunkRows(fields: number, columns: number): number {
    const fixed = 4 * fields + 64;
    // starts, values, spans, keys, counts, flags, with room for alignment
    const perRow = 4 + 8 * columns + 8 * columns + 8 + 4 + 1;
    const rows = Math.min(MAX_CHUNK, Math.floor((SCRATCH - fixed) / perRow) - 8);
    return rows >= MIN_CHUNK ? rows : 0;
  }

  /** The text of bytes [from, to) of this memory (ASCII: latin1 is the identity). */
  text(from: number, to: number): string {
    return this.latin1.toString("latin1", from, to);
  }

  /**
   * Reads rows [from, to) of a file at `base` whose rows start at `starts` (offsets into the file, as
   * PlainLines.starts; every row must end with a line feed), at most chunkRows(...) rows; `form` is
   * the date column's stamp form so far (see scanStamp; -1 before the first stamp).
   */
  scan(
    base: number,
    starts: Int32Array,
    from: number,
    to: number,
    slots: Int32Array,
    columns: number,
    delimiter: number,
    dateIndex: number,
    form = -1,
  ): KernelChunk {
    const count = to - from;
    const align8 = (n: number): number => (n + 7) & ~7;
    const statusAt = SCRATCH_BASE;
    const slotsAt = statusAt + 8;
    const startsAt = align8(slotsAt + 4 * slots.length);
    const outAt = align8(startsAt + 4 * (count + 1));
    const spansAt = outAt + 8 * columns * count;
    const keysAt = spansAt + 8 * columns * count;
    const countsAt = keysAt + 8 * count;
    const flagsAt = countsAt + 4 * count;
    const { words, doubles } = this;
    words.set(slots, slotsAt >> 2);
    words[(statusAt >> 2) + 1] = form;
    words.set(starts.subarray(from, to + 1), startsAt >> 2);
    const flagged = this.exports.readRows(
      startsAt,
      count,
      base,
      delimiter,
      slotsAt,
      slots.length,
      dateIndex,
      outAt,
      keysAt,
      countsAt,
      flagsAt,
      spansAt,
      statusAt,
    );
    return {
      values: (slot) => doubles.subarray((outAt >> 3) + slot * count, (outAt >> 3) + (slot + 1) * count),
      spans: (slot) => words.subarray((spansAt >> 2) + 2 * slot * count, (spansAt >> 2) + 2 * (slot + 1) * count),
      keys: doubles.subarray(keysAt >> 3, (keysAt >> 3) + count),
      counts: words.subarray(countsAt >> 2, (countsAt >> 2) + count),
      flags: this.bytes.subarray(flagsAt, flagsAt + count),
      flagged,
      badDate: words[statusAt >> 2] !== 0,
      form: words[(statusAt >> 2) + 1] as number,
    };
  }
}
