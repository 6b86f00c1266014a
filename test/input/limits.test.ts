/**
 * The size limits of the input layer: the longest text is V8's longest string, and a text longer than
 * a limit is refused before it is decoded (tested with a small limit in place of the real 2^29 - 24).
 */
import { constants } from "node:buffer";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { decodeText, textLengthIssue, utf16Length } from "../../src/input/decodeText.js";
import { maximumInputBytes, maximumTextLength } from "../../src/input/limits.js";

const utf8 = (text: string): Uint8Array => new TextEncoder().encode(text);

describe("the limits", () => {
  it("takes the longest text from the engine's own figure (Node's buffer.constants.MAX_STRING_LENGTH)", () => {
    expect(maximumTextLength).toBe(constants.MAX_STRING_LENGTH);
    expect(maximumInputBytes).toBe(2 ** 31 - 1);
  });

  it("counts the UTF-16 length of UTF-8 bytes as the decoded string's length", () => {
    fc.assert(
      fc.property(fc.string({ unit: "grapheme" }), (text) => {
        const bytes = utf8(text);
        expect(utf16Length(bytes, 0, bytes.length)).toBe(text.length);
      }),
      { numRuns: 500, seed: 20240607 },
    );
  });
});

describe("a text longer than the limit", () => {
  const header = "Date,Zürich,Low\n";
  const body = "2020-01-31,0.01,0.02\n".repeat(4);

  it("is refused before decoding, with its size, length, limit and the line that made it text", () => {
    const bytes = utf8(`${header}${body}`);
    // "ü" is two bytes: the text is one character shorter than the bytes.
    const length = bytes.length - 1;
    expect(decodeText(bytes, "f.csv", length - 1)).toEqual({
      ok: false,
      issues: [{ code: "text-too-large", source: "f.csv", size: bytes.length, length, limit: length - 1, cause: "non-ascii", line: 1 }],
    });
    expect(decodeText(bytes, "f.csv", length).ok).toBe(true);
  });

  it("is measured in characters, not bytes: multi-byte characters may fit", () => {
    const bytes = utf8("Date,Ä\n".repeat(10));
    const length = "Date,Ä\n".length * 10;
    expect(bytes.length).toBeGreaterThan(length);
    expect(textLengthIssue(bytes, 0, "f.csv", length)).toBeNull();
    expect(textLengthIssue(bytes, 0, "f.csv", length - 1)).toMatchObject({ code: "text-too-large", length });
  });

  it("does not count a UTF-8 byte-order mark", () => {
    const bytes = utf8(`\uFEFF${body}`);
    expect(textLengthIssue(bytes, 3, "f.csv", body.length)).toBeNull();
  });

  it.each([
    ["a quoted field", `Date,Low\n${body}2020-05-31,"0.01"\n`, "quote", 6],
    ["a lone carriage return", `Date,Low\n${body}2020-05-31,0.01\r2020-06-30,0.01\n`, "carriage-return", 6],
  ])("names %s as what sent the file to the text path", (_, text, cause, line) => {
    const bytes = utf8(text);
    expect(textLengthIssue(bytes, 0, "f.csv", 10)).toMatchObject({ cause, line });
  });

  it("says it is the size when every byte is plain", () => {
    const bytes = utf8(`Date,Low\r\n${body}`);
    const issue = textLengthIssue(bytes, 0, "f.csv", 10);
    expect(issue).toMatchObject({ code: "text-too-large", cause: "size" });
    expect(issue).not.toHaveProperty("line");
  });
});
