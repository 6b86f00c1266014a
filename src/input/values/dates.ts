/**
 * Date parsing. Every accepted date becomes an ISO 8601 string at the precision it was written
 * ("2020-03-31", "2020-03", "2020", "2020-03-31T09:30:00Z") and a sort key: milliseconds since
 * 1970-01-01 UTC at the start of the period (date-times with an offset are converted to UTC).
 */
import { DAY_MS } from "../../core/calendar.js";

/** One parsed date: normalised ISO text and its sort key. */
export interface ParsedDate {
  readonly iso: string;
  readonly key: number;
}

const ISO = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(\.\d{1,9})?)?(Z|[+-]\d{2}:?\d{2})?)?$/;
const COMPACT = /^(\d{4})(\d{2})(\d{2})?$/;
const YEAR_MONTH = /^(\d{4})[-/](\d{2})$/;
const YEAR_FIRST_SLASH = /^(\d{4})\/(\d{1,2})\/(\d{1,2})$/;
const YEAR = /^(\d{4})$/;
const SLASH = /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/;

const MONTH_DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Days from 1970-01-01 to a proleptic Gregorian date (H. Hinnant's days_from_civil). */
function daysFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const doy = Math.floor((153 * (month + (month > 2 ? -3 : 9)) + 2) / 5) + day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

const pad = (n: number, width = 2): string => String(n).padStart(width, "0");

const isLeap = (year: number): boolean => year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
export const daysInMonth = (year: number, month: number): number =>
  (MONTH_DAYS[month - 1] as number) + (month === 2 && isLeap(year) ? 1 : 0);
export { DAY_MS };

/**
 * Why numeric date parts are not a calendar date (worded in issues.ts): no year 0, no month outside
 * 1 to 12, no day outside 1 to 31, a day past the month's end, an hour, minute or second out of range,
 * a UTC offset out of range, or a word that names no month.
 */
export type DateProblem =
  | { readonly kind: "no-year" }
  | { readonly kind: "no-month"; readonly month: number }
  | { readonly kind: "no-day"; readonly day: number }
  | { readonly kind: "short-month"; readonly year: number; readonly month: number; readonly days: number }
  | { readonly kind: "no-time"; readonly part: "hour" | "minute" | "second"; readonly value: number }
  | { readonly kind: "no-offset"; readonly offset: string }
  | { readonly kind: "no-month-name"; readonly name: string };

/** A date, or why the text that fitted a layout is not one. */
export type DateOrProblem = ParsedDate | DateProblem;

/** The date when `read` is one, else null. */
export const dateOnly = (read: DateOrProblem | null): ParsedDate | null => (read === null || "kind" in read ? null : read);

/** Why year, month and (optional) day are not a calendar date, or null when they are one. */
export function calendarProblem(year: number, month: number, day?: number): DateProblem | null {
  if (year < 1) return { kind: "no-year" };
  if (month < 1 || month > 12) return { kind: "no-month", month };
  if (day === undefined) return null;
  if (day < 1 || day > 31) return { kind: "no-day", day };
  const days = daysInMonth(year, month);
  return day > days ? { kind: "short-month", year, month, days } : null;
}

/** A calendar date from numeric parts, or why it does not exist (e.g. 2021-02-29). */
export function calendarDateOrProblem(year: number, month: number, day?: number): DateOrProblem {
  const problem = calendarProblem(year, month, day);
  if (problem !== null) return problem;
  if (day === undefined) return { iso: `${pad(year, 4)}-${pad(month)}`, key: daysFromCivil(year, month, 1) * DAY_MS };
  return { iso: `${pad(year, 4)}-${pad(month)}-${pad(day)}`, key: daysFromCivil(year, month, day) * DAY_MS };
}

/** A calendar date from numeric parts, or null when it does not exist (e.g. 2021-02-29). */
export const calendarDate = (year: number, month: number, day?: number): ParsedDate | null =>
  dateOnly(calendarDateOrProblem(year, month, day));

function isoDateTime(m: RegExpExecArray): DateOrProblem {
  const date = calendarDateOrProblem(Number(m[1]), Number(m[2]), Number(m[3]));
  if ("kind" in date || m[4] === undefined) return date;
  const hour = Number(m[4]);
  const minute = Number(m[5]);
  const second = m[6] === undefined ? 0 : Number(m[6]);
  if (hour > 23) return { kind: "no-time", part: "hour", value: hour };
  if (minute > 59) return { kind: "no-time", part: "minute", value: minute };
  if (second > 59) return { kind: "no-time", part: "second", value: second };
  const fraction = m[7] ?? "";
  const zone = m[8] ?? "";
  let offsetMinutes = 0;
  if (zone !== "" && zone !== "Z") {
    const digits = zone.replace(":", "");
    const sign = digits.startsWith("-") ? -1 : 1;
    const hours = Number(digits.slice(1, 3));
    const minutes = Number(digits.slice(3, 5));
    if (hours > 23 || minutes > 59) return { kind: "no-offset", offset: zone };
    offsetMinutes = sign * (hours * 60 + minutes);
  }
  const normalisedZone = zone === "" || zone === "Z" ? zone : `${zone.slice(0, 3)}:${zone.replace(":", "").slice(3, 5)}`;
  const ms = fraction === "" ? 0 : Math.round(Number(`0${fraction}`) * 1000);
  const key = date.key + ((hour * 60 + minute - offsetMinutes) * 60 + second) * 1000 + ms;
  return { iso: `${date.iso}T${pad(hour)}:${pad(minute)}:${pad(second)}${fraction}${normalisedZone}`, key };
}

const digitAt = (text: string, i: number): number => {
  const d = text.charCodeAt(i) - 48;
  return d >= 0 && d <= 9 ? d : Number.NaN;
};

/** Sort key of a text that is exactly a real "YYYY-MM-DD" date (already normalised); NaN otherwise. */
export function plainIsoDateKey(text: string): number {
  if (text.length !== 10 || text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45) return Number.NaN;
  const year = digitAt(text, 0) * 1000 + digitAt(text, 1) * 100 + digitAt(text, 2) * 10 + digitAt(text, 3);
  const month = digitAt(text, 5) * 10 + digitAt(text, 6);
  const day = digitAt(text, 8) * 10 + digitAt(text, 9);
  return plainDateKey(year, month, day);
}

/**
 * The key `plainIsoDateKey` gives for year, month and day read from "YYYY-MM-DD" (NaN digits give
 * NaN): NaN unless it is a real date from year 1.
 */
export function plainDateKey(year: number, month: number, day: number): number {
  if (!(year >= 1 && month >= 1 && month <= 12 && day >= 1 && day <= daysInMonth(year, month))) return Number.NaN;
  return daysFromCivil(year, month, day) * DAY_MS;
}

const TWO_DIGITS = Array.from({ length: 100 }, (_, n) => pad(n));

/** Year, month and day (written to out[0], out[1], out[2]) of the day `day` days after 1970-01-01 (H. Hinnant's civil_from_days). */
export function civilOfDay(day: number, out: Int32Array): void {
  const z = day + 719468;
  const era = Math.floor(z / 146097);
  const doe = z - era * 146097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36524) - Math.floor(doe / 146096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const month = mp < 10 ? mp + 3 : mp - 9;
  out[0] = yoe + era * 400 + (month <= 2 ? 1 : 0);
  out[1] = month;
  out[2] = doy - Math.floor((153 * mp + 2) / 5) + 1;
}

/** civilOfDay's output, reused (no array per date). */
const civil = new Int32Array(3);

/**
 * The "YYYY-MM-DD" text of a key given by `plainIsoDateKey` (years 1 to 9999): the inverse of
 * that function (H. Hinnant's civil_from_days).
 */
export function plainIsoDateOfKey(key: number): string {
  civilOfDay(Math.floor(key / DAY_MS), civil);
  const year = civil[0] as number;
  const month = civil[1] as number;
  const day = civil[2] as number;
  return `${TWO_DIGITS[Math.floor(year / 100)] as string}${TWO_DIGITS[year % 100] as string}-${TWO_DIGITS[month] as string}-${TWO_DIGITS[day] as string}`;
}

/**
 * Parse an unambiguous date: ISO 8601 date or date-time, YYYYMMDD, YYYYMM, YYYY-MM, YYYY/MM,
 * YYYY/MM/DD or YYYY. Returns null for anything else (including day-month slash dates).
 */
export function parseUnambiguousDate(text: string): ParsedDate | null {
  const quick = plainIsoDateKey(text);
  if (!Number.isNaN(quick)) return { iso: text, key: quick };
  return dateOnly(readUnambiguousDate(text));
}

/**
 * `parseUnambiguousDate`, telling why when the text fits one of its layouts but is no date (e.g.
 * "2021-02-30", "20211301"); null when it fits none.
 */
export function readUnambiguousDate(text: string): DateOrProblem | null {
  const t = text.trim();
  let m = ISO.exec(t);
  if (m) return isoDateTime(m);
  m = COMPACT.exec(t);
  if (m) return calendarDateOrProblem(Number(m[1]), Number(m[2]), m[3] === undefined ? undefined : Number(m[3]));
  m = YEAR_MONTH.exec(t);
  if (m) return calendarDateOrProblem(Number(m[1]), Number(m[2]));
  m = YEAR_FIRST_SLASH.exec(t);
  if (m) return calendarDateOrProblem(Number(m[1]), Number(m[2]), Number(m[3]));
  m = YEAR.exec(t);
  if (m) return Number(m[1]) < 1 ? { kind: "no-year" } : { iso: t, key: daysFromCivil(Number(m[1]), 1, 1) * DAY_MS };
  return null;
}

/** The two readings of a slash date such as 03/04/2020 (null where a reading is not a real date). */
export interface SlashReadings {
  readonly dayFirst: ParsedDate | null;
  readonly monthFirst: ParsedDate | null;
}

/** Read "A/B/YYYY" both ways; undefined when the text is not of that shape. */
export function slashReadings(text: string): SlashReadings | undefined {
  const m = SLASH.exec(text.trim());
  if (!m) return undefined;
  const a = Number(m[1]);
  const b = Number(m[2]);
  const year = Number(m[3]);
  return { dayFirst: calendarDate(year, b, a), monthFirst: calendarDate(year, a, b) };
}

/** Why the slash date "A/B/YYYY" read day first (or month first) is no date; null when it is one or not of that shape. */
export function slashProblem(text: string, dayFirst: boolean): DateProblem | null {
  const m = SLASH.exec(text.trim());
  if (!m) return null;
  const [a, b] = [Number(m[1]), Number(m[2])];
  return dayFirst ? calendarProblem(Number(m[3]), b, a) : calendarProblem(Number(m[3]), a, b);
}
