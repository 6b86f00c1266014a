/** From extracted rows to a ReturnTable: date order, conversion to decimal returns, dropping, checks. */
import { AREA_ROWS, columnKernel } from "../../core/numerics/seriesKernel.js";
import { arrayOf, float64Of, identityOf, int32Of, isIdentity } from "./arrays.js";
import { success, failure, type Result } from "../../core/result.js";
import { dateTextAt, isoAt, type Extracted } from "./extracted.js";
import { PLAIN_DATE_FORM, stampIso } from "../values/dateStamps.js";
import { type DetectedFrequency, detectFrequency, frequencyFromPeriods } from "../values/frequency.js";
import type { IssueList } from "../issueList.js";
import type { InputIssue, InputWarning } from "../issues.js";
import type { ReadOptions } from "../options.js";
import type { ReturnTable } from "./returnTable.js";
import { toReturns } from "./convert.js";
import { columnUnitWarnings, layoutWarnings } from "./warnings.js";

/** A table needs at least this many usable rows (after dropping and, for prices, the first row). */
export const MIN_ROWS = 3;
const MAX_DROPPED_DATES = 5;

/**
 * The first k >= from with keys[k] <= keys[k - 1] (not later than the previous date), or keys.length;
 * the first search (from 1) in the column kernel (WebAssembly, core/numerics/seriesKernel.ts) when it holds
 * the keys (the later ones, after a key out of order, search on from it here: no copy each time).
 */
export function firstNotIncreasing(keys: Float64Array, from: number, useKernel = true): number {
  const kernel = useKernel && from === 1 && keys.length <= AREA_ROWS ? columnKernel() : null;
  if (kernel !== null) {
    kernel.area.set(keys);
    return kernel.firstNotIncreasing(keys.length);
  }
  for (let k = from; k < keys.length; k++) if (!((keys[k] as number) - (keys[k - 1] as number) > 0)) return k;
  return keys.length;
}

/** Row order by date: the identity when already ordered, else checked (or sorted with options.sort). */
function orderRows(data: Extracted, options: ReadOptions, issues: IssueList): Int32Array {
  const { keys } = data;
  const n = keys.length;
  const sorted = options.sort === true && !data.ordered;
  const order = sorted ? int32Of(n, (i) => i).sort((a, b) => (keys[a] as number) - (keys[b] as number) || a - b) : identityOf(n);
  const { source } = options;
  const column = data.dateColumn;
  // Unsorted, the order is the identity: find the first key that does not increase in one tight loop.
  for (let k = sorted ? 1 : firstNotIncreasing(keys, 1); k < n; k = sorted ? k + 1 : firstNotIncreasing(keys, k + 1)) {
    const i = order[k] as number;
    const previous = order[k - 1] as number;
    const delta = (keys[i] as number) - (keys[previous] as number);
    if (delta > 0) continue;
    const line = data.lines[i] as number;
    const value = dateTextAt(data, i);
    const previousLine = data.lines[previous] as number;
    if (delta === 0)
      issues.add({
        code: "duplicate-date",
        source,
        line: Math.max(line, previousLine),
        column,
        value,
        firstLine: Math.min(line, previousLine),
      });
    else issues.add({ code: "unsorted-dates", source, line, column, value, previousValue: dateTextAt(data, previous), previousLine });
  }
  return order;
}

/**
 * A table's rows in date order and converted to decimal returns, every column read: what any set of
 * its columns is finished from (see `keepComplete`).
 */
export interface ConvertedTable {
  readonly data: Extracted;
  /** Extracted row index of each return, in date order. */
  readonly rows: Int32Array;
  /** One array per column of `data`, in date order; NaN marks a missing value. */
  readonly values: readonly Float64Array[];
  /** The frequency, from the dates of all rows (dropped ones included) or set by option. */
  readonly frequency: () => DetectedFrequency | null;
}

/** Finish the table: every column read; fails with the collected issues when anything is wrong. */
export function finishTable(data: Extracted, options: ReadOptions, issues: IssueList): Result<ReturnTable, InputIssue[]> {
  const converted = convertTable(data, options, issues);
  return converted.ok ? keepComplete(converted.value, data.columns.keys(), options) : converted;
}

/** Order the rows by date and convert every column to returns; fails with the collected issues when anything is wrong. */
export function convertTable(data: Extracted, options: ReadOptions, issues: IssueList): Result<ConvertedTable, InputIssue[]> {
  const order = orderRows(data, options, issues);
  if (!issues.empty) return failure(issues.list());
  const converted = toReturns(data, order, options, issues);
  if (!issues.empty) return failure(issues.list());
  let frequency: DetectedFrequency | null | undefined;
  const detect = (): DetectedFrequency | null =>
    options.periodsPerYear === undefined ? detectFrequency(orderedKeys(data.keys, order)) : frequencyFromPeriods(options.periodsPerYear);
  return success({ data, ...converted, frequency: () => (frequency === undefined ? (frequency = detect()) : frequency) });
}

/**
 * The table of the columns `wantedColumns` (indexes into `table.data.columns`, in the order wanted) of a
 * converted table: a row is kept when none of these columns is missing (NaN) there. `unitWarningsOf`:
 * the unit warnings of one column's kept values (a reader of several sets may remember them).
 */
export function keepComplete(
  table: ConvertedTable,
  wantedColumns: Iterable<number>,
  options: ReadOptions,
  unitWarningsOf: (column: string, values: Float64Array) => readonly InputWarning[] = (column, values) =>
    columnUnitWarnings(column, values, options),
): Result<ReturnTable, InputIssue[]> {
  const { data, rows } = table;
  const wanted = [...wantedColumns];
  const values = wanted.map((c) => table.values[c] as Float64Array);
  let missing: Uint8Array | null = null;
  if (!data.complete)
    for (const column of values) {
      for (let k = 0; k < column.length; k++) if (Number.isNaN(column[k] as number)) (missing ??= new Uint8Array(rows.length))[k] = 1;
    }
  let kept = rows.length;
  let keep: Int32Array | null = null;
  const droppedDates: string[] = [];
  let dropped = 0;
  if (missing !== null) {
    keep = new Int32Array(rows.length);
    kept = 0;
    for (let k = 0; k < rows.length; k++) {
      if (missing[k] === 0) keep[kept++] = k;
      else if (++dropped <= MAX_DROPPED_DATES) droppedDates.push(isoAt(data, rows[k] as number));
    }
  }
  if (kept < MIN_ROWS) {
    return failure([{ code: "too-few-rows", source: options.source, kept, required: MIN_ROWS, rowsRead: data.rowsRead, dropped }]);
  }
  const source = keep === null || kept === rows.length ? null : keep.subarray(0, kept);
  const pick = (column: Float64Array): Float64Array =>
    source === null ? column : float64Of(source.length, (i) => column[source[i] as number] as number);
  const keptRows = source === null ? rows : int32Of(source.length, (i) => rows[source[i] as number] as number);
  const columns = new Map<string, Float64Array>();
  wanted.forEach((c, i) => columns.set(data.columns[c] as string, pick(values[i] as Float64Array)));
  const frequency = table.frequency();
  const identity = keptRows.length === data.keys.length && isIdentity(keptRows);
  const { isos } = data;
  let dates: readonly string[] | null = null;
  let keptKeys: Float64Array | null = null;
  if (isos !== null) dates = identity ? isos : arrayOf(keptRows.length, (i) => isos[keptRows[i] as number] as string);
  else keptKeys = identity ? data.keys : float64Of(keptRows.length, (i) => data.keys[keptRows[i] as number] as number);
  return success(
    withDates(
      {
        source: options.source,
        dateColumn: data.dateColumn,
        firstDate: isoAt(data, keptRows[0] as number),
        lastDate: isoAt(data, keptRows[keptRows.length - 1] as number),
        columns,
        rowsRead: data.rowsRead,
        dropped: { count: dropped, firstDates: droppedDates },
        frequency,
        warnings: [...layoutWarnings(data, options.source), ...[...columns].flatMap(([name, column]) => unitWarningsOf(name, column))],
      },
      dates,
      keptKeys,
      data.dateForm ?? PLAIN_DATE_FORM,
      identity && data.firstLine !== undefined
        ? { from: data.firstLine, count: keptRows.length }
        : identity
          ? data.lines
          : int32Of(keptRows.length, (i) => data.lines[keptRows[i] as number] as number),
    ),
  );
}

/**
 * The table with its `dates`: `isos`, or made from the keys (stamps of form `form`) on first access.
 * Made here, apart from finishTable, so that the getter holds these alone, not the extracted rows
 * and their grid (a closure holds every variable its function's closures capture).
 */
function withDates(
  table: Omit<ReturnTable, "dates" | "lines">,
  isos: readonly string[] | null,
  keys: Float64Array | null,
  form: number,
  rowLines: Int32Array | { readonly from: number; readonly count: number },
): ReturnTable {
  let dates = isos;
  // A run of lines (a line a row, none dropped) is made on first access, as the dates are.
  let lines = rowLines instanceof Int32Array ? rowLines : null;
  const run = rowLines instanceof Int32Array ? null : rowLines;
  // The fields in the order the table declares them.
  const { source, dateColumn, ...rest } = table;
  return {
    source,
    dateColumn,
    get dates(): readonly string[] {
      return (dates ??= arrayOf((keys as Float64Array).length, (i) => stampIso((keys as Float64Array)[i] as number, form)));
    },
    ...(keys === null ? {} : { stamps: { keys, form } }),
    get lines(): Int32Array {
      return (lines ??= int32Of((run as { count: number }).count, (i) => (run as { from: number }).from + i));
    },
    ...rest,
  };
}

/** keys[order[i]] for each i (the identity order is common and skips the copy). */
function orderedKeys(keys: Float64Array, order: Int32Array): Float64Array {
  return isIdentity(order) ? keys : float64Of(order.length, (k) => keys[order[k] as number] as number);
}
