/** From extracted rows to a ReturnTable: date order, conversion to decimal returns, dropping, checks. */
import { arrayOf, float64Of, int32Of } from "./arrays.js";
import { success, failure, type Result } from "../core/result.js";
import type { Extracted } from "./extracted.js";
import { detectFrequency, frequencyFromPeriods } from "./frequency.js";
import type { IssueList } from "./issueList.js";
import type { InputIssue } from "./issues.js";
import type { ReadOptions } from "./options.js";
import type { ReturnTable } from "./returnTable.js";
import { toReturns } from "./convert.js";
import { unitWarnings, layoutWarnings } from "./warnings.js";

/** A table needs at least this many usable rows (after dropping and, for prices, the first row). */
export const MIN_ROWS = 3;
const MAX_DROPPED_DATES = 5;

/** Row order by date: the identity when already ordered, else checked (or sorted with options.sort). */
function orderRows(data: Extracted, options: ReadOptions, issues: IssueList): Int32Array {
  const n = data.keys.length;
  const order = int32Of(n, (i) => i);
  const keyOf = (i: number): number => data.keys[i] as number;
  if (options.sort === true && !data.ordered) order.sort((a, b) => keyOf(a) - keyOf(b) || a - b);
  const { source } = options;
  const column = data.dateColumn;
  for (let k = 1; k < n; k++) {
    const i = order[k] as number;
    const previous = order[k - 1] as number;
    const delta = keyOf(i) - keyOf(previous);
    if (delta > 0) continue;
    const line = data.lines[i] as number;
    const value = data.dateTexts[i] as string;
    const previousLine = data.lines[previous] as number;
    if (delta === 0) issues.add({ code: "duplicate-date", source, line: Math.max(line, previousLine), column, value, firstLine: Math.min(line, previousLine) });
    else issues.add({ code: "unsorted-dates", source, line, column, value, previousValue: data.dateTexts[previous] as string, previousLine });
  }
  return order;
}

/** Finish the table (the frequency comes from the dates of all rows, dropped ones included); fails with the collected issues when anything is wrong. */
export function finishTable(data: Extracted, options: ReadOptions, issues: IssueList): Result<ReturnTable, InputIssue[]> {
  const order = orderRows(data, options, issues);
  if (!issues.empty) return failure(issues.list());
  const converted = toReturns(data, order, options, issues);
  if (!issues.empty) return failure(issues.list());
  const { rows, values } = converted;
  const keep = new Int32Array(rows.length);
  let kept = 0;
  const droppedDates: string[] = [];
  let dropped = 0;
  for (let k = 0; k < rows.length; k++) {
    let complete = true;
    for (const column of values) if (Number.isNaN(column[k] as number)) complete = false;
    if (complete) keep[kept++] = k;
    else if (++dropped <= MAX_DROPPED_DATES) droppedDates.push(data.isos[rows[k] as number] as string);
  }
  if (kept < MIN_ROWS) {
    return failure([{ code: "too-few-rows", source: options.source, kept, required: MIN_ROWS, rowsRead: data.rowsRead, dropped }]);
  }
  const source = kept === rows.length ? null : keep.subarray(0, kept);
  const pick = (column: Float64Array): Float64Array => (source === null ? column : float64Of(source.length, (i) => column[source[i] as number] as number));
  const keptRows = source === null ? rows : int32Of(source.length, (i) => rows[source[i] as number] as number);
  const columns = new Map<string, Float64Array>();
  data.columns.forEach((name, c) => columns.set(name, pick(values[c] as Float64Array)));
  const identity = keptRows.length === data.isos.length && keptRows.every((row, i) => row === i);
  const dates = identity ? data.isos : arrayOf(keptRows.length, (i) => data.isos[keptRows[i] as number] as string);
  const keys = float64Of(order.length, (i) => data.keys[order[i] as number] as number);
  const frequency = options.periodsPerYear === undefined ? detectFrequency(keys) : frequencyFromPeriods(options.periodsPerYear);
  return success({
    source: options.source,
    dateColumn: data.dateColumn,
    dates,
    columns,
    lines: int32Of(keptRows.length, (i) => data.lines[keptRows[i] as number] as number),
    rowsRead: data.rowsRead,
    dropped: { count: dropped, firstDates: droppedDates },
    frequency,
    warnings: [...layoutWarnings(data, options.source), ...unitWarnings(columns, options)],
  });
}
