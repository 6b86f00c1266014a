/**
 * The byte grid's field counts (src/input/engines/byteGrid.ts), which the layout checks read for up to
 * 1,000 rows of every file: each row's count must be the number of its fields split at the delimiter
 * (String.prototype.split, outside the grid's own search), 0 for a blank row.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { byteGrid } from "../../src/input/engines/byteGrid.js";
import { memoryFile } from "../../src/input/engines/plainFile.js";
import { plainLines } from "../../src/input/engines/plainLines.js";

const ascii = (text: string): Uint8Array => Uint8Array.from(text, (c) => c.charCodeAt(0));

function gridOf(text: string, delimiter: string) {
  const bytes = ascii(text);
  const lines = plainLines(bytes);
  if (lines === null) throw new Error("a plain text");
  return byteGrid(memoryFile(bytes, lines).bytes, lines, delimiter);
}

/** The rows of `text` as the grid sees them (line feeds end rows; a CR before one is not part of it). */
const rowsOf = (text: string): string[] => text.split("\n").map((row) => row.replace(/\r$/, ""));

/** A row of only delimiters, spaces and tabs is blank: no fields. */
const expectedCount = (row: string, delimiter: string): number =>
  [...row].every((c) => c === delimiter || c === " " || c === "\t") ? 0 : row.split(delimiter).length;

describe("the byte grid's field counts", () => {
  it("count empty fields, leading and trailing delimiters, CR LF rows and blank rows", () => {
    const text = "a,b,c\n,,\n,x,\r\n1,,2,,3\n \t, \nlast,";
    const grid = gridOf(text, ",");
    const rows = rowsOf(text);
    expect(grid.rowCount).toBe(rows.length);
    expect(rows.map((_, row) => grid.fieldCount(row))).toEqual([3, 0, 3, 5, 0, 2]);
  });

  it("equal the fields split at the delimiter on generated texts", () => {
    const piece = fc.constantFrom(",", ";", "\t", " ", "a", "1", ".", "-", "\n", "\r\n", ",,", ";;");
    fc.assert(
      fc.property(fc.array(piece, { minLength: 1, maxLength: 300 }), fc.constantFrom(",", ";", "\t"), (pieces, delimiter) => {
        const text = pieces.join("");
        const grid = gridOf(text, delimiter);
        const rows = rowsOf(text);
        for (let row = 0; row < grid.rowCount; row++) expect(grid.fieldCount(row)).toBe(expectedCount(rows[row] ?? "", delimiter));
      }),
      { seed: 20261205, numRuns: 2000 },
    );
  });
});

describe("the byte grid's search for rows that may be blank", () => {
  it("passes over no blank row, and stops at every row whose first byte is not printable or is the delimiter", () => {
    const piece = fc.constantFrom(",", ";", "\t", " ", "a", "1", "\n", "\r\n", "\u00a0", "\u0001", "\u007f");
    fc.assert(
      fc.property(
        fc.array(piece, { minLength: 1, maxLength: 200 }),
        fc.constantFrom(",", ";", "\t"),
        fc.nat(),
        (pieces, delimiter, seed) => {
          // Latin-1 bytes: a byte above 127 is not plain, so plainLines may refuse; those texts are skipped.
          const text = pieces.join("");
          const bytes = ascii(text);
          const lines = plainLines(bytes, 0);
          if (lines === null) return;
          const grid = byteGrid(memoryFile(bytes, lines).bytes, lines, delimiter);
          const from = grid.rowCount === 0 ? 0 : seed % grid.rowCount;
          const next = grid.nextMaybeBlank?.(from) ?? -1;
          expect(next).toBeGreaterThanOrEqual(from);
          expect(next).toBeLessThanOrEqual(grid.rowCount);
          for (let row = from; row < next; row++) expect(grid.isBlank(row)).toBe(false);
          if (next < grid.rowCount) {
            const first = bytes[lines.starts[next] ?? 0] ?? 0;
            expect(first <= 32 || first >= 128 || first === delimiter.charCodeAt(0)).toBe(true);
          }
        },
      ),
      { seed: 20261205, numRuns: 2000 },
    );
  });
});
