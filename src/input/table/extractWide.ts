/** The wide layout: one row per date, one column per series. */
import { chooseDateColumn } from "./dateColumnChoice.js";
import { readDates, settleCells } from "./cells.js";
import { resolveColumns } from "./columns.js";
import type { Extracted } from "./extracted.js";
import type { Grid } from "../engines/grid.js";
import type { IssueList } from "../issueList.js";
import type { TableLocation } from "./layout.js";
import type { Sentinels } from "../values/numbers.js";
import type { ReadOptions } from "../options.js";
import { countingFrom } from "./arrays.js";
import { freshFloat64, freshInt32 } from "../../core/numerics/freshMemory.js";
import { checkFieldCounts } from "./rowShape.js";
import { PLAIN_DATE_FORM } from "../values/dateStamps.js";

/** Extract the requested columns of the located table; null (after adding issues) on any problem. */
export function extractWide(
  grid: Grid,
  location: TableLocation,
  options: ReadOptions,
  sentinels: Sentinels,
  issues: IssueList,
  findInOtherTable: (name: string) => number | undefined,
): Extracted | null {
  const { source } = options;
  const header = grid.fields(location.headerRow).map((name) => name.trim());
  const headerLine = grid.line(location.headerRow);
  const dateColumn =
    options.dateColumn?.trim() ??
    chooseDateColumn(
      grid,
      location,
      header,
      options.columns.map((name) => name.trim()),
      options.dateFormat,
    );
  const wanted = [
    { name: dateColumn, role: "date" as const },
    ...options.columns.map((name) => ({ name: name.trim(), role: "value" as const })),
  ];
  const resolved = resolveColumns(header, wanted, { source, line: headerLine, findInOtherTable });
  if (typeof resolved[0] !== "number") {
    issues.addAll(resolved as never[]);
    return null;
  }
  const [dateIndex, ...valueIndexes] = resolved as number[];
  if (valueIndexes.includes(dateIndex as number)) {
    issues.add({
      code: "invalid-option",
      source,
      option: "columns",
      reason: `the column ${JSON.stringify(dateColumn)} is asked for as a series and is also the date column: name the date column with --date (a file needs one: without a column of dates, the first column is taken as it)`,
    });
    return null;
  }
  const count = location.endRow - location.firstDataRow;
  const first = location.firstDataRow;
  // Rows first .. first + count - 1 (a read-only view, see countingFrom).
  const rows = countingFrom(first, count);
  const columns = valueIndexes.map((index) => header[index] as string);
  // Fresh memory from the runtime's source (core/numerics/freshMemory.ts): it may be readied on another thread.
  const values = columns.map(() => freshFloat64(count));
  const slots = new Int32Array(header.length).fill(-1);
  valueIndexes.forEach((fieldIndex, slot) => (slots[fieldIndex] = slot));
  const counts = freshInt32(count);
  let plainKeys: Float64Array | null = null;
  let plainForm = PLAIN_DATE_FORM;
  let withNaN: readonly boolean[] = values.map(() => true);
  if (grid.readRows === undefined) for (let i = 0; i < count; i++) counts[i] = grid.readNumbers(first + i, slots, values, i);
  else {
    plainKeys = freshFloat64(count);
    const read = grid.readRows(first, count, slots, values, counts, dateIndex as number, plainKeys);
    if (!read.plainDates) plainKeys = null;
    plainForm = read.dateForm;
    withNaN = read.withNaN;
  }
  if (!checkFieldCounts(grid, rows, counts, header, source, issues)) return null;
  let missing = 0;
  values.forEach((column, c) => {
    // Only NaN cells and numeric sentinels need settling.
    if (withNaN[c] === true || sentinels.numbers.size > 0)
      missing += settleCells(grid, rows, valueIndexes[c] as number, columns[c] as string, column, sentinels, options, issues);
  });

  const dated = readDates(grid, rows, dateIndex as number, dateColumn, options, issues, plainKeys, plainForm);
  if (dated === null || !issues.empty) return null;
  // Each row takes a line or more, so lines grow by 1 at least from row to row: when the last row is
  // as many lines after the first as rows, every row is one line.
  const firstLine = count > 0 ? grid.line(first) : 0;
  const oneLineEach = count > 0 && grid.line(first + count - 1) - firstLine === count - 1;
  let lines: Int32Array | null = null;
  return {
    dateColumn,
    columns,
    keys: dated.keys,
    isos: dated.isos,
    dateTexts: dated.texts,
    dateForm: dated.form,
    // Made when asked: the lines are for messages, and tables of a line a row make theirs from firstLine.
    get lines(): Int32Array {
      return (lines ??= linesOf(grid, rows));
    },
    ...(oneLineEach ? { firstLine } : {}),
    values,
    complete: missing === 0,
    rawText: (column, row) => grid.field(rows[row] as number, valueIndexes[column] as number),
    rowsRead: count,
    ordered: false,
    blocks: location.blocks,
    block: location.block,
    titleRows: location.titleRows,
    headerLine,
  };
}

/** The source line of each row (an array of its own: tables hand it to their callers). */
function linesOf(grid: Grid, rows: Int32Array): Int32Array {
  const lines = new Int32Array(rows.length);
  for (let i = 0; i < rows.length; i++) lines[i] = grid.line(rows[i] as number);
  return lines;
}
