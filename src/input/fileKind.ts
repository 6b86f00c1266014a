/**
 * Recognising files that are not UTF-8 text before reading them: common binary formats by their
 * leading signature ("magic number"), and UTF-16 / UTF-32 text by its byte-order mark or, without
 * one, by where the zero bytes of its ASCII characters fall.
 */

/** Binary formats recognised by their first bytes (see `binaryKind`). */
export const binaryKinds = [
  "gzip",
  "zip",
  "xls",
  "pdf",
  "png",
  "jpeg",
  "gif",
  "bzip2",
  "xz",
  "zstd",
  "7z",
  "sqlite",
  "parquet",
  "elf",
] as const;
export type BinaryKind = (typeof binaryKinds)[number];

/** Signatures, each from its format's specification: bytes at offset 0 (null matches any byte). */
const SIGNATURES: readonly (readonly [BinaryKind, readonly (number | null)[]])[] = [
  ["gzip", [0x1f, 0x8b, 0x08]], // RFC 1952: ID1 ID2, CM = 8 (deflate)
  ["zip", [0x50, 0x4b, 0x03, 0x04]], // "PK\3\4": a local file header (also .xlsx, .ods, .docx)
  ["zip", [0x50, 0x4b, 0x05, 0x06]], // "PK\5\6": an empty archive
  ["xls", [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]], // OLE2 compound file (.xls, .doc)
  ["pdf", [0x25, 0x50, 0x44, 0x46, 0x2d]], // "%PDF-"
  ["png", [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]],
  ["jpeg", [0xff, 0xd8, 0xff]],
  ["gif", [0x47, 0x49, 0x46, 0x38, null, 0x61]], // "GIF87a" or "GIF89a"
  ["bzip2", [0x42, 0x5a, 0x68, null, 0x31, 0x41, 0x59, 0x26, 0x53, 0x59]], // "BZh" level, then the block magic
  ["xz", [0xfd, 0x37, 0x7a, 0x58, 0x5a, 0x00]],
  ["zstd", [0x28, 0xb5, 0x2f, 0xfd]],
  ["7z", [0x37, 0x7a, 0xbc, 0xaf, 0x27, 0x1c]],
  ["sqlite", [0x53, 0x51, 0x4c, 0x69, 0x74, 0x65, 0x20, 0x66, 0x6f, 0x72, 0x6d, 0x61, 0x74, 0x20, 0x33, 0x00]], // "SQLite format 3\0"
  ["parquet", [0x50, 0x41, 0x52, 0x31]], // "PAR1"
  ["elf", [0x7f, 0x45, 0x4c, 0x46]], // an executable
];

/** The binary format whose signature the bytes start with, or null. */
export function binaryKind(bytes: Uint8Array): BinaryKind | null {
  for (const [kind, signature] of SIGNATURES) {
    if (bytes.length >= signature.length && signature.every((b, i) => b === null || bytes[i] === b)) return kind;
  }
  return null;
}

/** A Unicode encoding other than UTF-8. */
export type UnicodeEncoding = "UTF-16LE" | "UTF-16BE" | "UTF-32LE" | "UTF-32BE";

/** The first bytes looked at for the zero-byte pattern of UTF-16 or UTF-32 without a byte-order mark. */
const SAMPLE = 4096;

/**
 * The encoding of UTF-16 or UTF-32 text, by its byte-order mark (UTF-32LE's, FF FE 00 00, is checked
 * before UTF-16LE's, FF FE) or, without one, by its zero bytes: in ASCII text (digits, commas, dates)
 * each character of UTF-16LE is a byte and a zero, of UTF-32BE three zeros and a byte, and so on.
 * Null for anything else.
 */
export function unicodeEncoding(bytes: Uint8Array): { readonly encoding: UnicodeEncoding; readonly bom: boolean } | null {
  const [b0, b1, b2, b3] = bytes;
  if (b0 === 0xff && b1 === 0xfe && b2 === 0 && b3 === 0) return { encoding: "UTF-32LE", bom: true };
  if (b0 === 0 && b1 === 0 && b2 === 0xfe && b3 === 0xff) return { encoding: "UTF-32BE", bom: true };
  if (b0 === 0xff && b1 === 0xfe) return { encoding: "UTF-16LE", bom: true };
  if (b0 === 0xfe && b1 === 0xff) return { encoding: "UTF-16BE", bom: true };
  const n = Math.min(bytes.length, SAMPLE) & ~3;
  // Text without a zero byte in the sample is neither (found by a native search: the count below runs
  // in V8's interpreter, about a millisecond at every start).
  if (n < 4 || bytes.subarray(0, n).indexOf(0) < 0) return null;
  // zeros[k]: how many of the sampled bytes at offsets k mod 4 are zero.
  const zeros = [0, 0, 0, 0];
  for (let i = 0; i < n; i++) if (bytes[i] === 0) zeros[i & 3] = (zeros[i & 3] as number) + 1;
  const quarter = n / 4;
  const mostly = (k: number): boolean => (zeros[k] as number) >= 0.9 * quarter;
  const rarely = (k: number): boolean => (zeros[k] as number) <= 0.1 * quarter;
  if (rarely(0) && mostly(1) && mostly(2) && mostly(3)) return { encoding: "UTF-32LE", bom: false };
  if (mostly(0) && mostly(1) && mostly(2) && rarely(3)) return { encoding: "UTF-32BE", bom: false };
  if (rarely(0) && mostly(1) && rarely(2) && mostly(3)) return { encoding: "UTF-16LE", bom: false };
  if (mostly(0) && rarely(1) && mostly(2) && rarely(3)) return { encoding: "UTF-16BE", bom: false };
  return null;
}
