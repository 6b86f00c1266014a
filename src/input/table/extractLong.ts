/**
 * The long (tidy) layout: one row per series and date, with an id column and a value column.
 * Rows may come in any order (they are pivoted into date order); the requested `columns` are
 * series ids. A date where a series has no row counts as a missing value for that series.
 */
import { float64Of, int32Of } from "./arrays.js";
import { readDates, settleCells } from "./cells.js";
import { resolveColumns } from "./columns.js";
import { plainIsoDateOfKey } from "../values/dates.js";
import type { Extracted } from "./extracted.js";
import type { Grid } from "../engines/grid.js";
import type { IssueList } from "../issueList.js";
import type { TableLocation } from "./layout.js";
import type { Sentinels } from "../values/numbers.js";
import type { ReadOptions } from "../options.js";
import { checkFieldCounts } from "./rowShape.js";
import { closestName } from "../suggest.js";
import { chooseDateColumn } from "./dateColumnChoice.js";

/** Extract and pivot the requested series of the located table; null (after adding issues) on any problem. */
export function extractLong(
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
  const idColumn = (options.idColumn ?? "").trim();
  const dateColumn =
    options.dateColumn?.trim() ??
    chooseDateColumn(grid, location, header, [idColumn, (options.valueColumn ?? "").trim()], options.dateFormat);
  const wanted = [
    { name: dateColumn, role: "date" as const },
    { name: idColumn, role: "series id" as const },
    { name: (options.valueColumn ?? "").trim(), role: "series value" as const },
  ];
  const resolved = resolveColumns(header, wanted, { source, line: headerLine, findInOtherTable });
  if (typeof resolved[0] !== "number") {
    issues.addAll(resolved as never[]);
    return null;
  }
  const [dateIndex, idIndex, valueIndex] = resolved as [number, number, number];
  const valueColumn = header[valueIndex] as string;
  const all = int32Of(location.endRow - location.firstDataRow, (i) => location.firstDataRow + i);
  if (
    !checkFieldCounts(
      grid,
      all,
      int32Of(all.length, (i) => grid.fieldCount(all[i] as number)),
      header,
      source,
      issues,
    )
  )
    return null;

  const series = options.columns.map((name) => name.trim());
  const slotOf = new Map(series.map((name, slot) => [name, slot]));
  const present = new Set<string>();
  const picked: number[] = [];
  const slots: number[] = [];
  for (const row of all) {
    const id = grid.field(row, idIndex).trim();
    present.add(id);
    const slot = slotOf.get(id);
    if (slot !== undefined) {
      picked.push(row);
      slots.push(slot);
    }
  }
  for (const name of series) {
    if (present.has(name)) continue;
    const available = [...present].filter((id) => id !== "");
    const suggestion = closestName(name, available);
    issues.add({ code: "unknown-series", source, column: name, idColumn, available, ...(suggestion === undefined ? {} : { suggestion }) });
  }
  if (!issues.empty) return null;
  const rows = Int32Array.from(picked);
  const values = new Float64Array(rows.length);
  const fieldSlots = new Int32Array(header.length).fill(-1);
  fieldSlots[valueIndex] = 0;
  for (let i = 0; i < rows.length; i++) grid.readNumbers(rows[i] as number, fieldSlots, [values], i);
  settleCells(grid, rows, valueIndex, valueColumn, values, sentinels, options, issues);
  const dated = readDates(grid, rows, dateIndex, dateColumn, options, issues);
  if (dated === null || !issues.empty) return null;

  const byKey = new Map<number, number>();
  const { keys } = dated;
  const order = Array.from(rows.keys()).sort((a, b) => (keys[a] as number) - (keys[b] as number) || a - b);
  const firsts: number[] = [];
  for (const i of order) {
    const key = keys[i] as number;
    if (!byKey.has(key)) byKey.set(key, firsts.push(i) - 1);
  }
  const n = firsts.length;
  const out = series.map(() => new Float64Array(n).fill(Number.NaN));
  const source2 = series.map(() => new Int32Array(n).fill(-1));
  for (const i of order) {
    const at = byKey.get(keys[i] as number) as number;
    const slot = slots[i] as number;
    const earlier = (source2[slot] as Int32Array)[at] as number;
    const row = rows[i] as number;
    if (earlier >= 0) {
      issues.add({
        code: "duplicate-date",
        source,
        line: grid.line(row),
        column: dateColumn,
        value: dated.texts === null ? plainIsoDateOfKey(keys[i] as number) : (dated.texts[i] as string),
        firstLine: grid.line(rows[earlier] as number),
        series: series[slot] as string,
      });
    }
    (source2[slot] as Int32Array)[at] = i;
    (out[slot] as Float64Array)[at] = values[i] as number;
  }
  if (!issues.empty) return null;
  return {
    dateColumn,
    columns: series,
    keys: float64Of(firsts.length, (k) => keys[firsts[k] as number] as number),
    isos: dated.isos === null ? null : firsts.map((i) => dated.isos?.[i] as string),
    dateTexts: dated.texts === null ? null : firsts.map((i) => dated.texts?.[i] as string),
    lines: int32Of(firsts.length, (k) => grid.line(rows[firsts[k] as number] as number)),
    values: out,
    complete: false,
    rawText: (column, at) => {
      const i = (source2[column] as Int32Array)[at] as number;
      return i < 0 ? "" : grid.field(rows[i] as number, valueIndex);
    },
    // A series' value on a date is on that series' own row (lines holds the first row of each date).
    cellAt: (column, at) => {
      const i = (source2[column] as Int32Array)[at] as number;
      const line = grid.line(i < 0 ? (rows[firsts[at] as number] as number) : (rows[i] as number));
      return { line, column: valueColumn, series: series[column] as string };
    },
    rowsRead: all.length,
    ordered: true,
    blocks: location.blocks,
    block: location.block,
    titleRows: location.titleRows,
    headerLine,
  };
}
