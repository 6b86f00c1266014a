/** Turning the bytes of a file into text, refusing binary files and anything that is not UTF-8. */
import { failure, success, type Result } from "../core/result.js";
import { UNPLAIN } from "./engines/plainLines.js";
import { binaryKind, unicodeEncoding } from "./fileKind.js";
import type { InputIssue } from "./issues.js";
import { maximumTextLength } from "./limits.js";

/**
 * The issue for bytes that are no text file at all, found from their first bytes before anything is
 * read: a known binary format ("not-a-text-file", by its signature) or UTF-16 / UTF-32 text
 * ("unsupported-encoding"); null otherwise.
 */
export function notTextIssue(bytes: Uint8Array, source: string): InputIssue | null {
  const kind = binaryKind(bytes);
  if (kind !== null) return { code: "not-a-text-file", source, kind, size: bytes.length };
  const unicode = unicodeEncoding(bytes);
  return unicode === null ? null : { code: "unsupported-encoding", source, ...unicode };
}

/**
 * Decode UTF-8 bytes strictly. A leading UTF-8 byte-order mark is removed. Fails with
 * "not-a-text-file" or "unsupported-encoding" (see `notTextIssue`), "binary-content" for a NUL
 * byte, "text-too-large" when the text would be longer than `limit` (the longest string, see
 * limits.ts; checked before decoding) and "invalid-encoding" for the first malformed UTF-8 sequence;
 * offsets are 0-based bytes, lines 1-based.
 */
export function decodeText(bytes: Uint8Array, source: string, limit = maximumTextLength): Result<string, InputIssue[]> {
  const notText = notTextIssue(bytes, source);
  if (notText !== null) return failure([notText]);
  const nul = bytes.indexOf(0);
  if (nul >= 0) return failure([{ code: "binary-content", source, line: lineAt(bytes, nul), offset: nul }]);
  const start = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  const tooLarge = textLengthIssue(bytes, start, source, limit);
  if (tooLarge !== null) return failure([tooLarge]);
  try {
    return success(new TextDecoder("utf-8", { fatal: true }).decode(bytes));
  } catch {
    const offset = firstInvalidUtf8(bytes);
    return failure([{ code: "invalid-encoding", source, line: lineAt(bytes, offset), offset, byte: bytes[offset] ?? 0 }]);
  }
}

/**
 * The number of UTF-16 code units the UTF-8 bytes [from, to) decode to: one per byte that does not
 * continue a sequence (10xxxxxx), and one more per 4-byte sequence (a surrogate pair). Exact for
 * valid UTF-8.
 */
export function utf16Length(bytes: Uint8Array, from: number, to: number): number {
  let units = 0;
  for (let i = from; i < to; i++) {
    const b = bytes[i] as number;
    if ((b & 0xc0) !== 0x80) units += b >= 0xf0 ? 2 : 1;
  }
  return units;
}

/**
 * A "text-too-large" issue when the text of `bytes` (from `start`, past a byte-order mark) is longer
 * than `limit` code units, else null; found without building the text. It names what sent the file
 * to the text path (the first byte that is not plain, see `UNPLAIN`).
 */
export function textLengthIssue(bytes: Uint8Array, start: number, source: string, limit = maximumTextLength): InputIssue | null {
  // Each byte gives at most one code unit: no need to count below the limit.
  if (bytes.length - start <= limit) return null;
  const length = utf16Length(bytes, start, bytes.length);
  if (length <= limit) return null;
  const offset = firstUnplain(bytes, start);
  const byte = offset < 0 ? -1 : (bytes[offset] as number);
  const cause = byte < 0 ? "size" : byte === 34 ? "quote" : byte === 13 ? "carriage-return" : "non-ascii";
  const line = offset < 0 ? {} : { line: lineAt(bytes, offset) };
  return { code: "text-too-large", source, size: bytes.length, length, limit, cause, ...line };
}

/** The offset of the first byte that sends a file to the text path (a CR before a LF does not), or -1. */
function firstUnplain(bytes: Uint8Array, start: number): number {
  for (let i = start; i < bytes.length; i++) {
    const b = bytes[i] as number;
    if (UNPLAIN[b] === 1 && !(b === 13 && bytes[i + 1] === 10)) return i;
  }
  return -1;
}

/** The 1-based line of a byte offset. */
function lineAt(bytes: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = bytes.indexOf(0x0a); i >= 0 && i < offset; i = bytes.indexOf(0x0a, i + 1)) line++;
  return line;
}

/** Offset of the first byte that does not start a well-formed UTF-8 sequence (RFC 3629), or bytes.length. */
export function firstInvalidUtf8(bytes: Uint8Array): number {
  let i = 0;
  while (i < bytes.length) {
    const b = bytes[i] as number;
    let need: number;
    let low = 0x80;
    let high = 0xbf;
    if (b < 0x80) need = 0;
    else if (b >= 0xc2 && b <= 0xdf) need = 1;
    else if (b >= 0xe0 && b <= 0xef) {
      need = 2;
      if (b === 0xe0) low = 0xa0;
      if (b === 0xed) high = 0x9f;
    } else if (b >= 0xf0 && b <= 0xf4) {
      need = 3;
      if (b === 0xf0) low = 0x90;
      if (b === 0xf4) high = 0x8f;
    } else return i;
    for (let k = 1; k <= need; k++) {
      const c = bytes[i + k];
      if (c === undefined || c < (k === 1 ? low : 0x80) || c > (k === 1 ? high : 0xbf)) return i;
    }
    i += need + 1;
  }
  return bytes.length;
}
