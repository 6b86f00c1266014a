import { describe, expect, it } from "vitest";
import { joinOnDates } from "../../src/input/table/joinOnDates.js";
import type { ReturnTable } from "../../src/input/readReturns.js";
import { readOk } from "./helpers.js";

const low = readOk("Date,Low\n2020-01-31,0.01\n2020-02-29,0.02\n2020-03-31,0.03\n2020-04-30,0.04\n", {
  source: "low.csv",
  columns: ["Low"],
});
const high = readOk("Date,High\n2020-02-29,0.2\n2020-03-31,0.3\n2020-04-30,0.4\n2020-05-31,0.5\n2020-06-30,0.6\n", {
  source: "high.csv",
  columns: ["High"],
});

describe("joinOnDates", () => {
  it("keeps the dates present in every table, with counts per side and matched", () => {
    const joined = joinOnDates([low, high]);
    if (!joined.ok) expect.fail(JSON.stringify(joined.issues));
    const { table, dateCounts, matched, unmatched } = joined.value;
    expect(table.dates).toEqual(["2020-02-29", "2020-03-31", "2020-04-30"]);
    expect([...(table.columns.get("Low") ?? [])]).toEqual([0.02, 0.03, 0.04]);
    expect([...(table.columns.get("High") ?? [])]).toEqual([0.2, 0.3, 0.4]);
    expect(dateCounts).toEqual([4, 5]);
    expect(matched).toBe(3);
    expect(unmatched).toEqual([
      { source: "low.csv", count: 1, firstDates: ["2020-01-31"] },
      { source: "high.csv", count: 2, firstDates: ["2020-05-31", "2020-06-30"] },
    ]);
    expect(table.source).toBe("low.csv + high.csv");
    expect([...table.lines]).toEqual([3, 4, 5]);
    expect(table.frequency).toEqual({ name: "monthly", periodsPerYear: 12, from: "detected" });
  });

  it("reports a column name that two tables share", () => {
    const joined = joinOnDates([low, low]);
    expect(joined.ok ? [] : joined.issues).toEqual([{ code: "duplicate-column", source: "low.csv and low.csv", column: "Low" }]);
  });

  it("reports too few common dates with the count of each table", () => {
    const other: ReturnTable = readOk("Date,X\n2021-01-31,1\n2021-02-28,1\n2021-03-31,1\n", {
      source: "x.csv",
      columns: ["X"],
      allowExtreme: true,
    });
    const joined = joinOnDates([low, other]);
    expect(joined.ok ? [] : joined.issues).toEqual([
      {
        code: "too-few-common-dates",
        source: "low.csv + x.csv",
        matched: 0,
        required: 3,
        counts: [
          { source: "low.csv", dates: 4 },
          { source: "x.csv", dates: 3 },
        ],
      },
    ]);
  });
});
