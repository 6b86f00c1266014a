/**
 * Files that are no UTF-8 text: binary formats by their signatures (made here by real encoders where
 * Node has one: zlib's gzip; the others are the signatures of their specifications), and UTF-16 / UTF-32
 * text with and without a byte-order mark (encoded by Node's own UTF-16LE encoder).
 */
import { gzipSync } from "node:zlib";
import { describe, expect, it } from "vitest";
import { binaryKind, unicodeEncoding } from "../../src/input/fileKind.js";
import { readReturnsFromBytes } from "../../src/input/readReturns.js";
import { optionsFor } from "./helpers.js";

const table = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,-0.02,0.03\n2020-03-31,0.015,-0.01\n";
const ascii = (text: string): number[] => [...text].map((c) => c.charCodeAt(0));
const bytes = (...parts: (number[] | Uint8Array)[]): Uint8Array => Uint8Array.from(parts.flatMap((p) => [...p]));

const utf16le = (text: string): Uint8Array => new Uint8Array(Buffer.from(text, "utf16le"));
const swapPairs = (b: Uint8Array): Uint8Array => b.map((_, i) => b[i ^ 1] as number);
const utf32 = (text: string, littleEndian: boolean): Uint8Array => {
  const points = [...text].map((c) => c.codePointAt(0) as number);
  const view = new DataView(new ArrayBuffer(points.length * 4));
  points.forEach((p, i) => view.setUint32(i * 4, p, littleEndian));
  return new Uint8Array(view.buffer);
};

describe("binaryKind", () => {
  it.each<[string, Uint8Array]>([
    ["gzip", new Uint8Array(gzipSync(table))],
    ["zip", bytes(ascii("PK"), [3, 4, 20, 0, 0, 0, 8, 0])],
    ["zip", bytes(ascii("PK"), [5, 6], new Array(18).fill(0))],
    ["xls", bytes([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0, 0])],
    ["pdf", bytes(ascii("%PDF-1.7\n1 0 obj\n"))],
    ["png", bytes([0x89], ascii("PNG\r\n"), [0x1a, 0x0a, 0, 0, 0, 13], ascii("IHDR"))],
    ["jpeg", bytes([0xff, 0xd8, 0xff, 0xe0, 0, 16], ascii("JFIF"))],
    ["gif", bytes(ascii("GIF89a"), [1, 0, 1, 0])],
    ["bzip2", bytes(ascii("BZh91AY&SY"), [0x12, 0x34])],
    ["xz", bytes([0xfd], ascii("7zXZ"), [0, 0, 4])],
    ["zstd", bytes([0x28, 0xb5, 0x2f, 0xfd, 0x24])],
    ["7z", bytes(ascii("7z"), [0xbc, 0xaf, 0x27, 0x1c, 0, 4])],
    ["sqlite", bytes(ascii("SQLite format 3"), [0], [16, 0])],
    ["parquet", bytes(ascii("PAR1"), [0x15, 0])],
    ["elf", bytes([0x7f], ascii("ELF"), [2, 1, 1])],
  ])("recognises %s", (kind, data) => {
    expect(binaryKind(data)).toBe(kind);
  });

  it("takes a text table, a short file or a near miss for none", () => {
    expect(binaryKind(new TextEncoder().encode(table))).toBeNull();
    expect(binaryKind(bytes(ascii("PK")))).toBeNull();
    expect(binaryKind(bytes(ascii("%PD")))).toBeNull();
    expect(binaryKind(bytes(ascii("BZh9 is a column name\n")))).toBeNull();
    expect(binaryKind(new Uint8Array(0))).toBeNull();
  });
});

describe("unicodeEncoding", () => {
  it.each<[string, Uint8Array, string, boolean]>([
    ["UTF-16LE with a BOM", bytes([0xff, 0xfe], utf16le(table)), "UTF-16LE", true],
    ["UTF-16BE with a BOM", bytes([0xfe, 0xff], swapPairs(utf16le(table))), "UTF-16BE", true],
    ["UTF-16LE without", utf16le(table), "UTF-16LE", false],
    ["UTF-16BE without", swapPairs(utf16le(table)), "UTF-16BE", false],
    ["UTF-32LE with a BOM", utf32(`\uFEFF${table}`, true), "UTF-32LE", true],
    ["UTF-32BE with a BOM", utf32(`\uFEFF${table}`, false), "UTF-32BE", true],
    ["UTF-32LE without", utf32(table, true), "UTF-32LE", false],
    ["UTF-32BE without", utf32(table, false), "UTF-32BE", false],
  ])("names %s", (_, data, encoding, bom) => {
    expect(unicodeEncoding(data)).toEqual({ encoding, bom });
  });

  it("names nothing in UTF-8 text, in zeros alone or in a few bytes", () => {
    expect(unicodeEncoding(new TextEncoder().encode(`\uFEFF${table}`))).toBeNull();
    expect(unicodeEncoding(new Uint8Array(64))).toBeNull();
    expect(unicodeEncoding(bytes([0x41, 0]))).toBeNull();
  });
});

describe("reading such a file", () => {
  it("refuses a binary format before reading, even one that starts as plain ASCII (a PDF)", () => {
    const pdf = new TextEncoder().encode("%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\n");
    expect(readReturnsFromBytes(pdf, optionsFor())).toEqual({
      ok: false,
      issues: [{ code: "not-a-text-file", source: "returns.csv", kind: "pdf", size: pdf.length }],
    });
  });

  it("names UTF-32 as UTF-32, not UTF-16 (its mark starts as UTF-16LE's)", () => {
    expect(readReturnsFromBytes(utf32(`\uFEFF${table}`, true), optionsFor())).toEqual({
      ok: false,
      issues: [{ code: "unsupported-encoding", source: "returns.csv", encoding: "UTF-32LE", bom: true }],
    });
  });
});
