/**
 * "Did you mean" suggestions: for misspelt column and series names, and the date layouts that read a
 * date's text that could not be read.
 */
import type { DateHint, LayoutReading } from "./issueTypes.js";
import { compileDateReader, type DateReader, readMonthNameDate } from "./values/dateFormat.js";
import { dateOnly, type DateProblem, readUnambiguousDate } from "./values/dates.js";

/** Levenshtein distance (insertions, deletions, substitutions each cost 1). */
export function editDistance(a: string, b: string): number {
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      current.push(Math.min((previous[j] as number) + 1, (current[j - 1] as number) + 1, (previous[j - 1] as number) + cost));
    }
    previous = current;
  }
  return previous[b.length] as number;
}

/**
 * The closest candidate to `wanted`, compared case-insensitively and ignoring surrounding spaces;
 * undefined when nothing is within max(2, a third of the name's length) edits.
 */
export function closestName(wanted: string, candidates: readonly string[]): string | undefined {
  const target = wanted.trim().toLowerCase();
  let best: string | undefined;
  let bestDistance = Math.max(2, Math.floor(target.length / 3));
  for (const candidate of candidates) {
    const distance = editDistance(target, candidate.trim().toLowerCase());
    if (distance <= bestDistance && (best === undefined || distance < bestDistance)) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return best;
}

/**
 * The --date-format layouts a date's text could be written in, from its shape: each run of digits
 * or letters is a part (1 or 2 digits a day or month, 4 a year, 6 and 8 a year and month run together
 * with or without a day, letters a month name) and everything between them is literal.
 */
function layoutsOfShape(text: string): string[] {
  const runs = text.trim().match(/\d+|[A-Za-z]+|[^A-Za-z\d]+/g) ?? [];
  const parts = runs.filter((run) => /^[A-Za-z\d]/.test(run));
  if (parts.length === 0 || parts.length > MAX_PARTS) return [];
  let layouts = [""];
  for (const run of runs) {
    const tokens = /^\d/.test(run) ? (DIGIT_TOKENS[run.length] ?? []) : /^[A-Za-z]/.test(run) ? ["MMM"] : [run];
    layouts = layouts.flatMap((layout) => tokens.map((token) => layout + token));
  }
  return layouts;
}

/** How many parts (runs of digits or letters) a date has at most. */
const MAX_PARTS = 4;
/** The tokens a run of this many digits can be. */
const DIGIT_TOKENS: Readonly<Record<number, readonly string[]>> = {
  1: ["D", "M"],
  2: ["DD", "MM"],
  4: ["YYYY"],
  6: ["YYYYMM", "MMYYYY"],
  8: ["YYYYMMDD", "DDMMYYYY", "MMDDYYYY"],
};
/** Layouts compiled so far (a layout that repeats or lacks a part is a string, and fits nothing); at most `COMPILED` kept. */
const compiled = new Map<string, DateReader | string>();
const COMPILED = 256;
const readerOf = (layout: string): DateReader | string => {
  let reader = compiled.get(layout);
  if (reader === undefined) {
    if (compiled.size >= COMPILED) compiled.clear();
    compiled.set(layout, (reader = compileDateReader(layout)));
  }
  return reader;
};
/** A layout with the year first and then the day before the month (suggested only when no other reads a text). */
function unusual(layout: string): boolean {
  const day = layout.indexOf("D");
  return layout.startsWith("YYYY") && day >= 0 && day < layout.indexOf("M");
}
/** At most this many layouts are suggested. */
const MAX_SUGGESTED = 3;
/** Which problem, of the layouts a text fits without being a date, says most (the parts read in the likeliest order). */
const PROBLEM_RANK: readonly DateProblem["kind"][] = [
  "short-month",
  "no-day",
  "no-time",
  "no-offset",
  "no-month-name",
  "no-month",
  "no-year",
];
/** A whole number of 5 digits (with an optional fraction of a day): a spreadsheet's day count from 1900 (1927 to 2173). */
const SERIAL = /^\d{5}(\.\d+)?$/;

/** A date followed by a time of day ("31.01.2000 09:30"): the date's text. */
const TIMED = /^(.*\d)(?:\s+|T)\d{1,2}:\d{2}(?::\d{2})?$/;

/** The layouts (other than `except`) that read a text, with the date each gives, and those it fits without being a date. */
function fittingLayouts(text: string, except?: string): { layouts: LayoutReading[]; misfits: LayoutMisfit[] } {
  const layouts: LayoutReading[] = [];
  const misfits: LayoutMisfit[] = [];
  for (const layout of layoutsOfShape(text)) {
    const read = layout === except ? null : readerOf(layout);
    const found = read === null || typeof read === "string" ? null : read(text);
    if (found === null) continue;
    if (!("kind" in found)) layouts.push({ layout, iso: found.iso });
    else misfits.push({ layout, problem: found });
  }
  const usual = layouts.filter(({ layout }) => !unusual(layout));
  return { layouts: (usual.length > 0 ? usual : layouts).slice(0, MAX_SUGGESTED), misfits };
}
type LayoutMisfit = { readonly layout: string; readonly problem: DateProblem };

/**
 * What to suggest for a date's text that could not be read (with `dateFormat` when one was given):
 * the --date-format layouts that read it, the date it gives without --date-format, a layout it fits
 * but names no date in, the layouts that read its date when it ends in a time of day (layouts have
 * none), or that it looks like a spreadsheet's serial number; null when there is nothing to say.
 * With `known` (the problem of the text in the layout used is already told), only other layouts that
 * read it are suggested, and only when a layout was given.
 */
export function dateHint(text: string, dateFormat: string | undefined, known: boolean): DateHint | null {
  if (known && dateFormat === undefined) return null;
  const { layouts, misfits } = fittingLayouts(text, dateFormat);
  if (known) return layouts.length === 0 ? null : { layouts };
  const automatic = dateFormat === undefined ? null : dateOnly(readUnambiguousDate(text) ?? readMonthNameDate(text));
  if (automatic !== null) return { layouts, unformatted: automatic.iso };
  if (layouts.length > 0) return { layouts };
  const rank = (m: LayoutMisfit): number => PROBLEM_RANK.indexOf(m.problem.kind) + (unusual(m.layout) ? PROBLEM_RANK.length : 0);
  const nearly = misfits.sort((a, b) => rank(a) - rank(b))[0];
  if (nearly !== undefined) return { layouts, nearly };
  const timed = TIMED.exec(text.trim());
  const withoutTime = timed === null ? [] : fittingLayouts(timed[1] as string).layouts;
  if (withoutTime.length > 0) return { layouts, withoutTime };
  return SERIAL.test(text.trim()) ? { layouts, serial: true } : null;
}
