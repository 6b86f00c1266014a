import { describe, expect, it } from "vitest";
import { column, readIssues, readOk } from "./helpers.js";

const LONG = [
  "Date,Fund,Return,Note",
  "2020-01-31,Kestrel High,0.02,a",
  "2020-02-29,Kestrel High,0.03,",
  "2020-03-31,Kestrel High,-0.01,",
  "2020-01-31,Stillwater Low,0.01,",
  "2020-03-31,Stillwater Low,0.005,",
  "2020-02-29,Stillwater Low,0.002,",
  "2020-02-29,Other,abc,",
].join("\n");
const long = { idColumn: "Fund", valueColumn: "Return", columns: ["Stillwater Low", "Kestrel High"] };

describe("the long layout", () => {
  it("pivots one row per series and date into date order", () => {
    const table = readOk(LONG, long);
    expect(table.dates).toEqual(["2020-01-31", "2020-02-29", "2020-03-31"]);
    expect([...table.columns.keys()]).toEqual(["Stillwater Low", "Kestrel High"]);
    expect(column(table, "Stillwater Low")).toEqual([0.01, 0.002, 0.005]);
    expect(column(table, "Kestrel High")).toEqual([0.02, 0.03, -0.01]);
    expect(table.rowsRead).toBe(7);
  });

  it("does not read values of series that were not requested", () => {
    expect(readOk(LONG, long).dropped.count).toBe(0);
  });

  it("counts a date where one series has no row as missing", () => {
    const text = `${LONG}\n2020-04-30,Kestrel High,0.01,\n2020-05-31,Kestrel High,0.01,\n2020-05-31,Stillwater Low,0.01,`;
    const table = readOk(text, long);
    expect(table.dates).toEqual(["2020-01-31", "2020-02-29", "2020-03-31", "2020-05-31"]);
    expect(table.dropped).toEqual({ count: 1, firstDates: ["2020-04-30"] });
  });

  it("reports an unknown series with a suggestion and the series present", () => {
    expect(readIssues(LONG, { ...long, columns: ["Stillwater Low", "kestrel hgh"] })).toEqual([
      {
        code: "unknown-series",
        source: "returns.csv",
        column: "kestrel hgh",
        idColumn: "Fund",
        available: ["Kestrel High", "Stillwater Low", "Other"],
        suggestion: "Kestrel High",
      },
    ]);
  });

  it("reports a repeated date within a series with both lines", () => {
    expect(readIssues(`${LONG}\n2020-01-31,Kestrel High,0.05,`, long)).toEqual([
      {
        code: "duplicate-date",
        source: "returns.csv",
        line: 9,
        column: "Date",
        value: "2020-01-31",
        firstLine: 2,
        series: "Kestrel High",
      },
    ]);
  });

  it("reports an unknown id or value column", () => {
    expect(readIssues(LONG, { ...long, valueColumn: "Returns" })[0]).toMatchObject({
      code: "unknown-column",
      column: "Returns",
      role: "series value",
      suggestion: "Return",
    });
  });

  it("needs both the id and the value column", () => {
    expect(readIssues(LONG, { idColumn: "Fund" })[0]).toMatchObject({ code: "invalid-option", option: "valueColumn" });
  });
});
