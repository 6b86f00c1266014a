/**
 * Problems name the file's own lines (1-based, the title and header lines counted) and columns, in
 * the long layout too, where rows are pivoted into date order: a series' value is on its own row, not
 * on the row of the first series of that date. Fixtures: test/fixtures/input (invented data; each
 * fault's line is found here by searching the file's text, not written down).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { SIMILAR_SHOWN } from "../../src/input/issueList.js";
import { describeInputIssue, type InputIssue } from "../../src/input/issues.js";
import { type ReadOptions, readReturns, readReturnsFromBytes } from "../../src/input/readReturns.js";

const LOW = "Stillwater Low Vol";
const HIGH = "Kestrel High Beta";
const LONG = { columns: [LOW, HIGH], idColumn: "symbol", valueColumn: "close", input: "prices" } as const;

const bytesOf = (name: string): Uint8Array => new Uint8Array(readFileSync(new URL(`../fixtures/input/${name}`, import.meta.url)));
const textOf = (name: string): string => new TextDecoder().decode(bytesOf(name));

/** The 1-based lines of a text that include `part`. */
const linesWith = (text: string, part: string): number[] => text.split("\n").flatMap((line, k) => (line.includes(part) ? [k + 1] : []));

/** The issues of reading a text (both from its bytes and from its text, which must agree). */
function issuesOf(name: string, text: string, options: Omit<ReadOptions, "source">): InputIssue[] {
  const fromText = readReturns(text, { source: name, ...options });
  const fromBytes = readReturnsFromBytes(new TextEncoder().encode(text), { source: name, ...options });
  if (fromText.ok || fromBytes.ok) return expect.fail(`${name} was read`);
  expect(fromBytes.issues).toEqual(fromText.issues);
  return fromText.issues;
}

describe("the long layout names the file's own lines", () => {
  it("reads the fixture: the date column second, month-name dates, a title line", () => {
    const read = readReturnsFromBytes(bytesOf("long-prices-month-names.csv"), { source: "p.csv", ...LONG });
    if (!read.ok) return expect.fail(read.issues.map(describeInputIssue).join("\n"));
    expect(read.value.dateColumn).toBe("date");
    const text = textOf("long-prices-month-names.csv");
    // Every date once (each has a row per series); the first price of each series is consumed.
    expect(read.value.dates).toHaveLength(linesWith(text, HIGH).length - 1);
    expect(read.value.warnings).toContainEqual({ code: "skipped-lines", source: "p.csv", line: 2, count: 1 });
  });

  it("a price that is not positive: its own line, the value column and the series", () => {
    const name = "long-prices-bad-price.csv";
    const text = textOf(name);
    const [line] = linesWith(text, `${HIGH},Jan 9 2023,0.00`);
    const issues = issuesOf(name, text, LONG);
    expect(issues).toEqual([{ code: "non-positive-price", source: name, line, column: "close", series: HIGH, value: "0.00" }]);
    // The row of the other series on that date is the line before: the pivot's row would have named it.
    expect(linesWith(text, `${LOW},Jan 9 2023,`)).toEqual([(line as number) - 1]);
    expect(describeInputIssue(issues[0] as InputIssue)).toBe(
      `${name} line ${line}, column "close" (series "${HIGH}"): the price "0.00" is not positive, so no return can be computed from it; check the column or the --input setting`,
    );
  });

  it("an extreme return of the second series: the line of its own row", () => {
    const text = textOf("long-prices-month-names.csv").replace(`${HIGH},Jan 10 2023,51.70`, `${HIGH},Jan 10 2023,5170`);
    const [line] = linesWith(text, "5170");
    const issues = issuesOf("x.csv", text, LONG);
    // 5170 / 52.30 - 1 is the extreme return (52.90 / 5170 - 1 is not); the row of the other series on that date is the line before.
    expect(issues).toMatchObject([{ code: "extreme-value", line, column: "close", series: HIGH, value: "5170" }]);
    expect(linesWith(text, `${LOW},Jan 10 2023,`)).toEqual([(line as number) - 1]);
  });

  it("a date that is no date: its line, the date column, the value, and why", () => {
    const name = "long-prices-bad-date.csv";
    const text = textOf(name);
    const [line] = linesWith(text, "Jan 32 2023");
    const issues = issuesOf(name, text, LONG);
    expect(issues).toEqual([
      { code: "bad-date", source: name, line, column: "date", value: "Jan 32 2023", problem: { kind: "no-day", day: 32 } },
    ]);
    expect(describeInputIssue(issues[0] as InputIssue)).toBe(
      `${name} line ${line}, column "date": "Jan 32 2023" is not a real date: there is no day 32; correct it in the file`,
    );
  });

  it("a value that is not a number: its own line and the value column", () => {
    const text = textOf("long-prices-month-names.csv").replace(`${HIGH},Jan 13 2023,52.80`, `${HIGH},Jan 13 2023,52.8O`);
    const [line] = linesWith(text, "52.8O");
    expect(issuesOf("x.csv", text, LONG)).toEqual([{ code: "not-a-number", source: "x.csv", line, column: "close", value: "52.8O" }]);
  });

  it("a repeated date of one series: both of its lines", () => {
    const text = textOf("long-prices-month-names.csv").replace(`${HIGH},Jan 12 2023,`, `${HIGH},Jan 11 2023,`);
    const lines = linesWith(text, `${HIGH},Jan 11 2023,`);
    const issues = issuesOf("x.csv", text, LONG);
    expect(issues).toEqual([
      { code: "duplicate-date", source: "x.csv", line: lines[1], column: "date", value: "Jan 11 2023", firstLine: lines[0], series: HIGH },
    ]);
    expect(describeInputIssue(issues[0] as InputIssue)).toBe(
      `x.csv line ${lines[1]}, column "date" (series "${HIGH}"): the date "Jan 11 2023" already appears on line ${lines[0]}; remove the repeated row`,
    );
  });

  it("repeated bad dates: the first few in full, then a count with the first and last line of the rest", () => {
    const name = "long-prices-bad-dates.csv";
    const text = textOf(name);
    const lines = linesWith(text, "Jam ");
    expect(lines.length).toBeGreaterThan(SIMILAR_SHOWN);
    const issues = issuesOf(name, text, LONG);
    const shown = issues.filter((i) => i.code === "bad-date");
    expect(shown.map((i) => [i.line, i.column, i.value])).toEqual(
      lines.slice(0, SIMILAR_SHOWN).map((line) => [line, "date", text.split("\n")[line - 1]?.split(",")[1]]),
    );
    expect(issues.at(-1)).toEqual({
      code: "similar-issues",
      source: name,
      like: "bad-date",
      column: "date",
      omitted: lines.length - SIMILAR_SHOWN,
      firstLine: lines[SIMILAR_SHOWN],
      lastLine: lines.at(-1),
    });
    expect(describeInputIssue(issues.at(-1) as InputIssue)).toBe(
      `${name} column "date": … and ${lines.length - SIMILAR_SHOWN} more dates that cannot be read, on lines ${lines[SIMILAR_SHOWN]} to ${lines.at(-1)}`,
    );
  });
});

describe("the wide layout under a title line names the file's own lines", () => {
  it("a value that is not a number", () => {
    const name = "wide-title-bad-value.csv";
    const text = textOf(name);
    const [line] = linesWith(text, "0.0x20");
    expect(line).toBeGreaterThan(2);
    expect(issuesOf(name, text, { columns: [LOW, HIGH] })).toEqual([
      { code: "not-a-number", source: name, line, column: HIGH, value: "0.0x20" },
    ]);
  });

  it("an extreme return", () => {
    const text = textOf("wide-title-bad-value.csv").replace("0.0x20", "12.5");
    const [line] = linesWith(text, "12.5");
    expect(issuesOf("w.csv", text, { columns: [LOW, HIGH] })).toMatchObject([{ code: "extreme-value", line, column: HIGH, value: "12.5" }]);
  });
});
