/**
 * The row kernel (src/input/engines/rowKernel.wat, driven by rowKernel.ts and byteGrid.ts): it must give what
 * the JavaScript engines give, bit for bit, on every file; it must read the simple rows itself; and
 * the committed binary must be the assembly of the committed text.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { plainLines } from "../../src/input/engines/plainLines.js";
import { readReturnsFromBytes, type ReadOptions } from "../../src/input/readReturns.js";
import { kernelBytes, rowKernelFor } from "../../src/input/engines/rowKernel.js";
import { expectSameRead, throughText } from "./helpers.js";

const ascii = (text: string): Uint8Array => Uint8Array.from(text, (c) => c.charCodeAt(0));
const inKernel = (bytes: Uint8Array): Uint8Array => {
  const copy = kernelBytes(bytes.length);
  copy.set(bytes);
  return copy;
};

const expectSame = expectSameRead;

describe("the row kernel", () => {
  it("reads simple rows itself: numbers, date keys and field counts, nothing flagged", () => {
    const rows = ["Date,A,B,Note", "2024-02-28,0.5,-12.25,x", "2024-02-29,-0,7,y", "2024-03-01,+.5,5.,z", ""];
    const bytes = ascii(rows.join("\n"));
    const lines = plainLines(bytes);
    if (lines === null) throw new Error("plain");
    const found = rowKernelFor(bytes);
    if (found === null) throw new Error("the kernel is available on Node 20");
    const read = found.kernel.scan(found.base, lines.starts, 1, 4, Int32Array.of(-1, 0, 1, -1), 2, ",".charCodeAt(0), 0);
    expect(read.flagged).toBe(0);
    expect([...read.values(0)]).toEqual([0.5, -0, 0.5]);
    expect(Object.is(read.values(0)[1], -0)).toBe(true);
    expect([...read.values(1)]).toEqual([-12.25, 7, 5]);
    expect([...read.counts]).toEqual([4, 4, 4]);
    // Date.UTC is the independent reference for the day count
    expect([...read.keys]).toEqual([Date.UTC(2024, 1, 28), Date.UTC(2024, 1, 29), Date.UTC(2024, 2, 1)]);
  });

  it("flags what it does not read, and says when a well-formed date is not in the calendar", () => {
    const rows = [
      "Date,A,B",
      "2023-02-29,1,2",
      "2023-03-01,1.5e3,2",
      "2023-03-02, 1,2",
      "2023-03-03,1",
      "2023-03-04,NA,2",
      "2023-03-05,0.12345678901234567,2",
      "",
    ];
    const bytes = ascii(rows.join("\n"));
    const lines = plainLines(bytes);
    const found = rowKernelFor(bytes);
    if (lines === null || found === null) throw new Error("setup");
    const read = found.kernel.scan(found.base, lines.starts, 1, 7, Int32Array.of(-1, 0, 1), 2, ",".charCodeAt(0), 0);
    expect([...read.flags]).toEqual([0, 1, 1, 1, 1, 2]);
    expect(read.badDate).toBe(true);
    expect(Number.isNaN(read.values(0)[5])).toBe(true);
  });

  it("reads numbers of every length as Number reads them: the digits as a 64-bit integer, long ones left to the caller", () => {
    // Integer and fraction parts of 0 to 24 digits, leading zeros included: around 2^53, 19 digits
    // (the most a 64-bit integer holds) and 22 fraction digits, where the kernel's fast path ends.
    const digits = (most: number) => fc.stringMatching(new RegExp(`^[0-9]{0,${most}}$`));
    const zeros = fc.nat(22).map((n) => "0".repeat(n));
    const fraction = fc.option(
      fc.tuple(zeros, digits(24)).map(([z, d]) => `${z}${d}`),
      { nil: undefined },
    );
    const drawn = fc
      .tuple(fc.constantFrom("", "-", "+"), digits(24), fraction)
      .filter(([, whole, fraction]) => whole.length + (fraction?.length ?? 0) > 0)
      .map(([sign, whole, fraction]) => `${sign}${whole}${fraction === undefined ? "" : `.${fraction}`}`);
    // 2^64 + 1 and 2^65 + 1: digits whose 64-bit integer wraps round to 1
    const wrapping = fc.constantFrom("18446744073709551617", "0.18446744073709551617", "-3689348814741910323.3");
    const number = fc.oneof({ arbitrary: drawn, weight: 9 }, { arbitrary: wrapping, weight: 1 });
    fc.assert(
      // 64 rows and more: the byte engine reads a file through the kernel from 64 rows on (the whole
      // read below then settles the long numbers as the kernel leaves them).
      fc.property(fc.array(number, { minLength: 64, maxLength: 100 }), (numbers) => {
        const rows = [
          "Date,A",
          ...numbers.map((text, r) => `${new Date(Date.UTC(2001, 0, 1 + r)).toISOString().slice(0, 10)},${text}`),
          "",
        ];
        const bytes = ascii(rows.join("\n"));
        const lines = plainLines(bytes);
        const found = rowKernelFor(bytes);
        if (lines === null || found === null) throw new Error("setup");
        const read = found.kernel.scan(found.base, lines.starts, 1, numbers.length + 1, Int32Array.of(-1, 0), 1, ",".charCodeAt(0), 0);
        numbers.forEach((text, k) => {
          const [whole = "", fraction = ""] = text.replace(/^[+-]/, "").split(".");
          const count = whole.length + fraction.length;
          const mantissa = BigInt(`${whole}${fraction}` || "0");
          const flag = read.flags[k];
          if (count > 19 || mantissa >= 2n ** 53n || fraction.length > 22) {
            expect(flag).toBe(2); // left to the caller, which parses the span
            expect(Number.isNaN(read.values(0)[k])).toBe(true);
          } else {
            expect(flag).toBe(0);
            // Number (ECMAScript's correctly rounded reading) is the reference
            expect(Object.is(read.values(0)[k], Number(text))).toBe(true);
          }
        });
        // and the whole read, long numbers settled by the caller, is the text engine's bit for bit
        const options: ReadOptions = { source: "numbers.csv", columns: ["A"], dateColumn: "Date" };
        expectSame(readReturnsFromBytes(inKernel(bytes), options), throughText(bytes, options));
      }),
      { seed: 20261204, numRuns: 120 },
    );
  });

  it("works out each day once for intraday stamps, a day not in the calendar included", () => {
    const days = ["2024-02-28", "2024-02-29", "2023-02-29", "2023-02-29", "2023-03-01", "2023-13-01", "2023-03-02"];
    const rows = ["Date,A", ...days.flatMap((day) => ["09:30", "09:31", "16:00"].map((time) => `${day} ${time},0.5`)), ""];
    const bytes = ascii(rows.join("\n"));
    const lines = plainLines(bytes);
    const found = rowKernelFor(bytes);
    if (lines === null || found === null) throw new Error("setup");
    const read = found.kernel.scan(found.base, lines.starts, 1, rows.length - 1, Int32Array.of(-1, 0), 1, ",".charCodeAt(0), 0);
    expect(read.flagged).toBe(0);
    expect(read.badDate).toBe(true);
    // Date.UTC is the independent reference; a day not in the calendar has key 0 on each of its rows
    const expected = days.flatMap((day) => {
      const [y, m, d] = day.split("-").map(Number) as [number, number, number];
      const real = m <= 12 && d <= new Date(Date.UTC(y, m, 0)).getUTCDate();
      return [
        [9, 30],
        [9, 31],
        [16, 0],
      ].map(([h, min]) => (real ? Date.UTC(y, m - 1, d, h, min) : 0));
    });
    expect([...read.keys]).toEqual(expected);

    // A day is kept only once its digits are read: a stamp that is no date, twice, is flagged twice;
    // a good day's row flagged for its time leaves the day as it was.
    const odd = ["2023-0a-01 09:30", "2023-0a-01 09:31", "2023-03-05 09:30", "2023-03-05 9:30", "2023-03-05 09:32"];
    const oddBytes = ascii(["Date,A", ...odd.map((stamp) => `${stamp},0.5`), ""].join("\n"));
    const oddLines = plainLines(oddBytes);
    const oddFound = rowKernelFor(oddBytes);
    if (oddLines === null || oddFound === null) throw new Error("setup");
    const oddRead = oddFound.kernel.scan(oddFound.base, oddLines.starts, 1, odd.length + 1, Int32Array.of(-1, 0), 1, ",".charCodeAt(0), 0);
    expect([...oddRead.flags]).toEqual([1, 1, 0, 1, 0]);
    expect(oddRead.keys[2]).toBe(Date.UTC(2023, 2, 5, 9, 30));
    expect(oddRead.keys[4]).toBe(Date.UTC(2023, 2, 5, 9, 32));
  });

  it("finds the same rows as the byte-by-byte search, 16 bytes at a time", () => {
    const line = fc.stringMatching(/^[a-z0-9,.-]{0,40}$/);
    fc.assert(
      fc.property(fc.array(line, { maxLength: 80 }), fc.boolean(), fc.boolean(), (lines, bom, finalBreak) => {
        const text = `${bom ? "\uFEFF" : ""}${lines.join("\n")}${finalBreak ? "\n" : ""}`;
        const bytes = new TextEncoder().encode(text);
        const expected = plainLines(bytes, Infinity);
        const actual = plainLines(inKernel(bytes), Infinity);
        expect(actual).toEqual(expected);
      }),
      { seed: 20261206, numRuns: 500 },
    );
  });

  it("says whether a range holds a byte that is not plain (NUL, CR, quote, non-ASCII) as it finds the line feeds", () => {
    const odd = (b: number): boolean => b === 0 || b === 13 || b === 34 || b >= 0x80;
    // Mostly plain bytes, so that ranges with no odd byte are common; odd ones anywhere in the range,
    // in the 16-byte blocks or the tail after them.
    const oddBytes = [0, 13, 34, 0x80, 0xff];
    const byte = fc.oneof(
      { arbitrary: fc.integer({ min: 32, max: 126 }), weight: 30 },
      { arbitrary: fc.constantFrom(...oddBytes), weight: 1 },
      { arbitrary: fc.nat(255), weight: 1 },
    );
    // Each odd byte alone at the edges of the 16-byte blocks and in the tail after them.
    for (const oddByte of oddBytes)
      for (const at of [0, 15, 16, 31, 47]) {
        const bytes = new Uint8Array(48).fill(97);
        bytes[at] = oddByte;
        const found = rowKernelFor(bytes);
        if (found === null) throw new Error("the kernel is available on Node 20");
        expect(found.kernel.appendLineEnds(found.base, 0, 48, { ends: new Int32Array(4), count: 0 }).plain).toBe(false);
        bytes[at] = 97;
        const plain = rowKernelFor(bytes); // a copy of the bytes as they are now
        if (plain === null) throw new Error("the kernel is available on Node 20");
        expect(plain.kernel.appendLineEnds(plain.base, 0, 48, { ends: new Int32Array(4), count: 0 }).plain).toBe(true);
      }
    fc.assert(
      fc.property(fc.array(byte, { maxLength: 120 }), fc.nat(40), (values, cut) => {
        const bytes = Uint8Array.from(values);
        const found = rowKernelFor(bytes);
        if (found === null) throw new Error("the kernel is available on Node 20");
        const from = Math.min(cut, bytes.length);
        const read = found.kernel.appendLineEnds(found.base, from, bytes.length, { ends: new Int32Array(4), count: 0 });
        expect(read.plain).toBe(!bytes.subarray(from).some(odd));
        expect([...read.ends.subarray(0, read.count)]).toEqual(values.flatMap((b, i) => (b === 10 && i >= from ? [i + 1] : [])));
      }),
      { seed: 20261204, numRuns: 400 },
    );
  });

  it("finds the rows of a file of 4 KiB and more (copied into the shared kernel) as a search written out here does", () => {
    const line = fc.stringMatching(/^[a-z0-9,.-]{0,60}$/).map((cells) => `${cells},2020-01-31,0.0123`);
    fc.assert(
      fc.property(fc.array(line, { minLength: 150, maxLength: 400 }), fc.boolean(), (lines, finalBreak) => {
        const text = `${lines.join("\n")}${finalBreak ? "\n" : ""}`;
        const bytes = new TextEncoder().encode(text);
        fc.pre(bytes.length >= 4096);
        // Every line feed ends a row; bytes after the last one are a row that ends one past the end.
        const expectedStarts: number[] = [];
        let from = 0;
        for (let i = 0; i < bytes.length; i++) {
          if (bytes[i] !== 10) continue;
          expectedStarts.push(from);
          from = i + 1;
        }
        if (from < bytes.length) {
          expectedStarts.push(from);
          from = bytes.length + 1;
        }
        expectedStarts.push(from);
        const found = plainLines(bytes, Infinity);
        expect(found?.starts).toEqual(Int32Array.from(expectedStarts));
        expect(found?.firstBytes).toEqual(Uint8Array.from(expectedStarts.slice(0, -1), (at) => bytes[at]!));
      }),
      { seed: 20261204, numRuns: 60 },
    );
  });

  // Rows around the kernel's edges: long and odd numbers, odd dates, odd rows, odd bytes.
  const oddCell = fc.constantFrom(
    "0.12345678901234567",
    "-12345678901234567890",
    "9007199254740993",
    "0.00000000000000000000001",
    "1e5",
    " 1",
    "1 ",
    "",
    "NA",
    "+",
    "-",
    ".",
    "1.",
    ".5",
    "-0",
    "0x10",
    "1,5",
    '1"',
    "\u0000",
    "\r",
    "é",
    "1\t",
  );
  const oddDate = fc.constantFrom(
    "2023-02-29",
    "2023-13-01",
    "2023-00-10",
    "0000-01-01",
    "2023-1-01",
    "2023/01/01",
    "20230101",
    "2023-01-01T00:00",
    "",
  );
  const oddRow = fc.oneof(
    fc.record({ kind: fc.constant("cell" as const), column: fc.nat(2), text: oddCell }),
    fc.record({ kind: fc.constant("date" as const), text: oddDate }),
    fc.record({ kind: fc.constantFrom("short" as const, "long" as const, "crlf" as const, "blank" as const) }),
  );
  const tall = fc.record({
    rows: fc.integer({ min: 64, max: 400 }),
    digits: fc.integer({ min: 1, max: 19 }),
    edits: fc.array(fc.tuple(fc.nat(), oddRow), { maxLength: 6 }),
    seed: fc.integer({ min: 1, max: 1_000_000 }),
    delimiter: fc.constantFrom(",", ";", "\t"),
    dateAt: fc.integer({ min: 0, max: 3 }),
  });

  type Tall = typeof tall extends fc.Arbitrary<infer T> ? T : never;
  function tallFile({ rows, digits, edits, seed, delimiter, dateAt }: Tall): string {
    let state = seed;
    const next = (): number => (state = (state * 16807) % 2147483647) / 2147483647;
    const lines = Array.from({ length: rows }, (_, r) => {
      const date = new Date(Date.UTC(2001, 0, 1) + r * 86_400_000).toISOString().slice(0, 10);
      const cells = [0, 1, 2].map(() => ((next() - 0.5) / 10).toFixed(digits));
      return [date, ...cells];
    });
    for (const [at, edit] of edits) {
      const line = lines[at % rows] as string[];
      if (edit.kind === "cell") line[1 + edit.column] = edit.text;
      else if (edit.kind === "date") line[0] = edit.text;
      else if (edit.kind === "short") line.pop();
      else if (edit.kind === "long") line.push("1");
      else if (edit.kind === "blank") line.splice(0, line.length);
      else line.push("\r");
    }
    // The date field moved to position dateAt (the header too).
    const moved = (cells: string[]): string[] =>
      cells.length === 0 ? cells : [...cells.slice(1, dateAt + 1), cells[0] as string, ...cells.slice(dateAt + 1)];
    const body = lines.map((cells) => moved(cells).join(delimiter).replace(`${delimiter}\r`, "\r"));
    return `${moved(["Date", "A", "B", "C"]).join(delimiter)}\n${body.join("\n")}\n`;
  }

  it("generates tall files that mostly read (so the comparison below is not between two failures)", () => {
    const specs = fc.sample(tall, { seed: 20261207, numRuns: 60 });
    const read = specs.filter((spec) => {
      const options: ReadOptions = {
        source: "tall.csv",
        columns: ["A", "B"],
        dateColumn: "Date",
        ...(spec.delimiter === "," ? {} : { delimiter: spec.delimiter }),
      };
      return readReturnsFromBytes(new TextEncoder().encode(tallFile(spec)), options).ok;
    });
    // A third read (20 of 60 with this seed); the others fail with the issues an odd row raises,
    // which the comparison checks too.
    expect(read.length).toBeGreaterThanOrEqual(10);
  });

  it("gives the text engine's result bit for bit on tall generated files, read in place or copied", () => {
    fc.assert(
      fc.property(tall, fc.constantFrom(["A", "B"], ["A", "B", "C"], ["C"]), (spec, columns) => {
        const text = tallFile(spec);
        const bytes = new TextEncoder().encode(text);
        const options: ReadOptions = {
          source: "tall.csv",
          columns,
          dateColumn: "Date",
          ...(spec.delimiter === "," ? {} : { delimiter: spec.delimiter }),
        };
        const expected = throughText(bytes, options);
        expectSame(readReturnsFromBytes(bytes, options), expected);
        expectSame(readReturnsFromBytes(inKernel(bytes), options), expected);
      }),
      { seed: 20261205, numRuns: 300 },
    );
  });
});
