/** Checking that each data row has as many fields as the header, and explaining when not. */
import type { Grid } from "../engines/grid.js";
import { allEqualTo } from "../engines/plainLines.js";
import type { IssueList } from "../issueList.js";

const INTEGER_PART = /^\s*[+-]?\d+$/;
const FRACTION_PART = /^\d+\s*$/;

/**
 * Adds an issue per row whose field count differs from the header's; extra trailing empty fields
 * are accepted. `counts[i]` is the field count of rows[i]. A row with extra fields where a number seems split at the delimiter ("1,5" read as
 * "1" and "5") is reported as "unquoted-delimiter". Returns true when every row is fine.
 */
export function checkFieldCounts(
  grid: Grid,
  rows: Int32Array,
  counts: Int32Array,
  header: readonly string[],
  source: string,
  issues: IssueList,
): boolean {
  const expected = header.length;
  if (allEqualTo(counts.subarray(0, rows.length), expected)) return true;
  let fine = true;
  for (let i = 0; i < rows.length; i++) {
    const actual = counts[i] as number;
    if (actual === expected) continue;
    const row = rows[i] as number;
    const fields = grid.fields(row);
    if (actual > expected && fields.slice(expected).every((f) => f.trim() === "")) continue;
    fine = false;
    const split = actual > expected ? findSplitNumber(fields) : undefined;
    const line = grid.line(row);
    if (split === undefined) issues.add({ code: "wrong-field-count", source, line, expected, actual });
    else {
      const value = `${fields[split] ?? ""}${grid.delimiter}${fields[split + 1] ?? ""}`;
      issues.add({ code: "unquoted-delimiter", source, line, column: header[split] ?? `#${split + 1}`, value, delimiter: grid.delimiter });
    }
  }
  return fine;
}

/** Index of the first field that, joined with the next, reads as a number with a split decimal separator. */
function findSplitNumber(fields: readonly string[]): number | undefined {
  for (let i = 0; i + 1 < fields.length; i++) {
    if (INTEGER_PART.test(fields[i] as string) && FRACTION_PART.test(fields[i + 1] as string)) return i;
  }
  return undefined;
}
