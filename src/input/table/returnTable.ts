/** The result of reading a return file. */
import type { DetectedFrequency } from "../values/frequency.js";
import type { InputWarning } from "../issues.js";

/** Decimal simple returns of the requested columns, by date. */
export interface ReturnTable {
  readonly source: string;
  readonly dateColumn: string;
  /**
   * ISO 8601 at the precision written: "YYYY-MM-DD", "YYYY-MM", "YYYY" or a date-time; ascending, unique.
   * When every date is a stamp of one form (plain "YYYY-MM-DD", "YYYY-MM-DD HH:MM", ...: see
   * values/dateStamps.ts) the array is built on first access (from compact keys),
   * so a caller that needs only the range should use firstDate and lastDate.
   */
  readonly dates: readonly string[];
  /**
   * When every date is a stamp of one form: their keys (milliseconds since 1970-01-01) and that form
   * (values/dateStamps.ts), so that a writer of many dates can write them without making `dates`
   * (writeStampIso gives the bytes of each). Absent otherwise.
   */
  readonly stamps?: { readonly keys: Float64Array; readonly form: number };
  /** dates[0] and dates[dates.length - 1], without building `dates`. */
  readonly firstDate: string;
  readonly lastDate: string;
  /** One entry per requested column, in request order, same length as dates, decimal simple returns. */
  readonly columns: ReadonlyMap<string, Float64Array>;
  /** 1-based source line of each kept row. */
  readonly lines: Int32Array;
  /** Data rows in the file (below the header of the table read). */
  readonly rowsRead: number;
  /** Rows dropped for missing values, with up to 5 of their dates. */
  readonly dropped: { readonly count: number; readonly firstDates: readonly string[] };
  /** Detected from the median gap between dates (null when no standard frequency fits), or set by option. */
  readonly frequency: DetectedFrequency | null;
  readonly warnings: readonly InputWarning[];
}
