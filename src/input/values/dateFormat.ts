/**
 * Explicit date layouts such as "DD/MM/YYYY", "MM/DD/YYYY", "DD.MM.YYYY", "D MMM YYYY" or "MMM YYYY".
 * Tokens: YYYY (4-digit year), MM / M (month, 2 digits / 1-2 digits), DD / D (day), MMM (English
 * month name or 3-letter abbreviation, any case), MMMM (same). Everything else is literal text;
 * a space in the layout matches one or more spaces. A layout without a day gives monthly dates "YYYY-MM".
 */
import { calendarDateOrProblem, dateOnly, type DateOrProblem, type ParsedDate } from "./dates.js";

/** The English month names, January first (lower case). */
export const MONTH_NAMES = [
  "january",
  "february",
  "march",
  "april",
  "may",
  "june",
  "july",
  "august",
  "september",
  "october",
  "november",
  "december",
];

type Part = "year" | "month" | "monthName" | "day";

const TOKENS: readonly (readonly [string, Part, string])[] = [
  ["YYYY", "year", "(\\d{4})"],
  ["MMMM", "monthName", "([A-Za-z]{3,9}\\.?)"],
  ["MMM", "monthName", "([A-Za-z]{3,9}\\.?)"],
  ["MM", "month", "(\\d{2})"],
  ["M", "month", "(\\d{1,2})"],
  ["DD", "day", "(\\d{2})"],
  ["D", "day", "(\\d{1,2})"],
];

/** A compiled layout: returns the parsed date, or null when the text does not fit it. */
export type DateParser = (text: string) => ParsedDate | null;

/** A compiled layout that tells why a text that fits it is no date: null when the text does not fit it. */
export type DateReader = (text: string) => DateOrProblem | null;

function monthFromName(name: string): number | null {
  const n = name.toLowerCase().replace(/\.$/, "");
  if (n.length < 3) return null;
  const index = MONTH_NAMES.findIndex((full) => full === n || (n.length <= 4 && full.startsWith(n)));
  return index < 0 ? null : index + 1;
}

/**
 * Compile a layout. Returns a string explaining the problem when the layout lacks a year or a
 * month or repeats a token.
 */
export function compileDateFormat(format: string): DateParser | string {
  const reader = compileDateReader(format);
  return typeof reader === "string" ? reader : (text) => dateOnly(reader(text));
}

/** `compileDateFormat`, whose parser tells why a text that fits the layout is no date. */
export function compileDateReader(format: string): DateReader | string {
  const parts: Part[] = [];
  let pattern = "";
  let i = 0;
  while (i < format.length) {
    const token = TOKENS.find(([name]) => format.startsWith(name, i));
    if (token) {
      const [name, part, regex] = token;
      const kind = part === "monthName" ? "month" : part;
      if (parts.some((p) => (p === "monthName" ? "month" : p) === kind)) return `the ${kind} appears twice in "${format}"`;
      parts.push(part);
      pattern += regex;
      i += name.length;
    } else {
      const char = format[i] as string;
      pattern += char === " " ? " +" : char.replace(/[.*+?^${}()|[\]\\/]/g, "\\$&");
      i++;
    }
  }
  if (!parts.includes("year")) return `"${format}" has no year (YYYY)`;
  if (!parts.includes("month") && !parts.includes("monthName")) return `"${format}" has no month (MM, M or MMM)`;
  const regex = new RegExp(`^${pattern}$`);
  return (text) => {
    const m = regex.exec(text.trim());
    if (!m) return null;
    let year = 0;
    let month: number | null = 0;
    let name = "";
    let day: number | undefined;
    parts.forEach((part, k) => {
      const value = m[k + 1] as string;
      if (part === "year") year = Number(value);
      else if (part === "month") month = Number(value);
      else if (part === "monthName") {
        month = monthFromName(value);
        name = value;
      } else day = Number(value);
    });
    return month === null ? { kind: "no-month-name", name } : calendarDateOrProblem(year, month, day);
  };
}

/**
 * Layouts with an English month name, read without --date-format: the name makes the order of the
 * parts plain ("Jan 1 2000", "January 1, 2000", "1 Jan 2000", "01-Jan-2000", "2000-Jan-01",
 * "Jan 2000" and "Jan-2000" for monthly dates).
 */
export const monthNameLayouts = ["MMM D YYYY", "MMM D, YYYY", "D MMM YYYY", "D-MMM-YYYY", "YYYY-MMM-D", "MMM YYYY", "MMM-YYYY"] as const;

const monthNameReaders = monthNameLayouts.map((layout) => compileDateReader(layout) as DateReader);

/** A date in one of `monthNameLayouts`, or why a text of that shape is no date; null when it fits none. */
export function readMonthNameDate(text: string): DateOrProblem | null {
  // A quick refusal: every layout holds a letter.
  if (!/[A-Za-z]/.test(text)) return null;
  for (const read of monthNameReaders) {
    const result = read(text);
    if (result !== null) return result;
  }
  return null;
}

/** `readMonthNameDate` as a date, or null. */
export function parseMonthNameDate(text: string): ParsedDate | null {
  return dateOnly(readMonthNameDate(text));
}
