/** The rows of a located table before dates are ordered and values are converted. */
import { PLAIN_DATE_FORM, stampIso, stampText } from "../values/dateStamps.js";

/** Rows of one table, in file order (or date order when `ordered`), values in file units. */
export interface Extracted {
  readonly dateColumn: string;
  readonly columns: readonly string[];
  /**
   * Date of each row: sort key (see ParsedDate), ISO text, and the text it was read from. `isos` and
   * `dateTexts` are null when every date is a stamp of one form, `dateForm` (values/dateStamps.ts;
   * absent: plain "YYYY-MM-DD" dates), whose texts are then recovered from the key (see `isoAt`,
   * `dateTextAt`).
   */
  readonly keys: Float64Array;
  readonly isos: readonly string[] | null;
  readonly dateTexts: readonly string[] | null;
  readonly dateForm?: number;
  readonly lines: Int32Array;
  /**
   * When row k is on line firstLine + k for every row (a row per line): that first line, so that the
   * table's `lines` can be made when asked, without holding the rows. Absent otherwise.
   */
  readonly firstLine?: number;
  /** One array per column, in file units; NaN marks a missing value. */
  readonly values: readonly Float64Array[];
  /**
   * True when no value is missing: every value is then a number (never NaN), and so is every
   * converted return (see convert.ts), so no row is dropped. False when some may be missing.
   */
  readonly complete: boolean;
  /** The file text behind values[column][row], for messages. */
  readonly rawText: (column: number, row: number) => string;
  /**
   * Where values[column][row] is in the file, when not on line lines[row] in column columns[column]:
   * the long layout's value of a series on a date is on that series' own row, in the value column.
   */
  readonly cellAt?: (column: number, row: number) => CellPlace;
  /** Data rows in the file. */
  readonly rowsRead: number;
  /** True when rows are already in date order (the long layout sorts while pivoting). */
  readonly ordered: boolean;
  readonly blocks: number;
  readonly block: number;
  readonly titleRows: number;
  readonly headerLine: number;
}

/** ISO text of the date of row i. */
export function isoAt(data: Extracted, i: number): string {
  return data.isos === null ? stampIso(data.keys[i] as number, data.dateForm ?? PLAIN_DATE_FORM) : (data.isos[i] as string);
}

/** The date of row i as written. */
export function dateTextAt(data: Extracted, i: number): string {
  return data.dateTexts === null ? stampText(data.keys[i] as number, data.dateForm ?? PLAIN_DATE_FORM) : (data.dateTexts[i] as string);
}

/** The place of a value in the file: its line and column, and its series in the long layout. */
export interface CellPlace {
  readonly line: number;
  readonly column: string;
  readonly series?: string;
}

/** Where values[column][row] of `data` is in the file. */
export function cellPlace(data: Extracted, column: number, row: number): CellPlace {
  return data.cellAt?.(column, row) ?? { line: data.lines[row] as number, column: data.columns[column] as string };
}
