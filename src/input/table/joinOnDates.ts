/** Inner join of return tables read from separate files, on their normalised date strings. */
import { failure, success, type Result } from "../../core/result.js";
import { float64Of, int32Of } from "./arrays.js";
import { parseUnambiguousDate } from "../values/dates.js";
import { detectFrequency } from "../values/frequency.js";
import type { InputIssue } from "../issues.js";
import { MIN_ROWS } from "./finish.js";
import type { ReturnTable } from "./returnTable.js";

/** The joined table with the bookkeeping of the join. */
export interface JoinedReturns {
  /** Dates present in every table, in the order of the first; columns of all tables; lines of the first. */
  readonly table: ReturnTable;
  /** Number of dates in each input table, in input order. */
  readonly dateCounts: readonly number[];
  /** Number of dates present in every table. */
  readonly matched: number;
  /** Per input table: how many of its dates had no partner, and the first 5 of them. */
  readonly unmatched: readonly { readonly source: string; readonly count: number; readonly firstDates: readonly string[] }[];
}

/**
 * Join tables on dates. Dates match only when their ISO texts are equal ("2020-01" does not match
 * "2020-01-31"). Column names must be unique across tables. The frequency is that of the first table
 * when set by option, otherwise detected again from the joined dates. Fails with
 * "too-few-common-dates" when fewer than 3 dates are shared.
 */
export function joinOnDates(tables: readonly ReturnTable[]): Result<JoinedReturns, InputIssue[]> {
  const first = tables[0];
  const source = tables.map((t) => t.source).join(" + ");
  if (first === undefined)
    return failure([{ code: "invalid-option", source: "<join>", option: "tables", reason: "give at least one table" }]);
  const issues: InputIssue[] = [];
  const owner = new Map<string, string>();
  for (const t of tables) {
    for (const name of t.columns.keys()) {
      if (owner.has(name)) issues.push({ code: "duplicate-column", source: `${owner.get(name)} and ${t.source}`, column: name });
      else owner.set(name, t.source);
    }
  }
  if (issues.length > 0) return failure(issues);
  const indexes = tables.map((t) => new Map(t.dates.map((date, i) => [date, i])));
  const picks: number[][] = tables.map(() => []);
  first.dates.forEach((date) => {
    const at = indexes.map((index) => index.get(date));
    if (at.every((i) => i !== undefined)) at.forEach((i, k) => (picks[k] as number[]).push(i as number));
  });
  const matched = picks[0]?.length ?? 0;
  const dateCounts = tables.map((t) => t.dates.length);
  if (matched < MIN_ROWS) {
    return failure([
      {
        code: "too-few-common-dates",
        source,
        matched,
        required: MIN_ROWS,
        counts: tables.map((t) => ({ source: t.source, dates: t.dates.length })),
      },
    ]);
  }
  const firstPicks = picks[0] as number[];
  const dates = firstPicks.map((i) => first.dates[i] as string);
  const columns = new Map<string, Float64Array>();
  tables.forEach((t, k) => {
    const rows = picks[k] as number[];
    for (const [name, values] of t.columns)
      columns.set(
        name,
        float64Of(rows.length, (j) => values[rows[j] as number] as number),
      );
  });
  const shared = new Set(dates);
  const unmatched = tables.map((t) => {
    const missing = t.dates.filter((d) => !shared.has(d));
    return { source: t.source, count: missing.length, firstDates: missing.slice(0, 5) };
  });
  const keys = dates.map((d) => parseUnambiguousDate(d)?.key ?? Number.NaN);
  const droppedDates = tables.flatMap((t) => t.dropped.firstDates).slice(0, 5);
  const table: ReturnTable = {
    source,
    dateColumn: first.dateColumn,
    dates,
    firstDate: dates[0] as string,
    lastDate: dates[dates.length - 1] as string,
    columns,
    lines: int32Of(firstPicks.length, (j) => first.lines[firstPicks[j] as number] as number),
    rowsRead: tables.reduce((sum, t) => sum + t.rowsRead, 0),
    dropped: { count: tables.reduce((sum, t) => sum + t.dropped.count, 0), firstDates: droppedDates },
    frequency: first.frequency?.from === "option" ? first.frequency : keys.some(Number.isNaN) ? first.frequency : detectFrequency(keys),
    warnings: tables.flatMap((t) => t.warnings),
  };
  return success({ table, dateCounts, matched, unmatched });
}
