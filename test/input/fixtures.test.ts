import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { decodeText } from "../../src/input/decodeText.js";
import { describeInputIssue } from "../../src/input/issues.js";
import { readReturns, type ReadOptions } from "../../src/input/readReturns.js";

const fixture = (name: string): Uint8Array => new Uint8Array(readFileSync(new URL(`../fixtures/csv/${name}`, import.meta.url)));

function read(name: string, options: Omit<ReadOptions, "source">) {
  const text = decodeText(fixture(name), name);
  if (!text.ok) return text;
  return readReturns(text.value, { source: name, ...options });
}

const LOW = "Stillwater Low Vol";
const HIGH = "Kestrel High Beta";

describe("fixture files", () => {
  it("reads a European export: title lines, semicolons, decimal commas, DD.MM.YYYY, percent", () => {
    const result = read("european-semicolon.csv", {
      columns: [LOW, HIGH, "T-Bill"],
      dateFormat: "DD.MM.YYYY",
      decimalComma: true,
      units: "percent",
    });
    if (!result.ok) expect.fail(result.issues.map(describeInputIssue).join("\n"));
    expect(result.value.dates).toEqual(["2023-01-31", "2023-02-28", "2023-03-31", "2023-04-30"]);
    expect([...(result.value.columns.get(HIGH) ?? [])]).toEqual([2.1 / 100, -3.05 / 100, 4.55 / 100, 1.02 / 100]);
    expect([...result.value.lines]).toEqual([5, 6, 7, 8]);
  });

  it("explains the decimal comma when it is not declared", () => {
    const result = read("european-semicolon.csv", { columns: [LOW, HIGH], dateFormat: "DD.MM.YYYY" });
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(describeInputIssue(result.issues[0] as never)).toBe(
        'european-semicolon.csv line 5, column "Stillwater Low Vol": "0,85" is not a number: it has a decimal comma; export the file with "." as the decimal separator, or pass --decimal-comma',
      );
    }
  });

  it("reads the first table of a percent file, dropping the row with a gap", () => {
    const result = read("monthly-percent.csv", { columns: [LOW, HIGH], units: "percent" });
    if (!result.ok) expect.fail(result.issues.map(describeInputIssue).join("\n"));
    expect(result.value.dates).toHaveLength(5);
    expect(result.value.dropped).toEqual({ count: 1, firstDates: ["2023-03-31"] });
    expect(result.value.frequency?.name).toBe("monthly");
    expect(result.value.warnings).toEqual([{ code: "other-blocks", source: "monthly-percent.csv", used: 1, blocks: 2 }]);
  });

  it("reads long-layout prices as daily returns", () => {
    const result = read("long-prices.csv", { idColumn: "fund", valueColumn: "close", columns: [LOW, HIGH], input: "prices" });
    if (!result.ok) expect.fail(result.issues.map(describeInputIssue).join("\n"));
    expect(result.value.dateColumn).toBe("date");
    expect(result.value.dates).toEqual(["2023-01-04", "2023-01-05", "2023-01-06", "2023-01-09"]);
    expect([...(result.value.columns.get(HIGH) ?? [])]).toEqual([51 / 50 - 1, 50.49 / 51 - 1, 51.5 / 50.49 - 1, 52 / 51.5 - 1]);
    expect(result.value.frequency).toEqual({ name: "daily", periodsPerYear: 252, from: "detected" });
  });

  it("refuses ambiguous slash dates until a layout is given", () => {
    expect(read("ambiguous-slash-dates.csv", { columns: ["Low", "High"] })).toMatchObject({
      ok: false,
      issues: [{ code: "ambiguous-dates", line: 2 }],
    });
    const dayFirst = read("ambiguous-slash-dates.csv", { columns: ["Low", "High"], dateFormat: "DD/MM/YYYY" });
    expect(dayFirst.ok && dayFirst.value.dates).toEqual(["2023-01-03", "2023-02-03", "2023-03-03"]);
  });

  it("refuses binary and non-UTF-8 files", () => {
    expect(read("binary.csv", { columns: ["Low"] })).toEqual({
      ok: false,
      issues: [{ code: "binary-content", source: "binary.csv", line: 3, offset: 54 }],
    });
    expect(read("latin1.csv", { columns: ["Low"] })).toEqual({
      ok: false,
      // 0xFC is "ü" in Latin-1, a lone byte that starts no UTF-8 sequence.
      issues: [{ code: "invalid-encoding", source: "latin1.csv", line: 1, offset: 12, byte: 0xfc }],
    });
  });
});
