import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { decimalOfBytes } from "../../src/input/engines/byteNumbers.js";
import { plainLines } from "../../src/input/engines/plainLines.js";
import { decodeText } from "../../src/input/decodeText.js";
import { parseDecimal } from "../../src/input/values/numbers.js";
import { readBytesWith, readReturns, readReturnsFromBytes, type ReadOptions } from "../../src/input/readReturns.js";
import { dialect, generatedTable, mutated, writeLongTable, writeTable } from "./arbitraries.js";
import { expectSameRead, throughText } from "./helpers.js";

const utf8 = (text: string): Uint8Array => new TextEncoder().encode(text);
const ascii = (text: string): Uint8Array => Uint8Array.from(text, (c) => c.charCodeAt(0));

const expectSame = expectSameRead;

const options = (columns: readonly string[], extra: Partial<ReadOptions> = {}): ReadOptions => ({ source: "bytes.csv", columns, ...extra });

describe("the byte number parser", () => {
  const token = fc.oneof(
    fc.double({ noNaN: true }).map(String),
    fc.double({ min: -1, max: 1, noNaN: true }).map(String),
    fc.tuple(fc.double({ min: -100, max: 100, noNaN: true }), fc.integer({ min: 0, max: 30 })).map(([x, k]) => x.toFixed(k)),
    fc
      .tuple(
        fc.constantFrom("", "-", "+", " ", "\t", " -"),
        fc.stringMatching(/^[0-9]{0,26}$/),
        fc.constantFrom("", "."),
        fc.stringMatching(/^[0-9]{0,26}$/),
        fc.constantFrom("", " ", "\t", "e5", "E-3", "x", "  "),
      )
      .map((parts) => parts.join("")),
    fc.stringMatching(/^[0-9.eE+\- \tNA,;x]{0,12}$/),
    fc.constantFrom(
      "9007199254740993",
      "9007199254740992.5",
      "0.9007199254740993",
      "900719925474099.3",
      "1e999",
      "-0",
      "-0.0",
      ".5",
      "5.",
      ".",
    ),
  );

  it("gives exactly parseDecimal (NaN for null) on every ASCII token, and so Number on accepted ones", () => {
    fc.assert(
      fc.property(token, fc.constantFrom(",", ";", "\t"), (text, delimiter) => {
        const field = text.split(delimiter)[0] as string;
        const read = decimalOfBytes(ascii(field), delimiter);
        const expected = parseDecimal(field);
        expect(Object.is(read, expected ?? Number.NaN), JSON.stringify(field)).toBe(true);
        if (expected !== null) expect(Object.is(read, Number(field))).toBe(true);
      }),
      { numRuns: 20_000 },
    );
  });

  it("reads 16-digit mantissas below 2^53 on the fast path, exactly", () => {
    for (const text of ["9007199254740991", "0.9007199254740991", "-900719925474.0991", "1234567890123456", "0.000000000000000000001"]) {
      expect(Object.is(decimalOfBytes(ascii(text)), Number(text))).toBe(true);
    }
  });
});

describe("readReturnsFromBytes", () => {
  it("takes the byte engine only for plain ASCII without NUL, quotes or lone CR", () => {
    expect(plainLines(ascii("Date,A\n2020-01-31,1\n"))).toEqual({ start: 0, starts: Int32Array.of(0, 7, 20), firstBytes: ascii("D2") });
    expect(plainLines(utf8("\uFEFFDate,A\r\n\r\n2020-01-31,1"))).toEqual({
      start: 3,
      starts: Int32Array.of(3, 11, 13, 26),
      firstBytes: ascii("D\r2"),
    });
    expect(plainLines(utf8("Date,Zürich\n"))).toBeNull();
    expect(plainLines(ascii('Date,"A"\n'))).toBeNull();
    expect(plainLines(ascii("Date,A\r2020,1"))).toBeNull();
    expect(plainLines(ascii("Date,A\n\u0000"))).toBeNull();
    expect(plainLines(utf8("\uFEFF\uFEFFDate,A\n"))).toBeNull();
  });

  it("reads a file like readReturns on its text, with the date range without building dates", () => {
    const text = "Title\n\nDate;A;B\r\n2020-01-31;0.01;-0,5\r\n2020-02-29;0.02;NA\r\n2020-03-31;-0.03;1\r\n2020-04-30;0.04;2";
    const opts = options(["A", "B"], { decimalComma: true });
    const result = readReturnsFromBytes(ascii(text), opts);
    expectSame(result, readReturns(text, opts));
    if (!result.ok) expect.fail("expected success");
    expect(result.value.firstDate).toBe("2020-01-31");
    expect(result.value.lastDate).toBe("2020-04-30");
    expect(result.value.dates).toEqual(["2020-01-31", "2020-03-31", "2020-04-30"]);
    expect([...result.value.lines]).toEqual([4, 6, 7]);
  });

  it("returns the decoding issues of decodeText", () => {
    for (const bytes of [
      Uint8Array.of(0xff, 0xfe, 0x41, 0),
      ascii("Date,A\n\u0000"),
      Uint8Array.of(...ascii("Date,A\n2020-01-31,"), 0xe9, 10),
    ]) {
      const decoded = decodeText(bytes, "bytes.csv");
      expect(decoded.ok).toBe(false);
      expect(readReturnsFromBytes(bytes, options(["A"]))).toEqual(decoded);
    }
  });

  it.each([
    ["a final row without a line break", "Date,A\n2020-01-31,1\n2020-02-29,2\n2020-03-31,3"],
    ["a final row with a bad number and no line break", "Date,A\n2020-01-31,1\n2020-02-29,2\n2020-03-31,3x"],
    ["a final row with too many fields", "Date,A\n2020-01-31,1\n2020-02-29,2\n2020-03-31,3,4"],
    ["month dates", "Date,A\n2020-01,1\n2020-02,2\n2020-03,3\n"],
    ["a date with a time", "Date,A\n2020-01-31,1\n2020-02-29T10:00,2\n2020-03-31,3\n"],
    ["a padded date", "Date,A\n2020-01-31,1\n 2020-02-29,2\n2020-03-31,3\n"],
    ["an impossible date", "Date,A\n2020-01-31,1\n2021-02-29,2\n2020-03-31,3\n"],
    ["a date column that is not first", "A,Date\n1,2020-01-31\n2,2020-02-29\n3,2020-03-31\n"],
    ["unsorted dates", "Date,A\n2020-01-31,1\n2020-03-31,2\n2020-02-29,3\n2020-04-30,3\n"],
    ["duplicate dates", "Date,A\n2020-01-31,1\n2020-01-31,2\n2020-02-29,3\n2020-04-30,3\n"],
    ["blank separated tables", "Date,A\n2020-01-31,1\n2020-02-29,2\n2020-03-31,3\n\n , \nDate,B\n2020-01-31,1\n"],
    ["a row with a missing date field", "Date,A\n2020-01-31,1\n2\n2020-03-31,3\n"],
    ["spaces and tabs", "Date,A\n2020-01-31, 1 \n2020-02-29,\t2\n2020-03-31,+3.\n"],
    ["control characters", "Date,A\n2020-01-31,1\n\u000b\n2020-02-29,2\n2020-03-31,3\u000c\n"],
    ["a tab delimiter with empty fields", "Date\tA\tB\n2020-01-31\t1\t\n2020-02-29\t2\t\t\n2020-03-31\t3\t\n"],
    ["only white space", " \t\r\n\n"],
    ["an empty file", ""],
  ])("agrees with the text path on %s", (_, text) => {
    for (const extra of [{}, { sort: true }, { input: "prices" as const }, { dateFormat: "YYYY-MM-DD" }, { delimiter: "\t" }]) {
      for (const columns of [["A"], ["A", "B"]]) {
        const opts = options(columns, extra);
        expectSame(readReturnsFromBytes(ascii(text), opts), throughText(ascii(text), opts));
        expectSame(readBytesWith(ascii(text), opts, "speculative"), throughText(ascii(text), opts));
      }
    }
  });

  it("finds the same rows at every alignment", () => {
    const text = "Date,A\n2020-01-31,1\r\n\n2020-02-29,2\n2020-03-31,3\n2020-04-30,4";
    for (let shift = 0; shift < 8; shift++) {
      const bytes = new Uint8Array(text.length + shift).subarray(shift);
      bytes.set(ascii(text));
      expect(plainLines(bytes)?.starts).toEqual(Int32Array.of(0, 7, 21, 22, 35, 48, text.length + 1));
      expectSame(readReturnsFromBytes(bytes, options(["A"])), readReturns(text, options(["A"])));
    }
    expect(plainLines(ascii("Date,A\n2020-01-31,1\n2020-02-29,\u00ff\n"))).toBeNull();
  });

  it("goes back to the text when a byte far into the file is not plain", () => {
    const rows = Array.from(
      { length: 6000 },
      (_, i) => `${new Date(Date.UTC(2000, 0, 1) + i * 86_400_000).toISOString().slice(0, 10)},0.00${i % 97},-0.01${i % 13},note ${i}`,
    );
    const plain = `Date,A,B,Note\n${rows.join("\n")}\n`;
    const at = plain.indexOf("note 5000");
    const at2 = plain.indexOf("0.0044", at);
    const variants = [
      plain,
      `${plain.slice(0, at)}é${plain.slice(at)}`,
      `${plain.slice(0, at)}"x"${plain.slice(at)}`,
      `${plain.slice(0, at)}\u0000${plain.slice(at)}`,
      `${plain.slice(0, at)}\r${plain.slice(at)}`,
      `${plain.slice(0, at2)}\r${plain.slice(at2)}`,
      `${plain.slice(0, at2)}é${plain.slice(at2)}`,
      `${plain}\n\nDate,A\n2020-01-31,"1"\n`,
      `${plain.slice(0, at)}"${plain.slice(at)}`,
      `${plain}2020-01-31,1,2,x\r`,
      `${plain}2020-01-31,1,2\u0000`,
    ];
    expect(plain.length).toBeGreaterThan(1 << 17);
    for (const text of variants) {
      const bytes = text.includes("é") ? utf8(text) : ascii(text);
      for (const opts of [
        options(["A", "B"]),
        options(["A"], { idColumn: "Note", valueColumn: "B" }),
        options(["Nope"]),
        options(["A"], { block: 2 }),
      ]) {
        const expected = throughText(bytes, opts);
        expectSame(readReturnsFromBytes(bytes, opts), expected);
        expectSame(readBytesWith(bytes, opts, "speculative"), expected);
      }
    }
    const latin1 = ascii(`${plain.slice(0, at)}\u00e9${plain.slice(at)}`);
    expect(readReturnsFromBytes(latin1, options(["A"]))).toEqual(decodeText(latin1, "bytes.csv"));
  });

  it("gives the result of decodeText and readReturns, bit for bit, on generated and mutated files", () => {
    const files = fc
      .tuple(generatedTable, dialect)
      .map(([table, d]) => ({ text: writeTable(table, { ...d, quoteAll: false }), names: table.names }));
    const mutatedFiles = files.chain(({ text, names }) => mutated(fc.constant(text)).map((t) => ({ text: t, names })));
    const extra = fc.record(
      {
        sort: fc.boolean(),
        input: fc.constantFrom("returns", "prices", "log-returns"),
        onMissing: fc.constantFrom("drop", "error"),
        missing: fc.constantFrom([], ["-99"], ["x"]),
        allowExtreme: fc.boolean(),
        decimalComma: fc.boolean(),
      },
      { requiredKeys: [] },
    );
    fc.assert(
      fc.property(
        fc.oneof(
          files,
          mutatedFiles,
          mutatedFiles.map(({ text, names }) => ({ text: text.replaceAll('"', ""), names })),
        ),
        extra,
        ({ text, names }, e) => {
          const bytes = utf8(text);
          const opts = options(names, e as Partial<ReadOptions>);
          const fromBytes = readReturnsFromBytes(bytes, opts);
          expectSame(fromBytes, throughText(bytes, opts));
          expectSame(fromBytes, throughText(bytes, opts, "general"));
          expectSame(fromBytes, readBytesWith(bytes, opts, "text"));
          expectSame(readBytesWith(bytes, opts, "speculative"), fromBytes);
        },
      ),
      { numRuns: 600 },
    );
  });

  it("agrees with the text path on the long layout and on arbitrary bytes", () => {
    fc.assert(
      fc.property(generatedTable, fc.integer(), (table, seed) => {
        const bytes = utf8(writeLongTable(table, seed, ","));
        const opts = options(table.names, { idColumn: "Series", valueColumn: "Value", allowExtreme: true });
        expectSame(readReturnsFromBytes(bytes, opts), throughText(bytes, opts));
      }),
      { numRuns: 100 },
    );
    const alphabet = fc.constantFrom(...ascii('0123456789.-,;\t \n\r"Ae/:'), 0, 0xc3, 0xa9, 0xef, 0xbb, 0xbf);
    // At every alignment of the bytes in their buffer (the scanner reads 4-byte words).
    fc.assert(
      fc.property(
        fc.array(alphabet, { maxLength: 200 }),
        fc.integer({ min: 0, max: 3 }),
        fc.constantFrom(["A"], ["a", "b"]),
        (values, shift, columns) => {
          const bytes = new Uint8Array(values.length + shift).subarray(shift);
          bytes.set(values);
          const opts = options(columns);
          const expected = throughText(bytes, opts);
          expectSame(readReturnsFromBytes(bytes, opts), expected);
          expectSame(readBytesWith(bytes, opts, "speculative"), expected);
          expectSame(readBytesWith(bytes, { ...opts, delimiter: "::" }, "speculative"), throughText(bytes, { ...opts, delimiter: "::" }));
        },
      ),
      { numRuns: 1000 },
    );
  });
});
