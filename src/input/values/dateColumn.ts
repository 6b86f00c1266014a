/**
 * Reading a whole date column. Without an explicit layout each date must be unambiguous (see
 * `parseUnambiguousDate`), name its month (`monthNameLayouts`: "Jan 1 2000", "1 Jan 2000",
 * "2000-Jan-01", ...) or be a slash date A/B/YYYY. Slash dates are read day-first or month-first
 * for the whole column: the reading under which every slash date is a real calendar date wins;
 * when both readings work and they differ for some date, the column is ambiguous.
 */
import type { DateHint } from "../issueTypes.js";
import { SIMILAR_SHOWN } from "../issueList.js";
import { dateHint } from "../suggest.js";
import { compileDateReader, parseMonthNameDate, readMonthNameDate } from "./dateFormat.js";
import {
  dateOnly,
  parseUnambiguousDate,
  plainIsoDateKey,
  readUnambiguousDate,
  slashProblem,
  slashReadings,
  type DateProblem,
  type ParsedDate,
  type SlashReadings,
} from "./dates.js";

/**
 * Why a text of the column that could not be read is no date, when it fits a layout (see
 * `DateProblem`), and what the text itself suggests (see `dateHint`).
 */
export interface DateExplanation {
  readonly problem?: DateProblem;
  /** How the column's slash dates were read, when this is one. */
  readonly reading?: "day first" | "month first";
  readonly hint?: DateHint;
}

/**
 * Texts given a hint per column: the issue list shows only the first few of a kind in full, and a
 * column of unreadable dates is then explained in bounded time.
 */
const HINTED = SIMILAR_SHOWN;

/** `explain` with the hint of each of the first `HINTED` texts it is asked about. */
function withHints(explain: (text: string) => DateExplanation | null, dateFormat?: string): (text: string) => DateExplanation | null {
  let left = HINTED;
  return (text) => {
    const found = explain(text);
    if (left <= 0) return found;
    left--;
    const hint = dateHint(text, dateFormat, found?.problem !== undefined);
    return hint === null ? found : { ...found, hint };
  };
}

/**
 * Outcome for a column: sort keys and ISO texts (key NaN where a date could not be read) and how to
 * explain a text that could not be read; or the first ambiguous date.
 */
export type DateColumn =
  | {
      readonly kind: "dates";
      readonly keys: Float64Array;
      readonly isos: readonly string[];
      readonly explain: (text: string) => DateExplanation | null;
    }
  | { readonly kind: "ambiguous"; readonly index: number; readonly dayFirst: string; readonly monthFirst: string }
  | { readonly kind: "bad-format"; readonly reason: string };

/** Parse every text of a date column, with an optional explicit layout (see `compileDateFormat`). */
export function readDateColumn(texts: readonly string[], dateFormat?: string): DateColumn {
  if (dateFormat !== undefined) {
    const reader = compileDateReader(dateFormat);
    if (typeof reader === "string") return { kind: "bad-format", reason: reader };
    const keys = new Float64Array(texts.length);
    const isos = new Array<string>(texts.length);
    texts.forEach((text, i) => set(keys, isos, i, dateOnly(reader(text))));
    return { kind: "dates", keys, isos, explain: withHints((text) => problemOf(reader(text)), dateFormat) };
  }
  const keys = new Float64Array(texts.length);
  let isos = texts as string[];
  let copied = false;
  const put = (index: number, date: ParsedDate | null): void => {
    if (!copied && date !== null && date.iso !== texts[index]) {
      isos = texts.slice();
      copied = true;
    }
    set(keys, isos, index, date);
  };
  const slashes: { index: number; readings: SlashReadings }[] = [];
  for (let index = 0; index < texts.length; index++) {
    const text = texts[index] as string;
    const key = plainIsoDateKey(text);
    keys[index] = key;
    if (!Number.isNaN(key)) continue;
    const date = parseUnambiguousDate(text) ?? parseMonthNameDate(text);
    if (date !== null) put(index, date);
    else {
      const readings = slashReadings(text);
      if (readings) slashes.push({ index, readings });
    }
  }
  if (slashes.length === 0) return { kind: "dates", keys, isos, explain: withHints((text) => problemOf(readUnambiguousDate(text), text)) };
  const dayFirstFails = slashes.filter((s) => s.readings.dayFirst === null).length;
  const monthFirstFails = slashes.filter((s) => s.readings.monthFirst === null).length;
  if (dayFirstFails === 0 && monthFirstFails === 0) {
    const differing = slashes.find((s) => s.readings.dayFirst?.key !== s.readings.monthFirst?.key);
    if (differing) {
      const { dayFirst, monthFirst } = differing.readings;
      return { kind: "ambiguous", index: differing.index, dayFirst: dayFirst?.iso ?? "", monthFirst: monthFirst?.iso ?? "" };
    }
  }
  const useDayFirst = dayFirstFails <= monthFirstFails;
  for (const { index, readings } of slashes) put(index, useDayFirst ? readings.dayFirst : readings.monthFirst);
  // The reading is named when some slash date of the column was read that way.
  const settled = (useDayFirst ? dayFirstFails : monthFirstFails) < slashes.length;
  const reading = settled ? { reading: useDayFirst ? ("day first" as const) : ("month first" as const) } : {};
  const explain = (text: string): DateExplanation | null => {
    const problem = slashProblem(text, useDayFirst);
    return problem === null ? problemOf(readUnambiguousDate(text), text) : { problem, ...reading };
  };
  return { kind: "dates", keys, isos, explain: withHints(explain) };
}

/** The explanation of a read that fitted a layout but gave no date. */
const problemOf = (read: ReturnType<typeof readUnambiguousDate>, text?: string): DateExplanation | null => {
  const found = read ?? (text === undefined ? null : readMonthNameDate(text));
  return found !== null && "kind" in found ? { problem: found } : null;
};

function set(keys: Float64Array, isos: string[], index: number, date: ParsedDate | null): void {
  keys[index] = date === null ? Number.NaN : date.key;
  if (date !== null) isos[index] = date.iso;
}
