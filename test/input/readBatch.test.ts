import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { groupSets, readColumnSetsFromBytes } from "../../src/input/readBatch.js";
import { type ReadOptions, readReturnsFromBytes } from "../../src/input/readReturns.js";
import { expectSameRead } from "./helpers.js";

const utf8 = (text: string): Uint8Array => new TextEncoder().encode(text);
const NAMES = ["A", "B", "C", "D", "E"];

/** What reading each set alone gives, against the tables of one batch read (asked for in `order`). */
function expectSameAsAlone(bytes: Uint8Array, options: Omit<ReadOptions, "columns">, sets: string[][], order: number[]): void {
  const tables = readColumnSetsFromBytes(bytes, options, sets);
  for (const i of order) expectSameRead(tables(i), readReturnsFromBytes(bytes, { ...options, columns: sets[i] as string[] }));
}

describe("reading several sets of columns of one file", () => {
  const text = [
    "Date,A,B,C,D",
    "2020-01-31,0.01,0.02,0.03,0.04",
    "2020-02-29,NA,0.021,0.031,0.041",
    "2020-03-31,0.012,0.022,0.032,0.042",
    "2020-04-30,0.013,,0.033,0.043",
    "2020-05-31,0.014,0.024,0.034,0.044",
    "2020-06-30,0.015,0.025,0.035,0.045",
    "",
  ].join("\n");
  const bytes = utf8(text);

  it("drops a row for a set only where one of its own columns is missing", () => {
    const tables = readColumnSetsFromBytes(bytes, { source: "f.csv" }, [
      ["A", "C"],
      ["B", "C"],
      ["C", "D"],
    ]);
    const dropped = [0, 1, 2].map((i) => {
      const table = tables(i);
      if (!table.ok) return expect.fail(JSON.stringify(table.issues));
      return table.value.dropped;
    });
    expect(dropped).toEqual([
      { count: 1, firstDates: ["2020-02-29"] },
      { count: 1, firstDates: ["2020-04-30"] },
      { count: 0, firstDates: [] },
    ]);
    expectSameAsAlone(
      bytes,
      { source: "f.csv" },
      [
        ["A", "C"],
        ["B", "C"],
        ["C", "D"],
      ],
      [0, 1, 2],
    );
  });

  it("reads the file once for sets it can share: a column no set drops a row of is one array for all", () => {
    const tables = readColumnSetsFromBytes(bytes, { source: "f.csv" }, [
      ["C", "D"],
      ["D", "C"],
    ]);
    const [first, second] = [tables(0), tables(1)];
    if (!first.ok || !second.ok) return expect.fail("expected two tables");
    expect(first.value.columns.get("C")).toBe(second.value.columns.get("C"));
    // Read alone, each set has arrays of its own.
    const alone = readReturnsFromBytes(bytes, { source: "f.csv", columns: ["C", "D"] });
    if (!alone.ok) return expect.fail("expected a table");
    expect(alone.value.columns.get("C")).not.toBe(first.value.columns.get("C"));
  });

  it("fails a set as reading it alone does, and reads the other sets from the rest", () => {
    const sets = [
      ["A", "Nope"],
      ["B", "C"],
      ["C", "C"],
      ["Date", "A"],
      ["C", "D"],
    ];
    const tables = readColumnSetsFromBytes(bytes, { source: "f.csv" }, sets);
    expect(sets.map((_, i) => tables(i).ok)).toEqual([false, true, false, false, true]);
    expectSameAsAlone(bytes, { source: "f.csv" }, sets, [0, 1, 2, 3, 4]);
  });

  it("reads a set alone when its names pick another date column or header row than the union's", () => {
    // Without --date, "Year" (numbers that read as years) is the date column unless it is asked for.
    const years = utf8(["A,Year,B,Date", ...[1, 2, 3, 4].map((i) => `0.0${i},${2000 + i},0.1${i},2020-0${i}-01`), ""].join("\n"));
    const options = { source: "y.csv", allowExtreme: true };
    const byYear = readColumnSetsFromBytes(years, options, [
      ["A", "Year"],
      ["A", "B"],
    ]);
    expect(
      [0, 1].map((i) => {
        const table = byYear(i);
        return table.ok ? table.value.dateColumn : null;
      }),
    ).toEqual(["Date", "Year"]);
    expectSameAsAlone(
      years,
      options,
      [
        ["A", "Year"],
        ["A", "B"],
      ],
      [0, 1],
    );
    // A title row naming A and B is the header for a set of A and B alone.
    const titled = utf8(["A,B", "Date,A,B,C", ...[1, 2, 3, 4].map((i) => `2020-0${i}-01,0.0${i},0.1${i},0.2${i}`), ""].join("\n"));
    const sets = [
      ["A", "C"],
      ["A", "B"],
    ];
    expect(readReturnsFromBytes(titled, { source: "t.csv", columns: ["A", "B"] }).ok).toBe(false);
    expectSameAsAlone(titled, { source: "t.csv" }, sets, [0, 1]);
  });

  it("groups consecutive sets within a number of columns, a larger set on its own", () => {
    const sets = [
      ["A", "B"],
      ["A", "C"],
      ["D", "E"],
      ["A", "B", "C", "D"],
      ["", "B"],
      ["E", "A"],
    ];
    const { of, unions } = groupSets(sets, { source: "f.csv" }, 3);
    expect([...of]).toEqual([0, 0, 1, 2, -1, 3]);
    expect(unions).toEqual([
      ["A", "B", "C"],
      ["D", "E"],
      ["A", "B", "C", "D"],
      ["E", "A"],
    ]);
  });
});

/** A small file: a date column and NAMES with holes, sentinels, stray text and large values here and there. */
const cell = fc.oneof(
  { weight: 40, arbitrary: fc.integer({ min: -900, max: 900 }).map((n) => String(n / 1000)) },
  { weight: 6, arbitrary: fc.constantFrom("NA", "", "-99") },
  { weight: 1, arbitrary: fc.constantFrom("abc", "25", "0") },
);
const file = fc
  .record({
    rows: fc.array(fc.array(cell, { minLength: NAMES.length, maxLength: NAMES.length }), { minLength: 2, maxLength: 14 }),
    title: fc.boolean(),
    unsorted: fc.constantFrom(false, false, false, true),
    yearColumn: fc.boolean(),
  })
  .map(({ rows, title, unsorted, yearColumn }) => {
    const dates = rows.map((_, i) => `2021-${String(1 + (i % 12)).padStart(2, "0")}-${String(1 + Math.floor(i / 12)).padStart(2, "0")}`);
    if (unsorted && dates.length > 3) [dates[1], dates[2]] = [dates[2] as string, dates[1] as string];
    // A numeric column named like a date: the date column chosen depends on the columns asked for.
    const header = yearColumn ? ["Year", ...NAMES.slice(1), "Date"] : ["Date", ...NAMES];
    const lines = rows.map((cells, i) => (yearColumn ? [String(2000 + i), ...cells.slice(1), dates[i]] : [dates[i], ...cells]).join(","));
    return `${title ? "Monthly returns\n" : ""}${header.join(",")}\n${lines.join("\n")}\n`;
  });
const columnName = fc.oneof({ weight: 30, arbitrary: fc.constantFrom(...NAMES) }, fc.constantFrom("Year", "Date", "Zed", " B", ""));
const columnSet = fc.array(columnName, { minLength: 1, maxLength: 3 });
const readOptions: fc.Arbitrary<Omit<ReadOptions, "columns">> = fc.record(
  {
    source: fc.constant("f.csv"),
    input: fc.constantFrom("returns", "prices", "log-returns"),
    units: fc.constantFrom("decimal", "percent"),
    onMissing: fc.constantFrom("drop", "drop", "drop", "error"),
    sort: fc.boolean(),
    allowExtreme: fc.boolean(),
    missing: fc.constant(["-99"]),
    dateColumn: fc.constantFrom("Date", "Date", "Year"),
    periodsPerYear: fc.constant(12),
  },
  { requiredKeys: ["source"] },
);

describe("every set's table is what reading it alone gives", () => {
  it("on generated files, options and sets, asked for in order and backwards", () => {
    fc.assert(
      fc.property(
        file,
        readOptions,
        fc.array(columnSet, { minLength: 2, maxLength: 8 }),
        fc.boolean(),
        (text, options, sets, backwards) => {
          const order = sets.map((_, i) => (backwards ? sets.length - 1 - i : i));
          expectSameAsAlone(utf8(text), options, sets, order);
        },
      ),
      { numRuns: 400, seed: 20261204 },
    );
  });
});
