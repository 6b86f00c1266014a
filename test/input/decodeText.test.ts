import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { decodeText, firstInvalidUtf8, notTextIssue } from "../../src/input/decodeText.js";

const bytes = (...values: number[]): Uint8Array => Uint8Array.from(values);
const utf8 = (text: string): Uint8Array => new TextEncoder().encode(text);

describe("decodeText", () => {
  it("decodes UTF-8 and removes a byte-order mark", () => {
    expect(decodeText(utf8("\uFEFFDate,Zürich\n"), "f.csv")).toEqual({ ok: true, value: "Date,Zürich\n" });
  });

  it("refuses a NUL byte as binary content, with its offset and line", () => {
    expect(decodeText(utf8("a,b\nc\u0000d"), "f.csv")).toEqual({
      ok: false,
      issues: [{ code: "binary-content", source: "f.csv", line: 2, offset: 5 }],
    });
  });

  it("refuses UTF-16 files by their byte-order mark", () => {
    expect(decodeText(bytes(0xff, 0xfe, 0x41, 0), "f.csv")).toEqual({
      ok: false,
      issues: [{ code: "unsupported-encoding", source: "f.csv", encoding: "UTF-16LE", bom: true }],
    });
    expect(decodeText(bytes(0xfe, 0xff, 0, 0x41), "f.csv")).toEqual({
      ok: false,
      issues: [{ code: "unsupported-encoding", source: "f.csv", encoding: "UTF-16BE", bom: true }],
    });
  });

  it("reports the first invalid UTF-8 byte with its offset, line and value (a Latin-1 file)", () => {
    const latin1 = bytes(...utf8("Date,Fund\n2020-01-31,"), 0xe9, 0x0a);
    expect(decodeText(latin1, "f.csv")).toEqual({
      ok: false,
      issues: [{ code: "invalid-encoding", source: "f.csv", line: 2, offset: 21, byte: 0xe9 }],
    });
  });

  it.each([
    [[0xc0, 0x80], 0],
    [[0x41, 0xed, 0xa0, 0x80], 1],
    [[0xf4, 0x90, 0x80, 0x80], 0],
    [[0xe2, 0x82], 0],
    [[0x41, 0x80], 1],
  ])("finds the malformed sequence in %j at %i", (values, offset) => {
    expect(firstInvalidUtf8(bytes(...values))).toBe(offset);
  });

  it("agrees with the fatal TextDecoder on arbitrary bytes", () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 64 }), (input) => {
        const result = decodeText(input, "f.csv");
        let valid = true;
        try {
          new TextDecoder("utf-8", { fatal: true }).decode(input);
        } catch {
          valid = false;
        }
        if (input.includes(0) || notTextIssue(input, "f.csv") !== null) expect(result.ok).toBe(false);
        else expect(result.ok).toBe(valid);
        if (!valid) expect(firstInvalidUtf8(input)).toBeLessThan(input.length);
        else expect(firstInvalidUtf8(input)).toBe(input.length);
      }),
      { numRuns: 1000 },
    );
  });
});
