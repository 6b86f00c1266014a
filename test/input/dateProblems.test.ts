/**
 * Why a date is no date: the calendar facts behind each refusal are those of the proleptic Gregorian
 * calendar (leap years divisible by 4, except centuries not divisible by 400), checked here against
 * JavaScript's own Date, an independent implementation of the same calendar.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { readDateColumn } from "../../src/input/values/dateColumn.js";
import { compileDateReader } from "../../src/input/values/dateFormat.js";
import { calendarProblem, readUnambiguousDate, slashProblem } from "../../src/input/values/dates.js";
import { readIssues } from "./helpers.js";

/** The number of days in a month, from Date: day 0 of the next month is the last day of this one. */
const daysFromDate = (year: number, month: number): number => new Date(Date.UTC(year, month, 0)).getUTCDate();

describe("calendarProblem", () => {
  it("agrees with Date on which days exist, and says how long the month is when one does not", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 9999 }),
        fc.integer({ min: 1, max: 12 }),
        fc.integer({ min: 1, max: 31 }),
        (year, month, day) => {
          const days = daysFromDate(year, month);
          expect(calendarProblem(year, month, day)).toEqual(day <= days ? null : { kind: "short-month", year, month, days });
        },
      ),
      { numRuns: 2000, seed: 7 },
    );
  });

  it("names a month, day or year that no calendar has", () => {
    expect(calendarProblem(2021, 13, 1)).toEqual({ kind: "no-month", month: 13 });
    expect(calendarProblem(2021, 0)).toEqual({ kind: "no-month", month: 0 });
    expect(calendarProblem(2021, 3, 0)).toEqual({ kind: "no-day", day: 0 });
    expect(calendarProblem(2021, 3, 32)).toEqual({ kind: "no-day", day: 32 });
    expect(calendarProblem(0, 1, 1)).toEqual({ kind: "no-year" });
    // 2000 is a leap year (divisible by 400), 1900 is not (a century not divisible by 400).
    expect(calendarProblem(2000, 2, 29)).toBeNull();
    expect(calendarProblem(1900, 2, 29)).toEqual({ kind: "short-month", year: 1900, month: 2, days: 28 });
  });
});

describe("the reasons of each layout", () => {
  it.each([
    ["2021-02-30", { kind: "short-month", year: 2021, month: 2, days: 28 }],
    ["2021-13-01", { kind: "no-month", month: 13 }],
    ["20210231", { kind: "short-month", year: 2021, month: 2, days: 28 }],
    ["202113", { kind: "no-month", month: 13 }],
    ["2021/04/31", { kind: "short-month", year: 2021, month: 4, days: 30 }],
    ["0000", { kind: "no-year" }],
    ["2021-03-31T24:00", { kind: "no-time", part: "hour", value: 24 }],
    ["2021-03-31T09:60", { kind: "no-time", part: "minute", value: 60 }],
    ["2021-03-31T09:30:00+25:00", { kind: "no-offset", offset: "+25:00" }],
  ])("%j: %j", (text, problem) => {
    expect(readUnambiguousDate(text)).toEqual(problem);
  });

  it("gives no reason for a text that fits no layout", () => {
    expect(readUnambiguousDate("someday")).toBeNull();
    expect(readUnambiguousDate("2021-2-3")).toBeNull();
  });

  it("explains a slash date in the reading asked for", () => {
    expect(slashProblem("30/02/2021", true)).toEqual({ kind: "short-month", year: 2021, month: 2, days: 28 });
    expect(slashProblem("30/02/2021", false)).toEqual({ kind: "no-month", month: 30 });
    expect(slashProblem("28/02/2021", true)).toBeNull();
  });

  it("explains a date in an explicit layout", () => {
    const reader = compileDateReader("DD.MM.YYYY");
    if (typeof reader === "string") expect.fail(reader);
    expect(reader("31.04.2021")).toEqual({ kind: "short-month", year: 2021, month: 4, days: 30 });
    expect(reader("31/04/2021")).toBeNull();
    const named = compileDateReader("D MMM YYYY");
    if (typeof named === "string") expect.fail(named);
    expect(named("3 Foo 2021")).toEqual({ kind: "no-month-name", name: "Foo" });
    expect(named("31 Sep 2021")).toEqual({ kind: "short-month", year: 2021, month: 9, days: 30 });
  });

  it("explains the slash dates of a column in the reading the column settled on", () => {
    const column = readDateColumn(["29/01/2021", "30/02/2021", "31/03/2021"]);
    if (column.kind !== "dates") expect.fail(column.kind);
    expect(Number.isNaN(column.keys[1])).toBe(true);
    expect(column.explain("30/02/2021")).toEqual({
      problem: { kind: "short-month", year: 2021, month: 2, days: 28 },
      reading: "day first",
    });
  });

  it("names no reading when no slash date of the column settled one", () => {
    const column = readDateColumn(["2021-01-29", "30/02/2021", "2021-03-31"]);
    if (column.kind !== "dates") expect.fail(column.kind);
    expect(column.explain("30/02/2021")).toEqual({ problem: { kind: "short-month", year: 2021, month: 2, days: 28 } });
  });
});

describe("bad dates read from a file", () => {
  const file = (dates: string[], delimiter = ","): string =>
    [`Date${delimiter}Low Fund${delimiter}High Fund`, ...dates.map((d) => [d, "0.01", "0.02"].join(delimiter))].join("\n");

  it.each([
    [["2021-01-29", "2021-02-30", "2021-03-31"], {}, { kind: "short-month", year: 2021, month: 2, days: 28 }, undefined],
    [["2021-01-29", "2021-13-01", "2021-03-31"], {}, { kind: "no-month", month: 13 }, undefined],
    [["20210129", "20210231", "20210331"], {}, { kind: "short-month", year: 2021, month: 2, days: 28 }, undefined],
    [
      ["29.01.2021", "31.04.2021", "31.05.2021"],
      { dateFormat: "DD.MM.YYYY" },
      { kind: "short-month", year: 2021, month: 4, days: 30 },
      undefined,
    ],
    [["29/01/2021", "30/02/2021", "31/03/2021"], {}, { kind: "short-month", year: 2021, month: 2, days: 28 }, "day first"],
  ])("%j names the date and why", (dates, options, problem, reading) => {
    const [issue] = readIssues(file(dates), options);
    expect(issue).toMatchObject({ code: "bad-date", line: 3, column: "Date", value: dates[1], problem });
    expect(issue && "reading" in issue ? issue.reading : undefined).toBe(reading);
  });
});
