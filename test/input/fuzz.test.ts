import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { readReturns, readReturnsWith, type ReadOptions } from "../../src/input/readReturns.js";
import { dialect, generatedTable, mutated, writeLongTable, writeTable } from "./arbitraries.js";
import { expectSameRead } from "./helpers.js";

const options = (columns: readonly string[], extra: Partial<ReadOptions> = {}): ReadOptions => ({ source: "fuzz.csv", columns, ...extra });

function neverThrows(text: string, opts: ReadOptions): void {
  const result = readReturns(text, opts);
  if (!result.ok) {
    expect(result.issues.length).toBeGreaterThan(0);
    expect(result.issues.map((i) => i.code)).not.toContain("internal-error");
  }
}

describe("readReturns never throws", () => {
  it("on arbitrary strings", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary", maxLength: 300 }), (text) => neverThrows(text, options(["a", "b"]))),
      { numRuns: 500 },
    );
  });

  it("on arbitrary strings with every option combination", () => {
    const extra = fc.record(
      {
        sort: fc.boolean(),
        units: fc.constantFrom("decimal", "percent"),
        input: fc.constantFrom("returns", "prices", "log-returns"),
        onMissing: fc.constantFrom("drop", "error"),
        missing: fc.constantFrom([], ["-99"], ["x"]),
        delimiter: fc.constantFrom(",", ";", "\t", "|"),
        block: fc.integer({ min: 1, max: 3 }),
        dateFormat: fc.constantFrom("DD/MM/YYYY", "D MMM YYYY", "YYYY"),
        decimalComma: fc.boolean(),
        allowExtreme: fc.boolean(),
        periodsPerYear: fc.constantFrom(12, 252),
        dateColumn: fc.constantFrom("a", "Date"),
        idColumn: fc.constantFrom("a", "b"),
        valueColumn: fc.constantFrom("a", "b"),
      },
      { requiredKeys: [] },
    );
    fc.assert(
      fc.property(fc.string({ maxLength: 200 }), extra, (text, e) => neverThrows(text, options(["a"], e as Partial<ReadOptions>))),
      { numRuns: 300 },
    );
  });

  it("on mutated valid files", () => {
    const file = fc.tuple(generatedTable, dialect).map(([table, d]) => ({ text: writeTable(table, d), names: table.names }));
    fc.assert(
      fc.property(
        file.chain(({ text, names }) => mutated(fc.constant(text)).map((t) => ({ text: t, names }))),
        ({ text, names }) => {
          neverThrows(text, options(names));
          neverThrows(text, options(names, { input: "prices", sort: true }));
          neverThrows(text, options(names.slice(0, 1), { idColumn: "Date", valueColumn: names[0] as string, dateColumn: names[1] ?? "x" }));
        },
      ),
      { numRuns: 400 },
    );
  });
});

describe("reading generated files", () => {
  it("gives back the written numbers exactly, in every dialect", () => {
    fc.assert(
      fc.property(generatedTable, dialect, (table, d) => {
        const result = readReturns(writeTable(table, d), options(table.names, { allowExtreme: true }));
        if (!result.ok) expect.fail(JSON.stringify(result.issues));
        expect(result.value.dates).toEqual(table.dates);
        table.names.forEach((name, c) => {
          const read = result.value.columns.get(name) as Float64Array;
          table.values.forEach((row, r) => {
            const written = row[c] as number;
            expect(Object.is(read[r], Object.is(written, -0) ? 0 : written) || Object.is(read[r], written), `${name} row ${r}`).toBe(true);
          });
        });
      }),
      { numRuns: 300 },
    );
  });

  it("gives the same result, bit for bit, with the fast scanner and with csv-parse on unquoted files", () => {
    const unquoted = fc
      .tuple(generatedTable, dialect)
      .map(([table, d]) => ({ text: writeTable(table, { ...d, quoteAll: false }), names: table.names }));
    const files = fc.oneof(
      unquoted,
      unquoted.chain(({ text, names }) => mutated(fc.constant(text)).map((t) => ({ text: t.replaceAll('"', ""), names }))),
    );
    fc.assert(
      fc.property(files, fc.boolean(), ({ text, names }, sort) => {
        const opts = options(names, { sort });
        expectSameRead(readReturnsWith(text, opts, "auto"), readReturnsWith(text, opts, "general"));
      }),
      { numRuns: 500 },
    );
  });

  it("gives back the written numbers from a shuffled long-layout file", () => {
    fc.assert(
      fc.property(generatedTable, fc.integer(), fc.constantFrom(",", ";", "\t"), (table, seed, delimiter) => {
        const result = readReturns(
          writeLongTable(table, seed, delimiter),
          options(table.names, { idColumn: "Series", valueColumn: "Value", allowExtreme: true }),
        );
        if (!result.ok) expect.fail(JSON.stringify(result.issues));
        expect(result.value.dates).toEqual(table.dates);
        table.names.forEach((name, c) => {
          const read = [...(result.value.columns.get(name) as Float64Array)];
          expect(read).toEqual(table.values.map((row) => (Object.is(row[c], -0) ? 0 : row[c])));
        });
      }),
      { numRuns: 200 },
    );
  });
});
