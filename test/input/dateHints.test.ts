/**
 * What a date that cannot be read suggests from its own text: every layout suggested is checked with
 * the layout parser itself (it reads the value, as the date said), the date without --date-format with
 * the column reader, and a layout the value fits without being a date with that layout's reader.
 */
import { describe, expect, it } from "vitest";
import { SIMILAR_SHOWN } from "../../src/input/issueList.js";
import { describeDateProblem, describeInputIssue, type InputIssue, UNFORMATTED_EXAMPLES } from "../../src/input/issues.js";
import type { DateHint } from "../../src/input/issueTypes.js";
import { dateHint } from "../../src/input/suggest.js";
import { readDateColumn } from "../../src/input/values/dateColumn.js";
import { compileDateFormat, compileDateReader } from "../../src/input/values/dateFormat.js";
import { readIssues } from "./helpers.js";

/** The ISO text of a calendar day, from Date (independent of the reader). */
const isoOf = (year: number, month: number, day?: number): string => {
  const date = new Date(Date.UTC(year, month - 1, day ?? 1)).toISOString();
  return day === undefined ? date.slice(0, 7) : date.slice(0, 10);
};

/** Texts of dates and not-dates, with the day each means when it means one. */
const CATALOGUE: readonly (readonly [string, string | null])[] = [
  ["2000-01-31", isoOf(2000, 1, 31)],
  ["20000131", isoOf(2000, 1, 31)],
  ["200001", isoOf(2000, 1)],
  ["2000-01", isoOf(2000, 1)],
  ["31.01.2000", isoOf(2000, 1, 31)],
  ["1.2.2000", isoOf(2000, 2, 1)],
  ["01/31/2000", isoOf(2000, 1, 31)],
  ["31/01/2000", isoOf(2000, 1, 31)],
  ["31-01-2000", isoOf(2000, 1, 31)],
  ["31012000", isoOf(2000, 1, 31)],
  ["01.2000", isoOf(2000, 1)],
  ["Jan 1 2000", isoOf(2000, 1, 1)],
  ["1 Jan 2000", isoOf(2000, 1, 1)],
  ["2000-Jan-01", isoOf(2000, 1, 1)],
  ["January 1, 2000", isoOf(2000, 1, 1)],
  ["1. Jan. 2000", isoOf(2000, 1, 1)],
  ["2000 01 31", isoOf(2000, 1, 31)],
  ["2000-01-01 09:30", null],
  ["31.01.2000 09:30", null],
  ["36526", null],
  ["garbage", null],
  ["n/a", null],
  ["31.01.00", null],
  ["32.01.2000", null],
  ["31.02.2000", null],
  ["Foo 1 2000", null],
  ["2000-13-45", null],
];

/** The layouts given with --date-format in the catalogue's runs (none: automatic). */
const FORMATS = [undefined, "DD.MM.YYYY", "MM/DD/YYYY", "YYYY-MM-DD", "D MMM YYYY", "YYYYMM"] as const;

/** Layouts named by the brief's users; a value one of them reads must get a suggestion. */
const COMMON_LAYOUTS = [
  "DD.MM.YYYY",
  "DD/MM/YYYY",
  "MM/DD/YYYY",
  "DD-MM-YYYY",
  "YYYYMMDD",
  "YYYY-MM",
  "MM.YYYY",
  "MMM D YYYY",
  "D MMM YYYY",
];

/** The date a layout's parser makes of a text, or null. */
const parsedIn = (layout: string, text: string): string | null => {
  const parse = compileDateFormat(layout);
  if (typeof parse === "string") return expect.fail(`suggested layout ${layout} does not compile: ${parse}`);
  return parse(text)?.iso ?? null;
};

/** The date the reader makes of a text without --date-format, or null. */
const unformatted = (text: string): string | null => {
  const column = readDateColumn([text]);
  return column.kind === "dates" && !Number.isNaN(column.keys[0]) ? (column.isos[0] as string) : null;
};

/** The bad-date issue of a value on line 3 of a small file read with `dateFormat`; null when the value is read. */
function badDateOf(value: string, dateFormat?: string): Extract<InputIssue, { code: "bad-date" }> | null {
  const column = readDateColumn([value], dateFormat);
  if (column.kind !== "dates" || !Number.isNaN(column.keys[0])) return null;
  const text = `Date;A;B\n${value};0.01;0.02\n`;
  const issues = readIssues(text, { columns: ["A", "B"], ...(dateFormat === undefined ? {} : { dateFormat }) });
  const issue = issues.find((i) => i.code === "bad-date");
  if (issue?.code !== "bad-date") return expect.fail(`no bad-date for ${value}: ${JSON.stringify(issues)}`);
  expect(issue).toMatchObject({ line: 2, column: "Date", value });
  return issue;
}

/** The text before a trailing time of day (the whole text when there is none). */
const withoutTime = (text: string): string => text.replace(/[ T]\d{2}:\d{2}$/, "");

/** Every claim of a hint, checked with the parsers. */
function checkHint(value: string, dateFormat: string | undefined, hint: DateHint): void {
  for (const { layout, iso } of hint.layouts) {
    expect(layout).not.toBe(dateFormat);
    expect(parsedIn(layout, value)).toBe(iso);
  }
  // A date with a time of day: the layouts read the value with its time cut off.
  for (const { layout, iso } of hint.withoutTime ?? []) expect(parsedIn(layout, withoutTime(value))).toBe(iso);
  if (hint.unformatted !== undefined) expect(unformatted(value)).toBe(hint.unformatted);
  if (hint.nearly !== undefined) {
    const reader = compileDateReader(hint.nearly.layout);
    if (typeof reader === "string") expect.fail(reader);
    expect(reader(value)).toEqual(hint.nearly.problem);
  }
}

describe("the hint for a date that cannot be read", () => {
  const runs = CATALOGUE.flatMap(([value, meant]) => FORMATS.map((format) => [value, meant, format] as const));

  it.each(runs)("%j (%s) with --date-format %s: what it suggests reads it", (value, meant, dateFormat) => {
    const issue = badDateOf(value, dateFormat);
    if (issue === null) return;
    const { hint } = issue;
    if (hint !== undefined) checkHint(value, dateFormat, hint);
    const readers = COMMON_LAYOUTS.filter((layout) => layout !== dateFormat && parsedIn(layout, value) !== null);
    // Some other layout reads it, or it reads without --date-format: the hint says so.
    if (issue.problem === undefined && (readers.length > 0 || (dateFormat !== undefined && unformatted(value) !== null))) {
      expect((hint?.layouts.length ?? 0) + (hint?.unformatted === undefined ? 0 : 1)).toBeGreaterThan(0);
    }
    // The day the value means is among the readings suggested.
    if (meant !== null && issue.problem === undefined) {
      expect([...(hint?.layouts.map((l) => l.iso) ?? []), hint?.unformatted]).toContain(meant);
    }
    // The message names each suggested layout with the date it gives, and every layout it names reads the value so.
    const message = describeInputIssue(issue);
    for (const { layout, iso } of hint?.layouts ?? [])
      expect(message).toContain(`${layout.includes(" ") ? JSON.stringify(layout) : layout} (${iso})`);
    for (const [, layout, iso] of message.matchAll(/(?:with --date-format | or )("[^"]+"|[^\s()]+) \(([^)]+)\)/g)) {
      const named = (layout as string).startsWith('"') ? (JSON.parse(layout as string) as string) : (layout as string);
      expect(parsedIn(named, hint?.withoutTime === undefined ? value : withoutTime(value))).toBe(iso);
    }
    const fitted = /it has the layout (\S+), but/.exec(message);
    if (fitted) expect(fitted[1]).toBe(hint?.nearly?.layout);
    expect(message).not.toContain("e.g. DD.MM.YYYY");
  });

  it("suggests the layouts of a day-month date both ways, with the date each gives", () => {
    const hint = dateHint("01.02.2000", undefined, false);
    expect(hint?.layouts.map((l) => l.layout).sort()).toEqual(["DD.MM.YYYY", "MM.DD.YYYY"]);
    for (const { layout, iso } of hint?.layouts ?? []) expect(parsedIn(layout, "01.02.2000")).toBe(iso);
  });

  it("says a month-name date reads without --date-format when another layout was given (the reported case)", () => {
    const issue = badDateOf("Jan 1 2000", "DD.MM.YYYY");
    expect(issue?.hint?.unformatted).toBe(isoOf(2000, 1, 1));
    const message = describeInputIssue(issue as InputIssue);
    expect(message).toContain(`without --date-format (${isoOf(2000, 1, 1)})`);
    expect(message.split("in the layout DD.MM.YYYY")[1]).not.toContain("DD.MM.YYYY");
  });

  it("says which part is out of range when the value fits a layout but is no date in it", () => {
    for (const value of ["32.01.2000", "31.02.2000"]) {
      const issue = badDateOf(value);
      const nearly = issue?.hint?.nearly ?? expect.fail(`no layout fitted ${value}`);
      expect(["no-day", "short-month"]).toContain(nearly.problem.kind);
      expect(describeInputIssue(issue as InputIssue)).toContain(
        `it has the layout ${nearly.layout}, but ${describeDateProblem(nearly.problem)}`,
      );
    }
  });

  it("offers another layout beside the problem when the one given does not fit the value", () => {
    const issue = badDateOf("12/31/2000", "DD/MM/YYYY");
    expect(issue?.problem).toEqual({ kind: "no-month", month: 31 });
    expect(issue?.hint?.layouts.map((l) => [l.layout, parsedIn(l.layout, "12/31/2000")])).toEqual([["MM/DD/YYYY", isoOf(2000, 12, 31)]]);
  });

  it("reads the date of a date-time in a layout, and says layouts have no time", () => {
    const issue = badDateOf("31.01.2000 09:30", "DD/MM/YYYY");
    const layouts = issue?.hint?.withoutTime ?? expect.fail("no layout for the date part");
    expect(layouts.map((l) => parsedIn(l.layout, "31.01.2000"))).toContain(isoOf(2000, 1, 31));
    const message = describeInputIssue(issue as InputIssue);
    expect(message).toContain("layouts have no time of day");
    const example = /written like (\S+)$/.exec(message)?.[1] ?? expect.fail(message);
    expect(unformatted(example)).not.toBeNull();
  });

  it("names a spreadsheet serial number for what it is", () => {
    const issue = badDateOf("36526");
    expect(issue?.hint).toEqual({ layouts: [], serial: true });
    expect(describeInputIssue(issue as InputIssue)).toContain("spreadsheet's serial day number");
  });

  it("says plainly that nothing reads a value of no date's shape, listing forms that do read", () => {
    for (const value of ["garbage", "n/a", "31.01.00"]) {
      const issue = badDateOf(value);
      expect(issue?.hint).toBeUndefined();
      expect(describeInputIssue(issue as InputIssue)).toContain("is not a date in any layout");
    }
    for (const example of UNFORMATTED_EXAMPLES) expect(unformatted(example), example).not.toBeNull();
  });

  it("gives a hint to every bad date the issue list shows in full", () => {
    const dates = Array.from({ length: 12 }, (_, k) => `${String(k + 1).padStart(2, "0")}.01.2000`);
    const issues = readIssues(`Date,A,B\n${dates.map((d) => `${d},0.01,0.02`).join("\n")}\n`, { columns: ["A", "B"] });
    const shown = issues.filter((i) => i.code === "bad-date");
    expect(shown).toHaveLength(SIMILAR_SHOWN);
    for (const issue of shown) expect(issue.code === "bad-date" && issue.hint?.layouts.length).toBeGreaterThan(0);
    expect(issues.find((i) => i.code === "similar-issues")).toMatchObject({ like: "bad-date", omitted: dates.length - SIMILAR_SHOWN });
  });
});
