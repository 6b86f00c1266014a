import { describe, expect, it } from "vitest";
import { describeInputIssue, type InputIssue } from "../../src/input/issues.js";
import { column, HIGH, LOW, MONTHLY, readIssues, readOk } from "./helpers.js";

describe("readReturns: the basic layout", () => {
  it("reads the requested columns in request order, with dates, lines and counts", () => {
    const table = readOk(MONTHLY, { columns: [HIGH, LOW] });
    expect([...table.columns.keys()]).toEqual([HIGH, LOW]);
    expect(table.dates).toEqual(["2020-01-31", "2020-02-29", "2020-03-31", "2020-04-30"]);
    expect(column(table, LOW)).toEqual([0.01, -0.005, 0.002, 0.012]);
    expect(column(table, HIGH)).toEqual([0.02, 0.031, -0.04, 0.05]);
    expect([...table.lines]).toEqual([2, 3, 4, 5]);
    expect(table.rowsRead).toBe(4);
    expect(table.dropped).toEqual({ count: 0, firstDates: [] });
    expect(table.dateColumn).toBe("Date");
    expect(table.source).toBe("returns.csv");
    expect(table.warnings).toEqual([]);
  });

  it("gives each row its own first line when a quoted note spans lines, and a run of lines otherwise", () => {
    const quoted = 'date,low,high,note\n2020-01-31,0.01,0.02,"two\nlines"\n2020-02-29,0.02,0.01,x\n2020-03-31,0.03,0.01,y\n';
    expect([...readOk(quoted, { columns: ["low", "high"] }).lines]).toEqual([2, 4, 5]);
    const dropped = "date,low,high\n2020-01-31,0.01,0.02\n2020-02-29,,0.01\n2020-03-31,0.03,0.01\n2020-04-30,0.01,0.03\n";
    expect([...readOk(dropped, { columns: ["low", "high"] }).lines]).toEqual([2, 4, 5]);
  });

  it("ignores a UTF-8 byte-order mark, CRLF line ends and trailing blank lines", () => {
    const text = `\uFEFF${MONTHLY.split("\n").join("\r\n")}\r\n\r\n  \r\n`;
    const table = readOk(text);
    expect(table.dateColumn).toBe("Date");
    expect(column(table, LOW)).toEqual([0.01, -0.005, 0.002, 0.012]);
  });

  it("reads quoted fields, including quoted numbers and header names", () => {
    const text = '"Date","Low Fund","High Fund"\n2020-01-31,"0.01",0.02\n"2020-02-29",0.03,"-0.01"\n2020-03-31,0.02,0.04\n';
    const table = readOk(text);
    expect(column(table, LOW)).toEqual([0.01, 0.03, 0.02]);
    expect(column(table, HIGH)).toEqual([0.02, -0.01, 0.04]);
  });

  it("uses the named date column instead of the first column", () => {
    const text = "Id,Low Fund,High Fund,When\na,0.01,0.02,2020-01-31\nb,0.02,0.03,2020-02-29\nc,0.03,0.04,2020-03-31\n";
    const table = readOk(text, { dateColumn: "When" });
    expect(table.dateColumn).toBe("When");
    expect(table.dates).toEqual(["2020-01-31", "2020-02-29", "2020-03-31"]);
  });

  it("does not parse columns that were not requested", () => {
    const table = readOk(MONTHLY);
    expect(table.columns.has("Comment")).toBe(false);
  });

  it("divides every value by 100 with units percent", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,1.5,-2\n2020-02-29,0.5,3\n2020-03-31,1,2\n";
    const table = readOk(text, { units: "percent" });
    expect(column(table, LOW)).toEqual([1.5 / 100, 0.5 / 100, 1 / 100]);
    expect(column(table, HIGH)).toEqual([-2 / 100, 3 / 100, 2 / 100]);
  });
});

describe("readReturns: missing values", () => {
  it("drops rows with a missing value and counts them with their dates", () => {
    const text = [
      "Date,Low Fund,High Fund",
      "2020-01-31,0.01,",
      "2020-02-29,NA,0.02",
      "2020-03-31,nan,0.02",
      "2020-04-30,0.01,null",
      "2020-05-31,N/A,0.03",
      "2020-06-30,n/a,0.01",
      "2020-07-31,0.01,0.02",
      "2020-08-31,0.02,0.03",
      "2020-09-30,0.03,0.04",
    ].join("\n");
    const table = readOk(text);
    expect(table.dates).toEqual(["2020-07-31", "2020-08-31", "2020-09-30"]);
    expect(table.dropped.count).toBe(6);
    expect(table.dropped.firstDates).toEqual(["2020-01-31", "2020-02-29", "2020-03-31", "2020-04-30", "2020-05-31"]);
    expect([...table.lines]).toEqual([8, 9, 10]);
    expect(table.rowsRead).toBe(9);
  });

  it("keeps a row whose only missing value is in a column that was not requested", () => {
    const table = readOk(MONTHLY);
    expect(table.dates).toHaveLength(4);
  });

  it("reports too few rows when fewer than 3 remain, with the counts", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,NA,0.02\n2020-03-31,0.03,0.04\n";
    expect(readIssues(text)).toEqual([{ code: "too-few-rows", source: "returns.csv", kept: 2, required: 3, rowsRead: 3, dropped: 1 }]);
  });
});

describe("readReturns: errors", () => {
  it("reports an empty file", () => {
    expect(readIssues("")).toEqual([{ code: "empty-file", source: "returns.csv" }]);
    expect(readIssues("\uFEFF \r\n\n")).toEqual([{ code: "empty-file", source: "returns.csv" }]);
  });

  it("reports a header without data rows, with its line", () => {
    expect(readIssues("Date,Low Fund,High Fund\n\n")).toEqual([{ code: "header-only", source: "returns.csv", line: 1 }]);
  });

  it("reports a non-numeric value with its line, column and text", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,0.01,abc\n2020-03-31,1.2abc,0.02\n2020-04-30,0x10,0.02\n";
    expect(readIssues(text)).toEqual([
      { code: "not-a-number", source: "returns.csv", line: 3, column: HIGH, value: "abc" },
      { code: "not-a-number", source: "returns.csv", line: 4, column: LOW, value: "1.2abc" },
      { code: "not-a-number", source: "returns.csv", line: 5, column: LOW, value: "0x10" },
    ]);
  });

  it("reports an unknown column with a suggestion and the available columns", () => {
    const [issue, ...rest] = readIssues(MONTHLY, { columns: ["low fund", "High Fund"] });
    expect(rest).toEqual([]);
    expect(issue).toEqual({
      code: "unknown-column",
      source: "returns.csv",
      line: 1,
      column: "low fund",
      role: "value",
      available: ["Date", "Low Fund", "High Fund", "Comment"],
      suggestion: "Low Fund",
    });
  });

  it("reports an unknown date column", () => {
    const [issue] = readIssues(MONTHLY, { dateColumn: "Datum" });
    expect(issue).toMatchObject({ code: "unknown-column", column: "Datum", role: "date", suggestion: "Date" });
  });

  it("reports a requested column that the header names twice", () => {
    const text = "Date,Low Fund,High Fund,Low Fund\n2020-01-31,1,2,3\n2020-02-29,1,2,3\n2020-03-31,1,2,3\n";
    expect(readIssues(text)).toEqual([{ code: "duplicate-column", source: "returns.csv", line: 1, column: LOW }]);
  });

  it("accepts a duplicated header name in a column that was not requested", () => {
    const text = "Date,Low Fund,High Fund,x,x\n2020-01-31,0.01,0.02,a,b\n2020-02-29,0.01,0.02,a,b\n2020-03-31,0.01,0.02,a,b\n";
    expect(readOk(text).dates).toHaveLength(3);
  });

  it("reports a row with the wrong number of fields", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,0.01\n2020-03-31,0.01,0.02\n2020-04-30,0.01,0.02\n";
    expect(readIssues(text)).toEqual([{ code: "wrong-field-count", source: "returns.csv", line: 3, expected: 3, actual: 2 }]);
  });

  it("reports a row with the wrong number of fields far into a long file (past the counts compared at once)", () => {
    // 40,000 daily rows from 1950 (integer day numbers as dates would not be dates): one short row at line 35,002.
    const day = (k: number) => new Date(Date.UTC(1950, 0, 1) + k * 86_400_000).toISOString().slice(0, 10);
    const rows = Array.from({ length: 40_000 }, (_, k) => (k === 35_000 ? `${day(k)},0.01` : `${day(k)},0.01,0.02`));
    const text = `Date,Low Fund,High Fund\n${rows.join("\n")}\n`;
    expect(readIssues(text)).toEqual([{ code: "wrong-field-count", source: "returns.csv", line: 35_002, expected: 3, actual: 2 }]);
  });

  it("reports duplicate dates with both lines", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,0.01,0.02\n2020-02-29,0.01,0.02\n2020-03-31,0.01,0.02\n";
    expect(readIssues(text)).toEqual([
      { code: "duplicate-date", source: "returns.csv", line: 4, column: "Date", value: "2020-02-29", firstLine: 3 },
    ]);
  });

  it("reports unsorted dates with the previous date and its line", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-03-31,0.01,0.02\n2020-02-29,0.01,0.02\n2020-04-30,0.01,0.02\n";
    expect(readIssues(text)).toEqual([
      {
        code: "unsorted-dates",
        source: "returns.csv",
        line: 4,
        column: "Date",
        value: "2020-02-29",
        previousValue: "2020-03-31",
        previousLine: 3,
      },
    ]);
  });

  it("reports a date that is not a date, or not a real calendar day", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2021-02-29,0.01,0.02\nlast month,0.01,0.02\n2020-04-30,0.01,0.02\n";
    expect(readIssues(text)).toEqual([
      {
        code: "bad-date",
        source: "returns.csv",
        line: 3,
        column: "Date",
        value: "2021-02-29",
        // 2021 is not a leap year (not divisible by 4).
        problem: { kind: "short-month", year: 2021, month: 2, days: 28 },
      },
      { code: "bad-date", source: "returns.csv", line: 4, column: "Date", value: "last month" },
    ]);
  });

  it("reports a value beyond +-10 (1000%) unless extreme values are allowed", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,12.5,0.02\n2020-03-31,0.01,-10\n";
    expect(readIssues(text)).toEqual([
      { code: "extreme-value", source: "returns.csv", line: 3, column: LOW, value: "12.5", decimalValue: 12.5, limit: 10 },
    ]);
    expect(column(readOk(text, { allowExtreme: true }), LOW)).toEqual([0.01, 12.5, 0.01]);
  });

  it("checks the extreme-value limit after the percent conversion", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,1,2\n2020-02-29,900,2\n2020-03-31,1,2\n";
    expect(readOk(text, { units: "percent" }).dates).toHaveLength(3);
    expect(readIssues(text.replace("900", "1001"), { units: "percent" })[0]).toMatchObject({
      code: "extreme-value",
      line: 3,
      value: "1001",
    });
  });

  it("reports invalid options before reading", () => {
    expect(readIssues(MONTHLY, { columns: [] })[0]).toMatchObject({ code: "invalid-option", option: "columns" });
    expect(readIssues(MONTHLY, { columns: [LOW, LOW] })[0]).toMatchObject({ code: "invalid-option", option: "columns" });
    expect(readIssues(MONTHLY, { delimiter: ";;" })[0]).toMatchObject({ code: "invalid-option", option: "delimiter" });
    expect(readIssues(MONTHLY, { block: 0 })[0]).toMatchObject({ code: "invalid-option", option: "block" });
    expect(readIssues(MONTHLY, { columns: ["Date", LOW] })).toEqual([
      {
        code: "invalid-option",
        source: "returns.csv",
        option: "columns",
        reason: expect.stringMatching(
          /^the column "Date" is asked for as a series and is also the date column: name the date column with --date/,
        ),
      },
    ]);
    expect(readIssues(MONTHLY, { decimalComma: true, delimiter: "," })[0]).toMatchObject({
      code: "invalid-option",
      option: "decimalComma",
    });
  });

  it("reports broken quoting with its line", () => {
    const issues = readIssues('Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,"0.01,0.02\n');
    expect(issues).toEqual([{ code: "malformed-quotes", source: "returns.csv", line: 3, problem: "not-closed" }]);
  });

  it.each([
    ['Date,Low Fund,High Fund\n2020-01-31,ab"secret",0.02\n', { line: 2, problem: "quote-inside", field: 2 }],
    ['Date,Low Fund,High Fund\n2020-01-31,"0.01"secret,0.02\n', { line: 2, problem: "after-closing" }],
  ])("reports broken quoting in its own words, without the field's text: %j", (text, expected) => {
    const issues = readIssues(text);
    expect(issues).toEqual([{ code: "malformed-quotes", source: "returns.csv", ...expected }]);
    expect(describeInputIssue(issues[0] as InputIssue)).not.toContain("secret");
  });

  it("shows the first three issues of a kind in a column, then counts the rest with their lines", () => {
    const rows = Array.from({ length: 80 }, (_, i) => `2020-01-${String((i % 28) + 1).padStart(2, "0")}-x,a,b`);
    const issues = readIssues(["Date,Low Fund,High Fund", ...rows].join("\n"));
    // Per column (Low Fund, High Fund, Date): three in full, then one line for the other 77, on lines 5 to 81.
    const kind = (code: string, column: string): unknown[] => [
      [code, column, 2],
      [code, column, 3],
      [code, column, 4],
      ["similar-issues", column, undefined],
    ];
    expect(issues.map((issue) => [issue.code, issue.column, issue.line])).toEqual([
      ...kind("not-a-number", LOW),
      ...kind("not-a-number", HIGH),
      ...kind("bad-date", "Date"),
    ]);
    expect(issues[3]).toEqual({
      code: "similar-issues",
      source: "returns.csv",
      column: LOW,
      like: "not-a-number",
      omitted: 77,
      firstLine: 5,
      lastLine: 81,
    });
  });

  it("caps the number of issues of different kinds and says how many were left out", () => {
    // 30 value columns with two bad values each: 60 issues of 30 kinds, of which 50 are shown.
    const names = Array.from({ length: 30 }, (_, i) => `S${i}`);
    const rows = ["2020-01-31", "2020-02-29", "2020-03-31"].map((date, r) => [date, ...names.map(() => (r < 2 ? "x" : "0.01"))].join(","));
    const issues = readIssues(`${["Date", ...names].join(",")}\n${rows.join("\n")}`, { columns: names });
    expect(issues).toHaveLength(51);
    expect(issues.slice(0, 50).every((issue) => issue.code === "not-a-number")).toBe(true);
    expect(issues[50]).toEqual({ code: "too-many-issues", source: "returns.csv", omitted: 60 - 50 });
  });
});

describe("readReturns: frequency", () => {
  it.each([
    ["monthly", ["2020-01-31", "2020-02-29", "2020-03-31", "2020-04-30"], 12],
    ["weekly", ["2020-01-03", "2020-01-10", "2020-01-17", "2020-01-24"], 52],
    ["daily", ["2020-01-02", "2020-01-03", "2020-01-06", "2020-01-07", "2020-01-08"], 252],
    ["quarterly", ["2020-03-31", "2020-06-30", "2020-09-30", "2020-12-31"], 4],
    ["annual", ["2017-12-31", "2018-12-31", "2019-12-31", "2020-12-31"], 1],
  ])("detects %s data from the median gap between dates", (name, dates, periodsPerYear) => {
    const text = ["Date,Low Fund,High Fund", ...dates.map((d) => `${d},0.01,0.02`)].join("\n");
    expect(readOk(text).frequency).toEqual({ name, periodsPerYear, from: "detected" });
  });

  it("returns no frequency when the gaps fit none", () => {
    const text = ["Date,Low Fund,High Fund", "2020-01-01,1,1", "2020-01-16,1,1", "2020-01-31,1,1"].join("\n");
    expect(readOk(text, { allowExtreme: true }).frequency).toBeNull();
  });

  it("takes periodsPerYear from the options when given", () => {
    expect(readOk(MONTHLY, { periodsPerYear: 260 }).frequency).toEqual({ name: "daily", periodsPerYear: 260, from: "option" });
  });
});
