/** The rows of a located table before dates are ordered and values are converted. */

/** Rows of one table, in file order (or date order when `ordered`), values in file units. */
export interface Extracted {
  readonly dateColumn: string;
  readonly columns: readonly string[];
  /** Date of each row: sort key (see ParsedDate), ISO text, and the text it was read from. */
  readonly keys: Float64Array;
  readonly isos: readonly string[];
  readonly dateTexts: readonly string[];
  readonly lines: Int32Array;
  /** One array per column, in file units; NaN marks a missing value. */
  readonly values: readonly Float64Array[];
  /** The file text behind values[column][row], for messages. */
  readonly rawText: (column: number, row: number) => string;
  /** Data rows in the file. */
  readonly rowsRead: number;
  /** True when rows are already in date order (the long layout sorts while pivoting). */
  readonly ordered: boolean;
  readonly blocks: number;
  readonly block: number;
  readonly titleRows: number;
  readonly headerLine: number;
}
