import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { readDateColumn } from "../../src/input/values/dateColumn.js";
import { compileDateFormat } from "../../src/input/values/dateFormat.js";
import { parseUnambiguousDate, plainIsoDateKey, plainIsoDateOfKey } from "../../src/input/values/dates.js";
import { readIssues, readOk } from "./helpers.js";

const isos = (texts: string[], format?: string): readonly string[] => {
  const column = readDateColumn(texts, format);
  if (column.kind !== "dates") expect.fail(JSON.stringify(column));
  return column.isos;
};

const withDates = (dates: string[]): string => ["Date,Low Fund,High Fund", ...dates.map((d) => `${d},0.01,0.02`)].join("\n");

describe("unambiguous dates", () => {
  it.each([
    ["2020-03-31", "2020-03-31"],
    [" 2020-03-31 ", "2020-03-31"],
    ["20200331", "2020-03-31"],
    ["202003", "2020-03"],
    ["2020-03", "2020-03"],
    ["2020/03", "2020-03"],
    ["2020/3/31", "2020-03-31"],
    ["2020", "2020"],
    ["2020-03-31T09:30", "2020-03-31T09:30:00"],
    ["2020-03-31 09:30:15", "2020-03-31T09:30:15"],
    ["2020-03-31T09:30:15.250Z", "2020-03-31T09:30:15.250Z"],
    ["2020-03-31T09:30:00+0100", "2020-03-31T09:30:00+01:00"],
  ])("reads %j as %j", (text, iso) => {
    expect(parseUnambiguousDate(text)?.iso).toBe(iso);
  });

  it.each([
    "2021-02-29",
    "2020-13-01",
    "2020-00-10",
    "2020-04-31",
    "20201301",
    "2020-1-5",
    "31.03.2020",
    "March 2020",
    "",
    "2020-03-31T25:00",
  ])("rejects %j", (text) => {
    expect(parseUnambiguousDate(text)).toBeNull();
  });

  it("accepts 29 February in leap years only", () => {
    expect(parseUnambiguousDate("2000-02-29")).not.toBeNull();
    expect(parseUnambiguousDate("1900-02-29")).toBeNull();
    expect(parseUnambiguousDate("2024-02-29")).not.toBeNull();
  });

  it("orders date-times by their instant, converting offsets to UTC", () => {
    const a = parseUnambiguousDate("2020-03-31T10:00:00+02:00")?.key;
    const b = parseUnambiguousDate("2020-03-31T09:00:00Z")?.key;
    expect(a).toBeLessThan(b as number);
  });

  it("gives every calendar day a key one day after the previous one", () => {
    fc.assert(
      fc.property(fc.date({ min: new Date("1800-01-01"), max: new Date("2200-12-31"), noInvalidDate: true }), (date) => {
        const iso = date.toISOString().slice(0, 10);
        const parsed = parseUnambiguousDate(iso);
        expect(parsed?.iso).toBe(iso);
        expect(parsed?.key).toBe(Date.parse(`${iso}T00:00:00Z`));
      }),
    );
  });
});

describe("slash dates", () => {
  it("reads a column day-first when some day is above 12", () => {
    expect(isos(["03/04/2020", "25/04/2020"])).toEqual(["2020-04-03", "2020-04-25"]);
  });

  it("reads a column month-first when some second number is above 12", () => {
    expect(isos(["03/04/2020", "04/25/2020"])).toEqual(["2020-03-04", "2020-04-25"]);
  });

  it("reports an ambiguous column naming both readings of its first ambiguous date", () => {
    expect(readDateColumn(["01/01/2020", "03/04/2020", "05/06/2020"])).toEqual({
      kind: "ambiguous",
      index: 1,
      dayFirst: "2020-04-03",
      monthFirst: "2020-03-04",
    });
  });

  it("is not ambiguous when day and month are equal everywhere", () => {
    expect(isos(["01/01/2020", "02/02/2020"])).toEqual(["2020-01-01", "2020-02-02"]);
  });

  it("reports the ambiguous date with its line through readReturns", () => {
    expect(readIssues(withDates(["01/02/2020", "01/03/2020", "01/04/2020"]))).toEqual([
      {
        code: "ambiguous-dates",
        source: "returns.csv",
        line: 2,
        column: "Date",
        value: "01/02/2020",
        dayFirst: "2020-02-01",
        monthFirst: "2020-01-02",
      },
    ]);
  });
});

describe("explicit date formats", () => {
  it.each([
    ["DD/MM/YYYY", "03/04/2020", "2020-04-03"],
    ["MM/DD/YYYY", "03/04/2020", "2020-03-04"],
    ["DD.MM.YYYY", "31.03.2020", "2020-03-31"],
    ["D MMM YYYY", "3 Apr 2020", "2020-04-03"],
    ["D MMM YYYY", "3  april 2020", "2020-04-03"],
    ["MMM YYYY", "Sep 2020", "2020-09"],
    ["MMMM D, YYYY", "September 3, 2020", "2020-09-03"],
    ["YYYYMMDD", "20200403", "2020-04-03"],
    ["D-M-YYYY", "3-4-2020", "2020-04-03"],
  ])("%s reads %j as %j", (format, text, iso) => {
    expect(isos([text], format)).toEqual([iso]);
  });

  it("rejects dates that do not fit the layout or do not exist", () => {
    const parse = compileDateFormat("DD/MM/YYYY");
    if (typeof parse === "string") expect.fail(parse);
    expect(parse("2020-04-03")).toBeNull();
    expect(parse("31/04/2020")).toBeNull();
    expect(parse("3/4/2020")).toBeNull();
  });

  it("explains a layout without a year or month", () => {
    expect(compileDateFormat("DD/MM")).toBe('"DD/MM" has no year (YYYY)');
    expect(compileDateFormat("DD YYYY")).toBe('"DD YYYY" has no month (MM, M or MMM)');
  });

  it("reports dates not in the layout through readReturns, with the layout", () => {
    const issues = readIssues(withDates(["03/04/2020", "2020-05-01", "05/04/2020"]), { dateFormat: "DD/MM/YYYY" });
    expect(issues).toHaveLength(1);
    expect(issues[0]).toMatchObject({
      code: "bad-date",
      source: "returns.csv",
      line: 3,
      column: "Date",
      value: "2020-05-01",
      dateFormat: "DD/MM/YYYY",
    });
  });

  it("reports an invalid layout as an option problem", () => {
    expect(readIssues(withDates(["2020-01-31", "2020-02-29", "2020-03-31"]), { dateFormat: "DD/MM" })[0]).toMatchObject({
      code: "invalid-option",
      option: "dateFormat",
    });
  });
});

describe("date order", () => {
  it("sorts rows by date with the sort option, keeping each row's values and line", () => {
    const text = "Date,Low Fund,High Fund\n2020-03-31,0.03,0.3\n2020-01-31,0.01,0.1\n2020-02-29,0.02,0.2\n";
    const table = readOk(text, { sort: true });
    expect(table.dates).toEqual(["2020-01-31", "2020-02-29", "2020-03-31"]);
    expect([...(table.columns.get("Low Fund") ?? [])]).toEqual([0.01, 0.02, 0.03]);
    expect([...table.lines]).toEqual([3, 4, 2]);
  });

  it("still reports duplicate dates after sorting", () => {
    const text = "Date,Low Fund,High Fund\n2020-03-31,0.03,0.3\n2020-01-31,0.01,0.1\n2020-03-31,0.02,0.2\n";
    expect(readIssues(text, { sort: true })).toEqual([
      { code: "duplicate-date", source: "returns.csv", line: 4, column: "Date", value: "2020-03-31", firstLine: 2 },
    ]);
  });

  it("normalises compact monthly dates and detects a monthly frequency", () => {
    const table = readOk(withDates(["202001", "202002", "202003", "202004"]));
    expect(table.dates).toEqual(["2020-01", "2020-02", "2020-03", "2020-04"]);
    expect(table.frequency?.name).toBe("monthly");
  });
});

describe("plainIsoDateOfKey", () => {
  it("is the inverse of plainIsoDateKey on every real date from year 1 to 9999", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 9999 }),
        fc.integer({ min: 1, max: 12 }),
        fc.integer({ min: 1, max: 31 }),
        (year, month, day) => {
          const text = `${String(year).padStart(4, "0")}-${String(month).padStart(2, "0")}-${String(day).padStart(2, "0")}`;
          const key = plainIsoDateKey(text);
          if (!Number.isNaN(key)) expect(plainIsoDateOfKey(key)).toBe(text);
        },
      ),
      { numRuns: 5000 },
    );
    for (const text of ["0001-01-01", "1600-02-29", "1900-02-28", "2000-02-29", "2024-12-31", "9999-12-31"])
      expect(plainIsoDateOfKey(plainIsoDateKey(text))).toBe(text);
  });
});

describe("dates that name their month, read without --date-format", () => {
  // Expected keys from Date.UTC (the platform's calendar, independent of this project's code).
  const day = (y: number, m: number, d: number) => new Date(Date.UTC(y, m - 1, d)).toISOString().slice(0, 10);
  it.each([
    ["Jan 1 2000", day(2000, 1, 1)],
    ["January 1, 2000", day(2000, 1, 1)],
    ["Sep 30 2021", day(2021, 9, 30)],
    ["Sept. 30 2021", day(2021, 9, 30)],
    ["1 Jan 2000", day(2000, 1, 1)],
    ["31 December 1999", day(1999, 12, 31)],
    ["01-Feb-2000", day(2000, 2, 1)],
    ["2000-Mar-05", day(2000, 3, 5)],
    ["dec 7 2001", day(2001, 12, 7)],
  ])("%s is %s", (text, iso) => {
    expect(isos([text])).toEqual([iso]);
  });

  it("a month and year alone are a monthly date", () => {
    expect(isos(["Jan 2000", "Feb-2000"])).toEqual(["2000-01", "2000-02"]);
  });

  it("a named date that does not exist says why, and a word that names no month says so", () => {
    const column = readDateColumn(["Feb 30 2001"]);
    if (column.kind !== "dates") expect.fail(JSON.stringify(column));
    expect(column.keys[0]).toBeNaN();
    expect(column.explain("Feb 30 2001")?.problem).toEqual({ kind: "short-month", year: 2001, month: 2, days: 28 });
    expect(column.explain("Foo 3 2001")?.problem).toEqual({ kind: "no-month-name", name: "Foo" });
  });

  it("a file whose dates name their month is read, its first column taken as the dates", () => {
    const table = readOk(withDates(["Jan 3 2000", "Jan 4 2000", "Jan 5 2000", "Jan 6 2000"]));
    expect(table.dates).toEqual(["2000-01-03", "2000-01-04", "2000-01-05", "2000-01-06"]);
  });
});

describe("the date column, when --date is not given", () => {
  it("in the long layout: the column named like a date, not the id column that comes first", () => {
    const text = [
      "symbol,date,value",
      ...["2000-01-03", "2000-01-04", "2000-01-05"].flatMap((d, i) => [`AAA,${d},0.0${i + 1}`, `BBB,${d},0.0${3 - i}`]),
    ].join("\n");
    const table = readOk(text, { idColumn: "symbol", valueColumn: "value", columns: ["AAA", "BBB"] });
    expect(table.dateColumn).toBe("date");
    expect(table.dates).toEqual(["2000-01-03", "2000-01-04", "2000-01-05"]);
  });

  it("in the wide layout: a dated column named like a date wherever it stands, else the first dated column", () => {
    const named = [
      "Fund Code,As Of,Low Fund,High Fund",
      "X1,2000-01-31,0.01,0.02",
      "X1,2000-02-29,0.02,0.01",
      "X1,2000-03-31,0.03,0.04",
    ].join("\n");
    expect(readOk(named, { columns: ["Low Fund", "High Fund"] }).dateColumn).toBe("As Of");
    const unnamed = [
      "Fund Code,Stamp,Low Fund,High Fund",
      "X1,2000-01-31,0.01,0.02",
      "X1,2000-02-29,0.02,0.01",
      "X1,2000-03-31,0.03,0.04",
    ].join("\n");
    expect(readOk(unnamed, { columns: ["Low Fund", "High Fund"] }).dateColumn).toBe("Stamp");
  });

  it("keeps the first column when it holds dates, and a column named like a date but holding none is passed over", () => {
    const text = [
      "When,Update Date,Low Fund,High Fund",
      "2000-01-31,n/a,0.01,0.02",
      "2000-02-29,n/a,0.02,0.01",
      "2000-03-31,n/a,0.03,0.04",
    ].join("\n");
    expect(readOk(text, { columns: ["Low Fund", "High Fund"] }).dateColumn).toBe("When");
  });

  it("--date still decides", () => {
    const text = [
      "A,B,Low Fund,High Fund",
      "2000-01-31,2001-01-31,0.01,0.02",
      "2000-02-29,2001-02-28,0.02,0.01",
      "2000-03-31,2001-03-31,0.03,0.04",
    ].join("\n");
    expect(readOk(text, { columns: ["Low Fund", "High Fund"], dateColumn: "B" }).dates).toEqual(["2001-01-31", "2001-02-28", "2001-03-31"]);
  });
});
