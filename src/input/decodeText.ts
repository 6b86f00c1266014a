/** Turning the bytes of a file into text, refusing binary files and anything that is not UTF-8. */
import { failure, success, type Result } from "../core/result.js";
import type { InputIssue } from "./issues.js";

/**
 * Decode UTF-8 bytes strictly. A leading UTF-8 byte-order mark is removed. Fails with
 * "unsupported-encoding" for a UTF-16 byte-order mark, "binary-content" for a NUL byte and
 * "invalid-encoding" for the first malformed UTF-8 sequence; offsets are 0-based bytes, lines 1-based.
 */
export function decodeText(bytes: Uint8Array, source: string): Result<string, InputIssue[]> {
  if (bytes[0] === 0xff && bytes[1] === 0xfe) return failure([{ code: "unsupported-encoding", source, encoding: "UTF-16LE" }]);
  if (bytes[0] === 0xfe && bytes[1] === 0xff) return failure([{ code: "unsupported-encoding", source, encoding: "UTF-16BE" }]);
  const nul = bytes.indexOf(0);
  if (nul >= 0) return failure([{ code: "binary-content", source, line: lineAt(bytes, nul), offset: nul }]);
  try {
    return success(new TextDecoder("utf-8", { fatal: true }).decode(bytes));
  } catch {
    const offset = firstInvalidUtf8(bytes);
    return failure([{ code: "invalid-encoding", source, line: lineAt(bytes, offset), offset }]);
  }
}

function lineAt(bytes: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset; i++) if (bytes[i] === 0x0a) line++;
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
