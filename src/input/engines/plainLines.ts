/**
 * The rows of a file's bytes for the byte engine (byteGrid.ts): where each row starts, found by the
 * row kernel's SIMD search (in place, or in a copy for a file of 4 KiB to 16 MB; rowKernel.ts lineEnds)
 * or Buffer's native search (a tiny file, or no WebAssembly), and the checks that the
 * bytes are plain ASCII without NUL, quote characters or lone CR, so that each byte is one character
 * of the text `decodeText` would give.
 */
import { maximumInputBytes } from "../limits.js";
import { lineEnds } from "./rowKernel.js";

/** 1 for the bytes that send a file to the text path: NUL, CR (unless it ends a row), the double quote, and every non-ASCII byte. */
export const UNPLAIN = Uint8Array.from({ length: 256 }, (_, b) => (b === 0 || b === 13 || b === 34 || b >= 0x80 ? 1 : 0));
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
  if (bytes.length > maximumInputBytes || !isPlain(bytes, start, Math.min(bytes.length, start + headCheck))) return null;
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
export function asBuffer(bytes: Uint8Array): Buffer {
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

/** Values allEqualTo compares at once with a run of the expected one. */
const RUN = 16_384;

/**
 * True when every value is `expected`: compared by Buffer.compare, natively, a run at a time (a loop
 * over them ran in V8's interpreter for the first thousands of rows, about 0.2 microseconds a row; the
 * check of every row's field count, table/rowShape.ts).
 */
export function allEqualTo(values: Int32Array, expected: number): boolean {
  const run = Buffer.from(new Int32Array(Math.min(RUN, values.length)).fill(expected).buffer);
  for (let from = 0; from < values.length; from += RUN) {
    const length = 4 * (Math.min(values.length, from + RUN) - from);
    const got = Buffer.from(values.buffer, values.byteOffset + 4 * from, length);
    if (got.compare(run, 0, length) !== 0) return false;
  }
  return true;
}
