/**
 * A plain file for the byte engine (byteGrid.ts), whether its bytes are all in memory or read through
 * a window (byteWindow.ts): its rows, its bytes, and what readReturns asks of it before tokenising.
 * A file read by position is scanned once (its rows, or the finding that it must be read whole) and
 * the answer kept for every read of it (a run reads one file once per group of pairs).
 */
import { ByteWindow, type GridBytes, type PagedBytes, scanPages, wholeBytes } from "./byteWindow.js";
import { asciiText, isAsciiWhiteSpace, isPlain, type PlainLines } from "./plainLines.js";
import { type RowKernel, rowKernelFor } from "./rowKernel.js";

/** What reading a plain file needs of it. */
export interface PlainFile {
  readonly bytes: GridBytes;
  readonly lines: PlainLines;
  readonly size: number;
  /** True when every byte is plain (see isPlain). */
  plain(): boolean;
  /** True when the text (after any byte-order mark) is only ASCII white space. */
  blank(): boolean;
  /** The text of bytes [from, to) (plain, so ASCII). */
  text(from: number, to: number): string;
}

/** A file's bytes all in memory. */
class MemoryBytes implements GridBytes {
  readonly shift = 0;
  readonly span = Number.POSITIVE_INFINITY;
  readonly size: number;
  constructor(private readonly bytes: Uint8Array) {
    this.size = bytes.length;
  }
  reach(): Uint8Array {
    return this.bytes;
  }
  plain(from: number, to: number): boolean {
    return isPlain(this.bytes, from, to);
  }
  kernel(): { readonly kernel: RowKernel; readonly base: number } | null {
    return rowKernelFor(this.bytes);
  }
}

/** The plain file of bytes in memory and their `plainLines`. */
export function memoryFile(bytes: Uint8Array, lines: PlainLines): PlainFile {
  const size = bytes.length;
  return {
    bytes: new MemoryBytes(bytes),
    lines,
    size,
    plain: () => isPlain(bytes, lines.start, size),
    blank: () => isAsciiWhiteSpace(bytes, lines.start, size),
    text: (from, to) => asciiText(bytes, from, to),
  };
}

/** What the first pass found of a file read by position: a plain file through a window, or its bytes whole. */
const scanned = new WeakMap<PagedBytes, PlainFile | Uint8Array>();

/**
 * The file through a window when all of it is plain (see scanPages); else all its bytes (read once,
 * kept while the file is).
 */
export function pagedFile(file: PagedBytes): PlainFile | Uint8Array {
  const known = scanned.get(file);
  if (known !== undefined) return known;
  const window = new ByteWindow(file);
  const pages = scanPages(window);
  const found: PlainFile | Uint8Array =
    pages === null
      ? wholeBytes(file)
      : {
          bytes: window,
          lines: pages.lines,
          size: file.size,
          plain: () => true,
          blank: () => pages.blank,
          text: (from, to) => window.text(from, to),
        };
  scanned.set(file, found);
  return found;
}

/** All the bytes of a file read by position (read once, kept while the file is). */
export function wholeFile(file: PagedBytes): Uint8Array {
  const known = scanned.get(file);
  if (known instanceof Uint8Array) return known;
  const bytes = wholeBytes(file);
  // A window found before stays for reads by the byte engine; these bytes are for the text path.
  if (known === undefined) scanned.set(file, bytes);
  return bytes;
}
