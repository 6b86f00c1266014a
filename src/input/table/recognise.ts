/**
 * Whether a located table is a return table, before any of its content is quoted in a message.
 * Pointed at some other file (a key, a password file, a document), the reader must not print its
 * lines: names from its header or values from its cells are quoted only once the table is recognised,
 * by its header naming a requested column, or by its first column holding a date near the top.
 */
import type { Grid } from "../engines/grid.js";
import { compileDateFormat, parseMonthNameDate } from "../values/dateFormat.js";
import { parseUnambiguousDate, slashReadings } from "../values/dates.js";
import type { TableLocation } from "./layout.js";

/** The first data rows looked at for a date. */
const DATE_ROWS = 5;

/** A reader telling whether a text is a date (in `dateFormat` when given, else any layout read without one). */
export function dateTest(dateFormat?: string): (text: string) => boolean {
  const parse = dateFormat === undefined ? undefined : compileDateFormat(dateFormat);
  return (text) => {
    if (typeof parse === "function") return parse(text) !== null;
    const slash = slashReadings(text);
    return (
      parseUnambiguousDate(text) !== null ||
      parseMonthNameDate(text) !== null ||
      (slash !== undefined && (slash.dayFirst !== null || slash.monthFirst !== null))
    );
  };
}

/** True when column `index` holds a date in one of the first data rows (all of them, with `every`). */
export function columnHasDates(
  grid: Grid,
  location: TableLocation,
  index: number,
  isDate: (text: string) => boolean,
  every = false,
): boolean {
  const end = Math.min(location.endRow, location.firstDataRow + DATE_ROWS);
  if (end <= location.firstDataRow) return false;
  for (let row = location.firstDataRow; row < end; row++) {
    const found = index < grid.fieldCount(row) && isDate(grid.field(row, index).trim());
    if (found !== every) return found;
  }
  return every;
}

/**
 * True when the header row names one of `wanted` (the requested column names, trimmed), or a field
 * of the first column reads as a date (in `dateFormat` when given) in one of the first data rows.
 */
export function isReturnTable(grid: Grid, location: TableLocation, wanted: readonly string[], dateFormat?: string): boolean {
  const header = new Set(grid.fields(location.headerRow).map((name) => name.trim()));
  if (wanted.some((name) => header.has(name))) return true;
  return columnHasDates(grid, location, 0, dateTest(dateFormat));
}
