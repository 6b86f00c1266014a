/** Reading the date and value cells of chosen rows, shared by the wide and long layouts. */
import { arrayOf } from "./arrays.js";
import { readDateColumn } from "../values/dateColumn.js";
import { PLAIN_DATE_FORM } from "../values/dateStamps.js";
import type { Grid } from "../engines/grid.js";
import type { IssueList } from "../issueList.js";
import { isMissingToken, parseDecimal, type Sentinels } from "../values/numbers.js";
import type { ReadOptions } from "../options.js";

/** A number written with a decimal comma ("-0,85"; no other comma or point), or null. */
export function readDecimalComma(text: string): number | null {
  const comma = text.indexOf(",");
  if (comma < 0 || text.includes(".") || text.indexOf(",", comma + 1) >= 0) return null;
  return parseDecimal(`${text.slice(0, comma)}.${text.slice(comma + 1)}`);
}

/**
 * Dates of the given rows; null (after adding issues) when any is unreadable. `isos` and `texts`
 * are null when every date is a stamp of one form, `form` (see `Extracted`). `plainKeys`: the keys
 * of those rows when already known to be all stamps of form `plainForm` (see Grid.readRows).
 */
export function readDates(
  grid: Grid,
  rows: Int32Array,
  dateIndex: number,
  dateColumn: string,
  options: ReadOptions,
  issues: IssueList,
  plainKeys: Float64Array | null = null,
  plainForm = PLAIN_DATE_FORM,
): { keys: Float64Array; isos: readonly string[] | null; texts: readonly string[] | null; form: number } | null {
  const { source, dateFormat } = options;
  if (dateFormat === undefined && plainKeys !== null) return { keys: plainKeys, isos: null, texts: null, form: plainForm };
  if (dateFormat === undefined && grid.plainIsoDates !== undefined) {
    // Every date a plain "YYYY-MM-DD": its text is its ISO form, and both are recovered from the key.
    const keys = new Float64Array(rows.length);
    if (grid.plainIsoDates(rows, dateIndex, keys)) return { keys, isos: null, texts: null, form: PLAIN_DATE_FORM };
  }
  const texts = arrayOf(rows.length, (i) => grid.field(rows[i] as number, dateIndex));
  const column = readDateColumn(texts, dateFormat);
  if (column.kind === "bad-format") {
    issues.add({ code: "invalid-option", source, option: "dateFormat", reason: column.reason });
    return null;
  }
  if (column.kind === "ambiguous") {
    const { index, dayFirst, monthFirst } = column;
    issues.add({
      code: "ambiguous-dates",
      source,
      line: grid.line(rows[index] as number),
      column: dateColumn,
      value: texts[index] as string,
      dayFirst,
      monthFirst,
    });
    return null;
  }
  const { keys, isos } = column;
  let fine = true;
  for (let i = 0; i < keys.length; i++) {
    if (!Number.isNaN(keys[i] as number)) continue;
    fine = false;
    const value = texts[i] as string;
    issues.add({
      code: "bad-date",
      source,
      line: grid.line(rows[i] as number),
      column: dateColumn,
      value,
      ...(dateFormat === undefined ? {} : { dateFormat }),
      ...column.explain(value),
    });
  }
  return fine ? { keys, isos, texts, form: PLAIN_DATE_FORM } : null;
}

/**
 * Settle every NaN and sentinel cell of `values` (read from `grid` rows, field `fieldIndex`):
 * missing spellings and sentinels stay NaN (or become "missing-value" issues when onMissing is
 * "error"); any other text becomes a "not-a-number" issue. With options.decimalComma, "0,85" is 0.85.
 * Returns how many cells are left NaN (every other value is a finite number).
 */
export function settleCells(
  grid: Grid,
  rows: Int32Array,
  fieldIndex: number,
  column: string,
  values: Float64Array,
  sentinels: Sentinels,
  options: ReadOptions,
  issues: IssueList,
): number {
  const { source } = options;
  const strict = options.onMissing === "error";
  const numericSentinels = sentinels.numbers.size > 0;
  const decimalComma = options.decimalComma === true;
  let missingCount = 0;
  for (let i = 0; i < values.length; i++) {
    const value = values[i] as number;
    if (!Number.isNaN(value) && !(numericSentinels && sentinels.numbers.has(value))) continue;
    const row = rows[i] as number;
    const text = grid.field(row, fieldIndex);
    if (decimalComma && Number.isNaN(value)) {
      const comma = readDecimalComma(text);
      if (comma !== null) {
        values[i] = comma;
        if (!(numericSentinels && sentinels.numbers.has(comma))) continue;
      }
    }
    const missing = !Number.isNaN(value) || isMissingToken(text) || sentinels.texts.has(text.trim().toLowerCase());
    values[i] = Number.NaN;
    missingCount++;
    if (!missing) issues.add({ code: "not-a-number", source, line: grid.line(row), column, value: text });
    else if (strict) issues.add({ code: "missing-value", source, line: grid.line(row), column, value: text });
  }
  return missingCount;
}
