/**
 * A delimited text as rows of fields, with two engines behind one interface:
 * `fastGrid` (fastGrid.ts) scans unquoted text itself; `csvGrid` uses csv-parse for everything
 * else (quotes, embedded line breaks, CR-only line ends). Rows are records; blank rows (every
 * field empty after String.prototype.trim) separate blocks.
 */
import { parse } from "csv-parse/sync";
import { parseDecimal } from "../values/numbers.js";

/** Rows of fields, however they were tokenised. Rows are 0-based; `line` maps them to 1-based source lines. */
export interface Grid {
  readonly delimiter: string;
  readonly rowCount: number;
  /** 1-based source line where the row starts. */
  line(row: number): number;
  /** True when every field is empty after trimming white space. */
  isBlank(row: number): boolean;
  /**
   * Optional shortcut for finding blank rows: the first row from `from` on that may be blank (every
   * row before it is not), or rowCount when none may be.
   */
  nextMaybeBlank?(from: number): number;
  /** Number of fields; 0 for a blank row. */
  fieldCount(row: number): number;
  /** The text of one field, untrimmed ("" beyond the last field). */
  field(row: number, index: number): string;
  fields(row: number): string[];
  /**
   * For each field index f with slots[f] >= 0: out[slots[f]][at] = parseDecimal(field) (NaN for null).
   * Returns the row's field count.
   */
  readNumbers(row: number, slots: Int32Array, out: readonly Float64Array[], at: number): number;
  /**
   * Optional shortcut for dates: when field `index` of every row in `rows` is exactly a real
   * "YYYY-MM-DD" date, sets keys[k] = plainIsoDateKey(field of rows[k]) and returns true; returns
   * false (keys partly written) otherwise.
   */
  plainIsoDates?(rows: Int32Array, index: number, keys: Float64Array): boolean;
  /**
   * Optional, one pass over the rows [first, first + count): for each k, counts[k] =
   * readNumbers(first + k, slots, out, k), and the keys of field `dateIndex` (which no slot reads)
   * of those rows into dateKeys: `plainDates` is true when every one is a stamp of one form,
   * `dateForm` (see scanStamp in values/dateStamps.ts; PLAIN_DATE_FORM is plainIsoDates' plain
   * "YYYY-MM-DD"). withNaN[slot] is false only when no value written to out[slot] is NaN.
   */
  readRows?(
    first: number,
    count: number,
    slots: Int32Array,
    out: readonly Float64Array[],
    counts: Int32Array,
    dateIndex: number,
    dateKeys: Float64Array,
  ): { readonly plainDates: boolean; readonly dateForm: number; readonly withNaN: readonly boolean[] };
}

/**
 * Why csv-parse could not tokenise the text, in the reader's own terms (its messages quote the
 * field's text, which must not be printed before the file is known to be a table): a quote inside a
 * field that does not start with one, text after a closing quote, or a quoted field never closed.
 */
export interface QuoteError {
  readonly line: number;
  readonly problem: QuoteProblem;
  /** The 0-based field where a quote was found inside a field, when csv-parse names it. */
  readonly field?: number;
}
export type QuoteProblem = "quote-inside" | "after-closing" | "not-closed" | "other";

const QUOTE_PROBLEMS: Readonly<Record<string, QuoteProblem>> = {
  INVALID_OPENING_QUOTE: "quote-inside",
  CSV_INVALID_CLOSING_QUOTE: "after-closing",
  CSV_NON_TRIMABLE_CHAR_AFTER_CLOSING_QUOTE: "after-closing",
  CSV_QUOTE_NOT_CLOSED: "not-closed",
};

/** Build the general grid with csv-parse, or a QuoteError when the quoting is broken. */
export function csvGrid(text: string, delimiter: string): Grid | QuoteError {
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(text, {
      delimiter,
      record_delimiter: ["\r\n", "\n", "\r"],
      relax_column_count: true,
      skip_empty_lines: false,
      info: true,
    }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (error) {
    const e = error as { lines?: unknown; code?: unknown; column?: unknown };
    const line = typeof e.lines === "number" ? e.lines : 1;
    const problem = (typeof e.code === "string" ? QUOTE_PROBLEMS[e.code] : undefined) ?? "other";
    return { line, problem, ...(problem === "quote-inside" && typeof e.column === "number" ? { field: e.column } : {}) };
  }
  const rows = records.map((r) => r.record);
  const lines: number[] = [];
  let next = 1;
  for (const r of records) {
    lines.push(next);
    next = r.info.lines + 1;
  }
  const counts = rows.map((fields) => (fields.every((f) => f.trim() === "") ? 0 : fields.length));
  return {
    delimiter,
    rowCount: rows.length,
    line: (row) => lines[row] ?? 1,
    isBlank: (row) => counts[row] === 0,
    fieldCount: (row) => counts[row] ?? 0,
    field: (row, index) => rows[row]?.[index] ?? "",
    fields: (row) => [...(rows[row] ?? [])],
    readNumbers(row, slots, out, position) {
      const fields = rows[row] ?? [];
      slots.forEach((slot, f) => {
        if (slot >= 0) (out[slot] as Float64Array)[position] = parseDecimal(fields[f] ?? "") ?? Number.NaN;
      });
      return fields.length;
    },
  };
}
