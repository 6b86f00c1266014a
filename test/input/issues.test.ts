import { describe, expect, it } from "vitest";
import {
  describeDateProblem,
  describeInputIssue,
  describeInputWarning,
  inputIssueCodes,
  quote,
  type InputIssue,
} from "../../src/input/issues.js";
import { maximumInputBytes, maximumTextLength } from "../../src/input/limits.js";
import type { DateProblem } from "../../src/input/values/dates.js";
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
      { code: "not-a-return-table", source: "f.csv", size: 214, wanted: ["A", "B"] },
      { code: "no-such-block", source: "f.csv", block: 3, available: 2 },
      { code: "unknown-column", source: "f.csv", line: 1, column: "x", role: "value", available: ["a"], foundInBlock: 2 },
      { code: "duplicate-column", source: "f.csv", line: 1, column: "x" },
      { code: "unknown-series", source: "f.csv", column: "x", idColumn: "Fund", available: ["a"], suggestion: "a" },
      { code: "not-a-number", source: "f.csv", line: 2, column: "x", value: "?" },
      { code: "missing-value", source: "f.csv", line: 2, column: "x", value: "" },
      { code: "wrong-field-count", source: "f.csv", line: 2, expected: 3, actual: 4 },
      { code: "unquoted-delimiter", source: "f.csv", line: 2, column: "x", value: "1,5", delimiter: "," },
      { code: "malformed-quotes", source: "f.csv", line: 2, problem: "quote-inside", field: 2 },
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
      { code: "invalid-encoding", source: "f.csv", line: 2, offset: 17, byte: 0xe9 },
      { code: "binary-content", source: "f.csv", line: 1, offset: 3 },
      { code: "not-a-text-file", source: "f.csv", kind: "gzip", size: 100 },
      { code: "unsupported-encoding", source: "f.csv", encoding: "UTF-16LE", bom: true },
      { code: "text-too-large", source: "f.csv", line: 1, size: 600, length: 590, limit: 500, cause: "non-ascii" },
      { code: "input-too-large", source: "f.csv", size: 2 ** 31, limit: 2 ** 31 - 1 },
      { code: "invalid-option", source: "f.csv", option: "block", reason: "must be a whole number from 1 to 1000000" },
      { code: "similar-issues", source: "f.csv", column: "x", like: "not-a-number", omitted: 7, firstLine: 5, lastLine: 11 },
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

describe("the size limits and their words", () => {
  it("defines the input limit once, as 2 GiB - 1 byte, and words its refusal with the size, the limit and what to do", () => {
    // 2^31 - 1 = 2,147,483,647 (the largest 32-bit signed integer).
    expect(maximumInputBytes).toBe(2_147_483_647);
    const threeGiB = 3 * 2 ** 30;
    expect(describeInputIssue({ code: "input-too-large", source: "big.csv", size: threeGiB, limit: maximumInputBytes })).toBe(
      "big.csv: the input is 3,221,225,472 bytes (3 GiB), more than the 2,147,483,647 bytes (2 GiB - 1 byte) that can be read; " +
        "split it by date (a file per period) or by columns (each book in its own file, joined on dates with --low FILE:COLUMN --high FILE:COLUMN)",
    );
  });

  it("words a text too long for one string with its size, length, limit, cause and what to do", () => {
    const issue: InputIssue = {
      code: "text-too-large",
      source: "big.csv",
      line: 1,
      size: 630_000_017,
      length: 630_000_001,
      limit: maximumTextLength,
      cause: "non-ascii",
    };
    expect(describeInputIssue(issue)).toBe(
      "big.csv: 630,000,017 bytes (0.59 GiB) of text, read as one string because line 1 has a character that is not ASCII, " +
        "and a string holds at most 536,870,888 characters (this one would have 630,000,001); save it as plain ASCII " +
        "(no accents or symbols in names), so that it is read from its bytes (up to 2 GiB - 1 byte), or split it by date " +
        "(a file per period) or by columns (each book in its own file, joined on dates with --low FILE:COLUMN --high FILE:COLUMN)",
    );
  });
});

describe("quoting file content", () => {
  it("escapes control, format and bidirectional characters, so a cell cannot drive the terminal", () => {
    expect(quote("\u001b[31mred\u001b[0m")).toBe('"\\u001b[31mred\\u001b[0m"');
    expect(quote("abc\u202edef")).toBe('"abc\\u202edef"');
    expect(quote("a\u0085b\u200bc")).toBe('"a\\u0085b\\u200bc"');
    expect(quote('say "hi"\n')).toBe('"say \\"hi\\"\\n"');
  });

  it("cuts a long cell to 40 characters and gives its length, without splitting a surrogate pair", () => {
    expect(quote("x".repeat(5000))).toBe(`"${"x".repeat(40)}…" (5,000 characters)`);
    expect(quote("x".repeat(40))).toBe(`"${"x".repeat(40)}"`);
    expect(quote(`${"x".repeat(39)}😀yz`)).toBe(`"${"x".repeat(39)}…" (43 characters)`);
  });

  it("lists at most 20 names from a header", () => {
    const available = Array.from({ length: 25 }, (_, i) => `c${i}`);
    const message = describeInputIssue({ code: "unknown-column", source: "f.csv", line: 1, column: "x", role: "value", available });
    expect(message).toContain('"c19" and 5 more');
    expect(message).not.toContain('"c20"');
  });
});

describe("why a date is not a date", () => {
  it.each<[DateProblem, string]>([
    [{ kind: "short-month", year: 2021, month: 2, days: 28 }, "February 2021 has 28 days"],
    [{ kind: "short-month", year: 2021, month: 4, days: 30 }, "April 2021 has 30 days"],
    [{ kind: "no-month", month: 13 }, "there is no month 13"],
    [{ kind: "no-day", day: 0 }, "there is no day 0"],
    [{ kind: "no-year" }, "there is no year 0"],
    [{ kind: "no-time", part: "hour", value: 24 }, "there is no hour 24"],
    [{ kind: "no-offset", offset: "+25:00" }, '"+25:00" is not a UTC offset'],
    [{ kind: "no-month-name", name: "Foo" }, '"Foo" is not a month name'],
  ])("words %j", (problem, words) => {
    expect(describeDateProblem(problem)).toBe(words);
  });

  it("names the layout or the slash reading the date was read in", () => {
    const at = { source: "f.csv", line: 4, column: "date" } as const;
    const problem = { kind: "short-month", year: 2021, month: 4, days: 30 } as const;
    expect(describeInputIssue({ code: "bad-date", ...at, value: "31.04.2021", dateFormat: "DD.MM.YYYY", problem })).toBe(
      'f.csv line 4, column "date": "31.04.2021" is not a real date (layout DD.MM.YYYY): April 2021 has 30 days; correct it in the file',
    );
    expect(describeInputIssue({ code: "bad-date", ...at, value: "31/04/2021", reading: "day first", problem })).toBe(
      'f.csv line 4, column "date": "31/04/2021" is not a real date read day first (as the column\'s other dates are): April 2021 has 30 days; correct it in the file',
    );
  });
});

describe("broken quoting", () => {
  it("is worded by what is wrong and, for a quote inside a field, which field", () => {
    const at = { code: "malformed-quotes", source: "f.csv", line: 2 } as const;
    const rule = "every quoted field must start and end with a double quote, and a quote inside one is written twice";
    expect(describeInputIssue({ ...at, problem: "quote-inside", field: 2 })).toBe(
      `f.csv line 2: broken quoting (field 2 has a double quote inside but does not start with one); ${rule}`,
    );
    expect(describeInputIssue({ ...at, problem: "not-closed" })).toBe(
      `f.csv line 2: broken quoting (a quoted field is never closed); ${rule}`,
    );
  });
});
