/**
 * Which column holds the dates when `--date` is not given: the first column named like a date
 * ("Date", "Trade Date", "Month", "Period", "Timestamp", ...) whose first data rows are all dates;
 * else the first column whose first data rows are all dates; else the first column named like a
 * date, or else the first column (whose values then say why they are no dates). Columns that play another
 * role (the requested series in the wide layout; the id and value columns in the long layout) are
 * never candidates.
 */
import type { Grid } from "../engines/grid.js";
import type { TableLocation } from "./layout.js";
import { columnHasDates, dateTest } from "./recognise.js";

const DATE_NAME = /\b(date|dates|time|timestamp|datetime|period|month|week|day|year|as ?of)\b/i;

/** The name of the date column of the table at `location`, for a read without `--date`. */
export function chooseDateColumn(
  grid: Grid,
  location: TableLocation,
  header: readonly string[],
  excluded: readonly string[],
  dateFormat?: string,
): string {
  return dateColumnChooser(grid, location, header, dateFormat)(excluded);
}

/**
 * `chooseDateColumn` of one table for any number of excluded lists: whether a column holds dates
 * does not depend on them, and is found once per column.
 */
export function dateColumnChooser(
  grid: Grid,
  location: TableLocation,
  header: readonly string[],
  dateFormat?: string,
): (excluded: readonly string[]) => string {
  const isDate = dateTest(dateFormat);
  const known = new Map<number, boolean>();
  const dated = (index: number): boolean => {
    let found = known.get(index);
    if (found === undefined) known.set(index, (found = columnHasDates(grid, location, index, isDate, true)));
    return found;
  };
  return (excluded) => {
    const candidates = header.map((name, index) => ({ name, index })).filter(({ name }) => name !== "" && !excluded.includes(name));
    const named = candidates.find(({ name, index }) => DATE_NAME.test(name) && dated(index));
    if (named !== undefined) return named.name;
    // The first column keeps its place when it holds dates (the common wide file).
    if (candidates[0]?.index === 0 && dated(0)) return header[0] ?? "";
    const any = candidates.find(({ index }) => dated(index));
    if (any !== undefined) return any.name;
    // No column is all dates: the one named like a date (else the first) is read, so that its values
    // say why they are no dates (the first column even when asked for as a series, which is then said).
    return candidates.find(({ name }) => DATE_NAME.test(name))?.name ?? header[0] ?? "";
  };
}
