import { describe, expect, it } from "vitest";
import type { ReadOptions } from "../../src/input/options.js";
import { columnUnitWarnings, DECIMAL_LOOKING_MEDIAN, PERCENT_LOOKING_MEDIAN } from "../../src/input/table/warnings.js";
import { uniforms } from "../support/random.js";
import { column, HIGH, LOW, readIssues, readOk } from "./helpers.js";

const file = (rows: string[]): string => ["Date,Low Fund,High Fund", ...rows].join("\n");
const dates = ["2020-01-31", "2020-02-29", "2020-03-31", "2020-04-30", "2020-05-31"];
const withValues = (low: string[], high: string[]): string => file(low.map((l, i) => `${dates[i]},${l},${high[i]}`));

describe("missing-value sentinels", () => {
  it("treats numeric sentinels as missing, whatever their spelling", () => {
    const table = readOk(withValues(["0.01", "-99.99", "0.02", "0.03", "-99.990"], ["0.1", "0.2", "0.3", "0.4", "0.5"]), {
      missing: ["-99.99"],
    });
    expect(table.dates).toEqual(["2020-01-31", "2020-03-31", "2020-04-30"]);
    expect(table.dropped).toEqual({ count: 2, firstDates: ["2020-02-29", "2020-05-31"] });
  });

  it("treats text sentinels as missing, case-insensitively", () => {
    const table = readOk(withValues(["0.01", "#N/A", "0.02", "0.03", "0.04"], ["0.1", "0.2", "0.3", "-", "0.5"]), {
      missing: ["#n/a", "-"],
    });
    expect(table.dropped.count).toBe(2);
  });

  it("keeps -99.99 as a value when it is not declared", () => {
    expect(column(readOk(withValues(["0.01", "-0.9999", "0.02"], ["0.1", "0.2", "0.3"])), LOW)).toEqual([0.01, -0.9999, 0.02]);
  });

  it("reports every missing value with onMissing error", () => {
    expect(
      readIssues(withValues(["0.01", "", "0.02", "NA"], ["0.1", "0.2", "-99", "0.4"]), { onMissing: "error", missing: ["-99"] }),
    ).toEqual([
      // Grouped by column, the columns in the order of their first issue.
      { code: "missing-value", source: "returns.csv", line: 3, column: LOW, value: "" },
      { code: "missing-value", source: "returns.csv", line: 5, column: LOW, value: "NA" },
      { code: "missing-value", source: "returns.csv", line: 4, column: HIGH, value: "-99" },
    ]);
  });
});

describe("unit warnings", () => {
  it("warns when decimal data look like percent", () => {
    const table = readOk(withValues(["1.2", "-0.8", "2.5"], ["0.01", "0.02", "0.03"]));
    expect(table.warnings).toEqual([{ code: "looks-like-percent", source: "returns.csv", column: LOW, medianAbs: 1.2 }]);
  });

  it("warns when percent data look like decimal", () => {
    const table = readOk(withValues(["0.0001", "-0.0002", "0.0003"], ["1", "2", "3"]), { units: "percent" });
    expect(table.warnings).toEqual([{ code: "looks-like-decimal", source: "returns.csv", column: LOW, medianAbs: 0.0002 / 100 }]);
  });

  it("does not warn about ordinary decimal returns", () => {
    expect(readOk(withValues(["0.012", "-0.3", "0.2"], ["0.01", "0.02", "0.03"])).warnings).toEqual([]);
  });
});

describe("unit warnings decided by a count before any median", () => {
  /** The rule written out: the median |x| of the sample (sorted), then the two thresholds. */
  function expected(values: Float64Array, percent: boolean): string[] {
    const step = Math.max(1, Math.floor(values.length / 10_000));
    const sample = Array.from({ length: Math.ceil(values.length / step) }, (_, i) => Math.abs(values[i * step]!)).sort((a, b) => a - b);
    const m = sample.length;
    const median = m === 0 ? Number.NaN : m % 2 === 1 ? sample[m >> 1]! : (sample[(m >> 1) - 1]! + sample[m >> 1]!) / 2;
    if (!percent && median > PERCENT_LOOKING_MEDIAN) return ["looks-like-percent"];
    if (percent && median > 0 && median < DECIMAL_LOOKING_MEDIAN) return ["looks-like-decimal"];
    return [];
  }

  it("warns exactly when the median rule does, around both thresholds, for odd and even sizes", () => {
    const random = uniforms(7);
    for (let trial = 0; trial < 400; trial++) {
      const percent = trial % 2 === 1;
      const threshold = percent ? DECIMAL_LOOKING_MEDIAN : PERCENT_LOOKING_MEDIAN;
      const n = 1 + Math.floor(random() * 40) + (trial % 7 === 0 ? 20_000 : 0);
      // Values on both sides of the threshold, some exactly on it, a few zeros.
      const values = Float64Array.from({ length: n }, () => {
        const u = random();
        const x = u < 0.1 ? threshold : u < 0.15 ? 0 : threshold * (0.5 + random());
        return random() < 0.5 ? -x : x;
      });
      const options = { source: "r.csv", units: percent ? ("percent" as const) : ("decimal" as const) };
      const found = columnUnitWarnings("low", values, options as ReadOptions).map((w) => w.code);
      expect(found, `trial ${trial}, n ${n}`).toEqual(expected(values, percent));
    }
  });
});

describe("prices and log returns", () => {
  it("turns prices into simple returns, consuming the first date", () => {
    const table = readOk(withValues(["100", "110", "99", "99"], ["50", "25", "50", "100"]), { input: "prices" });
    expect(table.dates).toEqual(["2020-02-29", "2020-03-31", "2020-04-30"]);
    expect(column(table, LOW)).toEqual([110 / 100 - 1, 99 / 110 - 1, 0]);
    expect(column(table, HIGH)).toEqual([-0.5, 1, 1]);
    expect([...table.lines]).toEqual([3, 4, 5]);
    expect(table.rowsRead).toBe(4);
  });

  it("drops both returns that need a missing price", () => {
    const table = readOk(
      file(["2020-01-31,100,1", "2020-02-29,110,1", "2020-03-31,,1", "2020-04-30,99,1", "2020-05-31,100,1", "2020-06-30,90,1"]),
      { input: "prices" },
    );
    expect(table.dates).toEqual(["2020-02-29", "2020-05-31", "2020-06-30"]);
    expect(column(table, LOW)).toEqual([110 / 100 - 1, 100 / 99 - 1, 90 / 100 - 1]);
    expect(table.dropped).toEqual({ count: 2, firstDates: ["2020-03-31", "2020-04-30"] });
  });

  it("reports a price that is zero or negative", () => {
    expect(readIssues(withValues(["100", "0", "99", "98"], ["1", "1", "1", "1"]), { input: "prices" })).toEqual([
      { code: "non-positive-price", source: "returns.csv", line: 3, column: LOW, value: "0" },
    ]);
  });

  it("refuses percent units for prices", () => {
    expect(readIssues(withValues(["1", "2", "3"], ["1", "2", "3"]), { input: "prices", units: "percent" })[0]).toMatchObject({
      code: "invalid-option",
      option: "units",
    });
  });

  it("turns log returns into simple returns with expm1", () => {
    const table = readOk(withValues(["0.01", "-0.02", "0"], ["1", "2", "3"]), { input: "log-returns", units: "percent" });
    expect(column(table, LOW)).toEqual([Math.expm1(0.0001), Math.expm1(-0.0002), 0]);
    expect(column(table, HIGH)).toEqual([Math.expm1(0.01), Math.expm1(0.02), Math.expm1(0.03)]);
  });

  it("checks the extreme-value limit on the simple returns", () => {
    expect(readIssues(withValues(["0.01", "2.5", "0"], ["0", "0", "0"]), { input: "log-returns" })[0]).toMatchObject({
      code: "extreme-value",
      line: 3,
      value: "2.5",
      decimalValue: Math.expm1(2.5),
    });
  });
});
