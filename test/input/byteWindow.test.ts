/**
 * A file read by position through a small window (src/input/engines/byteWindow.ts) reads as its bytes
 * read whole: the same ReturnTable bit for bit, or the same issues. The windows here are tiny (64
 * bytes), so that rows cross their edges, some row is longer than the window, and CR LF pairs are
 * split between two pieces.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { ByteWindow, type PagedBytes, scanPages } from "../../src/input/engines/byteWindow.js";
import { plainLines } from "../../src/input/engines/plainLines.js";
import { readColumnSetsFromBytes } from "../../src/input/readBatch.js";
import { readReturnsFromBytes, type ReadOptions } from "../../src/input/readReturns.js";
import { expectSameRead } from "./helpers.js";

/** The bytes as a file read by position, recording the length of every read. */
function pagedOf(bytes: Uint8Array, window: number): PagedBytes & { readonly reads: number[] } {
  const reads: number[] = [];
  return {
    size: bytes.length,
    window,
    reads,
    read(position, target, offset, length) {
      const count = Math.max(0, Math.min(length, bytes.length - position));
      target.set(bytes.subarray(position, position + count), offset);
      reads.push(count);
      return count;
    },
  };
}

const encode = (text: string): Uint8Array => new TextEncoder().encode(text);

/** Rows of a daily file: a date, three numbers and a note of varying length; `long` rows get a note longer than any window here. */
function rows(count: number, long: readonly number[] = []): string[] {
  const out = ["Date,Low,High,Rf,Note"];
  for (let i = 0; i < count; i++) {
    const date = new Date(Date.UTC(2001, 0, 1) + i * 86_400_000).toISOString().slice(0, 10);
    const note = long.includes(i) ? "n".repeat(150 + i) : "x".repeat(i % 7);
    out.push(`${date},${((i * 37) % 23) / 1000 - 0.01},${((i * 53) % 29) / 700 - 0.02},0.0001,${note}`);
  }
  return out;
}

const options: ReadOptions = { source: "paged.csv", columns: ["Low", "High", "Rf"] };

/** Reads `text` both ways; the windowed read must never have read the whole file at once when `whole` is false. */
function expectSameThroughWindow(bytes: Uint8Array, window = 64, whole = false, read: ReadOptions = options): void {
  const paged = pagedOf(bytes, window);
  expectSameRead(readReturnsFromBytes(paged, read), readReturnsFromBytes(bytes, read));
  expect(paged.reads.some((length) => length === bytes.length)).toBe(whole);
}

describe("a file read through a window", () => {
  it("reads as its bytes: rows across the window's edges, rows longer than the window", () => {
    // 300 rows: more than KERNEL_MIN_ROWS, so the row kernel reads them where the window holds them.
    const bytes = encode(`${rows(3000, [5, 150, 2999]).join("\n")}\n`);
    // Larger than the first bytes read apart from the window (64 KiB), so that a read of the whole file shows.
    expect(bytes.length).toBeGreaterThan(1 << 17);
    expectSameThroughWindow(bytes);
    expectSameThroughWindow(bytes, 4096);
    // Rows reached away from the window read a little around them (64 KiB), reading on fills the window.
    expectSameThroughWindow(bytes, 100_000);
  });

  it("reads as its bytes when rows are asked for backwards: dates in descending order, values quoted in issues", () => {
    const lines = rows(3000);
    const descending = [lines[0] ?? "", ...lines.slice(1).reverse()];
    const sorted = { ...options, sort: true };
    expectSameThroughWindow(encode(`${descending.join("\n")}\n`), 100_000, false, sorted);
    // Every 50th row's Low an extreme value: the issues quote each, in date order (backwards through the file).
    const extreme = descending.map((line, i) => (i > 0 && i % 50 === 0 ? line.replace(/^([^,]*),[^,]*,/, "$1,250,") : line));
    const read = readReturnsFromBytes(encode(`${extreme.join("\n")}\n`), sorted);
    expect(read.ok ? [] : read.issues.map((issue) => issue.code)).toContain("extreme-value");
    expectSameThroughWindow(encode(`${extreme.join("\n")}\n`), 100_000, false, sorted);
    expectSameThroughWindow(encode(`${extreme.join("\n")}\n`), 64, false, sorted);
  });

  it("reads as its bytes: CR LF line ends, a pair split between two pieces", () => {
    const bytes = encode(`${rows(2000).join("\r\n")}\r\n`);
    // The file's own bytes say a piece of 64 ends with the CR of a pair (else this case tests nothing).
    const split = Array.from({ length: Math.floor(bytes.length / 64) }, (_, k) => 64 * (k + 1) - 1).filter((at) => bytes[at] === 13);
    expect(split.length).toBeGreaterThan(0);
    expectSameThroughWindow(bytes);
  });

  it("reads as its bytes: a last row without a line feed, and a byte-order mark", () => {
    expectSameThroughWindow(encode(rows(2000).join("\n")));
    expectSameThroughWindow(encode(`\uFEFF${rows(2000).join("\n")}\n`));
    expectSameThroughWindow(encode(`\uFEFF${rows(2000, [1999]).join("\r\n")}`));
  });

  it("reads the whole file when a quote (or another byte the text must decide) comes late, with the same result", () => {
    const lines = rows(2000);
    lines[1990] = `${lines[1990]}"quoted"`;
    expectSameThroughWindow(encode(`${lines.join("\n")}\n`), 64, true);
    const accented = rows(2000);
    accented[1700] = `${accented[1700]}é`;
    expectSameThroughWindow(encode(`${accented.join("\n")}\n`), 64, true);
    const loneCr = rows(2000);
    loneCr[1600] = `${loneCr[1600]}\rmore`;
    expectSameThroughWindow(encode(`${loneCr.join("\n")}\n`), 64, true);
  });

  it("gives the same issues: a bad value in the middle, a missing column, a blank file, a binary signature", () => {
    const lines = rows(2000);
    lines[1001] = lines[1001]?.replace(",0.0001,", ",0.0x01,") ?? "";
    const bad = readReturnsFromBytes(pagedOf(encode(`${lines.join("\n")}\n`), 64), options);
    expect(bad.ok).toBe(false);
    expectSameThroughWindow(encode(`${lines.join("\n")}\n`));
    expectSameThroughWindow(encode(`${rows(2000).join("\n")}\n`), 64, false, { ...options, columns: ["Low", "Hihg"] });
    expectSameThroughWindow(encode(" \n\t\n".repeat(50_000)));
    expectSameThroughWindow(encode(`PAR1,${rows(2000).join("\n")}\n`), 64, true);
  });

  it("reads several sets of columns as the bytes do", () => {
    const bytes = encode(`${rows(150, [70]).join("\n")}\n`);
    const sets = [["Low", "High"], ["High", "Rf"], ["Low"]];
    const read = { source: "paged.csv" };
    const paged = readColumnSetsFromBytes(pagedOf(bytes, 64), read, sets);
    const whole = readColumnSetsFromBytes(bytes, read, sets);
    for (const index of [0, 1, 2]) expectSameRead(paged(index), whole(index));
  });

  it("reads any plain file as its bytes, through any window", () => {
    const cell = fc.oneof(fc.constantFrom("", "NA", " ", "1e3", "-0", "x"), fc.double({ noNaN: true }).map(String));
    const row = fc.tuple(fc.integer({ min: 0, max: 3000 }), cell, cell);
    fc.assert(
      fc.property(
        fc.array(row, { minLength: 3, maxLength: 120 }),
        fc.constantFrom("\n", "\r\n"),
        fc.boolean(),
        fc.integer({ min: 16, max: 200 }),
        (cells, lineEnd, finalBreak, window) => {
          const lines = [
            "Date,Low,High",
            ...cells.map(([day, a, b]) => `${new Date(Date.UTC(2000, 0, 1) + day * 86_400_000).toISOString().slice(0, 10)},${a},${b}`),
          ];
          const bytes = encode(`${lines.join(lineEnd)}${finalBreak ? lineEnd : ""}`);
          const read = { source: "paged.csv", columns: ["Low", "High"] };
          expectSameRead(readReturnsFromBytes(pagedOf(bytes, window), read), readReturnsFromBytes(bytes, read));
        },
      ),
      { seed: 20261204, numRuns: 200 },
    );
  });

  it("finds the rows and their first bytes as plainLines does on the whole bytes, through any window", () => {
    // Blank rows, rows of white space and delimiters, a line feed on a window's last byte: every first byte counts.
    const piece = fc.constantFrom("\n", "\r\n", " ", "\t", ",", "2020-01-31", "0.5", "x", "\n\n");
    fc.assert(
      fc.property(fc.array(piece, { minLength: 1, maxLength: 400 }), fc.integer({ min: 16, max: 300 }), (pieces, window) => {
        const bytes = encode(pieces.join(""));
        const scanned = scanPages(new ByteWindow(pagedOf(bytes, window)));
        const whole = plainLines(bytes, Number.POSITIVE_INFINITY);
        expect(scanned?.lines.starts).toEqual(whole?.starts);
        expect(scanned?.lines.firstBytes).toEqual(whole?.firstBytes);
      }),
      { seed: 20261205, numRuns: 400 },
    );
  });
});
