import { describe, expect, it } from "vitest";
import { describeInputIssue, describeInputWarning, inputIssueCodes, type InputIssue } from "../../src/input/issues.js";
import { readIssues } from "./helpers.js";

const one = (text: string, overrides = {}): string => describeInputIssue(readIssues(text, overrides)[0] as InputIssue);

describe("describeInputIssue", () => {
  it("names file, line, column and value for a non-number, and says what to do", () => {
    const text = "Date,Low Fund,Kestrel High\n2020-01-31,0.01,0.02\n2020-02-29,0.01,abc\n2020-03-31,0.01,0.02\n";
    expect(one(text, { columns: ["Low Fund", "Kestrel High"] })).toBe(
      'returns.csv line 3, column "Kestrel High": "abc" is not a number; use an empty field or NA for a missing value, or --missing to declare a sentinel',
    );
  });

  it("suggests the closest column name and lists the available ones", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,0.01,0.02\n2020-03-31,0.01,0.02\n";
    expect(one(text, { columns: ["Low Fund", "High Fnd"] })).toBe(
      'returns.csv line 1: no value column "High Fnd"; did you mean "High Fund"? available columns: "Date", "Low Fund", "High Fund"',
    );
  });

  it("offers no suggestion when nothing is close", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,0.01,0.02\n2020-03-31,0.01,0.02\n";
    expect(one(text, { columns: ["Low Fund", "Benchmark"] })).toBe(
      'returns.csv line 1: no value column "Benchmark"; available columns: "Date", "Low Fund", "High Fund"',
    );
  });

  it("words every issue code with the source name in it", () => {
    const samples: InputIssue[] = [
      { code: "empty-file", source: "f.csv" },
      { code: "header-only", source: "f.csv", line: 1 },
      { code: "no-table", source: "f.csv" },
      { code: "no-such-block", source: "f.csv", block: 3, available: 2 },
      { code: "unknown-column", source: "f.csv", line: 1, column: "x", role: "value", available: ["a"], foundInBlock: 2 },
      { code: "duplicate-column", source: "f.csv", line: 1, column: "x" },
      { code: "unknown-series", source: "f.csv", column: "x", idColumn: "Fund", available: ["a"], suggestion: "a" },
      { code: "not-a-number", source: "f.csv", line: 2, column: "x", value: "?" },
      { code: "missing-value", source: "f.csv", line: 2, column: "x", value: "" },
      { code: "wrong-field-count", source: "f.csv", line: 2, expected: 3, actual: 4 },
      { code: "unquoted-delimiter", source: "f.csv", line: 2, column: "x", value: "1,5", delimiter: "," },
      { code: "malformed-quotes", source: "f.csv", line: 2, detail: "quote not closed" },
      { code: "bad-date", source: "f.csv", line: 2, column: "Date", value: "x", dateFormat: "DD/MM/YYYY" },
      {
        code: "ambiguous-dates",
        source: "f.csv",
        line: 2,
        column: "Date",
        value: "03/04/2020",
        dayFirst: "2020-04-03",
        monthFirst: "2020-03-04",
      },
      { code: "duplicate-date", source: "f.csv", line: 3, column: "Date", value: "2020-01-31", firstLine: 2, series: "A" },
      {
        code: "unsorted-dates",
        source: "f.csv",
        line: 3,
        column: "Date",
        value: "2020-01-31",
        previousValue: "2020-02-29",
        previousLine: 2,
      },
      { code: "too-few-rows", source: "f.csv", kept: 2, required: 3, rowsRead: 5, dropped: 3 },
      { code: "too-few-common-dates", source: "f.csv", matched: 2, required: 3, counts: [{ source: "a.csv", dates: 5 }] },
      { code: "extreme-value", source: "f.csv", line: 2, column: "x", value: "15", decimalValue: 15, limit: 10 },
      { code: "non-positive-price", source: "f.csv", line: 2, column: "x", value: "0" },
      { code: "invalid-encoding", source: "f.csv", line: 2, offset: 17 },
      { code: "binary-content", source: "f.csv", line: 1, offset: 3 },
      { code: "unsupported-encoding", source: "f.csv", encoding: "UTF-16LE" },
      { code: "invalid-option", source: "f.csv", option: "block", reason: "must be a whole number from 1 to 1000000" },
      { code: "too-many-issues", source: "f.csv", omitted: 12 },
      { code: "internal-error", source: "f.csv", detail: "boom" },
    ];
    expect(samples.map((s) => s.code)).toEqual([...inputIssueCodes]);
    for (const issue of samples) {
      const message = describeInputIssue(issue);
      expect(message.startsWith("f.csv")).toBe(true);
      if ("line" in issue && issue.line !== undefined) expect(message).toContain(`line ${issue.line}`);
      if ("value" in issue && issue.value !== undefined && issue.value !== "") expect(message).toContain(JSON.stringify(issue.value));
    }
  });

  it("tells the reader to quote a number split by the delimiter", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,1,5,0.02\n2020-03-31,0.01,0.02\n";
    expect(one(text)).toBe(
      'returns.csv line 3, column "Low Fund": "1,5" looks like a number split by the "," delimiter; quote the value, use "." as the decimal separator, or choose another delimiter (--delimiter)',
    );
  });

  it("names both readings of an ambiguous date", () => {
    const text = "Date,Low Fund,High Fund\n03/04/2020,0.01,0.02\n04/05/2020,0.01,0.02\n05/06/2020,0.01,0.02\n";
    expect(one(text)).toBe(
      'returns.csv line 2, column "Date": "03/04/2020" reads as 2020-04-03 (day first) or 2020-03-04 (month first), and no date in the column settles it; pass --date-format DD/MM/YYYY or MM/DD/YYYY',
    );
  });
});

describe("describeInputWarning", () => {
  it("words each warning with the source and what to check", () => {
    expect(describeInputWarning({ code: "looks-like-percent", source: "f.csv", column: "A", medianAbs: 1.2 })).toBe(
      'f.csv, column "A": the median absolute return is 1.2, which looks like percent; if so pass --units percent',
    );
    expect(describeInputWarning({ code: "looks-like-decimal", source: "f.csv", column: "A", medianAbs: 0.0001 })).toContain("0.01%");
    expect(describeInputWarning({ code: "other-blocks", source: "f.csv", used: 1, blocks: 2 })).toContain("--block");
    expect(describeInputWarning({ code: "skipped-lines", source: "f.csv", line: 3, count: 2 })).toContain("line 3");
  });
});
